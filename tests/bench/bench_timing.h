#pragma once
// Shared by the benchmarks: wall-clock seconds and the median of rounds (the machine is noisy,
// so every benchmark reports medians of interleaved rounds).
#include <algorithm>
#include <chrono>
#include <vector>

namespace stridemark::bench {

using Clock = std::chrono::steady_clock;

inline double secondsSince(Clock::time_point start) {
  return std::chrono::duration<double>(Clock::now() - start).count();
}

// The value at rank n / 2 of the sorted rounds.
inline double median(std::vector<double> v) {
  std::sort(v.begin(), v.end());
  return v[v.size() / 2];
}

}  // namespace stridemark::bench
