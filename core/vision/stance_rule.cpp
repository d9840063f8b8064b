#include "vision/stance_rule.h"

#include <algorithm>
#include <cmath>

#include "vision/order_stats.h"

namespace stridemark::vision::detail {

namespace {

enum class Phase : signed char { unknown, stance, swing };

struct PairMotion {
  std::vector<Vec2> relative;  // foot shift minus ground shift, per pair
  std::vector<double> speed;
  std::vector<bool> valid;
};

struct Thresholds {
  double enter = 0, leave = 0;  // stance below `enter`; swing again above `leave`
  double tolerance = 0;         // position cue: still standing within this distance
};

struct Boundary {
  std::int64_t byVelocity = 0;  // index into the motion's frames
  std::int64_t byPosition = 0;
  std::int64_t chosen = 0;
  model::EventKind kind = model::EventKind::touchdown;
};

double length(Vec2 v) {
  return std::hypot(v.x, v.y);
}

PairMotion relativeMotion(const FootMotion& m) {
  const std::size_t pairs = m.position.empty() ? 0 : m.position.size() - 1;
  PairMotion out;
  out.relative.resize(pairs);
  out.speed.resize(pairs, 0);
  out.valid.resize(pairs, false);
  for (std::size_t t = 0; t < pairs; ++t) {
    if (!m.visible[t] || !m.visible[t + 1] || t >= m.ground.size() || !m.ground[t]) continue;
    const Vec2 g = *m.ground[t];
    out.relative[t] = {m.position[t + 1].x - m.position[t].x - g.x,
                       m.position[t + 1].y - m.position[t].y - g.y};
    out.speed[t] = length(out.relative[t]);
    out.valid[t] = true;
  }
  return out;
}

// Thresholds from this foot's own speeds: swing speed from the fast end of the distribution,
// tracking noise from the slow end. None when the foot hardly moves relative to the ground.
std::optional<Thresholds> thresholdsFor(const PairMotion& pairs) {
  std::vector<double> speeds;
  for (std::size_t t = 0; t < pairs.speed.size(); ++t)
    if (pairs.valid[t]) speeds.push_back(pairs.speed[t]);
  if (speeds.size() < 6) return std::nullopt;
  const double swing = percentile(speeds, 0.9);
  const double noise = percentile(speeds, 0.25);
  if (swing < 0.6 || swing < 4 * noise) return std::nullopt;
  Thresholds th;
  th.enter = std::max(0.15 * swing, 2.0 * noise);
  th.leave = std::min(std::max(0.3 * swing, 3.0 * noise), 0.6 * swing);
  th.enter = std::min(th.enter, 0.8 * th.leave);
  th.tolerance = std::max(0.4, 2.5 * noise);
  return th;
}

std::vector<Phase> hysteresis(const PairMotion& pairs, const Thresholds& th) {
  std::vector<Phase> phase(pairs.speed.size(), Phase::unknown);
  Phase state = Phase::unknown;
  for (std::size_t t = 0; t < phase.size(); ++t) {
    if (!pairs.valid[t]) {
      state = Phase::unknown;
    } else if (state == Phase::stance) {
      if (pairs.speed[t] > th.leave) state = Phase::swing;
    } else if (state == Phase::swing) {
      if (pairs.speed[t] < th.enter) state = Phase::stance;
    } else if (pairs.speed[t] < th.enter) {
      state = Phase::stance;
    } else if (pairs.speed[t] > th.leave) {
      state = Phase::swing;
    }
    phase[t] = state;
  }
  return phase;
}

// Runs of `shortKind` shorter than `minimum` pairs, between two runs of `otherKind`, become
// `otherKind` (a one-frame jitter is not a phase).
void absorbShortRuns(std::vector<Phase>& phase, Phase shortKind, Phase otherKind, int minimum) {
  std::size_t t = 0;
  while (t < phase.size()) {
    if (phase[t] != shortKind) {
      ++t;
      continue;
    }
    std::size_t end = t;
    while (end < phase.size() && phase[end] == shortKind) ++end;
    const bool bounded =
        t > 0 && end < phase.size() && phase[t - 1] == otherKind && phase[end] == otherKind;
    if (bounded && static_cast<int>(end - t) < minimum)
      std::fill(phase.begin() + static_cast<std::ptrdiff_t>(t),
                phase.begin() + static_cast<std::ptrdiff_t>(end), otherKind);
    t = end;
  }
}

// Foot position relative to the ground, accumulated along unbroken runs of valid pairs.
// segment[k] numbers the run frame k belongs to (-1: none).
struct GroundFrame {
  std::vector<Vec2> at;
  std::vector<int> segment;
};

GroundFrame groundFramePositions(const PairMotion& pairs) {
  const std::size_t frames = pairs.speed.size() + 1;
  GroundFrame g{std::vector<Vec2>(frames), std::vector<int>(frames, -1)};
  int segment = -1;
  for (std::size_t t = 0; t + 1 < frames; ++t) {
    if (!pairs.valid[t]) continue;
    if (t == 0 || !pairs.valid[t - 1]) {
      ++segment;
      g.at[t] = {0, 0};
      g.segment[t] = segment;
    }
    g.at[t + 1] = {g.at[t].x + pairs.relative[t].x, g.at[t].y + pairs.relative[t].y};
    g.segment[t + 1] = segment;
  }
  return g;
}

Vec2 medianPosition(const GroundFrame& g, std::int64_t from, std::int64_t to) {
  std::vector<double> xs, ys;
  for (std::int64_t k = from; k <= to; ++k) {
    xs.push_back(g.at[static_cast<std::size_t>(k)].x);
    ys.push_back(g.at[static_cast<std::size_t>(k)].y);
  }
  return {percentile(xs, 0.5), percentile(ys, 0.5)};
}

bool sameSegment(const GroundFrame& g, std::int64_t a, std::int64_t b) {
  if (a < 0 || b < 0 || a >= static_cast<std::int64_t>(g.segment.size()) ||
      b >= static_cast<std::int64_t>(g.segment.size()))
    return false;
  return g.segment[static_cast<std::size_t>(a)] >= 0 &&
         g.segment[static_cast<std::size_t>(a)] == g.segment[static_cast<std::size_t>(b)];
}

double distanceTo(const GroundFrame& g, std::int64_t k, Vec2 standing) {
  const Vec2 p = g.at[static_cast<std::size_t>(k)];
  return std::hypot(p.x - standing.x, p.y - standing.y);
}

// Touchdown by position: the earliest frame from which the foot stays where it stands.
std::int64_t touchdownByPosition(const GroundFrame& g, std::int64_t start, std::int64_t stanceEnd,
                                 double tolerance) {
  const std::int64_t settled = std::min(stanceEnd, start + 4);
  if (!sameSegment(g, start, settled) || settled <= start) return start;
  const Vec2 standing = medianPosition(g, start + 1, settled);
  std::int64_t first = start;
  while (first > start - 2 && sameSegment(g, first - 1, settled) &&
         distanceTo(g, first - 1, standing) <= tolerance)
    --first;
  while (first < start + 2 && distanceTo(g, first, standing) > tolerance) ++first;
  return first;
}

// Lift-off by position: the first frame the foot has left where it stood.
std::int64_t liftoffByPosition(const GroundFrame& g, std::int64_t stanceStart,
                               std::int64_t lastStanding, double tolerance) {
  const std::int64_t settled = std::max(stanceStart, lastStanding - 4);
  const std::int64_t firstOff = lastStanding + 1;
  if (!sameSegment(g, settled, firstOff) || settled >= lastStanding) return firstOff;
  const Vec2 standing = medianPosition(g, settled, lastStanding - 1);
  std::int64_t off = firstOff;
  while (off > firstOff - 2 && off - 1 > settled && distanceTo(g, off - 1, standing) > tolerance)
    --off;
  while (off < firstOff + 2 && sameSegment(g, off, settled) &&
         distanceTo(g, off, standing) <= tolerance)
    ++off;
  return off;
}

Boundary decide(std::int64_t byVelocity, std::int64_t byPosition, model::EventKind kind) {
  // Two cues that agree within two frames: the position cue places the frame (it does not
  // depend on a speed threshold); otherwise trust the velocity rule.
  const std::int64_t chosen = std::abs(byPosition - byVelocity) <= 2 ? byPosition : byVelocity;
  return {byVelocity, byPosition, chosen, kind};
}

std::vector<Boundary> findBoundaries(const std::vector<Phase>& phase, const GroundFrame& g,
                                     double tolerance) {
  std::vector<Boundary> out;
  std::size_t t = 0;
  while (t < phase.size()) {
    if (phase[t] != Phase::stance) {
      ++t;
      continue;
    }
    std::size_t end = t;
    while (end < phase.size() && phase[end] == Phase::stance) ++end;
    // Stance pairs [t, end): the foot stands in frames t .. end.
    const auto first = static_cast<std::int64_t>(t);
    const auto last = static_cast<std::int64_t>(end);
    if (t > 0 && phase[t - 1] == Phase::swing)
      out.push_back(decide(first, touchdownByPosition(g, first, last, tolerance),
                           model::EventKind::touchdown));
    if (end < phase.size() && phase[end] == Phase::swing)
      out.push_back(decide(last + 1, liftoffByPosition(g, first, last, tolerance),
                           model::EventKind::liftoff));
    t = end;
  }
  return out;
}

double meanSpeedNear(const PairMotion& pairs, std::int64_t from, std::int64_t to) {
  double sum = 0;
  int n = 0;
  for (std::int64_t t = from; t <= to; ++t) {
    if (t < 0 || t >= static_cast<std::int64_t>(pairs.speed.size())) continue;
    if (!pairs.valid[static_cast<std::size_t>(t)]) continue;
    sum += pairs.speed[static_cast<std::size_t>(t)];
    ++n;
  }
  return n ? sum / n : 0;
}

double trackQualityNear(const FootMotion& m, std::int64_t frame) {
  double q = 1;
  for (std::int64_t k = frame - 2; k <= frame + 2; ++k) {
    if (k < 0 || k >= static_cast<std::int64_t>(m.quality.size())) continue;
    q = std::min(
        q, m.visible[static_cast<std::size_t>(k)] ? m.quality[static_cast<std::size_t>(k)] : 0.3);
  }
  return q;
}

double agreementOf(const Boundary& b) {
  switch (std::abs(b.byPosition - b.byVelocity)) {
    case 0:
      return 1.0;
    case 1:
      return 0.8;
    case 2:
      return 0.55;
    default:
      return 0.35;
  }
}

// How well the interval to the neighbouring event of the same kind fits this foot's typical
// stride (1 = exactly one typical stride).
std::vector<double> strideFit(const std::vector<Boundary>& events) {
  std::vector<double> fit(events.size(), 0.6);
  for (const auto kind : {model::EventKind::touchdown, model::EventKind::liftoff}) {
    std::vector<std::size_t> idx;
    for (std::size_t i = 0; i < events.size(); ++i)
      if (events[i].kind == kind) idx.push_back(i);
    if (idx.size() < 3) continue;
    std::vector<double> gaps;
    for (std::size_t i = 1; i < idx.size(); ++i)
      gaps.push_back(static_cast<double>(events[idx[i]].chosen - events[idx[i - 1]].chosen));
    const double typical = percentile(gaps, 0.5);
    if (typical <= 0) continue;
    for (std::size_t i = 0; i < idx.size(); ++i) {
      const double gap = i > 0 ? gaps[i - 1] : gaps[0];
      fit[idx[i]] = std::clamp(1.0 - std::abs(gap / typical - 1.0) / 0.5, 0.0, 1.0);
    }
  }
  return fit;
}

double confidenceOf(const Boundary& b, const PairMotion& pairs, const FootMotion& m,
                    const Thresholds& th, double fit) {
  // The swing side of the boundary should move clearly faster than the threshold to leave.
  const double swingSpeed = b.kind == model::EventKind::touchdown
                                ? meanSpeedNear(pairs, b.chosen - 2, b.chosen - 1)
                                : meanSpeedNear(pairs, b.chosen - 1, b.chosen);
  const double sharp = std::clamp((swingSpeed / th.leave - 1.0) / 2.0, 0.0, 1.0);
  const double track = trackQualityNear(m, b.chosen);
  const double c =
      std::sqrt(std::max(track, 0.0)) * (0.35 + 0.65 * sharp) * agreementOf(b) * (0.6 + 0.4 * fit);
  return std::clamp(c, 0.0, 1.0);
}

std::vector<model::HiddenSpan> hiddenSpans(int limb, const FootMotion& m) {
  std::vector<model::HiddenSpan> spans;
  for (std::size_t k = 0; k < m.visible.size();) {
    if (m.visible[k]) {
      ++k;
      continue;
    }
    std::size_t end = k;
    while (end < m.visible.size() && !m.visible[end]) ++end;
    spans.push_back({limb, m.first + static_cast<std::int64_t>(k),
                     m.first + static_cast<std::int64_t>(end) - 1});
    k = end;
  }
  return spans;
}

int minimumPairs(double fps) {
  return std::max(2, static_cast<int>(std::lround(0.02 * fps)));
}

}  // namespace

LimbProposals proposeFromMotion(int limb, const FootMotion& motion, const RuleSettings& settings) {
  LimbProposals out;
  out.hidden = hiddenSpans(limb, motion);
  const PairMotion pairs = relativeMotion(motion);
  const auto th = thresholdsFor(pairs);
  if (!th) return out;
  std::vector<Phase> phase = hysteresis(pairs, *th);
  const int minimum = minimumPairs(settings.fps);
  absorbShortRuns(phase, Phase::swing, Phase::stance, minimum);
  absorbShortRuns(phase, Phase::stance, Phase::swing, std::max(1, minimum - 1));
  const GroundFrame g = groundFramePositions(pairs);
  const std::vector<Boundary> boundaries = findBoundaries(phase, g, th->tolerance);
  const std::vector<double> fit = strideFit(boundaries);
  const auto frames = static_cast<std::int64_t>(motion.position.size());
  for (std::size_t i = 0; i < boundaries.size(); ++i) {
    const Boundary& b = boundaries[i];
    if (b.chosen < 1 || b.chosen >= frames) continue;
    // Never next to an unseen frame: the event could be in the gap.
    if (!motion.visible[static_cast<std::size_t>(b.chosen)] ||
        !motion.visible[static_cast<std::size_t>(b.chosen - 1)])
      continue;
    model::ProposedEvent p;
    p.event = {motion.first + b.chosen, limb, b.kind};
    p.confidence = confidenceOf(b, pairs, motion, *th, fit[i]);
    out.events.push_back(p);
  }
  return out;
}

}  // namespace stridemark::vision::detail
