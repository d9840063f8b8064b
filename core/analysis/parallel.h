#pragma once
// Pieces of one scoring run on the machine's cores. Scoring is short (well under a second for
// 10^6 events), so there is no pool: a plain fork-join (at most one thread per core) for
// independent pieces, and a production line of one thread per stage for work in sequence.
#include <algorithm>
#include <atomic>
#include <condition_variable>
#include <cstddef>
#include <exception>
#include <functional>
#include <mutex>
#include <span>
#include <thread>
#include <vector>

namespace stridemark::analysis {

// Threads worth starting for `tasks` pieces of work (1 = run on the caller only).
inline std::size_t workerCount(std::size_t tasks) {
  const std::size_t cores = std::max(1u, std::thread::hardware_concurrency());
  return std::max<std::size_t>(1, std::min(tasks, cores));
}

// Calls task(i) for every i in [0, count), in any order and on any of workerCount(count)
// threads (the caller is one of them). The first exception a task throws is rethrown here after
// every thread has stopped; tasks not yet started are then skipped.
template <typename Task>
void forEachParallel(std::size_t count, Task task) {
  std::atomic<std::size_t> next{0};
  std::atomic<bool> failed{false};
  std::exception_ptr error;
  std::atomic_flag errorTaken;
  const auto work = [&] {
    for (std::size_t i; !failed.load() && (i = next.fetch_add(1)) < count;) {
      try {
        task(i);
      } catch (...) {
        if (!errorTaken.test_and_set()) error = std::current_exception();
        failed.store(true);
      }
    }
  };
  {
    std::vector<std::jthread> helpers;
    for (std::size_t t = 1; t < workerCount(count); ++t) helpers.emplace_back(work);
    work();
  }  // joins the helpers
  if (error) std::rethrow_exception(error);
}

// A production line: every stage handles chunks 0, 1, ... in order, each stage on a thread of
// its own (the first on the caller's), so different chunks are in different stages at once.
// Stage s takes chunk k only once stage s - 1 has finished it; the first stage starts chunk k
// only once the last has finished chunk k - depth, so at most `depth` chunks are in flight (a
// caller cycling through `depth` buffers never overwrites one still in use). A single chunk
// goes through the stages on the caller's thread. After a stage throws, no stage starts another
// chunk, and the first exception is rethrown here once every thread has stopped.
inline void runStages(std::size_t chunks, std::size_t depth,
                      std::span<const std::function<void(std::size_t)>> stages) {
  const std::size_t count = stages.size();
  if (count == 0 || chunks == 0) return;
  if (count == 1 || chunks == 1) {  // nothing to overlap (a short trial): no threads to start
    for (std::size_t chunk = 0; chunk < chunks; ++chunk)
      for (const auto& stage : stages) stage(chunk);
    return;
  }
  depth = std::max<std::size_t>(depth, 1);
  std::mutex mutex;
  std::condition_variable changed;
  std::vector<std::size_t> finished(count, 0);  // per stage: chunks done
  std::exception_ptr error;
  const auto mayStart = [&](std::size_t stage, std::size_t chunk) {
    if (stage > 0) return finished[stage - 1] > chunk;
    return chunk < depth || finished[count - 1] > chunk - depth;
  };
  const auto work = [&](std::size_t stage) {
    for (std::size_t chunk = 0; chunk < chunks; ++chunk) {
      {
        std::unique_lock lock(mutex);
        changed.wait(lock, [&] { return error || mayStart(stage, chunk); });
        if (error) return;
      }
      try {
        stages[stage](chunk);
      } catch (...) {
        std::lock_guard lock(mutex);
        if (!error) error = std::current_exception();
        changed.notify_all();
        return;
      }
      {
        std::lock_guard lock(mutex);
        ++finished[stage];
      }
      changed.notify_all();
    }
  };
  {
    std::vector<std::jthread> helpers;
    for (std::size_t stage = 1; stage < count; ++stage) helpers.emplace_back(work, stage);
    work(0);
  }  // joins the helpers
  if (error) std::rethrow_exception(error);
}

}  // namespace stridemark::analysis
