// Trials that are not one steady gait: uneven strides, missing and hidden tags, a stray key
// press, gait and speed changes (issue 16). Each check names the rule it comes from.
#include <gtest/gtest.h>

#include <algorithm>
#include <random>
#include <set>

#include "analysis/analyse.h"
#include "event_train.h"

namespace stridemark::analysis {
namespace {

using model::EventKind;
using model::LimbSet;
using testing::idealTrain;

constexpr int LF = 0, RF = 1, LH = 2, RH = 3;

bool anyProblemSays(const Report& r, const std::string& words, std::optional<int> limb = {}) {
  return std::any_of(r.problems.begin(), r.problems.end(), [&](const Problem& p) {
    return p.message.find(words) != std::string::npos && (!limb || p.limb == limb);
  });
}

std::set<std::string> gaitsOf(const Report& r) {
  std::set<std::string> gaits;
  for (const StrideRecord& s : r.strides) gaits.insert(s.gait);
  return gaits;
}

TEST(RealTrials, UnevenQuadrupedWalkIsAnAsymmetricalWalkNotAGallop) {
  // Source: docs/methods.md §3.3 step 2: not symmetrical but walking (mean DF >= 0.5, no
  // suspension) -> walk, symmetrical false. DF 0.70, RH lands at 0.62 of LH's stride.
  const model::Annotation a = idealTrain(
      LimbSet::quadruped(), {{0.25, 0.7}, {0.75, 0.7}, {0.0, 0.7}, {0.62, 0.7}}, 1200, 6);
  const Report r = analyse(a);
  ASSERT_FALSE(r.strides.empty());
  for (const StrideRecord& s : r.strides) {
    EXPECT_EQ(s.gait, "walk");
    EXPECT_FALSE(s.symmetrical);
    EXPECT_FALSE(s.lead);
    ASSERT_TRUE(s.hindContralateral);
    EXPECT_NEAR(*s.hindContralateral, 0.62, 1e-9);
  }
}

TEST(RealTrials, LimpingBipedWalkIsAWalkNotASkip) {
  // Source: docs/methods.md §3.3 step 2 and §4.1: an uneven biped walk is a walk, a skip has
  // flight phases. DF 0.65, R lands at 0.38 of L's stride.
  const model::Annotation a = idealTrain(LimbSet::biped(), {{0.0, 0.65}, {0.38, 0.65}}, 1000, 6);
  const Report r = analyse(a);
  ASSERT_FALSE(r.strides.empty());
  EXPECT_EQ(gaitsOf(r), (std::set<std::string>{"walk"}));
  EXPECT_FALSE(r.strides[0].symmetrical);
}

TEST(RealTrials, HiddenFootMakesTheStrideUnclassifiedNotAGallop) {
  // Source: docs/methods.md §1.5: a stride whose contralateral phase cannot be measured is
  // unclassified, with a problem naming the limb.
  model::Annotation a = testing::symmetricalQuadruped(0.4, 0.5);
  // RH's touchdown at 1000 + 3 * 1200 + 600 = 4200 and its lift-off 4680 are not seen.
  std::erase_if(a.events, [](const model::Event& e) {
    return e.limb == RH && (e.frame == 4200 || e.frame == 4680);
  });
  a.hidden.push_back({RH, 4100, 4700});
  const Report r = analyse(a);
  EXPECT_TRUE(anyProblemSays(r, "RH is hidden at frames 4100-4700", RH));
  for (const StrideRecord& s : r.strides) {
    EXPECT_TRUE(s.gait == "trot" || s.gait == "unclassified") << s.gait << " at " << s.startFrame;
    if (s.startFrame == 3400) {
      EXPECT_EQ(s.gait, "unclassified");
    }
  }
  EXPECT_EQ(r.bouts.size(), 1u);  // the unclassified stride does not end the trot bout
}

TEST(RealTrials, ADiagonalPartnerLandingAFrameEarlyStillCounts) {
  // Our choice (docs/methods.md §1.5): a trot's diagonal partner lands with the reference limb,
  // a frame or two either side as tags jitter; it must count once per stride, never 0 or 2
  // times (which would leave half the strides unclassified).
  std::mt19937 random(16);
  std::uniform_int_distribution<int> jitter(-2, 2);
  model::Annotation a;
  a.captureRate = Rational{250, 1};
  a.referenceLimb = LH;
  const double offset[] = {0.5, 0.0, 0.0, 0.5};
  for (int k = 0; k < 40; ++k)
    for (int limb = 0; limb < 4; ++limb) {
      const std::int64_t td = 100 + k * 100 + static_cast<std::int64_t>(offset[limb] * 100) +
                              (limb == LH ? 0 : jitter(random));
      a.events.push_back({td, limb, EventKind::touchdown});
      a.events.push_back({td + 40, limb, EventKind::liftoff});
    }
  a.normalize();
  const Report r = analyse(a);
  ASSERT_EQ(r.strides.size(), 39u);
  for (const StrideRecord& s : r.strides) {
    EXPECT_EQ(s.gait, "trot") << s.startFrame << " " << s.note.value_or("");
    EXPECT_EQ(s.touchdownCount[RF], 1) << s.startFrame;
  }
}

TEST(RealTrials, LabelsDoNotDependOnTheReferenceLimb) {
  // Source: issue 16 item 1; docs/methods.md §3.3 steps 0 and 9 (one window, half-frame
  // margin). A transverse gallop LH, RH, LF, RF with gaps, at 240 fps.
  const model::Annotation a =
      idealTrain(LimbSet::quadruped(), {{0.55, 0.3}, {0.7, 0.3}, {0.0, 0.35}, {0.12, 0.35}}, 96, 12,
                 Rational{240, 1});
  for (const int reference : {LF, RF, LH, RH}) {
    AnalysisOptions options;
    options.referenceLimb = reference;
    const Report r = analyse(a, options);
    SCOPED_TRACE(a.limbs.label(reference));
    // Every stride with all four feet in its window gets the same label (at the train's ends
    // some references' windows lack a foot: unclassified, never another gait).
    int named = 0;
    for (const StrideRecord& s : r.strides) {
      if (!s.complete) {
        EXPECT_EQ(s.gait, "unclassified");
        continue;
      }
      ++named;
      EXPECT_EQ(s.gait, "transverse gallop") << s.startFrame;
      EXPECT_EQ(s.lead.value_or("-"), "right") << s.startFrame;
      EXPECT_EQ(s.hindLead.value_or("-"), "right") << s.startFrame;
    }
    EXPECT_GE(named, 10);
  }
}

TEST(RealTrials, AStrayKeyPressThatSwapsALimbsTagsIsCaught) {
  // Source: issue 16 item 2: one extra key press flips every later tag of a limb (stance
  // becomes swing). Trot DF 0.40, 1200-frame strides; LF gets an extra touchdown at 5100 in its
  // swing, and from there its tags are read the other way round.
  model::Annotation a = testing::symmetricalQuadruped(0.4, 0.5, 1200, 10);
  for (model::Event& e : a.events)
    if (e.limb == LF && e.frame > 5100)
      e.kind = e.kind == EventKind::touchdown ? EventKind::liftoff : EventKind::touchdown;
  a.events.push_back({5100, LF, EventKind::touchdown});
  a.normalize();
  const Report r = analyse(a);
  ASSERT_TRUE(anyProblemSays(r, "look swapped", LF))
      << (r.problems.empty() ? "none" : r.problems[0].message);
  const auto swap = std::find_if(r.problems.begin(), r.problems.end(), [](const Problem& p) {
    return p.message.find("look swapped") != std::string::npos;
  });
  EXPECT_EQ(swap->frame, 5100);  // the extra tag, where the fix starts
  for (const StrideRecord& s : r.strides) {
    EXPECT_NE(s.gait.find("gallop"), 0u) << s.startFrame;
    EXPECT_LT(s.endFrame, 5100 + 1200) << "a stride over the swapped tags was kept";
  }
}

TEST(RealTrials, AMissedStepIsASuspiciousCycleLeftOutOfTheStatistics) {
  // Source: docs/methods.md §1.5: a cycle longer than 1.6x the median of its neighbours is
  // probably a missed touchdown. LF's touchdown at 4000 and lift-off at 4480 were not tagged.
  model::Annotation a = testing::symmetricalQuadruped(0.4, 0.5, 1200, 8);
  std::erase_if(a.events, [](const model::Event& e) {
    return e.limb == LF && (e.frame == 4000 || e.frame == 4480);
  });
  const Report r = analyse(a);
  EXPECT_TRUE(anyProblemSays(r,
                             "LF cycle 2800-5200 is 2.0x its neighbours: a touchdown may be "
                             "missing",
                             LF));
  for (const LimbCycle& c : r.cycles) EXPECT_FALSE(c.limb == LF && c.strideFrames() > 1500);
  EXPECT_NEAR(r.limbSummary[LF].strideS.mean, 1.0, 1e-9);  // 1200 frames at 1200 fps
}

TEST(RealTrials, StrideTimesNoAnimalHasAskAboutTheCaptureRate) {
  // Our choice (docs/methods.md §1.5): a median stride over 4 s asks whether the capture rate
  // is right. A 240 fps clip read at 30 fps: 1200-frame strides last 40 s.
  model::Annotation a = testing::symmetricalQuadruped(0.4, 0.5);
  a.captureRate = Rational{30, 1};
  EXPECT_TRUE(anyProblemSays(analyse(a), "is the capture rate right?"));
  a.captureRate = Rational{1200, 1};
  EXPECT_FALSE(anyProblemSays(analyse(a), "capture rate"));
}

TEST(RealTrials, ATrotReadAtAFalseLowRateAsksAboutTheCaptureRate) {
  // Our choice (docs/methods.md §1.5): running strides (duty factor below 0.5) over 2 s ask
  // too. A dog's 0.4 s trot stride (96 frames at 240 fps) read at 30 fps lasts 3.2 s, under
  // the 4 s any stride may take; a walk of the same frames (duty factor 0.7) does not ask.
  model::Annotation trot = testing::symmetricalQuadruped(0.4, 0.5, 96, 8);
  trot.captureRate = Rational{30, 1};
  EXPECT_TRUE(anyProblemSays(analyse(trot), "the median running stride lasts 3.20 s"));
  trot.captureRate = Rational{240, 1};
  EXPECT_FALSE(anyProblemSays(analyse(trot), "capture rate"));
  model::Annotation walk = testing::symmetricalQuadruped(0.7, 0.25, 96, 8);
  walk.captureRate = Rational{30, 1};
  EXPECT_FALSE(anyProblemSays(analyse(walk), "capture rate"));
}

TEST(RealTrials, UntaggedLimbsAndReferenceAreProblems) {
  // Source: docs/methods.md §1.5: untagged limbs and an untagged reference limb are problems.
  model::Annotation a = testing::symmetricalQuadruped(0.4, 0.5);
  std::erase_if(a.events, [](const model::Event& e) { return e.limb == RF || e.limb == LH; });
  const Report r = analyse(a);
  EXPECT_TRUE(anyProblemSays(r, "RF has no tags", RF));
  EXPECT_TRUE(anyProblemSays(r, "the reference limb LH has no tags", LH));
  EXPECT_TRUE(r.strides.empty());
}

// A walk (DF 0.65, LS single-foot) then a trot (DF 0.40) of a perfectly symmetrical animal.
model::Annotation walkThenTrot() {
  model::Annotation a;
  a.captureRate = Rational{1200, 1};
  a.referenceLimb = LH;
  const double walk[] = {0.25, 0.75, 0.0, 0.5}, trot[] = {0.5, 1.0, 0.0, 0.5};
  for (int limb = 0; limb < 4; ++limb) {
    for (int k = 0; k < 5; ++k) {
      const auto td = 1000 + k * 1200 + static_cast<std::int64_t>(walk[limb] * 1200);
      a.events.push_back({td, limb, EventKind::touchdown});
      a.events.push_back({td + 780, limb, EventKind::liftoff});
    }
    for (int k = 0; k < 6; ++k) {
      const auto td = 7000 + k * 1000 + static_cast<std::int64_t>(trot[limb] * 1000);
      a.events.push_back({td, limb, EventKind::touchdown});
      a.events.push_back({td + 400, limb, EventKind::liftoff});
    }
  }
  a.normalize();
  return a;
}

TEST(RealTrials, PerGaitSummariesOfASymmetricalAnimalAreSymmetrical) {
  // Source: docs/methods.md §11: pooling a walk and a trot (with one limb's first walk stride
  // untagged) gives a symmetry index that reads as lameness; per gait it is 0.
  model::Annotation a = walkThenTrot();
  std::erase_if(a.events, [](const model::Event& e) { return e.limb == LF && e.frame < 2500; });
  const Report r = analyse(a);
  EXPECT_TRUE(r.mixedGaits);
  ASSERT_EQ(r.byGait.count("walk"), 1u);
  ASSERT_EQ(r.byGait.count("trot"), 1u);
  for (const auto& [gait, summary] : r.byGait) {
    SCOPED_TRACE(gait);
    for (const auto& [pair, si] : summary.symmetry.dutyFactor.si) EXPECT_NEAR(si, 0.0, 1e-9);
    for (const auto& [pair, si] : summary.symmetry.stanceS.si) EXPECT_NEAR(si, 0.0, 1e-9);
  }
  EXPECT_NEAR(r.byGait.at("walk").limbs[LH].dutyFactor.mean, 0.65, 1e-9);
  EXPECT_NEAR(r.byGait.at("trot").limbs[LH].dutyFactor.mean, 0.40, 1e-9);
  ASSERT_TRUE(r.byGait.at("walk").hildebrand);
  EXPECT_EQ(r.byGait.at("walk").hildebrand->band, "lateral-sequence single-foot");
  EXPECT_EQ(r.byGait.at("trot").hildebrand->band, "trot");
}

TEST(RealTrials, SpeedScheduleGivesEachBoutItsSpeedAndFroude) {
  // Source: docs/methods.md §12: a bout's speed is the time-weighted mean of the belt's
  // schedule over its frames; a trial-wide speed only when the schedule is constant. Fr =
  // v^2 / (g h), g = 9.81, h = 0.5 m.
  const model::Annotation a = walkThenTrot();
  AnalysisOptions options;
  options.speedMs = 1.0;
  options.speedChanges = {{7000, 2.5}};
  options.legLengthM = 0.5;
  const Report r = analyse(a, options);
  EXPECT_FALSE(r.speed);
  ASSERT_TRUE(r.byGait.at("walk").speed);
  ASSERT_TRUE(r.byGait.at("trot").speed);
  EXPECT_NEAR(r.byGait.at("walk").speed->ms, 1.0, 1e-12);
  EXPECT_NEAR(r.byGait.at("trot").speed->ms, 2.5, 1e-12);
  EXPECT_NEAR(*r.byGait.at("trot").speed->froude, 2.5 * 2.5 / (9.81 * 0.5), 1e-12);
  EXPECT_NEAR(r.byGait.at("trot").speed->strideLengthM, 2.5 * 1000.0 / 1200.0, 1e-9);
}

TEST(RealTrials, DiagonalAdvancedPlacementPerDiagonal) {
  // Source: docs/methods.md §7.3: DAP = TD(fore) - TD(hind) per diagonal, positive = hind
  // first; a +12 / -8 ms pair is reported as such (mean 2, difference 20), not as "2 ms". At
  // 250 fps, 3 frames = 12 ms and -2 frames = -8 ms; 200-frame strides.
  const model::Annotation a =
      idealTrain(LimbSet::quadruped(), {{0.49, 0.4}, {0.015, 0.4}, {0.0, 0.4}, {0.5, 0.4}}, 200, 6,
                 Rational{250, 1});
  const Report r = analyse(a);
  ASSERT_TRUE(r.dap);
  EXPECT_NEAR(r.dap->lhRfMs.mean, 12.0, 1e-9);
  EXPECT_NEAR(r.dap->rhLfMs.mean, -8.0, 1e-9);
  EXPECT_NEAR(r.dap->meanMs, 2.0, 1e-9);
  EXPECT_NEAR(r.dap->differenceMs, 20.0, 1e-9);
  EXPECT_NEAR(r.dap->lhRfPercent.mean, 1.5, 1e-9);
}

TEST(RealTrials, AnExcludedStrideStaysVisibleButLeavesTheStatistics) {
  // Issue 16 item 6 (our rule): an excluded stride keeps its place and label, carries its
  // reason, and no summary counts it. Stride 2 of a trot gets a longer LH stance.
  model::Annotation a = testing::symmetricalQuadruped(0.4, 0.5);
  for (model::Event& e : a.events)
    if (e.limb == LH && e.frame == 1000 + 2 * 1200 + 480) e.frame += 60;
  const Report before = analyse(a);
  a.excluded.push_back({1000 + 2 * 1200, "the dog looked back at the handler"});
  const Report r = analyse(a);
  ASSERT_EQ(r.strides.size(), before.strides.size());
  EXPECT_EQ(r.strides[2].gait, before.strides[2].gait);
  ASSERT_TRUE(r.strides[2].excluded);
  EXPECT_EQ(*r.strides[2].excluded, "the dog looked back at the handler");
  EXPECT_EQ(r.limbSummary[LH].dutyFactor.n, before.limbSummary[LH].dutyFactor.n - 1);
  EXPECT_NEAR(r.limbSummary[LH].dutyFactor.mean, 0.4, 1e-12);
  EXPECT_GT(before.limbSummary[LH].dutyFactor.mean, 0.4);
  EXPECT_EQ(r.bouts.size(), 1u);  // the bout stays whole
  EXPECT_EQ(r.bouts[0].summary.strides, before.bouts[0].summary.strides - 1);
}

}  // namespace
}  // namespace stridemark::analysis
