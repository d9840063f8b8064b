// What the window shows of the analysis: a rerun after each edit, the newest report in every
// dock, the title and the status line.
#include <QFileInfo>
#include <QLabel>

#include "ui/main_window.h"
#include "ui/widgets/figure_view.h"
#include "ui/widgets/footfall_lanes.h"
#include "ui/widgets/report_panels.h"
#include "ui/widgets/stride_sheet.h"
#include "ui/widgets/viewer.h"

namespace stridemark::ui {

void MainWindow::onAnnotationChanged() {
  const auto& a = doc_.annotation();
  viewer_->setCaptureRate(a.captureRate);
  analysis::AnalysisOptions options;
  options.speedMs = doc_.project().trial.speedMs;
  options.speedChanges = doc_.project().trial.speedChanges;
  options.legLengthM = doc_.project().trial.legLengthM;
  runner_.request(a, options, doc_.revision());
  lanes_->update();
  updateTagKeyHints();
  updateStatus();
  showSeeds();
  // The proposal under review may have moved in the order, or gone (an undo): a gone one keeps
  // its place for the next step but shows nothing.
  if (current_ && doc_.findProposal(current_->event)) {
    showReview();
  } else if (current_) {
    lanes_->setCurrentProposal(std::nullopt);
    viewer_->setReviewStrip({});
  }
}

void MainWindow::onReport(std::shared_ptr<const analysis::Report> report, std::uint64_t revision) {
  if (revision < shownRevision_) return;  // an older run finished late
  shownRevision_ = revision;
  report_ = report;
  updateScopeChoices();
  showScope();  // Summary, Gait map, Phase dial and Stride sheet
  dutyPlot_->setReport(report);
  checks_->setReport(report, !doc_.annotation().events.empty());
}

void MainWindow::updateTitle() {
  QString name =
      doc_.projectPath().isEmpty()
          ? (doc_.videoPath().isEmpty() ? tr("untitled") : QFileInfo(doc_.videoPath()).fileName())
          : QFileInfo(doc_.projectPath()).fileName();
  setWindowTitle(QStringLiteral("%1[*] — Stridemark").arg(name));
  setWindowModified(doc_.isModified());
}

void MainWindow::updateStatus() {
  const auto& a = doc_.annotation();
  const QString limb =
      QString::fromStdString(a.limbs.label(std::min(selectedLimb_, a.limbs.size() - 1)));
  const bool stance = a.inStance(selectedLimb_, playhead_);
  status_->setText(tr("limb %1 (%2) · %3 events · speed %4%5%6")
                       .arg(limb, stance ? tr("stance") : tr("swing"))
                       .arg(a.events.size())
                       .arg(speedText())
                       .arg(playDirection_ > 0   ? tr(" · playing")
                            : playDirection_ < 0 ? tr(" · playing backwards")
                                                 : QString())
                       .arg(video_ && video_->displayingProxy() ? tr(" · proxy") : QString()));
}

}  // namespace stridemark::ui
