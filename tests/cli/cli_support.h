#pragma once
// Runs the built `stridemark` binary (path from CMake: STRIDEMARK_EXE) and captures its exit
// code, stdout and stderr; private temp folders for inputs and outputs.
#include <string>
#include <vector>

#include "../support/process.h"

namespace stridemark::clitest {

using testsupport::readText;
using testsupport::runShell;
using testsupport::shellQuote;
using testsupport::writeText;
using CliRun = testsupport::ProcessResult;

// Paths as strings: the CLI tests pass them straight into argument lists.
class TempFolder : public testsupport::TempFolder {
 public:
  TempFolder() : testsupport::TempFolder("stridemark-cli-") {}
  std::string operator/(const std::string& name) const { return (path() / name).string(); }
};

inline CliRun runStridemark(const std::vector<std::string>& args) {
  std::string commandLine = shellQuote(STRIDEMARK_EXE);
  for (const auto& arg : args) commandLine += " " + shellQuote(arg);
  return runShell(commandLine);
}

}  // namespace stridemark::clitest
