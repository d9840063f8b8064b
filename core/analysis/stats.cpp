#include "analysis/stats.h"

#include <cmath>

namespace stridemark::analysis {

Stat describe(std::span<const double> values) {
  Stat out;
  const std::size_t n = values.size();
  out.n = static_cast<int>(n);
  if (n == 0) return out;
  double sum = 0;
  for (const double v : values) sum += v;
  out.mean = sum / static_cast<double>(n);
  if (n < 2) return out;
  double squares = 0;
  for (const double v : values) squares += (v - out.mean) * (v - out.mean);
  out.sd = std::sqrt(squares / static_cast<double>(n - 1));
  if (out.mean != 0) out.cv = out.sd / out.mean;
  return out;
}

}  // namespace stridemark::analysis
