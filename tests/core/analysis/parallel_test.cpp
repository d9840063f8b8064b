#include "analysis/parallel.h"

#include <gtest/gtest.h>

#include <atomic>
#include <functional>
#include <mutex>
#include <optional>
#include <stdexcept>
#include <thread>
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

TEST(Parallel, NoTasksIsFine) {
  forEachParallel(0, [](std::size_t) { FAIL(); });
}

// Common practice, no source: a production line keeps chunk order in every stage, hands a chunk
// on only when the stage before finished it, and never has more than `depth` chunks in flight.
TEST(Parallel, StagesTakeChunksInOrderWithBoundedDepth) {
  constexpr std::size_t kChunks = 200, kDepth = 3;
  std::mutex mutex;
  std::vector<std::vector<std::size_t>> seen(3);
  std::vector<std::size_t> finished(3, 0);
  std::size_t worstInFlight = 0;
  bool outOfTurn = false;
  const auto stage = [&](std::size_t s) {
    return [&, s](std::size_t chunk) {
      {
        std::lock_guard lock(mutex);
        if (s > 0 && finished[s - 1] <= chunk) outOfTurn = true;
        if (s == 0) worstInFlight = std::max(worstInFlight, chunk + 1 - finished[2]);
        seen[s].push_back(chunk);
      }
      std::this_thread::yield();
      std::lock_guard lock(mutex);
      ++finished[s];
    };
  };
  const std::function<void(std::size_t)> stages[] = {stage(0), stage(1), stage(2)};
  runStages(kChunks, kDepth, stages);
  EXPECT_FALSE(outOfTurn);
  EXPECT_LE(worstInFlight, kDepth);
  for (const auto& order : seen) {
    ASSERT_EQ(order.size(), kChunks);
    for (std::size_t k = 0; k < kChunks; ++k) EXPECT_EQ(order[k], k);
  }
}

// A single chunk goes through every stage in turn on the caller's thread.
TEST(Parallel, OneChunkRunsEveryStageOnTheCaller) {
  const auto caller = std::this_thread::get_id();
  std::vector<int> order;
  const auto stage = [&](int s) {
    return [&, s](std::size_t chunk) {
      EXPECT_EQ(chunk, 0u);
      EXPECT_EQ(std::this_thread::get_id(), caller);
      order.push_back(s);
    };
  };
  const std::function<void(std::size_t)> stages[] = {stage(0), stage(1), stage(2)};
  runStages(1, 3, stages);
  EXPECT_EQ(order, (std::vector<int>{0, 1, 2}));
  const std::function<void(std::size_t)> failing[] = {
      [](std::size_t) { throw std::runtime_error("lift-off before touchdown"); }, stage(9)};
  EXPECT_THROW(runStages(1, 3, failing), std::runtime_error);
  EXPECT_EQ(order.size(), 3u);  // the stage after the failure did not run
}

TEST(Parallel, AStageFailureStopsTheLineAndReachesTheCaller) {
  std::atomic<std::size_t> lastStarted{0};
  const std::function<void(std::size_t)> stages[] = {
      [&](std::size_t chunk) { lastStarted = chunk; },
      [](std::size_t chunk) {
        if (chunk == 5) throw std::runtime_error("disk full at chunk 5");
      },
      [](std::size_t chunk) { EXPECT_LT(chunk, 5u); },
  };
  EXPECT_THROW(runStages(1000, 2, stages), std::runtime_error);
  EXPECT_LT(lastStarted.load(), 10u);  // the first stage stopped soon after, not at chunk 999
  runStages(0, 2, stages);             // nothing to do is fine
  runStages(3, 2, {});
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
