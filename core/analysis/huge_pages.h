#pragma once
// Scoring 10^6 events fills ~100 MB of fresh vectors; on a 4 KiB page each first touch is a
// page fault, which profiling showed as the largest single cost of `analyse`. Asking the kernel
// for transparent huge pages on those buffers cuts the faults ~500-fold. Only a hint: a no-op
// off Linux, for small buffers, or when the kernel declines.
#include <cstddef>
#include <vector>

namespace stridemark::analysis {

// Hints huge pages for the whole pages inside [data, data + bytes).
void adviseHugePages(void* data, std::size_t bytes);

// Same, for the reserved capacity of `values` (call right after reserve, before filling).
template <typename T>
void adviseHugePages(std::vector<T>& values) {
  adviseHugePages(static_cast<void*>(values.data()), values.capacity() * sizeof(T));
}

}  // namespace stridemark::analysis
