// Robustness: randomly damaged inputs must be read or refused with stridemark::Error — never a
// crash, never another exception type. Seeds are fixed and printed with each failure.
#include <gtest/gtest.h>

#include <random>

#include "analysis/analyse.h"
#include "common/error.h"
#include "formats/events_csv.h"
#include "formats/project_file.h"
#include "formats/report_json.h"
#include "trial_fixture.h"

namespace stridemark::formats {
namespace {

std::string damaged(std::string text, std::mt19937& random) {
  const int edits = 1 + static_cast<int>(random() % 4);
  for (int e = 0; e < edits && !text.empty(); ++e) {
    const std::size_t at = random() % text.size();
    switch (random() % 4) {
      case 0:
        text[at] = static_cast<char>(random() & 0xFF);
        break;
      case 1:
        text.erase(at, 1 + random() % 8);
        break;
      case 2:
        text.insert(at, text.substr(random() % text.size(), 1 + random() % 12));
        break;
      default:
        text.insert(at, 1, ",\n\"#{}[]:-.0e"[random() % 13]);
        break;
    }
  }
  return text;
}

template <typename Read>
void expectOnlyFormatErrors(const std::string& good, std::uint32_t seed, Read read) {
  std::mt19937 random(seed);
  int refused = 0;
  for (int i = 0; i < 3000; ++i) {
    const std::string text = damaged(good, random);
    try {
      read(text);
    } catch (const Error&) {
      ++refused;
    } catch (const std::exception& e) {
      FAIL() << "seed " << seed << " case " << i << ": " << e.what() << "\n" << text;
    }
  }
  EXPECT_GT(refused, 0) << "no damaged input was refused (seed " << seed << ")";
}

TEST(Mutation, EventsCsvReaderOnlyThrowsFormatErrors) {
  const std::string good = formatEventsCsv(testing::checkOneTrial());
  EventsCsvOptions options;
  options.captureRate = Rational{250, 1};
  expectOnlyFormatErrors(good, 20261202u, [&](const std::string& text) {
    toAnnotation(parseEventsCsv(text, "m.csv", options));
  });
}

TEST(Mutation, ProjectReaderOnlyThrowsFormatErrors) {
  model::Project project;
  project.annotation = testing::checkOneTrial(2);
  project.annotation.hidden.push_back({0, 3, 9});
  project.trial.speedMs = 1.5;
  project.video = model::VideoLink{"a.mp4", "sig", 500, Rational{30, 1}};
  expectOnlyFormatErrors(projectJsonText(project), 77u,
                         [](const std::string& text) { parseProjectJson(text, "m.stridemark"); });
}

TEST(Mutation, ReportReaderOnlyThrowsFormatErrors) {
  const std::string good = reportJsonText(analysis::analyse(testing::checkOneTrial(2)));
  expectOnlyFormatErrors(good, 5u,
                         [](const std::string& text) { parseReportJson(text, "m.json"); });
}

}  // namespace
}  // namespace stridemark::formats
