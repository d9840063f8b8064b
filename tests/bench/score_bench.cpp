// Benchmark (not a ctest): `stridemark score --json OUT` on a 1,000,000-event quadruped events
// CSV versus merely parsing the same CSV with our reader (readEventsCsv alone, one thread).
// - Each measured run is a fresh process (this program re-executed with --child), as a real
//   `stridemark score` is: in one long-lived process, whichever step ran first left the
//   allocator's free memory to the other, and the ratio swung by 2x with no change in the code.
// - Parse and score runs are interleaved. Both children set up memory as the `stridemark`
//   command does (keepFreedMemoryForReuse).
// - Each score run writes a new report file, as a first scoring does: the previous run's report
//   is deleted before the child starts (on a disk mounted with `discard`, replacing a 56 MB file
//   costs another ~20 ms in rename(); a cost of overwriting, not of scoring).
// - Every child starts after sync() and a 3 s pause: the report is not fsynced (a regenerable
//   output, see formats/file_io.h), so its write-back would otherwise land in whichever child
//   runs next; and in a virtual machine with free page reporting, memory a process frees goes
//   back to the host 2 s later. With a shorter pause the parse child (run after a score child)
//   got warm pages and the score child cold ones: the first score run after a parse took twice
//   as long as an identical one run next. Both now start cold, as a single command does.
// Prints {"parse_s", "score_s", "ratio", "peak_rss_mb", ...}: medians of the runs. CPU times
// are the child's process CPU time (every thread, user + system) over the measured work only;
// *_s stage times are wall time.
// write_only_s: a third child writes as many bytes as the report to a new file and computes
// nothing; parse_plus_write_ratio = (parse_s + write_only_s) / parse_s is the least ratio any
// score run that writes this report could reach on this machine.
// command_s: the real `stridemark score CSV --fps 250 --json OUT`, timed from fork to exit
// (start-up, loading and exit included; 0 where the program is not built); command_ratio =
// command_s / parse_s holds the whole command to the same yardstick, which itself excludes them.
// round_ratio_*: score / parse within each round (a round takes ~10 s, so slower drifts of the
// machine cancel); their median, least and greatest show how far the ratio moves from run to run.
// Targets (issue 2): ratio <= 2.0, peak RSS < 300 MB.
// Usage: score_bench [runs=7] [strides-per-limb=125000] [pause-seconds=3]   (0: smoke test)
#include <fcntl.h>
#include <sys/resource.h>
#include <sys/wait.h>
#include <unistd.h>

#include <algorithm>
#include <chrono>
#include <cstdio>
#include <cstdlib>
#include <ctime>
#include <filesystem>
#include <random>
#include <string>
#include <vector>

#include "analysis/analyse.h"
#include "common/batch_memory.h"
#include "formats/events_csv.h"
#include "formats/file_io.h"
#include "formats/report_json.h"
#include "formats/write_behind.h"

