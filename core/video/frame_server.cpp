#include "video/frame_server.h"

#include <algorithm>

#include "common/error.h"

extern "C" {
#include <libavformat/avformat.h>
}

namespace stridemark::video {

namespace {

// Frames kept before the target of a cold jump: about one second of holding the back-step
// key, which gives the first window refill time to finish (VIDEO-NOTES §4.2.4).
constexpr std::int64_t kKeepBeforeJump = 30;

}  // namespace

FrameServer::FrameServer(const std::string& path, std::shared_ptr<const FrameIndex> index,
                         FrameServerOptions options)
    : index_(std::move(index)), options_(options), pool_(FramePool::create()) {
  if (!index_) throw Error(ErrorCategory::seek, path + ": no frame index given to the server");
  ReaderOptions readerOptions;
  readerOptions.decodeThreads = options_.decodeThreads;
  reader_ = std::make_unique<FrameReader>(path, index_, readerOptions, pool_);
  // Frame 0 tells the frame size; it also becomes the first cached frame.
  auto first = std::make_shared<const DecodedFrame>(reader_->frameAt(0));
  frameBytes_ = first->bytes();
  std::vector<Ready> none;
  insertLocked(std::move(first), none);
  stats_.windowFrames = windowFramesLocked();
  worker_ = std::thread([this] { workerLoop(); });
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
  index_->decodePosition(n);
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
      demandLocked(n, nullptr, nullptr, cancelled);
    }
  }
  wake_.notify_one();
  deliver(cancelled);
  return found;
}

void FrameServer::request(std::int64_t n, Callback done) {
  index_->decodePosition(n);
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
  if (found && done) done(n, std::move(found), nullptr);
}

void FrameServer::moveToLocked(std::int64_t n) {
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

std::int64_t FrameServer::windowFramesLocked() const {
  const auto budgetFrames =
      static_cast<std::int64_t>(options_.budgetBytes / std::max<std::size_t>(frameBytes_, 1));
  return std::clamp<std::int64_t>(budgetFrames / 2, 1, index_->frameCount());
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

// Evicts the frames least likely to be shown next: far behind the direction of travel first
// (weighted 4x), then far ahead. The playhead frame itself is kept.
void FrameServer::evictOverBudgetLocked() {
  while (cachedBytes_ > options_.budgetBytes && cache_.size() > 1) {
    const auto score = [this](std::int64_t n) {
      const std::int64_t d = n - playhead_;
      const bool behind = direction_ == Direction::forward ? d < 0 : d > 0;
      return behind ? 4 * std::abs(d) : std::abs(d);
    };
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
  // Backward: keep a window up to the target, but never cross into the previous GOP here (that
  // would make this step slower than a plain seek); the prefetch fills the rest.
  const std::int64_t keep =
      direction_ == Direction::backward ? windowFramesLocked() - 1 : kKeepBeforeJump;
  std::int64_t first = std::max(keyFrameNumber(n), n - keep);
  while (first < n && cache_.count(first)) ++first;
  // When the decoder already stands inside the span, continue from there instead of seeking
  // back (a forward step that outran the decode-ahead).
  const std::int64_t next = reader_->nextSequentialFrame();
  if (next > first && next <= n) first = next;
  decodeSpan(first, n, lock);
}

// Background work: decode ahead when moving forward; refill the window before the playhead
// when moving backward. Returns false when there is nothing to do.
bool FrameServer::runBackground(std::unique_lock<std::mutex>& lock) {
  const std::int64_t count = index_->frameCount();
  if (direction_ == Direction::forward) {
    const std::int64_t budgetFrames =
        static_cast<std::int64_t>(options_.budgetBytes / std::max<std::size_t>(frameBytes_, 1));
    const std::int64_t ahead =
        std::min(options_.aheadFrames, std::max<std::int64_t>(budgetFrames / 2, 1));
    const std::int64_t last = std::min(count - 1, playhead_ + ahead);
    std::int64_t m = playhead_ + 1;
    while (m <= last && (cache_.count(m) || unreadable_.count(m))) ++m;
    if (m > last) return false;
    decodeSpan(m, last, lock);
    return true;
  }
  const std::int64_t window = windowFramesLocked();
  const std::int64_t start = contiguousStartLocked(playhead_);
  if (start > playhead_ || start == 0) return false;  // playhead not cached yet, or at the start
  if (unreadable_.count(start - 1)) return false;     // damaged frame: only on explicit request
  // Refill as soon as less than a window is cached before the playhead: the cache holds the
  // window being stepped through plus the next one (window = budget / 2).
  if (playhead_ - start >= window) return false;
  // One refill never crosses into the previous GOP, so it costs at most one plain seek to
  // start-1; the next refill takes the GOP before.
  ++stats_.windowRefills;
  const std::int64_t last = start - 1;
  decodeSpan(std::max({std::int64_t{0}, last - window + 1, keyFrameNumber(last)}), last, lock);
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
  try {
    reader_->decodeSpan(first, last, [&](DecodedFrame&& frame) {
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
