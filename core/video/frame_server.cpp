#include "video/frame_server.h"

#include <sys/resource.h>
#include <unistd.h>

#include <algorithm>
#include <chrono>
#include <cmath>

#include "common/error.h"

extern "C" {
#include <libavformat/avformat.h>
}

namespace stridemark::video {

namespace {

// Frames kept before the target of a cold jump: about one second of holding the back-step
// key, which gives the first refill time to finish (VIDEO-NOTES §4.2.4), while the jump costs
// only a few frames more than an exact seek.
constexpr std::int64_t kKeepBeforeJump = 30;

// The shortest backward refill worth its pre-roll, and the span used while the user steps
// faster than frames decode (each such span ends in a wait, so its length bounds the wait).
constexpr std::int64_t kShortestSpan = 32;
constexpr std::int64_t kOutrunSpan = 48;

// Frames behind the direction of travel that stay cached when space is short.
std::int64_t behindReserve(std::int64_t budgetFrames) {
  return std::clamp<std::int64_t>(budgetFrames / 8, 1, 32);
}

std::int64_t budgetFrames(std::size_t budgetBytes, std::size_t frameBytes) {
  return std::max<std::int64_t>(
      1, static_cast<std::int64_t>(budgetBytes / std::max<std::size_t>(frameBytes, 1)));
}

// Frames the budget holds ahead of the playhead in the direction of travel.
std::int64_t aheadCapacity(std::size_t budgetBytes, std::size_t frameBytes) {
  const std::int64_t frames = budgetFrames(budgetBytes, frameBytes);
  return std::max<std::int64_t>(1, frames - behindReserve(frames));
}

// Linux nice values are per thread and inherited by threads created later, so lowering the
// worker's priority before it opens the decoder also covers libavcodec's frame threads.
void lowerThisThreadsPriority(int nice) {
  if (nice <= 0) return;
  const auto tid = static_cast<id_t>(gettid());
  const int current = getpriority(PRIO_PROCESS, tid);
  (void)setpriority(PRIO_PROCESS, tid, std::min(current + nice, 19));  // best effort
}

}  // namespace

// Half the ahead part, so the span being stepped through and the one being decoded fit together.
std::int64_t backwardRefillFrames(std::size_t budgetBytes, std::size_t frameBytes) {
  return std::max<std::int64_t>(1, aheadCapacity(budgetBytes, frameBytes) / 2);
}

FrameServer::FrameServer(const std::string& path, std::shared_ptr<const FrameIndex> index,
                         FrameServerOptions options)
    : index_(std::move(index)), options_(options), pool_(FramePool::create()) {
  if (!index_) throw Error(ErrorCategory::seek, path + ": no frame index given to the server");
  worker_ = std::thread([this, path] { workerMain(path); });
  std::unique_lock lock(mutex_);
  arrived_.wait(lock, [this] { return started_ || startError_; });
  if (startError_) {
    lock.unlock();
    worker_.join();
    std::rethrow_exception(startError_);
  }
}

FrameServer::~FrameServer() {
  std::vector<Ready> cancelled;
  {
    std::lock_guard lock(mutex_);
    stopping_ = true;
    ++generation_;
    for (auto& p : pending_)
      if (p.done) cancelled.push_back({std::move(p.done), p.frame, nullptr, nullptr});
    pending_.clear();
  }
  wake_.notify_all();
  arrived_.notify_all();
  worker_.join();
  deliver(cancelled);
}

// Opens the file on the worker thread (so its decoder threads inherit the lower priority) and
// decodes frame 0, which tells the frame size and becomes the first cached frame.
void FrameServer::workerMain(const std::string& path) {
  try {
    lowerThisThreadsPriority(options_.workerNice);
    ReaderOptions readerOptions;
    readerOptions.decodeThreads = options_.decodeThreads;
    reader_ = std::make_unique<FrameReader>(path, index_, readerOptions, pool_);
    auto first = std::make_shared<const DecodedFrame>(reader_->frameAt(0));
    std::lock_guard lock(mutex_);
    frameBytes_ = first->bytes();
    std::vector<Ready> none;
    insertLocked(std::move(first), none);
    stats_.windowFrames = windowFramesLocked();
    started_ = true;
  } catch (...) {
    std::lock_guard lock(mutex_);
    startError_ = std::current_exception();
  }
  arrived_.notify_all();
  if (startError_) return;
  workerLoop();
}

void FrameServer::deliver(std::vector<Ready>& ready) {
  for (auto& r : ready)
    if (r.done) r.done(r.frame, std::move(r.picture), r.error);
  ready.clear();
}

std::shared_ptr<const DecodedFrame> FrameServer::get(std::int64_t n) {
  index_->decodePosition(n);  // throws Error(seek) for frames outside the clip
  std::vector<Ready> cancelled;
  std::unique_lock lock(mutex_);
  moveToLocked(n);
  if (auto it = cache_.find(n); it != cache_.end()) {
    ++stats_.hits;
    wake_.notify_one();  // decode-ahead follows the playhead
    return it->second;
  }
  ++stats_.misses;
  auto slot = std::make_shared<Slot>();
  demandLocked(n, slot, nullptr, cancelled);
  lock.unlock();
  deliver(cancelled);
  lock.lock();
  arrived_.wait(lock, [&] { return slot->frame || slot->error || stopping_; });
  if (slot->error) std::rethrow_exception(slot->error);
  if (!slot->frame) throw Error(ErrorCategory::seek, "frame server closed while waiting");
  return slot->frame;
}

std::shared_ptr<const DecodedFrame> FrameServer::tryGet(std::int64_t n) {
  Callback none;
  return lookupOrDemand(n, none);
}

std::shared_ptr<const DecodedFrame> FrameServer::peek(std::int64_t n) const {
  std::lock_guard lock(mutex_);
  const auto it = cache_.find(n);
  return it == cache_.end() ? nullptr : it->second;
}

void FrameServer::request(std::int64_t n, Callback done) {
  auto found = lookupOrDemand(n, done);
  if (found && done) done(n, std::move(found), nullptr);
}

// The cached frame, or null after queueing a demand (which takes `done` over).
std::shared_ptr<const DecodedFrame> FrameServer::lookupOrDemand(std::int64_t n, Callback& done) {
  index_->decodePosition(n);  // throws Error(seek) for frames outside the clip
  std::vector<Ready> cancelled;
  std::shared_ptr<const DecodedFrame> found;
  {
    std::lock_guard lock(mutex_);
    moveToLocked(n);
    if (auto it = cache_.find(n); it != cache_.end()) {
      ++stats_.hits;
      found = it->second;
    } else {
      ++stats_.misses;
      demandLocked(n, nullptr, std::move(done), cancelled);
    }
  }
  wake_.notify_one();
  deliver(cancelled);
  return found;
}

void FrameServer::moveToLocked(std::int64_t n) {
  // How fast the user steps: an average over single-frame moves (jumps say nothing).
  const auto now = std::chrono::steady_clock::now();
  if (n != playhead_ && std::abs(n - playhead_) <= 2) {
    const double ms = std::chrono::duration<double, std::milli>(now - lastMove_).count();
    if (ms < 1000) {  // a longer gap is a pause, not a pace
      stepMs_ = stepSamples_ == 0 ? ms : 0.7 * stepMs_ + 0.3 * ms;
      ++stepSamples_;
    }
  } else if (n != playhead_) {
    stepSamples_ = 0;  // a jump: the pace is unknown again
  }
  lastMove_ = now;
  if (n < playhead_) direction_ = Direction::backward;
  if (n > playhead_) direction_ = Direction::forward;
  playhead_ = n;
}

bool FrameServer::jobWillProduceLocked(std::int64_t n) const {
  return jobActive_ && n >= jobNext_ && n <= jobLast_;
}

// Queues a demand for an uncached frame. Older non-blocking demands are superseded (their
// callbacks get a null frame), and the running job is cancelled unless it is about to produce
// the frame anyway (e.g. a prefetch the playhead caught up with).
void FrameServer::demandLocked(std::int64_t n, std::shared_ptr<Slot> slot, Callback done,
                               std::vector<Ready>& cancelled) {
  std::vector<Pending> kept;
  for (auto& p : pending_) {
    if (p.slot || p.frame == n)
      kept.push_back(std::move(p));
    else if (p.done)
      cancelled.push_back({std::move(p.done), p.frame, nullptr, nullptr});
  }
  pending_ = std::move(kept);
  pending_.push_back({n, std::move(slot), std::move(done)});
  if (!jobWillProduceLocked(n)) {
    ++generation_;
    if (jobActive_) ++stats_.cancelledJobs;
  }
  wake_.notify_one();
}

void FrameServer::setBudget(std::size_t bytes) {
  {
    std::lock_guard lock(mutex_);
    options_.budgetBytes = bytes;
    evictOverBudgetLocked();
    stats_.windowFrames = windowFramesLocked();
  }
  pool_->trimIdle();
  wake_.notify_one();
}

std::size_t FrameServer::budget() const {
  std::lock_guard lock(mutex_);
  return options_.budgetBytes;
}

FrameServerStats FrameServer::stats() const {
  std::lock_guard lock(mutex_);
  FrameServerStats s = stats_;
  s.cachedBytes = cachedBytes_;
  s.cachedFrames = static_cast<std::int64_t>(cache_.size());
  return s;
}

std::int64_t FrameServer::budgetFramesLocked() const {
  return budgetFrames(options_.budgetBytes, frameBytes_);
}

std::int64_t FrameServer::aheadCapacityLocked() const {
  return aheadCapacity(options_.budgetBytes, frameBytes_);
}

std::int64_t FrameServer::windowFramesLocked() const {
  return std::min(backwardRefillFrames(options_.budgetBytes, frameBytes_), index_->frameCount());
}

std::int64_t FrameServer::keyFrameNumber(std::int64_t n) const {
  const std::int64_t shown =
      index_->packets()[static_cast<std::size_t>(index_->keyPacketFor(n))].frame;
  return shown >= 0 && shown <= n ? shown : 0;
}

std::int64_t FrameServer::contiguousStartLocked(std::int64_t n) const {
  auto it = cache_.find(n);
  if (it == cache_.end()) return n + 1;
  std::int64_t start = n;
  while (it != cache_.begin()) {
    --it;
    if (it->first != start - 1) break;
    start = it->first;
  }
  return start;
}

void FrameServer::insertLocked(std::shared_ptr<const DecodedFrame> frame,
                               std::vector<Ready>& ready) {
  const std::int64_t n = frame->index();
  auto [it, added] = cache_.emplace(n, frame);
  if (added) cachedBytes_ += frame->bytes();
  std::vector<Pending> waiting;
  for (auto& p : pending_) {
    if (p.frame == n) {
      if (p.slot) p.slot->frame = frame;
      if (p.done) ready.push_back({std::move(p.done), n, frame, nullptr});
    } else {
      waiting.push_back(std::move(p));
    }
  }
  pending_ = std::move(waiting);
  evictOverBudgetLocked();
  stats_.peakCachedBytes = std::max(stats_.peakCachedBytes, cachedBytes_);
}

void FrameServer::failLocked(std::int64_t first, std::int64_t last, std::exception_ptr error,
                             std::vector<Ready>& ready) {
  std::vector<Pending> waiting;
  for (auto& p : pending_) {
    if (p.frame >= first && p.frame <= last) {
      if (p.slot) p.slot->error = error;
      if (p.done) ready.push_back({std::move(p.done), p.frame, nullptr, error});
    } else {
      waiting.push_back(std::move(p));
    }
  }
  pending_ = std::move(waiting);
}

// Evicts the frames least likely to be shown next: behind the direction of travel beyond the
// reserve first, then far ahead, then the reserve (weighted 4x). The playhead frame is kept.
void FrameServer::evictOverBudgetLocked() {
  const std::int64_t reserve = behindReserve(budgetFramesLocked());
  const std::int64_t capacity = aheadCapacityLocked();
  const auto score = [&](std::int64_t n) {
    const std::int64_t d = n - playhead_;
    const bool behind = direction_ == Direction::forward ? d < 0 : d > 0;
    if (!behind) return std::abs(d);
    return std::abs(d) <= reserve ? 4 * std::abs(d) : capacity + std::abs(d);
  };
  while (cachedBytes_ > options_.budgetBytes && cache_.size() > 1) {
    // Only the two ends of the ordered map can hold the worst frame.
    auto low = cache_.begin();
    auto high = std::prev(cache_.end());
    auto victim = score(low->first) >= score(high->first) ? low : high;
    if (victim->first == playhead_) victim = victim == low ? high : low;
    cachedBytes_ -= victim->second->bytes();
    cache_.erase(victim);
  }
}

void FrameServer::workerLoop() {
  std::unique_lock lock(mutex_);
  while (!stopping_) {
    if (!pending_.empty()) {
      runDemand(lock);
    } else if (!runBackground(lock)) {
      wake_.wait(lock);
    }
  }
}

void FrameServer::runDemand(std::unique_lock<std::mutex>& lock) {
  const std::int64_t n = pending_.front().frame;
  if (auto it = cache_.find(n); it != cache_.end()) {
    std::vector<Ready> ready;
    insertLocked(it->second, ready);  // already cached: just answer the waiters
    lock.unlock();
    deliver(ready);
    arrived_.notify_all();
    lock.lock();
    return;
  }
  // Keep a few frames before the target whichever way the playhead moves: the step costs
  // about one exact seek, and the background refill takes over from there.
  std::int64_t first = std::max(keyFrameNumber(n), n - kKeepBeforeJump);
  while (first < n && cache_.count(first)) ++first;
  // When the decoder already stands inside the span, continue from there instead of seeking
  // back (a forward step that outran the decode-ahead).
  const std::int64_t next = reader_->nextSequentialFrame();
  if (next > first && next <= n) first = next;
  decodeSpan(first, n, lock);
}

// Background work: decode ahead when moving forward; refill the frames before the playhead
// when moving backward. Returns false when there is nothing to do.
bool FrameServer::runBackground(std::unique_lock<std::mutex>& lock) {
  Span span;
  if (direction_ == Direction::forward) {
    if (!planForwardLocked(span)) return false;
  } else {
    if (!planBackwardLocked(span)) return false;
    ++stats_.windowRefills;
  }
  decodeSpan(span.first, span.last, lock);
  return true;
}

bool FrameServer::planForwardLocked(Span& span) const {
  const std::int64_t count = index_->frameCount();
  const std::int64_t ahead =
      std::min(options_.aheadFrames, std::max<std::int64_t>(budgetFramesLocked() / 2, 1));
  const std::int64_t last = std::min(count - 1, playhead_ + ahead);
  std::int64_t m = playhead_ + 1;
  while (m <= last && (cache_.count(m) || unreadable_.count(m))) ++m;
  if (m > last) return false;
  span = {m, last};
  return true;
}

// The next span below the cached run that holds the playhead (see the policy in the header).
bool FrameServer::planBackwardLocked(Span& span) const {
  const std::int64_t start = contiguousStartLocked(playhead_);
  if (start > playhead_ || start == 0) return false;  // playhead not cached yet, or at the start
  const std::int64_t last = start - 1;
  if (unreadable_.count(last)) return false;  // damaged frame: only on explicit request
  const std::int64_t capacity = aheadCapacityLocked();
  const std::int64_t ahead = playhead_ - start + 1;
  const std::int64_t room = capacity - ahead;
  const std::int64_t restOfGop = last - keyFrameNumber(last) + 1;
  // The span's newest frame, which the playhead needs first, comes out last. When the user
  // steps faster than frames decode, every span ends in a wait: keep spans short so each wait
  // stays under one plain back-step. Otherwise grow them (about twice what is cached ahead).
  // Until a few steps tell the pace, assume the worst (short spans cost little then).
  const bool outrun = stepSamples_ < 3 || decodeMs_ <= 0 || stepMs_ < decodeMs_;
  const std::int64_t pace = outrun ? kOutrunSpan : std::max(kShortestSpan, 2 * ahead);
  const std::int64_t size = std::min({room, restOfGop, windowFramesLocked(), pace});
  // Wait for room for a worthwhile span: a short one pays the GOP's pre-roll for few frames.
  const std::int64_t worthwhile =
      std::min({restOfGop, pace, std::max<std::int64_t>(1, capacity / 4)});
  if (size < worthwhile) return false;
  span = {last - size + 1, last};
  return true;
}

void FrameServer::decodeSpan(std::int64_t first, std::int64_t last,
                             std::unique_lock<std::mutex>& lock) {
  const std::uint64_t generation = generation_;
  jobActive_ = true;
  jobNext_ = first;
  jobLast_ = last;
  lock.unlock();
  std::exception_ptr error;
  const auto began = std::chrono::steady_clock::now();
  std::int64_t delivered = 0;
  try {
    reader_->decodeSpan(first, last, [&](DecodedFrame&& frame) {
      ++delivered;
      auto shared = std::make_shared<const DecodedFrame>(std::move(frame));
      std::vector<Ready> ready;
      {
        std::lock_guard inner(mutex_);
        if (generation_ != generation || stopping_) return false;  // cancelled
        jobNext_ = shared->index() + 1;
        insertLocked(std::move(shared), ready);
      }
      arrived_.notify_all();
      deliver(ready);
      return true;
    });
  } catch (...) {
    error = std::current_exception();
  }
  lock.lock();
  jobActive_ = false;
  if (delivered >= 8) {  // decode cost per kept frame, pre-roll included
    const double ms =
        std::chrono::duration<double, std::milli>(std::chrono::steady_clock::now() - began)
            .count() /
        static_cast<double>(delivered);
    decodeMs_ = decodeMs_ <= 0 ? ms : 0.5 * decodeMs_ + 0.5 * ms;
  }
  if (error) {
    unreadable_.insert(jobNext_);
    // Fail the demands this job was meant to answer (and any frame it could not reach).
    std::vector<Ready> ready;
    failLocked(jobNext_, last, error, ready);
    lock.unlock();
    arrived_.notify_all();
    deliver(ready);
    lock.lock();
  }
}

}  // namespace stridemark::video