namespace {

namespace fs = std::filesystem;
using namespace stridemark;
using Clock = std::chrono::steady_clock;

double secondsSince(Clock::time_point start) {
  return std::chrono::duration<double>(Clock::now() - start).count();
}

// CPU time of this process (all threads): fairer than wall time on a machine shared with builds.
double cpuSeconds() {
  timespec now{};
  clock_gettime(CLOCK_PROCESS_CPUTIME_ID, &now);
  return static_cast<double>(now.tv_sec) + 1e-9 * static_cast<double>(now.tv_nsec);
}

double median(std::vector<double> values) {
  std::sort(values.begin(), values.end());
  const std::size_t n = values.size();
  return n % 2 ? values[n / 2] : 0.5 * (values[n / 2 - 1] + values[n / 2]);
}

// A seeded trot at 250 fps: ~100-frame strides (+-3 frames), duty factor ~0.4, diagonal pairs
// LH+RF and RH+LF half a stride apart, each touchdown jittered by up to 2 frames.
model::Annotation jitteredTrot(int stridesPerLimb, std::uint32_t seed) {
  std::mt19937 random(seed);
  std::uniform_int_distribution<int> strideJitter(-3, 3), eventJitter(-2, 2);
  model::Annotation annotation;
  annotation.captureRate = Rational{250, 1};
  const double offset[4] = {0.5, 0.0, 0.0, 0.5};  // LF, RF, LH, RH
  std::int64_t start = 10;
  std::vector<std::int64_t> last(4, -1);
  annotation.events.reserve(static_cast<std::size_t>(stridesPerLimb) * 8);
  for (int k = 0; k < stridesPerLimb; ++k) {
    const int length = 100 + strideJitter(random);
    for (int limb = 0; limb < 4; ++limb) {
      const std::int64_t touchdown =
          start + static_cast<std::int64_t>(offset[limb] * length) + eventJitter(random);
      const std::int64_t liftoff = touchdown + 40 + eventJitter(random);
      annotation.events.push_back({touchdown, limb, model::EventKind::touchdown});
      annotation.events.push_back({liftoff, limb, model::EventKind::liftoff});
    }
    start += length;
  }
  annotation.normalize();
  return annotation;
}

// One measured step's figures, as a child prints them on stdout.
struct Sample {
  double wall = 0, cpu = 0, read = 0, analyse = 0, rssMb = 0;  // analyse: scoring and writing
  double readWall = 0, analyseWall = 0;                        // the same stages in wall time
  std::size_t count = 0;
};

// What `stridemark score INPUT --fps 250 --json OUT` does (app/cli/verb_score.cpp): read and
// parse, free the text, make the annotation (events left in file order), then score and write
// the report in one pass.
Sample scoreToJson(const fs::path& csvPath, const fs::path& jsonPath) {
  Sample out;
  const auto start = Clock::now();
  const double cpu0 = cpuSeconds();
  formats::EventsCsvOptions options;
  options.captureRate = Rational{250, 1};
  options.limbs = model::LimbSet::quadruped();
  model::Project project;
  {
    std::string content = formats::readWholeFile(csvPath);
    formats::EventsCsv csv = formats::parseEventsCsv(content, csvPath.string(), options);
    std::string().swap(content);
    project.annotation = formats::toAnnotationInFileOrder(std::move(csv));
  }
  const double cpu1 = cpuSeconds();
  const auto read = Clock::now();
  analysis::AnalysisOptions analysisOptions;
  analysisOptions.strideSupport = false;  // as the verb does
  const analysis::Report report =
      formats::scoreToReportJsonFile(jsonPath, std::move(project), analysisOptions);
  const double cpu2 = cpuSeconds();
  out.wall = secondsSince(start);
  out.readWall = std::chrono::duration<double>(read - start).count();
  out.analyseWall = out.wall - out.readWall;  // scoring and writing now run together
  out.cpu = cpu2 - cpu0;
  out.read = cpu1 - cpu0;
  out.analyse = cpu2 - cpu1;
  // Every stride is in exactly one bout; the strides themselves were not kept.
  out.count =
      report.bouts.empty() ? 0 : static_cast<std::size_t>(report.bouts.back().lastStride) + 1;
  return out;
}

// The yardstick: our reader on the same file, nothing else.
Sample parseOnly(const fs::path& csvPath) {
  Sample out;
  const auto start = Clock::now();
  const double cpu0 = cpuSeconds();
  out.count = formats::readEventsCsv(csvPath, {model::LimbSet::quadruped(), Rational{250, 1}})
                  .events.size();
  out.cpu = cpuSeconds() - cpu0;
  out.wall = secondsSince(start);
  return out;
}

// A floor for any run that writes the report: the same number of bytes written to a new file
// as `score` writes it (WriteBehindFile, regenerable, 1 MiB chunks), nothing computed.
Sample writeOnly(const fs::path& path, std::size_t bytes) {
  Sample out;
  const auto start = Clock::now();
  const double cpu0 = cpuSeconds();
  const std::string chunk(std::size_t{1} << 20, ' ');
  formats::WriteBehindFile file(path, formats::Durability::regenerable);
  for (std::size_t left = bytes; left > 0;) {
    const std::size_t n = std::min(left, chunk.size());
    file.write(std::string_view(chunk.data(), n));
    left -= n;
  }
  file.commit();
  out.cpu = cpuSeconds() - cpu0;
  out.wall = secondsSince(start);
  out.count = bytes;
  return out;
}

double peakRssMb() {
  rusage usage{};
  getrusage(RUSAGE_SELF, &usage);
  return static_cast<double>(usage.ru_maxrss) / 1024.0;  // ru_maxrss is in KiB on Linux
}

// The same start for every child (see the top of this file): a quiet disk, and a pause longer
// than the kernel's free page reporting delay (2 s), so the memory the previous child freed has
// gone back to the host and every child starts equally cold.
void startEquallyCold(unsigned pauseSeconds) {
  ::sync();
  ::sleep(pauseSeconds);
}

// Waits for child `pid`; true when it exited with status 0.
bool exitedCleanly(pid_t pid) {
  int status = 0;
  ::waitpid(pid, &status, 0);
  return WIFEXITED(status) && WEXITSTATUS(status) == 0;
}

// Runs `self --child MODE CSV JSON` and reads back its Sample.
Sample runChild(const char* self, const char* mode, const fs::path& csvPath,
                const fs::path& jsonPath, unsigned pauseSeconds) {
  startEquallyCold(pauseSeconds);
  int pipeFds[2];
  if (::pipe(pipeFds) != 0) std::abort();
  const pid_t pid = ::fork();
  if (pid == 0) {
    ::dup2(pipeFds[1], STDOUT_FILENO);
    ::close(pipeFds[0]);
    ::close(pipeFds[1]);
    const std::string csv = csvPath.string(), json = jsonPath.string();
    ::execl(self, self, "--child", mode, csv.c_str(), json.c_str(), static_cast<char*>(nullptr));
    std::_Exit(127);
  }
  ::close(pipeFds[1]);
  std::string text;
  char buffer[512];
  for (ssize_t got; (got = ::read(pipeFds[0], buffer, sizeof buffer)) > 0;)
    text.append(buffer, static_cast<std::size_t>(got));
  ::close(pipeFds[0]);
  Sample s;
  if (!exitedCleanly(pid) ||
      std::sscanf(text.c_str(), "%lf %lf %lf %lf %lf %zu %lf %lf", &s.wall, &s.cpu, &s.read,
                  &s.analyse, &s.rssMb, &s.count, &s.readWall, &s.analyseWall) != 8) {
    std::fprintf(stderr, "score_bench: child '%s' failed\n", mode);
    std::exit(1);
  }
  return s;
}

#ifdef STRIDEMARK_EXE
// The whole command as a user runs it: `stridemark score CSV --fps 250 --json OUT`, timed from
// fork to its exit (process start, loading, reading, scoring, writing and exit included), after
// the same sync and pause as every child.
double runCommand(const fs::path& csvPath, const fs::path& jsonPath, unsigned pauseSeconds) {
  startEquallyCold(pauseSeconds);
  const std::string csv = csvPath.string(), json = jsonPath.string();
  const auto start = Clock::now();
  const pid_t pid = ::fork();
  if (pid == 0) {
    const int quiet = ::open("/dev/null", O_WRONLY);  // its "wrote ..." line on stderr too
    if (quiet >= 0) {
      ::dup2(quiet, STDOUT_FILENO);
      ::dup2(quiet, STDERR_FILENO);
    }
    ::execl(STRIDEMARK_EXE, STRIDEMARK_EXE, "score", csv.c_str(), "--fps", "250", "--json",
            json.c_str(), static_cast<char*>(nullptr));
    std::_Exit(127);
  }
  const bool ok = exitedCleanly(pid);
  const double seconds = secondsSince(start);
  if (!ok) {
    std::fprintf(stderr, "score_bench: %s score %s --fps 250 --json %s failed; run it by hand\n",
                 STRIDEMARK_EXE, csv.c_str(), json.c_str());
    std::exit(1);
  }
  return seconds;
}
#endif

int childMain(const std::string& mode, const fs::path& csvPath, const fs::path& jsonPath) {
  keepFreedMemoryForReuse();  // as app/cli/run.cpp does before any verb
  const Sample s = mode == "parse"              ? parseOnly(csvPath)
                   : mode.starts_with("write:") ? writeOnly(jsonPath, std::stoull(mode.substr(6)))
                                                : scoreToJson(csvPath, jsonPath);
  std::printf("%.6f %.6f %.6f %.6f %.3f %zu %.6f %.6f\n", s.wall, s.cpu, s.read, s.analyse,
              peakRssMb(), s.count, s.readWall, s.analyseWall);
  return 0;
}

}  // namespace

