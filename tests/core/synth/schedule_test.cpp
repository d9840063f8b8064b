// Ground truth of every preset, scored by core/analysis, must give back what was asked for.
#include <gtest/gtest.h>

#include <cmath>
#include <map>
#include <string>

#include "analysis/analyse.h"
#include "common/error.h"
#include "synth/synth.h"

namespace stridemark::synth {
namespace {

using model::LimbSet;

double circularGap(double a, double b) {
  double d = std::fmod(std::abs(a - b), 1.0);
  return std::min(d, 1.0 - d);
}

struct Case {
  std::string limbs;
  std::string gait;
  friend void PrintTo(const Case& c, std::ostream* os) { *os << c.limbs << " " << c.gait; }
};

std::vector<Case> allPresets() {
  std::vector<Case> cases;
  for (const char* set : {"quadruped", "biped", "hexapod", "multi-pair-5"})
    for (const auto& name : presetNames(LimbSet::fromName(set))) cases.push_back({set, name});
  cases.push_back({"multi-pair-3", "wave"});
  return cases;
}

model::Annotation truthOf(const LimbSet& limbs, const GaitSegment& segment, Rational fps,
                          double legLength) {
  TimelineOptions o;
  o.captureRate = fps;
  o.legLengthM = legLength;
  o.startCycle = 0.37;
  const Timeline timeline(limbs, {segment}, o);
  model::Annotation a;
  a.limbs = limbs;
  a.captureRate = fps;
  a.referenceLimb = limbs.defaultReference();
  a.events = timeline.events();
  a.clip = model::FrameRange{0, timeline.frameCount() - 1};
  a.normalize();
  return a;
}

class PresetTruth : public ::testing::TestWithParam<Case> {};

// Source: docs/methods.md §1.1-1.2 (duty factor = stance/stride; phase = touchdown lag
// over the reference stride); tolerance one frame of the stride (docs/methods.md §1.3).
// Labels: docs/methods.md team decisions (§2.2 bands, §3.3 classifier, §4.1, §4.2 templates).
TEST_P(PresetTruth, ScoresAsRequested) {
  const auto& c = GetParam();
  const LimbSet limbs = LimbSet::fromName(c.limbs);
  GaitSegment segment = parseGaitSegment(limbs, c.gait + ":8");
  const Rational fps{240, 1};
  const auto report = analysis::analyse(truthOf(limbs, segment, fps, 0.5));
  ASSERT_TRUE(report.problems.empty()) << report.problems.front().message;
  ASSERT_GE(report.strides.size(), 5u);
  const auto& p = segment.pattern;
  for (const auto& stride : report.strides) {
    const double frames = static_cast<double>(stride.endFrame - stride.startFrame);
    EXPECT_NEAR(frames, fps.toDouble() / p.strideHz, 1.0) << "stride at " << stride.startFrame;
    const double oneFrame = 1.0 / frames + 1e-9;
    for (int l = 0; l < limbs.size(); ++l) {
      const auto i = static_cast<std::size_t>(l);
      ASSERT_TRUE(stride.phase[i].has_value()) << limbs.label(l) << " at " << stride.startFrame;
      EXPECT_LE(circularGap(*stride.phase[i], p.phase[i]), oneFrame)
          << limbs.label(l) << " phase at " << stride.startFrame;
      if (stride.dutyFactor[i]) {
        EXPECT_NEAR(*stride.dutyFactor[i], p.dutyFactor[i], oneFrame)
            << limbs.label(l) << " duty factor at " << stride.startFrame;
      }
    }
    // docs/methods.md §1.5: only a stride at the ends of the clip may lack a limb's cycle.
    const bool atAnEnd = &stride == &report.strides.front() || &stride == &report.strides.back();
    if (!stride.complete && atAnEnd) {
      EXPECT_EQ(stride.gait, "unclassified");
      continue;
    }
    EXPECT_EQ(stride.gait, p.expectedLabel)
        << c.limbs << " " << c.gait << " stride at " << stride.startFrame;
  }
}

INSTANTIATE_TEST_SUITE_P(AllPresets, PresetTruth, ::testing::ValuesIn(allPresets()),
                         [](const ::testing::TestParamInfo<Case>& param) {
                           std::string name = param.param.limbs + "_" + param.param.gait;
                           for (auto& ch : name)
                             if (!std::isalnum(static_cast<unsigned char>(ch))) ch = '_';
                           return name;
                         });

// Explicit duty factors and phases are honoured the same way.
TEST(CustomPattern, ExplicitValuesComeBack) {
  const LimbSet limbs = LimbSet::quadruped();
  const auto segment =
      parseGaitSegment(limbs, "custom,df=0.7,df.LF=0.6,LF=0.2,RH=0.55,RF=0.7:5@1.1");
  const auto report = analysis::analyse(truthOf(limbs, segment, {120, 1}, 0.6));
  ASSERT_TRUE(report.problems.empty());
  ASSERT_GE(report.strides.size(), 3u);
  for (const auto& stride : report.strides) {
    const double oneFrame = 1.0 / static_cast<double>(stride.endFrame - stride.startFrame) + 1e-9;
    EXPECT_LE(circularGap(*stride.phase[0], 0.2), oneFrame);  // LF
    if (stride.dutyFactor[0]) {
      EXPECT_NEAR(*stride.dutyFactor[0], 0.6, oneFrame);
    }
    if (stride.dutyFactor[2]) {
      EXPECT_NEAR(*stride.dutyFactor[2], 0.7, oneFrame);
    }
  }
}

// Transitions: per limb, touchdown and lift-off alternate, each stance ends before the next one
// starts, no foot jumps between frames, and scoring finds both gaits as bouts.
TEST(Transitions, WalkToTrotToGallopStaysPhysical) {
  const LimbSet limbs = LimbSet::quadruped();
  TimelineOptions o;
  o.captureRate = {200, 1};
  o.legLengthM = 0.55;
  const Timeline t(limbs,
                   {parseGaitSegment(limbs, "walk:4"), parseGaitSegment(limbs, "trot:4"),
                    parseGaitSegment(limbs, "transverse-gallop:3")},
                   o);
  std::map<int, model::EventKind> last;
  std::map<int, std::int64_t> lastFrame;
  for (const auto& e : t.events()) {
    if (last.count(e.limb)) {
      EXPECT_NE(last[e.limb], e.kind) << "limb " << e.limb << " frame " << e.frame;
      EXPECT_GT(e.frame, lastFrame[e.limb]) << "limb " << e.limb;
    }
    last[e.limb] = e.kind;
    lastFrame[e.limb] = e.frame;
  }
  // Common practice, no source: no foot moves more than a fraction of a leg per frame.
  for (int l = 0; l < limbs.size(); ++l) {
    for (std::int64_t f = 1; f < t.frameCount(); ++f) {
      const auto a = t.foot(l, static_cast<double>(f - 1));
      const auto b = t.foot(l, static_cast<double>(f));
      EXPECT_LT(std::abs(b.x - a.x), 0.12 * o.legLengthM) << "limb " << l << " frame " << f;
      if (a.stance && b.stance) {
        EXPECT_NEAR(b.x - a.x,
                    -(t.distance(static_cast<double>(f)) - t.distance(static_cast<double>(f - 1))),
                    1e-9);
      }
    }
  }
  model::Annotation a;
  a.limbs = limbs;
  a.captureRate = o.captureRate;
  a.referenceLimb = limbs.defaultReference();
  a.events = t.events();
  a.normalize();
  const auto report = analysis::analyse(a);
  EXPECT_TRUE(report.problems.empty());
  std::vector<std::string> gaits;
  for (const auto& bout : report.bouts)
    if (gaits.empty() || gaits.back() != bout.gait) gaits.push_back(bout.gait);
  ASSERT_GE(gaits.size(), 3u);
  EXPECT_EQ(gaits.front(), "walk");
  EXPECT_NE(std::find(gaits.begin(), gaits.end(), "trot"), gaits.end());
  EXPECT_EQ(gaits.back(), "transverse gallop");
}

TEST(SoftLanding, SameEventsGentlerTouchdown) {
  // Our definition (--landing soft, issue 18): the stance span and so every event stays; the
  // swinging foot arrives with almost no vertical speed and near the ground's speed, where the
  // sharp profile comes down steeply and still moving forward.
  const LimbSet limbs = LimbSet::quadruped();
  TimelineOptions o;
  o.captureRate = {240, 1};
  const std::vector<GaitSegment> schedule{parseGaitSegment(limbs, "trot:2")};
  const Timeline sharp(limbs, schedule, o);
  o.softLanding = true;
  const Timeline soft(limbs, schedule, o);
  EXPECT_EQ(sharp.events(), soft.events());
  int touchdowns = 0;
  for (const auto& e : soft.events()) {
    if (e.kind != model::EventKind::touchdown || e.frame < 2) continue;
    const auto f = static_cast<double>(e.frame);
    ++touchdowns;
    EXPECT_TRUE(soft.foot(e.limb, f).stance);
    EXPECT_FALSE(soft.foot(e.limb, f - 1).stance);
    // Lift one frame before touchdown: a small share of the sharp profile's.
    EXPECT_LT(soft.foot(e.limb, f - 1).lift, 0.2 * sharp.foot(e.limb, f - 1).lift);
    // Forward motion relative to the ground in the last frame of swing.
    const double ground = soft.distance(f) - soft.distance(f - 1);
    const double softWorld = soft.foot(e.limb, f).x - soft.foot(e.limb, f - 1).x + ground;
    const double sharpWorld = sharp.foot(e.limb, f).x - sharp.foot(e.limb, f - 1).x + ground;
    EXPECT_LT(std::abs(softWorld), 0.5 * std::abs(sharpWorld)) << "frame " << e.frame;
  }
  EXPECT_GT(touchdowns, 8);
}

TEST(Errors, BadSpecsAreExplained) {
  const LimbSet limbs = LimbSet::quadruped();
  try {
    parseGaitSegment(limbs, "tripod:3");
    FAIL() << "expected an error";
  } catch (const Error& e) {
    EXPECT_NE(std::string(e.what()).find("walk"), std::string::npos) << e.what();
  }
  EXPECT_THROW(parseGaitSegment(limbs, "walk:abc"), Error);
  EXPECT_THROW(parseGaitSegment(limbs, "custom,df=1.2"), Error);
  EXPECT_THROW(parseGaitSegment(limbs, "custom,XX=0.5"), Error);
  TimelineOptions o;
  o.captureRate = {10, 1};
  EXPECT_THROW(Timeline(limbs, {parseGaitSegment(limbs, "trot:2")}, o), Error);  // 5 frames/stride
}

}  // namespace
}  // namespace stridemark::synth
