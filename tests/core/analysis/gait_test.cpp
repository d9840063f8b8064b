#include "analysis/gait_rules.h"

#include <gtest/gtest.h>

#include "analysis/analyse.h"
#include "event_train.h"

namespace stridemark::analysis {
namespace {

using model::LimbSet;
using testing::idealTrain;
using testing::LimbPattern;

// Quadruped patterns are given as {LF, RF, LH, RH} (limb-set order).
StrideRecord quadrupedStride(std::vector<LimbPattern> patterns) {
  const Report r = analyse(idealTrain(LimbSet::quadruped(), patterns, 1200, 4));
  return r.strides.at(1);
}

TEST(Gait, TransverseGallopRightLead) {
  // Source: Biancardi & Minetti 2012; WikiVet lead rule [src]; docs/methods.md check 19: order
  // LH, RH, LF, RF with clear gaps -> transverse gallop, right lead.
  const StrideRecord s = quadrupedStride({{0.40, 0.25}, {0.55, 0.25}, {0, 0.25}, {0.12, 0.25}});
  EXPECT_FALSE(s.symmetrical);
  EXPECT_EQ(s.gait, "transverse gallop");
  EXPECT_EQ(*s.lead, "right");
  EXPECT_FALSE(s.band);
}

TEST(Gait, RotaryGallopRightForeLead) {
  // Source: docs/methods.md check 19: RH, LH, LF, RF -> rotary gallop, right fore lead (left hind
  // lead) - Biancardi & Minetti 2012; WikiVet [src].
  const StrideRecord s = quadrupedStride({{0.40, 0.25}, {0.55, 0.25}, {0.12, 0.25}, {0, 0.25}});
  EXPECT_EQ(s.gait, "rotary gallop");
  EXPECT_EQ(*s.lead, "right");
}

TEST(Gait, LeftLeadTransverseGallop) {
  // Source: mirror image of docs/methods.md check 19 (order RH, LH, RF, LF) [calc].
  const StrideRecord s = quadrupedStride({{0.55, 0.25}, {0.40, 0.25}, {0.12, 0.25}, {0, 0.25}});
  EXPECT_EQ(s.gait, "transverse gallop");
  EXPECT_EQ(*s.lead, "left");
}

TEST(Gait, Canter) {
  // Source: docs/methods.md §3.1 canter: trailing hind alone, then lead hind + trailing fore,
  // then lead fore [src: 3 beats, diagonal together; pairing mem]. Right lead.
  const StrideRecord s = quadrupedStride({{0.25, 0.3}, {0.45, 0.3}, {0, 0.3}, {0.25, 0.3}});
  EXPECT_EQ(s.gait, "canter");
  EXPECT_EQ(*s.lead, "right");
}

TEST(Gait, HalfBoundBoundPronk) {
  // From memory (docs/methods.md §3.1): half-bound = hinds together, fores apart; bound = both
  // together; pronk = all four together.
  const StrideRecord half = quadrupedStride({{0.45, 0.2}, {0.6, 0.2}, {0, 0.2}, {0, 0.2}});
  EXPECT_EQ(half.gait, "half-bound");
  EXPECT_EQ(*half.lead, "right");
  const StrideRecord bound = quadrupedStride({{0.5, 0.2}, {0.5, 0.2}, {0, 0.2}, {0, 0.2}});
  EXPECT_EQ(bound.gait, "bound");
  EXPECT_FALSE(bound.lead);
  EXPECT_TRUE(bound.aerial);
  const StrideRecord pronk = quadrupedStride({{0, 0.3}, {0, 0.3}, {0, 0.3}, {0, 0.3}});
  EXPECT_EQ(pronk.gait, "pronk");
  EXPECT_TRUE(pronk.aerial);
}

TEST(Gait, TauNeverBelowTwoFrames) {
  // Source: docs/methods.md §3.3 [choice]: tau never less than 2 frames. At 20 frames per stride a
  // 1-frame gap between the hind feet is still "together" (bound, not gallop).
  const Report r = analyse(
      idealTrain(LimbSet::quadruped(), {{0.5, 0.2}, {0.5, 0.2}, {0, 0.2}, {0.05, 0.2}}, 20, 4));
  EXPECT_EQ(r.strides.at(1).gait, "bound");
}

TEST(Gait, Biped) {
  // Source: docs/methods.md team decisions: walk (DF >= 0.5), run (< 0.5), hop (in phase), skip
  // (asymmetrical); human walking stance about 60 % (teaching sources [src]).
  const LimbSet biped = LimbSet::biped();
  EXPECT_EQ(analyse(idealTrain(biped, {{0, 0.6}, {0.5, 0.6}}, 1200, 3)).strides[1].gait, "walk");
  EXPECT_EQ(analyse(idealTrain(biped, {{0, 0.3}, {0.5, 0.3}}, 1200, 3)).strides[1].gait, "run");
  EXPECT_EQ(analyse(idealTrain(biped, {{0, 0.3}, {0, 0.3}}, 1200, 3)).strides[1].gait, "hop");
  const StrideRecord skip = analyse(idealTrain(biped, {{0, 0.3}, {0.25, 0.3}}, 1200, 3)).strides[1];
  EXPECT_EQ(skip.gait, "skip");
  EXPECT_EQ(*skip.lead, "right");
}

TEST(Gait, HexapodTripod) {
  // Source: docs/methods.md check 20 [calc]: L1=R2=L3=0, R1=L2=R3=0.5, DF 0.5 -> "tripod",
  // 3 legs in stance 100 %. Hexapod order L1 R1 L2 R2 L3 R3.
  const Report r = analyse(idealTrain(
      LimbSet::hexapod(), {{0, .5}, {.5, .5}, {.5, .5}, {0, .5}, {0, .5}, {.5, .5}}, 1200, 4));
  const StrideRecord& s = r.strides.at(1);
  EXPECT_EQ(s.gait, "tripod");
  EXPECT_NEAR(*s.templateDistance, 0.0, 1e-12);
  EXPECT_DOUBLE_EQ(s.supportByCount.at(3), 1.0);
  EXPECT_NEAR(*s.ipsilateralLag, 0.5, 1e-12);
  EXPECT_FALSE(s.waveDirection);  // a lag of half a cycle has no direction
}

TEST(Gait, HexapodWave) {
  // Source: docs/methods.md check 20 [calc]: L3=0, L2=1/6, L1=2/6, R3=3/6, R2=4/6, R1=5/6,
  // DF 5/6 -> "wave", 5 legs 100 %; docs/methods.md §4.3: back-to-front wave = "direct".
  const double d = 5.0 / 6.0;
  const Report r = analyse(idealTrain(
      LimbSet::hexapod(), {{2. / 6, d}, {5. / 6, d}, {1. / 6, d}, {4. / 6, d}, {0, d}, {3. / 6, d}},
      1200, 4));
  const StrideRecord& s = r.strides.at(1);
  EXPECT_EQ(s.gait, "wave");
  EXPECT_DOUBLE_EQ(s.supportByCount.at(5), 1.0);
  EXPECT_NEAR(*s.ipsilateralLag, 1.0 / 6.0, 1e-12);
  EXPECT_EQ(*s.waveDirection, "direct");
}

TEST(Gait, HexapodTetrapod) {
  // Source: docs/methods.md §4.2 [mem + calc]: L3=0, L2=1/3, L1=2/3, R1=0, R3=1/3, R2=2/3;
  // DF 2/3 -> four legs in stance at every instant.
  const double d = 2.0 / 3.0;
  const Report r = analyse(
      idealTrain(LimbSet::hexapod(),
                 {{2. / 3, d}, {0, d}, {1. / 3, d}, {2. / 3, d}, {0, d}, {1. / 3, d}}, 1200, 4));
  const StrideRecord& s = r.strides.at(1);
  EXPECT_EQ(s.gait, "tetrapod");
  EXPECT_DOUBLE_EQ(s.supportByCount.at(4), 1.0);
  EXPECT_FALSE(s.symmetrical);
}

TEST(Gait, MultiPairRetrogradeWave) {
  // Source: docs/methods.md §4.3 [mem, verify]: a wave running front to back is "retrograde". Eight
  // pairs, left leg of segment s at s/16, right half a cycle later.
  const LimbSet set = LimbSet::multiPair(8);
  std::vector<LimbPattern> patterns(16);
  for (int i = 0; i < set.size(); ++i) {
    const model::Limb& limb = set.limb(i);
    const double left = limb.segment / 16.0;
    patterns[static_cast<std::size_t>(i)] = {limb.side == model::Side::left ? left : left + 0.5,
                                             0.75};
  }
  const Report r = analyse(idealTrain(set, patterns, 1600, 3));
  const StrideRecord& s = r.strides.at(1);
  EXPECT_EQ(s.gait, "wave");
  EXPECT_NEAR(*s.ipsilateralLag, 1.0 - 1.0 / 16.0, 1e-12);
  EXPECT_EQ(*s.waveDirection, "retrograde");
}

TEST(Gait, ManyPairsBeyondSixtyFourLimbs) {
  // Common practice, no source: 40 pairs (80 limbs) still score; combination names are not
  // kept for sets over 64 limbs but counts are. Direct wave, lag 1/80 per segment.
  const LimbSet set = LimbSet::multiPair(40);
  std::vector<LimbPattern> patterns(80);
  for (int i = 0; i < set.size(); ++i) {
    const model::Limb& limb = set.limb(i);
    const double left = (39 - limb.segment) / 80.0;
    patterns[static_cast<std::size_t>(i)] = {limb.side == model::Side::left ? left : left + 0.5,
                                             0.75};
  }
  const Report r = analyse(idealTrain(set, patterns, 1600, 3));
  const StrideRecord& s = r.strides.at(1);
  EXPECT_EQ(s.gait, "wave");
  EXPECT_EQ(*s.waveDirection, "direct");
  EXPECT_DOUBLE_EQ(s.supportByCount.at(60), 1.0);  // 80 legs x DF 0.75, evenly spread
  EXPECT_TRUE(s.supportByCombination.empty());
  EXPECT_EQ(r.symmetry.dutyFactor.si.size(), 40u);
}

TEST(Gait, MultiPairTripodLikeAlternation) {
  // Common practice, no source: alternate segments in antiphase is the tripod template.
  const LimbSet set = LimbSet::multiPair(4);
  std::vector<LimbPattern> patterns(8);
  for (int i = 0; i < set.size(); ++i) {
    const model::Limb& limb = set.limb(i);
    patterns[static_cast<std::size_t>(i)] = {
        0.5 * ((limb.segment + (limb.side == model::Side::right ? 1 : 0)) % 2), 0.5};
  }
  const Report r = analyse(idealTrain(set, patterns, 1200, 3));
  EXPECT_EQ(r.strides.at(1).gait, "tripod");
}

TEST(Gait, SymmetricalLabelsFromBand) {
  // Source: docs/methods.md team decisions: band trot -> trot, pace -> pace, else walk/amble.
  EXPECT_EQ(symmetricalQuadrupedGait("trot", 0.7), "trot");
  EXPECT_EQ(symmetricalQuadrupedGait("pace", 0.3), "pace");
  EXPECT_EQ(symmetricalQuadrupedGait("lateral-sequence single-foot", 0.5), "walk");
  EXPECT_EQ(symmetricalQuadrupedGait("lateral-sequence single-foot", 0.49), "amble");
}

}  // namespace
}  // namespace stridemark::analysis
