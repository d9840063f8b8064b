#include "video/intra_proxy.h"

#include <filesystem>
#include <vector>

#include "common/error.h"
#include "video/convert.h"
#include "video/encoder.h"
#include "video/frame_reader.h"
#include "video/frame_server.h"
#include "video/video_info.h"

namespace stridemark::video {

bool intraProxyAdvised(const FrameIndex& index, std::size_t budgetBytes, std::size_t frameBytes) {
  if (index.isIntraOnly() || frameBytes == 0) return false;
  return index.maxKeyframeInterval() >
         kProxyPrerollSpans * backwardRefillFrames(budgetBytes, frameBytes);
}

FrameIndex buildIntraProxy(const std::string& source, std::shared_ptr<const FrameIndex> index,
                           const std::string& proxyPath,
                           const std::function<bool(std::int64_t, std::int64_t)>& progress) {
  const VideoInfo info = describeVideo(source, *index);
  if (info.width % 2 || info.height % 2)
    throw Error(ErrorCategory::export_,
                source + ": no stepping proxy for odd frame sizes (" + std::to_string(info.width) +
                    "x" + std::to_string(info.height) + "); stepping uses the source.");
  const std::string partial = proxyPath + ".part.avi";
  const std::int64_t total = index->frameCount();
  bool cancelled = false;
  {
    EncoderOptions options;
    options.path = partial;
    options.width = info.width;
    options.height = info.height;
    options.fileRate = info.fileRate.valid() ? info.fileRate : Rational{30, 1};
    options.codec = VideoCodec::mjpeg;
    options.input = PixelLayout::bgra32;
    options.mjpegQuality = 3;
    options.comment = "Stridemark stepping proxy of " + source;
    Encoder encoder(options);
    FrameReader reader(source, index, ReaderOptions{2, false});
    FrameConverter converter;
    const int stride = info.width * 4;
    std::vector<std::uint8_t> bgra(static_cast<std::size_t>(stride) *
                                   static_cast<std::size_t>(info.height));
    std::int64_t done = 0;
    reader.decodeSpan(0, total - 1, [&](DecodedFrame&& frame) {
      converter.convert(frame, PackedFormat::bgra, bgra.data(), stride);
      encoder.write(bgra.data(), stride);
      ++done;
      if (progress && !progress(done, total)) {
        cancelled = true;
        return false;
      }
      return true;
    });
    if (!cancelled) encoder.finish();
  }
  std::error_code ec;
  if (cancelled) {
    std::filesystem::remove(partial, ec);
    throw Error(ErrorCategory::io, source + ": building the stepping proxy was cancelled.");
  }
  FrameIndex proxy = FrameIndex::build(partial);
  if (proxy.frameCount() != total || !proxy.isIntraOnly()) {
    std::filesystem::remove(partial, ec);
    throw Error(ErrorCategory::export_,
                source + ": the stepping proxy has " + std::to_string(proxy.frameCount()) +
                    " frames instead of " + std::to_string(total) + "; stepping uses the source.");
  }
  std::filesystem::rename(partial, proxyPath, ec);
  if (ec) throw Error(ErrorCategory::io, proxyPath + ": cannot save the stepping proxy.");
  return FrameIndex::build(proxyPath);
}

IntraProxyJob::IntraProxyJob(std::string source, std::shared_ptr<const FrameIndex> index,
                             std::string proxyPath) {
  thread_ = std::thread([this, source = std::move(source), index = std::move(index),
                         proxyPath = std::move(proxyPath)] {
    try {
      result_ = std::make_shared<const FrameIndex>(
          buildIntraProxy(source, index, proxyPath, [this](std::int64_t done, std::int64_t total) {
            progress_.store(static_cast<double>(done) / static_cast<double>(total));
            return !cancelled_.load();
          }));
    } catch (...) {
      error_ = std::current_exception();
    }
    finished_.store(true);
  });
}

IntraProxyJob::~IntraProxyJob() {
  cancel();
  if (thread_.joinable()) thread_.join();
}

std::shared_ptr<const FrameIndex> IntraProxyJob::wait() {
  if (thread_.joinable()) thread_.join();
  if (error_) std::rethrow_exception(error_);
  return result_;
}

}  // namespace stridemark::video
