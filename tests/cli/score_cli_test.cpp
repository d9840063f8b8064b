// End-to-end tests of `stridemark score` (the command-line and report contracts in CHANGELOG.md).
#include <gtest/gtest.h>

#include <cmath>
#include <filesystem>
#include <map>
#include <set>
#include <string>
#include <utility>
#include <vector>

#include <nlohmann/json.hpp>

#include "cli_support.h"

namespace stridemark::clitest {
namespace {

using Json = nlohmann::json;
using Keys = std::set<std::string>;

Keys keysOf(const Json& object) {
  Keys keys;
  for (auto it = object.begin(); it != object.end(); ++it) keys.insert(it.key());
  return keys;
}

bool isNumberOrNull(const Json& value) {
  return value.is_number() || value.is_null();
}

void expectStat(const Json& stat, const std::string& where) {
  EXPECT_EQ(keysOf(stat), (Keys{"n", "mean", "sd", "cv"})) << where;
  EXPECT_TRUE(stat["n"].is_number_integer()) << where;
  for (const char* key : {"mean", "sd", "cv"}) EXPECT_TRUE(isNumberOrNull(stat[key])) << where;
}

// Checks a report against the "Report JSON" contract (CHANGELOG.md): exact keys and nesting, null
// (never NaN) for undefined numbers, fractions in [0, 1], phases in [0, 1). Additions only under
// "extra".
void expectDesignReport(const Json& report, const std::vector<std::string>& labels) {
  Keys top{"schema",  "fps",      "limb_set", "reference_limb", "limbs",
           "strides", "phase",    "support",  "bouts",          "symmetry",
           "speed",   "problems", "extra",    "by_gait",        "mixed_gaits"};
  if (report["limb_set"] == "quadruped") top.insert({"hildebrand", "dap"});
  EXPECT_EQ(keysOf(report), top);
  EXPECT_EQ(report["schema"], "stridemark.report.v1");
  EXPECT_TRUE(report["fps"].is_number());
  const Keys limbKeys(labels.begin(), labels.end());
  EXPECT_EQ(keysOf(report["limbs"]), limbKeys);
  for (const auto& label : labels) {
    const Json& limb = report["limbs"][label];
    EXPECT_EQ(keysOf(limb), (Keys{"strides", "stride_s", "stance_s", "swing_s", "duty_factor"}));
    for (const char* stat : {"stride_s", "stance_s", "swing_s", "duty_factor"}) {
      expectStat(limb[stat], label + "." + stat);
    }
    const Json& phase = report["phase"][label];
    EXPECT_EQ(keysOf(phase), (Keys{"n", "mean", "r", "circ_sd", "rayleigh_p"}));
  }
  EXPECT_EQ(keysOf(report["phase"]), limbKeys);
  const std::set<std::string> gaits{
      "walk",          "amble",      "trot",     "pace",  "canter",       "transverse gallop",
      "rotary gallop", "half-bound", "bound",    "pronk", "run",          "hop",
      "skip",          "tripod",     "tetrapod", "wave",  "unclassified", "transition"};
  for (const Json& stride : report["strides"]) {
    Keys keys{"start_frame", "end_frame", "duration_s",  "duty_factor", "phase",  "gait",
              "band",        "sequence",  "symmetrical", "aerial",      "steady", "bout"};
    if (!stride["symmetrical"].get<bool>()) keys.insert({"lead", "hind_lead"});
    EXPECT_EQ(keysOf(stride), keys);
    EXPECT_EQ(keysOf(stride["duty_factor"]), limbKeys);
    EXPECT_EQ(keysOf(stride["phase"]), limbKeys);
    for (const auto& label : labels) {
      const Json& df = stride["duty_factor"][label];
      const Json& phase = stride["phase"][label];
      EXPECT_TRUE(df.is_null() || (df >= 0.0 && df <= 1.0)) << df;
      EXPECT_TRUE(phase.is_null() || (phase >= 0.0 && phase < 1.0)) << phase;
    }
    EXPECT_TRUE(gaits.count(stride["gait"].get<std::string>())) << stride["gait"];
    EXPECT_TRUE(stride["band"].is_null() || stride["band"].is_string());
    EXPECT_TRUE(stride["sequence"].is_null() || stride["sequence"] == "lateral" ||
                stride["sequence"] == "diagonal");
  }
  if (report.contains("hildebrand") && !report["hildebrand"].is_null()) {
    EXPECT_EQ(keysOf(report["hildebrand"]), (Keys{"n", "duty_factor", "limb_phase", "band"}));
  }
  double supportSum = 0;
  for (auto it = report["support"].begin(); it != report["support"].end(); ++it) {
    EXPECT_EQ(it.key(), std::to_string(std::stoi(it.key())));
    supportSum += it.value().get<double>();
  }
  if (!report["support"].empty()) {
    EXPECT_NEAR(supportSum, 1.0, 1e-9);
  }
  // Source: issue 16 / docs/methods.md §11: each SUMMARY member has the shape of the
  // trial-level member of the same name.
  const auto expectSummary = [&](const Json& summary) {
    EXPECT_EQ(keysOf(summary), (Keys{"strides", "limbs", "phase", "hildebrand", "support",
                                     "symmetry", "speed", "dap"}));
    EXPECT_EQ(keysOf(summary["limbs"]), limbKeys);
    EXPECT_EQ(keysOf(summary["phase"]), limbKeys);
    EXPECT_EQ(keysOf(summary["symmetry"]), keysOf(report["symmetry"]));
  };
  for (const Json& bout : report["bouts"]) {
    EXPECT_EQ(keysOf(bout),
              (Keys{"gait", "first_stride", "last_stride", "start_frame", "end_frame", "summary"}));
    expectSummary(bout["summary"]);
  }
  for (const auto& [gait, summary] : report["by_gait"].items()) expectSummary(summary);
  EXPECT_EQ(report["mixed_gaits"].get<bool>(), report["by_gait"].size() > 1);
  EXPECT_EQ(keysOf(report["symmetry"]), (Keys{"stance_s", "swing_s", "duty_factor"}));
  if (!report["speed"].is_null()) {
    EXPECT_EQ(keysOf(report["speed"]),
              (Keys{"m_s", "froude", "stride_length_m", "relative_stride_length"}));
  }
  for (const Json& problem : report["problems"]) {
    EXPECT_EQ(keysOf(problem), (Keys{"frame", "limb", "message"}));
  }
}

// Events of a steady gait: each limb touches down at phase[limb] of every `stride`-frame cycle
// and stays down for dutyFactor of it.
std::string steadyGaitCsv(const std::map<std::string, double>& phase, int stride, double dutyFactor,
                          int strides, int start = 20) {
  std::string csv = "limb,event,frame\n";
  for (const auto& [label, offset] : phase) {
    for (int k = 0; k <= strides; ++k) {
      const int touchdown = start + static_cast<int>(std::lround(offset * stride)) + k * stride;
      csv += label + ",touchdown," + std::to_string(touchdown) + "\n";
      if (k < strides) {
        const int liftoff = touchdown + static_cast<int>(std::lround(dutyFactor * stride));
        csv += label + ",liftoff," + std::to_string(liftoff) + "\n";
      }
    }
  }
  return csv;
}

Json scoreJson(const std::vector<std::string>& args) {
  std::vector<std::string> all{"score"};
  all.insert(all.end(), args.begin(), args.end());
  all.insert(all.end(), {"--json", "-"});
  const CliRun run = runStridemark(all);
  EXPECT_EQ(run.exitCode, 0) << run.err;
  EXPECT_TRUE(run.err.empty()) << run.err;
  return Json::parse(run.out);
}

TEST(ScoreCli, QuadrupedTrot) {
  // Source: docs/methods.md check 14 — all DF 0.40, phase 0.50 -> trot (Schmitt et al. 2006 trot).
  TempFolder folder;
  writeText(folder / "trot.csv",
            steadyGaitCsv({{"LH", 0.0}, {"RF", 0.0}, {"RH", 0.5}, {"LF", 0.5}}, 100, 0.4, 6));
  const Json report = scoreJson({folder / "trot.csv", "--fps", "200", "--limbs", "quadruped"});
  expectDesignReport(report, {"LF", "RF", "LH", "RH"});
  ASSERT_EQ(report["strides"].size(), 6u);
  for (const Json& stride : report["strides"]) EXPECT_EQ(stride["gait"], "trot");
  EXPECT_EQ(report["hildebrand"]["band"], "trot");
  EXPECT_EQ(report["fps"], 200);
}

TEST(ScoreCli, BipedWalk) {
  // Source: docs/methods.md team decision for bipeds — duty factor >= 0.5 -> walk.
  TempFolder folder;
  writeText(folder / "biped.csv", steadyGaitCsv({{"L", 0.0}, {"R", 0.5}}, 80, 0.6, 5));
  const Json report = scoreJson({folder / "biped.csv", "--fps", "100", "--limbs", "biped"});
  expectDesignReport(report, {"L", "R"});
  EXPECT_EQ(report["reference_limb"], "L");
  for (const Json& stride : report["strides"]) EXPECT_EQ(stride["gait"], "walk");
}

TEST(ScoreCli, HexapodTripod) {
  // Source: docs/methods.md check 20 — L1=R2=L3 at 0, R1=L2=R3 at 0.5, DF 0.5 -> tripod.
  TempFolder folder;
  writeText(
      folder / "hexapod.csv",
      steadyGaitCsv({{"L1", 0.0}, {"R2", 0.0}, {"L3", 0.0}, {"R1", 0.5}, {"L2", 0.5}, {"R3", 0.5}},
                    60, 0.5, 5));
  const Json report = scoreJson({folder / "hexapod.csv", "--fps", "500", "--limbs", "hexapod"});
  expectDesignReport(report, {"L1", "R1", "L2", "R2", "L3", "R3"});
  for (const Json& stride : report["strides"]) EXPECT_EQ(stride["gait"], "tripod");
}

TEST(ScoreCli, MultiPairSet) {
  TempFolder folder;
  std::map<std::string, double> phase;
  for (int i = 1; i <= 5; ++i) {
    phase["L" + std::to_string(i)] = 0.15 * (5 - i);
    phase["R" + std::to_string(i)] = std::fmod(0.15 * (5 - i) + 0.5, 1.0);
  }
  writeText(folder / "myriapod.csv", steadyGaitCsv(phase, 100, 0.7, 4));
  const Json report =
      scoreJson({folder / "myriapod.csv", "--fps", "250", "--limbs", "multi-pair-5"});
  expectDesignReport(report, {"L1", "L2", "L3", "L4", "L5", "R1", "R2", "R3", "R4", "R5"});
  EXPECT_EQ(report["limb_set"], "multi-pair-5");
  EXPECT_EQ(report["strides"].size(), 4u);
}

TEST(ScoreCli, HandComputableTrial) {
  // Source: docs/methods.md checks 1 and 2 (definitions §1.1; Hildebrand limb phase per Usherwood &
  // Self Davies 2017): LH TD 100, LO 160, TD 225 at 250 fps -> stride 0.500 s, stance 0.240 s,
  // duty factor 0.480; LF TD at 131 -> phase 0.248.
  TempFolder folder;
  writeText(folder / "check1.csv",
            "limb,event,frame\nLH,touchdown,100\nLH,liftoff,160\nLH,touchdown,225\n"
            "LF,touchdown,131\n");
  const Json report = scoreJson({folder / "check1.csv", "--fps", "250"});
  expectDesignReport(report, {"LF", "RF", "LH", "RH"});
  const Json& lh = report["limbs"]["LH"];
  EXPECT_EQ(lh["strides"], 1);
  EXPECT_NEAR(lh["stride_s"]["mean"].get<double>(), 0.5, 1e-12);
  EXPECT_NEAR(lh["stance_s"]["mean"].get<double>(), 0.24, 1e-12);
  EXPECT_NEAR(lh["duty_factor"]["mean"].get<double>(), 0.48, 1e-12);
  EXPECT_TRUE(lh["duty_factor"]["sd"].is_null()) << "SD of one value is undefined";
  ASSERT_EQ(report["strides"].size(), 1u);
  EXPECT_NEAR(report["strides"][0]["phase"]["LF"].get<double>(), 0.248, 1e-12);
  EXPECT_TRUE(report["strides"][0]["phase"]["RF"].is_null());
}

TEST(ScoreCli, TimeColumnAndHeaderComments) {
  // frame = round(time_s x capture rate), our events CSV contract; 0.4 s x 250 = 100, 0.9 s x 250 =
  // 225.
  TempFolder folder;
  writeText(folder / "times.csv",
            "# fps: 250\nlimb,event,time_s\nLH,touchdown,0.4\nLH,liftoff,0.64\nLH,touchdown,0.9\n");
  const Json report = scoreJson({folder / "times.csv"});
  EXPECT_EQ(report["strides"][0]["start_frame"], 100);
  EXPECT_EQ(report["strides"][0]["end_frame"], 225);
  EXPECT_NEAR(report["limbs"]["LH"]["duty_factor"]["mean"].get<double>(), 0.48, 1e-12);
}

TEST(ScoreCli, ClipStartingAndEndingMidStanceIsNormal) {
  // Our contract (CHANGELOG.md, events CSV): a first lift-off or a last touchdown is normal, not an
  // error.
  TempFolder folder;
  writeText(folder / "mid.csv",
            "limb,event,frame\nLH,liftoff,10\nLH,touchdown,100\nLH,liftoff,160\n"
            "LH,touchdown,225\nLH,liftoff,285\nLH,touchdown,350\n");
  const Json report = scoreJson({folder / "mid.csv", "--fps", "250"});
  // Only the untagged limbs are problems (docs/methods.md §1.5), never LH's mid-stance ends.
  for (const Json& problem : report["problems"]) {
    EXPECT_NE(problem["limb"], "LH") << problem;
    EXPECT_NE(problem["message"].get<std::string>().find("has no tags"), std::string::npos);
  }
  EXPECT_EQ(report["limbs"]["LH"]["strides"], 2);
}

TEST(ScoreCli, SpeedAndLegLengthGiveFroude) {
  // Source: docs/methods.md check 21 — v = 3.0 m/s, h = 0.90 m -> Fr = v^2 / (g h) = 1.01937.
  TempFolder folder;
  writeText(folder / "trot.csv",
            steadyGaitCsv({{"LH", 0.0}, {"RF", 0.0}, {"RH", 0.5}, {"LF", 0.5}}, 100, 0.4, 3));
  const Json report =
      scoreJson({folder / "trot.csv", "--fps", "200", "--speed", "3.0", "--leg-length", "0.9"});
  ASSERT_FALSE(report["speed"].is_null());
  EXPECT_NEAR(report["speed"]["froude"].get<double>(), 1.01937, 1e-5);
  // stride length = v x mean stride time = 3.0 x 0.5 s.
  EXPECT_NEAR(report["speed"]["stride_length_m"].get<double>(), 1.5, 1e-9);
}

TEST(ScoreCli, ProjectFileInput) {
  TempFolder folder;
  writeText(folder / "trial.stridemark", R"({
    "schema": "stridemark.project.v1", "schema_version": 1, "limb_set": "biped",
    "reference_limb": "R", "capture_rate": "250",
    "trial": {"subject": "invented", "speed_m_s": 1.2, "leg_length_m": 0.5},
    "events": [{"limb": "R", "event": "touchdown", "frame": 100},
               {"limb": "R", "event": "liftoff", "frame": 160},
               {"limb": "R", "event": "touchdown", "frame": 225}]})");
  const Json report = scoreJson({folder / "trial.stridemark"});
  EXPECT_EQ(report["limb_set"], "biped");
  EXPECT_EQ(report["reference_limb"], "R");
  EXPECT_NEAR(report["limbs"]["R"]["duty_factor"]["mean"].get<double>(), 0.48, 1e-12);
  EXPECT_NEAR(report["speed"]["m_s"].get<double>(), 1.2, 1e-12);
  // Flags override the project: --fps 125 doubles every duration.
  const Json slower = scoreJson({folder / "trial.stridemark", "--fps", "125"});
  EXPECT_NEAR(slower["limbs"]["R"]["stride_s"]["mean"].get<double>(), 1.0, 1e-12);
}

TEST(ScoreCli, CsvTablesAndSummary) {
  TempFolder folder;
  writeText(folder / "trot.csv",
            steadyGaitCsv({{"LH", 0.0}, {"RF", 0.0}, {"RH", 0.5}, {"LF", 0.5}}, 100, 0.4, 3));
  const CliRun tables =
      runStridemark({"score", folder / "trot.csv", "--fps", "200", "--csv", folder / "out"});
  EXPECT_EQ(tables.exitCode, 0) << tables.err;
  for (const char* name : {"events.csv", "strides.csv", "limbs.csv", "phases.csv", "support.csv",
                           "bouts.csv", "symmetry.csv", "dap.csv"}) {
    EXPECT_TRUE(std::filesystem::exists(folder.path() / "out" / name)) << name;
  }
  const CliRun summary = runStridemark({"score", folder / "trot.csv", "--fps", "200"});
  EXPECT_EQ(summary.exitCode, 0) << summary.err;
  EXPECT_NE(summary.out.find("LH    3        0.500 ± 0.000     0.400 ± 0.000"), std::string::npos)
      << summary.out;
  EXPECT_NE(summary.out.find("trot"), std::string::npos);
  EXPECT_NE(summary.out.find("problems: 0"), std::string::npos);
  EXPECT_NE(summary.out.find("licensed veterinarian"), std::string::npos);
}

TEST(ScoreCli, JsonAloneIsStreamedWithTheSameBytes) {
  // Common practice, no source: `--json` alone scores and writes in one pass (strides are not
  // kept); with `--csv` the report is kept whole. Both, and stdout, give the same bytes. 6,000
  // strides with a stumble span several of the analysis's chunks.
  TempFolder folder;
  std::string csv =
      steadyGaitCsv({{"LH", 0.0}, {"RF", 0.02}, {"RH", 0.5}, {"LF", 0.52}}, 100, 0.45, 6000);
  csv += "LH,touchdown,3030\n";  // a second touchdown inside a stance: a problem
  writeText(folder / "long.csv", csv);
  const std::vector<std::string> input{"score", folder / "long.csv", "--fps", "250"};
  const auto with = [&](std::vector<std::string> extra) {
    std::vector<std::string> args = input;
    args.insert(args.end(), extra.begin(), extra.end());
    return runStridemark(args);
  };
  const CliRun streamed = with({"--json", folder / "streamed.json"});
  const CliRun kept = with({"--json", folder / "kept.json", "--csv", folder / "tables"});
  const CliRun toStdout = with({"--json", "-"});
  ASSERT_EQ(streamed.exitCode, 0) << streamed.err;
  ASSERT_EQ(kept.exitCode, 0) << kept.err;
  ASSERT_EQ(toStdout.exitCode, 0) << toStdout.err;
  const std::string text = readText(folder / "streamed.json");
  EXPECT_TRUE(text == readText(folder / "kept.json"));
  EXPECT_TRUE(text == toStdout.out);
  const Json report = Json::parse(text);
  EXPECT_GT(report["strides"].size(), 5900u);
  EXPECT_EQ(report["strides"].size(), report["extra"]["strides"].size());
  EXPECT_FALSE(report["problems"].empty());
}

// A walk, then a trot, at 250 fps (invented; the same trial as tests/core/formats/
// trial_fixture.h walkThenTrotTrial): 4 walking strides of 100 frames (duty factor 0.65), then
// 5 trotting strides of 80 frames from frame 400 (duty factor 0.40). Bouts: walk, strides 0-2
// (frames 0-300); trot, strides 4-8 (frames 400-800).
std::vector<std::pair<std::string, std::vector<std::pair<std::string, int>>>> walkThenTrotTags() {
  const std::map<std::string, std::pair<int, int>> offsets = {
      {"LF", {25, 43}}, {"RF", {75, 2}}, {"LH", {0, 0}}, {"RH", {50, 40}}};
  std::vector<std::pair<std::string, std::vector<std::pair<std::string, int>>>> tags;
  for (const auto& [limb, offset] : offsets) {
    std::vector<std::pair<int, double>> touchdowns;
    for (int k = 0; k < 4; ++k) touchdowns.push_back({100 * k + offset.first, 0.65});
    for (int k = 0; k <= 5; ++k) touchdowns.push_back({400 + 80 * k + offset.second, 0.40});
    std::vector<std::pair<std::string, int>> events;
    for (std::size_t i = 0; i < touchdowns.size(); ++i) {
      const auto [frame, duty] = touchdowns[i];
      events.push_back({"touchdown", frame});
      if (i + 1 < touchdowns.size()) {
        const int cycle = touchdowns[i + 1].first - frame;
        events.push_back({"liftoff", frame + static_cast<int>(std::lround(duty * cycle))});
      }
    }
    tags.push_back({limb, events});
  }
  return tags;
}

std::string walkThenTrotCsv() {
  std::string csv = "# fps: 250\nlimb,event,frame\n";
  for (const auto& [limb, events] : walkThenTrotTags())
    for (const auto& [event, frame] : events)
      csv += limb + "," + event + "," + std::to_string(frame) + "\n";
  return csv;
}

std::string walkThenTrotProject(const std::string& trial) {
  Json events = Json::array();
  for (const auto& [limb, tags] : walkThenTrotTags())
    for (const auto& [event, frame] : tags)
      events.push_back({{"limb", limb}, {"event", event}, {"frame", frame}});
  return R"({"schema": "stridemark.project.v1", "schema_version": 1, "limb_set": "quadruped",
             "reference_limb": "LH", "capture_rate": "250", "trial": )" +
         trial + R"(, "events": )" + events.dump() + "}";
}

