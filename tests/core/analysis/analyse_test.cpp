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

// Collects what a streamed analysis hands on.
class CollectStrides final : public StrideConsumer {
 public:
  void begin(const Report& head) override {
    ++begins;
    headLimbSummaries = head.limbSummary.size();
  }
  void consume(std::span<const StrideRecord> chunk) override {
    strides.insert(strides.end(), chunk.begin(), chunk.end());
    ++chunks;
  }
  int begins = 0, chunks = 0;
  std::size_t headLimbSummaries = 0;
  std::vector<StrideRecord> strides;
};

// Same double to the bit (NaN equal to NaN).
bool sameBits(double a, double b) {
  return std::memcmp(&a, &b, sizeof a) == 0;
}

void expectSameStride(const StrideRecord& a, const StrideRecord& b, std::size_t i) {
  EXPECT_EQ(a.startFrame, b.startFrame) << i;
  EXPECT_EQ(a.endFrame, b.endFrame) << i;
  EXPECT_TRUE(sameBits(a.durationS, b.durationS)) << i;
  EXPECT_EQ(a.dutyFactor, b.dutyFactor) << i;
  EXPECT_EQ(a.phase, b.phase) << i;
  EXPECT_EQ(a.touchdownCount, b.touchdownCount) << i;
  EXPECT_EQ(a.gait, b.gait) << i;
  EXPECT_EQ(a.band, b.band) << i;
  EXPECT_EQ(a.quadrant, b.quadrant) << i;
  EXPECT_EQ(a.sequence, b.sequence) << i;
  EXPECT_EQ(a.lead, b.lead) << i;
  EXPECT_EQ(a.symmetrical, b.symmetrical) << i;
  EXPECT_EQ(a.aerial, b.aerial) << i;
  EXPECT_EQ(a.hindDutyFactor, b.hindDutyFactor) << i;
  EXPECT_EQ(a.limbPhase, b.limbPhase) << i;
  EXPECT_EQ(a.dapMs, b.dapMs) << i;
  EXPECT_EQ(a.dapPercent, b.dapPercent) << i;
  EXPECT_EQ(a.supportByCount, b.supportByCount) << i;
  EXPECT_EQ(a.supportByCombination, b.supportByCombination) << i;
  EXPECT_EQ(a.ipsilateralLag, b.ipsilateralLag) << i;
  EXPECT_EQ(a.waveDirection, b.waveDirection) << i;
  EXPECT_EQ(a.templateDistance, b.templateDistance) << i;
  EXPECT_EQ(a.foreLag, b.foreLag) << i;
  EXPECT_EQ(a.hindLag, b.hindLag) << i;
  EXPECT_EQ(a.pairLag, b.pairLag) << i;
}

void expectSameSummaries(const Report& a, const Report& b) {
  ASSERT_EQ(a.phase.size(), b.phase.size());
  for (std::size_t i = 0; i < a.phase.size(); ++i) {
    EXPECT_EQ(a.phase[i].n, b.phase[i].n);
    EXPECT_TRUE(sameBits(a.phase[i].mean, b.phase[i].mean)) << i;
    EXPECT_TRUE(sameBits(a.phase[i].r, b.phase[i].r)) << i;
    EXPECT_TRUE(sameBits(a.phase[i].rayleighP, b.phase[i].rayleighP)) << i;
  }
  ASSERT_EQ(a.hildebrand.has_value(), b.hildebrand.has_value());
  if (a.hildebrand) {
    EXPECT_TRUE(sameBits(a.hildebrand->dutyFactor, b.hildebrand->dutyFactor));
    EXPECT_TRUE(sameBits(a.hildebrand->limbPhase, b.hildebrand->limbPhase));
    EXPECT_EQ(a.hildebrand->band, b.hildebrand->band);
  }
  ASSERT_EQ(a.bouts.size(), b.bouts.size());
  for (std::size_t i = 0; i < a.bouts.size(); ++i) {
    EXPECT_EQ(a.bouts[i].gait, b.bouts[i].gait);
    EXPECT_EQ(a.bouts[i].firstStride, b.bouts[i].firstStride);
    EXPECT_EQ(a.bouts[i].lastStride, b.bouts[i].lastStride);
  }
  EXPECT_EQ(a.transitions.size(), b.transitions.size());
  EXPECT_EQ(a.support, b.support);
  EXPECT_EQ(a.supportByCombination, b.supportByCombination);
  EXPECT_EQ(a.cycles.size(), b.cycles.size());
  EXPECT_EQ(a.problems.size(), b.problems.size());
}

TEST(Analyse, StreamedStridesAndSummariesMatchStoredOnes) {
  // Common practice, no source: streaming changes where strides go, never a number. 10,000
  // strides are several of the pipeline's chunks; the trial has problems and gait changes.
  for (const LimbSet& set :
       {LimbSet::quadruped(), LimbSet::biped(), LimbSet::hexapod(), LimbSet::multiPair(4)}) {
    const model::Annotation a = testing::variedTrain(set, 10000, 7);
    for (const bool strideSupport : {false, true}) {
      AnalysisOptions options;
      options.strideSupport = strideSupport;
      const Report stored = analyse(a, options);
      CollectStrides collected;
      const Report streamed = analyseStreaming(a, options, collected);
      SCOPED_TRACE(set.name() + (strideSupport ? " with stride support" : ""));
      EXPECT_TRUE(streamed.strides.empty());
      EXPECT_EQ(collected.begins, 1);
      EXPECT_EQ(collected.headLimbSummaries, static_cast<std::size_t>(set.size()));
      EXPECT_GT(collected.chunks, 2);
      EXPECT_GT(stored.strides.size(), 9000u);
      EXPECT_FALSE(stored.problems.empty());
      ASSERT_EQ(collected.strides.size(), stored.strides.size());
      for (std::size_t i = 0; i < stored.strides.size(); ++i)
        expectSameStride(collected.strides[i], stored.strides[i], i);
      expectSameSummaries(streamed, stored);
    }
  }
}

TEST(Analyse, StreamingWithoutStridesStillBegins) {
  // Common practice, no source: an empty trial still gives the consumer its head.
  model::Annotation empty;
  empty.captureRate = Rational{250, 1};
  CollectStrides collected;
  const Report r = analyseStreaming(empty, {}, collected);
  EXPECT_EQ(collected.begins, 1);
  EXPECT_EQ(collected.chunks, 0);
  EXPECT_TRUE(r.bouts.empty());
}

TEST(Analyse, ConsumerErrorEndsTheAnalysis) {
  // Common practice, no source: a consumer that cannot go on (a full disk) stops scoring with
  // its own error, not a crash or a half-finished report.
  class FailingConsumer final : public StrideConsumer {
   public:
    void begin(const Report&) override {}
    void consume(std::span<const StrideRecord>) override {
      if (++calls == 2) throw Error(ErrorCategory::io, "disk full");
    }
    int calls = 0;
  } failing;
  const model::Annotation a = testing::variedTrain(LimbSet::quadruped(), 20000, 3);
  try {
    analyseStreaming(a, {}, failing);
    FAIL() << "expected the consumer's error";
  } catch (const Error& e) {
    EXPECT_STREQ(e.what(), "disk full");
  }
  EXPECT_EQ(failing.calls, 2);
}

}  // namespace
}  // namespace stridemark::analysis
