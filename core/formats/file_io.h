#pragma once
// Whole-file reads and crash-safe writes. A save either replaces the old file completely or
// leaves it untouched: we write `<file>.tmp-XXXXXX` beside it, fsync, then rename over it.
#include <filesystem>
#include <string>
#include <string_view>

namespace stridemark::formats {

// Reads a whole file into memory. Throws Error(io) naming the file and the system's reason.
std::string readWholeFile(const std::filesystem::path& path);

// Streams content into a temporary file in the target's folder; commit() makes it the target.
// Destroying an uncommitted AtomicFile removes the temporary file and leaves the target as it was.
class AtomicFile {
 public:
  explicit AtomicFile(std::filesystem::path target);
  ~AtomicFile();
  AtomicFile(const AtomicFile&) = delete;
  AtomicFile& operator=(const AtomicFile&) = delete;

  void write(std::string_view bytes);
  void commit();  // fsync, close, rename over the target, fsync the folder

 private:
  [[noreturn]] void fail(std::string_view what, int errorNumber);
  std::filesystem::path target_;
  std::filesystem::path temp_;
  int fd_ = -1;
  bool committed_ = false;
};

// One-shot form of AtomicFile for content already in memory.
void writeFileAtomically(const std::filesystem::path& path, std::string_view content);

}  // namespace stridemark::formats
