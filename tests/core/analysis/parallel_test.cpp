#include "analysis/parallel.h"

#include <gtest/gtest.h>

#include <atomic>
#include <optional>
#include <stdexcept>
#include <vector>

#include "analysis/limb_values.h"

namespace stridemark::analysis {
namespace {

// Common practice, no source: a fork-join runs every task exactly once and reports a failure.
TEST(Parallel, EveryTaskRunsExactlyOnce) {
  std::vector<std::atomic<int>> runs(1000);
  forEachParallel(runs.size(), [&](std::size_t i) { runs[i].fetch_add(1); });
  for (const auto& r : runs) EXPECT_EQ(r.load(), 1);
}

TEST(Parallel, FirstExceptionReachesTheCallerAfterAllThreadsStop) {
  std::atomic<int> started{0};
  EXPECT_THROW(forEachParallel(100,
                               [&](std::size_t i) {
                                 started.fetch_add(1);
                                 if (i == 3) throw std::runtime_error("tag at frame 3");
                               }),
               std::runtime_error);
  EXPECT_GE(started.load(), 4);
}

TEST(Parallel, RunBothRunsBoth) {
  int first = 0, second = 0;
  runBoth([&] { first = 1; }, [&] { second = 2; });
  EXPECT_EQ(first + second, 3);
}

TEST(Parallel, NoTasksIsFine) {
  forEachParallel(0, [](std::size_t) { FAIL(); });
}

// Per-limb values spill to the heap past four limbs (hexapods): copies are deep, moves leave
// an empty source.
TEST(LimbValues, HexapodValuesCopyAndMove) {
  LimbValues<std::optional<double>> six;
  six.assign(6, std::nullopt);
  six[5] = 0.5;
  LimbValues<std::optional<double>> copy = six;
  copy[5] = 0.25;
  EXPECT_EQ(six[5], 0.5);
  EXPECT_EQ(copy.size(), 6u);
  LimbValues<std::optional<double>> moved = std::move(copy);
  EXPECT_EQ(moved[5], 0.25);
  EXPECT_TRUE(copy.empty());  // NOLINT(bugprone-use-after-move): defined as empty
  moved = six;
  EXPECT_TRUE(moved == six);
  LimbValues<int> four{1, 2, 3, 4};
  four.assign(6, 7);
  EXPECT_EQ(four[5], 7);
  four.assign(2, 9);
  EXPECT_EQ(four.size(), 2u);
  EXPECT_EQ(four[1], 9);
}

}  // namespace
}  // namespace stridemark::analysis
