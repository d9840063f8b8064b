#include "common/batch_memory.h"

#include <algorithm>
#include <cstdint>
#include <cstdlib>

#if __has_include(<malloc.h>)
#include <malloc.h>
#endif
#if __has_include(<sys/mman.h>)
#include <sys/mman.h>
#endif

namespace stridemark {

void keepFreedMemoryForReuse() {
#if defined(M_MMAP_MAX) && defined(M_TRIM_THRESHOLD) && defined(M_ARENA_MAX)
  mallopt(M_MMAP_MAX, 0);                 // big blocks from the heap too, so they can be reused
  mallopt(M_TRIM_THRESHOLD, 1024 << 20);  // keep freed memory (a batch process is short-lived)
  mallopt(M_ARENA_MAX, 1);                // one heap, so memory freed by a helper thread is reused
#endif
}

void populatePages(void* data, std::size_t bytes, const std::atomic<bool>* stop) {
#if defined(MADV_POPULATE_WRITE)
  constexpr std::uintptr_t kPage = 4096;
  constexpr std::uintptr_t kPiece = std::uintptr_t{4} << 20;
  const auto begin = reinterpret_cast<std::uintptr_t>(data);
  const std::uintptr_t first = (begin + kPage - 1) & ~(kPage - 1);
  const std::uintptr_t last = (begin + bytes) & ~(kPage - 1);
  for (std::uintptr_t at = first; at < last && !(stop && stop->load()); at += kPiece) {
    const std::uintptr_t size = std::min(kPiece, last - at);
    // Failure (old kernel, memory pressure) leaves the pages to fault in on first use.
    static_cast<void>(::madvise(reinterpret_cast<void*>(at), size, MADV_POPULATE_WRITE));
  }
#else
  static_cast<void>(data);
  static_cast<void>(bytes);
  static_cast<void>(stop);
#endif
}

namespace {

// Asks for transparent huge pages on the whole huge pages inside [data, data + bytes).
void adviseHuge(void* data, std::size_t bytes) {
#if defined(MADV_HUGEPAGE)
  constexpr std::uintptr_t kHuge = std::uintptr_t{2} << 20;
  const auto begin = reinterpret_cast<std::uintptr_t>(data);
  const std::uintptr_t first = (begin + kHuge - 1) & ~(kHuge - 1);
  const std::uintptr_t last = (begin + bytes) & ~(kHuge - 1);
  if (last > first)
    static_cast<void>(::madvise(reinterpret_cast<void*>(first), last - first, MADV_HUGEPAGE));
#else
  static_cast<void>(data);
  static_cast<void>(bytes);
#endif
}

}  // namespace

HeapWarmup::HeapWarmup(std::size_t bytes) {
  constexpr std::size_t kWorthIt = std::size_t{16} << 20;
  if (bytes < kWorthIt || std::thread::hardware_concurrency() < 2) return;
  worker_ = std::jthread([this, bytes] {
    // One block: freed, it leaves one hole big enough for the largest later allocation.
    void* block = std::malloc(bytes);
    if (block == nullptr) return;
    adviseHuge(block, bytes);
    populatePages(block, bytes, &stop_);
    std::free(block);
  });
}

void HeapWarmup::finish() {
  stop_.store(true);
  if (worker_.joinable()) worker_.join();
}

}  // namespace stridemark
