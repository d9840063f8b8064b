#include "analysis/cycles.h"

#include <gtest/gtest.h>

#include <algorithm>

#include "analysis/analyse.h"
#include "event_train.h"

namespace stridemark::analysis {
namespace {

using model::EventKind;
using testing::symmetricalQuadruped;

constexpr EventKind TD = EventKind::touchdown;
constexpr EventKind LO = EventKind::liftoff;

model::Annotation quadruped(Rational fps = {250, 1}) {
  model::Annotation a;
  a.captureRate = fps;
  a.referenceLimb = 2;  // LH
  return a;
}

void tag(model::Annotation& a, const char* limb, EventKind kind, std::int64_t frame) {
  a.events.push_back({frame, *a.limbs.indexOf(limb), kind});
}

TEST(Cycles, StrideStanceSwingDutyFactorFrequency) {
  // Source: docs/methods.md check 1, §1.1 [calc]: LH TD 100 and 225, LO 160 at 250 fps ->
  // T 0.500 s, stance 0.240 s, DF 0.480, f 2.0 Hz.
  model::Annotation a = quadruped();
  tag(a, "LH", TD, 100);
  tag(a, "LH", LO, 160);
  tag(a, "LH", TD, 225);
  const Report r = analyse(a);
  const LimbSummary& lh = r.limbSummary[2];
  ASSERT_EQ(lh.strides, 1);
  // Only LH is tagged: each other limb is reported once, never LH.
  ASSERT_EQ(r.problems.size(), 3u);
  for (const Problem& p : r.problems) EXPECT_NE(p.limb, 2);
  EXPECT_DOUBLE_EQ(lh.strideS.mean, 0.5);
  EXPECT_DOUBLE_EQ(lh.stanceS.mean, 0.24);
  EXPECT_DOUBLE_EQ(lh.swingS.mean, 0.26);
  EXPECT_DOUBLE_EQ(lh.dutyFactor.mean, 0.48);
  EXPECT_DOUBLE_EQ(1.0 / lh.strideS.mean, 2.0);
}

TEST(Cycles, MidStanceStartAndEndAreNotProblems) {
  // Source: our contract (CHANGELOG.md, events CSV): a first lift-off or a last touchdown is
  // normal.
  model::Annotation a = quadruped();
  tag(a, "LH", LO, 10);
  tag(a, "LH", TD, 100);
  tag(a, "LH", LO, 160);
  tag(a, "LH", TD, 225);
  tag(a, "LH", LO, 290);
  tag(a, "LH", TD, 350);
  const CycleScan scan = scanCycles(a);
  EXPECT_TRUE(scan.problems.empty());
  ASSERT_EQ(scan.tracks[2].cycles.size(), 2u);
  EXPECT_EQ(scan.tracks[2].cycles[0].touchdown, 100);
  EXPECT_EQ(scan.tracks[2].cycles[1].nextTouchdown, 350);
  // Known state runs from the first tag to the last: swing 10-100 ... swing 290-350.
  const std::vector<StateInterval>& known = scan.tracks[2].known;
  ASSERT_FALSE(known.empty());
  EXPECT_EQ(known.front().first, 10);
  EXPECT_FALSE(known.front().stance);
  EXPECT_EQ(known.back().end, 350);
}

TEST(Cycles, StanceAndSwingNeedTheLiftoff) {
  // Source: docs/methods.md §1.1: stance = lift-off - touchdown, swing = next touchdown -
  // lift-off; without a lift-off neither is known, the stride time still is.
  LimbCycle c{3, 1'000'000'000'000, 1'000'000'000'500, std::nullopt};
  EXPECT_FALSE(c.stanceFrames().has_value());
  EXPECT_FALSE(c.swingFrames().has_value());
  EXPECT_EQ(c.strideFrames(), 500);
  c.liftoff = 1'000'000'000'200;
  EXPECT_EQ(c.stanceFrames(), 200);
  EXPECT_EQ(c.swingFrames(), 300);
}

// Common practice, no source: each tagging error is reported at its frame and limb and only the
// strides it touches are left out. A 6-stride trot train with LH as reference.
class ProblemTest : public ::testing::Test {
 protected:
  model::Annotation train = symmetricalQuadruped(0.4, 0.5, 1200, 6);
  const int lf = 0;
  const int lh = 2;

