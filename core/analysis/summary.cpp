#include "analysis/summary.h"

#include <algorithm>
#include <cmath>

#include "analysis/circular.h"
#include "analysis/hildebrand.h"
#include "analysis/speed.h"
#include "analysis/stats.h"
#include "analysis/symmetry.h"

namespace stridemark::analysis {

std::vector<LimbSummary> summariseLimbs(const std::vector<LimbTrack>& tracks, Rational fps) {
  std::vector<LimbSummary> out;
  for (const LimbTrack& track : tracks) {
    const auto eachCycle = [&track](auto measure) {
      return describeEach([&](auto&& take) {
        for (const LimbCycle& c : track.cycles) measure(c, take);
      });
    };
    LimbSummary s;
    s.strides = static_cast<int>(track.cycles.size());
    s.strideS = eachCycle(
        [fps](const LimbCycle& c, auto&& take) { take(framesToSeconds(c.strideFrames(), fps)); });
    s.stanceS = eachCycle([fps](const LimbCycle& c, auto&& take) {
      if (const auto stance = c.stanceFrames()) take(framesToSeconds(*stance, fps));
    });
    s.swingS = eachCycle([fps](const LimbCycle& c, auto&& take) {
      if (const auto liftoff = c.liftoff()) take(framesToSeconds(c.nextTouchdown - *liftoff, fps));
    });
    s.dutyFactor = eachCycle([](const LimbCycle& c, auto&& take) {
      if (const auto stance = c.stanceFrames())
        take(static_cast<double>(*stance) / static_cast<double>(c.strideFrames()));
    });
    out.push_back(s);
  }
  return out;
}

PhaseSummariser::PhaseSummariser(int limbCount)
    : phases_(static_cast<std::size_t>(std::max(limbCount, 0))) {}

void PhaseSummariser::add(const StrideRecord& stride) {
  const std::size_t n = std::min(phases_.size(), stride.phase.size());
  for (std::size_t i = 0; i < n; ++i)
    if (stride.phase[i]) phases_[i].add(*stride.phase[i]);
}

std::vector<PhaseSummary> PhaseSummariser::finish() const {
  std::vector<PhaseSummary> out;
  for (const CircularSums& limbPhases : phases_) {
    const CircularStats c = limbPhases.stats();
    PhaseSummary p;
    p.n = c.n;
    if (c.n > 0) {
      p.r = c.r;
      p.angularDeviation = c.angularDev;
      p.rayleighZ = c.rayleighZ;
      p.rayleighP = c.rayleighP;
      if (c.defined) {
        p.mean = c.mean;
        p.circSd = c.circSd;
      }
    }
    out.push_back(p);
  }
  return out;
}

void HildebrandSummariser::add(const StrideRecord& stride) {
  if (!stride.symmetrical || !stride.limbPhase || !stride.hindDutyFactor) return;
  limbPhases_.add(*stride.limbPhase);
  dutySum_ += *stride.hindDutyFactor;
}

std::optional<HildebrandSummary> HildebrandSummariser::finish() const {
  const CircularStats phases = limbPhases_.stats();
  if (phases.n == 0) return std::nullopt;
  HildebrandSummary out;
  out.dutyFactor = dutySum_ / static_cast<double>(phases.n);
  out.limbPhase = phases.mean;  // NaN when the mean direction does not exist
  if (std::isnan(out.limbPhase)) return out;
  out.band = hildebrandBand(out.limbPhase);
  out.quadrant = cartmillQuadrant(out.limbPhase).value_or("");
  return out;
}

namespace {

void addPair(SymmetryValues& values, const std::string& name, const Stat& left, const Stat& right) {
  if (left.n == 0 || right.n == 0 || left.mean + right.mean == 0 || left.mean == 0) return;
  values.si[name] = symmetryIndex(right.mean, left.mean);
  values.ratio[name] = symmetryRatio(right.mean, left.mean);
}

}  // namespace

Symmetry summariseSymmetry(const model::LimbSet& limbs,
                           const std::vector<LimbSummary>& limbSummary) {
  Symmetry out;
  for (const LimbPair& pair : leftRightPairs(limbs)) {
    const LimbSummary& l = limbSummary[static_cast<std::size_t>(pair.left)];
    const LimbSummary& r = limbSummary[static_cast<std::size_t>(pair.right)];
    addPair(out.strideS, pair.name, l.strideS, r.strideS);
    addPair(out.stanceS, pair.name, l.stanceS, r.stanceS);
    addPair(out.swingS, pair.name, l.swingS, r.swingS);
    addPair(out.dutyFactor, pair.name, l.dutyFactor, r.dutyFactor);
  }
  return out;
}

std::optional<SpeedSummary> summariseSpeed(std::optional<double> speedMs,
                                           std::optional<double> legLengthM,
                                           const LimbSummary& reference) {
  if (!speedMs) return std::nullopt;
  SpeedSummary out;
  out.ms = *speedMs;
  if (reference.strideS.n > 0) out.strideLengthM = strideLength(*speedMs, reference.strideS.mean);
  if (legLengthM) {
    out.froude = froudeNumber(*speedMs, *legLengthM);
    out.dimensionlessSpeed = dimensionlessSpeed(*speedMs, *legLengthM);
    if (!std::isnan(out.strideLengthM)) out.relativeStrideLength = out.strideLengthM / *legLengthM;
  }
  return out;
}

}  // namespace stridemark::analysis
