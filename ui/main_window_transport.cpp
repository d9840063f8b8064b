// Transport: the playhead, stepping, playing forwards and backwards at a fraction of the
// capture rate, jumping between events, and Go to.
#include <QInputDialog>
#include <QLineEdit>
#include <QSettings>
#include <algorithm>
#include <array>

#include "ui/main_window.h"
#include "ui/session/guarded.h"
#include "ui/widgets/footfall_lanes.h"
#include "ui/widgets/viewer.h"

namespace stridemark::ui {

namespace {

// Playback speeds as fractions of real time at the capture rate.
constexpr std::array<double, 6> kSpeeds{1.0 / 32, 1.0 / 16, 1.0 / 8, 1.0 / 4, 1.0 / 2, 1.0};

}  // namespace

std::int64_t MainWindow::frameCount() const {
  if (video_) return video_->frameCount();
  const auto& clip = doc_.annotation().clip;
  if (clip) return clip->last + 1;
  const auto& events = doc_.annotation().events;
  std::int64_t last = 0;
  for (const auto& e : events) last = std::max(last, e.frame);
  return last + 1;
}

void MainWindow::seek(std::int64_t frame) {
  frame = std::clamp<std::int64_t>(frame, 0, std::max<std::int64_t>(0, frameCount() - 1));
  if (frame == playhead_) return;
  playhead_ = frame;
  viewer_->setPendingFrame(frame);
  lanes_->setPlayhead(frame);
  if (video_) video_->request(frame);
  updateTagKeyHints();
  updateStatus();
}

void MainWindow::onFrame(qint64 frame, const QImage& image) {
  viewer_->setFrame(frame, image);
}

void MainWindow::stepBy(std::int64_t delta) {
  stopPlayback();
  seek(playhead_ + delta);
}

void MainWindow::jumpToEvent(int direction) {
  const auto events = doc_.annotation().eventsOf(selectedLimb_);
  if (direction > 0) {
    for (const auto& e : events)
      if (e.frame > playhead_) return seek(e.frame);
  } else {
    for (auto it = events.rbegin(); it != events.rend(); ++it)
      if (it->frame < playhead_) return seek(it->frame);
  }
}

// The same key starts and pauses playing in its direction.
void MainWindow::togglePlayback(int direction) {
  playDirection_ == direction ? stopPlayback() : startPlayback(direction);
}

void MainWindow::startPlayback(int direction) {
  playDirection_ = direction;
  playOrigin_ = playhead_;
  playClock_.start();
  playTimer_.start();
  updateStatus();
}

void MainWindow::stopPlayback() {
  if (playDirection_ == 0) return;
  playDirection_ = 0;
  playTimer_.stop();
  updateStatus();
}

void MainWindow::playTick() {
  const double fps = doc_.annotation().captureRate.toDouble();
  const double frames =
      playClock_.elapsed() / 1000.0 * fps * kSpeeds[static_cast<std::size_t>(speedIndex_)];
  const auto target = playOrigin_ + playDirection_ * static_cast<std::int64_t>(frames);
  seek(target);
  if (target <= 0 || target >= frameCount() - 1) stopPlayback();
}

void MainWindow::changeSpeed(int direction) {
  speedIndex_ = std::clamp(speedIndex_ + direction, 0, static_cast<int>(kSpeeds.size()) - 1);
  if (playDirection_ != 0) startPlayback(playDirection_);  // restart the clock at the new speed
  updateStatus();
}

QString MainWindow::speedText() const {
  const double speed = kSpeeds[static_cast<std::size_t>(speedIndex_)];
  return speed >= 1.0 ? QStringLiteral("1×") : QStringLiteral("1/%1×").arg(qRound(1.0 / speed));
}

void MainWindow::goToDialog() {
  bool ok = false;
  const QString text = QInputDialog::getText(
      this, tr("Go to"), tr("Frame number, or time in seconds ending in 's' (e.g. 1.25s):"),
      QLineEdit::Normal, QString::number(playhead_), &ok);
  if (!ok) return;
  const QString t = text.trimmed();
  if (t.endsWith(QLatin1Char('s'))) {
    const double seconds = t.chopped(1).toDouble(&ok);
    if (ok) seek(secondsToFrame(seconds, doc_.annotation().captureRate));
  } else {
    const auto frame = t.toLongLong(&ok);
    if (ok) seek(frame);
  }
  if (!ok)
    reportError(this, tr("Go to"),
                tr("'%1' is neither a frame number nor a time like 1.25s.").arg(t));
}

void MainWindow::bigStepDialog() {
  bool ok = false;
  const int n = QInputDialog::getInt(this, tr("Big step"), tr("Frames per Shift+arrow step:"),
                                     static_cast<int>(bigStep_), 2, 10000, 1, &ok);
  if (!ok) return;
  bigStep_ = n;
  QSettings().setValue(QStringLiteral("bigStep"), n);
}

}  // namespace stridemark::ui
