#include "ui/session/frame_crops.h"

#include <QMetaObject>
#include <algorithm>

#include "video/convert.h"
#include "video/frame_reader.h"

namespace stridemark::ui {

FrameCrops::FrameCrops(QString videoPath, std::shared_ptr<const video::FrameIndex> index,
                       QObject* parent)
    : QObject(parent),
      path_(std::move(videoPath)),
      index_(std::move(index)),
      worker_([this] { loop(); }) {}

FrameCrops::~FrameCrops() {
  {
    std::lock_guard lock(mutex_);
    stopping_ = true;
  }
  wake_.notify_all();
  worker_.join();
}

void FrameCrops::fetch(std::uint64_t ticket, std::vector<CropRequest> requests, int side) {
  {
    std::lock_guard lock(mutex_);
    pending_ = Job{ticket, std::move(requests), std::max(8, side)};
  }
  wake_.notify_one();
}

bool FrameCrops::superseded() const {
  std::lock_guard lock(mutex_);
  return stopping_ || pending_.has_value();
}

void FrameCrops::loop() {
  std::unique_lock lock(mutex_);
  for (;;) {
    wake_.wait(lock, [this] { return stopping_ || pending_; });
    if (stopping_) return;
    Job job = std::move(*pending_);
    pending_.reset();
    lock.unlock();
    std::vector<QImage> crops = read(job);
    if (!superseded()) {
      QMetaObject::invokeMethod(
          this, [this, ticket = job.ticket, crops] { emit ready(ticket, crops); },
          Qt::QueuedConnection);
    }
    lock.lock();
  }
}

// Frames in order, one decode pass: neighbours share their keyframe's pre-roll.
std::vector<QImage> FrameCrops::read(const Job& job) {
  std::vector<QImage> crops(job.requests.size());
  if (job.requests.empty()) return crops;
  std::int64_t first = job.requests.front().frame, last = first;
  for (const auto& r : job.requests) {
    first = std::min(first, r.frame);
    last = std::max(last, r.frame);
  }
  first = std::max<std::int64_t>(first, 0);
  last = std::min(last, index_->frameCount() - 1);
  if (first > last) return crops;
  try {
    video::FrameReader reader(path_.toStdString(), index_);
    video::FrameConverter converter(video::ConversionQuality::fast);
    reader.decodeSpan(first, last, [&](video::DecodedFrame&& frame) {
      QImage full(frame.width(), frame.height(), QImage::Format_RGB32);
      converter.convert(frame, video::PackedFormat::bgra, full.bits(),
                        static_cast<int>(full.bytesPerLine()));
      for (std::size_t i = 0; i < job.requests.size(); ++i) {
        if (job.requests[i].frame != frame.index()) continue;
        const int side = std::min({job.side, full.width(), full.height()});
        const int x = std::clamp(static_cast<int>(job.requests[i].centre.x()) - side / 2, 0,
                                 full.width() - side);
        const int y = std::clamp(static_cast<int>(job.requests[i].centre.y()) - side / 2, 0,
                                 full.height() - side);
        crops[i] = full.copy(x, y, side, side);
      }
      return !superseded();
    });
  } catch (const std::exception&) {
    // A frame that cannot be read stays a grey tile: the Viewer's own status names decode
    // errors of the playhead's frame; the strip is only an aid to the decision.
  }
  return crops;
}

}  // namespace stridemark::ui