  Report run() {
    train.normalize();
    return analyse(train);
  }
  // The report has exactly one problem, at `frame` and `limb`, whose message says `words`.
  static void expectOneProblem(const Report& r, std::int64_t frame, int limb,
                               const std::string& words) {
    ASSERT_EQ(r.problems.size(), 1u);
    EXPECT_EQ(r.problems[0].frame, frame);
    EXPECT_EQ(r.problems[0].limb, limb);
    EXPECT_NE(r.problems[0].message.find(words), std::string::npos) << r.problems[0].message;
  }
  static bool hasStrideStarting(const Report& r, std::int64_t frame) {
    for (const StrideRecord& s : r.strides)
      if (s.startFrame == frame) return true;
    return false;
  }
};

TEST_F(ProblemTest, CleanTrainHasSixStrides) {
  const Report r = run();
  EXPECT_TRUE(r.problems.empty());
  EXPECT_EQ(r.strides.size(), 6u);
}

TEST_F(ProblemTest, SecondTouchdownInsideStance) {
  // LH strides start at 1000, 2200, ... 7000; LF lands at +600 with stance 480 frames.
  // LF stance 4000-4480 lies in the LH stride 3400-4600: an extra touchdown at 4100.
  train.events.push_back({4100, lf, TD});
  const Report r = run();
  ASSERT_EQ(r.problems.size(), 1u);
  EXPECT_EQ(r.problems[0].frame, 4100);
  EXPECT_EQ(r.problems[0].limb, lf);
  EXPECT_NE(r.problems[0].message.find("second touchdown"), std::string::npos);
  EXPECT_EQ(r.strides.size(), 5u);
  EXPECT_FALSE(hasStrideStarting(r, 3400));
  EXPECT_TRUE(hasStrideStarting(r, 2200));
  EXPECT_TRUE(hasStrideStarting(r, 4600));
}

TEST_F(ProblemTest, TwoLiftOffsInARow) {
  // LH swing 3880-4600: an extra lift-off at 4000 has no touchdown before it.
  train.events.push_back({4000, lh, LO});
  const Report r = run();
  ASSERT_EQ(r.problems.size(), 1u);
  EXPECT_EQ(r.problems[0].frame, 4000);
  EXPECT_EQ(r.problems[0].limb, lh);
  EXPECT_NE(r.problems[0].message.find("no touchdown"), std::string::npos);
  EXPECT_EQ(r.strides.size(), 5u);
  EXPECT_FALSE(hasStrideStarting(r, 3400));
}

TEST_F(ProblemTest, ZeroLengthStance) {
  // LF: move lift-off 4480 onto the touchdown at 4000.
  for (auto& e : train.events)
    if (e.limb == lf && e.frame == 4480) e.frame = 4000;
  const Report r = run();
  ASSERT_EQ(r.problems.size(), 1u);
  EXPECT_EQ(r.problems[0].frame, 4000);
  EXPECT_EQ(r.problems[0].limb, lf);
  EXPECT_NE(r.problems[0].message.find("zero-length stance"), std::string::npos);
  EXPECT_EQ(r.strides.size(), 5u);
  EXPECT_FALSE(hasStrideStarting(r, 3400));
}

TEST_F(ProblemTest, ZeroLengthSwing) {
  // LH: lift-off 3880 moved onto the next touchdown at 4600.
  for (auto& e : train.events)
    if (e.limb == lh && e.frame == 3880) e.frame = 4600;
  const Report r = run();
  ASSERT_EQ(r.problems.size(), 1u);
  EXPECT_EQ(r.problems[0].frame, 4600);
  EXPECT_EQ(r.problems[0].limb, lh);
  EXPECT_NE(r.problems[0].message.find("zero-length swing"), std::string::npos);
  EXPECT_FALSE(hasStrideStarting(r, 3400));
  EXPECT_TRUE(hasStrideStarting(r, 2200));
}

TEST_F(ProblemTest, DuplicateEvent) {
  train.events.push_back({5800, lh, TD});
  const Report r = run();
  ASSERT_EQ(r.problems.size(), 1u);
  EXPECT_EQ(r.problems[0].frame, 5800);
  EXPECT_EQ(r.problems[0].limb, lh);
  EXPECT_NE(r.problems[0].message.find("duplicate"), std::string::npos);
  EXPECT_FALSE(hasStrideStarting(r, 5800));
  EXPECT_EQ(r.strides.size(), 5u);
}

TEST_F(ProblemTest, EventsOutsideClip) {
  train.clip = model::FrameRange{0, 20000};
  train.events.push_back({25000, lh, TD});
  train.events.push_back({-5, lf, LO});
  const Report r = run();
  ASSERT_EQ(r.problems.size(), 2u);
  EXPECT_EQ(r.problems[0].frame, -5);
  EXPECT_EQ(r.problems[0].limb, lf);
  EXPECT_EQ(r.problems[1].frame, 25000);
  EXPECT_NE(r.problems[1].message.find("outside the clip"), std::string::npos);
  EXPECT_EQ(r.strides.size(), 6u);
}

TEST_F(ProblemTest, UnknownLimbIndexIsReportedNotFatal) {
  train.events.push_back({1500, 9, TD});
  const Report r = run();
  ASSERT_EQ(r.problems.size(), 1u);
  EXPECT_FALSE(r.problems[0].limb.has_value());
  EXPECT_EQ(r.strides.size(), 6u);
}

TEST_F(ProblemTest, FrameBeyondWhatATagHoldsIsReportedNotCut) {
  const std::int64_t far = (std::int64_t{1} << 62) + 1000;  // would read as 1000 if cut
  train.events.push_back({far, lh, TD});
  const Report r = run();
  expectOneProblem(r, far, lh, "beyond frame 2^61 - 1");
  EXPECT_EQ(r.strides.size(), 6u);
}

TEST_F(ProblemTest, BadHiddenSpansAreReported) {
  train.hidden.push_back({7, 100, 200});   // no such limb
  train.hidden.push_back({lf, 900, 800});  // ends before it starts
  const Report r = run();
  ASSERT_EQ(r.problems.size(), 2u);
  EXPECT_FALSE(r.problems[0].limb.has_value());
  EXPECT_EQ(r.problems[1].frame, 900);
  EXPECT_EQ(r.problems[1].limb, lf);
  EXPECT_EQ(r.strides.size(), 6u);
}

TEST_F(ProblemTest, HiddenSpanMakesTheCycleUnknownAndTheStrideUnclassified) {
  // Source: docs/methods.md §1.5: a cycle over a hidden span is undefined (a touchdown may lie
  // in it), never double-length; the stride is unclassified with a problem naming the limb.
  // LF hidden around its lift-off at 4480: the lift-off tag is removed, as a scorer would.
  train.events.erase(
      std::remove(train.events.begin(), train.events.end(), model::Event{4480, lf, LO}),
      train.events.end());
  train.hidden.push_back({lf, 4300, 4550});
  const Report r = run();
  ASSERT_EQ(r.problems.size(), 1u);
  EXPECT_EQ(r.problems[0].limb, lf);
  EXPECT_NE(r.problems[0].message.find("LF is hidden at frames 4300-4550"), std::string::npos)
      << r.problems[0].message;
  EXPECT_EQ(r.strides.size(), 6u);
  const StrideRecord& s = r.strides[2];
  ASSERT_EQ(s.startFrame, 3400);
  EXPECT_EQ(s.gait, "unclassified");
  EXPECT_FALSE(s.complete);
  EXPECT_FALSE(s.dutyFactor[static_cast<std::size_t>(lf)].has_value());
  EXPECT_TRUE(s.supportByCount.empty());  // part of the window is unknown
  for (const LimbCycle& c : r.cycles) {
    if (c.limb != lf) continue;
    EXPECT_TRUE(c.liftoff.has_value());
    EXPECT_FALSE(c.touchdown < 4550 && c.nextTouchdown > 4300) << c.touchdown;
  }
  EXPECT_EQ(r.strides[3].gait, "trot");  // the next stride is whole again
}

TEST_F(ProblemTest, TagInsideHiddenSpanIsReported) {
  train.hidden.push_back({lf, 3900, 4050});  // covers the LF touchdown at 4000
  const Report r = run();
  ASSERT_EQ(r.problems.size(), 1u);
  EXPECT_EQ(r.problems[0].frame, 4000);
  EXPECT_EQ(r.problems[0].limb, lf);
  EXPECT_NE(r.problems[0].message.find("hidden"), std::string::npos);
}

}  // namespace
}  // namespace stridemark::analysis
