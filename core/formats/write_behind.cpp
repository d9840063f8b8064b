#include "formats/write_behind.h"

#include <algorithm>
#include <chrono>
#include <cstring>
#include <new>
#include <utility>

namespace stridemark::formats {

WriteBehindFile::WriteBehindFile(std::filesystem::path target, Durability durability)
    : file_(std::move(target), durability),
      filling_(newBuffer()),
      writer_([this] { writeQueued(); }) {}

WriteBehindFile::~WriteBehindFile() {
  if (!writer_.joinable()) return;
  {
    std::lock_guard lock(mutex_);
    queued_.clear();  // not committed: the temporary file is removed anyway
  }
  stopWriter();
}

WriteBehindFile::Buffer WriteBehindFile::newBuffer() {
  char* bytes = static_cast<char*>(std::aligned_alloc(AtomicFile::kDirectAlignment, kBuffer));
  if (bytes == nullptr) throw std::bad_alloc();
  return Buffer{std::unique_ptr<char, Free>(bytes), 0};
}

void WriteBehindFile::write(std::string_view bytes) {
  while (!bytes.empty()) {
    const std::size_t n = std::min(bytes.size(), kBuffer - filling_.size);
    std::memcpy(filling_.bytes.get() + filling_.size, bytes.data(), n);
    filling_.size += n;
    bytes.remove_prefix(n);
    if (filling_.size == kBuffer) handOff();
  }
}

void WriteBehindFile::handOff() {
  std::unique_lock lock(mutex_);
  if (failure_) std::rethrow_exception(failure_);
  queued_.push_back(std::move(filling_));
  changed_.notify_all();
  if (spare_.empty() && buffers_ < kBuffers) {
    ++buffers_;
    lock.unlock();
    filling_ = newBuffer();
    return;
  }
  changed_.wait(lock, [this] { return !spare_.empty(); });
  filling_ = std::move(spare_.back());
  spare_.pop_back();
}

void WriteBehindFile::commit() {
  {
    std::lock_guard lock(mutex_);
    if (filling_.size > 0) queued_.push_back(std::move(filling_));
  }
  stopWriter();
  if (failure_) std::rethrow_exception(failure_);  // the writer has stopped: no lock needed
  file_.commit();
}

void WriteBehindFile::stopWriter() {
  {
    std::lock_guard lock(mutex_);
    stopping_ = true;
  }
  changed_.notify_all();
  writer_.join();
}

void WriteBehindFile::writeQueued() {
  std::unique_lock lock(mutex_);
  while (true) {
    changed_.wait(lock, [this] { return !queued_.empty() || stopping_; });
    if (queued_.empty()) return;  // stopping, and every buffer is written
    Buffer buffer = std::move(queued_.front());
    queued_.erase(queued_.begin());
    const bool failed = failure_ != nullptr;
    lock.unlock();
    std::exception_ptr error;
    if (!failed) {  // after an error the rest is dropped: the file will not be committed
      try {
        writeOut(buffer);
      } catch (...) {
        error = std::current_exception();
      }
    }
    buffer.size = 0;
    lock.lock();
    if (error) failure_ = error;
    spare_.push_back(std::move(buffer));
    changed_.notify_all();
  }
}

// Only a full buffer can be written direct (the last one is not), so every direct write starts
// at an aligned offset.
void WriteBehindFile::writeOut(const Buffer& buffer) {
  const std::string_view bytes(buffer.bytes.get(), buffer.size);
  const bool full = buffer.size == kBuffer;
  if (!file_.direct() && full && written_ >= kDirectFrom && written_ % kBuffer == 0 &&
      slowDirectWrites_ < kSlowDirectWritesAllowed)
    file_.setDirect(true);
  if (file_.direct() && !full) file_.setDirect(false);
  const bool direct = file_.direct();
  const auto start = std::chrono::steady_clock::now();
  file_.write(bytes);  // may itself fall back to buffered (see AtomicFile::write)
  written_ += bytes.size();
  if (!direct || !file_.direct()) return;
  const double seconds =
      std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count();
  if (seconds * kSlowestDirectBytesPerSecond > static_cast<double>(bytes.size())) {
    ++slowDirectWrites_;  // a hiccup, or a slow disk: after a few, buffered for good
    file_.setDirect(false);
  }
}

}  // namespace stridemark::formats
