#include "ui/export/clip_compositor.h"

#include <QPainter>
#include <algorithm>
#include <bit>
#include <condition_variable>
#include <deque>
#include <exception>
#include <mutex>
#include <optional>
#include <set>
#include <thread>

#include <opencv2/core/utility.hpp>
#include <opencv2/imgproc.hpp>

#include "common/error.h"
#include "video/convert.h"
#include "video/encoder.h"
#include "video/frame_index.h"
#include "video/frame_reader.h"

namespace stridemark::ui::exports {

namespace {

static_assert(std::endian::native == std::endian::little,
              "ARGB32 images are handed to the encoder as bgra bytes");

constexpr std::size_t kQueueDepth = 4;  // images in flight between the two threads

int evenUp(int v) {
  return v + (v % 2);
}

Error cancelledError() {
  return Error(ErrorCategory::export_, "marked-clip export cancelled; no clip was written.");
}

// Images travel worker -> encoder through `ready` and come back through `spare`, so the
// pipeline allocates kQueueDepth images once instead of one per frame.
class ImageQueue {
 public:
  struct Item {
    QImage image;
    std::int64_t frame = 0;
  };

  ImageQueue(QSize size, std::size_t depth) {
    for (std::size_t i = 0; i < depth; ++i) {
      // ARGB32_Premultiplied is QPainter's fastest target; on little-endian machines its bytes
      // are B, G, R, A, i.e. libav's bgra (the frames are opaque, so premultiplying is a no-op).
      QImage image(size, QImage::Format_ARGB32_Premultiplied);
      image.fill(Qt::black);
      spare_.push_back(std::move(image));
    }
  }

  // Worker side. Returns nothing when the queue was closed (cancel or encoder failure).
  std::optional<QImage> takeSpare() {
    std::unique_lock lock(mutex_);
    changed_.wait(lock, [&] { return closed_ || !spare_.empty(); });
    if (closed_) return std::nullopt;
    QImage image = std::move(spare_.front());
    spare_.pop_front();
    return image;
  }
  void pushReady(Item item) {
    std::lock_guard lock(mutex_);
    ready_.push_back(std::move(item));
    changed_.notify_all();
  }
  // Encoder side. Returns nothing when the worker is done and everything was taken.
  std::optional<Item> takeReady() {
    std::unique_lock lock(mutex_);
    changed_.wait(lock, [&] { return !ready_.empty() || producerDone_; });
    if (ready_.empty()) return std::nullopt;
    Item item = std::move(ready_.front());
    ready_.pop_front();
    return item;
  }
  void giveBack(QImage image) {
    std::lock_guard lock(mutex_);
    spare_.push_back(std::move(image));
    changed_.notify_all();
  }
  void producerFinished() {
    std::lock_guard lock(mutex_);
    producerDone_ = true;
    changed_.notify_all();
  }
  void close() {
    std::lock_guard lock(mutex_);
    closed_ = true;
    changed_.notify_all();
  }

 private:
  std::mutex mutex_;
  std::condition_variable changed_;
  std::deque<QImage> spare_;
  std::deque<Item> ready_;
  bool producerDone_ = false;
  bool closed_ = false;
};

struct Layout {
  QSize output;      // encoded size (even)
  QRectF videoArea;  // where the frame goes
  QRectF panelArea;  // side panel, empty when none
};

Layout layoutFor(int width, int height, const ClipSettings& s) {
  Layout l;
  l.videoArea = QRectF(0, 0, width, height);
  int total = width;
  if (s.sidePanel) {
    const int panel = evenUp(static_cast<int>(height * s.sidePanelWidthShare));
    l.panelArea = QRectF(width, 0, panel, height);
    total += panel;
  }
  l.output = QSize(evenUp(total), evenUp(height));
  return l;
}

// Damaged frames of the range, found while decoding: skipped, listed in the result.
class DamageList {
 public:
  void add(std::int64_t frame, const std::string& reason) {
    std::lock_guard lock(mutex_);
    if (frames_.insert(frame).second && firstReason_.empty()) firstReason_ = reason;
  }
  std::int64_t count() const {
    std::lock_guard lock(mutex_);
    return static_cast<std::int64_t>(frames_.size());
  }
  void copyTo(ClipResult& result) const {
    std::lock_guard lock(mutex_);
    result.skippedDamaged.assign(frames_.begin(), frames_.end());
    result.firstDamageReason = firstReason_;
  }

