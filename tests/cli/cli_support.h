#pragma once
// Runs the built `stridemark` binary (path from CMake: STRIDEMARK_EXE) and captures its exit
// code, stdout and stderr; private temp folders for inputs and outputs.
#include <sys/wait.h>

#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <random>
#include <sstream>
#include <string>
#include <vector>

namespace stridemark::clitest {

class TempFolder {
 public:
  TempFolder() {
    std::random_device seed;
    path_ = std::filesystem::temp_directory_path() /
            ("stridemark-cli-" + std::to_string(seed()) + std::to_string(seed()));
    std::filesystem::create_directories(path_);
  }
  ~TempFolder() {
    std::error_code ec;
    std::filesystem::remove_all(path_, ec);
  }
  TempFolder(const TempFolder&) = delete;
  TempFolder& operator=(const TempFolder&) = delete;
  const std::filesystem::path& path() const { return path_; }
  std::string operator/(const std::string& name) const { return (path_ / name).string(); }

 private:
  std::filesystem::path path_;
};

inline void writeText(const std::string& path, const std::string& text) {
  std::ofstream out(path, std::ios::binary);
  out << text;
}

inline std::string readText(const std::string& path) {
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

struct CliRun {
  int exitCode = -1;
  std::string out;
  std::string err;
};

inline CliRun runShell(const std::string& commandLine) {
  TempFolder folder;
  const std::string outPath = folder / "stdout";
  const std::string errPath = folder / "stderr";
  const std::string full =
      commandLine + " >" + shellQuote(outPath) + " 2>" + shellQuote(errPath) + " </dev/null";
  const int status = std::system(full.c_str());
  CliRun run;
  run.exitCode = WIFEXITED(status) ? WEXITSTATUS(status) : -1;
  run.out = readText(outPath);
  run.err = readText(errPath);
  return run;
}

inline CliRun runStridemark(const std::vector<std::string>& args) {
  std::string commandLine = shellQuote(STRIDEMARK_EXE);
  for (const auto& arg : args) commandLine += " " + shellQuote(arg);
  return runShell(commandLine);
}

}  // namespace stridemark::clitest