TEST(ScoreCli, SpeedScheduleGivesEachBoutItsSpeed) {
  // Source: docs/methods.md §12 (each bout gets the time-weighted mean speed over its own
  // frames; one trial speed only when the belt kept one speed) and §6.1 (stride length = speed
  // x mean reference stride time, Fr = v^2 / (g h), g = 9.81). The trot bout spans frames
  // 400-800: 1.0 m/s to frame 600 and 2.0 m/s from it average 1.5 m/s.
  TempFolder folder;
  writeText(folder / "walk-trot.csv", walkThenTrotCsv());
  const Json report = scoreJson(
      {folder / "walk-trot.csv", "--speed", "1.0", "--speed", "2.0@600", "--leg-length", "0.5"});
  expectDesignReport(report, {"LF", "RF", "LH", "RH"});
  ASSERT_EQ(report["bouts"].size(), 2u);
  const Json& walk = report["bouts"][0];
  const Json& trot = report["bouts"][1];
  ASSERT_EQ(walk["gait"], "walk");
  ASSERT_EQ(trot["gait"], "trot");
  EXPECT_NEAR(walk["summary"]["speed"]["m_s"].get<double>(), 1.0, 1e-12);
  EXPECT_NEAR(walk["summary"]["speed"]["stride_length_m"].get<double>(), 0.40, 1e-12);
  EXPECT_NEAR(walk["summary"]["speed"]["froude"].get<double>(), 1.0 / (9.81 * 0.5), 1e-12);
  EXPECT_NEAR(trot["summary"]["speed"]["m_s"].get<double>(), 1.5, 1e-12);
  EXPECT_NEAR(trot["summary"]["speed"]["stride_length_m"].get<double>(), 0.48, 1e-12);
  EXPECT_NEAR(trot["summary"]["speed"]["relative_stride_length"].get<double>(), 0.96, 1e-12);
  EXPECT_NEAR(trot["summary"]["speed"]["froude"].get<double>(), 2.25 / (9.81 * 0.5), 1e-12);
  EXPECT_NEAR(report["by_gait"]["trot"]["speed"]["m_s"].get<double>(), 1.5, 1e-12);
  EXPECT_TRUE(report["speed"].is_null());
  // Where INPUT stands among the flags does not matter.
  const CliRun reordered =
      runStridemark({"score", "--speed", "1.0", folder / "walk-trot.csv", "--speed", "2.0@600",
                     "--leg-length", "0.5", "--json", "-"});
  ASSERT_EQ(reordered.exitCode, 0) << reordered.err;
  EXPECT_EQ(Json::parse(reordered.out), report);
  // The text summary names each bout's speed.
  const CliRun summary =
      runStridemark({"score", folder / "walk-trot.csv", "--speed", "1.0", "--speed", "2.0@600"});
  EXPECT_EQ(summary.exitCode, 0) << summary.err;
  EXPECT_NE(summary.out.find("frames 400-800, 1.50 m/s"), std::string::npos) << summary.out;
  // One speed for the whole trial: the trial has it too.
  const Json steady = scoreJson({folder / "walk-trot.csv", "--speed", "1.2"});
  EXPECT_NEAR(steady["speed"]["m_s"].get<double>(), 1.2, 1e-12);
  EXPECT_NEAR(steady["bouts"][1]["summary"]["speed"]["m_s"].get<double>(), 1.2, 1e-12);
}

