#include "analysis/bouts.h"

#include <gtest/gtest.h>

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
  const std::vector<StrideRecord> strides = {stride(0, 100, "walk"), stride(100, 200, "walk"),
                                             stride(200, 290, "trot"), stride(290, 380, "trot"),
                                             stride(500, 590, "trot")};
  const std::vector<Bout> bouts = findBouts(strides);
  ASSERT_EQ(bouts.size(), 3u);
  EXPECT_EQ(bouts[0].gait, "walk");
  EXPECT_EQ(bouts[0].firstStride, 0);
  EXPECT_EQ(bouts[0].lastStride, 1);
  EXPECT_EQ(bouts[0].endFrame, 200);
  EXPECT_EQ(bouts[1].firstStride, 2);
  EXPECT_EQ(bouts[1].lastStride, 3);
  EXPECT_EQ(bouts[2].startFrame, 500);  // a gap starts a new bout even with the same gait
  const std::vector<Transition> transitions = findTransitions(bouts);
  ASSERT_EQ(transitions.size(), 1u);  // no transition across the gap
  EXPECT_EQ(transitions[0].fromGait, "walk");
  EXPECT_EQ(transitions[0].toGait, "trot");
  EXPECT_EQ(transitions[0].frame, 200);
  EXPECT_EQ(transitions[0].stride, 2);
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

TEST(Bouts, WalkToTrotTransitionFromTags) {
  // Common practice, no source: three walk strides (1200 frames, DF 0.7, LS single-foot) then
  // trot strides (1000 frames, DF 0.4) of one quadruped; limb order LF, RF, LH, RH.
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
  const Report r = analyse(a);
  ASSERT_TRUE(r.problems.empty()) << r.problems.front().message;
  ASSERT_EQ(r.strides.size(), 6u);
  ASSERT_EQ(r.bouts.size(), 2u);
  EXPECT_EQ(r.bouts[0].gait, "walk");
  EXPECT_EQ(r.bouts[0].lastStride, 2);
  EXPECT_EQ(r.bouts[1].gait, "trot");
  EXPECT_EQ(r.bouts[1].startFrame, 4600);
  ASSERT_EQ(r.transitions.size(), 1u);
  EXPECT_EQ(r.transitions[0].frame, 4600);
  EXPECT_EQ(r.transitions[0].fromGait, "walk");
}

}  // namespace
}  // namespace stridemark::analysis
