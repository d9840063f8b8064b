#pragma once
// Test helpers shared by the suites that run programs: private temp folders, whole-file text
// I/O and running a shell command line with its exit code, stdout and stderr captured.
#include <sys/wait.h>
#include <unistd.h>

#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <random>
#include <sstream>
#include <string>

namespace stridemark::testsupport {

class TempFolder {
 public:
  explicit TempFolder(const std::string& prefix = "stridemark-test-") {
    std::random_device seed;
    path_ = std::filesystem::temp_directory_path() /
            (prefix + std::to_string(seed()) + std::to_string(seed()));
    std::filesystem::create_directories(path_);
  }
  ~TempFolder() {
    std::error_code ec;
    // A test may have made the folder read-only; make it removable again.
    std::filesystem::permissions(path_, std::filesystem::perms::owner_all,
                                 std::filesystem::perm_options::add, ec);
    std::filesystem::remove_all(path_, ec);
  }
  TempFolder(const TempFolder&) = delete;
  TempFolder& operator=(const TempFolder&) = delete;
  const std::filesystem::path& path() const { return path_; }
  std::filesystem::path operator/(const std::string& name) const { return path_ / name; }

 private:
  std::filesystem::path path_;
};

// A pid that certainly ran and has ended: a child that exits at once, reaped.
inline pid_t finishedPid() {
  const pid_t child = ::fork();
  if (child == 0) ::_exit(0);
  int status = 0;
  ::waitpid(child, &status, 0);
  return child;
}

inline void writeText(const std::filesystem::path& path, const std::string& text) {
  std::ofstream out(path, std::ios::binary);
  out << text;
}

inline std::string readText(const std::filesystem::path& path) {
  std::ifstream in(path, std::ios::binary);
  std::stringstream buffer;
  buffer << in.rdbuf();
  return buffer.str();
}

inline std::string shellQuote(const std::string& s) {
  std::string out = "'";
  for (const char c : s) {
    if (c == '\'') {
      out += "'\\''";
    } else {
      out += c;
    }
  }
  return out + "'";
}

struct ProcessResult {
  int exitCode = -1;
  std::string out;
  std::string err;
};

// Runs a shell command line with no standard input, capturing exit code, stdout and stderr.
inline ProcessResult runShell(const std::string& commandLine) {
  TempFolder folder;
  const auto outPath = folder / "stdout";
  const auto errPath = folder / "stderr";
  const std::string full = commandLine + " >" + shellQuote(outPath.string()) + " 2>" +
                           shellQuote(errPath.string()) + " </dev/null";
  const int status = std::system(full.c_str());
  ProcessResult result;
  result.exitCode = WIFEXITED(status) ? WEXITSTATUS(status) : -1;
  result.out = readText(outPath);
  result.err = readText(errPath);
  return result;
}

}  // namespace stridemark::testsupport
