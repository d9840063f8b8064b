// Every committed sample regenerates: running `stridemark synth` with the arguments kept in the
// sample's manifest reproduces its events CSV and foot truth byte for byte.
#include <gtest/gtest.h>

#include <algorithm>
#include <cstdlib>
#include <filesystem>
#include <string>

#include <nlohmann/json.hpp>

#include "analysis/analyse.h"
#include "formats/file_io.h"
#include "formats/project_file.h"

namespace {

namespace fs = std::filesystem;

std::string quoted(const std::string& s) {
  std::string out = "'";
  for (char c : s) out += c == '\'' ? std::string("'\\''") : std::string(1, c);
  return out + "'";
}

TEST(Samples, EventsRegenerateByteForByte) {
  const fs::path samples = fs::path(STRIDEMARK_SOURCE_DIR) / "samples";
  int checked = 0;
  for (const auto& entry : fs::directory_iterator(samples)) {
    const fs::path manifestPath = entry.path() / "manifest.json";
    if (!fs::exists(manifestPath)) continue;
    const auto manifest = nlohmann::json::parse(stridemark::formats::readWholeFile(manifestPath));
    const fs::path out =
        fs::temp_directory_path() / ("stridemark-sample-" + entry.path().filename().string() + "-" +
                                     std::to_string(::getpid()));
    fs::remove_all(out);
    std::string command = std::string(STRIDEMARK_CLI) + " synth --out " + quoted(out.string());
    for (const auto& arg : manifest.at("arguments"))
      command += " " + quoted(arg.get<std::string>());
    command += " --no-video > /dev/null";
    ASSERT_EQ(std::system(command.c_str()), 0) << command;
    EXPECT_EQ(stridemark::formats::readWholeFile(out / "events.csv"),
              stridemark::formats::readWholeFile(entry.path() / "events.csv"))
        << entry.path() << " no longer regenerates; command: " << command;
    // The foot truth (issue 18) comes from the same arguments, so it regenerates too.
    for (const char* truth : {"feet.csv", "seeds.csv"}) {
      ASSERT_TRUE(fs::exists(entry.path() / truth)) << entry.path() << " lacks " << truth;
      EXPECT_EQ(stridemark::formats::readWholeFile(out / truth),
                stridemark::formats::readWholeFile(entry.path() / truth))
          << entry.path() / truth << " no longer regenerates; command: " << command;
    }
    fs::remove_all(out);
    ++checked;
  }
  EXPECT_GE(checked, 3);
}

// Scoring each committed sample finds every gait of its schedule as a bout, with no annotation
// problems. Labels: docs/methods.md team decisions (the same the preset tests check).
TEST(Samples, ScoringFindsEveryScheduledGait) {
  const fs::path samples = fs::path(STRIDEMARK_SOURCE_DIR) / "samples";
  int checked = 0;
  for (const auto& entry : fs::directory_iterator(samples)) {
    const fs::path manifestPath = entry.path() / "manifest.json";
    if (!fs::exists(manifestPath)) continue;
    const auto manifest = nlohmann::json::parse(stridemark::formats::readWholeFile(manifestPath));
    const auto project = stridemark::formats::readProjectFile(
        entry.path() / manifest.at("files").at("project").get<std::string>());
    const auto report = stridemark::analysis::analyse(project.annotation);
    EXPECT_TRUE(report.problems.empty()) << entry.path();
    for (const auto& segment : manifest.at("segments")) {
      std::string label = segment.at("gait").get<std::string>();
      if (label == "transverse-gallop" || label == "rotary-gallop") label[label.find('-')] = ' ';
      const bool found = std::any_of(report.bouts.begin(), report.bouts.end(),
                                     [&](const auto& bout) { return bout.gait == label; });
      EXPECT_TRUE(found) << entry.path() << ": no bout of " << label;
    }
    ++checked;
  }
  EXPECT_GE(checked, 3);
}

}  // namespace
