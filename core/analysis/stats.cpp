#include "analysis/stats.h"

namespace stridemark::analysis {

Stat describe(std::span<const double> values) {
  return describeEach([values](auto&& take) {
    for (double v : values) take(v);
  });
}

}  // namespace stridemark::analysis
