#include "formats/tables_csv.h"

#include <gtest/gtest.h>

#include "analysis/analyse.h"
#include "common/error.h"
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
  EXPECT_EQ(written.size(), 7u);
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
      "for c in ['stride', 'start_frame', 'end_frame', 'duration_s', 'limb', 'duty_factor',\n"
      "          'phase_cycles', 'gait', 'band', 'quadrant', 'sequence', 'lead', 'symmetrical',\n"
      "          'aerial', 'dap_ms', 'dap_percent']:\n"
      "    assert c in st.columns, c\n"
      "assert len(st) == 3 * 4, len(st)\n"
      "assert st.symmetrical.dtype == bool and st.aerial.dtype == bool\n"
      "lh = st[(st.limb == 'LH') & (st.stride == 0)].iloc[0]\n"
      "assert abs(lh.duty_factor - 0.48) < 1e-12 and abs(lh.duration_s - 0.5) < 1e-12\n"
      "assert lh.start_frame == 100 and lh.end_frame == 225\n"
      "lf = st[(st.limb == 'LF') & (st.stride == 0)].iloc[0]\n"
      "assert abs(lf.phase_cycles - 0.248) < 1e-12\n"
      "li = pd.read_csv(d + 'limbs.csv', comment='#')\n"
      "assert list(li.columns) == ['limb', 'strides', 'measure', 'n', 'mean', 'sd', 'cv']\n"
      "m = li[(li.limb == 'LH') & (li.measure == 'duty_factor')].iloc[0]\n"
      "assert abs(m['mean'] - 0.48) < 1e-12 and m.n == 3\n"
      "ph = pd.read_csv(d + 'phases.csv', comment='#')\n"
      "assert 'mean_cycles' in ph.columns and len(ph) == 4\n"
      "assert abs(ph[ph.limb == 'LF'].iloc[0].mean_cycles - 0.248) < 1e-9\n"
      "su = pd.read_csv(d + 'support.csv', comment='#')\n"
      "counts = su[su.pattern_kind == 'count']\n"
      "assert abs(counts.share.sum() - 1) < 1e-9, counts\n"
      "pd.read_csv(d + 'bouts.csv', comment='#')\n"
      "pd.read_csv(d + 'symmetry.csv', comment='#')\n"
      "print('ok')\n");
  EXPECT_EQ(result.exitCode, 0) << result.err;
  EXPECT_EQ(result.out, "ok\n");
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
