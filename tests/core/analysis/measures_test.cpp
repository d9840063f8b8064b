// Symmetry, speed and timing measures against docs/methods.md check values.
#include <gtest/gtest.h>

#include "analysis/analyse.h"
#include "analysis/speed.h"
#include "analysis/symmetry.h"
#include "event_train.h"

namespace stridemark::analysis {
namespace {

TEST(Speed, FroudeNumber) {
  // Source: docs/methods.md check 21 [calc]: v 3.0 m/s, h 0.90 m -> Fr 1.01937, sqrt 1.00964.
  EXPECT_NEAR(froudeNumber(3.0, 0.90), 1.01937, 1e-5);
  EXPECT_NEAR(dimensionlessSpeed(3.0, 0.90), 1.00964, 1e-5);
}

TEST(Speed, WalkTrotTransitionSpeeds) {
  // Source: Griffin 2004 (1.6-2.3 m/s at Fr about 0.35) [src] + [calc]; docs/methods.md check 22.
  EXPECT_NEAR(speedAtFroude(0.35, 0.7), 1.55, 0.005);
  EXPECT_NEAR(speedAtFroude(0.35, 1.4), 2.19, 0.005);
}

TEST(Speed, AlexanderSpeedAndStrideFits) {
  // Source: Alexander 1976 via fossilhunters [src] +[calc]; docs/methods.md check 23: stride 2.8 m,
  // hip 1.4 m -> 2.95 m/s; Fr 1 -> lambda/h 2.30 (1976 form) or 1.855 (1991 fit).
  EXPECT_NEAR(alexanderSpeed(2.8, 1.4), 2.95, 0.01);
  EXPECT_NEAR(relativeStrideAlexander1976(1.0), 2.30, 1e-9);
  EXPECT_NEAR(relativeStrideAlexander1991(1.0), 1.855, 0.001);
  // The 1976 speed formula is algebraically lambda/h = 2.3 Fr^0.3 [calc, docs/methods.md §6.2].
  const double u = alexanderSpeed(2.8, 1.4);
  EXPECT_NEAR(relativeStrideAlexander1976(froudeNumber(u, 1.4)), 2.0, 0.01);
}

TEST(Symmetry, RobinsonRatioMinBasedAndAngle) {
  // Source: docs/methods.md check 24: Robinson 1987 [src], medicalalgorithms AI [src], Zifchock
  // 2008 symmetry angle [mem formula]: R 110, L 100 -> SI 9.5238 %, ratio 1.10, AI 10.0 %,
  // SA 3.029 %.
  EXPECT_NEAR(symmetryIndex(110, 100), 9.5238, 1e-4);
  EXPECT_NEAR(symmetryRatio(110, 100), 1.10, 1e-12);
  EXPECT_NEAR(minBasedAsymmetryIndex(100, 110), 10.0, 1e-12);
  EXPECT_NEAR(symmetryAngle(100, 110), 3.029, 1e-3);
}

TEST(Symmetry, ReportUsesRightMinusLeft) {
  // Source: docs/methods.md team decision: Robinson SI, positive when the right value is larger.
  // RH stance 660 frames vs LH 600 of 1200 -> SI = 60 / 630 * 100.
  const model::Annotation a = testing::idealTrain(
      model::LimbSet::quadruped(), {{0.25, 0.6}, {0.75, 0.6}, {0, 0.5}, {0.5, 0.55}}, 1200, 4);
  const Report r = analyse(a);
  EXPECT_NEAR(r.symmetry.stanceS.si.at("hind"), 60.0 / 630.0 * 100.0, 1e-9);
  EXPECT_NEAR(r.symmetry.stanceS.ratio.at("hind"), 1.1, 1e-12);
  EXPECT_NEAR(r.symmetry.dutyFactor.si.at("fore"), 0.0, 1e-12);
  EXPECT_NEAR(r.symmetry.swingS.si.at("hind"), (540.0 - 600.0) / 570.0 * 100.0, 1e-9);
  EXPECT_NEAR(r.symmetry.strideS.ratio.at("hind"), 1.0, 1e-12);
}

TEST(Symmetry, PairNamesPerLimbSet) {
  // Common practice, no source: our pair keys.
  EXPECT_EQ(leftRightPairs(model::LimbSet::quadruped()).at(1).name, "hind");
  EXPECT_EQ(leftRightPairs(model::LimbSet::biped()).at(0).name, "pair");
  EXPECT_EQ(leftRightPairs(model::LimbSet::multiPair(5)).at(4).name, "segment5");
}

TEST(Timing, DiagonalAdvancedPlacement) {
  // Source: docs/methods.md check 25 [choice/src]: hind TD 1000 ms, diagonal fore TD 1012 ms,
  // stride 700 ms -> +12 ms, +1.714 % (positive = hind first).
  const AdvancedPlacement dap = advancedPlacement(1000, 1012, 700, Rational{1000, 1});
  EXPECT_NEAR(dap.ms, 12.0, 1e-12);
  EXPECT_NEAR(dap.percent, 1.714, 1e-3);
}

TEST(Timing, DapOnTrotStrides) {
  // Source: docs/methods.md §7.3 [choice]: DAP = TD fore - TD hind per diagonal, positive = hind
  // first. Fores land 12 frames after their diagonal hinds at 1000 fps, stride 700 frames.
  const model::Annotation a =
      testing::idealTrain(model::LimbSet::quadruped(),
                          {{0.5 + 12.0 / 700, 0.45}, {12.0 / 700, 0.45}, {0, 0.45}, {0.5, 0.45}},
                          700, 4, Rational{1000, 1});
  const StrideRecord s = analyse(a).strides.at(1);
  EXPECT_EQ(s.gait, "trot");
  EXPECT_NEAR(*s.dapMs, 12.0, 1e-9);
  EXPECT_NEAR(*s.dapPercent, 1.714, 1e-3);
}

TEST(Timing, DrevemoTrot) {
  // Source: Drevemo 1980 [src] + [calc]; docs/methods.md check 29: T 455 ms, stance F 100 ms,
  // H 177 ms -> DF 0.2198 / 0.3890; stride length 5.45 m -> speed 11.98 m/s.
  const model::Annotation a = testing::idealTrain(
      model::LimbSet::quadruped(),
      {{0.5, 100.0 / 455}, {0.0, 100.0 / 455}, {0.0, 177.0 / 455}, {0.5, 177.0 / 455}}, 455, 5,
      Rational{1000, 1});
  AnalysisOptions options;
  options.speedMs = 5.45 / 0.455;
  options.legLengthM = 1.0;
  const Report r = analyse(a, options);
  EXPECT_NEAR(r.limbSummary[0].dutyFactor.mean, 0.2198, 1e-4);
  EXPECT_NEAR(r.limbSummary[2].dutyFactor.mean, 0.3890, 1e-4);
  EXPECT_NEAR(*options.speedMs, 11.98, 0.005);
  ASSERT_TRUE(r.speed);
  EXPECT_NEAR(r.speed->strideLengthM, 5.45, 1e-9);
  EXPECT_NEAR(*r.speed->relativeStrideLength, 5.45, 1e-9);
  EXPECT_NEAR(*r.speed->froude, options.speedMs.value() * *options.speedMs / 9.81, 1e-9);
}

TEST(Timing, QuantisationBound) {
  // Source: docs/methods.md check 30 [calc]: fps 250, T 0.5 s, DF 0.4 -> max DF error 0.0112.
  EXPECT_NEAR(dutyFactorQuantisationBound(250, 0.5, 0.4), 0.0112, 1e-12);
  // Realised: touchdown/lift-off times rounded to frames never move DF by more than the bound.
  const double fps = 250, t0 = 0.0031, stride = 0.5, beta = 0.4;
  for (int shift = 0; shift < 50; ++shift) {
    const double td = t0 + shift * 0.00037;
    const double f0 = std::round(td * fps), f1 = std::round((td + beta * stride) * fps);
    const double f2 = std::round((td + stride) * fps);
    EXPECT_LE(std::abs((f1 - f0) / (f2 - f0) - beta),
              dutyFactorQuantisationBound(fps, stride, beta) + 1e-12);
  }
}

}  // namespace
}  // namespace stridemark::analysis