TEST(ScoreCli, ProjectSpeedChangesAndFlagsThatOverrideThem) {
  // Source: the same schedule given as flags (test above); CHANGELOG.md: --speed overrides the
  // trial card's speed and its changes.
  TempFolder folder;
  writeText(folder / "walk-trot.csv", walkThenTrotCsv());
  writeText(folder / "card.stridemark",
            walkThenTrotProject(R"({"speed_m_s": 1.0, "leg_length_m": 0.5,
                                    "speed_changes": [{"from_frame": 600, "m_s": 2.0}]})"));
  const CliRun fromCard = runStridemark({"score", folder / "card.stridemark", "--json", "-"});
  const CliRun fromFlags =
      runStridemark({"score", folder / "walk-trot.csv", "--speed", "1.0", "--speed", "2.0@600",
                     "--leg-length", "0.5", "--json", "-"});
  ASSERT_EQ(fromCard.exitCode, 0) << fromCard.err;
  ASSERT_EQ(fromFlags.exitCode, 0) << fromFlags.err;
  EXPECT_TRUE(fromCard.out == fromFlags.out) << "the card's schedule scores like the flags";
  EXPECT_NEAR(Json::parse(fromCard.out)["bouts"][1]["summary"]["speed"]["m_s"].get<double>(), 1.5,
              1e-12);
  // --speed replaces the whole schedule: no change at frame 600 any more.
  const Json overridden = scoreJson({folder / "card.stridemark", "--speed", "3.0"});
  EXPECT_NEAR(overridden["speed"]["m_s"].get<double>(), 3.0, 1e-12);
  EXPECT_NEAR(overridden["bouts"][1]["summary"]["speed"]["m_s"].get<double>(), 3.0, 1e-12);
}

