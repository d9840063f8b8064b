// Issue 17 defect 2 end to end: `stridemark score` on a project nested 70,000 levels deep at a
// typed field used to die of a stack overflow; now it exits 1 with a short, clear message.
#include <gtest/gtest.h>

#include <string>

#include "cli_support.h"

namespace stridemark::clitest {
namespace {

TEST(DeepJsonCli, ScoreRefusesADeeplyNestedProject) {
  TempFolder folder;
  const std::string deep = std::string(70'000, '[') + "1" + std::string(70'000, ']');
  const std::string path = folder / "deep.stridemark";
  writeText(path, R"({"schema": "stridemark.project.v1", "schema_version": 1,
 "limb_set": "quadruped", "capture_rate": )" +
                      deep + R"(, "events": []})");
  const CliRun run = runStridemark({"score", path});
  // Source: CHANGELOG.md command-line contract (exit 1 = bad input, message on stderr).
  EXPECT_EQ(run.exitCode, 1) << run.err.substr(0, 400);
  EXPECT_EQ(run.out, "");
  EXPECT_NE(run.err.find("stridemark: " + path + ":2:"), std::string::npos) << run.err;
  EXPECT_NE(run.err.find("nested more than 256 levels deep"), std::string::npos) << run.err;
  // Common practice, no source: the message does not carry the offending value.
  EXPECT_LT(run.err.size(), 400u) << run.err.substr(0, 400);
}

}  // namespace
}  // namespace stridemark::clitest
