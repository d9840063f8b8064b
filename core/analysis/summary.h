#pragma once
// Report-level summaries built from cycles and strides: per-limb statistics, per-limb phase
// statistics, the Hildebrand point, left/right symmetry and speed measures.
#include <optional>
#include <vector>

#include "analysis/cycles.h"
#include "analysis/report.h"

namespace stridemark::analysis {

// Stride, stance, swing (seconds) and duty factor per limb over its valid cycles.
std::vector<LimbSummary> summariseLimbs(const std::vector<LimbTrack>& tracks, Rational fps);

// Circular statistics of each limb's phase over the strides where it is defined.
std::vector<PhaseSummary> summarisePhases(int limbCount, const std::vector<StrideRecord>& strides);

// Mean hind duty factor and circular-mean limb phase of the symmetrical strides; null if none.
std::optional<HildebrandSummary> summariseHildebrand(const std::vector<StrideRecord>& strides);

// Robinson SI and R/L ratio per left/right pair from the limbs' mean values.
Symmetry summariseSymmetry(const model::LimbSet& limbs,
                           const std::vector<LimbSummary>& limbSummary);

// Null without a speed; Froude and relative stride length need the leg length too.
std::optional<SpeedSummary> summariseSpeed(std::optional<double> speedMs,
                                           std::optional<double> legLengthM,
                                           const LimbSummary& reference);

}  // namespace stridemark::analysis
