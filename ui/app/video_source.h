#pragma once
// The Viewer's link to core/video. Opening builds (or loads) the frame index; frames come from
// a FrameServer whose worker thread decodes; the UI thread only converts the finished frame to
// RGBA (about a memcpy, VIDEO-NOTES §0.9) and paints it. Requests never block the UI thread.
#include <QImage>
#include <QObject>
#include <QString>
#include <cstdint>
#include <memory>

#include "model/annotation.h"
#include "video/convert.h"
#include "video/frame_server.h"
#include "video/video_info.h"

namespace stridemark::ui {

class VideoSource : public QObject {
  Q_OBJECT
 public:
  // Throws stridemark::Error naming the file when it cannot be opened or has no video.
  explicit VideoSource(const QString& path, QObject* parent = nullptr);
  ~VideoSource() override;

  const video::VideoInfo& info() const { return info_; }
  QString path() const { return path_; }
  std::int64_t frameCount() const { return info_.frameCount; }
  // "size-headhash-tailhash": lets a moved video be recognised again.
  std::string signatureText() const;
  model::VideoLink link() const;

  // Non-blocking: frameReady() follows on the UI thread (at once when the frame is cached).
  void request(std::int64_t frame);
  // Blocking exact read (export and tests). Throws stridemark::Error.
  QImage frameNow(std::int64_t frame);
  video::FrameServerStats stats() const { return server_->stats(); }

  static std::string signatureText(const video::VideoSignature& s);

 signals:
  void frameReady(qint64 frame, const QImage& image);
  void frameFailed(qint64 frame, const QString& message);

 private:
  QImage toImage(const video::DecodedFrame& frame);
  void deliver(std::int64_t n, std::shared_ptr<const video::DecodedFrame> frame,
               std::exception_ptr error);

  QString path_;
  std::shared_ptr<const video::FrameIndex> index_;
  video::VideoInfo info_;
  std::unique_ptr<video::FrameServer> server_;
  video::FrameConverter converter_;  // UI thread only
  std::int64_t wanted_ = -1;         // newest request; older answers are dropped
};

}  // namespace stridemark::ui
