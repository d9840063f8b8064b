#pragma once
// Shared by the libFuzzer targets: inputs as text, a temp file for readers that take a path,
// and one way to report a broken promise (a crash libFuzzer records with its input).
#include <unistd.h>

#include <algorithm>
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

// Two writings that must be equal; on a difference prints both around its first byte.
inline void requireSame(std::string_view first, std::string_view second, const char* promise) {
  if (first == second) return;
  std::size_t at = 0;
  while (at < first.size() && at < second.size() && first[at] == second[at]) ++at;
  const std::size_t from = at > 80 ? at - 80 : 0;
  std::fprintf(
      stderr, "fuzz: first difference at byte %zu\n--- first:\n%.*s\n--- second:\n%.*s\n", at,
      static_cast<int>(std::min<std::size_t>(first.size() - from, 200)), first.data() + from,
      static_cast<int>(std::min<std::size_t>(second.size() - from, 200)), second.data() + from);
  require(false, promise);
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
