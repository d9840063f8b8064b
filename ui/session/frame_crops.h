#pragma once
// Small crops of a few frames around a proposal (issue 18 item 3: the frames around it, so a
// decision takes one look), read exactly by frame number on a worker thread with a reader of
// their own: the Viewer's frame server keeps serving the playhead meanwhile. A new fetch
// replaces one that is waiting; answers come back on the UI thread with their ticket.
#include <QImage>
#include <QObject>
#include <QPointF>
#include <QString>
#include <condition_variable>
#include <cstdint>
#include <memory>
#include <mutex>
#include <optional>
#include <thread>
#include <vector>

namespace stridemark::video {
class FrameIndex;
}

namespace stridemark::ui {

struct CropRequest {
  std::int64_t frame = 0;
  QPointF centre;  // pixels of the upright frame
};

class FrameCrops : public QObject {
  Q_OBJECT
 public:
  FrameCrops(QString videoPath, std::shared_ptr<const video::FrameIndex> index,
             QObject* parent = nullptr);
  ~FrameCrops() override;

  // Squares of `side` video pixels around each centre (clamped into the frame).
  void fetch(std::uint64_t ticket, std::vector<CropRequest> requests, int side);

 signals:
  // One picture per request, in order; a null picture for a frame that could not be read.
  void ready(quint64 ticket, const std::vector<QImage>& crops);

 private:
  struct Job {
    std::uint64_t ticket = 0;
    std::vector<CropRequest> requests;
    int side = 64;
  };
  void loop();
  std::vector<QImage> read(const Job& job);
  bool superseded() const;

  QString path_;
  std::shared_ptr<const video::FrameIndex> index_;
  mutable std::mutex mutex_;
  std::condition_variable wake_;
  std::optional<Job> pending_;
  bool stopping_ = false;
  std::thread worker_;  // last: starts after the state above exists
};

}  // namespace stridemark::ui
