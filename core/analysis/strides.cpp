#include "analysis/strides.h"

#include <algorithm>
#include <cmath>
#include <initializer_list>
#include <string>

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
        settings_(settings),
        hidden_(static_cast<std::size_t>(annotation.limbs.size())) {
    for (const model::HiddenSpan& h : annotation.hidden)
      if (h.limb >= 0 && h.limb < limbs_.size() && h.last >= h.first)
        hidden_[static_cast<std::size_t>(h.limb)].push_back(h);
  }

  StrideRecord build(const LimbCycle& reference) {
    StrideRecord s;
    s.startFrame = reference.touchdown;
    s.endFrame = reference.nextTouchdown;
    s.durationS = framesToSeconds(reference.strideFrames(), fps_);
    fillLimbs(s);
    fillSupport(s);  // the labels read the suspension
    checkComplete(s);
    checkSteady(s);
    GaitTolerances tol = settings_.tolerances;
    const double frames = static_cast<double>(reference.strideFrames());
    tol.tau = std::max(tol.tau, settings_.minTauFrames / frames);
    tol.margin = 0.5 / frames;
    if (limbs_.kind() == model::LimbSetKind::quadruped) {
      labelQuadruped(s, tol);
    } else if (limbs_.kind() == model::LimbSetKind::biped) {
      labelBiped(s, tol);
    } else if (s.complete) {
      labelMultiPairStride(s, limbs_, tol);
    }
    if (!s.complete) s.gait = "unclassified";
    if (s.gait == "trot") fillDap(s);
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
    s.ownCycle.assign(n, std::nullopt);
    firsts_.assign(n, std::nullopt);
    firstCycles_.assign(n, nullptr);
    // A limb landing with the reference limb (a trot's diagonal partner) would land on either
    // side of the window's start as the tags jitter by a frame or two, and so be counted 0 or
    // 2 times: the window opens `lead` frames early (our choice: the simultaneity tolerance).
    const std::int64_t lead = leadFrames(s.endFrame - s.startFrame);
    for (std::size_t i = 0; i < n; ++i) {
      const LimbTrack& t = tracks_[i];
      const WindowPhase wp = phaseInWindow(t.touchdowns, s.startFrame - lead, s.endFrame - lead);
      s.touchdownCount[i] = wp.touchdowns;
      if (wp.phase) s.phase[i] = wrapPhase(relativePhase(*wp.first, s.startFrame, s.endFrame));
      firsts_[i] = wp.first;
      if (!wp.first) continue;
      const LimbCycle* cycle = cycleStartingAt(t, *wp.first);
      firstCycles_[i] = cycle;
      if (cycle) s.ownCycle[i] = *cycle;
      if (const auto stance = cycle ? cycle->stanceFrames() : std::nullopt)
        s.dutyFactor[i] = static_cast<double>(*stance) / static_cast<double>(cycle->strideFrames());
    }
  }

  std::int64_t leadFrames(std::int64_t strideFrames) const {
    const auto share =
        static_cast<std::int64_t>(settings_.tolerances.tau * static_cast<double>(strideFrames));
    return std::min(std::max<std::int64_t>(share, settings_.minTauFrames), strideFrames / 4);
  }

  // Phase of `target` in the cycle of `base` that starts first in the stride; falls back to the
  // difference of their phases in the reference stride when that cycle is not usable.
  std::optional<double> pairPhase(const StrideRecord& s, int base, int target) const {
    if (const LimbCycle* c = firstCycles_[static_cast<std::size_t>(base)]) {
      const std::int64_t lead = leadFrames(c->strideFrames());
      const WindowPhase wp =
          phaseInWindow(track(target).touchdowns, c->touchdown - lead, c->nextTouchdown - lead);
      if (wp.phase) return wrapPhase(relativePhase(*wp.first, c->touchdown, c->nextTouchdown));
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

  QuadrupedLimbs quadrupedLimbs() const {
    return {limbAt(Side::left, 0), limbAt(Side::right, 0), limbAt(Side::left, 1),
            limbAt(Side::right, 1)};
  }

  void labelQuadruped(StrideRecord& s, const GaitTolerances& tol) {
    const QuadrupedLimbs q = quadrupedLimbs();
    s.hindDutyFactor = meanDutyFactor(s, {q.lh, q.rh});
    s.limbPhase = pairPhase(s, q.lh, q.lf);
    if (!s.complete) return;
    labelQuadrupedStride(s, q, *meanDutyFactor(s, {q.lf, q.rf, q.lh, q.rh}), tol);
  }

  void labelBiped(StrideRecord& s, const GaitTolerances& tol) {
    if (!s.complete) return;
    const int l = limbAt(Side::left, 0), r = limbAt(Side::right, 0);
    const double rightRelLeft =
        wrapPhase(*s.phase[static_cast<std::size_t>(r)] - *s.phase[static_cast<std::size_t>(l)]);
    labelBipedStride(s, rightRelLeft, *meanDutyFactor(s, {l, r}), tol);
  }

  // Complete (docs/methods.md §1.5): each limb lands once in the window, its own cycle from
  // there is tagged to the next touchdown with its lift-off, and it is never hidden there.
  void checkComplete(StrideRecord& s) const {
    s.complete = true;
    for (int limb = 0; limb < limbs_.size(); ++limb) {
      const std::optional<std::string> missing = whatIsMissing(s, limb);
      if (!missing) continue;
      s.complete = false;
      s.note = *missing;
      s.incompleteLimb = limb;
      s.touchdownSlipped = s.touchdownCount[static_cast<std::size_t>(limb)] != 1 &&
                           missing->find(" is hidden at ") == std::string::npos;
      s.cutByTagEnds = beyondTags(s, limb);
      return;
    }
  }

  // The limb's tags end (or begin) inside this stride: the data stop, nothing is wrong.
  bool beyondTags(const StrideRecord& s, int limb) const {
    const auto i = static_cast<std::size_t>(limb);
    const std::vector<std::int64_t>& touchdowns = track(limb).touchdowns;
    if (touchdowns.empty()) return true;  // never tagged: a problem of its own says so
    if (s.touchdownCount[i] == 0)
      return s.endFrame <= touchdowns.front() || s.startFrame >= touchdowns.back();
    return s.touchdownCount[i] == 1 && !firstCycles_[i] && firsts_[i] == touchdowns.back();
  }

  std::optional<std::string> whatIsMissing(const StrideRecord& s, int limb) const {
    const auto i = static_cast<std::size_t>(limb);
    const std::string& label = limbs_.label(limb);
    for (const model::HiddenSpan& h : hidden_[i])
      if (h.first < s.endFrame && h.last >= s.startFrame)
        return label + " is hidden at frames " + std::to_string(h.first) + "-" +
               std::to_string(h.last);
    if (s.touchdownCount[i] == 0) return label + " has no touchdown in it";
    if (s.touchdownCount[i] > 1)
      return label + " has " + std::to_string(s.touchdownCount[i]) + " touchdowns in it";
    const LimbCycle* cycle = firstCycles_[i];
    if (!cycle)
      return label + "'s cycle from frame " + std::to_string(*firsts_[i]) +
             " is not complete (a tag is missing, or it was left out)";
    if (!cycle->liftoff)
      return label + "'s lift-off between frames " + std::to_string(cycle->touchdown) + " and " +
             std::to_string(cycle->nextTouchdown) + " is missing";
    return std::nullopt;
  }

  // Steady (docs/methods.md §1.5): every limb's own cycle lasts this stride within the
  // tolerance (and half a frame).
  void checkSteady(StrideRecord& s) const {
    const double frames = static_cast<double>(s.endFrame - s.startFrame);
    for (int limb = 0; limb < limbs_.size(); ++limb) {
      const LimbCycle* cycle = firstCycles_[static_cast<std::size_t>(limb)];
      if (!cycle) continue;
      const double ratio = static_cast<double>(cycle->strideFrames()) / frames;
      if (std::abs(ratio - 1.0) <= settings_.steadyTolerance + 0.5 / frames) continue;
      s.steady = false;
      if (!s.note)
        s.note = limbs_.label(limb) + "'s cycle lasts " + std::to_string(cycle->strideFrames()) +
                 " frames against the stride's " + std::to_string(s.endFrame - s.startFrame) +
                 ": unsteady";
      return;
    }
  }

  // DAP of each diagonal (hind touchdown in the stride, the nearest diagonal fore touchdown).
  std::optional<AdvancedPlacement> dapOf(const StrideRecord& s, int hind, int fore) const {
    const std::optional<std::int64_t>& h = firsts_[static_cast<std::size_t>(hind)];
    if (!h) return std::nullopt;
    const auto f = nearestTouchdown(track(fore).touchdowns, *h);
    if (!f) return std::nullopt;
    return advancedPlacement(*h, *f, s.endFrame - s.startFrame, fps_);
  }

  void fillDap(StrideRecord& s) const {
    const QuadrupedLimbs q = quadrupedLimbs();
    const auto left = dapOf(s, q.lh, q.rf), right = dapOf(s, q.rh, q.lf);
    if (left) {
      s.dapLhRfMs = left->ms;
      s.dapLhRfPercent = left->percent;
    }
    if (right) {
      s.dapRhLfMs = right->ms;
      s.dapRhLfPercent = right->percent;
    }
    if (!left || !right) return;
    s.dapMs = (left->ms + right->ms) / 2;
    s.dapPercent = (left->percent + right->percent) / 2;
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
  std::vector<std::vector<model::HiddenSpan>> hidden_;  // per limb
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
  const std::vector<LimbCycle>& reference =
      scan.tracks[static_cast<std::size_t>(referenceLimb)].cycles;
  std::vector<StrideRecord> strides;
  strides.reserve(reference.size());  // records are large: no regrowth
  for (const LimbCycle& cycle : reference) {
    if (touchesFlag(flags, cycle.touchdown, cycle.nextTouchdown)) continue;
    strides.push_back(builder.build(cycle));
  }
  return strides;
}

}  // namespace stridemark::analysis
