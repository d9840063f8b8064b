#pragma once
// The Viewer: shows the current frame scaled to fit, with wheel zoom and drag pan, and always
// shows the frame number and the time at the capture rate. At fit size it asks for frames
// converted to its own pixel size (displayPixels), which it then draws without scaling: on a
// 1080p clip that is cheaper than converting the full frame and scaling it in every paint.
//
// Over the picture (issue 18 item 3): foot seeds on their frame, each foot's track over nearby
// frames, and for the proposal under review a strip of crops of the frames around it. These
// are given in pixels of the upright video frame; videoPixelAt() maps back from the widget
// through zoom, pan and the letterbox margins.

#include <QColor>
#include <QImage>
#include <QWidget>
#include <cstdint>
#include <optional>
#include <vector>

#include "common/rational.h"

class QPainter;

namespace stridemark::ui {

struct ViewerSeed {
  std::int64_t frame = 0;
  QPointF at;  // video pixels
  QString label;
  QColor colour;
};

struct ViewerTrack {
  QString label;
  QColor colour;
  std::int64_t first = 0;                      // frame of points[0]
  std::vector<std::optional<QPointF>> points;  // one per frame; empty where not visible
  bool emphasised = false;                     // the foot of the proposal under review
};

// Small pictures of the frames around a proposal, left to right, one of them the proposal's.
struct ReviewStrip {
  std::vector<QImage> crops;      // a null image: not read yet
  std::vector<QString> captions;  // one per crop ("-1", "132", "+1")
  int centre = 0;                 // index of the proposal's frame
  QString title;                  // "RF touchdown 132, confidence 0.83"
};

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

  void setSeeds(std::vector<ViewerSeed> seeds);
  const std::vector<ViewerSeed>& seeds() const { return seeds_; }
  void setTracks(std::vector<ViewerTrack> tracks);
  const std::vector<ViewerTrack>& tracks() const { return tracks_; }
  void setReviewStrip(ReviewStrip strip);  // no crops: none shown
  const ReviewStrip& reviewStrip() const { return strip_; }
  // Seeding: a click (not a drag) reports the video pixel under it; the cursor is a cross.
  void setSeeding(bool on);
  bool seeding() const { return seeding_; }
  // The point of the upright video frame under `widgetPos`, or nothing outside the picture.
  std::optional<QPointF> videoPixelAt(QPointF widgetPos) const;
  QPointF widgetPointOf(QPointF videoPixel) const;

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
  void seedClicked(QPointF videoPixel);        // left click while seeding
  void seedRemoveClicked(QPointF videoPixel);  // right click while seeding

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
  QRectF pictureRect() const;  // where the frame is drawn (also before a picture arrives)
  void paintSeeds(QPainter& p) const;
  void paintTracks(QPainter& p) const;
  void paintReviewStrip(QPainter& p) const;

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
  std::vector<ViewerSeed> seeds_;
  std::vector<ViewerTrack> tracks_;
  ReviewStrip strip_;
  bool seeding_ = false;
  QPoint pressAt_;
};

}  // namespace stridemark::ui
