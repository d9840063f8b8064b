#pragma once
// Summaries of a set of strides (docs/methods.md §11): per-limb statistics of each limb's own
// cycle in the strides, phase statistics, the Hildebrand point, support shares, left/right
// symmetry, speed and DAP. The same function summarises a bout, a gait and the trial.
#include <optional>
#include <vector>

#include "analysis/report.h"
#include "model/annotation.h"

namespace stridemark::analysis {

using model::SpeedStep;

struct SummaryInputs {
  const model::LimbSet& limbs;
  Rational fps;
  int referenceLimb = 0;
  std::vector<SpeedStep> speed;  // ascending; empty without a speed
  std::optional<double> legLengthM;
};

// The trial-level members of a report as one summary (the shape of a gait's or a bout's); its
// stride count is the strides those members were made from.
Summary trialSummary(const Report& report);

// The inverse: sets the report's trial-level members to `summary` (a scope's view of a report).
void setTrialMembers(Report& report, const Summary& summary);

// Summary of strides[i] for each i in `members` (ascending).
Summary summariseStrides(const std::vector<StrideRecord>& strides, const std::vector<int>& members,
                         const SummaryInputs& in);

// Stride, stance, swing (seconds) and duty factor of the given cycles of one limb.
LimbSummary summariseCycles(const std::vector<LimbCycle>& cycles, Rational fps);

// Robinson SI and R/L ratio per left/right pair from the limbs' mean values.
Symmetry summariseSymmetry(const model::LimbSet& limbs,
                           const std::vector<LimbSummary>& limbSummary);

// Time-weighted mean speed over frames [first, end) of a schedule; null when it is empty.
std::optional<double> meanSpeed(const std::vector<SpeedStep>& speed, std::int64_t first,
                                std::int64_t end);

// Null without a speed; Froude and relative stride length need the leg length too.
std::optional<SpeedSummary> summariseSpeed(std::optional<double> speedMs,
                                           std::optional<double> legLengthM,
                                           const LimbSummary& reference);

}  // namespace stridemark::analysis
