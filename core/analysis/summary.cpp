#include "analysis/summary.h"

#include <algorithm>
#include <cmath>
#include <iterator>
#include <span>

#include "analysis/circular.h"
#include "analysis/hildebrand.h"
#include "analysis/parallel.h"
#include "analysis/speed.h"
#include "analysis/stats.h"
#include "analysis/symmetry.h"

namespace stridemark::analysis {

namespace {

// Describes one measure over a limb's cycles; `measure(cycle, take)` takes the cycle's value
// when it has one.
template <typename Measure>
Stat describeCycles(std::span<const LimbCycle> cycles, Measure measure) {
  return describeEach([&](auto&& take) {
    for (const LimbCycle& c : cycles) measure(c, take);
  });
}

Stat describeStride(std::span<const LimbCycle> cycles, Rational fps) {
  return describeCycles(cycles, [fps](const LimbCycle& c, auto&& take) {
    take(framesToSeconds(c.strideFrames(), fps));
  });
}

Stat describeStance(std::span<const LimbCycle> cycles, Rational fps) {
  return describeCycles(cycles, [fps](const LimbCycle& c, auto&& take) {
    if (const auto stance = c.stanceFrames()) take(framesToSeconds(*stance, fps));
  });
}

Stat describeSwing(std::span<const LimbCycle> cycles, Rational fps) {
  return describeCycles(cycles, [fps](const LimbCycle& c, auto&& take) {
    if (const auto liftoff = c.liftoff()) take(framesToSeconds(c.nextTouchdown - *liftoff, fps));
  });
}

Stat describeDutyFactor(std::span<const LimbCycle> cycles, Rational /*fps*/) {
  return describeCycles(cycles, [](const LimbCycle& c, auto&& take) {
    if (const auto stance = c.stanceFrames())
      take(static_cast<double>(*stance) / static_cast<double>(c.strideFrames()));
  });
}

// Each statistic of a limb summary and how it is described: one task per limb and row.
struct CycleStatistic {
  Stat LimbSummary::*into;
  Stat (*describe)(std::span<const LimbCycle>, Rational);
};
constexpr CycleStatistic kCycleStatistics[] = {{&LimbSummary::strideS, describeStride},
                                               {&LimbSummary::stanceS, describeStance},
                                               {&LimbSummary::swingS, describeSwing},
                                               {&LimbSummary::dutyFactor, describeDutyFactor}};
constexpr std::size_t kStatisticCount = std::size(kCycleStatistics);

// Below this many cycles in all, threads cost more than the statistics (every desk edit).
constexpr std::size_t kParallelFromCycles = 20000;

}  // namespace

std::vector<LimbSummary> summariseLimbs(const std::vector<LimbTrack>& tracks, Rational fps) {
  std::vector<LimbSummary> out(tracks.size());
  std::size_t cycles = 0;
  for (std::size_t i = 0; i < tracks.size(); ++i) {
    out[i].strides = static_cast<int>(tracks[i].cycles.size());
    cycles += tracks[i].cycles.size();
  }
  // Limbs x statistics, each its own task, on the machine's cores.
  const auto describe = [&](std::size_t task) {
    const std::size_t limb = task / kStatisticCount;
    const CycleStatistic& statistic = kCycleStatistics[task % kStatisticCount];
    out[limb].*statistic.into = statistic.describe(tracks[limb].cycles, fps);
  };
  const std::size_t tasks = tracks.size() * kStatisticCount;
  if (cycles >= kParallelFromCycles) {
    forEachParallel(tasks, describe);
  } else {
    for (std::size_t task = 0; task < tasks; ++task) describe(task);
  }
  return out;
}

PhaseSummariser::PhaseSummariser(int limbCount)
    : phases_(static_cast<std::size_t>(std::max(limbCount, 0))) {}

void PhaseSummariser::add(const StrideRecord& stride) {
  const std::size_t n = std::min(phases_.size(), stride.phase.size());
  for (std::size_t i = 0; i < n; ++i)
    if (stride.phase[i]) phases_[i].add(*stride.phase[i], vectors_);
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
  limbPhases_.add(*stride.limbPhase, vectors_);
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
