#pragma once
// Helpers shared by the formats tests: private temp folders and running the Debian Python
// (the reference tool for CSV/JSON loading; it sees python3-pandas, the python3 on PATH may not).
#include <gtest/gtest.h>
#include <string>

#include "../../support/process.h"

namespace stridemark::testing {

using testsupport::ProcessResult;
using testsupport::readText;
using testsupport::runShell;
using testsupport::shellQuote;
using testsupport::writeText;

class TempFolder : public testsupport::TempFolder {
 public:
  TempFolder() : testsupport::TempFolder("stridemark-formats-") {}
};

// Runs a Python script with Debian's /usr/bin/python3 (scipy, pandas).
inline ProcessResult runDebianPython(const std::string& script) {
  TempFolder folder;
  const auto scriptPath = folder / "check.py";
  writeText(scriptPath, script);
  return runShell("/usr/bin/python3 " + shellQuote(scriptPath.string()));
}

}  // namespace stridemark::testing
