#include "analysis/strides.h"

#include <algorithm>
#include <initializer_list>

#include "analysis/circular.h"
#include "analysis/phase.h"
#include "analysis/speed.h"

namespace stridemark::analysis {
namespace {

using model::Side;

// Problem spans of every limb, merged into disjoint ascending spans.
std::vector<FlaggedSpan> mergedFlags(const std::vector<LimbTrack>& tracks) {
  std::vector<FlaggedSpan> all;
  for (const LimbTrack& t : tracks) all.insert(all.end(), t.flagged.begin(), t.flagged.end());
  std::sort(all.begin(), all.end(),
            [](const FlaggedSpan& a, const FlaggedSpan& b) { return a.first < b.first; });
  std::vector<FlaggedSpan> merged;
  for (const FlaggedSpan& f : all) {
    if (!merged.empty() && f.first <= merged.back().last + 1) {
      merged.back().last = std::max(merged.back().last, f.last);
    } else {
      merged.push_back(f);
    }
  }
  return merged;
}

bool touchesFlag(const std::vector<FlaggedSpan>& flags, std::int64_t first, std::int64_t end) {
  auto it = std::lower_bound(flags.begin(), flags.end(), first,
                             [](const FlaggedSpan& f, std::int64_t v) { return f.last < v; });
  return it != flags.end() && it->first < end;
}

// Measures and labels one reference stride.
class StrideBuilder {
 public:
  StrideBuilder(const model::Annotation& annotation, const CycleScan& scan,
                const SupportTimeline& support, const StrideSettings& settings)
      : limbs_(annotation.limbs),
        fps_(annotation.captureRate),
        tracks_(scan.tracks),
        support_(support),
        settings_(settings) {}

  StrideRecord build(const LimbCycle& reference) {
    StrideRecord s;
    s.startFrame = reference.touchdown;
    s.endFrame = reference.nextTouchdown;
    s.durationS = framesToSeconds(reference.strideFrames(), fps_);
    fillLimbs(s);
    GaitTolerances tol = settings_.tolerances;
    tol.tau =
        std::max(tol.tau, settings_.minTauFrames / static_cast<double>(reference.strideFrames()));
    switch (limbs_.kind()) {
      case model::LimbSetKind::quadruped:
        labelQuadruped(s, tol);
        break;
      case model::LimbSetKind::biped:
        labelBiped(s, tol);
        break;
      default:
        labelMultiPairStride(s, limbs_, tol);
    }
    fillSupport(s);
    return s;
  }

 private:
  const LimbTrack& track(int limb) const { return tracks_[static_cast<std::size_t>(limb)]; }
  int limbAt(Side side, int segment) const { return limbs_.at(side, segment).value_or(-1); }

  // Each limb's touchdowns in the window, its phase, and the duty factor of the cycle its
  // first touchdown there starts. Remembers those firsts for the pair phases and DAP.
  void fillLimbs(StrideRecord& s) {
    const auto n = static_cast<std::size_t>(limbs_.size());
    s.phase.assign(n, std::nullopt);
    s.dutyFactor.assign(n, std::nullopt);
    s.touchdownCount.assign(n, 0);
    firsts_.assign(n, std::nullopt);
    firstCycles_.assign(n, nullptr);
    for (std::size_t i = 0; i < n; ++i) {
      const LimbTrack& t = tracks_[i];
      const WindowPhase wp = phaseInWindow(t.touchdowns, s.startFrame, s.endFrame);
      s.touchdownCount[i] = wp.touchdowns;
      s.phase[i] = wp.phase;
      firsts_[i] = wp.first;
      if (!wp.first) continue;
      const LimbCycle* cycle = cycleStartingAt(t, *wp.first);
      firstCycles_[i] = cycle;
      if (const auto stance = cycle ? cycle->stanceFrames() : std::nullopt)
        s.dutyFactor[i] = static_cast<double>(*stance) / static_cast<double>(cycle->strideFrames());
    }
  }

