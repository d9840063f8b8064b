#pragma once
// Memory policy for short-lived batch commands (`stridemark score`, ...).
//
// In a virtual machine every fresh page costs a fault and a zeroing, about 1 ms per MB measured
// by tests/bench/score_bench; scoring 10^6 events touches ~170 MB, so faults, not arithmetic,
// were most of `stridemark score`. Two remedies: freed memory stays in the process for the next
// stage, and a second core faults in the memory analysis will need while the first parses.
#include <atomic>
#include <cstddef>
#include <thread>

namespace stridemark {

// Keeps every allocation in the heap (no per-block mmap/munmap) and freed memory in the process,
// so each stage reuses the pages of the one before. Call once at the start of a batch process;
// not for the desk app, whose heap would then stay at its peak for the whole session.
// A no-op off glibc.
void keepFreedMemoryForReuse();

// Heap to warm for scoring, per byte of an events CSV (lines average ~20 bytes). Analysis keeps
// ~130 bytes per event (stride records, cycles, per-limb states); the parser's buffers, freed
// before analysis, cover the rest. 6 measured best in score_bench (8 raised the peak RSS to
// ~290 MB for no gain).
inline constexpr std::size_t kScoreHeapPerInputByte = 6;

// Faults in the whole pages of [data, data + bytes) for writing, a few MiB per system call:
// populating holds the address-space lock, and other threads' allocations (brk) wait for it.
// Stops early once `stop` is set. Only a hint: where unsupported, pages fault in on first use.
void populatePages(void* data, std::size_t bytes, const std::atomic<bool>* stop = nullptr);

// Faults in `bytes` of heap on another core and gives them back to the allocator, so the
// stages that follow allocate warm pages. Needs keepFreedMemoryForReuse(). Does nothing on a
// single core (it would only take time from the caller) or for a small amount.
class HeapWarmup {
 public:
  explicit HeapWarmup(std::size_t bytes);
  ~HeapWarmup() { finish(); }
  HeapWarmup(const HeapWarmup&) = delete;
  HeapWarmup& operator=(const HeapWarmup&) = delete;

  // Stops warming and frees the block, warm or not, for the caller's next allocations. Call
  // when the work that needs the memory starts: on a slow machine warming may not be done yet,
  // and it would then compete with that work instead of preparing for it.
  void finish();

 private:
  std::atomic<bool> stop_{false};
  std::jthread worker_;
};

}  // namespace stridemark
