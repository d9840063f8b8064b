#include "formats/file_io.h"

#include <fcntl.h>
#include <signal.h>
#include <sys/stat.h>
#include <unistd.h>

#include <cerrno>
#include <charconv>
#include <cstring>
#include <vector>

#include "common/error.h"

namespace stridemark::formats {
namespace fs = std::filesystem;
namespace {

std::string systemReason(int errorNumber) {
  return std::strerror(errorNumber);
}

// Closes a descriptor when it goes out of scope.
class Descriptor {
 public:
  explicit Descriptor(int fd) : fd_(fd) {}
  ~Descriptor() {
    if (fd_ >= 0) ::close(fd_);
  }
  Descriptor(const Descriptor&) = delete;
  Descriptor& operator=(const Descriptor&) = delete;
  int get() const { return fd_; }

 private:
  int fd_;
};

std::string kindOf(mode_t mode) {
  if (S_ISREG(mode)) return {};
  if (S_ISDIR(mode)) return "a folder";
  if (S_ISFIFO(mode)) return "a FIFO (named pipe)";
  if (S_ISCHR(mode) || S_ISBLK(mode)) return "a device";
  if (S_ISSOCK(mode)) return "a socket";
  return "not a regular file";
}

// Syncs a folder so a rename inside it survives a power cut. Best effort: some file systems
// refuse to open folders for reading, and the rename itself has already succeeded.
void syncFolder(const fs::path& folder) {
  const int fd = ::open(folder.c_str(), O_RDONLY | O_DIRECTORY | O_CLOEXEC);
  if (fd < 0) return;
  ::fsync(fd);
  ::close(fd);
}

fs::path folderOf(const fs::path& file) {
  return file.parent_path().empty() ? fs::path(".") : file.parent_path();
}

// The descriptor a standard-stream name stands for: /dev/stdout, /dev/stderr, /dev/fd/N,
// /proc/self/fd/N. These are written through the descriptor the program already holds, so a
// shell's `>>` appends and a pipe gets the bytes.
std::optional<int> standardStream(const fs::path& path) {
  const std::string text = path.lexically_normal().string();
  if (text == "/dev/stdout") return 1;
  if (text == "/dev/stderr") return 2;
  for (const std::string_view prefix : {"/dev/fd/", "/proc/self/fd/"}) {
    if (text.rfind(prefix, 0) != 0) continue;
    int fd = -1;
    const char* begin = text.data() + prefix.size();
    const char* end = text.data() + text.size();
    const auto [ptr, ec] = std::from_chars(begin, end, fd);
    if (ec == std::errc() && ptr == end && begin != end) return fd;
  }
  return std::nullopt;
}

// Follows symlinks at the last path component until a non-link (or a missing file) is reached:
// the file a save must replace. A standard-stream name stops the walk (the kernel's links under
// /proc name pipes and terminals, not paths).
fs::path followLinks(fs::path path, const fs::path& named) {
  for (int hops = 0; hops < 40; ++hops) {
    if (standardStream(path)) return path;
    struct stat info {};
    if (::lstat(path.c_str(), &info) != 0 || !S_ISLNK(info.st_mode)) return path;
    std::vector<char> buffer(static_cast<std::size_t>(info.st_size > 0 ? info.st_size : 255) + 1);
    const ssize_t length = ::readlink(path.c_str(), buffer.data(), buffer.size());
    if (length < 0 || static_cast<std::size_t>(length) >= buffer.size()) break;
    const fs::path linked(std::string(buffer.data(), static_cast<std::size_t>(length)));
    path = linked.is_absolute() ? linked : folderOf(path) / linked;
  }
  throw Error(ErrorCategory::io, named.string() +
                                     ": too many levels of symbolic links — point the link at "
                                     "a file, or give the file's own path");
}

bool processIsGone(pid_t pid) {
  return ::kill(pid, 0) != 0 && errno == ESRCH;
}

}  // namespace

std::vector<fs::path> removeStaleTemporaries(const fs::path& target) {
  const std::string prefix = "." + target.filename().string() + ".smtmp-";
  std::vector<fs::path> removed;
  std::error_code ec;
  for (fs::directory_iterator it(folderOf(target), ec), end; !ec && it != end; it.increment(ec)) {
    const std::string entry = it->path().filename().string();
    if (entry.size() <= prefix.size() || entry.compare(0, prefix.size(), prefix) != 0) continue;
    const std::string_view rest = std::string_view(entry).substr(prefix.size());
    pid_t pid = 0;
    const auto [ptr, parsed] = std::from_chars(rest.data(), rest.data() + rest.size(), pid);
    const std::string_view suffix(ptr, static_cast<std::size_t>(rest.data() + rest.size() - ptr));
    if (parsed != std::errc() || pid <= 0 || suffix.size() != 7 || suffix.front() != '-') continue;
    if (pid == ::getpid() || !processIsGone(pid)) continue;
    struct stat info {};
    if (::lstat(it->path().c_str(), &info) != 0 || !S_ISREG(info.st_mode) ||
        info.st_uid != ::geteuid())
      continue;
    if (::unlink(it->path().c_str()) == 0) removed.push_back(it->path());
  }
  return removed;
}

std::string nonRegularKind(const fs::path& path) {
  struct stat info {};
  if (::stat(path.c_str(), &info) != 0) return {};
  return kindOf(info.st_mode);
}

std::optional<FileIdentity> fileIdentity(const fs::path& path) {
  struct stat info {};
  if (::stat(path.c_str(), &info) != 0) return std::nullopt;
  return FileIdentity{static_cast<std::uint64_t>(info.st_dev),
                      static_cast<std::uint64_t>(info.st_ino)};
}

std::string readWholeFile(const fs::path& path) {
  // O_NONBLOCK: opening a FIFO must not wait for a writer; it has no effect on regular files.
  const Descriptor file(::open(path.c_str(), O_RDONLY | O_NONBLOCK | O_CLOEXEC));
  if (file.get() < 0) {
    throw Error(ErrorCategory::io, path.string() + ": cannot open (" + systemReason(errno) +
                                       ") — check the path and the file's permissions");
  }
  struct stat info {};
  if (::fstat(file.get(), &info) != 0) {
    throw Error(ErrorCategory::io, path.string() + ": cannot read (" + systemReason(errno) + ")");
  }
  if (!S_ISREG(info.st_mode)) {
    throw Error(ErrorCategory::io, path.string() + ": is " + kindOf(info.st_mode) +
                                       ", not a file — give the path of the file itself");
  }
  std::string content;
  char buffer[1 << 16];
  while (true) {
    const ssize_t got = ::read(file.get(), buffer, sizeof buffer);
    if (got == 0) break;
    if (got < 0) {
      if (errno == EINTR) continue;
      throw Error(ErrorCategory::io, path.string() + ": read failed (" + systemReason(errno) +
                                         ") — check the disk or copy the file elsewhere");
    }
    content.append(buffer, static_cast<std::size_t>(got));
  }
  return content;
}

std::string temporaryNamePrefix(std::string_view targetName, pid_t pid) {
  return "." + std::string(targetName) + ".smtmp-" + std::to_string(pid) + "-";
}

AtomicFile::AtomicFile(fs::path target, Durability durability)
    : target_(std::move(target)), durability_(durability) {
  if (const auto stream = standardStream(target_)) {
    openDirect(::dup(*stream));
    return;
  }
  destination_ = followLinks(target_, target_);
  if (const auto stream = standardStream(destination_)) {
    openDirect(::dup(*stream));
    return;
  }
  struct stat existing {};
  if (::stat(destination_.c_str(), &existing) == 0 && !S_ISREG(existing.st_mode)) {
    if (S_ISDIR(existing.st_mode)) {
      throw Error(ErrorCategory::io,
                  target_.string() + ": is a folder — give a file name for this output");
    }
    // A device or FIFO cannot be replaced; write into it (a FIFO waits for its reader).
    openDirect(::open(destination_.c_str(), O_WRONLY | O_CLOEXEC));
    return;
  }
  openTemporary();
}

void AtomicFile::openDirect(int fd) {
  direct_ = true;
  if (destination_.empty()) destination_ = target_;
  fd_ = fd;
  if (fd_ < 0) fail("cannot open for writing", errno);
}

void AtomicFile::openTemporary() {
  const fs::path folder = folderOf(destination_);
  const std::string name = destination_.filename().string();
  removeStaleTemporaries(destination_);
  const std::string pattern = (folder / temporaryNamePrefix(name, ::getpid())).string() + "XXXXXX";
  std::vector<char> buffer(pattern.begin(), pattern.end());
  buffer.push_back('\0');
  fd_ = ::mkstemp(buffer.data());
  if (fd_ < 0) fail("cannot create a temporary file in its folder", errno);
  temp_ = buffer.data();
  // mkstemp creates 0600; keep the old file's mode, or use the usual 0644 for a new one.
  struct stat old {};
  const mode_t mode = ::stat(destination_.c_str(), &old) == 0 ? (old.st_mode & 07777) : 0644;
  ::fchmod(fd_, mode);
}

AtomicFile::~AtomicFile() {
  if (fd_ >= 0) ::close(fd_);
  if (!committed_ && !temp_.empty()) ::unlink(temp_.c_str());
}

void AtomicFile::fail(std::string_view what, int errorNumber) {
  const std::string reason = " (" + systemReason(errorNumber) + ")";
  if (direct_) {
    throw Error(ErrorCategory::io, target_.string() + ": " + std::string(what) + reason +
                                       " — this output is a device, pipe or standard stream "
                                       "written directly, so what it received may be "
                                       "incomplete; check it, or write to a regular file");
  }
  throw Error(ErrorCategory::io, target_.string() + ": " + std::string(what) + reason +
                                     " — the previous file, if any, is unchanged; check the "
                                     "folder's permissions and free space");
}

void AtomicFile::write(std::string_view bytes) {
  while (!bytes.empty()) {
    const ssize_t wrote = ::write(fd_, bytes.data(), bytes.size());
    if (wrote < 0) {
      if (errno == EINTR) continue;
      fail("write failed", errno);
    }
    bytes.remove_prefix(static_cast<std::size_t>(wrote));
  }
}

void AtomicFile::finish() {
  if (finished_) return;
  const bool durable = durability_ == Durability::survivePowerLoss;
  // Pipes and terminals cannot be synced (EINVAL); that is no failure of the write.
  if (durable && ::fsync(fd_) != 0 && !(direct_ && (errno == EINVAL || errno == EROFS)))
    fail("could not flush to disk", errno);
  const int closed = ::close(fd_);
  fd_ = -1;
  if (closed != 0)
    fail(direct_ ? "could not finish the write" : "could not close the temporary file", errno);
  finished_ = true;
}

void AtomicFile::commit() {
  finish();
  if (direct_) {
    committed_ = true;
    return;
  }
  if (::rename(temp_.c_str(), destination_.c_str()) != 0) fail("could not replace the file", errno);
  committed_ = true;
  if (durability_ == Durability::survivePowerLoss) syncFolder(folderOf(destination_));
}

void writeFileAtomically(const fs::path& path, std::string_view content, Durability durability) {
  AtomicFile file(path, durability);
  file.write(content);
  file.commit();
}

}  // namespace stridemark::formats
