#include "ui/widgets/viewer.h"

#include <QMouseEvent>
#include <QPainter>
#include <QRegion>
#include <QResizeEvent>
#include <QWheelEvent>
#include <algorithm>
#include <cmath>

namespace stridemark::ui {

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
  if (event->button() != Qt::LeftButton) return;
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

void Viewer::mouseReleaseEvent(QMouseEvent*) {
  dragging_ = false;
  unsetCursor();
}

void Viewer::mouseDoubleClickEvent(QMouseEvent*) {
  resetView();
}

}  // namespace stridemark::ui
