// The stance rule on foot trajectories whose stance spans are known exactly.
#include "vision/stance_rule.h"

#include <gtest/gtest.h>

#include <cmath>
#include <random>

namespace stridemark::vision::detail {
namespace {

using model::EventKind;

// A foot on a treadmill seen by a still camera: in stance it moves back with the belt
// (`belt` px per frame); in swing it moves forward and up, back down onto the belt. Stance
// frames are [td, lo) of each stride; the frame convention is Stridemark's (touchdown = first
// frame on the ground, lift-off = first frame off).
struct Stride {
  int td, lo;
};

FootMotion treadmillFoot(int frames, const std::vector<Stride>& strides, double belt,
                         double noise = 0, unsigned seed = 1) {
  FootMotion m;
  m.first = 0;
  std::mt19937 rng(seed);
  std::normal_distribution<double> jitter(0, noise > 0 ? noise : 1);
  double x = 300;
  bool wasStance = false;
  for (int f = 0; f < frames; ++f) {
    bool stance = false;
    double swingShare = 0;
    int swingLength = 1;
    for (std::size_t i = 0; i < strides.size(); ++i) {
      if (f >= strides[i].td && f < strides[i].lo) stance = true;
      const int nextTd = i + 1 < strides.size() ? strides[i + 1].td : frames + 40;
      if (f >= strides[i].lo && f < nextTd) {
        swingLength = nextTd - strides[i].lo;
        swingShare = static_cast<double>(f - strides[i].lo) / swingLength;
      }
    }
    // Into a stance frame from a stance frame the foot moves with the belt; arriving at
    // touchdown and leaving at lift-off it moves as in swing.
    if (f > 0) x += stance && wasStance ? -belt : 2.5 * belt;
    wasStance = stance;
    const double lift = stance ? 0 : 12 * std::sin(M_PI * swingShare);
    Vec2 p{x, 200 - lift};
    if (noise > 0) {
      p.x += jitter(rng);
      p.y += jitter(rng);
    }
    m.position.push_back(p);
    m.quality.push_back(0.95);
    m.visible.push_back(true);
  }
  for (int t = 0; t + 1 < frames; ++t) m.ground.push_back(Vec2{-belt, 0});
  return m;
}

std::vector<model::Event> eventsOf(const LimbProposals& p) {
  std::vector<model::Event> out;
  for (const auto& e : p.events) out.push_back(e.event);
  return out;
}

const std::vector<Stride> kStrides = {{10, 40}, {70, 100}, {130, 160}, {190, 220}};

// Source: docs/methods.md §13 (stance while the foot moves with the ground) and the frame
// convention of the events CSV; exact trajectories, so exact frames are expected.
TEST(StanceRule, FindsExactFramesOnACleanTreadmillTrajectory) {
  const auto found = proposeFromMotion(2, treadmillFoot(250, kStrides, 3.0), {120});
  std::vector<model::Event> expected;
  for (const auto& s : kStrides) {
    expected.push_back({s.td, 2, EventKind::touchdown});
    expected.push_back({s.lo, 2, EventKind::liftoff});
  }
  EXPECT_EQ(eventsOf(found), expected);
  EXPECT_TRUE(found.hidden.empty());
}

// Source: as above; tracking noise of 0.25 px SD (LK-level noise, common practice, no source)
// must not add or move events by more than one frame.
TEST(StanceRule, NoisyTrackStaysWithinOneFrame) {
  const auto found = proposeFromMotion(0, treadmillFoot(250, kStrides, 3.0, 0.25, 7), {120});
  ASSERT_EQ(found.events.size(), 2 * kStrides.size());
  for (std::size_t i = 0; i < kStrides.size(); ++i) {
    EXPECT_NEAR(found.events[2 * i].event.frame, kStrides[i].td, 1);
    EXPECT_NEAR(found.events[2 * i + 1].event.frame, kStrides[i].lo, 1);
  }
}

// Source: docs/methods.md §13 (one rule for every scene): over ground under a still camera the
// ground does not move; a foot standing still in the picture is in stance.
TEST(StanceRule, StillGroundIsTheSameRule) {
  FootMotion m = treadmillFoot(250, kStrides, 0.0);
  // Give the swing some forward speed (a foot crossing the picture).
  double x = 100;
  for (std::size_t f = 0; f < m.position.size(); ++f) {
    bool stance = false;
    bool before = false;
    for (const auto& s : kStrides) {
      stance = stance || (static_cast<int>(f) >= s.td && static_cast<int>(f) < s.lo);
      before = before || (static_cast<int>(f) - 1 >= s.td && static_cast<int>(f) - 1 < s.lo);
    }
    if (f > 0 && !(stance && before)) x += 6;
    m.position[f].x = x;
  }
  const auto found = proposeFromMotion(1, m, {120});
  ASSERT_EQ(found.events.size(), 2 * kStrides.size());
  EXPECT_EQ(found.events.front().event.frame, 10);
  EXPECT_EQ(found.events.back().event.frame, 220);
}

// Issue 18 item 1: a briefly hidden foot gets no events inside the gap, and the gap is
// proposed as a hidden span.
TEST(StanceRule, NoEventsInsideAHiddenGapWhichBecomesAHiddenSpan) {
  FootMotion m = treadmillFoot(250, kStrides, 3.0);
  for (int f = 66; f <= 74; ++f) m.visible[static_cast<std::size_t>(f)] = false;  // TD at 70
  const auto found = proposeFromMotion(3, m, {120});
  ASSERT_EQ(found.hidden.size(), 1u);
  EXPECT_EQ(found.hidden[0].first, 66);
  EXPECT_EQ(found.hidden[0].last, 74);
  for (const auto& e : found.events) {
    EXPECT_FALSE(e.event.frame >= 66 && e.event.frame <= 75) << e.event.frame;
  }
  EXPECT_EQ(found.events.size(), 2 * kStrides.size() - 1);  // only the hidden touchdown is gone
}

// Common practice, no source: a track that never moves relative to the ground (an animal
// standing) gives no events rather than events from noise.
TEST(StanceRule, AStandingFootGivesNoEvents) {
  const auto found = proposeFromMotion(0, treadmillFoot(200, {{0, 400}}, 3.0, 0.2), {120});
  EXPECT_TRUE(found.events.empty());
}

// Issue 18 item 1 (confidence from the evidence): events next to poor tracking rank below
// events with clear tracking.
TEST(StanceRule, PoorTrackingNearAnEventLowersItsConfidence) {
  FootMotion m = treadmillFoot(250, kStrides, 3.0);
  for (int f = 128; f <= 132; ++f) m.quality[static_cast<std::size_t>(f)] = 0.2;  // TD at 130
  const auto found = proposeFromMotion(0, m, {120});
  double poor = -1, best = 0;
  for (const auto& e : found.events) {
    if (e.event.frame == 130)
      poor = e.confidence;
    else
      best = std::max(best, e.confidence);
  }
  ASSERT_GE(poor, 0);
  EXPECT_LT(poor, 0.6 * best);
  for (const auto& e : found.events) {
    EXPECT_GE(e.confidence, 0.0);
    EXPECT_LE(e.confidence, 1.0);
  }
}

// Issue 18 item 1 (fit to the stride period): a stride far off this foot's typical period
// ranks below the regular ones.
TEST(StanceRule, AnOddStrideRanksBelowRegularOnes) {
  std::vector<Stride> strides = {{10, 40}, {70, 100}, {130, 160}, {150 + 60 + 40, 280}, {310, 340}};
  const auto found = proposeFromMotion(0, treadmillFoot(380, strides, 3.0), {120});
  double odd = -1, regular = 0;
  for (const auto& e : found.events) {
    if (e.event.kind != EventKind::touchdown) continue;
    if (e.event.frame == 250) odd = e.confidence;
    if (e.event.frame == 70) regular = e.confidence;
  }
  ASSERT_GE(odd, 0);
  EXPECT_LT(odd, regular);
}

}  // namespace
}  // namespace stridemark::vision::detail