int main(int argc, char** argv) {
  if (argc == 5 && std::string(argv[1]) == "--child") return childMain(argv[2], argv[3], argv[4]);
  const int runs = std::max(5, argc > 1 ? std::atoi(argv[1]) : 7);
  const int stridesPerLimb = argc > 2 ? std::atoi(argv[2]) : 125000;
  const auto pause = static_cast<unsigned>(argc > 3 ? std::max(0, std::atoi(argv[3])) : 3);
  const fs::path folder = fs::temp_directory_path() / ("score_bench-" + std::to_string(::getpid()));
  fs::create_directories(folder);
  const fs::path csvPath = folder / "trot.csv";
  const fs::path jsonPath = folder / "report.json";
  std::size_t events = 0;
  {
    const model::Annotation trot = jitteredTrot(stridesPerLimb, 42);
    events = trot.events.size();
    formats::writeEventsCsv(csvPath, trot, "score_bench seeded trot (seed 42)");
  }
  const std::string self = fs::read_symlink("/proc/self/exe").string();
  const fs::path bytesPath = folder / "bytes.json";
  std::vector<double> parse, score, parseCpu, scoreCpu, read, analyse, rss, writeFloor;
  std::vector<double> readWall, analyseWall;
  std::vector<double> roundRatio;  // score / parse of the same round: machine drift cancels
  std::vector<double> command;     // the whole `stridemark score` process, where it is built
  std::size_t strides = 0, parsed = 0;
  for (int run = 0; run < runs; ++run) {
    const Sample p = runChild(self.c_str(), "parse", csvPath, jsonPath, pause);
    fs::remove(jsonPath);
    const Sample s = runChild(self.c_str(), "score", csvPath, jsonPath, pause);
    fs::remove(bytesPath);
    const std::string write = "write:" + std::to_string(fs::file_size(jsonPath));
    writeFloor.push_back(runChild(self.c_str(), write.c_str(), csvPath, bytesPath, pause).wall);
#ifdef STRIDEMARK_EXE
    fs::remove(jsonPath);
    command.push_back(runCommand(csvPath, jsonPath, pause));
#endif
    parsed = p.count;
    strides = s.count;
    parse.push_back(p.wall);
    roundRatio.push_back(s.wall / p.wall);
    parseCpu.push_back(p.cpu);
    score.push_back(s.wall);
    scoreCpu.push_back(s.cpu);
    read.push_back(s.read);
    analyse.push_back(s.analyse);
    rss.push_back(s.rssMb);
    readWall.push_back(s.readWall);
    analyseWall.push_back(s.analyseWall);
  }
  const double parseS = median(parse), scoreS = median(score);
  std::printf(
      "{\"benchmark\": \"score_vs_parse\", \"process_per_run\": true, \"events\": %zu, "
      "\"parsed\": %zu, \"strides\": %zu, \"csv_mb\": %.1f, \"json_mb\": %.1f, \"runs\": %d, "
      "\"parse_s\": %.4f, \"score_s\": %.4f, \"ratio\": %.3f, \"peak_rss_mb\": %.1f, "
      "\"parse_cpu_s\": %.4f, \"score_cpu_s\": %.4f, \"ratio_cpu\": %.3f, "
      "\"score_read_cpu_s\": %.4f, \"score_analyse_and_write_cpu_s\": %.4f, "
      "\"score_read_s\": %.4f, \"score_analyse_and_write_s\": %.4f, "
      "\"write_only_s\": %.4f, \"parse_plus_write_ratio\": %.3f, "
      "\"round_ratio_median\": %.3f, \"round_ratio_min\": %.3f, \"round_ratio_max\": %.3f, "
      "\"command_s\": %.4f, \"command_ratio\": %.3f, "
      "\"target_ratio\": 2.0, \"target_peak_rss_mb\": 300}\n",
      events, parsed, strides, static_cast<double>(fs::file_size(csvPath)) / 1e6,
      static_cast<double>(fs::file_size(jsonPath)) / 1e6, runs, parseS, scoreS, scoreS / parseS,
      *std::max_element(rss.begin(), rss.end()), median(parseCpu), median(scoreCpu),
      median(scoreCpu) / median(parseCpu), median(read), median(analyse), median(readWall),
      median(analyseWall), median(writeFloor), (parseS + median(writeFloor)) / parseS,
      median(roundRatio), *std::min_element(roundRatio.begin(), roundRatio.end()),
      *std::max_element(roundRatio.begin(), roundRatio.end()),
      command.empty() ? 0.0 : median(command), command.empty() ? 0.0 : median(command) / parseS);
  std::error_code ec;
  fs::remove_all(folder, ec);
  return 0;
}
