#pragma once
#include <string>
#include <vector>

namespace stridemark::cli {

// Exit codes (DESIGN §5): 0 success, 1 bad input, 2 usage error, 3 internal failure.
inline constexpr int kExitOk = 0;
inline constexpr int kExitBadInput = 1;
inline constexpr int kExitUsage = 2;
inline constexpr int kExitInternal = 3;

// Parses argv, runs the verb and turns every error into a message on stderr and an exit code.
int runCommandLine(int argc, char** argv);

}  // namespace stridemark::cli
