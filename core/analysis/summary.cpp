#include "analysis/summary.h"

#include <algorithm>
#include <cmath>

#include "analysis/circular.h"
#include "analysis/cycles.h"
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

LimbSummary summariseCycles(const std::vector<LimbCycle>& cycles, Rational fps) {
  return summariseLimb(cycles, fps);
}

namespace {

std::vector<PhaseSummary> summarisePhases(const std::vector<StrideRecord>& strides,
                                          const std::vector<int>& members, int limbCount) {
  std::vector<PhaseSummary> out;
  for (std::size_t limb = 0; limb < static_cast<std::size_t>(std::max(limbCount, 0)); ++limb) {
    std::vector<double> phases;
    for (const int i : members) {
      const StrideRecord& s = strides[static_cast<std::size_t>(i)];
      if (limb < s.phase.size() && s.phase[limb]) phases.push_back(*s.phase[limb]);
    }
    out.push_back(phaseSummary(circularStats(phases)));
  }
  return out;
}

std::optional<HildebrandSummary> summariseHildebrand(const std::vector<StrideRecord>& strides,
                                                     const std::vector<int>& members) {
  std::vector<double> limbPhases;
  double dutySum = 0;
  for (const int i : members) {
    const StrideRecord& s = strides[static_cast<std::size_t>(i)];
    if (!s.symmetrical || !s.limbPhase || !s.hindDutyFactor) continue;
    limbPhases.push_back(*s.limbPhase);
    dutySum += *s.hindDutyFactor;
  }
  if (limbPhases.empty()) return std::nullopt;
  HildebrandSummary out;
  out.n = static_cast<int>(limbPhases.size());
  out.dutyFactor = dutySum / static_cast<double>(limbPhases.size());
  out.limbPhase = circularStats(limbPhases).mean;  // NaN when the mean direction does not exist
  if (std::isnan(out.limbPhase)) return out;
  out.band = hildebrandBand(out.limbPhase);
  out.quadrant = cartmillQuadrant(out.limbPhase).value_or("");
  return out;
}

// Shares of the strides' time (each stride with known support, weighted by its frames).
void summariseSupport(const std::vector<StrideRecord>& strides, const std::vector<int>& members,
                      int limbCount, Summary& out) {
  double total = 0;
  std::vector<double> byCount(static_cast<std::size_t>(limbCount) + 1, 0.0);
  std::map<std::string, double> byCombination;
  for (const int i : members) {
    const StrideRecord& s = strides[static_cast<std::size_t>(i)];
    if (s.supportByCount.empty()) continue;
    const auto frames = static_cast<double>(s.endFrame - s.startFrame);
    total += frames;
    for (std::size_t k = 0; k < s.supportByCount.size() && k < byCount.size(); ++k)
      byCount[k] += s.supportByCount[k] * frames;
    // Strides mostly show the same combinations, in the same (sorted) order: each lookup
    // starts where the last one ended.
    auto hint = byCombination.begin();
    for (const auto& [name, share] : s.supportByCombination) {
      hint = byCombination.try_emplace(hint, name, 0.0);
      hint->second += share * frames;
      ++hint;
    }
  }
  if (total == 0) return;
  for (double& share : byCount) share /= total;
  for (auto& [name, share] : byCombination) share /= total;
  out.support = std::move(byCount);
  out.supportByCombination = std::move(byCombination);
}

std::optional<DapSummary> summariseDap(const std::vector<StrideRecord>& strides,
                                       const std::vector<int>& members) {
  std::vector<double> lhRf, rhLf, lhRfPercent, rhLfPercent;
  for (const int i : members) {
    const StrideRecord& s = strides[static_cast<std::size_t>(i)];
    if (s.dapLhRfMs) lhRf.push_back(*s.dapLhRfMs);
    if (s.dapRhLfMs) rhLf.push_back(*s.dapRhLfMs);
    if (s.dapLhRfPercent) lhRfPercent.push_back(*s.dapLhRfPercent);
    if (s.dapRhLfPercent) rhLfPercent.push_back(*s.dapRhLfPercent);
  }
  if (lhRf.empty() && rhLf.empty()) return std::nullopt;
  DapSummary out;
  out.lhRfMs = describe(lhRf);
  out.rhLfMs = describe(rhLf);
  out.lhRfPercent = describe(lhRfPercent);
  out.rhLfPercent = describe(rhLfPercent);
  if (!lhRf.empty() && !rhLf.empty()) {
    out.meanMs = (out.lhRfMs.mean + out.rhLfMs.mean) / 2;
    out.differenceMs = out.lhRfMs.mean - out.rhLfMs.mean;
  }
  return out;
}

}  // namespace

