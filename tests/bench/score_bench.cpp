// Benchmark (not a ctest): `stridemark score --json OUT` on a 1,000,000-event quadruped events
// CSV versus merely parsing the same CSV with our reader, in one process, interleaved.
// Prints {"parse_s", "score_s", "ratio", "peak_rss_mb", ...}; medians of the runs.
// Targets (issue 2): ratio <= 2.0, peak RSS < 300 MB.
// Usage: score_bench [runs=7] [strides-per-limb=125000]
#include <sys/resource.h>
#include <unistd.h>

#include <algorithm>
#include <chrono>
#include <cstdio>
#include <cstdlib>
#include <ctime>
#include <filesystem>
#include <random>
#include <vector>

#include "analysis/analyse.h"
#include "formats/events_csv.h"
#include "formats/file_io.h"
#include "formats/report_json.h"

namespace {

namespace fs = std::filesystem;
using namespace stridemark;
using Clock = std::chrono::steady_clock;

double secondsSince(Clock::time_point start) {
  return std::chrono::duration<double>(Clock::now() - start).count();
}

// CPU time of this (single) thread: fairer than wall time on a machine shared with builds.
double cpuSeconds() {
  timespec now{};
  clock_gettime(CLOCK_THREAD_CPUTIME_ID, &now);
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

struct Stages {
  std::vector<double> read, analyse, write;
};

// What `stridemark score INPUT --fps 250 --json OUT` does (app/cli/verb_score.cpp).
std::size_t scoreToJson(const fs::path& csvPath, const fs::path& jsonPath, Stages& stages) {
  double cpuStart = cpuSeconds();
  formats::EventsCsvOptions options;
  options.captureRate = Rational{250, 1};
  options.limbs = model::LimbSet::quadruped();
  formats::EventsCsv csv = formats::readEventsCsv(csvPath, options);
  model::Project project;
  project.annotation = formats::toAnnotation(std::move(csv));
  stages.read.push_back(cpuSeconds() - cpuStart);
  cpuStart = cpuSeconds();
  analysis::AnalysisOptions analysisOptions;
  analysisOptions.strideSupport = false;  // as the verb does
  const analysis::Report report = analysis::analyse(project, analysisOptions);
  stages.analyse.push_back(cpuSeconds() - cpuStart);
  cpuStart = cpuSeconds();
  formats::writeReportJsonFile(jsonPath, report);
  stages.write.push_back(cpuSeconds() - cpuStart);
  return report.strides.size();
}

double peakRssMb() {
  rusage usage{};
  getrusage(RUSAGE_SELF, &usage);
  return static_cast<double>(usage.ru_maxrss) / 1024.0;  // ru_maxrss is in KiB on Linux
}

}  // namespace

int main(int argc, char** argv) {
  const int runs = std::max(5, argc > 1 ? std::atoi(argv[1]) : 7);
  const int stridesPerLimb = argc > 2 ? std::atoi(argv[2]) : 125000;
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
  const double rssAfterGenerate = peakRssMb();
  std::vector<double> parse, score, parseCpu, scoreCpu;
  Stages stages;
  std::size_t strides = 0, parsed = 0;
  for (int run = 0; run < runs; ++run) {
    auto start = Clock::now();
    double cpu = cpuSeconds();
    parsed = formats::readEventsCsv(csvPath, {model::LimbSet::quadruped(), Rational{250, 1}})
                 .events.size();
    parse.push_back(secondsSince(start));
    parseCpu.push_back(cpuSeconds() - cpu);
    start = Clock::now();
    cpu = cpuSeconds();
    strides = scoreToJson(csvPath, jsonPath, stages);
    score.push_back(secondsSince(start));
    scoreCpu.push_back(cpuSeconds() - cpu);
  }
  const double parseS = median(parse), scoreS = median(score);
  std::printf(
      "{\"benchmark\": \"score_vs_parse\", \"events\": %zu, \"parsed\": %zu, \"strides\": %zu, "
      "\"csv_mb\": %.1f, \"json_mb\": %.1f, \"runs\": %d, \"parse_s\": %.4f, \"score_s\": %.4f, "
      "\"ratio\": %.3f, \"peak_rss_mb\": %.1f, \"peak_rss_after_generate_mb\": %.1f, "
      "\"parse_cpu_s\": %.4f, \"score_cpu_s\": %.4f, \"ratio_cpu\": %.3f, "
      "\"score_read_cpu_s\": %.4f, \"score_analyse_cpu_s\": %.4f, \"score_write_json_cpu_s\": "
      "%.4f, "
      "\"target_ratio\": 2.0, \"target_peak_rss_mb\": 300}\n",
      events, parsed, strides, static_cast<double>(fs::file_size(csvPath)) / 1e6,
      static_cast<double>(fs::file_size(jsonPath)) / 1e6, runs, parseS, scoreS, scoreS / parseS,
      peakRssMb(), rssAfterGenerate, median(parseCpu), median(scoreCpu),
      median(scoreCpu) / median(parseCpu), median(stages.read), median(stages.analyse),
      median(stages.write));
  std::error_code ec;
  fs::remove_all(folder, ec);
  return 0;
}
