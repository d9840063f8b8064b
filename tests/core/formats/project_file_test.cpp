#include "formats/project_file.h"

#include <gtest/gtest.h>

#include <filesystem>

#include "common/error.h"
#include "formats/file_io.h"
#include "test_support.h"

namespace stridemark::formats {
namespace {

using model::EventKind;

model::Project sampleProject() {
  model::Project project;
  auto& annotation = project.annotation;
  annotation.limbs = model::LimbSet::multiPair(4);
  annotation.captureRate = Rational{30000, 1001};
  annotation.referenceLimb = 5;  // R2
  annotation.clip = model::FrameRange{0, 1999};
  for (int limb = 0; limb < annotation.limbs.size(); ++limb) {
    annotation.events.push_back({10 + limb, limb, EventKind::touchdown});
    annotation.events.push_back({50 + limb, limb, EventKind::liftoff});
  }
  annotation.hidden.push_back({3, 100, 120});
  annotation.normalize();
  project.trial.subject = "Millipede \"M-7\" (invented)";
  project.trial.species = "Narceus sp.";
  project.trial.condition = "glass track";
  project.trial.observer = "unit test";
  project.trial.examDate = "2024-02-29";
  project.trial.notes = "line one\nline two — ünïcode";
  project.trial.speedMs = 0.021;
  project.trial.speedChanges = {{600, 0.035}, {1500, 0.0}};
  project.trial.speedSource = "ground";
  project.trial.legLengthM = 0.004;
  project.video = model::VideoLink{"clips/m7.mp4", "123456:abcdef", 2000, Rational{30, 1}};
  project.seeds = {{0, 12, 101.5, 220.25}, {5, 40, 333, 218}};
  project.proposals.events = {{{14, 0, EventKind::touchdown}, 0.875},
                              {{60, 0, EventKind::liftoff}, 0.25}};
  project.proposals.hidden = {{2, 70, 79}};
  return project;
}

void expectSameProject(const model::Project& a, const model::Project& b) {
  EXPECT_EQ(a.annotation.limbs, b.annotation.limbs);
  EXPECT_EQ(a.annotation.captureRate, b.annotation.captureRate);
  EXPECT_EQ(a.annotation.referenceLimb, b.annotation.referenceLimb);
  EXPECT_EQ(a.annotation.clip, b.annotation.clip);
  EXPECT_EQ(a.annotation.events, b.annotation.events);
  EXPECT_EQ(a.annotation.hidden, b.annotation.hidden);
  EXPECT_EQ(a.trial, b.trial);
  EXPECT_EQ(a.video, b.video);
  EXPECT_EQ(a.seeds, b.seeds);
  EXPECT_EQ(a.proposals, b.proposals);
}

std::string errorOf(const std::string& text) {
  try {
    parseProjectJson(text, "p.stridemark");
  } catch (const Error& e) {
    return e.what();
  }
  return "";
}

TEST(ProjectFile, RoundTripsEveryField) {
  const model::Project project = sampleProject();
  const std::string text = projectJsonText(project);
  EXPECT_NE(text.find("\"schema\": \"stridemark.project.v1\""), std::string::npos);
  EXPECT_NE(text.find("\"capture_rate\": \"30000/1001\""), std::string::npos);
  EXPECT_NE(text.find("\"speed_changes\": ["), std::string::npos) << text;
  expectSameProject(parseProjectJson(text, "p.stridemark"), project);
}

// Source: docs/methods.md §12 (the trial card holds the belt speed as a list of changes);
// the layout is ours (CHANGELOG.md, project file).
TEST(ProjectFile, SpeedChangesAreWrittenAsFramesAndSpeeds) {
  model::Project project;
  project.trial.speedMs = 1.0;
  project.trial.speedChanges = {{620, 2.5}};
  const nlohmann::json document = nlohmann::json::parse(projectJsonText(project));
  EXPECT_EQ(document["schema_version"], 1);
  EXPECT_EQ(document["trial"]["speed_m_s"], 1.0);
  EXPECT_EQ(document["trial"]["speed_changes"],
            nlohmann::json::parse(R"([{"from_frame": 620, "m_s": 2.5}])"));
  // No changes: an empty list, still written.
  project.trial.speedChanges.clear();
  const nlohmann::json none = nlohmann::json::parse(projectJsonText(project));
  EXPECT_EQ(none["trial"]["speed_changes"], nlohmann::json::array());
}

// Issue 16 item 6: an exclusion is saved in the project with its reason; the layout is ours.
TEST(ProjectFile, ExcludedStridesKeepTheirReasons) {
  model::Project project;
  project.annotation.excluded = {{1200, "looked back at the handler"}, {400, "stumbled"}};
  const std::string text = projectJsonText(project);
  const nlohmann::json document = nlohmann::json::parse(text);
  EXPECT_EQ(document["excluded_strides"][0]["reason"], "looked back at the handler");
  const model::Project back = parseProjectJson(text, "p.stridemark");
  ASSERT_EQ(back.annotation.excluded.size(), 2u);
  EXPECT_EQ(back.annotation.excluded[0].startFrame, 400);  // in frame order
  EXPECT_EQ(back.annotation.excluded[1].reason, "looked back at the handler");
  // None: no key, so files without exclusions keep their bytes.
  EXPECT_EQ(projectJsonText(model::Project{}).find("excluded_strides"), std::string::npos);
}

// Issue 16 item 7: the report names the exam date. Source: ISO 8601 calendar dates
// (YYYY-MM-DD; the Gregorian leap-year rule: every 4th year, not every 100th, every 400th).
TEST(ProjectFile, ExamDateIsAnIsoCalendarDate) {
  for (const char* good : {"2026-12-03", "2024-02-29", "2000-02-29", "1999-12-31"})
    EXPECT_TRUE(model::isCalendarDate(good)) << good;
  for (const char* bad : {"2023-02-29", "1900-02-29", "2026-13-01", "2026-04-31", "2026-00-10",
                          "2026-1-5", "03/12/2026", "2026-12-03T10:00", "", "2026-12-0x"})
    EXPECT_FALSE(model::isCalendarDate(bad)) << bad;
  model::Project project;
  project.trial.examDate = "2026-03-14";
  const nlohmann::json document = nlohmann::json::parse(projectJsonText(project));
  EXPECT_EQ(document["trial"]["exam_date"], "2026-03-14");
  EXPECT_EQ(parseProjectJson(projectJsonText(project), "p").trial.examDate, "2026-03-14");
  // Not given: no key, so older files and files without a date keep their bytes.
  EXPECT_EQ(projectJsonText(model::Project{}).find("exam_date"), std::string::npos);
}

TEST(ProjectFile, VersionOneFilesWithoutSpeedChangesStillRead) {
  // A schema_version 1 file as written before speed_changes existed.
  const model::Project project = parseProjectJson(
      R"({"schema":"stridemark.project.v1","schema_version":1,"limb_set":"quadruped",
          "capture_rate":"240","trial":{"speed_m_s":1.2,"speed_source":"belt"},"events":[]})",
      "old.stridemark");
  ASSERT_TRUE(project.trial.speedMs.has_value());
  EXPECT_EQ(*project.trial.speedMs, 1.2);
  EXPECT_TRUE(project.trial.speedChanges.empty());
  const model::Project nullChanges = parseProjectJson(
      R"({"schema":"stridemark.project.v1","schema_version":1,"limb_set":"quadruped",
          "capture_rate":"240","trial":{"speed_m_s":1.2,"speed_changes":null},"events":[]})",
      "p.stridemark");
  EXPECT_TRUE(nullChanges.trial.speedChanges.empty());
}

