#pragma once
// Bouts: runs of consecutive strides (each starting where the previous ended) with one gait,
// and the transitions between neighbouring bouts.
#include <utility>
#include <vector>

#include "analysis/report.h"

namespace stridemark::analysis {

std::vector<Bout> findBouts(const std::vector<StrideRecord>& strides);

// The same, fed the strides in order (index = position in Report::strides).
class BoutFinder {
 public:
  void add(const StrideRecord& stride, int index);
  std::vector<Bout> take() { return std::move(bouts_); }

 private:
  std::vector<Bout> bouts_;
};

// A transition joins two bouts only when the second starts where the first ended.
std::vector<Transition> findTransitions(const std::vector<Bout>& bouts);

}  // namespace stridemark::analysis
