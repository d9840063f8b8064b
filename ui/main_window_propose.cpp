// Proposing events from the video (issue 18 item 3): Review ▸ Propose events… asks for the scene
// and the range, then vision::propose runs on a ProposeJob's worker with a progress bar and a
// Cancel button in the status bar. The result is one undo step (ProjectDocument::
// storeProposals); the tracks stay in memory for the Viewer. Errors thrown by the core reach
// the person through runGuarded, the desk's one error path.
#include <QAction>
#include <QProgressBar>
#include <QPushButton>
#include <QSettings>
#include <QStatusBar>
#include <QStringList>
#include <algorithm>
#include <set>

#include "common/error.h"
#include "ui/main_window.h"
#include "ui/session/guarded.h"
#include "ui/session/propose_job.h"
#include "ui/widgets/footfall_lanes.h"

namespace stridemark::ui {

void MainWindow::buildProposeStatus() {
  proposeJob_ = std::make_unique<ProposeJob>();
  proposeBar_ = new QProgressBar;
  proposeBar_->setAccessibleName(tr("Proposing events progress"));
  proposeBar_->setRange(0, 1000);
  proposeBar_->setFormat(tr("Proposing events %p%"));
  proposeBar_->setMaximumWidth(proposeBar_->fontMetrics().horizontalAdvance(proposeBar_->format()) *
                               2);
  proposeCancel_ = new QPushButton(tr("Cancel"));
  proposeCancel_->setAccessibleName(tr("Cancel proposing events"));
  proposeCancel_->setToolTip(tr("Stop proposing; the proposals you have stay as they are"));
  connect(proposeCancel_, &QPushButton::clicked, this, &MainWindow::cancelProposing);
  statusBar()->addPermanentWidget(proposeBar_);
  statusBar()->addPermanentWidget(proposeCancel_);
  connect(proposeJob_.get(), &ProposeJob::progressed, this, [this](qint64 done, qint64 total) {
    if (total > 0) proposeBar_->setValue(static_cast<int>(done * 1000 / total));
  });
  connect(proposeJob_.get(), &ProposeJob::finished, this, &MainWindow::onProposeFinished);
  const auto scene = QSettings().value(QStringLiteral("propose/scene")).toString().toStdString();
  try {
    if (!scene.empty()) proposeSettings_.scene = vision::parseScene(scene);
  } catch (const Error&) {
    // A setting from another version: keep the default scene.
  }
  showProposeProgress(false);
}

void MainWindow::showProposeProgress(bool on) {
  proposeBar_->setVisible(on);
  proposeCancel_->setVisible(on);
  if (auto* a = action(ActionId::cancelProposing)) a->setEnabled(on);
  if (auto* a = action(ActionId::proposeEvents)) a->setEnabled(!on);
  if (on) proposeBar_->setValue(0);
}

bool MainWindow::proposing() const {
  return proposeJob_->running();
}

void MainWindow::cancelProposing() {
  if (!proposing()) return;
  proposeJob_->cancel();
  statusBar()->showMessage(tr("Cancelling…"));
}

void MainWindow::proposeDialog() {
  const auto& limbs = doc_.annotation().limbs;
  QStringList seeded, missing;
  for (int limb = 0; limb < limbs.size(); ++limb) {
    QStringList frames;
    for (const auto& s : doc_.project().seeds)
      if (s.limb == limb) frames << QString::number(s.frame);
    (frames.isEmpty() ? missing : seeded)
        << QString::fromStdString(limbs.label(limb)) +
               (frames.isEmpty() ? QString()
                                 : tr(" at frame %1").arg(frames.join(QStringLiteral(", "))));
  }
  QString summary = seeded.isEmpty() ? tr("none yet") : seeded.join(QStringLiteral("; "));
  if (!missing.isEmpty() && !seeded.isEmpty())
    summary += tr(". No seed, so no proposals: %1.").arg(missing.join(QStringLiteral(", ")));
  // The selection's frames are offered as the range.
  std::optional<model::FrameRange> suggested;
  if (const auto& sel = lanes_->selection(); sel.size() >= 2) {
    const auto [lo, hi] = std::minmax_element(
        sel.begin(), sel.end(), [](const auto& a, const auto& b) { return a.frame < b.frame; });
    if (hi->frame > lo->frame) suggested = model::FrameRange{lo->frame, hi->frame};
  } else if (const auto& span = lanes_->selectedHiddenSpan()) {
    suggested = model::FrameRange{span->first, span->last};
  }
  ProposeDialog dialog(proposeSettings_, frameCount(), suggested, summary, this);
  if (dialog.exec() != QDialog::Accepted) return;
  proposeEvents(dialog.settings());
}

bool MainWindow::proposeEvents(const ProposeSettings& settings) {
  const QString what = tr("Propose events");
  if (proposing()) {
    statusBar()->showMessage(tr("Events are being proposed already; wait or cancel."), 6000);
    return false;
  }
  if (!video_) {
    reportError(this, what,
                tr("Proposals are made from the video: open the project's video first."));
    return false;
  }
  const auto& seeds = doc_.project().seeds;
  if (seeds.empty()) {
    reportError(this, what,
                tr("There are no foot seeds. Turn on %1, choose a limb, and click its foot in "
                   "the Viewer; one seed per foot is enough.")
                    .arg(menuPath(ActionId::seedMode)));
    return false;
  }
  const auto& info = video_->info();
  const std::string problem = vision::seedProblem(seeds, doc_.annotation().limbs,
                                                  video_->frameCount(), info.width, info.height);
  if (!problem.empty()) {
    reportError(this, what, QString::fromStdString(problem));
    return false;
  }
  proposeSettings_ = settings;
  QSettings().setValue(QStringLiteral("propose/scene"),
                       QString::fromUtf8(vision::sceneName(settings.scene).data()));
  vision::ProposeRequest request;
  request.video = video_->path().toStdString();
  request.limbs = doc_.annotation().limbs;
  request.captureRate = doc_.annotation().captureRate;
  request.scene = settings.scene;
  request.seeds = seeds;
  request.range = settings.range;
  runTicket_ = proposeTicket_;
  proposeJob_->start(std::move(request));
  showProposeProgress(true);
  statusBar()->showMessage(tr("Proposing events in the background; the desk stays usable."));
  return true;
}

void MainWindow::onProposeFinished() {
  showProposeProgress(false);
  ProposeJob::Outcome outcome = proposeJob_->takeOutcome();
  if (runTicket_ != proposeTicket_) return;  // another project was opened meanwhile
  if (outcome.cancelled) {
    statusBar()->showMessage(tr("Proposing cancelled; nothing was changed."), 8000);
    return;
  }
  if (outcome.error) {
    statusBar()->clearMessage();
    runGuarded(this, tr("Propose events"), [&] { std::rethrow_exception(outcome.error); });
    return;
  }
  if (!outcome.result) return;
  std::set<int> limbSet;
  for (const auto& s : outcome.request.seeds) limbSet.insert(s.limb);
  const std::vector<int> limbs(limbSet.begin(), limbSet.end());
  const model::FrameRange range = outcome.request.range.value_or(
      model::FrameRange{0, std::max<std::int64_t>(0, frameCount() - 1)});
  doc_.storeProposals(outcome.result->proposals, limbs, range);
  tracks_ = std::move(outcome.result->tracks);
  setCurrentProposal(std::nullopt);
  const auto count = doc_.project().proposals.events.size();
  statusBar()->showMessage(
      tr("%1 proposals to review in frames %2-%3. %4: next; %5: accept; %6: reject.")
          .arg(count)
          .arg(range.first)
          .arg(range.last)
          .arg(action(ActionId::nextProposal)->shortcut().toString(QKeySequence::NativeText),
               action(ActionId::acceptProposal)->shortcut().toString(QKeySequence::NativeText),
               action(ActionId::rejectProposal)->shortcut().toString(QKeySequence::NativeText)),
      15000);
  showTracks();
}

}  // namespace stridemark::ui
