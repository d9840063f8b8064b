#pragma once
// Report-level summaries built from cycles and strides: per-limb statistics, per-limb phase
// statistics, the Hildebrand point, left/right symmetry and speed measures.
#include <optional>
#include <vector>

#include "analysis/circular.h"
#include "analysis/cycles.h"
#include "analysis/report.h"

namespace stridemark::analysis {

// Stride, stance, swing (seconds) and duty factor per limb over its valid cycles.
std::vector<LimbSummary> summariseLimbs(const std::vector<LimbTrack>& tracks, Rational fps);

// Circular statistics of each limb's phase over the strides where it is defined. Fed stride by
// stride, in stride order, so a streamed analysis gets the same numbers as a stored one.
class PhaseSummariser {
 public:
  explicit PhaseSummariser(int limbCount);
  void add(const StrideRecord& stride);
  std::vector<PhaseSummary> finish() const;

 private:
  std::vector<CircularSums> phases_;  // per limb
  UnitVectors vectors_;
};

// Mean hind duty factor and circular-mean limb phase of the symmetrical strides; null if none.
class HildebrandSummariser {
 public:
  void add(const StrideRecord& stride);
  std::optional<HildebrandSummary> finish() const;

 private:
  CircularSums limbPhases_;
  UnitVectors vectors_;
  double dutySum_ = 0;
};

// Robinson SI and R/L ratio per left/right pair from the limbs' mean values.
Symmetry summariseSymmetry(const model::LimbSet& limbs,
                           const std::vector<LimbSummary>& limbSummary);

// Null without a speed; Froude and relative stride length need the leg length too.
std::optional<SpeedSummary> summariseSpeed(std::optional<double> speedMs,
                                           std::optional<double> legLengthM,
                                           const LimbSummary& reference);

}  // namespace stridemark::analysis
