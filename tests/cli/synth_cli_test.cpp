// `stridemark synth` options added for the video-proposal benchmark (issue 18): bad values are
// refused before anything is written, naming the option and the allowed range; good values land
// in the manifest with the two foot-truth files.
#include <gtest/gtest.h>

#include <filesystem>
#include <string>
#include <vector>

#include <nlohmann/json.hpp>

#include "cli_support.h"

namespace stridemark::clitest {
namespace {

struct BadValue {
  std::vector<std::string> args;
  std::string mustMention;  // the option and its range, as the user needs them
};

TEST(SynthCli, BadValuesOfTheNewOptionsAreRefusedWithTheRange) {
  // Common practice, no source: exit 1 (bad input) or 2 (usage) and a message naming the option.
  const TempFolder tmp;
  const std::vector<BadValue> cases = {
      {{"--light", "0.05"}, "--light 0.05"},
      {{"--light", "1.5"}, "0.1 (very dark) to 1"},
      {{"--look", "-1"}, "0 (the original look) to 9999"},
      {{"--look", "10000"}, "--look 10000"},
      {{"--scene", "panning", "--drift", "0.5"}, "0 (perfect follow) to 0.2"},
      {{"--drift", "0.1"}, "--drift needs --scene panning"},
      {{"--crf", "52"}, "0 (lossless) to 51"},
      {{"--crf", "-3"}, "--crf -3"},
      {{"--crf", "30", "--mjpeg"}, "--mjpeg"},
      {{"--landing", "hard"}, "--landing"},
      {{"--scene", "paddock"}, "panning"},
      {{"--feet", "toes"}, "bipeds"},
  };
  for (const auto& c : cases) {
    std::vector<std::string> args = {"synth", "--out", tmp / "never", "--gait", "walk:1"};
    args.insert(args.end(), c.args.begin(), c.args.end());
    const CliRun run = runStridemark(args);
    EXPECT_TRUE(run.exitCode == 1 || run.exitCode == 2) << c.args[1] << ": " << run.exitCode;
    EXPECT_NE(run.err.find(c.mustMention), std::string::npos)
        << "for " << c.args.front() << " " << c.args[1] << " stderr was: " << run.err;
    EXPECT_FALSE(std::filesystem::exists(tmp / "never")) << "nothing is written on bad input";
  }
}

TEST(SynthCli, NewOptionsReachTheManifestAndTheTruthFiles) {
  // Our definition (docs/synth.md): every option is kept so the clip can be reproduced.
  const TempFolder tmp;
  const CliRun run = runStridemark(
      {"synth",   "--out",   tmp / "clip", "--limbs", "biped", "--feet",     "toes",    "--gait",
       "run:0.5", "--scene", "panning",    "--drift", "0.05",  "--occluder", "--light", "0.5",
       "--look",  "42",      "--landing",  "soft",    "--crf", "30",         "--size",  "320x180"});
  ASSERT_EQ(run.exitCode, 0) << run.err;
  EXPECT_NE(run.out.find("feet csv:"), std::string::npos) << run.out;
  const auto manifest = nlohmann::json::parse(readText(tmp / "clip/manifest.json"));
  EXPECT_EQ(manifest["render"]["scene"], "panning");
  EXPECT_EQ(manifest["render"]["feet"], "toes");
  EXPECT_DOUBLE_EQ(manifest["render"]["drift"].get<double>(), 0.05);
  EXPECT_EQ(manifest["render"]["occluder"], true);
  EXPECT_DOUBLE_EQ(manifest["render"]["light"].get<double>(), 0.5);
  EXPECT_EQ(manifest["render"]["look"], 42);
  EXPECT_EQ(manifest["landing"], "soft");
  EXPECT_EQ(manifest["crf"], 30);
  EXPECT_TRUE(std::filesystem::exists(tmp / "clip/feet.csv"));
  EXPECT_TRUE(std::filesystem::exists(tmp / "clip/seeds.csv"));
}

}  // namespace
}  // namespace stridemark::clitest
