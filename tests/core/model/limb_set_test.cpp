#include "model/limb_set.h"

#include <gtest/gtest.h>

#include "common/error.h"

namespace stridemark::model {
namespace {

// Our limb-set contract (CHANGELOG.md, events CSV): labels, order, default reference limb.
TEST(LimbSet, QuadrupedLabelsOrderAndReference) {
  const auto q = LimbSet::quadruped();
  ASSERT_EQ(q.size(), 4);
  EXPECT_EQ(q.labelList(), "LF, RF, LH, RH");
  EXPECT_EQ(q.label(q.defaultReference()), "LH");
  EXPECT_EQ(q.label(q.contralateral(*q.indexOf("LF"))), "RF");
  EXPECT_EQ(*q.at(Side::right, 1), *q.indexOf("RH"));
}

TEST(LimbSet, BipedHexapodAndMultiPair) {
  EXPECT_EQ(LimbSet::biped().labelList(), "L, R");
  EXPECT_EQ(LimbSet::hexapod().labelList(), "L1, R1, L2, R2, L3, R3");
  EXPECT_EQ(LimbSet::hexapod().label(LimbSet::hexapod().defaultReference()), "L1");
  const auto m = LimbSet::multiPair(3);
  EXPECT_EQ(m.labelList(), "L1, L2, L3, R1, R2, R3");
  EXPECT_EQ(m.name(), "multi-pair-3");
  EXPECT_EQ(LimbSet::fromName("multi-pair-3"), m);
  EXPECT_EQ(LimbSet::fromName("multipair:3"), m);
}

TEST(LimbSet, UnknownNameSaysWhatIsAccepted) {
  try {
    LimbSet::fromName("octopus");
    FAIL();
  } catch (const Error& e) {
    EXPECT_NE(std::string(e.what()).find("multi-pair-N"), std::string::npos);
  }
  EXPECT_THROW(LimbSet::fromName("multi-pair-0"), Error);
  EXPECT_THROW(LimbSet::fromName("multi-pair-x"), Error);
}

}  // namespace
}  // namespace stridemark::model
