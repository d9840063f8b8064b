#pragma once
// The Viewer's link to core/video. Opening builds (or loads) the frame index; frames come from
// a FrameServer whose worker thread decodes; the UI thread only converts the finished frame to
// RGBA (about a memcpy, VIDEO-NOTES §0.9) and paints it. Requests never block the UI thread.
// Long-GOP clips: when backward stepping would stall, an all-intra stepping proxy is built in the
// background (ProxyBuilder) and, once verified, serves the display with the same frame numbers;
// frameNow() (export) always reads the source.
#include <QImage>
#include <QObject>
#include <QString>
#include <array>
#include <cstdint>
#include <memory>

#include "model/annotation.h"
#include "video/convert.h"
#include "video/frame_server.h"
#include "video/video_info.h"

namespace stridemark::ui {

class ProxyBuilder;

struct VideoSourceOptions {
  std::size_t budgetBytes = video::FrameServerOptions{}.budgetBytes;  // frame cache budget
  QString proxyDir;  // where stepping proxies go; empty: the user's cache folder
};

class VideoSource : public QObject {
  Q_OBJECT
 public:
  // Throws stridemark::Error naming the file when it cannot be opened or has no video.
  explicit VideoSource(const QString& path, const VideoSourceOptions& options = {},
                       QObject* parent = nullptr);
  ~VideoSource() override;

  const video::VideoInfo& info() const { return info_; }
  // The frame index, for readers of their own (the review strip's crops).
  std::shared_ptr<const video::FrameIndex> index() const { return index_; }
  QString path() const { return path_; }
  std::int64_t frameCount() const { return info_.frameCount; }
  // "size-headhash-tailhash": lets a moved video be recognised again.
  std::string signatureText() const;
  model::VideoLink link() const;

  // Non-blocking: frameReady() follows on the UI thread (at once when the frame is cached).
  void request(std::int64_t frame);
  // Blocking exact read at full size and exact conversion (export and tests). Throws
  // stridemark::Error.
  QImage frameNow(std::int64_t frame);
  // Pictures for frameReady() are made at this size (device pixels; the Viewer's fitted frame)
  // when it is smaller than the frame, else at full size. Re-sends the current frame.
  void setDisplaySize(QSize pixels, qreal devicePixelRatio);
  // The display server's statistics (the proxy's once it is in use).
  video::FrameServerStats stats() const { return display().stats(); }
  // Requests answered with a picture made ahead (see prepareAhead), and the frame whose picture
  // is ready now (-1: none). For tests and the stepping benchmark.
  std::int64_t preparedShown() const { return preparedShown_; }
  std::int64_t preparedFrame() const { return prepared_.frame; }

  // The frame cache budget (bytes) of the display, applied at once: the source's and the
  // proxy's servers grow or shrink their caches. proxyAdvised() follows it.
  void setBudget(std::size_t bytes);
  std::size_t budget() const { return options_.budgetBytes; }

  // --- stepping proxy ---
  // True when backward steps would stall at this cache budget (long keyframe intervals).
  bool proxyAdvised() const;
  // Starts the proxy when advised: reuses a verified one at once (proxyReady) or builds it in
  // the background (proxyProgress ... then proxyReady or proxyFailed). False: not advised.
  bool startProxyIfAdvised();
  void cancelProxy();
  bool proxyBuilding() const;
  bool hasProxy() const { return proxyServer_ != nullptr; }
  // Display from the proxy when there is one (default) or from the source.
  void setStepOnProxy(bool on);
  bool stepOnProxy() const { return stepOnProxy_; }
  bool displayingProxy() const { return stepOnProxy_ && proxyServer_; }
  QString proxyPath() const;

 signals:
  void frameReady(qint64 frame, const QImage& image);
  void frameFailed(qint64 frame, const QString& message);
  void proxyProgress(double fraction);
  void proxyReady();
  void proxyFailed(const QString& message);

 private:
  video::FrameServer& display() const;
  void useProxy(std::shared_ptr<const video::FrameIndex> proxyIndex);
  void switchDisplay(bool proxy);
  std::size_t sourceBudget(bool proxyDisplayed) const;
  QImage toDisplayImage(const video::DecodedFrame& frame);  // with the converter of its server
  QImage& recycledImage(QSize size);  // a slot nobody else holds, of this size
  void deliver(std::int64_t n, std::shared_ptr<const video::DecodedFrame> frame,
               std::exception_ptr error);
  // Display pictures are made ahead in the direction of travel: after frame n is shown, the
  // picture of n + (n - previous) is converted while the user looks at n, if that frame is
  // decoded already, so the next step only paints. Holding a step key shows frames at the
  // speed of painting instead of painting plus converting.
  void prepareAhead();
  void showPrepared();
  void dropPrepared() { prepared_ = {}; }
  void noteShown(std::int64_t frame);  // queues prepareAhead() behind the paint
  bool event(QEvent* event) override;

  QString path_;
  std::shared_ptr<const video::FrameIndex> index_;
  video::VideoInfo info_;
  VideoSourceOptions options_;
  std::unique_ptr<video::FrameServer> server_;       // the source: export and frameNow()
  std::unique_ptr<video::FrameServer> proxyServer_;  // all-intra proxy, display only
  std::unique_ptr<ProxyBuilder> builder_;
  bool stepOnProxy_ = true;
  // UI thread only. One per server: swscale's cached context mixes up the colour range when a
  // converter alternates between yuv420p (source) and yuvj420p (MJPEG proxy) frames.
  video::FrameConverter converter_{video::ConversionQuality::fast};
  video::FrameConverter proxyConverter_{video::ConversionQuality::fast};
  video::FrameConverter exportConverter_;  // exact, for frameNow()
  QSize displayPixels_;                    // empty: full size
  qreal displayRatio_ = 1.0;
  // Pictures handed out before: one the Viewer no longer holds is refilled instead of
  // allocating (and page-faulting) 8 MB per 1080p step.
  // (One more than the Viewer's picture, the prepared one and the one being made.)
  std::array<QImage, 4> recycled_;
  std::int64_t wanted_ = -1;  // newest request; older answers are dropped
  struct Prepared {
    std::int64_t frame = -1;
    QImage image;
  };
  Prepared prepared_;        // the picture made ahead, for the current server and size
  std::int64_t shown_ = -1;  // the last frame handed out, and the one before it
  std::int64_t previous_ = -1;
  bool prepareQueued_ = false;
  std::int64_t preparedShown_ = 0;
};

}  // namespace stridemark::ui