TEST(ScoreCli, BadSpeedScheduleExitsTwoSayingWhy) {
  TempFolder folder;
  writeText(folder / "walk-trot.csv", walkThenTrotCsv());
  const std::vector<std::pair<std::vector<std::string>, std::string>> cases = {
      {{"-1"}, "--speed -1: expected a speed of 0 m/s or more"},
      {{"nan"}, "--speed nan: expected a speed of 0 m/s or more"},
      {{"inf"}, "--speed inf: expected a speed of 0 m/s or more"},
      {{"fast"}, "--speed fast: expected a speed"},
      {{"1.0", "2.5@"}, "--speed 2.5@: expected a frame number (0 or more) after '@'"},
      {{"1.0", "2.5@x"}, "--speed 2.5@x: expected a frame number"},
      {{"1.0", "2.5@-4"}, "--speed 2.5@-4: expected a frame number"},
      {{"1.0", "-2@620"}, "--speed -2@620: expected a speed of 0 m/s or more"},
      {{"2.5@620"}, "--speed 2.5@620: a speed change needs a speed from the start first"},
      {{"1.0", "2.0@600", "3.0@500"},
       "--speed 3.0@500 after --speed 2.0@600: speed changes must start at later and later "
       "frames"},
      {{"1.0", "2.0@600", "3.0@600"}, "--speed 3.0@600 after --speed 2.0@600"},
      {{"1.0", "2.0"}, "--speed 2.0 after --speed 1.0"},
  };
  for (const auto& [speeds, says] : cases) {
    std::vector<std::string> args{"score", folder / "walk-trot.csv"};
    for (const auto& speed : speeds) args.insert(args.end(), {"--speed", speed});
    args.insert(args.end(), {"--json", folder / "out.json"});
    const CliRun run = runStridemark(args);
    EXPECT_EQ(run.exitCode, 2) << says << "\n" << run.err;
    EXPECT_NE(run.err.find("stridemark score: " + says), std::string::npos) << run.err;
    EXPECT_TRUE(run.out.empty()) << run.out;
    EXPECT_FALSE(std::filesystem::exists(folder.path() / "out.json")) << says;
  }
  // A bad schedule is a usage error even before the input is read.
  const CliRun absent = runStridemark({"score", folder / "absent.csv", "--speed", "-1"});
  EXPECT_EQ(absent.exitCode, 2) << absent.err;
}