TEST(ProjectFile, RoundTripsEmptyOptionalParts) {
  model::Project project;
  project.annotation.events = {{5, 2, EventKind::touchdown}};
  const model::Project back = parseProjectJson(projectJsonText(project), "p");
  expectSameProject(back, project);
  EXPECT_FALSE(back.video.has_value());
  EXPECT_FALSE(back.trial.speedMs.has_value());
}

TEST(ProjectFile, MigratesThePreReleaseLayout) {
  const auto path =
      std::filesystem::path(STRIDEMARK_SOURCE_DIR) / "tests/core/formats/fixtures/project_v0.json";
  const nlohmann::json raw = nlohmann::json::parse(testing::readText(path));
  EXPECT_EQ(projectSchemaVersion(raw, "v0"), 0);
  const model::Project project = readProjectFile(path);
  const auto& annotation = project.annotation;
  EXPECT_EQ(annotation.limbs.name(), "quadruped");
  EXPECT_EQ(annotation.captureRate, (Rational{2997, 100}));
  EXPECT_EQ(annotation.referenceLimb, 0);  // LF
  ASSERT_EQ(annotation.events.size(), 4u);
  // Sorted by limb, then frame (model::Event ordering): RF 40, LH 12, 80, 140.
  EXPECT_EQ(annotation.events[0], (model::Event{40, 1, EventKind::touchdown}));
  EXPECT_EQ(annotation.events[1], (model::Event{12, 2, EventKind::touchdown}));
  EXPECT_EQ(annotation.events[2], (model::Event{80, 2, EventKind::liftoff}));
  EXPECT_EQ(annotation.events[3], (model::Event{140, 2, EventKind::touchdown}));
  EXPECT_EQ(project.trial.subject, "Pony 3 (invented)");
  EXPECT_EQ(project.trial.observer, "fixture");
  ASSERT_TRUE(project.video.has_value());
  EXPECT_EQ(project.video->path, "clips/walk.mp4");
  EXPECT_TRUE(project.trial.speedChanges.empty());
  // Saving writes the current layout; reading it back gives the same project.
  expectSameProject(parseProjectJson(projectJsonText(project), "again"), project);
}

