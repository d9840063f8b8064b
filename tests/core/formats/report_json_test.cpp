#include "formats/report_json.h"

#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <filesystem>
#include <random>
#include <string>
#include <vector>

#include <nlohmann/json.hpp>

#include "../analysis/event_train.h"
#include "analysis/analyse.h"
#include "common/error.h"
#include "formats/events_csv.h"
#include "formats/file_io.h"
#include "test_support.h"
#include "trial_fixture.h"

namespace stridemark::formats {
namespace {

analysis::Report checkOneReport() {
  return analysis::analyse(testing::checkOneTrial());
}

TEST(ReportJson, HandComputableTrialComesOutRight) {
  // Source: docs/methods.md checks 1 and 2 (see trial_fixture.h).
  const nlohmann::json j = nlohmann::json::parse(reportJsonText(checkOneReport()));
  EXPECT_EQ(j["schema"], "stridemark.report.v1");
  EXPECT_EQ(j["fps"], 250);
  EXPECT_EQ(j["reference_limb"], "LH");
  EXPECT_NEAR(j["limbs"]["LH"]["duty_factor"]["mean"].get<double>(), 0.48, 1e-12);
  EXPECT_NEAR(j["limbs"]["LH"]["stride_s"]["mean"].get<double>(), 0.5, 1e-12);
  EXPECT_NEAR(j["limbs"]["LH"]["stance_s"]["mean"].get<double>(), 0.24, 1e-12);
  EXPECT_NEAR(j["strides"][0]["phase"]["LF"].get<double>(), 0.248, 1e-12);
  EXPECT_EQ(j["strides"][0]["start_frame"], 100);
  EXPECT_EQ(j["strides"][0]["end_frame"], 225);
  EXPECT_NEAR(j["hildebrand"]["limb_phase"].get<double>(), 0.248, 1e-9);
}

TEST(ReportJson, UndefinedNumbersAreNullNeverNaN) {
  analysis::Report report;
  report.referenceLimb = 2;
  report.limbSummary.resize(4);
  report.limbSummary[0].strideS = {1, 0.5, analysis::kUndefined, analysis::kUndefined};
  report.phase.resize(4);
  const std::string text = reportJsonText(report);
  EXPECT_EQ(text.find("NaN"), std::string::npos);
  EXPECT_EQ(text.find("nan"), std::string::npos);
  const nlohmann::json j = nlohmann::json::parse(text);
  EXPECT_TRUE(j["limbs"]["LF"]["stride_s"]["sd"].is_null());
  EXPECT_EQ(j["limbs"]["LF"]["stride_s"]["mean"], 0.5);
  EXPECT_TRUE(j["speed"].is_null());
  EXPECT_TRUE(j["hildebrand"].is_null());
  const analysis::Report back = parseReportJson(text, "r.json");
  EXPECT_TRUE(std::isnan(back.limbSummary[0].strideS.sd));
  EXPECT_EQ(back.limbSummary[0].strideS.mean, 0.5);
}

TEST(ReportJson, StrictJsonForPythonsParser) {
  // Reference: Python's json module with NaN/Infinity refused (RFC 8259 has no NaN).
  testing::TempFolder folder;
  writeReportJsonFile(folder / "r.json", checkOneReport());
  const auto result = testing::runDebianPython(
      "import json\n"
      "def refuse(name): raise ValueError('non-standard constant ' + name)\n"
      "doc = json.load(open('" +
      (folder / "r.json").string() +
      "'), parse_constant=refuse)\n"
      "assert doc['schema'] == 'stridemark.report.v1'\n"
      "print(len(doc['strides']))\n");
  EXPECT_EQ(result.exitCode, 0) << result.err;
  EXPECT_EQ(result.out, "3\n");
}

TEST(ReportJson, ReaderRoundTripIsAFixedPoint) {
  const analysis::Report report = checkOneReport();
  const std::string first = reportJsonText(report);
  const analysis::Report back = parseReportJson(first, "r.json");
  EXPECT_EQ(back.strides.size(), report.strides.size());
  EXPECT_EQ(back.limbs, report.limbs);
  EXPECT_EQ(back.fps, report.fps);
  EXPECT_EQ(reportJsonText(back), first);
}

TEST(ReportJson, NonQuadrupedsHaveNoHildebrandKey) {
  model::Annotation annotation;
  annotation.limbs = model::LimbSet::biped();
  annotation.referenceLimb = 0;
  annotation.events = {{0, 0, model::EventKind::touchdown},  {30, 0, model::EventKind::liftoff},
                       {50, 0, model::EventKind::touchdown}, {25, 1, model::EventKind::touchdown},
                       {55, 1, model::EventKind::liftoff},   {75, 1, model::EventKind::touchdown}};
  annotation.normalize();
  const nlohmann::json j = nlohmann::json::parse(reportJsonText(analysis::analyse(annotation)));
  EXPECT_FALSE(j.contains("hildebrand"));
  EXPECT_EQ(j["limb_set"], "biped");
}

TEST(ReportJson, ReaderNamesPathOfABadValue) {
  nlohmann::json j = nlohmann::json::parse(reportJsonText(checkOneReport()));
  j["strides"][1]["gait"] = 5;
  try {
    parseReportJson(j.dump(), "r.json");
    FAIL() << "accepted a numeric gait";
  } catch (const Error& e) {
    EXPECT_NE(std::string(e.what()).find("r.json: at /strides/1/gait: expected text"),
              std::string::npos)
        << e.what();
  }
  j["schema"] = "stridemark.report.v0";
  EXPECT_THROW(parseReportJson(j.dump(), "r.json"), Error);
}

std::string reportOf(const model::Annotation& annotation) {
  return reportJsonText(analysis::analyse(annotation));
}

// The events CSV text of `annotation`'s events in the order given (header and rows only).
std::string csvRows(const model::Annotation& annotation, const std::vector<model::Event>& events) {
  std::string text = "# fps: 250\n# limbs: " + annotation.limbs.name() + "\nlimb,event,frame\n";
  for (const model::Event& e : events)
    text += annotation.limbs.label(e.limb) + "," + std::string(model::eventWord(e.kind)) + "," +
            std::to_string(e.frame) + "\n";
  return text;
}

TEST(ReportJson, RowOrderOfTheEventsFileDoesNotMatter) {
  // Common practice, no source: scoring must not depend on the order of a CSV's rows, problems
  // and their order included. Rows in frame order (the usual file) and shuffled, with a
  // duplicate, a second touchdown inside a stance, a lift-off with no touchdown and a
  // zero-length stance among them.
  model::Annotation trial = testing::variedTrain(model::LimbSet::quadruped(), 400, 21);
  const std::vector<model::Event> faults = {
      {trial.events[10].frame, 0, model::EventKind::touchdown},
      {trial.events[10].frame, 0, model::EventKind::touchdown},
      {trial.events[41].frame + 1, 1, model::EventKind::touchdown},
      {trial.events[900].frame + 1, 2, model::EventKind::liftoff},
      {trial.events[1300].frame, 3, model::EventKind::touchdown},
      {trial.events[1300].frame, 3, model::EventKind::liftoff}};
  std::vector<model::Event> byFrame = trial.events;
  byFrame.insert(byFrame.end(), faults.begin(), faults.end());
  std::stable_sort(byFrame.begin(), byFrame.end(),
                   [](const model::Event& a, const model::Event& b) { return a.frame < b.frame; });
  std::vector<model::Event> shuffled = byFrame;
  std::shuffle(shuffled.begin(), shuffled.end(), std::mt19937(7));
  const std::string inFrameOrder =
      reportOf(toAnnotation(parseEventsCsv(csvRows(trial, byFrame), "t.csv")));
  for (const auto& rows : {byFrame, shuffled}) {
    const std::string text = reportOf(toAnnotation(parseEventsCsv(csvRows(trial, rows), "t.csv")));
    EXPECT_TRUE(text == inFrameOrder);
    const auto report = nlohmann::json::parse(text);
    EXPECT_GE(report["problems"].size(), 4U);
    EXPECT_GT(report["strides"].size(), 300U);
  }
}

TEST(ReportJson, ReportFileIsTheReportText) {
  // Common practice, no source: the file holds exactly the text, long trials included.
  const auto folder = std::filesystem::temp_directory_path() / "stridemark_report_file_test";
  std::filesystem::create_directories(folder);
  const auto path = folder / "report.json";
  const model::Annotation trial = testing::variedTrain(model::LimbSet::quadruped(), 5000, 5);
  const analysis::Report report = analysis::analyse(trial);
  writeReportJsonFile(path, report);
  EXPECT_EQ(readWholeFile(path), reportJsonText(report));
  EXPECT_TRUE(nlohmann::json::accept(readWholeFile(path)));
  std::filesystem::remove_all(folder);
}

}  // namespace
}  // namespace stridemark::formats
