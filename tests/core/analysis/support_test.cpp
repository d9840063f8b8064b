#include "analysis/support_patterns.h"

#include <gtest/gtest.h>

#include <algorithm>

#include "analysis/analyse.h"
#include "event_train.h"

namespace stridemark::analysis {
namespace {

using testing::symmetricalQuadruped;

double share(const std::map<std::string, double>& m, const std::string& key) {
  const auto it = m.find(key);
  return it == m.end() ? 0.0 : it->second;
}

// Every full stride of the train must show the same support; checks the middle one.
const StrideRecord& middleStride(const Report& r) {
  return r.strides.at(r.strides.size() / 2);
}

TEST(Support, ThreeFeetAlwaysAtDf075Phase025) {
  // Source: Usherwood & Smith 2018 movie S1 [src] + [calc]; docs/methods.md check 13: DF 0.75,
  // phase 0.25 -> tripedal support 100 % of the stride, four tripods 25 % each (§5 table).
  const Report r = analyse(symmetricalQuadruped(0.75, 0.25));
  const StrideRecord& s = middleStride(r);
  ASSERT_EQ(s.supportByCount.size(), 5u);
  EXPECT_DOUBLE_EQ(s.supportByCount[3], 1.0);
  EXPECT_EQ(s.supportByCombination.size(), 4u);
  EXPECT_DOUBLE_EQ(share(s.supportByCombination, "tripod LF+LH+RH"), 0.25);
  EXPECT_DOUBLE_EQ(share(s.supportByCombination, "tripod LF+RF+LH"), 0.25);
  EXPECT_FALSE(s.aerial);
}

TEST(Support, RunningTrotHasTwoSuspensions) {
  // Source: docs/methods.md check 14 [calc; trot def. src Schmitt 2006]: DF 0.40, phase 0.50 ->
  // 80 % diagonal bipedal, 20 % suspension in two 10 % intervals; a trot.
  const Report r = analyse(symmetricalQuadruped(0.40, 0.50));
  const StrideRecord& s = middleStride(r);
  EXPECT_DOUBLE_EQ(s.supportByCount[2], 0.8);
  EXPECT_DOUBLE_EQ(s.supportByCount[0], 0.2);
  EXPECT_DOUBLE_EQ(share(s.supportByCombination, "diagonal LH+RF"), 0.4);
  EXPECT_DOUBLE_EQ(share(s.supportByCombination, "diagonal RH+LF"), 0.4);
  EXPECT_DOUBLE_EQ(share(s.supportByCombination, "suspension"), 0.2);
  EXPECT_TRUE(s.aerial);
  EXPECT_EQ(s.gait, "trot");
  EXPECT_EQ(*s.band, "trot");
  EXPECT_LT(*s.hindDutyFactor, 0.5);  // running trot: DF < 0.5
  // Two separate 10 % suspensions: the halves of the stride each hold one.
  const model::Annotation a = symmetricalQuadruped(0.40, 0.50);
  const CycleScan scan = scanCycles(a);
  SupportTimeline t(a.limbs, scan.tracks);
  const auto first = t.window(s.startFrame, s.startFrame + 600);
  const auto second = t.window(s.startFrame + 600, s.endFrame);
  EXPECT_DOUBLE_EQ(first.byCount[0], 0.2);
  EXPECT_DOUBLE_EQ(second.byCount[0], 0.2);
}

TEST(Support, WindowsOverUnknownEdgesAndTheWholeTrial) {
  // Common practice, no source: a window is complete only where every limb's state is known;
  // the whole-trial shares are those of one window over the known frames. Walking trot (no
  // suspension) and running trot (suspension).
  for (const double df : {0.60, 0.40}) {
    const model::Annotation a = symmetricalQuadruped(df, 0.50);
    const CycleScan scan = scanCycles(a);
    const SupportTimeline timeline(a.limbs, scan.tracks);
    const Report r = analyse(a);
    ASSERT_GE(r.strides.size(), 3u);
    const std::int64_t first = r.strides[1].startFrame;  // every limb tagged on both sides
    const std::int64_t end = r.strides[r.strides.size() - 2].endFrame;
    EXPECT_FALSE(timeline.window(first - 100000, first).complete) << "df " << df;
    EXPECT_TRUE(timeline.window(first, end).complete) << "df " << df;
    EXPECT_EQ(timeline.window(first, end).aerial, df < 0.5) << "df " << df;
    const SupportShares total = timeline.overall();
    const SupportShares wide = timeline.window(first - 100000, end + 100000);
    EXPECT_EQ(total.byCount, wide.byCount) << "df " << df;
    EXPECT_EQ(total.byCombination, wide.byCombination) << "df " << df;
    EXPECT_EQ(total.knownFrames, wide.knownFrames) << "df " << df;
    // Source: docs/methods.md check 15 [calc]: DF 0.60 (0.40), phase 0.50 -> 80 % diagonal
    // bipedal and 20 % four-foot support (suspension), over the trial's strides.
    ASSERT_EQ(r.support.size(), 5u);
    EXPECT_NEAR(r.support[2], 0.8, 1e-12) << "df " << df;
    EXPECT_NEAR(r.support[df < 0.5 ? 0 : 4], 0.2, 1e-12) << "df " << df;
  }
}

TEST(Support, WalkingTrotHasQuadrupedalSupport) {
  // Source: docs/methods.md check 15 [calc]: DF 0.60, phase 0.50 -> 80 % diagonal, 20 % all four.
  const StrideRecord s = middleStride(analyse(symmetricalQuadruped(0.60, 0.50)));
  EXPECT_DOUBLE_EQ(s.supportByCount[2], 0.8);
  EXPECT_DOUBLE_EQ(s.supportByCount[4], 0.2);
  EXPECT_DOUBLE_EQ(share(s.supportByCombination, "all four"), 0.2);
  EXPECT_DOUBLE_EQ(share(s.supportByCombination, "diagonal LH+RF"), 0.4);
}

TEST(Support, TripedalShareIsFourDfMinusTwo) {
  // Source: docs/methods.md check 16 [calc: 4 DF - 2]: DF 0.65 with only 2/3-foot phases ->
  // tripedal 60 %, bipedal 40 %.
  for (double phase : {0.25, 0.2, 0.3}) {
    const StrideRecord s = middleStride(analyse(symmetricalQuadruped(0.65, phase)));
    EXPECT_NEAR(s.supportByCount[3], 0.6, 1e-12) << "phase " << phase;
    EXPECT_NEAR(s.supportByCount[2], 0.4, 1e-12) << "phase " << phase;
  }
}

struct TableRow {
  double df, phase;
  std::map<int, double> byCount;
  std::map<std::string, double> combos;
};

TEST(Support, MethodsSupportTable) {
  // Source: docs/methods.md §5 table of computed support fractions for symmetrical gaits [calc].
  const std::vector<TableRow> rows = {
      {0.50, 0.50, {{2, 1.0}}, {{"diagonal LH+RF", 0.5}, {"diagonal RH+LF", 0.5}}},
      {0.50, 0.00, {{2, 1.0}}, {{"lateral LH+LF", 0.5}, {"lateral RH+RF", 0.5}}},
      {0.60,
       0.25,
       {{2, 0.6}, {3, 0.4}},
       {{"diagonal LH+RF", 0.15},
        {"diagonal RH+LF", 0.15},
        {"lateral LH+LF", 0.15},
        {"lateral RH+RF", 0.15},
        {"tripod LF+RF+LH", 0.1}}},
      {0.60, 0.60, {{2, 0.6}, {3, 0.4}}, {{"diagonal LH+RF", 0.3}, {"diagonal RH+LF", 0.3}}},
      {0.60, 0.10, {{2, 0.6}, {3, 0.4}}, {{"lateral LH+LF", 0.3}, {"lateral RH+RF", 0.3}}},
      {0.30, 0.25, {{1, 0.8}, {2, 0.2}}, {{"LF", 0.2}, {"RH", 0.2}, {"diagonal LH+RF", 0.05}}},
  };
  for (const TableRow& row : rows) {
    const StrideRecord s = middleStride(analyse(symmetricalQuadruped(row.df, row.phase)));
    for (const auto& [k, expected] : row.byCount)
      EXPECT_NEAR(s.supportByCount.at(static_cast<std::size_t>(k)), expected, 1e-12)
          << "DF " << row.df << " phase " << row.phase << " k " << k;
    for (const auto& [name, expected] : row.combos)
      EXPECT_NEAR(share(s.supportByCombination, name), expected, 1e-12)
          << "DF " << row.df << " phase " << row.phase << " " << name;
  }
}

TEST(Support, MeanLimbsInStanceEqualsSumOfDutyFactors) {
  // Source: docs/methods.md §5 identity [calc]: mean number of limbs in stance = sum of DFs.
  const model::Annotation a = testing::idealTrain(
      model::LimbSet::quadruped(), {{0.3, 0.55}, {0.8, 0.65}, {0.0, 0.7}, {0.5, 0.6}}, 1200, 5);
  const Report r = analyse(a);
  const StrideRecord& s = middleStride(r);
  double mean = 0;
  for (std::size_t k = 0; k < s.supportByCount.size(); ++k)
    mean += static_cast<double>(k) * s.supportByCount[k];
  EXPECT_NEAR(mean, 0.55 + 0.65 + 0.7 + 0.6, 1e-12);
}

TEST(Support, NamesForOtherLimbSets) {
  // Common practice, no source: sorted labels joined with "+".
  const auto hex = model::LimbSet::hexapod();  // L1 R1 L2 R2 L3 R3
  EXPECT_EQ(combinationName(hex, 0b010101), "L1+L2+L3");
  EXPECT_EQ(combinationName(hex, 0), "suspension");
  EXPECT_EQ(combinationName(model::LimbSet::biped(), 0b11), "L+R");
  EXPECT_EQ(combinationName(model::LimbSet::quadruped(), 0b0011), "fore pair");
  EXPECT_EQ(combinationName(model::LimbSet::quadruped(), 0b1100), "hind pair");
  EXPECT_EQ(combinationName(model::LimbSet::quadruped(), 0b1111), "all four");
}

TEST(Support, OverallShareExcludesUnknownTime) {
  // Common practice, no source: the report's support covers only frames where every limb's
  // state is known. DF 0.5 trot: two feet down at every known instant. LF's lift-off at 4480 is
  // hidden; were the hidden time read as swing, one-foot support would appear.
  model::Annotation a = symmetricalQuadruped(0.5, 0.5);
  const Report clean = analyse(a);
  ASSERT_EQ(clean.support.size(), 5u);
  EXPECT_DOUBLE_EQ(clean.support[2], 1.0);
  a.events.erase(std::remove(a.events.begin(), a.events.end(),
                             model::Event{4600, 0, model::EventKind::liftoff}),
                 a.events.end());
  a.hidden.push_back({0, 4500, 4700});
  const Report hidden = analyse(a);
  ASSERT_FALSE(hidden.problems.empty());  // strides over the hidden span are unclassified
  for (const Problem& p : hidden.problems)
    EXPECT_NE(p.message.find("hidden"), std::string::npos) << p.message;
  EXPECT_DOUBLE_EQ(hidden.support[2], 1.0);
  EXPECT_DOUBLE_EQ(hidden.support[1], 0.0);
  EXPECT_NEAR(share(hidden.supportByCombination, "diagonal LH+RF") +
                  share(hidden.supportByCombination, "diagonal RH+LF"),
              1.0, 1e-12);
}

}  // namespace
}  // namespace stridemark::analysis
