#pragma once
// Memory policy for short-lived batch commands (`stridemark score`, ...).

namespace stridemark {

// A batch command allocates and frees buffers of tens of MB one after another: the file's text,
// the parsed rows, the annotation, the analysis. By default glibc hands each freed large block
// back to the kernel, so the next stage faults in and zeroes fresh pages (in a virtual machine
// about 1 ms per MB, measured by tests/bench/score_bench). This keeps every allocation in the
// heap and freed memory in the process, so each stage reuses the pages of the one before.
// Call once at the start of a batch process; not for the desk app, whose heap would then stay
// at its peak for the whole session. A no-op off glibc.
void keepFreedMemoryForReuse();

}  // namespace stridemark