TEST(ProjectFile, MigrationTableCoversEveryOlderVersion) {
  EXPECT_EQ(projectMigrations().size(), static_cast<std::size_t>(model::Project::kSchemaVersion));
}

TEST(ProjectFile, MigrationErrorsNameThePathInTheOldFile) {
  const std::string message = errorOf(
      R"({"format":"stridemark-project","version":0,"limbs":"quadruped","fps":240,
          "tags":[["LH","td",1],["LH","up",9]]})");
  EXPECT_NE(message.find("p.stridemark: at /tags/1/1: unknown tag 'up'"), std::string::npos)
      << message;
  const std::string limb = errorOf(
      R"({"format":"stridemark-project","version":0,"limbs":"biped","fps":240,
          "tags":[["L","td",1],["LH","td",9]]})");
  EXPECT_NE(limb.find("p.stridemark: at /tags/1/0: unknown limb 'LH'"), std::string::npos) << limb;
}

struct BadProject {
  const char* name;
  std::string text;
  const char* says;
};

class ProjectFileRejects : public ::testing::TestWithParam<BadProject> {};

TEST_P(ProjectFileRejects, NamingFileAndPath) {
  const std::string message = errorOf(GetParam().text);
  ASSERT_FALSE(message.empty()) << GetParam().name << " was accepted";
  EXPECT_EQ(message.rfind("p.stridemark:", 0), 0u) << message;
  EXPECT_NE(message.find(GetParam().says), std::string::npos) << message;
}

std::string v1(const std::string& events, const std::string& extra = "") {
  return R"({"schema":"stridemark.project.v1","schema_version":1,"limb_set":"quadruped",)"
         R"("capture_rate":"240","events":)" +
         events + extra + "}";
}

