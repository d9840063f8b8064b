#pragma once
// Builds the all-intra stepping proxy of a long-GOP clip in the background (issue 3 item 5) and
// reports to the UI thread: progress while it runs, then the proxy's index or an error. The
// proxy lives in the user's cache folder under the video's signature, never next to the video;
// an existing proxy with the source's frame count is reused without rebuilding.
#include <QObject>
#include <QString>
#include <QTimer>
#include <cstdint>
#include <memory>

#include "video/frame_index.h"

namespace stridemark::video {
class IntraProxyJob;
}

namespace stridemark::ui {

class ProxyBuilder : public QObject {
  Q_OBJECT
 public:
  ProxyBuilder(QString sourcePath, std::shared_ptr<const video::FrameIndex> sourceIndex,
               QString proxyPath, QObject* parent = nullptr);
  ~ProxyBuilder() override;  // cancels a running job and waits for it

  QString proxyPath() const { return proxyPath_; }
  // A finished proxy already on disk for this video, or null (a stale one is deleted).
  std::shared_ptr<const video::FrameIndex> reuseExisting();
  // Starts the background job; ready() or failed() follows on the UI thread.
  void start();
  void cancel();
  bool running() const { return job_ != nullptr; }
  double progress() const;

  // The proxy file for a video signature inside `dir` (empty: the user's cache folder).
  static QString proxyPathFor(const QString& dir, const std::string& signatureText);

 signals:
  void progressed(double fraction);
  void ready(std::shared_ptr<const video::FrameIndex> proxyIndex);
  void failed(const QString& message);

 private:
  void poll();
  void removeLeftovers() const;

  QString sourcePath_;
  std::shared_ptr<const video::FrameIndex> sourceIndex_;
  QString proxyPath_;
  std::unique_ptr<video::IntraProxyJob> job_;
  QTimer pollTimer_;
};

}  // namespace stridemark::ui
