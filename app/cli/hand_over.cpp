#include "cli/hand_over.h"

#include <unistd.h>

#include <cerrno>
#include <cstring>
#include <filesystem>
#include <iostream>
#include <system_error>

#include "cli/run.h"

namespace stridemark::cli {
namespace {

// The folder of this executable: /proc/self/exe, else the path it was started by.
std::filesystem::path ownFolder(const char* argv0) {
  std::error_code ec;
  const std::filesystem::path self = std::filesystem::read_symlink("/proc/self/exe", ec);
  if (!ec) return self.parent_path();
  return std::filesystem::path(argv0 != nullptr ? argv0 : "").parent_path();
}

}  // namespace

int handOverToFullCommandLine(char** argv) {
  const std::filesystem::path full = ownFolder(argv[0]) / "stridemark-full";
  ::execv(full.c_str(), argv);  // returns only on failure
  const int reason = errno;
  std::cerr << "stridemark: cannot run " << full.string() << " (" << std::strerror(reason)
            << "), which carries every verb but score - rebuild Stridemark (bash .ci/build ci) "
               "or reinstall it with both programs in one folder\n";
  return kExitInternal;
}

}  // namespace stridemark::cli
