// End-to-end tests of how the command line is split in two programs (app/CMakeLists.txt):
// `stridemark` runs `score` itself and hands every other verb to `stridemark-full`.
#include <gtest/gtest.h>

#include <filesystem>

#include "cli_support.h"

namespace stridemark::clitest {
namespace {

const char* const kEvents =
    "limb,event,frame\n"
    "LF,touchdown,0\nLF,liftoff,40\nLF,touchdown,100\nLF,liftoff,140\nLF,touchdown,200\n"
    "RF,touchdown,50\nRF,liftoff,90\nRF,touchdown,150\nRF,liftoff,190\nRF,touchdown,250\n"
    "LH,touchdown,50\nLH,liftoff,90\nLH,touchdown,150\nLH,liftoff,190\nLH,touchdown,250\n"
    "RH,touchdown,0\nRH,liftoff,40\nRH,touchdown,100\nRH,liftoff,140\nRH,touchdown,200\n";

// Common practice, no source: the dynamic section lists the libraries a program loads at start
// (readelf from binutils). The one that scores must load no Qt, video or OpenCV library.
TEST(Programs, ScoringLoadsNoQtVideoOrOpenCvLibrary) {
  const CliRun run = runShell("readelf -d " + shellQuote(STRIDEMARK_EXE));
  ASSERT_EQ(run.exitCode, 0) << run.err;
  EXPECT_NE(run.out.find("libc.so"), std::string::npos) << run.out;
  for (const char* heavy : {"Qt6", "libav", "libswscale", "opencv"})
    EXPECT_EQ(run.out.find(heavy), std::string::npos) << heavy << " in\n" << run.out;
}

TEST(Programs, OtherVerbsAndVersionRunInTheFullProgram) {
  const CliRun version = runStridemark({"--version"});
  EXPECT_EQ(version.exitCode, 0) << version.err;
  EXPECT_EQ(version.out.rfind("stridemark ", 0), 0u) << version.out;
  const CliRun help = runStridemark({"--help"});
  EXPECT_EQ(help.exitCode, 0) << help.err;
  for (const char* verb : {"probe", "frame", "score", "synth", "export"})
    EXPECT_NE(help.out.find(verb), std::string::npos) << verb << " missing from\n" << help.out;
  TempFolder folder;
  const CliRun probe = runStridemark({"probe", folder / "no-such-clip.mp4"});
  EXPECT_EQ(probe.exitCode, 1) << probe.err;  // the full program's own bad-input answer
  EXPECT_NE(probe.err.find("no-such-clip.mp4"), std::string::npos) << probe.err;
}

// Without stridemark-full beside it, `score` still works and every other verb says what is
// missing and what to do, with the internal-failure exit code.
TEST(Programs, AMissingFullProgramIsNamedAndScoringStillWorks) {
  TempFolder folder;
  const std::string alone = folder / "stridemark";
  std::filesystem::copy_file(STRIDEMARK_EXE, alone);
  writeText(folder / "events.csv", kEvents);
  const CliRun score =
      runShell(shellQuote(alone) + " score " + shellQuote(folder / "events.csv") + " --fps 100");
  EXPECT_EQ(score.exitCode, 0) << score.err;
  EXPECT_NE(score.out.find("reference limb"), std::string::npos) << score.out;
  const CliRun probe = runShell(shellQuote(alone) + " probe clip.mp4");
  EXPECT_EQ(probe.exitCode, 3);
  EXPECT_NE(probe.err.find(folder / "stridemark-full"), std::string::npos) << probe.err;
  EXPECT_NE(probe.err.find("rebuild"), std::string::npos) << probe.err;
}

}  // namespace
}  // namespace stridemark::clitest
