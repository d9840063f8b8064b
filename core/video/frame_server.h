#pragma once
// The player-facing frame source. It keeps native-format frames around the playhead under a
// byte budget, decodes ahead in the direction of travel on one worker thread, and refills the
// frames before the playhead when stepping backwards so back steps are cache lookups (decode a
// GOP span once, keep the frames; VIDEO-NOTES §4.2). A new request elsewhere cancels the
// worker's current job through a generation counter.
//
// Backward refill policy: the budget is split into a small reserve behind the direction of
// travel (for a change of mind) and the frames ahead of it. A refill is planned as soon as the
// ahead part has room for a worthwhile span below the cached run; it takes at most half of the
// ahead part, so one span is stepped through while the next one decodes. Frames before the span
// are pre-rolled with non-reference frames skipped. The worker and its decoder threads run at
// a lower priority, so the thread that steps and converts is not slowed down by refills. A
// second low-priority thread faults in the cache's memory (up to the budget, or the clip if it
// is smaller) right after opening: fresh pages cost more than decoding on some machines, and
// the first refills would otherwise pay for them.
//
// Threading: every public method is thread-safe. Callbacks given to request() run on the
// worker thread; they must be quick and must not call back into the server synchronously
// (post to your own thread instead).
#include <chrono>
#include <condition_variable>
#include <cstddef>
#include <cstdint>
#include <exception>
#include <functional>
#include <map>
#include <memory>
#include <mutex>
#include <set>
#include <string>
#include <thread>
#include <vector>

#include "video/decoded_frame.h"
#include "video/frame_index.h"
#include "video/frame_reader.h"

namespace stridemark::video {

struct FrameServerOptions {
  std::size_t budgetBytes = std::size_t{1} << 30;  // 1 GiB default (setting)
  int decodeThreads = 2;                           // frame threads for refill / decode-ahead
  std::int64_t aheadFrames = 32;                   // decode-ahead depth when moving forward
  int workerNice = 10;  // niceness added to the worker and its decoder threads (0 = unchanged)
};

struct FrameServerStats {
  std::size_t cachedBytes = 0;
  std::size_t peakCachedBytes = 0;
  std::int64_t cachedFrames = 0;
  std::int64_t hits = 0;
  std::int64_t misses = 0;
  std::int64_t cancelledJobs = 0;
  std::int64_t windowRefills = 0;
  std::int64_t windowFrames = 0;  // largest span one backward refill keeps at this budget
};

// The most frames one backward refill keeps for this budget and frame size (the policy above).
std::int64_t backwardRefillFrames(std::size_t budgetBytes, std::size_t frameBytes);

class FrameServer {
 public:
  using Callback =
      std::function<void(std::int64_t n, std::shared_ptr<const DecodedFrame>, std::exception_ptr)>;

  FrameServer(const std::string& path, std::shared_ptr<const FrameIndex> index,
              FrameServerOptions options = {});
  ~FrameServer();
  FrameServer(const FrameServer&) = delete;
  FrameServer& operator=(const FrameServer&) = delete;

  // Blocking and exact: returns frame n (moving the playhead there) or throws stridemark::Error.
  std::shared_ptr<const DecodedFrame> get(std::int64_t n);
  // Non-blocking: the cached frame or null. Moves the playhead (so decode-ahead follows).
  std::shared_ptr<const DecodedFrame> tryGet(std::int64_t n);
  // The cached frame or null, changing nothing: no playhead move (the step pace and the
  // decode-ahead follow the user's steps only), no decoding asked for, no hit or miss counted.
  // For work done ahead of the user, such as preparing the next frame's picture.
  std::shared_ptr<const DecodedFrame> peek(std::int64_t n) const;
  // Non-blocking: moves the playhead to n; `done` runs on the worker when the frame is ready
  // (immediately on the caller's thread if it is cached). A later request to another frame
  // cancels this one: `done` then receives a null frame and a null exception.
  void request(std::int64_t n, Callback done);

