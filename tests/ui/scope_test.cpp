// The desk's scope selector on a walk→trot trial (issue 16 items 6-7): the Summary dock leads
// with per-gait figures, the Gait map shows one mean point per gait, the four scoped docks
// follow the selector, and a stride excluded from the Stride sheet is an undoable edit that
// changes the summary while the stride stays listed.
#include <gtest/gtest.h>
#include <QApplication>
#include <QComboBox>
#include <QDir>
#include <QDockWidget>
#include <QImage>
#include <QLineEdit>
#include <QPainter>
#include <QPushButton>
#include <QTest>

#include "analysis/bouts.h"
#include "synth/gait.h"
#include "synth/timeline.h"
#include "tests/ui/test_support.h"
#include "ui/figures/analysis_figures.h"
#include "ui/main_window.h"
#include "ui/widgets/figure_view.h"
#include "ui/widgets/report_panels.h"
#include "ui/widgets/stride_sheet.h"

namespace stridemark::ui {
namespace {

// Our generator's walk then trot (core/synth), as in samples/dog-rehab-treadmill: 4 s each at
// 120 fps, the exact events the renderer would draw.
model::Project walkThenTrot() {
  const auto limbs = model::LimbSet::quadruped();
  synth::TimelineOptions options;
  options.captureRate = {120, 1};
  const synth::Timeline timeline(
      limbs, {{synth::presetGait(limbs, "walk"), 4.0}, {synth::presetGait(limbs, "trot"), 4.0}},
      options);
  model::Project p;
  p.annotation.limbs = limbs;
  p.annotation.captureRate = options.captureRate;
  p.annotation.referenceLimb = limbs.defaultReference();
  p.annotation.clip = model::FrameRange{0, timeline.frameCount() - 1};
  p.annotation.events = timeline.events();
  p.annotation.normalize();
  return p;
}

struct Desk {
  Desk() {
    test::showUnattended(w);
    w.document()->reset(walkThenTrot(), {});
    settle();
    gaitMap = w.findChild<FigureView*>();
    for (auto* view : w.findChildren<FigureView*>())
      if (view->accessibleName() == QStringLiteral("Gait map")) gaitMap = view;
    summary = w.findChild<SummaryView*>();
  }
  // The report of the document as it is now, taken by every dock.
  const analysis::Report& settle() {
    w.analysisRunner()->waitIdle();
    EXPECT_TRUE(test::waitUntil(
        [&] { return w.report() != nullptr && w.analysisRunner()->completedRuns() > 0; }));
    test::waitUntil([] { return false; }, 50);  // the finished signal reaches the docks
    return *w.report();
  }
  int scopeIndex(const QString& startsWith) const {
    for (int i = 0; i < w.scopeSelector()->count(); ++i)
      if (w.scopeSelector()->itemText(i).startsWith(startsWith)) return i;
    return -1;
  }
  MainWindow w;
  FigureView* gaitMap = nullptr;
  SummaryView* summary = nullptr;
};

// Where the Gait map draws phase x, duty y in an image of `size` (the painter's own margins).
QColor pixelAt(const QImage& image, const analysis::HildebrandSummary& h,
               const std::function<QPointF(double, double)>& px) {
  return image.pixelColor(px(h.limbPhase, h.dutyFactor).toPoint());
}

TEST(DeskScope, SummaryLeadsWithEachGaitAndTheScopeSelectsWhatTheDocksShow) {
  // Source: issue 16 item 7 and docs/methods.md §11 (bouts, per-gait summaries; pooled means
  // of mixed gaits are labelled as such).
  Desk desk;
  const analysis::Report& r = desk.settle();
  ASSERT_TRUE(r.mixedGaits) << "the generator's walk then trot gives two gaits";
  ASSERT_TRUE(r.byGait.count("walk") && r.byGait.count("trot"));
  QComboBox* scope = desk.w.scopeSelector();
  ASSERT_NE(scope, nullptr);
  // All, each gait, each bout.
  EXPECT_EQ(scope->count(), static_cast<int>(1 + 2 + r.bouts.size()));
  EXPECT_EQ(scope->currentText(), QStringLiteral("All strides (walk, trot)"));

  // All: per gait first (walk, then trot), then the pooled figures marked as mixed.
  const QString all = desk.summary->toPlainText();
  const auto walkAt = all.indexOf(QStringLiteral("walk — "));
  const auto trotAt = all.indexOf(QStringLiteral("trot — "));
  const auto pooledAt = all.indexOf(QStringLiteral("All strides pooled"));
  ASSERT_GE(walkAt, 0) << all.toStdString();
  EXPECT_LT(walkAt, trotAt);
  EXPECT_LT(trotAt, pooledAt);
  EXPECT_TRUE(all.contains(QStringLiteral("Mixed gaits")));
  // Each gait's Gait map point with its stride count.
  for (const char* gait : {"walk", "trot"}) {
    const auto& h = r.byGait.at(gait).hildebrand;
    ASSERT_TRUE(h) << gait;
    EXPECT_GT(h->n, 1);
    EXPECT_TRUE(all.contains(QStringLiteral("(n = %1)").arg(h->n))) << gait;
  }

  // Trot only: the trot's summary and strides, nothing of the walk.
  const int trotScope = desk.scopeIndex(QStringLiteral("trot, every bout"));
  ASSERT_GE(trotScope, 0);
  scope->setCurrentIndex(trotScope);
  EXPECT_EQ(desk.w.scope().kind, ReportScope::Kind::gait);
  const QString trot = desk.summary->toPlainText();
  EXPECT_TRUE(trot.contains(QStringLiteral("trot — %1 strides").arg(r.byGait.at("trot").strides)))
      << trot.toStdString();
  EXPECT_FALSE(trot.contains(QStringLiteral("walk — ")));
  const auto& shown = desk.gaitMap->report();
  ASSERT_TRUE(shown && shown->hildebrand);
  EXPECT_DOUBLE_EQ(shown->hildebrand->limbPhase, r.byGait.at("trot").hildebrand->limbPhase);
  EXPECT_EQ(shown->byGait.size(), 1u);
  const StrideTableModel* rows = desk.w.findChild<StrideSheet*>()->strideModel();
  ASSERT_GT(rows->rowCount(), 0);
  for (int row = 0; row < rows->rowCount(); ++row) {
    const int bout = rows->index(row, StrideTableModel::kBoutColumn).data().toInt() - 1;
    ASSERT_GE(bout, 0);
    EXPECT_EQ(r.bouts[static_cast<std::size_t>(bout)].gait, "trot") << "row " << row;
  }

  // One bout: its own summary; back to All shows both gaits again.
  const int firstBout = desk.scopeIndex(QStringLiteral("Bout 1: walk"));
  ASSERT_GE(firstBout, 0);
  scope->setCurrentIndex(firstBout);
  EXPECT_EQ(rows->rowCount(), r.bouts[0].lastStride - r.bouts[0].firstStride + 1);
  EXPECT_TRUE(desk.summary->toPlainText().contains(QStringLiteral("Showing: Bout 1: walk")));
  scope->setCurrentIndex(0);
  EXPECT_EQ(rows->rowCount(), static_cast<int>(r.strides.size()));
  EXPECT_TRUE(desk.summary->toPlainText().contains(QStringLiteral("All strides pooled")));
}

TEST(DeskScope, GaitMapDrawsOneMeanPointPerGaitAtThatGaitsMean) {
  // Source: issue 16 item 7 (one mean point per gait, not one pooled point) and docs/methods.md
  // §2.2 (x = limb phase, y = hind duty factor). Means are drawn last, so the pixel at each
  // gait's mean (from core/analysis, byGait) is that gait's marker colour; the generator's walk
  // and trot lie in different bands, so the two markers do not cover each other.
  Desk desk;
  const analysis::Report& r = desk.settle();
  ASSERT_TRUE(r.byGait.at("walk").hildebrand && r.byGait.at("trot").hildebrand);
  QImage image(800, 600, QImage::Format_ARGB32);
  QPainter p(&image);
  const auto style = figures::FigureStyle::print();
  figures::paintGaitMap(p, QRectF(image.rect()), r, style);
  p.end();
  // The painter's plot margins (ui/figures/analysis_figures.cpp), from the same fonts.
  const double fp = style.fontPx;
  const double titleH = QFontMetricsF(style.font(-1)).height();
  const double tickW = QFontMetricsF(style.font(-2)).horizontalAdvance(QStringLiteral("100%"));
  const QRectF plot =
      QRectF(image.rect()).adjusted(titleH + tickW + fp * 0.6, fp * 2.6, -fp * 1.6, -fp * 3.2);
  auto px = [&](double phase, double duty) {
    return QPointF(plot.left() + phase * plot.width(), plot.bottom() - duty * plot.height());
  };
  const QColor walk = pixelAt(image, *r.byGait.at("walk").hildebrand, px);
  const QColor trot = pixelAt(image, *r.byGait.at("trot").hildebrand, px);
  EXPECT_EQ(walk, QColor(0xd5, 0x5e, 0x00)) << walk.name().toStdString();  // first gait
  EXPECT_EQ(trot, QColor(0x00, 0x72, 0xb2)) << trot.name().toStdString();  // second gait
}

TEST(DeskScope, ExcludingAStrideInTheSheetIsUndoableAndChangesTheSummary) {
  // Source: issue 16 item 6 and docs/methods.md §11 (an excluded stride stays listed and is
  // left out of every summary).
  Desk desk;
  const analysis::Report before = desk.settle();
  const int trotStrides = before.byGait.at("trot").strides;
  StrideSheetPanel* panel = desk.w.strideSheetPanel();
  StrideSheet* sheet = panel->sheet();
  // A trot stride the trot's summary uses.
  const auto& bout = before.bouts.back();
  ASSERT_EQ(bout.gait, "trot");
  std::int64_t start = -1;
  for (int i = bout.firstStride; i <= bout.lastStride; ++i) {
    const auto& s = before.strides[static_cast<std::size_t>(i)];
    if (s.steady && s.gait == "trot") start = s.startFrame;
  }
  ASSERT_GE(start, 0);
  ASSERT_TRUE(sheet->selectStride(start));
  EXPECT_FALSE(panel->excludeButton()->isEnabled()) << "no reason typed yet";
  // As a person does: click into the field (tag keys stay off while a text field has focus).
  QTest::mouseClick(panel->reasonEdit(), Qt::LeftButton);
  ASSERT_TRUE(test::waitUntil([&] { return panel->reasonEdit()->hasFocus(); }, 2000));
  QTest::keyClicks(panel->reasonEdit(), QStringLiteral("stumbled"));
  ASSERT_TRUE(panel->excludeButton()->isEnabled());
  QTest::mouseClick(panel->excludeButton(), Qt::LeftButton);

  ASSERT_EQ(desk.w.document()->annotation().excluded.size(), 1u);
  EXPECT_EQ(desk.w.document()->annotation().excluded[0].reason, "stumbled");
  const analysis::Report& excluded = desk.settle();
  EXPECT_EQ(excluded.byGait.at("trot").strides, trotStrides - 1);
  EXPECT_EQ(excluded.strides.size(), before.strides.size()) << "the stride stays listed";
  // Still in the sheet, selected, greyed, with its reason; Include now offered.
  ASSERT_TRUE(sheet->selectedStart());
  EXPECT_EQ(*sheet->selectedStart(), start);
  const QModelIndex row = sheet->selectionModel()->selectedRows().front();
  EXPECT_EQ(row.siblingAtColumn(StrideTableModel::kExcludedColumn).data().toString(),
            QStringLiteral("stumbled"));
  EXPECT_TRUE(row.data(Qt::ForegroundRole).isValid());
  EXPECT_TRUE(panel->includeButton()->isEnabled());
  EXPECT_TRUE(desk.summary->toPlainText().contains(
      QStringLiteral("trot — %1 strides").arg(trotStrides - 1)));

  // Undo takes it back; redo excludes it again; Include is its own undo step.
  desk.w.document()->undoStack()->undo();
  EXPECT_TRUE(desk.w.document()->annotation().excluded.empty());
  EXPECT_EQ(desk.settle().byGait.at("trot").strides, trotStrides);
  EXPECT_TRUE(
      desk.summary->toPlainText().contains(QStringLiteral("trot — %1 strides").arg(trotStrides)));
  desk.w.document()->undoStack()->redo();
  EXPECT_EQ(desk.settle().byGait.at("trot").strides, trotStrides - 1);
  ASSERT_TRUE(sheet->selectStride(start));
  QTest::mouseClick(panel->includeButton(), Qt::LeftButton);
  EXPECT_TRUE(desk.w.document()->annotation().excluded.empty());
  EXPECT_EQ(desk.settle().byGait.at("trot").strides, trotStrides);
}

TEST(DeskScope, ScreenshotsOfTheWalkThenTrotSample) {
  // For people to look at (tests/ui/screenshots): the desk on samples/dog-rehab-treadmill with
  // the per-gait Summary and Gait map, in scope All and in scope trot. Checked here only that
  // the sample reads walk then trot and that each picture was written.
  Desk desk;
  ASSERT_TRUE(desk.w.openProject(QStringLiteral(STRIDEMARK_SOURCE_DIR) +
                                 QStringLiteral("/samples/dog-rehab-treadmill/trial.stridemark")));
  desk.w.resize(1600, 1000);
  const analysis::Report& r = desk.settle();
  ASSERT_TRUE(r.mixedGaits);
  EXPECT_EQ(analysis::gaitsInOrder(r.bouts), (std::vector<std::string>{"walk", "trot"}));
  for (auto* dock : desk.w.findChildren<QDockWidget*>())
    if (dock->objectName() == QStringLiteral("dockSummary")) dock->raise();
  test::waitUntil([] { return false; }, 200);
  const QString dir = test::screenshotDir();
  QDir().mkpath(dir);
  EXPECT_TRUE(desk.w.grab().save(dir + QStringLiteral("/scope-all.png")));
  EXPECT_TRUE(desk.gaitMap->grab().save(dir + QStringLiteral("/scope-all-gait-map.png")));
  EXPECT_TRUE(desk.summary->grab().save(dir + QStringLiteral("/scope-all-summary.png")));
  desk.w.scopeSelector()->setCurrentIndex(desk.scopeIndex(QStringLiteral("trot, every bout")));
  test::waitUntil([] { return false; }, 200);
  EXPECT_TRUE(desk.w.grab().save(dir + QStringLiteral("/scope-trot.png")));
}

}  // namespace
}  // namespace stridemark::ui