std::optional<double> meanSpeed(const std::vector<SpeedStep>& speed, std::int64_t first,
                                std::int64_t end) {
  if (speed.empty() || end <= first) return std::nullopt;
  double sum = 0;
  for (std::size_t i = 0; i < speed.size(); ++i) {
    const std::int64_t from = i == 0 ? first : std::max(first, speed[i].fromFrame);
    const std::int64_t to = i + 1 < speed.size() ? std::min(end, speed[i + 1].fromFrame) : end;
    if (to > from) sum += speed[i].ms * static_cast<double>(to - from);
  }
  return sum / static_cast<double>(end - first);
}

Summary trialSummary(const Report& report) {
  Summary s;
  s.strides = static_cast<int>(std::count_if(
      report.strides.begin(), report.strides.end(),
      [](const StrideRecord& r) { return r.steady && r.gait != "transition" && !r.excluded; }));
  s.limbs = report.limbSummary;
  s.phase = report.phase;
  s.hildebrand = report.hildebrand;
  s.support = report.support;
  s.supportByCombination = report.supportByCombination;
  s.symmetry = report.symmetry;
  s.speed = report.speed;
  s.dap = report.dap;
  return s;
}

void setTrialMembers(Report& report, const Summary& summary) {
  report.limbSummary = summary.limbs;
  report.phase = summary.phase;
  report.hildebrand = summary.hildebrand;
  report.support = summary.support;
  report.supportByCombination = summary.supportByCombination;
  report.symmetry = summary.symmetry;
  report.speed = summary.speed;
  report.dap = summary.dap;
}

Summary summariseStrides(const std::vector<StrideRecord>& strides, const std::vector<int>& members,
                         const SummaryInputs& in) {
  Summary out;
  out.strides = static_cast<int>(members.size());
  const int limbCount = in.limbs.size();
  for (int limb = 0; limb < limbCount; ++limb) {
    std::vector<LimbCycle> cycles;
    for (const int i : members) {
      const StrideRecord& s = strides[static_cast<std::size_t>(i)];
      const auto l = static_cast<std::size_t>(limb);
      if (l < s.ownCycle.size() && s.ownCycle[l]) cycles.push_back(*s.ownCycle[l]);
    }
    out.limbs.push_back(summariseLimb(cycles, in.fps));
  }
  out.phase = summarisePhases(strides, members, limbCount);
  if (in.limbs.kind() == model::LimbSetKind::quadruped) {
    out.hildebrand = summariseHildebrand(strides, members);
    out.dap = summariseDap(strides, members);
  }
  summariseSupport(strides, members, limbCount, out);
  out.symmetry = summariseSymmetry(in.limbs, out.limbs);
  if (!members.empty()) {
    // Speed over the strides' own frames, weighted by time.
    double weighted = 0, frames = 0;
    for (const int i : members) {
      const StrideRecord& s = strides[static_cast<std::size_t>(i)];
      if (const auto v = meanSpeed(in.speed, s.startFrame, s.endFrame)) {
        weighted += *v * static_cast<double>(s.endFrame - s.startFrame);
        frames += static_cast<double>(s.endFrame - s.startFrame);
      }
    }
    if (frames > 0)
      out.speed = summariseSpeed(weighted / frames, in.legLengthM,
                                 out.limbs[static_cast<std::size_t>(in.referenceLimb)]);
  }
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
