#pragma once
// Scoring 10^6 events fills ~100 MB of fresh vectors. On a 4 KiB page each first touch is a
// page fault; in a virtual machine a fault costs several microseconds (measured: ~3 ms per MB of
// fresh memory, against ~0.15 ms per MB on 2 MiB pages), so faults, not arithmetic, were most of
// `stridemark score`. Big buffers therefore ask the kernel for transparent huge pages. Only a
// hint: a no-op off Linux, for small buffers, or when the kernel declines.
#include <cstddef>
#include <cstdlib>
#include <memory>
#include <new>
#include <vector>

namespace stridemark {

inline constexpr std::size_t kHugePage = std::size_t{2} << 20;

// Hints huge pages for the whole pages inside [data, data + bytes).
void adviseHugePages(void* data, std::size_t bytes);

// Same, for the reserved capacity of `values` (call right after reserve, before filling).
template <typename T, typename A>
void adviseHugePages(std::vector<T, A>& values) {
  adviseHugePages(static_cast<void*>(values.data()), values.capacity() * sizeof(T));
}

// Reserves room for `count` elements and hints huge pages for it (before the first write).
template <typename T, typename A>
void reserveHuge(std::vector<T, A>& values, std::size_t count) {
  values.reserve(count);
  adviseHugePages(values);
}

// Allocator for internal buffers of 256 KiB or more: whole, aligned huge pages (a std::vector's
// own block is rarely aligned, which leaves up to 2 MiB at each end on small pages). Zeroing one
// huge page costs less than faulting in 64 small ones, so even a quarter-MiB buffer gains.
template <typename T>
struct HugePageAllocator {
  using value_type = T;
  HugePageAllocator() = default;
  template <typename U>
  HugePageAllocator(const HugePageAllocator<U>&) {}  // NOLINT(google-explicit-constructor)

  T* allocate(std::size_t n) {
    const std::size_t bytes = n * sizeof(T);
    if (bytes < kSmallest) return std::allocator<T>{}.allocate(n);
    const std::size_t rounded = (bytes + kHugePage - 1) & ~(kHugePage - 1);
    void* block = std::aligned_alloc(kHugePage, rounded);
    if (block == nullptr) throw std::bad_alloc();
    adviseHugePages(block, rounded);
    return static_cast<T*>(block);
  }
  void deallocate(T* p, std::size_t n) {
    if (n * sizeof(T) < kSmallest) {
      std::allocator<T>{}.deallocate(p, n);
    } else {
      std::free(p);
    }
  }
  template <typename U>
  bool operator==(const HugePageAllocator<U>&) const {
    return true;
  }

 private:
  static constexpr std::size_t kSmallest = std::size_t{256} << 10;
};

template <typename T>
using HugeVector = std::vector<T, HugePageAllocator<T>>;

}  // namespace stridemark
