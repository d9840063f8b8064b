#include "ui/widgets/viewer.h"

#include <QMouseEvent>
#include <QPainter>
#include <QRegion>
#include <QResizeEvent>
#include <QWheelEvent>
#include <algorithm>
#include <cmath>

namespace stridemark::ui {

namespace {
constexpr int kClickSlop = 4;              // pixels a click may move and still be a click
constexpr std::int64_t kTrackFrames = 12;  // frames of track drawn each side of the shown one
}  // namespace

Viewer::Viewer(QWidget* parent) : QWidget(parent) {
  setAccessibleName(tr("Viewer"));
  setAccessibleDescription(tr("Current video frame. Wheel zooms, drag pans, double-click fits."));
  setMinimumSize(320, 200);
  setFocusPolicy(Qt::ClickFocus);
  setAttribute(Qt::WA_OpaquePaintEvent);
  setPlaceholder(tr("Open a video or project (Ctrl+O), or drop a file here."));
}

void Viewer::setFrame(std::int64_t frame, const QImage& image) {
  image_ = image;
  shownFrame_ = frame;
  update();
}

void Viewer::setPendingFrame(std::int64_t frame) {
  playhead_ = frame;
  update();
}

void Viewer::setCaptureRate(Rational rate) {
  rate_ = rate;
  update();
}

void Viewer::setFrameCount(std::int64_t count) {
  frameCount_ = count;
  update();
}

void Viewer::setPlaceholder(const QString& text) {
  placeholder_ = text;
  update();
}

void Viewer::setSourceSize(QSize size) {
  sourceSize_ = size;
  announceDisplayPixels();
  update();
}

void Viewer::resetView() {
  zoom_ = 1.0;
  pan_ = {};
  announceDisplayPixels();
  update();
}

QSizeF Viewer::fittedSize() const {
  const QSize base = sourceSize_.isValid() ? sourceSize_ : image_.size();
  if (base.isEmpty()) return {};
  const qreal dpr = devicePixelRatioF();
  const QSizeF fit = QSizeF(base).scaled(QSizeF(size()) * dpr, Qt::KeepAspectRatio);
  // Whole, even device pixels (4:2:0 pictures).
  const int w = static_cast<int>(fit.width()) / 2 * 2;
  const int h = static_cast<int>(fit.height()) / 2 * 2;
  return QSizeF(std::max(w, 2), std::max(h, 2)) / dpr;
}

QSize Viewer::displayPixels() const {
  if (!sourceSize_.isValid()) return {};
  if (zoom_ != 1.0) return sourceSize_;
  // A frame smaller than the view comes at full size and is scaled up when painted.
  const QSize fit = (fittedSize() * devicePixelRatioF()).toSize();
  return fit.width() < sourceSize_.width() ? fit : sourceSize_;
}

void Viewer::announceDisplayPixels() {
  const QSize pixels = displayPixels();
  if (pixels == announced_) return;
  announced_ = pixels;
  emit displayPixelsChanged(pixels, devicePixelRatioF());
}

void Viewer::resizeEvent(QResizeEvent* event) {
  QWidget::resizeEvent(event);
  announceDisplayPixels();
}

QRectF Viewer::imageRect() const {
  if (image_.isNull()) return {};
  return pictureRect();
}

QRectF Viewer::pictureRect() const {
  const QSizeF scaled = fittedSize() * zoom_;
  QPointF topLeft = QPointF(width() / 2.0, height() / 2.0) + pan_ -
                    QPointF(scaled.width() / 2, scaled.height() / 2);
  // On whole device pixels, so a picture made at this size is copied, not resampled.
  const qreal dpr = devicePixelRatioF();
  topLeft = QPointF(std::round(topLeft.x() * dpr), std::round(topLeft.y() * dpr)) / dpr;
  return {topLeft, scaled};
}

QString Viewer::statusText() const {
  const double seconds = framesToSeconds(playhead_, rate_);
  QString text = tr("frame %1").arg(playhead_);
  if (frameCount_ > 0) text += tr(" / %1").arg(frameCount_ - 1);
  text += tr("   %1 s @ %2 fps capture")
              .arg(seconds, 0, 'f', 4)
              .arg(QString::fromStdString(toString(rate_)));
  if (shownFrame_ >= 0 && shownFrame_ != playhead_) text += tr("   (decoding…)");
  return text;
}

void Viewer::paintEvent(QPaintEvent*) {
  QPainter p(this);
  const QColor backdrop(0x10, 0x10, 0x10);
  if (image_.isNull() || zoom_ != 1.0) {
    p.fillRect(rect(), backdrop);
  } else {
    // Only the margins around the fitted frame: the frame covers the rest.
    const QRegion margins = QRegion(rect()) - imageRect().toAlignedRect().adjusted(1, 1, -1, -1);
    for (const QRect& r : margins) p.fillRect(r, backdrop);
  }
  if (image_.isNull()) {
    p.setPen(QColor(0xcc, 0xcc, 0xcc));
    p.drawText(rect().adjusted(20, 20, -20, -40), Qt::AlignCenter | Qt::TextWordWrap, placeholder_);
  } else {
    const QRectF target = imageRect();
    const QSizeF logical = QSizeF(image_.size()) / image_.devicePixelRatio();
    if (std::abs(logical.width() - target.width()) < 0.01 &&
        std::abs(logical.height() - target.height()) < 0.01) {
      p.drawImage(target.topLeft(), image_);  // made for this size: a plain copy
    } else {
      p.setRenderHint(QPainter::SmoothPixmapTransform, zoom_ < 2.0);
      p.drawImage(target, image_);
    }
  }
  // Frame number and time at the capture rate: always visible, on a solid band.
  QFont f = font();
  f.setPixelSize(14);
  f.setBold(true);
  p.setFont(f);
  const QString text = statusText();
  const QRect band(0, height() - 26, width(), 26);
  p.fillRect(band, QColor(0, 0, 0, 190));
  p.setPen(Qt::white);
  p.drawText(band.adjusted(8, 0, -8, 0), Qt::AlignVCenter | Qt::AlignLeft, text);
  if (zoom_ != 1.0)
    p.drawText(band.adjusted(8, 0, -8, 0), Qt::AlignVCenter | Qt::AlignRight,
               tr("zoom %1×").arg(zoom_, 0, 'f', 1));
  if (!image_.isNull()) {
    paintTracks(p);
    paintSeeds(p);
    paintReviewStrip(p);
    ++painted_;
    emit framePainted(shownFrame_);
  }
}

void Viewer::wheelEvent(QWheelEvent* event) {
  if (image_.isNull()) return;
  const double steps = event->angleDelta().y() / 120.0;
  const double newZoom = std::clamp(zoom_ * std::pow(1.25, steps), 1.0, 32.0);
  // Keep the point under the cursor still while zooming.
  const QPointF centre(width() / 2.0, height() / 2.0);
  const QPointF cursor = event->position();
  const QPointF rel = cursor - centre - pan_;
  pan_ = cursor - centre - rel * (newZoom / zoom_);
  zoom_ = newZoom;
  if (zoom_ == 1.0) pan_ = {};
  announceDisplayPixels();
  update();
  event->accept();
}

void Viewer::mousePressEvent(QMouseEvent* event) {
  if (seeding_ && event->button() == Qt::RightButton) {
    if (const auto at = videoPixelAt(event->position())) emit seedRemoveClicked(*at);
    return;
  }
  if (event->button() != Qt::LeftButton) return;
  pressAt_ = event->position().toPoint();
  dragging_ = true;
  dragStart_ = event->position().toPoint();
  panAtDrag_ = pan_;
  setCursor(Qt::ClosedHandCursor);
}

void Viewer::mouseMoveEvent(QMouseEvent* event) {
  if (!dragging_) return;
  pan_ = panAtDrag_ + QPointF(event->position().toPoint() - dragStart_);
  update();
}

void Viewer::mouseReleaseEvent(QMouseEvent* event) {
  const bool wasDragging = dragging_;
  dragging_ = false;
  if (!seeding_) {
    unsetCursor();
    return;
  }
  setCursor(Qt::CrossCursor);
  // A click places a seed; a drag only pans (and is put back where the press was).
  if (!wasDragging || event->button() != Qt::LeftButton) return;
  if ((event->position().toPoint() - pressAt_).manhattanLength() > kClickSlop) return;
  pan_ = panAtDrag_;
  if (const auto at = videoPixelAt(event->position())) emit seedClicked(*at);
}

void Viewer::mouseDoubleClickEvent(QMouseEvent*) {
  resetView();
}

}  // namespace stridemark::ui