  // Phase of `target` in the cycle of `base` that starts first in the stride; falls back to the
  // difference of their phases in the reference stride when that cycle is not usable.
  std::optional<double> pairPhase(const StrideRecord& s, int base, int target) const {
    if (const LimbCycle* c = firstCycles_[static_cast<std::size_t>(base)]) {
      const WindowPhase wp =
          phaseInWindow(track(target).touchdowns, c->touchdown, c->nextTouchdown);
      if (wp.phase) return wp.phase;
      if (wp.ambiguous()) return std::nullopt;
    }
    const auto& pb = s.phase[static_cast<std::size_t>(base)];
    const auto& pt = s.phase[static_cast<std::size_t>(target)];
    if (pb && pt) return wrapPhase(*pt - *pb);
    return std::nullopt;
  }

  static std::optional<double> meanDutyFactor(const StrideRecord& s,
                                              std::initializer_list<int> limbs) {
    double sum = 0;
    int n = 0;
    for (int limb : limbs) {
      if (const auto& df = s.dutyFactor[static_cast<std::size_t>(limb)]) {
        sum += *df;
        ++n;
      }
    }
    if (n == 0) return std::nullopt;
    return sum / n;
  }

  void labelQuadruped(StrideRecord& s, const GaitTolerances& tol) {
    const QuadrupedLimbs q{limbAt(Side::left, 0), limbAt(Side::right, 0), limbAt(Side::left, 1),
                           limbAt(Side::right, 1)};
    s.hindDutyFactor = meanDutyFactor(s, {q.lh, q.rh});
    s.limbPhase = pairPhase(s, q.lh, q.lf);
    labelQuadrupedStride(s, q, pairPhase(s, q.lh, q.rh), pairPhase(s, q.lf, q.rf), tol);
    if (s.gait == "trot") fillDap(s, {{q.lh, q.rf}, {q.rh, q.lf}});
  }

  void labelBiped(StrideRecord& s, const GaitTolerances& tol) {
    const int l = limbAt(Side::left, 0), r = limbAt(Side::right, 0);
    labelBipedStride(s, pairPhase(s, l, r), meanDutyFactor(s, {l, r}), tol);
  }

  // Mean DAP of the two diagonals (hind touchdown in the stride, nearest diagonal fore).
  void fillDap(StrideRecord& s, std::initializer_list<std::pair<int, int>> diagonals) const {
    double ms = 0, percent = 0;
    int n = 0;
    for (const auto& [hind, fore] : diagonals) {
      const std::optional<std::int64_t>& h = firsts_[static_cast<std::size_t>(hind)];
      if (!h) continue;
      const auto f = nearestTouchdown(track(fore).touchdowns, *h);
      if (!f) continue;
      const AdvancedPlacement dap = advancedPlacement(*h, *f, s.endFrame - s.startFrame, fps_);
      ms += dap.ms;
      percent += dap.percent;
      ++n;
    }
    if (n == 0) return;
    s.dapMs = ms / n;
    s.dapPercent = percent / n;
  }

  void fillSupport(StrideRecord& s) const {
    SupportShares shares = support_.window(s.startFrame, s.endFrame);
    s.aerial = shares.aerial;
    if (!shares.complete) return;
    s.supportByCount = std::move(shares.byCount);
    s.supportByCombination = std::move(shares.byCombination);
  }

  const model::LimbSet& limbs_;
  Rational fps_;
  const std::vector<LimbTrack>& tracks_;
  const SupportTimeline& support_;
  const StrideSettings& settings_;
  // Per limb, for the stride being built: first touchdown in the window and the cycle it starts.
  std::vector<std::optional<std::int64_t>> firsts_;
  std::vector<const LimbCycle*> firstCycles_;
};

}  // namespace

std::vector<StrideRecord> buildStrides(const model::Annotation& annotation, int referenceLimb,
                                       const CycleScan& scan, const SupportTimeline& support,
                                       const StrideSettings& settings) {
  const std::vector<FlaggedSpan> flags = mergedFlags(scan.tracks);
  StrideBuilder builder(annotation, scan, support, settings);
  std::vector<StrideRecord> strides;
  for (const LimbCycle& cycle : scan.tracks[static_cast<std::size_t>(referenceLimb)].cycles) {
    if (touchesFlag(flags, cycle.touchdown, cycle.nextTouchdown)) continue;
    strides.push_back(builder.build(cycle));
  }
  return strides;
}

}  // namespace stridemark::analysis
