#pragma once
// One StrideRecord per reference stride (docs/methods.md §1.2, §2, §5, §7.3): each limb's
// phase and duty factor in the window, the Hildebrand point, the support shares, the gait label
// (by the rules of gait_rules.h) and, for trots, the diagonal advanced placement.
#include <vector>

#include "analysis/cycles.h"
#include "analysis/gait_rules.h"
#include "analysis/report.h"
#include "analysis/support_patterns.h"
#include "model/annotation.h"

namespace stridemark::analysis {

struct StrideSettings {
  GaitTolerances tolerances;  // tau is the share of a stride; raised per stride to minTauFrames
  int minTauFrames = 2;
  double steadyTolerance = 0.15;  // each limb's cycle within this share of the stride (§1.5)
};

// Strides of every reference cycle that touches no annotation problem, in order. Incomplete
// strides are "unclassified", with a note naming the limb (the problems come with the bouts).
std::vector<StrideRecord> buildStrides(const model::Annotation& annotation, int referenceLimb,
                                       const CycleScan& scan, const SupportTimeline& support,
                                       const StrideSettings& settings);

}  // namespace stridemark::analysis
