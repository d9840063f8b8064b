// Issue 17 defect 2: JSON nested tens of thousands of levels deep crashed the readers by stack
// overflow (the error message serialised the whole offending value, recursively). The readers
// now refuse any document nested deeper than kMaxJsonDepth before building it, and quote at
// most a short prefix of a wrong value.
#include <gtest/gtest.h>

#include <algorithm>
#include <string>

#include <nlohmann/json.hpp>

#include "analysis/analyse.h"
#include "common/error.h"
#include "formats/json_in.h"
#include "formats/project_file.h"
#include "formats/report_json.h"
#include "test_support.h"
#include "trial_fixture.h"

namespace stridemark::formats {
namespace {

constexpr int kHostileDepth = 70'000;  // the depth of the hostile test's files (issue 17)

// `depth` nested arrays around the number 1: "[[[...1...]]]".
std::string nestedArrays(int depth) {
  return std::string(static_cast<std::size_t>(depth), '[') + "1" +
         std::string(static_cast<std::size_t>(depth), ']');
}

// The document text with the value of the string "@HERE@" replaced by `replacement`.
std::string withValue(const nlohmann::json& document, const std::string& replacement) {
  std::string text = document.dump(1);
  const std::string marker = "\"@HERE@\"";
  const auto at = text.find(marker);
  EXPECT_NE(at, std::string::npos);
  return text.replace(at, marker.size(), replacement);
}

nlohmann::json sampleProjectDocument() {
  model::Project project;
  project.annotation.events = {{12, 0, model::EventKind::touchdown}};
  return nlohmann::json::parse(projectJsonText(project));
}

std::string errorOf(void (*read)(const std::string&), const std::string& text) {
  try {
    read(text);
  } catch (const Error& e) {
    EXPECT_EQ(e.category(), ErrorCategory::format);
    return e.what();
  }
  ADD_FAILURE() << "no error";
  return "";
}

void readProject(const std::string& text) {
  parseProjectJson(text, "deep.stridemark");
}
void readReport(const std::string& text) {
  parseReportJson(text, "deep.json");
}

// Common practice, no source: a refusal names the file, the place, the limit and what to do,
// and stays short (it must not carry the offending value).
void expectDepthRefusal(const std::string& message, const std::string& file) {
  EXPECT_EQ(message.rfind(file + ":", 0), 0u) << message;
  EXPECT_NE(message.find("nested more than 256 levels deep"), std::string::npos) << message;
  EXPECT_NE(message.find("restore a backup"), std::string::npos) << message;
  EXPECT_LT(message.size(), 300u) << message.substr(0, 300);
}

TEST(DeepJson, ProjectWithADeepValueAtATypedFieldIsRefused) {
  nlohmann::json document = sampleProjectDocument();
  document["capture_rate"] = "@HERE@";
  const std::string text = withValue(document, nestedArrays(kHostileDepth));
  const std::string message = errorOf(readProject, text);
  expectDepthRefusal(message, "deep.stridemark");
  // Source: our pretty printer puts capture_rate on its own line, so the bracket that crosses
  // the limit is on that line; the message points at it (line:column).
  const auto line =
      std::count(text.begin(), text.begin() + static_cast<long>(text.find('[')), '\n') + 1;
  EXPECT_NE(message.find("deep.stridemark:" + std::to_string(line) + ":"), std::string::npos)
      << message;
}

TEST(DeepJson, ProjectWithADeepEventFrameIsRefused) {
  nlohmann::json document = sampleProjectDocument();
  document["events"][0]["frame"] = "@HERE@";
  // Objects as well as arrays count as levels.
  std::string deep;
  for (int i = 0; i < kHostileDepth; ++i) deep += R"({"a":)";
  deep += "1" + std::string(kHostileDepth, '}');
  expectDepthRefusal(errorOf(readProject, withValue(document, deep)), "deep.stridemark");
}

TEST(DeepJson, ReportWithADeepValueIsRefused) {
  nlohmann::json document =
      nlohmann::json::parse(reportJsonText(analysis::analyse(testing::checkOneTrial())));
  document["fps"] = "@HERE@";
  expectDepthRefusal(errorOf(readReport, withValue(document, nestedArrays(kHostileDepth))),
                     "deep.json");
}

TEST(DeepJson, BracketsInsideTextDoNotCount) {
  // Common practice, no source: JSON text may hold any brackets inside quotes.
  nlohmann::json document = sampleProjectDocument();
  document["trial"]["notes"] = std::string(5000, '[') + "\\\"" + std::string(5000, '{');
  const model::Project project = parseProjectJson(document.dump(), "notes.stridemark");
  EXPECT_EQ(project.trial.notes.size(), 10'002u);
}

TEST(DeepJson, ShallowEnoughWrongValueIsQuotedBriefly) {
  // 200 levels are within the limit: the reader reaches the field and says what it expected,
  // quoting at most 40 characters of what it found.
  nlohmann::json document = sampleProjectDocument();
  document["capture_rate"] = "@HERE@";
  const std::string message = errorOf(readProject, withValue(document, nestedArrays(200)));
  EXPECT_NE(message.find("deep.stridemark: at /capture_rate: expected text in quotes, found " +
                         std::string(40, '[') + "..."),
            std::string::npos)
      << message;
  EXPECT_LT(message.size(), 200u) << message;
  // Common practice, no source: the file and place are named once (they used to be doubled,
  // "deep.stridemark: at /capture_rate: deep.stridemark: at /capture_rate: expected ...").
  EXPECT_EQ(message.find("deep.stridemark", 1), std::string::npos) << message;
}

TEST(DeepJson, QuotingNeverSerialisesTheWholeValue) {
  // A value built in memory (as a migration could) far deeper than any file may be: quoting it
  // must not walk it all (the old dump() recursed once per level and overflowed the stack).
  nlohmann::json deep = 1;
  for (int i = 0; i < 300'000; ++i) {
    nlohmann::json outer = nlohmann::json::array();
    outer.push_back(std::move(deep));
    deep = std::move(outer);
  }
  try {
    JsonIn(deep, "memory.json", "/x").text();
    ADD_FAILURE() << "no error";
  } catch (const Error& e) {
    EXPECT_EQ(std::string(e.what()),
              "memory.json: at /x: expected text in quotes, found " + std::string(40, '[') + "...");
  }
  // Long text and many members: a prefix only, and small values quoted whole.
  nlohmann::json wide = {{"key", std::string(100'000, 'x')}, {"more", nlohmann::json::array()}};
  try {
    JsonIn(wide, "memory.json").number();
    ADD_FAILURE() << "no error";
  } catch (const Error& e) {
    EXPECT_EQ(std::string(e.what()), "memory.json: at /: expected a number, found {\"key\":\"" +
                                         std::string(32, 'x') + "...");
  }
  try {
    JsonIn(nlohmann::json::parse(R"({"a":[1,true,null],"b":{}})"), "memory.json").number();
    ADD_FAILURE() << "no error";
  } catch (const Error& e) {
    EXPECT_EQ(std::string(e.what()),
              R"(memory.json: at /: expected a number, found {"a":[1,true,null],"b":{}})");
  }
}

}  // namespace
}  // namespace stridemark::formats
