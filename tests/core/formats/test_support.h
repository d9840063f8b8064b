#pragma once
// Helpers shared by the formats tests: private temp folders and running the Debian Python
// (the reference tool for CSV/JSON loading; it sees python3-pandas, the python3 on PATH may not).
#include <gtest/gtest.h>
#include <sys/wait.h>

#include <cstdio>
#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <random>
#include <sstream>
#include <string>

namespace stridemark::testing {

class TempFolder {
 public:
  TempFolder() {
    std::random_device seed;
    path_ = std::filesystem::temp_directory_path() /
            ("stridemark-formats-" + std::to_string(seed()) + std::to_string(seed()));
    std::filesystem::create_directories(path_);
  }
  ~TempFolder() {
    std::error_code ec;
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

// Runs a shell command line, capturing exit code, stdout and stderr through temp files.
inline ProcessResult runShell(const std::string& commandLine) {
  TempFolder folder;
  const auto outPath = folder / "stdout";
  const auto errPath = folder / "stderr";
  const std::string full =
      commandLine + " >" + shellQuote(outPath.string()) + " 2>" + shellQuote(errPath.string());
  const int status = std::system(full.c_str());
  ProcessResult result;
  result.exitCode = WIFEXITED(status) ? WEXITSTATUS(status) : -1;
  result.out = readText(outPath);
  result.err = readText(errPath);
  return result;
}

// Runs a Python script with Debian's /usr/bin/python3 (scipy, pandas).
inline ProcessResult runDebianPython(const std::string& script) {
  TempFolder folder;
  const auto scriptPath = folder / "check.py";
  writeText(scriptPath, script);
  return runShell("/usr/bin/python3 " + shellQuote(scriptPath.string()));
}

}  // namespace stridemark::testing
