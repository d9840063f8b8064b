#pragma once
// Shared by the libFuzzer targets: inputs as text, a temp file for readers that take a path,
// and one way to report a broken promise (a crash libFuzzer records with its input).
#include <unistd.h>

#include <cstdint>
#include <cstdio>
#include <cstdlib>
#include <fstream>
#include <string>
#include <string_view>

namespace stridemark::fuzz {

inline std::string_view asText(const std::uint8_t* data, std::size_t size) {
  return {reinterpret_cast<const char*>(data), size};
}

// A property every accepted input must keep (e.g. "what we write, we read back the same").
inline void require(bool holds, const char* promise) {
  if (holds) return;
  std::fprintf(stderr, "fuzz: broken promise: %s\n", promise);
  std::abort();
}

// Keeps a computed value alive so the optimiser cannot drop the call that made it.
inline volatile std::int64_t keptValue = 0;
inline void keep(std::int64_t value) {
  keptValue = value;
}

// One file per process under $TMPDIR, rewritten for every input and removed at exit.
class InputFile {
 public:
  explicit InputFile(const char* suffix) {
    const char* tmp = std::getenv("TMPDIR");
    path_ = std::string(tmp && *tmp ? tmp : "/tmp") + "/stridemark-fuzz-" +
            std::to_string(::getpid()) + suffix;
  }
  ~InputFile() { std::remove(path_.c_str()); }
  InputFile(const InputFile&) = delete;
  InputFile& operator=(const InputFile&) = delete;

  const std::string& write(const std::uint8_t* data, std::size_t size) {
    std::ofstream out(path_, std::ios::binary | std::ios::trunc);
    out.write(reinterpret_cast<const char*>(data), static_cast<std::streamsize>(size));
    out.close();
    require(static_cast<bool>(out), "the fuzz input file can be written");
    return path_;
  }

 private:
  std::string path_;
};

}  // namespace stridemark::fuzz
