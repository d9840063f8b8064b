// `stridemark suggest`: the command's contract (issue 18 item 2) on a clip the synth verb makes.
#include <gtest/gtest.h>

#include <memory>

#include <nlohmann/json.hpp>

#include "cli_support.h"

namespace stridemark::clitest {
namespace {

class SuggestCli : public ::testing::Test {
 protected:
  static void SetUpTestSuite() {
    folder_ = std::make_unique<TempFolder>();  // lives for the suite
    const CliRun made = runStridemark({"synth", "--out", *folder_ / "clip", "--gait", "trot:1",
                                       "--capture-fps", "60", "--markers"});
    ASSERT_EQ(made.exitCode, 0) << made.err;
  }
  static void TearDownTestSuite() { folder_.reset(); }
  static std::string video() { return *folder_ / "clip/clip.mp4"; }
  static std::string seeds(const std::string& name, const std::string& text) {
    const std::string path = *folder_ / name;
    writeText(path, text);
    return path;
  }
  static std::string out(const std::string& name) { return *folder_ / name; }
  static CliRun suggest(const std::vector<std::string>& extra) {
    std::vector<std::string> args = {"suggest", video(),     "--scene", "treadmill",
                                     "--limbs", "quadruped", "--fps",   "60"};
    args.insert(args.end(), extra.begin(), extra.end());
    return runStridemark(args);
  }
  static std::unique_ptr<TempFolder> folder_;
};

std::unique_ptr<TempFolder> SuggestCli::folder_;

const char* kGoodSeeds = "limb,frame,x,y\nLF,0,330,280\nRF,0,300,285\nLH,0,200,280\nRH,0,180,285\n";

// Issue 18 item 2: OUT.csv is the events CSV format plus a confidence column (0-1).
TEST_F(SuggestCli, WritesEventsWithConfidenceAndAJsonSummary) {
  const CliRun run = suggest(
      {"--seeds", seeds("good.csv", kGoodSeeds), "--csv", out("p.csv"), "--json", out("p.json")});
  ASSERT_EQ(run.exitCode, 0) << run.err;
  const std::string csv = readText(out("p.csv"));
  EXPECT_NE(csv.find("# fps: 60\n# limbs: quadruped\n"), std::string::npos) << csv;
  EXPECT_NE(csv.find("\nlimb,event,frame,confidence\n"), std::string::npos) << csv;
  const auto json = nlohmann::json::parse(readText(out("p.json")));
  EXPECT_EQ(json["schema"], "stridemark.suggestions.v1");
  EXPECT_EQ(json["tracks"].size(), 4u);
  for (const auto& e : json["events"]) {
    EXPECT_GE(e["confidence"].get<double>(), 0.0);
    EXPECT_LE(e["confidence"].get<double>(), 1.0);
  }
  EXPECT_NE(json["caution"].get<std::string>().find("veterinarian"), std::string::npos);
  // Issue 18 item 3 (proposals never count as tags until accepted): `score` refuses them and
  // says how to use them.
  const CliRun scored = runStridemark({"score", out("p.csv")});
  EXPECT_EQ(scored.exitCode, 1);
  EXPECT_NE(scored.err.find("look like proposals from `stridemark suggest`"), std::string::npos)
      << scored.err;
}

// Issue 18 item 2: bad seeds and unreadable video exit 1 with a message saying what to fix.
TEST_F(SuggestCli, BadSeedsExitOneSayingWhatToFix) {
  const CliRun outside = suggest(
      {"--seeds", seeds("outside.csv", "limb,frame,x,y\nLF,0,5000,20\n"), "--csv", out("o.csv")});
  EXPECT_EQ(outside.exitCode, 1);
  EXPECT_NE(outside.err.find("seed LF at frame 0: position (5000"), std::string::npos)
      << outside.err;
  const CliRun limb = suggest(
      {"--seeds", seeds("limb.csv", "limb,frame,x,y\nL2,0,50,20\n"), "--csv", out("o.csv")});
  EXPECT_EQ(limb.exitCode, 1);
  EXPECT_NE(limb.err.find("limb.csv:2: unknown limb 'L2'"), std::string::npos) << limb.err;
  const CliRun frame = suggest(
      {"--seeds", seeds("frame.csv", "limb,frame,x,y\nLF,9999,50,20\n"), "--csv", out("o.csv")});
  EXPECT_EQ(frame.exitCode, 1);
  EXPECT_NE(frame.err.find("seed LF at frame 9999: the clip has frames 0..59"), std::string::npos)
      << frame.err;
  EXPECT_FALSE(std::filesystem::exists(out("o.csv")));
}

TEST_F(SuggestCli, UnreadableVideoExitsOne) {
  writeText(out("junk.mp4"), "this is not a video");
  const CliRun run = runStridemark(
      {"suggest", out("junk.mp4"), "--scene", "overground", "--limbs", "biped", "--fps", "100",
       "--seeds", seeds("b.csv", "limb,frame,x,y\nL,0,1,1\n"), "--csv", out("j.csv")});
  EXPECT_EQ(run.exitCode, 1);
  EXPECT_NE(run.err.find("junk.mp4"), std::string::npos) << run.err;
}

// Common practice, no source: usage mistakes exit 2 and name the flag.
TEST_F(SuggestCli, UsageMistakesExitTwo) {
  const CliRun scene = runStridemark({"suggest", video(), "--scene", "belt", "--limbs", "quadruped",
                                      "--fps", "60", "--csv", out("u.csv")});
  EXPECT_EQ(scene.exitCode, 2);
  EXPECT_NE(scene.err.find("unknown scene 'belt'"), std::string::npos) << scene.err;
  const CliRun noFps =
      runStridemark({"suggest", video(), "--scene", "treadmill", "--limbs", "quadruped", "--seeds",
                     seeds("g2.csv", kGoodSeeds), "--csv", out("u.csv")});
  EXPECT_EQ(noFps.exitCode, 2);
  EXPECT_NE(noFps.err.find("--fps RATE is required"), std::string::npos) << noFps.err;
  const CliRun overwrite = suggest({"--seeds", seeds("g3.csv", kGoodSeeds), "--csv", video()});
  EXPECT_EQ(overwrite.exitCode, 2) << overwrite.err;
}

// Issue 18 item 2: a project gives the video, limb set, capture rate and seeds.
TEST_F(SuggestCli, TakesEverythingFromAProject) {
  const CliRun none = runStridemark({"suggest", *folder_ / "clip/trial.stridemark", "--scene",
                                     "treadmill", "--csv", out("n.csv")});
  EXPECT_EQ(none.exitCode, 2);
  EXPECT_NE(none.err.find("has no seeds"), std::string::npos) << none.err;
  const CliRun run =
      runStridemark({"suggest", *folder_ / "clip/trial.stridemark", "--scene", "treadmill",
                     "--seeds", seeds("g4.csv", kGoodSeeds), "--csv", out("proj.csv")});
  ASSERT_EQ(run.exitCode, 0) << run.err;
  EXPECT_NE(readText(out("proj.csv")).find("# limbs: quadruped"), std::string::npos);
}

}  // namespace
}  // namespace stridemark::clitest
