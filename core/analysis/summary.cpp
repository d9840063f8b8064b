#include "analysis/summary.h"

#include <algorithm>
#include <cmath>

#include "analysis/circular.h"
#include "analysis/hildebrand.h"
#include "analysis/speed.h"
#include "analysis/stats.h"
#include "analysis/symmetry.h"

namespace stridemark::analysis {

namespace {

// One value per cycle that has it, in cycle order.
template <typename Measure>
Stat describeCycles(const std::vector<LimbCycle>& cycles, Measure measure) {
  std::vector<double> values;
  values.reserve(cycles.size());
  for (const LimbCycle& c : cycles)
    if (const std::optional<double> v = measure(c)) values.push_back(*v);
  return describe(values);
}

LimbSummary summariseLimb(const std::vector<LimbCycle>& cycles, Rational fps) {
  const auto seconds = [fps](std::optional<std::int64_t> frames) -> std::optional<double> {
    if (!frames) return std::nullopt;
    return framesToSeconds(*frames, fps);
  };
  LimbSummary out;
  out.strides = static_cast<int>(cycles.size());
  out.strideS =
      describeCycles(cycles, [&](const LimbCycle& c) { return seconds(c.strideFrames()); });
  out.stanceS =
      describeCycles(cycles, [&](const LimbCycle& c) { return seconds(c.stanceFrames()); });
  out.swingS = describeCycles(cycles, [&](const LimbCycle& c) { return seconds(c.swingFrames()); });
  out.dutyFactor = describeCycles(cycles, [](const LimbCycle& c) -> std::optional<double> {
    const auto stance = c.stanceFrames();
    if (!stance) return std::nullopt;
    return static_cast<double>(*stance) / static_cast<double>(c.strideFrames());
  });
  return out;
}

PhaseSummary phaseSummary(const CircularStats& c) {
  PhaseSummary p;
  p.n = c.n;
  if (c.n == 0) return p;
  p.r = c.r;
  p.angularDeviation = c.angularDev;
  p.rayleighZ = c.rayleighZ;
  p.rayleighP = c.rayleighP;
  if (c.defined) {
    p.mean = c.mean;
    p.circSd = c.circSd;
  }
  return p;
}

}  // namespace

std::vector<LimbSummary> summariseLimbs(const std::vector<LimbTrack>& tracks, Rational fps) {
  std::vector<LimbSummary> out;
  out.reserve(tracks.size());
  for (const LimbTrack& track : tracks) out.push_back(summariseLimb(track.cycles, fps));
  return out;
}

std::vector<PhaseSummary> summarisePhases(int limbCount, const std::vector<StrideRecord>& strides) {
  std::vector<PhaseSummary> out;
  for (std::size_t limb = 0; limb < static_cast<std::size_t>(std::max(limbCount, 0)); ++limb) {
    std::vector<double> phases;
    for (const StrideRecord& s : strides)
      if (limb < s.phase.size() && s.phase[limb]) phases.push_back(*s.phase[limb]);
    out.push_back(phaseSummary(circularStats(phases)));
  }
  return out;
}

std::optional<HildebrandSummary> summariseHildebrand(const std::vector<StrideRecord>& strides) {
  std::vector<double> limbPhases;
  double dutySum = 0;
  for (const StrideRecord& s : strides) {
    if (!s.symmetrical || !s.limbPhase || !s.hindDutyFactor) continue;
    limbPhases.push_back(*s.limbPhase);
    dutySum += *s.hindDutyFactor;
  }
  if (limbPhases.empty()) return std::nullopt;
  HildebrandSummary out;
  out.dutyFactor = dutySum / static_cast<double>(limbPhases.size());
  out.limbPhase = circularStats(limbPhases).mean;  // NaN when the mean direction does not exist
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
