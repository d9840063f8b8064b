#pragma once
// Independent pieces of one scoring run on the machine's cores. Scoring is short (well under a
// second for 10^6 events), so this is a plain fork-join: no pool, at most one thread per core.
#include <algorithm>
#include <atomic>
#include <cstddef>
#include <exception>
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

// Runs `first` and `second` at the same time; rethrows the first exception either threw.
template <typename First, typename Second>
void runBoth(First first, Second second) {
  forEachParallel(2, [&](std::size_t i) { i == 0 ? first() : second(); });
}

}  // namespace stridemark::analysis