TEST(ScoreCli, BadProjectSpeedChangeNamesFileAndPath) {
  TempFolder folder;
  writeText(folder / "p.stridemark", walkThenTrotProject(R"({"speed_m_s": 1.0, "speed_changes": [
                {"from_frame": 600, "m_s": 2.0}, {"from_frame": 450, "m_s": 2.5}]})"));
  const CliRun run = runStridemark({"score", folder / "p.stridemark"});
  EXPECT_EQ(run.exitCode, 1) << run.err;
  EXPECT_NE(run.err.find(folder / "p.stridemark" +
                         ": at /trial/speed_changes/1/from_frame: frame 450 does not follow "
                         "frame 600"),
            std::string::npos)
      << run.err;
}

struct Malformed {
  const char* name;
  std::string text;
  int line;
  const char* says;
};

class ScoreCliRejects : public ::testing::TestWithParam<Malformed> {};

TEST_P(ScoreCliRejects, ExitOneNamingTheLine) {
  TempFolder folder;
  const std::string path = folder / "bad.csv";
  writeText(path, GetParam().text);
  const CliRun run = runStridemark({"score", path, "--fps", "240"});
  EXPECT_EQ(run.exitCode, 1) << run.err;
  EXPECT_TRUE(run.out.empty()) << run.out;
  EXPECT_NE(run.err.find(path + ":" + std::to_string(GetParam().line) + ": "), std::string::npos)
      << run.err;
  EXPECT_NE(run.err.find(GetParam().says), std::string::npos) << run.err;
}

