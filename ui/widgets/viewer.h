#pragma once
// The Viewer: shows the current frame scaled to fit, with wheel zoom and drag pan, and always
// shows the frame number and the time at the capture rate. At fit size it asks for frames
// converted to its own pixel size (displayPixels), which it then draws without scaling: on a
// 1080p clip that is cheaper than converting the full frame and scaling it in every paint.
#include <QImage>
#include <QWidget>
#include <cstdint>

#include "common/rational.h"

namespace stridemark::ui {

class Viewer : public QWidget {
  Q_OBJECT
 public:
  explicit Viewer(QWidget* parent = nullptr);

  void setFrame(std::int64_t frame, const QImage& image);
  void setPendingFrame(std::int64_t frame);  // playhead moved; picture still on its way
  void setCaptureRate(Rational rate);
  void setFrameCount(std::int64_t count);
  void setPlaceholder(const QString& text);
  void setSourceSize(QSize size);  // the video's frame size (pictures may arrive smaller)
  void resetView();                // back to fit-to-window

  std::int64_t shownFrame() const { return shownFrame_; }
  std::int64_t playheadFrame() const { return playhead_; }
  double zoom() const { return zoom_; }
  // The size, in device pixels, that pictures should have: the fitted frame at zoom 1, the
  // source size when zoomed in. Empty before a source size is known.
  QSize displayPixels() const;
  // Counts paints that put a frame on screen (benchmarks measure press -> paint).
  std::uint64_t paintedFrames() const { return painted_; }

 signals:
  void framePainted(qint64 frame);
  void displayPixelsChanged(QSize pixels, qreal devicePixelRatio);

 protected:
  void paintEvent(QPaintEvent* event) override;
  void resizeEvent(QResizeEvent* event) override;
  void wheelEvent(QWheelEvent* event) override;
  void mousePressEvent(QMouseEvent* event) override;
  void mouseMoveEvent(QMouseEvent* event) override;
  void mouseReleaseEvent(QMouseEvent* event) override;
  void mouseDoubleClickEvent(QMouseEvent* event) override;

 private:
  QRectF imageRect() const;
  QSizeF fittedSize() const;  // frame fitted to the widget, snapped to whole device pixels
  void announceDisplayPixels();
  QString statusText() const;

  QImage image_;
  QSize sourceSize_;
  QSize announced_;
  std::int64_t shownFrame_ = -1;
  std::int64_t playhead_ = 0;
  std::int64_t frameCount_ = 0;
  Rational rate_{240, 1};
  QString placeholder_;
  double zoom_ = 1.0;  // 1 = fit to window
  QPointF pan_;        // offset of the image centre, in widget pixels
  QPoint dragStart_;
  QPointF panAtDrag_;
  bool dragging_ = false;
  std::uint64_t painted_ = 0;
};

}  // namespace stridemark::ui
