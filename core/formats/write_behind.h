#pragma once
// Writing a large file from a thread of its own, past the page cache. In a virtual machine,
// copying a 56 MB report into the page cache took 80-180 ms of kernel time (fresh pages for
// the kernel cost as much as fresh pages for us), against ~30 ms written direct: as long as the
// scoring it held up when the scoring thread wrote it itself (tests/bench/score_bench).
#include <condition_variable>
#include <cstddef>
#include <cstdlib>
#include <exception>
#include <filesystem>
#include <memory>
#include <mutex>
#include <string_view>
#include <thread>
#include <vector>

#include "formats/file_io.h"

namespace stridemark::formats {

// An AtomicFile written behind the caller. write() copies the bytes into one of a few reused
// 1 MiB buffers and returns; a thread of its own passes full buffers to the file, in order.
// Past the first few MiB the file is written direct (AtomicFile::setDirect) while the disk keeps
// up (a slow disk would otherwise make the caller wait for it; the page cache then takes over).
// A write error is thrown from the next write() or from commit(). Destroying it uncommitted
// leaves the target as it was (see AtomicFile).
class WriteBehindFile {
 public:
  explicit WriteBehindFile(std::filesystem::path target,
                           Durability durability = Durability::survivePowerLoss);
  ~WriteBehindFile();
  WriteBehindFile(const WriteBehindFile&) = delete;
  WriteBehindFile& operator=(const WriteBehindFile&) = delete;

  void write(std::string_view bytes);
  // Waits for every byte to reach the file, then commits it (AtomicFile::commit).
  void commit();

  static constexpr std::size_t kBuffer = std::size_t{1} << 20;

 private:
  static constexpr std::size_t kBuffers = 4;  // the caller runs at most 3 MiB ahead
  // Small files stay buffered: a direct write waits for the disk, which only pays on volume.
  static constexpr std::size_t kDirectFrom = 4 * kBuffer;
  // Direct writes slower than this (a spinning or network disk) go back to the page cache.
  static constexpr double kSlowestDirectBytesPerSecond = 250e6;
  static constexpr int kSlowDirectWritesAllowed = 3;

  struct Free {
    void operator()(char* p) const { std::free(p); }
  };
  struct Buffer {
    std::unique_ptr<char, Free> bytes;  // aligned for direct writes
    std::size_t size = 0;
  };
  static Buffer newBuffer();

  void handOff();                       // queues filling_ and takes a free buffer
  void stopWriter();                    // lets the writer finish the queue and joins it
  void writeQueued();                   // the writer thread
  void writeOut(const Buffer& buffer);  // on the writer thread

  AtomicFile file_;
  std::mutex mutex_;
  std::condition_variable changed_;
  std::vector<Buffer> queued_;  // full buffers, oldest first
  std::vector<Buffer> spare_;   // written buffers, ready for reuse
  std::size_t buffers_ = 1;     // buffers in existence
  Buffer filling_;              // the caller's current buffer
  std::exception_ptr failure_;
  bool stopping_ = false;
  std::size_t written_ = 0;   // writer thread only
  int slowDirectWrites_ = 0;  // writer thread only
  std::thread writer_;        // last: it starts once every member above exists
};

}  // namespace stridemark::formats
