#pragma once
// All-intra stepping proxy for long-GOP clips (issue 3 item 5). When a keyframe interval is
// longer than the backward window the cache can hold, stepping backwards would pause at every
// window refill; an MJPEG copy (every frame a keyframe) steps both ways at forward cost. The
// proxy is for display only: export and `frame --md5` keep using the source.
// Same frame numbering: proxy frame i is source frame i (frame count verified after writing).
#include <atomic>
#include <cstdint>
#include <exception>
#include <functional>
#include <memory>
#include <string>
#include <thread>

#include "video/frame_index.h"

namespace stridemark::video {

// True when backward stepping would stall: a refill pre-rolls up to one keyframe interval
// before the span it keeps, so once the longest interval exceeds kProxyPrerollSpans refill
// spans (backwardRefillFrames), a refill costs more decoding than holding the back-step key
// gives it time for. Skipping non-reference frames makes the pre-roll about 1.5-1.9x cheaper
// than full decoding (VIDEO-NOTES §4.2.3); 1080p H.264 on two cores decodes about 8x faster
// than 30 steps/s, which leaves room for about four spans of pre-roll per span stepped.
constexpr std::int64_t kProxyPrerollSpans = 4;
bool intraProxyAdvised(const FrameIndex& index, std::size_t budgetBytes, std::size_t frameBytes);

// Writes the proxy (MJPEG in AVI, even sizes only) and returns its index. `progress(done,
// total)` returning false cancels: throws Error(io, "... cancelled") and removes the partial
// file. Throws Error(export_) when the written proxy does not have the source's frame count.
FrameIndex buildIntraProxy(const std::string& source, std::shared_ptr<const FrameIndex> index,
                           const std::string& proxyPath,
                           const std::function<bool(std::int64_t, std::int64_t)>& progress = {});

// The same on a background thread, with progress the UI can poll and a cancel button.
class IntraProxyJob {
 public:
  IntraProxyJob(std::string source, std::shared_ptr<const FrameIndex> index, std::string proxyPath);
  ~IntraProxyJob();  // cancels and joins
  IntraProxyJob(const IntraProxyJob&) = delete;
  IntraProxyJob& operator=(const IntraProxyJob&) = delete;

  double progress() const { return progress_.load(); }  // 0..1
  bool finished() const { return finished_.load(); }
  void cancel() { cancelled_.store(true); }
  // Waits for the end; returns the proxy's index or rethrows the job's error.
  std::shared_ptr<const FrameIndex> wait();

 private:
  std::atomic<double> progress_{0};
  std::atomic<bool> cancelled_{false};
  std::atomic<bool> finished_{false};
  std::shared_ptr<const FrameIndex> result_;
  std::exception_ptr error_;
  std::thread thread_;
};

}  // namespace stridemark::video
