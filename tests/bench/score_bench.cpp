// Benchmark (not a ctest): the whole `stridemark score CSV --fps 250 --json OUT` command, as a
// user runs it (process start, reading, scoring, writing, exit), on two trials:
//   - a long real trial, 20,000 events (2,500 strides of a trot): target <= 0.1 s;
//   - a ceiling, 1,000,000 events: it must finish, <= 5 s and <= 600 MB peak memory.
// References measured in the same run: the same program's start-up alone (`--version`), and
// our CSV reader alone on the same file in this process. Each figure is the median of `runs`
// fresh processes; the peak memory is the child's maximum resident set (wait4).
// Usage: score_bench [runs=7] [events=20000] [ceiling-events=1000000]
#include <sys/resource.h>
#include <sys/wait.h>
#include <unistd.h>

#include <algorithm>
#include <chrono>
#include <cstdio>
#include <cstdlib>
#include <filesystem>
#include <random>
#include <string>
#include <vector>

#include "formats/events_csv.h"

#ifndef STRIDEMARK_EXE
#error "score_bench times the stridemark program: build it with the app target"
#endif

namespace {

namespace fs = std::filesystem;
using namespace stridemark;
using Clock = std::chrono::steady_clock;

double median(std::vector<double> values) {
  std::sort(values.begin(), values.end());
  const std::size_t n = values.size();
  return n % 2 ? values[n / 2] : 0.5 * (values[n / 2 - 1] + values[n / 2]);
}

// A seeded trot at 250 fps: ~100-frame strides (+-3 frames), duty factor ~0.4, diagonal pairs
// half a stride apart, each event jittered by up to 2 frames. 8 events per stride.
model::Annotation jitteredTrot(int strides, std::uint32_t seed) {
  std::mt19937 random(seed);
  std::uniform_int_distribution<int> strideJitter(-3, 3), eventJitter(-2, 2);
  model::Annotation annotation;
  annotation.captureRate = Rational{250, 1};
  const double offset[4] = {0.5, 0.0, 0.0, 0.5};  // LF, RF, LH, RH
  std::int64_t start = 10;
  for (int k = 0; k < strides; ++k) {
    const int length = 100 + strideJitter(random);
    for (int limb = 0; limb < 4; ++limb) {
      const std::int64_t touchdown =
          start + static_cast<std::int64_t>(offset[limb] * length) + eventJitter(random);
      annotation.events.push_back({touchdown, limb, model::EventKind::touchdown});
      annotation.events.push_back(
          {touchdown + 40 + eventJitter(random), limb, model::EventKind::liftoff});
    }
    start += length;
  }
  annotation.normalize();
  return annotation;
}

struct Run {
  double seconds = 0;
  double peakMb = 0;
};

// Runs STRIDEMARK_EXE with `args` (output to /dev/null), timed from fork to exit.
Run runCommand(const std::vector<std::string>& args) {
  const auto start = Clock::now();
  const pid_t pid = ::fork();
  if (pid == 0) {
    std::freopen("/dev/null", "w", stdout);
    std::freopen("/dev/null", "w", stderr);
    std::vector<char*> argv{const_cast<char*>(STRIDEMARK_EXE)};
    for (const std::string& a : args) argv.push_back(const_cast<char*>(a.c_str()));
    argv.push_back(nullptr);
    ::execv(STRIDEMARK_EXE, argv.data());
    std::_Exit(127);
  }
  int status = 0;
  rusage usage{};
  ::wait4(pid, &status, 0, &usage);
  Run run{std::chrono::duration<double>(Clock::now() - start).count(),
          static_cast<double>(usage.ru_maxrss) / 1024.0};  // KiB on Linux
  if (!WIFEXITED(status) || WEXITSTATUS(status) != 0) {
    std::string line = STRIDEMARK_EXE;
    for (const std::string& a : args) line += " " + a;
    std::fprintf(stderr, "score_bench: '%s' failed; run it by hand\n", line.c_str());
    std::exit(1);
  }
  return run;
}

double parseSeconds(const fs::path& csv) {
  const auto start = Clock::now();
  const auto parsed = formats::readEventsCsv(csv, {model::LimbSet::quadruped(), Rational{250, 1}});
  if (parsed.events.empty()) std::exit(1);
  return std::chrono::duration<double>(Clock::now() - start).count();
}

struct Figures {
  std::size_t events = 0;
  double commandS = 0, peakMb = 0, parseS = 0;
};

Figures measure(const fs::path& folder, int events, int runs, std::uint32_t seed) {
  const fs::path csv = folder / ("trot-" + std::to_string(events) + ".csv");
  const fs::path json = folder / ("trot-" + std::to_string(events) + ".json");
  const model::Annotation trial = jitteredTrot(std::max(1, events / 8), seed);
  formats::writeEventsCsv(csv, trial);
  Figures f;
  f.events = trial.events.size();
  std::vector<double> seconds, parses;
  for (int i = 0; i < runs; ++i) {
    fs::remove(json);  // a first scoring writes a new file
    const Run run = runCommand({"score", csv.string(), "--fps", "250", "--json", json.string()});
    seconds.push_back(run.seconds);
    f.peakMb = std::max(f.peakMb, run.peakMb);
    parses.push_back(parseSeconds(csv));
  }
  f.commandS = median(seconds);
  f.parseS = median(parses);
  return f;
}

const char* verdict(bool ok) {
  return ok ? "true" : "false";
}

}  // namespace

int main(int argc, char** argv) {
  const int runs = argc > 1 ? std::max(1, std::atoi(argv[1])) : 7;
  const int events = argc > 2 ? std::atoi(argv[2]) : 20000;
  const int ceilingEvents = argc > 3 ? std::atoi(argv[3]) : 1000000;
  const fs::path folder = fs::temp_directory_path() / ("score_bench_" + std::to_string(::getpid()));
  fs::create_directories(folder);

  std::vector<double> startups;
  for (int i = 0; i < runs; ++i) startups.push_back(runCommand({"--version"}).seconds);
  const double startupS = median(startups);
  const Figures trial = measure(folder, events, runs, 20261203);
  const Figures ceiling = measure(folder, ceilingEvents, std::min(runs, 3), 20261204);
  fs::remove_all(folder);

  const bool trialOk = trial.commandS <= 0.1;
  const bool ceilingOk = ceiling.commandS <= 5.0 && ceiling.peakMb <= 600.0;
  std::printf(
      "{\"benchmark\": \"score_command\", \"runs\": %d, \"startup_s\": %.4f,\n"
      " \"trial\": {\"events\": %zu, \"command_s\": %.4f, \"parse_only_s\": %.4f, "
      "\"command_to_startup_ratio\": %.2f, \"peak_rss_mb\": %.1f, \"target_s\": 0.1, "
      "\"pass\": %s},\n"
      " \"ceiling\": {\"events\": %zu, \"command_s\": %.3f, \"parse_only_s\": %.3f, "
      "\"command_to_parse_ratio\": %.2f, \"peak_rss_mb\": %.1f, \"target_s\": 5, "
      "\"target_mb\": 600, \"pass\": %s}}\n",
      runs, startupS, trial.events, trial.commandS, trial.parseS, trial.commandS / startupS,
      trial.peakMb, verdict(trialOk), ceiling.events, ceiling.commandS, ceiling.parseS,
      ceiling.commandS / ceiling.parseS, ceiling.peakMb, verdict(ceilingOk));
  return 0;  // the verdicts are in the JSON: a benchmark, not a timed test
}