std::string binaryGarbage() {
  std::string bytes = "limb,event,frame\n";
  std::mt19937 random(11);  // fixed seed: 11
  for (int i = 0; i < 2048; ++i) bytes += static_cast<char>(random() & 0xFF);
  return bytes;
}

INSTANTIATE_TEST_SUITE_P(
    Files, ScoreCliRejects,
    ::testing::Values(
        Malformed{"wrong_header", "limb;event;frame\nLH;touchdown;1\n", 1, "header"},
        Malformed{"unknown_limb", "limb,event,frame\nLH,touchdown,1\nFL,liftoff,9\n", 3,
                  "unknown limb 'FL'"},
        Malformed{"unknown_event", "limb,event,frame\nLH,touchdown,1\nLH,lift,9\n", 3,
                  "unknown event 'lift'"},
        Malformed{"non_numeric_frame", "limb,event,frame\nLH,touchdown,ten\n", 2, "not a number"},
        Malformed{"negative_frame", "# c\nlimb,event,frame\nLH,touchdown,-1\n", 3, "negative"},
        Malformed{"empty_file", "", 1, "no header"},
        Malformed{"binary_garbage", binaryGarbage(), 2, "not a text CSV"}),
    [](const ::testing::TestParamInfo<Malformed>& param) { return param.param.name; });

