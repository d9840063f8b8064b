#include "analysis/stats.h"

#include <cmath>

namespace stridemark::analysis {

Stat describe(std::span<const double> values) {
  Stat out;
  out.n = static_cast<int>(values.size());
  if (values.empty()) return out;
  double sum = 0;
  for (double v : values) sum += v;
  out.mean = sum / static_cast<double>(values.size());
  if (values.size() < 2) return out;
  double squares = 0;
  for (double v : values) squares += (v - out.mean) * (v - out.mean);
  out.sd = std::sqrt(squares / static_cast<double>(values.size() - 1));
  if (out.mean != 0) out.cv = out.sd / out.mean;
  return out;
}

}  // namespace stridemark::analysis
