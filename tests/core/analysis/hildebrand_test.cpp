#include "analysis/hildebrand.h"
#include "analysis/gait_rules.h"

#include <gtest/gtest.h>

#include <string>

#include "analysis/analyse.h"
#include "event_train.h"

namespace stridemark::analysis {
namespace {

using testing::symmetricalQuadruped;

// A symmetrical stride with its gait and both classification schemes (docs/methods.md §2.2).
void expectSymmetricalStride(const StrideRecord& s, const std::string& gait,
                             const std::string& quadrant, const std::string& band,
                             const std::string& sequence) {
  EXPECT_TRUE(s.symmetrical);
  EXPECT_EQ(s.gait, gait);
  EXPECT_EQ(*s.quadrant, quadrant);
  EXPECT_EQ(*s.band, band);
  EXPECT_EQ(*s.sequence, sequence);
}

TEST(Hildebrand, LateralSequenceWalk) {
  // Source: docs/methods.md check 17, Cartmill 2002 quadrants [src]: hind DF 0.62, phase 0.20 ->
  // scheme A "LSLC" walk, scheme B "LS single-foot" walk [choice on src definitions].
  const Report r = analyse(symmetricalQuadruped(0.62, 0.20));
  const StrideRecord& s = r.strides.at(2);
  expectSymmetricalStride(s, "walk", "LSLC", "lateral-sequence single-foot", "lateral");
  EXPECT_NEAR(*s.hindDutyFactor, 0.62, 1e-12);
  EXPECT_NEAR(*s.limbPhase, 0.20, 1e-12);
  ASSERT_TRUE(r.hildebrand);
  EXPECT_NEAR(r.hildebrand->dutyFactor, 0.62, 1e-12);
  EXPECT_NEAR(r.hildebrand->limbPhase, 0.20, 1e-12);
  EXPECT_EQ(r.hildebrand->band, "lateral-sequence single-foot");
  EXPECT_EQ(r.hildebrand->quadrant, "LSLC");
}

TEST(Hildebrand, LateralSequenceDiagonalCoupletsWalk) {
  // Source: docs/methods.md §2.2 scheme A, Cartmill 2002 [src]: 25 < D < 50 -> "LSDC"; scheme B
  // band [31.25,43.75) -> "LS diagonal couplets" [mem+choice]; docs/methods.md §2.4 [src]: fore DF
  // 60 % puts the LSDC optimum at D = 40. Hind DF 0.60 >= 0.5 -> a walk (CHANGELOG.md vocabulary).
  const StrideRecord s = analyse(symmetricalQuadruped(0.60, 0.40)).strides.at(2);
  expectSymmetricalStride(s, "walk", "LSDC", "lateral-sequence diagonal couplets", "lateral");
  EXPECT_NEAR(*s.limbPhase, 0.40, 1e-12);
}

TEST(Hildebrand, DiagonalSequenceWalk) {
  // Source: docs/methods.md check 17: hind DF 0.62, phase 0.60 -> DSDC walk, "DS diagonal couplets"
  const StrideRecord s = analyse(symmetricalQuadruped(0.62, 0.60)).strides.at(2);
  expectSymmetricalStride(s, "walk", "DSDC", "diagonal-sequence diagonal couplets", "diagonal");
}

TEST(Hildebrand, RunningTrot) {
  // Source: docs/methods.md check 17: DF 0.45, phase 0.50 -> "running trot" (trot band, DF < 0.5).
  const StrideRecord s = analyse(symmetricalQuadruped(0.45, 0.50)).strides.at(2);
  EXPECT_EQ(s.gait, "trot");
  EXPECT_EQ(*s.band, "trot");
  EXPECT_FALSE(s.sequence);
  EXPECT_LT(*s.hindDutyFactor, 0.5);
}

TEST(Hildebrand, SymmetryGate) {
  // Source: Schmitt et al. 2006 10 % criterion [src]; docs/methods.md check 18.
  EXPECT_TRUE(isSymmetrical(0.58, 0.50, 0.10));
  EXPECT_FALSE(isSymmetrical(0.62, 0.50, 0.10));
  // The same through analyse: RH at 0.58 (symmetrical) and 0.62 (not) of the LH stride.
  for (const auto& [rh, expected] : {std::pair{0.58, true}, std::pair{0.62, false}}) {
    const model::Annotation a = testing::idealTrain(
        model::LimbSet::quadruped(), {{0.25, 0.7}, {0.75, 0.7}, {0, 0.7}, {rh, 0.7}}, 1200, 4);
    EXPECT_EQ(analyse(a).strides.at(1).symmetrical, expected) << "RH at " << rh;
  }
}

TEST(Hildebrand, BandTableEdgesAndWrap) {
  // Source: docs/methods.md §2.2 scheme B [mem + choice]: 12.5 %-wide bands, pace wraps round 0.
  EXPECT_EQ(hildebrandBand(0.97), "pace");
  EXPECT_EQ(hildebrandBand(0.03), "pace");
  EXPECT_EQ(hildebrandBand(0.0625), "lateral-sequence lateral couplets");
  EXPECT_EQ(hildebrandBand(0.4375), "trot");
  EXPECT_EQ(hildebrandBand(0.5624), "trot");
  EXPECT_EQ(hildebrandBand(0.75), "diagonal-sequence single-foot");
  EXPECT_EQ(hildebrandBand(0.9), "diagonal-sequence lateral couplets");
  // The table is configurable: a two-band table.
  const std::vector<BandEdge> two = {{0.25, "a"}, {0.75, "b"}};
  EXPECT_EQ(hildebrandBand(0.5, two), "a");
  EXPECT_EQ(hildebrandBand(0.1, two), "b");
}

TEST(Hildebrand, CartmillOptimaOnQuadrants) {
  // Source: Cartmill 2002 optimal-support relations [src, abstract]; docs/methods.md §2.4 check
  // [calc]: hind DF 60 % -> DSDC optimum D = 60 and LSLC optimum D = 10; fore DF 60 % -> LSDC
  // optimum D = 40. Each optimum falls in the quadrant its relation belongs to.
  EXPECT_EQ(*cartmillQuadrant(0.60), "DSDC");
  EXPECT_EQ(*cartmillQuadrant(0.60 - 0.50), "LSLC");
  EXPECT_EQ(*cartmillQuadrant(1.00 - 0.60), "LSDC");
  EXPECT_EQ(*cartmillQuadrant(0.80), "DSLC");
  EXPECT_FALSE(cartmillQuadrant(0.5));
}

TEST(Hildebrand, PaceAndAmble) {
  // Source: Schmitt et al. 2006 Fig. 2 legend [src]: running strides with no aerial phase away
  // from 0/50 % are ambles; paces near 0 %.
  const StrideRecord pace = analyse(symmetricalQuadruped(0.45, 0.0)).strides.at(2);
  EXPECT_EQ(pace.gait, "pace");
  const StrideRecord amble = analyse(symmetricalQuadruped(0.45, 0.25)).strides.at(2);
  EXPECT_EQ(amble.gait, "amble");
  EXPECT_FALSE(amble.aerial);
}

}  // namespace
}  // namespace stridemark::analysis