INSTANTIATE_TEST_SUITE_P(
    Malformed, ProjectFileRejects,
    ::testing::Values(
        BadProject{"not json", "{\n  \"schema\": \n}", "p.stridemark:3:1: not valid JSON"},
        BadProject{"array", "[1,2]", "not a Stridemark project"},
        BadProject{"no version", R"({"schema":"x"})", "no schema_version"},
        BadProject{"newer", R"({"schema_version":7})",
                   "at /schema_version: schema_version 7 is newer"},
        BadProject{"wrong schema", R"({"schema":"other","schema_version":1})", "at /schema:"},
        BadProject{"bad limb", v1(R"([{"limb":"LX","event":"touchdown","frame":1}])"),
                   "at /events/0/limb: unknown limb 'LX'"},
        BadProject{"bad event", v1(R"([{"limb":"LH","event":"land","frame":1}])"),
                   "at /events/0/event: unknown event 'land'"},
        BadProject{"negative frame",
                   v1(R"([{"limb":"LH","event":"touchdown","frame":1},)"
                      R"({"limb":"LH","event":"liftoff","frame":-4}])"),
                   "at /events/1/frame: frame -4 is negative"},
        BadProject{"fractional frame", v1(R"([{"limb":"LH","event":"liftoff","frame":2.5}])"),
                   "at /events/0/frame: expected a whole number"},
        BadProject{"missing frame", v1(R"([{"limb":"LH","event":"liftoff"}])"),
                   "at /events/0/frame: missing"},
        BadProject{"bad rate", v1("[]").replace(v1("[]").find("\"240\""), 5, "\"0\""),
                   "at /capture_rate:"},
        BadProject{"bad speed", v1("[]", R"(,"trial":{"speed_m_s":-1})"),
                   "at /trial/speed_m_s: expected a positive number"},
        BadProject{"speed change negative",
                   v1("[]", R"(,"trial":{"speed_m_s":1,"speed_changes":[{"from_frame":9,)"
                            R"("m_s":-2}]})"),
                   "at /trial/speed_changes/0/m_s: expected a speed of 0 m/s or more"},
        BadProject{"speed change not a number",
                   v1("[]", R"(,"trial":{"speed_m_s":1,"speed_changes":[{"from_frame":9,)"
                            R"("m_s":"fast"}]})"),
                   "at /trial/speed_changes/0/m_s: expected a number"},
        BadProject{"speed change at frame 0",
                   v1("[]", R"(,"trial":{"speed_m_s":1,"speed_changes":[{"from_frame":0,)"
                            R"("m_s":2}]})"),
                   "at /trial/speed_changes/0/from_frame: expected a frame after 0"},
        BadProject{"speed change fractional frame",
                   v1("[]", R"(,"trial":{"speed_m_s":1,"speed_changes":[{"from_frame":6.5,)"
                            R"("m_s":2}]})"),
                   "at /trial/speed_changes/0/from_frame: expected a whole number"},
        BadProject{"speed changes not ascending",
                   v1("[]", R"(,"trial":{"speed_m_s":1,"speed_changes":[{"from_frame":600,)"
                            R"("m_s":2},{"from_frame":300,"m_s":3}]})"),
                   "at /trial/speed_changes/1/from_frame: frame 300 does not follow frame 600"},
        BadProject{"speed change missing speed",
                   v1("[]", R"(,"trial":{"speed_m_s":1,"speed_changes":[{"from_frame":60}]})"),
                   "at /trial/speed_changes/0/m_s: missing"},
        BadProject{"speed changes not a list",
                   v1("[]", R"(,"trial":{"speed_m_s":1,"speed_changes":{"from_frame":60}})"),
                   "at /trial/speed_changes: expected an array"},
        BadProject{"speed changes without start",
                   v1("[]", R"(,"trial":{"speed_changes":[{"from_frame":60,"m_s":2}]})"),
                   "at /trial/speed_changes: speed changes without a speed from the start"},
        BadProject{"exam date not a date", v1("[]", R"(,"trial":{"exam_date":"14/03/2026"})"),
                   "at /trial/exam_date: expected a calendar date as YYYY-MM-DD"},
        BadProject{"exam date that does not exist",
                   v1("[]", R"(,"trial":{"exam_date":"2023-02-29"})"),
                   "at /trial/exam_date: expected a calendar date"},
        BadProject{"seed off the limb set",
                   v1("[]", R"(,"foot_seeds":[{"limb":"L1","frame":0,"x":3,"y":4}])"),
                   "at /foot_seeds/0/limb: unknown limb 'L1'"},
        BadProject{"seed without y", v1("[]", R"(,"foot_seeds":[{"limb":"LF","frame":0,"x":3}])"),
                   "at /foot_seeds/0/y: missing"},
        BadProject{"proposal confidence above 1",
                   v1("[]", R"(,"proposals":{"events":[{"limb":"LF","event":"touchdown",)"
                            R"("frame":5,"confidence":1.5}]})"),
                   "at /proposals/events/0/confidence: expected a confidence from 0 to 1"},
        BadProject{"hidden backwards", v1("[]", R"(,"hidden":[{"limb":"LF","first":9,"last":3}])"),
                   "at /hidden/0/last:"}),
    [](const ::testing::TestParamInfo<BadProject>& param) {
      std::string name = param.param.name;
      for (char& c : name) {
        if (!std::isalnum(static_cast<unsigned char>(c))) c = '_';
      }
      return name;
    });

