#pragma once
// Linear summary statistics for durations and duty factors (n, mean, sample SD, CV).
#include <cmath>
#include <cstddef>
#include <span>

#include "analysis/report.h"

namespace stridemark::analysis {

// Mean, sample SD (n - 1) and CV = SD / mean; fields stay NaN where undefined.
Stat describe(std::span<const double> values);

// The same, over values made on demand, so long trials need not store them: forEach(f) must
// call f(value) for every value, in the same order each time (it is called twice).
template <typename ForEach>
Stat describeEach(ForEach forEach) {
  Stat out;
  double sum = 0;
  std::size_t n = 0;
  forEach([&](double v) {
    sum += v;
    ++n;
  });
  out.n = static_cast<int>(n);
  if (n == 0) return out;
  out.mean = sum / static_cast<double>(n);
  if (n < 2) return out;
  double squares = 0;
  forEach([&](double v) { squares += (v - out.mean) * (v - out.mean); });
  out.sd = std::sqrt(squares / static_cast<double>(n - 1));
  if (out.mean != 0) out.cv = out.sd / out.mean;
  return out;
}

}  // namespace stridemark::analysis