  void setBudget(std::size_t bytes);
  std::size_t budget() const;
  FrameServerStats stats() const;
  const FrameIndex& index() const { return *index_; }
  std::int64_t frameCount() const { return index_->frameCount(); }

 private:
  // Where a waiting get() receives its answer (kept even if the cache evicts the frame).
  struct Slot {
    std::shared_ptr<const DecodedFrame> frame;
    std::exception_ptr error;
  };
  struct Pending {
    std::int64_t frame = -1;
    std::shared_ptr<Slot> slot;  // set for a blocking get(): never cancelled by later requests
    Callback done;
  };
  struct Ready {
    Callback done;
    std::int64_t frame;
    std::shared_ptr<const DecodedFrame> picture;
    std::exception_ptr error;
  };
  enum class Direction { forward, backward };

  std::shared_ptr<const DecodedFrame> lookupOrDemand(std::int64_t n, Callback& done);
  // All private helpers named "...Locked" expect mutex_ to be held.
  void moveToLocked(std::int64_t n);
  void demandLocked(std::int64_t n, std::shared_ptr<Slot> slot, Callback done,
                    std::vector<Ready>& cancelled);
  bool jobWillProduceLocked(std::int64_t n) const;
  void workerMain(const std::string& path);
  void workerLoop();
  void runDemand(std::unique_lock<std::mutex>& lock);
  bool runBackground(std::unique_lock<std::mutex>& lock);
  struct Span {
    std::int64_t first = 0;
    std::int64_t last = -1;
  };
  bool planForwardLocked(Span& span) const;
  bool planBackwardLocked(Span& span) const;
  // Decodes [first, last] on the worker with the mutex released; frames go into the cache.
  void decodeSpan(std::int64_t first, std::int64_t last, std::unique_lock<std::mutex>& lock);
  void insertLocked(std::shared_ptr<const DecodedFrame> frame, std::vector<Ready>& ready);
  void failLocked(std::int64_t first, std::int64_t last, std::exception_ptr error,
                  std::vector<Ready>& ready);
  void evictOverBudgetLocked();
  std::int64_t budgetFramesLocked() const;
  std::int64_t aheadCapacityLocked() const;
  std::int64_t windowFramesLocked() const;
  std::int64_t keyFrameNumber(std::int64_t n) const;
  std::int64_t contiguousStartLocked(std::int64_t n) const;
  static void deliver(std::vector<Ready>& ready);

  std::shared_ptr<const FrameIndex> index_;
  FrameServerOptions options_;
  std::shared_ptr<FramePool> pool_;
  std::unique_ptr<FrameReader> reader_;  // made and used only by the worker thread
  std::size_t frameBytes_ = 0;

  mutable std::mutex mutex_;
  std::condition_variable wake_;     // the worker waits on it
  std::condition_variable arrived_;  // get() waits on it
  std::map<std::int64_t, std::shared_ptr<const DecodedFrame>> cache_;
  std::size_t cachedBytes_ = 0;
  std::int64_t playhead_ = 0;
  Direction direction_ = Direction::forward;
  std::uint64_t generation_ = 0;
  std::vector<Pending> pending_;
  std::set<std::int64_t> unreadable_;  // frames a job failed on: background work skips them
  bool jobActive_ = false;
  std::int64_t jobNext_ = 0;  // next frame the running job will deliver
  std::int64_t jobLast_ = -1;
  FrameServerStats stats_;
  std::chrono::steady_clock::time_point lastMove_{};
  double stepMs_ = 0;     // average time between single-frame moves of the playhead
  int stepSamples_ = 0;   // moves averaged since the last jump
  double decodeMs_ = 0;   // average decode time per kept frame of recent jobs
  bool started_ = false;  // the worker has opened the file and decoded frame 0
  std::exception_ptr startError_;
  bool stopping_ = false;
  std::thread worker_;  // after everything above: starts once it exists
};

}  // namespace stridemark::video
