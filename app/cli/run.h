#pragma once
#include <span>

#include "cli/verbs.h"

namespace stridemark::cli {

// Exit codes (contract in CHANGELOG.md): 0 success, 1 bad input, 2 usage error, 3 internal failure.
inline constexpr int kExitOk = 0;
inline constexpr int kExitBadInput = 1;
inline constexpr int kExitUsage = 2;
inline constexpr int kExitInternal = 3;

// Adds one verb's subcommand (see verbs.h).
using AddVerb = void (*)(CLI::App&, VerbAction&);

// Parses argv for the given verbs, runs the chosen one and turns every error into a message on
// stderr and an exit code: the one place where core errors reach the user.
int runVerbs(int argc, char** argv, std::span<const AddVerb> verbs);

// Every verb (cli/run_all.cpp): what `stridemark` runs.
int runCommandLine(int argc, char** argv);

}  // namespace stridemark::cli