namespace stridemark::ui {

void Viewer::setSeeds(std::vector<ViewerSeed> seeds) {
  seeds_ = std::move(seeds);
  update();
}

void Viewer::setTracks(std::vector<ViewerTrack> tracks) {
  tracks_ = std::move(tracks);
  update();
}

void Viewer::setReviewStrip(ReviewStrip strip) {
  strip_ = std::move(strip);
  update();
}

void Viewer::setSeeding(bool on) {
  seeding_ = on;
  if (on) {
    setCursor(Qt::CrossCursor);
  } else {
    unsetCursor();
  }
}

std::optional<QPointF> Viewer::videoPixelAt(QPointF widgetPos) const {
  const QRectF r = pictureRect();
  if (!sourceSize_.isValid() || r.isEmpty() || !r.contains(widgetPos)) return std::nullopt;
  return QPointF((widgetPos.x() - r.left()) * sourceSize_.width() / r.width(),
                 (widgetPos.y() - r.top()) * sourceSize_.height() / r.height());
}

QPointF Viewer::widgetPointOf(QPointF videoPixel) const {
  const QRectF r = pictureRect();
  if (!sourceSize_.isValid() || r.isEmpty()) return {};
  return {r.left() + videoPixel.x() * r.width() / sourceSize_.width(),
          r.top() + videoPixel.y() * r.height() / sourceSize_.height()};
}

void Viewer::paintSeeds(QPainter& p) const {
  QFont f = font();
  f.setPixelSize(11);
  f.setBold(true);
  p.setFont(f);
  p.setRenderHint(QPainter::Antialiasing, true);
  for (const auto& seed : seeds_) {
    if (seed.frame != shownFrame_) continue;
    const QPointF c = widgetPointOf(seed.at);
    // A small ring with a dark edge (visible on light and dark fur) and the limb's label.
    p.setBrush(Qt::NoBrush);
    p.setPen(QPen(QColor(0, 0, 0, 200), 3.5));
    p.drawEllipse(c, 6, 6);
    p.setPen(QPen(seed.colour, 2));
    p.drawEllipse(c, 6, 6);
    p.drawLine(c - QPointF(2, 0), c + QPointF(2, 0));
    const QRectF label(c + QPointF(8, -18),
                       QSizeF(p.fontMetrics().horizontalAdvance(seed.label) + 8, 14));
    p.fillRect(label, QColor(0, 0, 0, 170));
    p.setPen(seed.colour);
    p.drawText(label, Qt::AlignCenter, seed.label);
  }
}

void Viewer::paintTracks(QPainter& p) const {
  p.setRenderHint(QPainter::Antialiasing, true);
  for (const auto& track : tracks_) {
    const auto at = [&](std::int64_t frame) -> std::optional<QPointF> {
      const auto i = frame - track.first;
      if (i < 0 || i >= static_cast<std::int64_t>(track.points.size())) return std::nullopt;
      return track.points[static_cast<std::size_t>(i)];
    };
    QColor colour = track.colour;
    colour.setAlphaF(track.emphasised ? 0.95 : 0.6);
    // Visible points only: the line breaks where the foot was covered or lost.
    std::optional<QPointF> previous;
    for (auto f = shownFrame_ - kTrackFrames; f <= shownFrame_ + kTrackFrames; ++f) {
      const auto point = at(f);
      if (point && previous) {
        p.setPen(QPen(colour, track.emphasised ? 2 : 1.2));
        p.drawLine(widgetPointOf(*previous), widgetPointOf(*point));
      }
      if (point) {
        p.setPen(Qt::NoPen);
        p.setBrush(colour);
        p.drawEllipse(widgetPointOf(*point), 1.6, 1.6);
      }
      previous = point;
    }
    if (const auto now = at(shownFrame_)) {
      p.setBrush(Qt::NoBrush);
      p.setPen(QPen(track.colour, track.emphasised ? 2 : 1.2));
      p.drawRect(QRectF(widgetPointOf(*now) - QPointF(4, 4), QSizeF(8, 8)));
    }
  }
}

void Viewer::paintReviewStrip(QPainter& p) const {
  if (strip_.crops.empty()) return;
  const int n = static_cast<int>(strip_.crops.size());
  // Tiles take at most about a third of the Viewer's height: the picture stays in view.
  const double side =
      std::clamp(std::min((width() - 16.0 - (n - 1) * 4.0) / n, height() * 0.3), 36.0, 110.0);
  QFont f = font();
  f.setPixelSize(11);
  p.setFont(f);
  const QFontMetrics fm(f);
  const double captionHeight = fm.height() + 2;
  const QRectF band(4, 4, n * side + (n - 1) * 4 + 8, side + 2 * captionHeight + 10);
  p.fillRect(band, QColor(0, 0, 0, 200));
  p.setPen(Qt::white);
  p.drawText(QRectF(band.left() + 4, band.top() + 2, band.width() - 8, captionHeight),
             Qt::AlignLeft | Qt::AlignVCenter, strip_.title);
  for (int i = 0; i < n; ++i) {
    const QRectF tile(band.left() + 4 + i * (side + 4), band.top() + captionHeight + 4, side, side);
    const QImage& crop = strip_.crops[static_cast<std::size_t>(i)];
    if (crop.isNull()) {
      p.fillRect(tile, QColor(0x30, 0x30, 0x30));
    } else {
      p.setRenderHint(QPainter::SmoothPixmapTransform, true);
      p.drawImage(tile, crop);
    }
    const bool centre = i == strip_.centre;
    p.setBrush(Qt::NoBrush);
    p.setPen(QPen(centre ? QColor(0x56, 0xb4, 0xe9) : QColor(0x90, 0x90, 0x90), centre ? 3 : 1));
    p.drawRect(tile);
    // A cross at the tracked foot: the centre of each crop.
    p.setPen(QPen(QColor(255, 255, 255, 150), 1));
    p.drawLine(tile.center() - QPointF(5, 0), tile.center() + QPointF(5, 0));
    p.drawLine(tile.center() - QPointF(0, 5), tile.center() + QPointF(0, 5));
    p.setPen(centre ? QColor(0x56, 0xb4, 0xe9) : Qt::white);
    const auto caption = static_cast<std::size_t>(i) < strip_.captions.size()
                             ? strip_.captions[static_cast<std::size_t>(i)]
                             : QString();
    p.drawText(QRectF(tile.left(), tile.bottom() + 2, side, captionHeight), Qt::AlignCenter,
               caption);
  }
}

}  // namespace stridemark::ui
