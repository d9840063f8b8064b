// Reviewing proposals from the keyboard (issue 18 item 3): next / previous (by frame, or least
// confident first), accept, reject, nudge, accept all above a confidence. Every accept and
// reject is an undo step of the document; the current proposal is highlighted in the lanes,
// the playhead goes to it, the status bar names it, and the Viewer shows the foot's track and
// crops of the frames around it.
#include <QAction>
#include <QSettings>
#include <QStatusBar>
#include <algorithm>
#include <cmath>

#include "ui/figures/figure_style.h"
#include "ui/main_window.h"
#include "ui/session/frame_crops.h"
#include "ui/widgets/footfall_lanes.h"
#include "ui/widgets/viewer.h"

namespace stridemark::ui {

namespace {

constexpr std::int64_t kStripFrames = 2;  // crops of the proposal's frame and 2 each side

QString eventText(model::EventKind kind) {
  return kind == model::EventKind::touchdown ? MainWindow::tr("touchdown")
                                             : MainWindow::tr("lift-off");
}

// Where the foot is on `frame`: its track there, else the nearest visible point of it.
std::optional<QPointF> footAt(const std::vector<vision::FootTrack>& tracks, int limb,
                              std::int64_t frame) {
  for (const auto& t : tracks) {
    if (t.limb != limb || t.points.empty()) continue;
    std::optional<QPointF> best;
    std::int64_t bestGap = 0;
    for (std::size_t i = 0; i < t.points.size(); ++i) {
      if (!t.points[i].visible) continue;
      const auto gap = std::abs(t.first + static_cast<std::int64_t>(i) - frame);
      if (!best || gap < bestGap) {
        best = QPointF(t.points[i].x, t.points[i].y);
        bestGap = gap;
      }
    }
    return best;
  }
  return std::nullopt;
}

}  // namespace

QString MainWindow::reviewText() const {
  if (!current_) return {};
  const auto& proposals = doc_.project().proposals;
  const int place = reviewPosition(proposals, order_, *current_);
  const auto& e = current_->event;
  QString text =
      tr("%1 %2 @ %3 proposed, confidence %4")
          .arg(QString::fromStdString(doc_.annotation().limbs.label(e.limb)), eventText(e.kind))
          .arg(e.frame)
          .arg(current_->confidence, 0, 'f', 2);
  if (place > 0) text += tr(" (%1 of %2)").arg(place).arg(proposals.events.size());
  return text;
}

void MainWindow::setReviewOrder(ReviewOrder order) {
  order_ = order;
  action(ActionId::leastConfidentFirst)->setChecked(order == ReviewOrder::leastConfidentFirst);
  showReview();
}

void MainWindow::setCurrentProposal(std::optional<model::ProposedEvent> proposal) {
  current_ = proposal;
  lanes_->setCurrentProposal(proposal ? std::optional(proposal->event) : std::nullopt);
  if (proposal) {
    stopPlayback();
    selectLimb(proposal->event.limb);
    seek(proposal->event.frame);
  }
  showReview();
  showTracks();
  fetchCrops();
}

bool MainWindow::stepProposal(int direction) {
  const auto next =
      ui::stepProposal(doc_.project().proposals, order_, current_, playhead_, direction);
  if (!next) {
    statusBar()->showMessage(doc_.project().proposals.events.empty()
                                 ? tr("No proposals to review.")
                                 : (direction > 0 ? tr("No proposal after this one.")
                                                  : tr("No proposal before this one.")),
                             6000);
    return false;
  }
  setCurrentProposal(next);
  return true;
}

// After an accept or reject the next proposal in review order follows at once.
void MainWindow::afterReviewStep(const std::optional<model::ProposedEvent>& from) {
  const auto next = ui::stepProposal(doc_.project().proposals, order_, from, playhead_, 1);
  if (next) {
    setCurrentProposal(next);
    return;
  }
  setCurrentProposal(std::nullopt);
  statusBar()->showMessage(doc_.project().proposals.events.empty()
                               ? tr("Every proposal is reviewed.")
                               : tr("No proposal after this one; %1 goes back.")
                                     .arg(action(ActionId::previousProposal)
                                              ->shortcut()
                                              .toString(QKeySequence::NativeText)),
                           8000);
}

bool MainWindow::acceptCurrentProposal() {
  if (!current_ || !doc_.findProposal(current_->event)) {
    statusBar()->showMessage(
        tr("No proposal under review: %1 goes to the next one.")
            .arg(action(ActionId::nextProposal)->shortcut().toString(QKeySequence::NativeText)),
        6000);
    return false;
  }
  const auto from = current_;
  switch (doc_.acceptProposal(current_->event)) {
    case ProjectDocument::AcceptOutcome::accepted:
      afterReviewStep(from);
      return true;
    case ProjectDocument::AcceptOutcome::tagOnFrame:
      statusBar()->showMessage(
          tr("%1 has a tag on frame %2 already: reject the proposal or nudge it.")
              .arg(QString::fromStdString(doc_.annotation().limbs.label(from->event.limb)))
              .arg(from->event.frame),
          8000);
      return false;
    case ProjectDocument::AcceptOutcome::missing:
      return false;
  }
  return false;
}

bool MainWindow::rejectCurrentProposal() {
  const auto from = current_;
  if (!from || !doc_.rejectProposal(from->event)) return false;
  afterReviewStep(from);
  return true;
}

bool MainWindow::nudgeCurrentProposal(std::int64_t delta) {
  if (!current_) return false;
  auto now = *current_;
  const auto moved = doc_.nudgeProposal(now.event, delta);
  if (!moved) return false;
  now.event = *moved;
  setCurrentProposal(now);
  return true;
}

int MainWindow::acceptProposalsAbove(double minConfidence) {
  const auto from = current_;
  const int n = doc_.acceptProposalsFrom(minConfidence);
  statusBar()->showMessage(
      tr("%1 proposals at confidence %2 or more are tags now (one undo step); %3 left to review.")
          .arg(n)
          .arg(minConfidence, 0, 'f', 2)
          .arg(doc_.project().proposals.events.size()),
      10000);
  if (n > 0 && from && !doc_.findProposal(from->event)) afterReviewStep(from);
  return n;
}

void MainWindow::acceptAboveDialog() {
  const auto& proposals = doc_.project().proposals.events;
  if (proposals.empty()) {
    statusBar()->showMessage(tr("No proposals to review."), 6000);
    return;
  }
  QSettings settings;
  const double last = settings.value(QStringLiteral("review/acceptAbove"), 0.8).toDouble();
  AcceptProposalsDialog dialog(
      last, static_cast<int>(proposals.size()),
      [this](double c) { return static_cast<int>(doc_.acceptableFrom(c).size()); }, this);
  if (dialog.exec() != QDialog::Accepted) return;
  settings.setValue(QStringLiteral("review/acceptAbove"), dialog.threshold());
  acceptProposalsAbove(dialog.threshold());
}

void MainWindow::showReview() {
  if (!current_) {
    viewer_->setReviewStrip({});
    return;
  }
  statusBar()->showMessage(reviewText());
}

void MainWindow::showTracks() {
  std::vector<ViewerTrack> marks;
  const auto& limbs = doc_.annotation().limbs;
  for (const auto& t : tracks_) {
    if (t.limb < 0 || t.limb >= limbs.size()) continue;
    ViewerTrack mark;
    mark.label = QString::fromStdString(limbs.label(t.limb));
    mark.colour = figures::limbColour(t.limb);
    mark.first = t.first;
    mark.emphasised = current_ && current_->event.limb == t.limb;
    mark.points.reserve(t.points.size());
    for (const auto& p : t.points)
      mark.points.push_back(p.visible ? std::optional(QPointF(p.x, p.y)) : std::nullopt);
    marks.push_back(std::move(mark));
  }
  viewer_->setTracks(std::move(marks));
}

void MainWindow::attachCropReader() {
  crops_.reset();
  if (!video_) return;
  crops_ = std::make_unique<FrameCrops>(video_->path(), video_->index());
  connect(crops_.get(), &FrameCrops::ready, this, &MainWindow::onCrops);
}

void MainWindow::fetchCrops() {
  if (!current_) return;
  const auto& e = current_->event;
  ReviewStrip strip;
  strip.title =
      tr("%1 %2 %3, confidence %4")
          .arg(QString::fromStdString(doc_.annotation().limbs.label(e.limb)), eventText(e.kind))
          .arg(e.frame)
          .arg(current_->confidence, 0, 'f', 2);
  std::vector<CropRequest> requests;
  const QSizeF size = video_ ? QSizeF(video_->info().width, video_->info().height) : QSizeF();
  for (auto f = e.frame - kStripFrames; f <= e.frame + kStripFrames; ++f) {
    if (f < 0 || f >= frameCount()) continue;
    if (f == e.frame) strip.centre = static_cast<int>(requests.size());
    const auto at = footAt(tracks_, e.limb, f);
    requests.push_back({f, at.value_or(QPointF(size.width() / 2, size.height() / 2))});
    strip.captions.push_back(f == e.frame ? QString::number(f)
                                          : QStringLiteral("%1%2")
                                                .arg(f > e.frame ? QStringLiteral("+") : QString())
                                                .arg(f - e.frame));
  }
  strip.crops.resize(requests.size());
  viewer_->setReviewStrip(strip);
  if (!crops_ || requests.empty()) return;
  // A square a fifth of the picture's short side: the foot and what it stands on.
  const int side = std::max(48, static_cast<int>(std::min(size.width(), size.height()) / 5));
  crops_->fetch(++cropTicket_, std::move(requests), side);
}

void MainWindow::onCrops(quint64 ticket, const std::vector<QImage>& crops) {
  if (ticket != cropTicket_ || !current_) return;
  ReviewStrip strip = viewer_->reviewStrip();
  if (strip.crops.size() != crops.size()) return;
  strip.crops = crops;
  viewer_->setReviewStrip(std::move(strip));
}

}  // namespace stridemark::ui
