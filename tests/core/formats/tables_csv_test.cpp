#include "formats/tables_csv.h"

#include <gtest/gtest.h>

#include <map>
#include <sstream>
#include <string>
#include <vector>

#include "analysis/analyse.h"
#include "common/error.h"
#include "formats/report_json.h"
#include "test_support.h"
#include "trial_fixture.h"

namespace stridemark::formats {
namespace {

TEST(TablesCsv, EveryTableLoadsInPandasWithUnitsAndValues) {
  // Reference: pandas.read_csv(comment='#') from Debian's python3-pandas.
  // Values: docs/methods.md checks 1 and 2 (see trial_fixture.h).
  const model::Annotation annotation = testing::checkOneTrial();
  const analysis::Report report = analysis::analyse(annotation);
  testing::TempFolder folder;
  const auto written = writeTables(folder / "tables", annotation, report, {"check1.csv"});
  EXPECT_EQ(written.size(), 8u);
  const std::string dir = (folder / "tables").string();
  const auto result = testing::runDebianPython(
      "import pandas as pd\n"
      "d = '" +
      dir +
      "/'\n"
      "ev = pd.read_csv(d + 'events.csv', comment='#')\n"
      "assert list(ev.columns) == ['limb', 'event', 'frame', 'time_s'], ev.columns\n"
      "assert len(ev) == " +
      std::to_string(annotation.events.size()) +
      "\n"
      "assert ev.frame.dtype.kind == 'i'\n"
      "row = ev[(ev.limb == 'LH') & (ev.frame == 225)].iloc[0]\n"
      "assert abs(row.time_s - 0.9) < 1e-12 and row.event == 'touchdown'\n"
      "st = pd.read_csv(d + 'strides.csv', comment='#')\n"
      "assert list(st.columns) == ['stride', 'start_frame', 'end_frame', 'duration_s', 'limb',\n"
      "    'duty_factor', 'phase_cycles', 'gait', 'bout', 'band', 'quadrant', 'sequence',\n"
      "    'lead', 'hind_lead', 'symmetrical', 'steady', 'complete', 'aerial',\n"
      "    'hind_duty_factor', 'limb_phase_cycles', 'dap_ms', 'dap_percent', 'dap_lh_rf_ms',\n"
      "    'dap_rh_lf_ms', 'dap_lh_rf_percent', 'dap_rh_lf_percent', 'ipsilateral_lag_cycles',\n"
      "    'wave_direction', 'note'], list(st.columns)\n"
      "assert len(st) == 3 * 4, len(st)\n"
      "for c in ['symmetrical', 'aerial', 'steady', 'complete']:\n"
      "    assert st[c].dtype == bool, c\n"
      "lh = st[(st.limb == 'LH') & (st.stride == 0)].iloc[0]\n"
      "assert abs(lh.duty_factor - 0.48) < 1e-12 and abs(lh.duration_s - 0.5) < 1e-12\n"
      "assert lh.start_frame == 100 and lh.end_frame == 225\n"
      "lf = st[(st.limb == 'LF') & (st.stride == 0)].iloc[0]\n"
      "assert abs(lf.phase_cycles - 0.248) < 1e-12\n"
      "li = pd.read_csv(d + 'limbs.csv', comment='#')\n"
      "assert list(li.columns) == ['scope', 'gait', 'bout', 'limb', 'strides', 'measure', 'n',\n"
      "                            'mean', 'sd', 'cv'], list(li.columns)\n"
      "trial = li[li.scope == 'trial']\n"
      "assert len(trial) == 4 * 4 and trial.gait.isna().all() and trial.bout.isna().all()\n"
      "m = trial[(trial.limb == 'LH') & (trial.measure == 'duty_factor')].iloc[0]\n"
      "assert abs(m['mean'] - 0.48) < 1e-12 and m.n == 3\n"
      "ph = pd.read_csv(d + 'phases.csv', comment='#')\n"
      "assert list(ph.columns[:4]) == ['scope', 'gait', 'bout', 'limb']\n"
      "ph = ph[ph.scope == 'trial']\n"
      "assert 'mean_cycles' in ph.columns and len(ph) == 4\n"
      "assert abs(ph[ph.limb == 'LF'].iloc[0].mean_cycles - 0.248) < 1e-9\n"
      "su = pd.read_csv(d + 'support.csv', comment='#')\n"
      "counts = su[(su.scope == 'trial') & (su.pattern_kind == 'count')]\n"
      "assert abs(counts.share.sum() - 1) < 1e-9, counts\n"
      "pd.read_csv(d + 'bouts.csv', comment='#')\n"
      "sy = pd.read_csv(d + 'symmetry.csv', comment='#')\n"
      "assert list(sy.columns[:3]) == ['scope', 'gait', 'bout']\n"
      "da = pd.read_csv(d + 'dap.csv', comment='#')\n"
      "assert list(da.columns) == ['scope', 'gait', 'bout', 'diagonal', 'n', 'mean_ms', 'sd_ms',\n"
      "                            'mean_percent', 'sd_percent'], list(da.columns)\n"
      "print('ok')\n");
  EXPECT_EQ(result.exitCode, 0) << result.err;
  EXPECT_EQ(result.out, "ok\n");
}

// A walk then a trot: every summary table has rows for the pooled trial, each gait and each
// bout, and the figures of each gait are that gait's alone.
TEST(TablesCsv, MixedTrialHasRowsPerTrialGaitAndBout) {
  const model::Annotation annotation = testing::walkThenTrotTrial();
  const analysis::Report report = analysis::analyse(annotation);
  // The trial the checks below are about (trial_fixture.h): walk bout, one stride in none,
  // trot bout.
  ASSERT_EQ(report.bouts.size(), 2u);
  ASSERT_EQ(report.bouts[0].gait, "walk");
  ASSERT_EQ(report.bouts[1].gait, "trot");
  ASSERT_TRUE(report.mixedGaits);
  ASSERT_EQ(report.strides.size(), 9u);
  ASSERT_EQ(report.strides[3].bout, -1);
  testing::TempFolder folder;
  writeTables(folder / "t", annotation, report, {"walk-trot.csv"});
  const std::string dir = (folder / "t").string();
  // Source: the fixture's own tags (trial_fixture.h) at 250 fps; DAP sign per docs/methods.md
  // §7.3 (fore minus hind touchdown, positive = hind first). Reader: Debian's python3-pandas.
  const auto result = testing::runDebianPython(
      "import pandas as pd\n"
      "d = '" +
      dir +
      "/'\n"
      "def near(a, b): return abs(float(a) - b) < 1e-9\n"
      "st = pd.read_csv(d + 'strides.csv', comment='#')\n"
      "lh = st[st.limb == 'LH'].set_index('stride')\n"
      "assert list(lh.bout.iloc[:3]) == [0, 0, 0] and list(lh.bout.iloc[4:]) == [1] * 5\n"
      "assert pd.isna(lh.bout[3]) and not lh.steady[3] and isinstance(lh.note[3], str)\n"
      "assert lh.steady.drop(3).all() and lh.note.drop(3).isna().all()\n"
      "trot = lh[lh.gait == 'trot']\n"
      "assert len(trot) == 5\n"
      "assert all(near(v, 8) for v in trot.dap_lh_rf_ms), trot.dap_lh_rf_ms\n"
      "assert all(near(v, 12) for v in trot.dap_rh_lf_ms)\n"
      "assert all(near(v, 2.5) for v in trot.dap_lh_rf_percent)\n"
      "assert all(near(v, 3.75) for v in trot.dap_rh_lf_percent)\n"
      "assert all(near(v, 10) for v in trot.dap_ms)\n"
      "assert lh[lh.gait == 'walk'].dap_lh_rf_ms.isna().all()\n"
      "li = pd.read_csv(d + 'limbs.csv', comment='#')\n"
      "keys = li[['scope', 'gait', 'bout']].drop_duplicates().fillna('-').values.tolist()\n"
      "assert keys == [['trial', 'mixed', '-'], ['gait', 'trot', '-'], ['gait', 'walk', '-'],\n"
      "                ['bout', 'walk', 0.0], ['bout', 'trot', 1.0]], keys\n"
      "def df(scope, gait, measure, limb='LH'):\n"
      "    r = li[(li.scope == scope) & (li.gait == gait) & (li.limb == limb) &\n"
      "           (li.measure == measure)]\n"
      "    assert len(r) == 1, (scope, gait, measure, r)\n"
      "    return r.iloc[0]\n"
      "assert near(df('gait', 'walk', 'duty_factor')['mean'], 0.65)\n"
      "assert near(df('gait', 'trot', 'duty_factor')['mean'], 0.40)\n"
      "assert near(df('bout', 'trot', 'stride_s')['mean'], 0.32)\n"
      "assert near(df('bout', 'walk', 'stride_s')['mean'], 0.40)\n"
      "assert df('bout', 'trot', 'stride_s').n == 5 and df('bout', 'walk', 'stride_s').n == 3\n"
      "pooled = df('trial', 'mixed', 'duty_factor')\n"
      "assert 0.40 < pooled['mean'] < 0.65 and pooled.sd > 0.1, pooled\n"
      "ph = pd.read_csv(d + 'phases.csv', comment='#')\n"
      "lf = ph[(ph.limb == 'LF') & (ph.scope == 'gait')].set_index('gait')\n"
      "assert near(lf.mean_cycles['walk'], 0.25) and near(lf.mean_cycles['trot'], 43 / 80)\n"
      "su = pd.read_csv(d + 'support.csv', comment='#')\n"
      "counts = su[su.pattern_kind == 'count'].fillna({'gait': '', 'bout': -1})\n"
      "for key, rows in counts.groupby(['scope', 'gait', 'bout']):\n"
      "    assert near(rows.share.sum(), 1), (key, rows)\n"
      "walk = counts[(counts.scope == 'gait') & (counts.gait == 'walk')].set_index('pattern')\n"
      "assert near(walk.share['0 limbs'], 0) and walk.share['3 limbs'] > 0\n"
      "sy = pd.read_csv(d + 'symmetry.csv', comment='#')\n"
      "per_gait = sy[sy.scope == 'gait']\n"
      "assert set(per_gait.gait) == {'walk', 'trot'}\n"
      "assert all(abs(v) < 1e-9 for v in per_gait.symmetry_index_percent), per_gait\n"
      "da = pd.read_csv(d + 'dap.csv', comment='#')\n"
      "assert set(da.gait) == {'mixed', 'trot'}, da\n"
      "b = da[da.scope == 'bout'].set_index('diagonal')\n"
      "assert list(b.index) == ['LH-RF', 'RH-LF', 'mean', 'difference'] and (b.bout == 1).all()\n"
      "assert b.n['LH-RF'] == 5 and near(b.mean_ms['LH-RF'], 8) and near(b.sd_ms['LH-RF'], 0)\n"
      "assert near(b.mean_ms['RH-LF'], 12) and near(b.mean_percent['RH-LF'], 3.75)\n"
      "assert near(b.mean_ms['mean'], 10) and near(b.mean_ms['difference'], -4)\n"
      "assert pd.isna(b.n['mean']) and pd.isna(b.sd_ms['difference'])\n"
      "bo = pd.read_csv(d + 'bouts.csv', comment='#').set_index('bout')\n"
      "assert list(bo.gait) == ['walk', 'trot'] and list(bo.summarised_strides) == [3, 5]\n"
      "assert near(bo.reference_stride_s[0], 0.40) and near(bo.reference_stride_s[1], 0.32)\n"
      "assert near(bo.dap_mean_ms[1], 10) and near(bo.dap_difference_ms[1], -4)\n"
      "assert pd.isna(bo.dap_mean_ms[0]) and bo.band[1] == 'trot'\n"
      "assert bo.speed_m_s.isna().all()\n"
      "print('ok')\n");
  EXPECT_EQ(result.exitCode, 0) << result.err << result.out;
  EXPECT_EQ(result.out, "ok\n");
}

TEST(TablesCsv, DapTableStatesTheSignConvention) {
  const model::Annotation annotation = testing::walkThenTrotTrial();
  const std::string text = dapTable(analysis::analyse(annotation), {"x.csv"});
  EXPECT_NE(text.find("# sign convention: " + std::string(kDapConvention) + "\n"),
            std::string::npos)
      << text;
  // A trial without trot strides has no DAP: the header alone.
  const std::string none = dapTable(analysis::analyse(testing::checkOneTrial()), {"x.csv"});
  EXPECT_EQ(none.substr(none.rfind("scope,")),
            "scope,gait,bout,diagonal,n,mean_ms,sd_ms,"
            "mean_percent,sd_percent\n");
}

// The data rows of a table without quoted cells, each as column name -> cell text.
std::vector<std::map<std::string, std::string>> rowsOf(const std::string& table) {
  std::vector<std::vector<std::string>> lines;
  std::istringstream in(table);
  for (std::string line; std::getline(in, line);) {
    if (line.empty() || line[0] == '#') continue;
    std::vector<std::string> cells;
    std::istringstream cellsIn(line + ",");
    for (std::string cell; std::getline(cellsIn, cell, ',');) cells.push_back(cell);
    lines.push_back(cells);
  }
  std::vector<std::map<std::string, std::string>> rows;
  for (std::size_t i = 1; i < lines.size(); ++i) {
    std::map<std::string, std::string> row;
    for (std::size_t c = 0; c < lines[0].size() && c < lines[i].size(); ++c)
      row[lines[0][c]] = lines[i][c];
    rows.push_back(row);
  }
  return rows;
}

TEST(TablesCsv, BoutsGiveTheirSpeedFromTheSchedule) {
  // Source: docs/methods.md §12 (each bout: the time-weighted mean speed over its strides'
  // frames), §6.1 (stride length = speed x mean reference stride time; Fr = v^2 / (g h),
  // g = 9.81). The trot bout's strides span frames 400-800: 1.0 m/s to frame 600 and 2.0 m/s
  // after it average 1.5 m/s.
  analysis::AnalysisOptions options;
  options.speedMs = 1.0;
  options.speedChanges = {{600, 2.0}};
  options.legLengthM = 0.5;
  const analysis::Report report = analysis::analyse(testing::walkThenTrotTrial(), options);
  const auto rows = rowsOf(boutsTable(report, {"x.csv"}));
  ASSERT_EQ(rows.size(), 2u);
  const auto number = [](const std::string& cell) { return std::stod(cell); };
  const auto& walk = rows[0];
  EXPECT_EQ(walk.at("gait"), "walk");
  EXPECT_NEAR(number(walk.at("speed_m_s")), 1.0, 1e-12);
  EXPECT_NEAR(number(walk.at("stride_length_m")), 0.40, 1e-12);
  EXPECT_NEAR(number(walk.at("relative_stride_length")), 0.80, 1e-12);
  EXPECT_NEAR(number(walk.at("froude")), 1.0 / (9.81 * 0.5), 1e-12);
  EXPECT_TRUE(walk.at("dap_mean_ms").empty());
  const auto& trot = rows[1];
  EXPECT_EQ(trot.at("gait"), "trot");
  EXPECT_EQ(trot.at("start_frame"), "400");
  EXPECT_EQ(trot.at("end_frame"), "800");
  EXPECT_NEAR(number(trot.at("speed_m_s")), 1.5, 1e-12);
  EXPECT_NEAR(number(trot.at("stride_length_m")), 0.48, 1e-12);
  EXPECT_NEAR(number(trot.at("relative_stride_length")), 0.96, 1e-12);
  EXPECT_NEAR(number(trot.at("froude")), 1.5 * 1.5 / (9.81 * 0.5), 1e-12);
  // One speed for the whole trial only when the belt kept one speed (§12).
  EXPECT_FALSE(report.speed.has_value());
}

TEST(TablesCsv, AllTablesAreWhatWriteTablesWrites) {
  const model::Annotation annotation = testing::walkThenTrotTrial();
  const analysis::Report report = analysis::analyse(annotation);
  testing::TempFolder folder;
  const auto written = writeTables(folder / "t", annotation, report, {"x"});
  const auto tables = allTables(annotation, report, {"x"});
  ASSERT_EQ(written.size(), tables.size());
  for (std::size_t i = 0; i < tables.size(); ++i) {
    EXPECT_EQ(written[i].filename().string(), tables[i].fileName);
    EXPECT_EQ(testing::readText(written[i]), tables[i].text) << tables[i].fileName;
  }
}

TEST(TablesCsv, HeaderNamesVersionInputAndRate) {
  const model::Annotation annotation = testing::checkOneTrial();
  const std::string text = eventsTable(annotation, {"trial 7.csv"});
  EXPECT_EQ(text.rfind("# stridemark ", 0), 0u);
  EXPECT_NE(text.find("# input: trial 7.csv\n"), std::string::npos);
  EXPECT_NE(text.find("# capture_rate_fps: 250\n"), std::string::npos);
  EXPECT_NE(text.find("licensed veterinarian"), std::string::npos);
}

TEST(TablesCsv, FolderThatIsAFileIsAClearError) {
  testing::TempFolder folder;
  testing::writeText(folder / "taken", "x");
  const model::Annotation annotation = testing::checkOneTrial();
  EXPECT_THROW(writeTables(folder / "taken", annotation, analysis::analyse(annotation), {"x"}),
               Error);
}

}  // namespace
}  // namespace stridemark::formats
