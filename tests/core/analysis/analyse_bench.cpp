// Benchmark (not a ctest): analyse a 1,000,000-event quadruped annotation and print JSON with
// the time of `analyse` and, as the in-run reference, the time of sorting the same events
// (Annotation::normalize); also analyse without per-stride support maps. Usage: analyse_bench
// [strides-per-limb=125000] [repeats=3]
#include <algorithm>
#include <chrono>
#include <cstdio>
#include <cstdlib>
#include <ctime>
#include <random>
#include <vector>

#include "analysis/analyse.h"
#include "event_train.h"

namespace {

double secondsSince(std::chrono::steady_clock::time_point start) {
  return std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count();
}

// Process CPU time: on a shared machine wall time mostly measures the neighbours.
double cpuSeconds() {
  return static_cast<double>(std::clock()) / CLOCKS_PER_SEC;
}

}  // namespace

int main(int argc, char** argv) {
  const int strides = argc > 1 ? std::atoi(argv[1]) : 125000;
  const int repeats = argc > 2 ? std::atoi(argv[2]) : 3;
  const stridemark::model::Annotation base =
      stridemark::testing::symmetricalQuadruped(0.6, 0.25, 120, strides);
  double bestAnalyse = 1e30, bestSort = 1e30, firstAnalyse = 0, bestLean = 1e30;
  double firstCpu = 0, bestCpu = 1e30, bestSortCpu = 1e30;
  stridemark::analysis::AnalysisOptions lean;
  lean.strideSupport = false;
  std::size_t strideCount = 0;
  for (int rep = 0; rep < repeats; ++rep) {
    stridemark::model::Annotation shuffled = base;
    std::shuffle(shuffled.events.begin(), shuffled.events.end(), std::mt19937(7));
    auto start = std::chrono::steady_clock::now();
    double cpu = cpuSeconds();
    shuffled.normalize();
    bestSort = std::min(bestSort, secondsSince(start));
    bestSortCpu = std::min(bestSortCpu, cpuSeconds() - cpu);
    start = std::chrono::steady_clock::now();
    cpu = cpuSeconds();
    const stridemark::analysis::Report report = stridemark::analysis::analyse(base);
    const double t = secondsSince(start);
    cpu = cpuSeconds() - cpu;
    if (rep == 0) firstAnalyse = t;
    if (rep == 0) firstCpu = cpu;
    bestCpu = std::min(bestCpu, cpu);
    bestAnalyse = std::min(bestAnalyse, t);
    strideCount = report.strides.size();
    start = std::chrono::steady_clock::now();
    const stridemark::analysis::Report leanReport = stridemark::analysis::analyse(base, lean);
    bestLean = std::min(bestLean, secondsSince(start));
  }
  std::printf(
      "{\"benchmark\": \"analyse_quadruped\", \"events\": %zu, \"strides\": %zu, "
      "\"analyse_first_s\": %.4f, \"analyse_best_s\": %.4f, "
      "\"analyse_no_stride_support_best_s\": %.4f, \"sort_events_best_s\": %.4f, "
      "\"ratio_analyse_to_sort\": %.3f, \"analyse_first_cpu_s\": %.4f, "
      "\"analyse_best_cpu_s\": %.4f, \"sort_events_best_cpu_s\": %.4f}\n",
      base.events.size(), strideCount, firstAnalyse, bestAnalyse, bestLean, bestSort,
      bestAnalyse / bestSort, firstCpu, bestCpu, bestSortCpu);
  return 0;
}
