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

// Found by tests/fuzz (fuzz_journal): hidden spans sharing limb and first frame kept the order
// they came in, so a journal or project written and read back changed its bytes. Common
// practice, no source: normalising is canonical, whatever the input order.
TEST(Annotation, NormalizeGivesOneOrderWhateverTheInputOrder) {
  Annotation a;
  a.hidden = {{2, 0, 71}, {2, 0, 21}, {1, 5, 9}};
  a.excluded = {{40, "stumbled"}, {40, "looked back"}};
  Annotation b;
  b.hidden = {{1, 5, 9}, {2, 0, 21}, {2, 0, 71}};
  b.excluded = {{40, "looked back"}, {40, "stumbled"}};
  a.normalize();
  b.normalize();
  EXPECT_EQ(a.hidden, b.hidden);
  EXPECT_EQ(a.hidden.front(), (HiddenSpan{1, 5, 9}));
  EXPECT_EQ(a.hidden.back(), (HiddenSpan{2, 0, 71}));
  EXPECT_EQ(a.excluded, b.excluded);
}

TEST(Annotation, EventWordsRoundTrip) {
  EXPECT_EQ(parseEventWord("touchdown"), EventKind::touchdown);
  EXPECT_EQ(parseEventWord("liftoff"), EventKind::liftoff);
  EXPECT_EQ(parseEventWord("Touchdown"), std::nullopt);
  EXPECT_EQ(eventWord(EventKind::liftoff), "liftoff");
}

}  // namespace
}  // namespace stridemark::model