 private:
  mutable std::mutex mutex_;
  std::set<std::int64_t> frames_;
  std::string firstReason_;
};

// A picture the encoder can take: decoded without errors and of the clip's size.
bool usable(const video::DecodedFrame& frame, const Layout& layout, DamageList& damage) {
  if (frame.damaged) {
    damage.add(frame.index(), video::kConcealedDamage);
    return false;
  }
  if (frame.width() != static_cast<int>(layout.videoArea.width()) ||
      frame.height() != static_cast<int>(layout.videoArea.height())) {
    damage.add(frame.index(), "its size differs from the clip's first frame");
    return false;
  }
  return true;
}

// Worker: decode the span, convert each frame into a recycled RGBA image and draw on it.
// Damaged frames are skipped, so one bad frame does not cost the whole clip.
void produceFrames(video::FrameReader& reader, const ClipSettings& s, const Layout& layout,
                   const OverlayModel& overlay, ImageQueue& queue, DamageList& damage,
                   const std::atomic<bool>& cancel) {
  video::FrameConverter converter;
  const auto skip = [&damage](std::int64_t frame, const std::string& reason) {
    damage.add(frame, reason);
  };
  reader.decodeSpan(
      s.first, s.last,
      [&](video::DecodedFrame&& frame) {
        if (cancel.load()) return false;
        if (!usable(frame, layout, damage)) return true;
        std::optional<QImage> image = queue.takeSpare();
        if (!image) return false;
        converter.convert(frame, video::PackedFormat::bgra, image->bits(),
                          static_cast<int>(image->bytesPerLine()));
        QPainter painter(&*image);
        if (s.sidePanel) {
          painter.fillRect(layout.panelArea, Qt::white);
          s.sidePanel(painter, layout.panelArea, frame.index());
        }
        if (s.drawOverlay) drawOverlay(painter, layout.videoArea, overlay, frame.index());
        painter.end();
        queue.pushReady({std::move(*image), frame.index()});
        return true;
      },
      skip);
}

// The size of the clip's pictures: from the first frame of the range that decodes cleanly.
std::optional<QSize> firstGoodFrameSize(video::FrameReader& reader, const ClipSettings& s,
                                        DamageList& damage) {
  std::optional<QSize> size;
  reader.decodeSpan(
      s.first, s.last,
      [&](video::DecodedFrame&& frame) {
        if (frame.damaged) {
          damage.add(frame.index(), video::kConcealedDamage);
          return true;
        }
        size = QSize(frame.width(), frame.height());
        return false;
      },
      [&damage](std::int64_t frame, const std::string& reason) { damage.add(frame, reason); });
  return size;
}

}  // namespace

Rational defaultPlaybackRate(Rational captureRate) {
  if (captureRate.valid() && captureRate.toDouble() > 60.0) return Rational{30, 1};
  return captureRate.valid() ? captureRate : Rational{30, 1};
}

ClipResult renderMarkedClip(const ClipSettings& s, const OverlayModel& overlay,
                            const std::filesystem::path& outPath, const ClipProgress& progress,
                            const std::atomic<bool>& cancel) {
  auto index =
      s.index ? s.index
              : std::make_shared<const video::FrameIndex>(video::FrameIndex::build(s.videoPath));
  const std::int64_t count = index->frameCount();
  if (count == 0) {
    throw Error(ErrorCategory::export_, "video '" + s.videoPath + "' has no frames to export.");
  }
  if (s.first < 0 || s.last < s.first || s.last >= count) {
    throw Error(ErrorCategory::export_,
                "frame range " + std::to_string(s.first) + "-" + std::to_string(s.last) +
                    " is outside the video '" + s.videoPath + "' (frames 0-" +
                    std::to_string(count - 1) + "). Choose --from/--to inside it.");
  }
  video::ReaderOptions readerOptions;
  readerOptions.decodeThreads = s.decoderThreads;
  video::FrameReader reader(s.videoPath, index, readerOptions);
  // The first good frame tells us the size (and fails early on an undecodable range).
  DamageList damage;
  const std::optional<QSize> pictureSize = firstGoodFrameSize(reader, s, damage);
  if (!pictureSize)
    throw Error(ErrorCategory::export_,
                "every frame of " + std::to_string(s.first) + "-" + std::to_string(s.last) +
                    " of '" + s.videoPath +
                    "' is damaged, so no marked clip was made. `stridemark probe` lists the "
                    "damaged frames; choose another range with --from/--to.");
  const Layout layout = layoutFor(pictureSize->width(), pictureSize->height(), s);

  video::EncoderOptions options;
  options.path = outPath;
  options.width = layout.output.width();
  options.height = layout.output.height();
  options.fileRate = s.playbackRate;
  options.codec = video::VideoCodec::h264;
  // OpenCV's SIMD BGRA -> I420 beat swscale's generic RGB -> YUV path here.
  options.input = video::PixelLayout::yuv420p;
  options.threads = s.encoderThreads;
  options.x264Preset = s.x264Preset;
  options.x264Crf = s.x264Crf;
  options.comment = "Marked clip made by Stridemark";
  video::Encoder encoder(options);

  ImageQueue queue(layout.output, kQueueDepth);
  std::exception_ptr workerError;
  std::thread worker([&] {
    try {
      produceFrames(reader, s, layout, overlay, queue, damage, cancel);
    } catch (...) {
      workerError = std::current_exception();
    }
    queue.producerFinished();
  });
  // Stop the worker on any exit from this scope, including an encoder exception.
  struct JoinOnExit {
    ImageQueue& queue;
    std::thread& worker;
    ~JoinOnExit() {
      queue.close();
      if (worker.joinable()) worker.join();
    }
  } joiner{queue, worker};

  const std::int64_t total = s.last - s.first + 1;
  std::int64_t done = 0;
  // One OpenCV thread: its pool's spinning workers would compete with libx264's threads.
  const int openCvThreads = cv::getNumThreads();
  cv::setNumThreads(1);
  struct RestoreOpenCvThreads {
    int count;
    ~RestoreOpenCvThreads() { cv::setNumThreads(count); }
  } restoreOpenCv{openCvThreads};
  cv::Mat planar;  // I420, reused: height * 3 / 2 rows of width bytes
  while (std::optional<ImageQueue::Item> item = queue.takeReady()) {
    if (cancel.load()) break;
    const cv::Mat bgra(item->image.height(), item->image.width(), CV_8UC4,
                       const_cast<uchar*>(item->image.constBits()),
                       static_cast<std::size_t>(item->image.bytesPerLine()));
    cv::cvtColor(bgra, planar, cv::COLOR_BGRA2YUV_I420);
    encoder.write(planar.data, planar.cols);
    queue.giveBack(std::move(item->image));
    ++done;
    if (progress) progress(std::min(total, done + damage.count()), total);
  }
  queue.close();
  if (worker.joinable()) worker.join();
  if (workerError) std::rethrow_exception(workerError);
  if (cancel.load()) throw cancelledError();
  if (done + damage.count() < total) {
    throw Error(ErrorCategory::export_, "marked clip stopped after " + std::to_string(done) +
                                            " of " + std::to_string(total) + " frames of '" +
                                            s.videoPath + "'.");
  }
  encoder.finish();
  ClipResult result;
  result.frames = done;
  result.width = layout.output.width();
  result.height = layout.output.height();
  damage.copyTo(result);
  result.rotationDegrees = reader.rotation().degrees;
  result.rotationApplied = reader.rotation().applied;
  return result;
}

}  // namespace stridemark::ui::exports
