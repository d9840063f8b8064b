#include "analysis/phase.h"

#include <gtest/gtest.h>

#include <vector>

#include "analysis/analyse.h"
#include "analysis/circular.h"
#include "event_train.h"

namespace stridemark::analysis {
namespace {

TEST(Phase, HildebrandLimbPhase) {
  // Source: Hildebrand phase definition (Usherwood & Self Davies 2017) [src def, calc];
  // docs/methods.md check 2: LH stride 100-225, LF touchdown 131 -> 0.248 (exact).
  const std::vector<std::int64_t> lf{131};
  const WindowPhase wp = phaseInWindow(lf, 100, 225);
  ASSERT_TRUE(wp.phase);
  EXPECT_DOUBLE_EQ(*wp.phase, 0.248);
}

TEST(Phase, LateTouchdownAndCentredForm) {
  // Source: docs/methods.md check 3 [calc]: target touchdown at 222 -> 0.976, centred -0.024.
  const std::vector<std::int64_t> target{222};
  const WindowPhase wp = phaseInWindow(target, 100, 225);
  ASSERT_TRUE(wp.phase);
  EXPECT_DOUBLE_EQ(*wp.phase, 0.976);
  EXPECT_NEAR(centredPhase(*wp.phase), -0.024, 1e-12);
}

TEST(Phase, NoTouchdownInWindowIsNull) {
  // Source: docs/methods.md §1.2/§1.3 [choice]: null when the limb has no touchdown in the window.
  const std::vector<std::int64_t> target{50, 225, 300};
  const WindowPhase wp = phaseInWindow(target, 100, 225);
  EXPECT_EQ(wp.touchdowns, 0);
  EXPECT_FALSE(wp.phase);
}

TEST(Phase, TwoTouchdownsAreFlaggedAndNull) {
  // Source: docs/methods.md §1.3 [choice]: two touchdowns in a reference stride -> flag, undefined.
  const std::vector<std::int64_t> target{120, 180};
  const WindowPhase wp = phaseInWindow(target, 100, 225);
  EXPECT_TRUE(wp.ambiguous());
  EXPECT_FALSE(wp.phase);
  EXPECT_EQ(*wp.first, 120);
}

TEST(Phase, StrideRecordCarriesCountAndNullPhase) {
  // Common practice, no source: a limb stepping twice per reference stride (stride mismatch).
  model::Annotation a =
      testing::idealTrain(model::LimbSet::biped(), {{0, 0.6}, {0.5, 0.2}}, 1200, 3);
  // Give R an extra step 300 frames after each of its touchdowns.
  std::vector<model::Event> extra;
  for (const model::Event& e : a.events)
    if (e.limb == 1) extra.push_back({e.frame + 300, 1, e.kind});
  a.events.insert(a.events.end(), extra.begin(), extra.end());
  a.normalize();
  const Report r = analyse(a);
  ASSERT_EQ(r.strides.size(), 3u);
  EXPECT_EQ(r.strides[0].touchdownCount[1], 2);
  EXPECT_FALSE(r.strides[0].phase[1]);
  EXPECT_EQ(r.strides[0].gait, "unclassified");
}

TEST(Phase, NearestTouchdown) {
  const std::vector<std::int64_t> tds{100, 200, 300};
  EXPECT_EQ(*nearestTouchdown(tds, 149), 100);
  EXPECT_EQ(*nearestTouchdown(tds, 151), 200);
  EXPECT_EQ(*nearestTouchdown(tds, 1000), 300);
  EXPECT_FALSE(nearestTouchdown(std::vector<std::int64_t>{}, 5));
}

}  // namespace
}  // namespace stridemark::analysis