TEST(ProjectFile, SaveReplacesTheFileAndLeavesNoTemporaryFiles) {
  testing::TempFolder folder;
  const auto path = folder / ("trial" + std::string(kProjectExtension));
  model::Project project = sampleProject();
  writeProjectFile(path, project);
  project.trial.notes = "second save";
  writeProjectFile(path, project);
  EXPECT_EQ(readProjectFile(path).trial.notes, "second save");
  int files = 0;
  for ([[maybe_unused]] const auto& entry : std::filesystem::directory_iterator(folder.path())) {
    ++files;
  }
  EXPECT_EQ(files, 1);
}

TEST(ProjectFile, FailedSaveLeavesTheOldFileIntact) {
  testing::TempFolder folder;
  // The target is a folder: the final rename must fail, after the temporary file was written.
  const auto blocked = folder / "blocked.stridemark";
  std::filesystem::create_directories(blocked / "inside");
  EXPECT_THROW(writeProjectFile(blocked, sampleProject()), Error);
  EXPECT_TRUE(std::filesystem::is_directory(blocked / "inside"));
  // The target's folder does not exist: the temporary file cannot even be created.
  const auto nowhere = folder / "no-such-folder" / "p.stridemark";
  try {
    writeProjectFile(nowhere, sampleProject());
    FAIL() << "saving into a missing folder succeeded";
  } catch (const Error& e) {
    EXPECT_EQ(e.category(), ErrorCategory::io);
    EXPECT_NE(std::string(e.what()).find("unchanged"), std::string::npos) << e.what();
  }
  // A good file stays byte-identical when a later save of it fails half way (write error).
  const auto good = folder / "good.stridemark";
  writeProjectFile(good, sampleProject());
  const std::string before = testing::readText(good);
  {
    AtomicFile file(good);
    file.write("{ partial");
    // Destroyed without commit(): as if the program failed while writing.
  }
  EXPECT_EQ(testing::readText(good), before);
  int files = 0;
  for ([[maybe_unused]] const auto& entry : std::filesystem::directory_iterator(folder.path())) {
    ++files;
  }
  EXPECT_EQ(files, 2) << "temporary files left behind";
}

// Source: issue 17 defect 7 (saving a symlinked project left the real file unchanged): the save
// goes through the link to the real file, and the link stays a link.
TEST(ProjectFile, SavingThroughASymlinkUpdatesTheRealFile) {
  testing::TempFolder folder;
  std::filesystem::create_directories(folder / "real");
  const auto real = folder / "real" / "trial.stridemark";
  writeProjectFile(real, sampleProject());
  const auto link = folder / "trial.stridemark";
  std::filesystem::create_symlink(real, link);
  model::Project changed = sampleProject();
  changed.trial.subject = "saved through a link";
  writeProjectFile(link, changed);
  EXPECT_TRUE(std::filesystem::is_symlink(link));  // Source: issue 17 defect 7
  EXPECT_EQ(readProjectFile(real).trial.subject, "saved through a link");
  std::size_t entries = 0;
  for ([[maybe_unused]] const auto& entry : std::filesystem::directory_iterator(folder / "real"))
    ++entries;
  EXPECT_EQ(entries, 1u) << "temporary file left beside the real file";
}

}  // namespace
}  // namespace stridemark::formats
