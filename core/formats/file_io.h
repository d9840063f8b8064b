#pragma once
// Whole-file reads and crash-safe writes. A save either replaces the old file completely or
// leaves it untouched: we write `<file>.tmp-<pid>-XXXXXX` beside it, fsync, then rename over it.
// The writer's pid in the name lets a later run tell a killed writer's leftovers from a live one's.
#include <filesystem>
#include <string>
#include <string_view>
#include <vector>

namespace stridemark::formats {

// Reads a whole file into memory. Throws Error(io) naming the file and the system's reason.
std::string readWholeFile(const std::filesystem::path& path);

// What a committed file survives. Every write is atomic for readers (they see the old file or the
// whole new one). The user's work (projects, events CSVs, the journal) must also survive a power
// cut, which costs an fsync: waiting for the disk. Derived outputs (reports, tables) can be made
// again from the project in a second, so they skip it; the kernel still writes them out soon.
enum class Durability { survivePowerLoss, regenerable };

// Streams content into a temporary file in the target's folder; commit() makes it the target.
// Destroying an uncommitted AtomicFile removes the temporary file and leaves the target as it was.
class AtomicFile {
 public:
  explicit AtomicFile(std::filesystem::path target,
                      Durability durability = Durability::survivePowerLoss);
  ~AtomicFile();
  AtomicFile(const AtomicFile&) = delete;
  AtomicFile& operator=(const AtomicFile&) = delete;

  void write(std::string_view bytes);
  // fsync (survivePowerLoss), close, rename over the target, fsync the folder (survivePowerLoss)
  void commit();

 private:
  [[noreturn]] void fail(std::string_view what, int errorNumber);
  std::filesystem::path target_;
  std::filesystem::path temp_;
  Durability durability_;
  int fd_ = -1;
  bool committed_ = false;
};

// One-shot form of AtomicFile for content already in memory.
void writeFileAtomically(const std::filesystem::path& path, std::string_view content,
                         Durability durability = Durability::survivePowerLoss);

// Removes what killed writers left of `target`: only regular files named exactly
// `<target name>.tmp-<pid>-XXXXXX` whose pid is no running process on this machine; nothing else.
// A pid means nothing on another machine, so call this only for files this process owns (the
// desk holds the project's lock). Best effort, never throws; returns the files removed.
std::vector<std::filesystem::path> removeStaleTemporaries(const std::filesystem::path& target);

}  // namespace stridemark::formats
