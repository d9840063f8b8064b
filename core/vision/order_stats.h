#pragma once
// Internal: the order statistics the vision code uses (robust to the odd bad sample).
#include <algorithm>
#include <cstddef>
#include <vector>

namespace stridemark::vision::detail {

// The value at rank floor(share * (n - 1)) of the sorted values; 0 for none.
inline double percentile(std::vector<double> values, double share) {
  if (values.empty()) return 0;
  const auto k = static_cast<std::size_t>(share * static_cast<double>(values.size() - 1));
  std::nth_element(values.begin(), values.begin() + static_cast<std::ptrdiff_t>(k), values.end());
  return values[k];
}

// The value at rank n / 2 (for an even count, the upper of the two middle values).
inline double upperMedian(std::vector<double> values) {
  const auto middle = values.begin() + static_cast<std::ptrdiff_t>(values.size() / 2);
  std::nth_element(values.begin(), middle, values.end());
  return *middle;
}

}  // namespace stridemark::vision::detail
