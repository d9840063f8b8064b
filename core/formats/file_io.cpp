#include "formats/file_io.h"

#include <fcntl.h>
#include <signal.h>
#include <sys/stat.h>
#include <unistd.h>

#include <algorithm>
#include <cctype>
#include <cerrno>
#include <cstdio>
#include <cstring>
#include <memory>
#include <vector>

#include "common/error.h"

namespace stridemark::formats {
namespace {

struct FileCloser {
  void operator()(std::FILE* f) const { std::fclose(f); }
};
using FileHandle = std::unique_ptr<std::FILE, FileCloser>;

std::string systemReason(int errorNumber) {
  return std::strerror(errorNumber);
}

// Syncs a folder so a rename inside it survives a power cut. Best effort: some file systems
// refuse to open folders for reading, and the rename itself has already succeeded.
void syncFolder(const std::filesystem::path& folder) {
  const int fd = ::open(folder.c_str(), O_RDONLY | O_DIRECTORY | O_CLOEXEC);
  if (fd < 0) return;
  ::fsync(fd);
  ::close(fd);
}

// The writer's pid when `name` is `<base>.tmp-<pid>-XXXXXX` (mkstemp's six characters), else 0.
pid_t temporaryWriter(const std::string& name, const std::string& base) {
  const std::string prefix = base + ".tmp-";
  if (name.size() <= prefix.size() + 7 || name.compare(0, prefix.size(), prefix) != 0) return 0;
  const std::string rest = name.substr(prefix.size());
  const auto dash = rest.find('-');
  if (dash == 0 || dash == std::string::npos || dash > 9 || rest.size() - dash - 1 != 6) return 0;
  const std::string digits = rest.substr(0, dash);
  if (!std::all_of(digits.begin(), digits.end(), [](unsigned char c) { return std::isdigit(c); }))
    return 0;
  const std::string suffix = rest.substr(dash + 1);
  if (!std::all_of(suffix.begin(), suffix.end(), [](unsigned char c) { return std::isalnum(c); }))
    return 0;
  return static_cast<pid_t>(std::stol(digits));
}

// kill(pid, 0) probes without sending: EPERM means alive but someone else's.
bool processIsRunning(pid_t pid) {
  return pid == ::getpid() || ::kill(pid, 0) == 0 || errno != ESRCH;
}

}  // namespace

std::vector<std::filesystem::path> removeStaleTemporaries(const std::filesystem::path& target) {
  std::vector<std::filesystem::path> removed;
  std::filesystem::path folder = target.parent_path();
  if (folder.empty()) folder = ".";
  const std::string base = target.filename().string();
  std::error_code ec;
  for (std::filesystem::directory_iterator it(folder, ec), end; !ec && it != end;
       it.increment(ec)) {
    const pid_t writer = temporaryWriter(it->path().filename().string(), base);
    if (writer <= 0 || processIsRunning(writer)) continue;
    std::error_code kindError;
    if (!it->is_regular_file(kindError) || it->is_symlink(kindError)) continue;
    if (std::filesystem::remove(it->path(), kindError)) removed.push_back(it->path());
  }
  return removed;
}

std::string readWholeFile(const std::filesystem::path& path) {
  std::error_code ec;
  if (std::filesystem::is_directory(path, ec)) {
    throw Error(ErrorCategory::io,
                path.string() + ": is a folder, not a file — give the path of the file itself");
  }
  FileHandle file(std::fopen(path.c_str(), "rb"));
  if (!file) {
    throw Error(ErrorCategory::io, path.string() + ": cannot open (" + systemReason(errno) +
                                       ") — check the path and the file's permissions");
  }
  std::string content;
  char buffer[1 << 16];
  std::size_t got = 0;
  while ((got = std::fread(buffer, 1, sizeof buffer, file.get())) > 0) content.append(buffer, got);
  if (std::ferror(file.get())) {
    throw Error(ErrorCategory::io, path.string() + ": read failed (" + systemReason(errno) +
                                       ") — check the disk or copy the file elsewhere");
  }
  return content;
}

AtomicFile::AtomicFile(std::filesystem::path target, Durability durability)
    : target_(std::move(target)), durability_(durability) {
  std::filesystem::path folder = target_.parent_path();
  if (folder.empty()) folder = ".";
  std::string pattern =
      (folder / target_.filename()).string() + ".tmp-" + std::to_string(::getpid()) + "-XXXXXX";
  std::vector<char> name(pattern.begin(), pattern.end());
  name.push_back('\0');
  fd_ = ::mkstemp(name.data());
  if (fd_ < 0) fail("cannot create a temporary file in its folder", errno);
  temp_ = name.data();
  // mkstemp creates 0600; keep the old file's mode, or use the usual 0644 for a new one.
  struct stat old {};
  const mode_t mode = ::stat(target_.c_str(), &old) == 0 ? (old.st_mode & 07777) : 0644;
  ::fchmod(fd_, mode);
}

AtomicFile::~AtomicFile() {
  if (fd_ >= 0) ::close(fd_);
  if (!committed_ && !temp_.empty()) ::unlink(temp_.c_str());
}

void AtomicFile::fail(std::string_view what, int errorNumber) {
  throw Error(ErrorCategory::io, target_.string() + ": " + std::string(what) + " (" +
                                     systemReason(errorNumber) +
                                     ") — the previous file, if any, is unchanged; check the "
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

void AtomicFile::commit() {
  const bool durable = durability_ == Durability::survivePowerLoss;
  if (durable && ::fsync(fd_) != 0) fail("could not flush to disk", errno);
  const int closed = ::close(fd_);
  fd_ = -1;
  if (closed != 0) fail("could not close the temporary file", errno);
  if (::rename(temp_.c_str(), target_.c_str()) != 0) fail("could not replace the file", errno);
  committed_ = true;
  if (durable)
    syncFolder(target_.parent_path().empty() ? std::filesystem::path(".") : target_.parent_path());
}

void writeFileAtomically(const std::filesystem::path& path, std::string_view content,
                         Durability durability) {
  AtomicFile file(path, durability);
  file.write(content);
  file.commit();
}

}  // namespace stridemark::formats
