#include "analysis/analyse.h"

#include <gtest/gtest.h>

#include <cmath>
#include <cstring>
#include <span>
#include <vector>

#include "common/error.h"
#include "event_train.h"

namespace stridemark::analysis {
namespace {

using model::LimbSet;
using testing::idealTrain;

TEST(Analyse, BadOptionsAreClearErrors) {
  // Common practice, no source: unusable options are the only thing analyse throws for.
  const model::Annotation a = testing::symmetricalQuadruped(0.6, 0.25);
  AnalysisOptions bad;
  bad.referenceLimb = 7;
  try {
    analyse(a, bad);
    FAIL() << "no error";
  } catch (const Error& e) {
    EXPECT_EQ(e.category(), ErrorCategory::analysis);
    EXPECT_NE(std::string(e.what()).find("LF, RF, LH, RH"), std::string::npos);
  }
  AnalysisOptions leg;
  leg.legLengthM = -1;
  EXPECT_THROW(analyse(a, leg), Error);
  model::Annotation noRate = a;
  noRate.captureRate = {0, 1};
  EXPECT_THROW(analyse(noRate), Error);
}

TEST(Analyse, EmptyAnnotationGivesEmptyReport) {
  // Common practice, no source: nothing tagged yet is not an error.
  model::Annotation a;
  const Report r = analyse(a);
  EXPECT_TRUE(r.strides.empty());
  EXPECT_TRUE(r.problems.empty());
  EXPECT_EQ(r.limbSummary.size(), 4u);
  EXPECT_EQ(r.phase.size(), 4u);
  EXPECT_EQ(r.phase[0].n, 0);
  EXPECT_FALSE(r.hildebrand);
  EXPECT_FALSE(r.speed);
}

TEST(Analyse, ReferenceLimbOverride) {
  // Common practice, no source: phases are relative to the chosen reference limb.
  const model::Annotation a = testing::symmetricalQuadruped(0.6, 0.25);
  AnalysisOptions options;
  options.referenceLimb = 0;  // LF
  const Report r = analyse(a, options);
  EXPECT_EQ(r.referenceLimb, 0);
  ASSERT_FALSE(r.strides.empty());
  EXPECT_NEAR(*r.strides[1].phase[2], 0.75, 1e-12);  // LH lands 3/4 of an LF stride later
  EXPECT_NEAR(r.phase[2].mean, 0.75, 1e-12);
  EXPECT_NEAR(r.phase[2].r, 1.0, 1e-12);
}

TEST(Analyse, PhaseSummaryAndStats) {
  // Source: docs/methods.md §8 circular statistics of a constant phase: R 1, circular SD 0.
  const Report r = analyse(testing::symmetricalQuadruped(0.6, 0.25, 1200, 8));
  const PhaseSummary& lf = r.phase[0];
  EXPECT_EQ(lf.n, 8);
  EXPECT_NEAR(lf.mean, 0.25, 1e-12);
  EXPECT_NEAR(lf.r, 1.0, 1e-12);
  EXPECT_NEAR(lf.circSd, 0.0, 1e-6);
  EXPECT_LT(lf.rayleighP, 0.01);
  EXPECT_EQ(r.limbSummary[2].strides, 8);
  EXPECT_NEAR(r.limbSummary[2].strideS.mean, 1.0, 1e-12);
  EXPECT_NEAR(r.limbSummary[2].strideS.sd, 0.0, 1e-12);
  EXPECT_NEAR(r.limbSummary[2].dutyFactor.mean, 0.6, 1e-12);
}

TEST(Analyse, EveryLimbSetScores) {
  // Common practice, no source: each limb set produces strides, phases and support.
  struct Case {
    LimbSet set;
    std::vector<testing::LimbPattern> patterns;
    const char* gait;
  };
  const LimbSet multi = LimbSet::multiPair(3);  // L1 L2 L3 R1 R2 R3
  const std::vector<Case> cases = {
      {LimbSet::quadruped(), {{0.25, 0.7}, {0.75, 0.7}, {0, 0.7}, {0.5, 0.7}}, "walk"},
      {LimbSet::biped(), {{0, 0.6}, {0.5, 0.6}}, "walk"},
      {LimbSet::hexapod(), {{0, .5}, {.5, .5}, {.5, .5}, {0, .5}, {0, .5}, {.5, .5}}, "tripod"},
      {multi, {{0, .5}, {.5, .5}, {0, .5}, {.5, .5}, {0, .5}, {.5, .5}}, "tripod"},
  };
  for (const Case& c : cases) {
    const Report r = analyse(idealTrain(c.set, c.patterns, 1200, 4));
    ASSERT_EQ(r.strides.size(), 4u) << c.set.name();
    EXPECT_EQ(r.strides[1].gait, c.gait) << c.set.name();
    EXPECT_EQ(r.support.size(), static_cast<std::size_t>(c.set.size()) + 1) << c.set.name();
    EXPECT_EQ(r.bouts.size(), 1u) << c.set.name();
    EXPECT_EQ(r.hildebrand.has_value(), c.set.kind() == model::LimbSetKind::quadruped);
    EXPECT_FALSE(r.symmetry.stanceS.si.empty()) << c.set.name();
  }
}

TEST(Analyse, UnsortedEventsGiveTheSameReport) {
  // Common practice, no source: analysis does not depend on the order tags were added.
  model::Annotation sorted = testing::symmetricalQuadruped(0.6, 0.6);
  model::Annotation shuffled = sorted;
  std::reverse(shuffled.events.begin(), shuffled.events.end());
  const Report a = analyse(sorted);
  const Report b = analyse(shuffled);
  ASSERT_EQ(a.strides.size(), b.strides.size());
  for (std::size_t i = 0; i < a.strides.size(); ++i) {
    EXPECT_EQ(a.strides[i].gait, b.strides[i].gait);
    EXPECT_EQ(a.strides[i].phase, b.strides[i].phase);
  }
}

TEST(Analyse, ProjectOverloadUsesTrialCard) {
  // Source: docs/methods.md team decision: Fr = v^2 / (g h), g = 9.81.
  model::Project p;
  p.annotation = testing::symmetricalQuadruped(0.4, 0.5);
  p.trial.speedMs = 3.0;
  p.trial.legLengthM = 0.9;
  const Report r = analyse(p);
  ASSERT_TRUE(r.speed);
  EXPECT_NEAR(*r.speed->froude, 1.01937, 1e-5);
  EXPECT_NEAR(r.speed->strideLengthM, 3.0, 1e-12);  // 1200 frames at 1200 fps = 1 s
  AnalysisOptions override;
  override.speedMs = 1.5;
  EXPECT_NEAR(analyse(p, override).speed->ms, 1.5, 1e-12);
}

TEST(Analyse, LargeAnnotationIsLinearish) {
  // Common practice, no source: 100,000 strides per limb score without quadratic behaviour
  // (a smoke check; the timing target lives in tests/bench).
  const Report r = analyse(testing::symmetricalQuadruped(0.6, 0.25, 120, 100000));
  EXPECT_EQ(r.strides.size(), 100000u);
  EXPECT_EQ(r.bouts.size(), 1u);
  EXPECT_TRUE(r.problems.empty());
}

}  // namespace
}  // namespace stridemark::analysis
