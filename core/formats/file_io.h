#pragma once
// Whole-file reads and crash-safe writes. A save either replaces the old file completely or
// leaves it untouched: we write a hidden temporary file beside it, fsync, then rename over it.
#include <sys/types.h>

#include <cstdint>
#include <filesystem>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

namespace stridemark::formats {

// Reads a whole regular file into memory. A folder, FIFO, device or socket is refused at once
// (a FIFO would block until some other program writes to it). Throws Error(io) naming the file
// and the system's reason.
std::string readWholeFile(const std::filesystem::path& path);

// What a path names, following symlinks: "a folder", "a FIFO (named pipe)", "a device", "a
// socket"; empty for a regular file or a path that does not exist. Never blocks.
std::string nonRegularKind(const std::filesystem::path& path);

// The file a path names, following symlinks; two paths with equal identities are one file (a
// hard link, a symlink or another spelling of the same path). nullopt when nothing is there.
struct FileIdentity {
  std::uint64_t device = 0;
  std::uint64_t inode = 0;
  friend bool operator==(const FileIdentity&, const FileIdentity&) = default;
};
std::optional<FileIdentity> fileIdentity(const std::filesystem::path& path);

// What a committed file survives. Every write is atomic for readers (they see the old file or the
// whole new one). The user's work (projects, events CSVs, the journal) must also survive a power
// cut, which costs an fsync: waiting for the disk. Derived outputs (reports, tables) can be made
// again from the project in a second, so they skip it; the kernel still writes them out soon.
enum class Durability { survivePowerLoss, regenerable };

// Streams content into a temporary file in the target's folder; commit() makes it the target.
// Destroying an uncommitted AtomicFile removes the temporary file and leaves the target as it was.
//
// Where the content lands: a symlink is followed to the file it names (the link stays, the file
// it points to is replaced atomically in that file's folder). A device, FIFO or socket, and the
// standard streams (/dev/stdout, /dev/stderr, /dev/fd/N), are written directly: they cannot be
// replaced, and a write error there (for example /dev/full) is reported like any other.
//
// Temporary files are named `.<name>.smtmp-<pid>-XXXXXX`. Opening an AtomicFile removes those of
// the same target left by a process that no longer runs (a killed earlier run), never others.
class AtomicFile {
 public:
  explicit AtomicFile(std::filesystem::path target,
                      Durability durability = Durability::survivePowerLoss);
  ~AtomicFile();
  AtomicFile(const AtomicFile&) = delete;
  AtomicFile& operator=(const AtomicFile&) = delete;

  void write(std::string_view bytes);
  // fsync (survivePowerLoss) and close: the content is complete, the target not yet replaced.
  void finish();
  // finish() when not done yet, rename over the target, fsync the folder (survivePowerLoss).
  void commit();

  // True when commit() renames a temporary file (a regular file, new or old); false when the
  // content goes straight to a device, FIFO or standard stream.
  bool replacesByRename() const { return !direct_; }
  // The file the content goes to: the target with its symlinks followed.
  const std::filesystem::path& destination() const { return destination_; }

 private:
  [[noreturn]] void fail(std::string_view what, int errorNumber);
  void openDirect(int fd);
  void openTemporary();
  std::filesystem::path target_;
  std::filesystem::path destination_;
  std::filesystem::path temp_;
  Durability durability_;
  int fd_ = -1;
  bool direct_ = false;
  bool finished_ = false;
  bool committed_ = false;
};

// One-shot form of AtomicFile for content already in memory.
void writeFileAtomically(const std::filesystem::path& path, std::string_view content,
                         Durability durability = Durability::survivePowerLoss);

// The pattern of our temporary names, for tests and for the clean-up: `.<name>.smtmp-<pid>-`.
std::string temporaryNamePrefix(std::string_view targetName, pid_t pid);

// Removes what killed writers left of `target`: only regular files of ours named exactly
// `.<target name>.smtmp-<pid>-XXXXXX` whose pid is no running process; nothing else. Every
// atomic write calls it for its own file; the desk also calls it for a project and its journal
// once it holds their lock. A pid means nothing on another machine. Best effort, never throws;
// returns the files removed.
std::vector<std::filesystem::path> removeStaleTemporaries(const std::filesystem::path& target);

}  // namespace stridemark::formats
