#include "analysis/bouts.h"

#include <gtest/gtest.h>

#include <algorithm>

#include "analysis/analyse.h"
#include "event_train.h"

namespace stridemark::analysis {
namespace {

StrideRecord stride(std::int64_t start, std::int64_t end, const char* gait) {
  StrideRecord s;
  s.startFrame = start;
  s.endFrame = end;
  s.gait = gait;
  return s;
}

TEST(Bouts, ConsecutiveSameGaitStridesJoin) {
  // Common practice, no source: a bout is a run of touching strides with one gait.
  std::vector<StrideRecord> strides = {stride(0, 100, "walk"),   stride(100, 200, "walk"),
                                       stride(200, 290, "trot"), stride(290, 380, "trot"),
                                       stride(500, 590, "trot"), stride(590, 680, "trot")};
  const std::vector<Bout> bouts = findBouts(strides);
  ASSERT_EQ(bouts.size(), 3u);
  EXPECT_EQ(bouts[0].gait, "walk");
  EXPECT_EQ(bouts[0].firstStride, 0);
  EXPECT_EQ(bouts[0].lastStride, 1);
  EXPECT_EQ(bouts[0].endFrame, 200);
  EXPECT_EQ(bouts[1].firstStride, 2);
  EXPECT_EQ(bouts[1].lastStride, 3);
  EXPECT_EQ(bouts[2].startFrame, 500);  // a gap starts a new bout even with the same gait
  const std::vector<Transition> transitions = findTransitions(bouts, strides);
  ASSERT_EQ(transitions.size(), 1u);  // no transition across the gap
  EXPECT_EQ(transitions[0].fromGait, "walk");
  EXPECT_EQ(transitions[0].toGait, "trot");
  EXPECT_EQ(transitions[0].frame, 200);
  EXPECT_EQ(transitions[0].stride, 2);
}

TEST(Bouts, UnclassifiedStridesInsideARunDoNotEndIt) {
  // Source: docs/methods.md §11: unclassified strides inside a run of one gait do not end the
  // bout; they are left out of its statistics.
  std::vector<StrideRecord> strides = {stride(0, 60, "trot"), stride(60, 120, "unclassified"),
                                       stride(120, 180, "trot"), stride(180, 240, "trot")};
  const std::vector<Bout> bouts = findBouts(strides);
  ASSERT_EQ(bouts.size(), 1u);
  EXPECT_EQ(bouts[0].firstStride, 0);
  EXPECT_EQ(bouts[0].lastStride, 3);
  EXPECT_EQ(strides[1].bout, 0);
  EXPECT_EQ(summarisedMembers(strides, bouts[0]), (std::vector<int>{0, 2, 3}));
}

TEST(Bouts, OneStrideOfAGaitBetweenTwoBoutsIsATransition) {
  // Source: docs/methods.md §11: a gait seen in a single stride between two bouts is no bout.
  std::vector<StrideRecord> strides = {stride(0, 100, "walk"), stride(100, 200, "walk"),
                                       stride(200, 283, "canter"), stride(283, 343, "trot"),
                                       stride(343, 403, "trot")};
  const std::vector<Bout> bouts = findBouts(strides);
  ASSERT_EQ(bouts.size(), 2u);
  EXPECT_EQ(bouts[0].gait, "walk");
  EXPECT_EQ(bouts[1].gait, "trot");
  EXPECT_EQ(strides[2].gait, "transition");
  EXPECT_EQ(strides[2].bout, -1);
  const std::vector<Transition> transitions = findTransitions(bouts, strides);
  ASSERT_EQ(transitions.size(), 1u);
  EXPECT_EQ(transitions[0].frame, 283);
}

TEST(Bouts, UnsteadyStrideWhereGaitsMeetIsATransition) {
  // Source: docs/methods.md §1.5: an unsteady stride between two bouts of different gaits is
  // a transition; elsewhere it keeps its label.
  std::vector<StrideRecord> strides = {stride(0, 100, "walk"),   stride(100, 200, "walk"),
                                       stride(200, 290, "walk"), stride(290, 350, "trot"),
                                       stride(350, 410, "trot"), stride(410, 470, "trot")};
  strides[2].steady = false;
  strides[5].steady = false;  // inside the trot bout's end: keeps its label
  const std::vector<Bout> bouts = findBouts(strides);
  ASSERT_EQ(bouts.size(), 2u);
  EXPECT_EQ(strides[2].gait, "transition");
  EXPECT_EQ(bouts[0].lastStride, 1);
  EXPECT_EQ(strides[5].gait, "trot");
  EXPECT_EQ(summarisedMembers(strides, bouts[1]), (std::vector<int>{3, 4}));
}

TEST(Bouts, ASingleStrideIsNoBout) {
  // Source: docs/methods.md §11: a bout is at least 2 strides (configurable).
  std::vector<StrideRecord> strides = {stride(0, 100, "walk")};
  EXPECT_TRUE(findBouts(strides).empty());
  EXPECT_EQ(findBouts(strides, 1).size(), 1u);
}

// Appends `count` cycles of one limb: touchdowns at start + k * stride + offset * stride.
void addCycles(model::Annotation& a, int limb, std::int64_t start, std::int64_t stride,
               double offset, double dutyFactor, int count) {
  for (int k = 0; k < count; ++k) {
    const auto td = start + k * stride + static_cast<std::int64_t>(offset * stride);
    a.events.push_back({td, limb, model::EventKind::touchdown});
    a.events.push_back(
        {td + static_cast<std::int64_t>(dutyFactor * stride), limb, model::EventKind::liftoff});
  }
}

// Three walk strides (1200 frames, DF 0.7, LS single-foot) then trot strides (1000 frames,
// DF 0.4) of one quadruped; limb order LF, RF, LH, RH; LH is the reference.
model::Annotation walkThenTrotTags() {
  model::Annotation a;
  a.captureRate = {1200, 1};
  a.referenceLimb = 2;
  const double walkOffsets[] = {0.25, 0.75, 0.0, 0.5};
  const double trotOffsets[] = {0.5, 1.0, 0.0, 0.5};
  for (int limb = 0; limb < 4; ++limb) {
    addCycles(a, limb, 1000, 1200, walkOffsets[limb], 0.7, 3);
    addCycles(a, limb, 4600, 1000, trotOffsets[limb], 0.4, 4);
  }
  a.normalize();
  return a;
}

TEST(Bouts, WalkToTrotTransitionFromTags) {
  // Common practice, no source: the walk-then-trot tags of walkThenTrotTags().
  const model::Annotation a = walkThenTrotTags();
  const Report r = analyse(a);
  ASSERT_TRUE(r.problems.empty()) << r.problems.front().message;
  ASSERT_EQ(r.strides.size(), 6u);
  ASSERT_EQ(r.bouts.size(), 2u);
  EXPECT_EQ(r.bouts[0].gait, "walk");
  // Source: docs/methods.md §1.5: in the last walk stride LF's cycle (3700-5100) is 1.17x the
  // stride, so it is unsteady where the gaits meet: a transition. In the next one RF lands at
  // 5600 only (trot offset 1.0): no touchdown in 4600-5600, its touchdown slipped out of the
  // window as the cycles changed length, so between the bouts it is a transition as well
  // (METHODS §1.5: an unsteady stride between two bouts of different gaits is `transition`).
  EXPECT_EQ(r.bouts[0].lastStride, 1);
  EXPECT_EQ(r.strides[2].gait, "transition");
  EXPECT_EQ(r.strides[3].gait, "transition");
  EXPECT_EQ(r.bouts[1].gait, "trot");
  EXPECT_EQ(r.bouts[1].startFrame, 5600);
  ASSERT_EQ(r.transitions.size(), 1u);
  EXPECT_EQ(r.transitions[0].frame, 5600);
  EXPECT_EQ(r.transitions[0].fromGait, "walk");
  // Source: docs/methods.md §11: per-gait summaries, and the trial flagged as mixed.
  EXPECT_TRUE(r.mixedGaits);
  ASSERT_EQ(r.byGait.count("walk"), 1u);
  ASSERT_EQ(r.byGait.count("trot"), 1u);
  EXPECT_NEAR(r.byGait.at("walk").limbs[2].dutyFactor.mean, 0.7, 1e-9);
  EXPECT_NEAR(r.byGait.at("trot").limbs[2].dutyFactor.mean, 0.4, 1e-9);
  EXPECT_EQ(r.bouts[0].summary.strides, 2);
}

TEST(Bouts, UnclassifiedStrideOutsideATransitionSaysWhichLimbAndWhy) {
  // Source: METHODS §1.5 (an incomplete stride is `unclassified` and `problems` says which limb
  // and what is missing). The walk-to-trot tags above, with bouts of 3 strides: the two walk
  // strides are no bout, so the stride where RF's touchdown slipped out of the window is no
  // transition: it stays unclassified and a problem names RF and frame 4600.
  const model::Annotation a = walkThenTrotTags();
  AnalysisOptions options;
  options.minBoutStrides = 3;
  const Report r = analyse(a, options);
  ASSERT_EQ(r.strides.size(), 6u);
  ASSERT_EQ(r.strides[3].gait, "unclassified");
  const auto it = std::find_if(r.problems.begin(), r.problems.end(),
                               [](const Problem& p) { return p.frame == 4600; });
  ASSERT_NE(it, r.problems.end());
  EXPECT_EQ(it->limb, 1);
  EXPECT_NE(it->message.find("stride 4600-5600 is unclassified: RF has no touchdown in it"),
            std::string::npos)
      << it->message;
}

}  // namespace
}  // namespace stridemark::analysis
