#pragma once
// Bouts: runs of consecutive strides (each starting where the previous ended) with one gait,
// and the transitions between neighbouring bouts.
#include <vector>

#include "analysis/report.h"

namespace stridemark::analysis {

std::vector<Bout> findBouts(const std::vector<StrideRecord>& strides);

// A transition joins two bouts only when the second starts where the first ended.
std::vector<Transition> findTransitions(const std::vector<Bout>& bouts);

}  // namespace stridemark::analysis
