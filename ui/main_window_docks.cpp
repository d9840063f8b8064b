// The analysis docks around the Viewer and the lanes, and where each starts.
#include <QDockWidget>
#include <QHBoxLayout>
#include <QToolButton>
#include <QUndoView>
#include <QVBoxLayout>

#include "ui/figures/analysis_figures.h"
#include "ui/main_window.h"
#include "ui/widgets/figure_view.h"
#include "ui/widgets/report_panels.h"
#include "ui/widgets/stride_sheet.h"

namespace stridemark::ui {

namespace {

// The Checks list with its fix under it: the button appears while some problem has a fix and
// works on the selected one (the same command as the entry's context menu).
QWidget* checksWithFixButton(ChecksList* checks) {
  auto* panel = new QWidget;
  auto* layout = new QVBoxLayout(panel);
  layout->setContentsMargins(0, 0, 0, 0);
  layout->setSpacing(2);
  layout->addWidget(checks);
  auto* fix = new QToolButton;
  fix->setObjectName(QStringLiteral("checksFixButton"));
  fix->setDefaultAction(checks->swapAction());
  fix->setToolButtonStyle(Qt::ToolButtonTextOnly);
  fix->setVisible(checks->hasFixes());
  QObject::connect(checks, &ChecksList::hasFixesChanged, fix, &QWidget::setVisible);
  auto* row = new QHBoxLayout;
  row->setContentsMargins(4, 0, 4, 2);
  row->addWidget(fix);
  row->addStretch();
  layout->addLayout(row);
  return panel;
}

}  // namespace

void MainWindow::buildDocks() {
  auto dock = [this](const QString& title, const QString& name, QWidget* w,
                     Qt::DockWidgetArea area) {
    auto* d = new QDockWidget(title, this);
    d->setObjectName(name);
    d->setWidget(w);
    addDockWidget(area, d);
    return d;
  };
  buildScopeBar();
  sheetPanel_ = new StrideSheetPanel;
  sheet_ = sheetPanel_->sheet();
  connect(sheet_, &StrideSheet::seekRequested, this, [this](qint64 f) { seek(f); });
  // The document's undo commands for excluding strides (ProjectDocument::excludeStride).
  connect(sheetPanel_, &StrideSheetPanel::excludeRequested, this,
          [this](qint64 start, const QString& reason) {
            doc_.excludeStride(start, reason.toStdString());
          });
  connect(sheetPanel_, &StrideSheetPanel::includeRequested, this,
          [this](qint64 start) { doc_.includeStride(start); });
  gaitMap_ = new FigureView(tr("Gait map"), figures::paintGaitMap);
  phaseDial_ = new FigureView(tr("Phase dial"), figures::paintPhaseDial);
  dutyPlot_ = new FigureView(tr("Duty factor per stride"), figures::paintStrideDutyPlot);
  checks_ = new ChecksList;
  connect(checks_, &ChecksList::seekRequested, this, [this](qint64 f) {
    if (f >= 0) seek(f);
  });
  connect(checks_, &ChecksList::limbRequested, this, &MainWindow::selectLimb);
  connect(checks_, &ChecksList::swapRequested, this,
          [this](int limb, qint64 frame) { doc_.swapTagsFrom(limb, frame); });
  auto* checksPanel = checksWithFixButton(checks_);
  summary_ = new SummaryView;
  legend_ = new TagKeyLegend;
  auto* undoView = new QUndoView(doc_.undoStack());
  undoView->setAccessibleName(tr("Edit history"));

  // Right: Gait map above, Phase dial and Summary tabbed below it.
  dock(tr("Gait map"), QStringLiteral("dockGaitMap"), gaitMap_, Qt::RightDockWidgetArea);
  auto* pd =
      dock(tr("Phase dial"), QStringLiteral("dockPhaseDial"), phaseDial_, Qt::RightDockWidgetArea);
  auto* sm = dock(tr("Summary"), QStringLiteral("dockSummary"), summary_, Qt::RightDockWidgetArea);
  tabifyDockWidget(pd, sm);
  pd->raise();
  // Bottom: Stride sheet with the duty plot, Checks with the edit history.
  auto* ss = dock(tr("Stride sheet"), QStringLiteral("dockStrideSheet"), sheetPanel_,
                  Qt::BottomDockWidgetArea);
  auto* ck =
      dock(tr("Checks"), QStringLiteral("dockChecks"), checksPanel, Qt::BottomDockWidgetArea);
  auto* dp = dock(tr("Duty per stride"), QStringLiteral("dockDutyPlot"), dutyPlot_,
                  Qt::BottomDockWidgetArea);
  auto* hv = dock(tr("History"), QStringLiteral("dockHistory"), undoView, Qt::BottomDockWidgetArea);
  tabifyDockWidget(ss, dp);
  tabifyDockWidget(ck, hv);
  ss->raise();
  ck->raise();
  dock(tr("Tag keys"), QStringLiteral("dockTagKeys"), legend_, Qt::LeftDockWidgetArea);
}

}  // namespace stridemark::ui
