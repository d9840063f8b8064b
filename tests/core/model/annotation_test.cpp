#include "model/annotation.h"

#include <gtest/gtest.h>

namespace stridemark::model {
namespace {

// Common practice, no source: a limb is in stance from its touchdown frame until its lift-off.
TEST(Annotation, InStanceFollowsTheLastEventAtOrBeforeTheFrame) {
  Annotation a;
  const int lh = *a.limbs.indexOf("LH");
  a.events = {{80, lh, EventKind::liftoff}, {12, lh, EventKind::touchdown}};
  a.normalize();
  EXPECT_FALSE(a.inStance(lh, 11));
  EXPECT_TRUE(a.inStance(lh, 12));
  EXPECT_TRUE(a.inStance(lh, 79));
  EXPECT_FALSE(a.inStance(lh, 80));
  EXPECT_FALSE(a.inStance(*a.limbs.indexOf("LF"), 50));
  EXPECT_EQ(a.eventsOf(lh).size(), 2u);
  EXPECT_EQ(a.eventsOf(lh).front().frame, 12);
}

TEST(Annotation, EventWordsRoundTrip) {
  EXPECT_EQ(parseEventWord("touchdown"), EventKind::touchdown);
  EXPECT_EQ(parseEventWord("liftoff"), EventKind::liftoff);
  EXPECT_EQ(parseEventWord("Touchdown"), std::nullopt);
  EXPECT_EQ(eventWord(EventKind::liftoff), "liftoff");
}

}  // namespace
}  // namespace stridemark::model