TEST(ScoreCli, UsageErrorsExitTwo) {
  TempFolder folder;
  writeText(folder / "ok.csv", "limb,event,frame\nLH,touchdown,1\n");
  const std::vector<std::vector<std::string>> cases = {
      {"score"},
      {"score", folder / "ok.csv", "--fps", "fast"},
      {"score", folder / "ok.csv", "--fps", "240", "--limbs", "octopus"},
      {"score", folder / "ok.csv", "--fps", "240", "--no-such-flag"},
      {"score", folder / "ok.csv", "--fps", "240", "--leg-length", "-1"},
      {"score", folder / "ok.csv"},  // no capture rate anywhere
      {"score", folder / "ok.csv", "--fps", "240", "--reference", "XX"}};
  for (const auto& args : cases) {
    const CliRun run = runStridemark(args);
    EXPECT_EQ(run.exitCode, 2) << args.back() << "\n" << run.err;
    EXPECT_FALSE(run.err.empty());
  }
}

TEST(ScoreCli, MissingInputFileIsBadInput) {
  TempFolder folder;
  const CliRun run = runStridemark({"score", folder / "absent.csv", "--fps", "240"});
  EXPECT_EQ(run.exitCode, 1);
  EXPECT_NE(run.err.find("absent.csv: cannot open"), std::string::npos) << run.err;
}

TEST(ScoreCli, BadProjectValueNamesItsPath) {
  TempFolder folder;
  writeText(folder / "p.stridemark",
            R"({"schema":"stridemark.project.v1","schema_version":1,"limb_set":"quadruped",
                "capture_rate":"240","events":[{"limb":"LH","event":"touchdown","frame":"x"}]})");
  const CliRun run = runStridemark({"score", folder / "p.stridemark"});
  EXPECT_EQ(run.exitCode, 1);
  EXPECT_NE(run.err.find("p.stridemark: at /events/0/frame"), std::string::npos) << run.err;
}

}  // namespace
}  // namespace stridemark::clitest
