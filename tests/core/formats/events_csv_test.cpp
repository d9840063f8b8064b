#include "formats/events_csv.h"

#include <gtest/gtest.h>

#include "common/error.h"
#include "test_support.h"

namespace stridemark::formats {
namespace {

using model::EventKind;
using model::LimbSet;

// The message of the Error thrown while parsing `text`, or "" when parsing succeeds.
std::string errorOf(const std::string& text, const EventsCsvOptions& options = {}) {
  try {
    parseEventsCsv(text, "trial.csv", options);
  } catch (const Error& e) {
    EXPECT_EQ(e.category(), ErrorCategory::format);
    return e.what();
  }
  return "";
}

TEST(EventsCsv, ReadsFramesInFileOrder) {
  const EventsCsv csv = parseEventsCsv("limb,event,frame\nLH,touchdown,12\nLF,liftoff,80\n", "a");
  ASSERT_EQ(csv.events.size(), 2u);
  EXPECT_EQ(csv.events[0], (model::Event{12, 2, EventKind::touchdown}));
  EXPECT_EQ(csv.events[1], (model::Event{80, 0, EventKind::liftoff}));
  EXPECT_EQ(csv.limbs.name(), "quadruped");
  EXPECT_FALSE(csv.captureRate.has_value());
  EXPECT_FALSE(csv.timeColumn);
}

TEST(EventsCsv, AcceptsColumnOrderWhitespaceCrlfBomCommentsAndBlankLines) {
  const std::string text =
      "\xEF\xBB\xBF# exported by hand\r\n"
      "\r\n"
      " frame , limb ,event \r\n"
      "# a comment between rows\r\n"
      " 5 , RF , touchdown\r\n"
      "\r\n"
      "\"9\",\"RF\",\"liftoff\"";  // quoted fields, no final newline
  const EventsCsv csv = parseEventsCsv(text, "a");
  ASSERT_EQ(csv.events.size(), 2u);
  EXPECT_EQ(csv.events[0], (model::Event{5, 1, EventKind::touchdown}));
  EXPECT_EQ(csv.events[1], (model::Event{9, 1, EventKind::liftoff}));
}

TEST(EventsCsv, HeaderCommentsGiveRateLimbSetAndReference) {
  const EventsCsv csv = parseEventsCsv(
      "# fps: 30000/1001\n# limbs: hexapod\n# reference: R2\nlimb,event,frame\nL3,touchdown,1\n",
      "a");
  EXPECT_EQ(csv.limbs.name(), "hexapod");
  EXPECT_EQ(*csv.captureRate, (Rational{30000, 1001}));
  EXPECT_EQ(*csv.referenceLimb, 3);
  EXPECT_EQ(csv.events[0].limb, 4);
}

TEST(EventsCsv, OptionsOverrideHeaderComments) {
  EventsCsvOptions options;
  options.captureRate = Rational{500, 1};
  options.limbs = LimbSet::biped();
  const EventsCsv csv = parseEventsCsv(
      "# fps: 240\n# limbs: quadruped\nlimb,event,frame\nR,touchdown,3\n", "a", options);
  EXPECT_EQ(*csv.captureRate, (Rational{500, 1}));
  EXPECT_EQ(csv.limbs.name(), "biped");
  EXPECT_EQ(csv.events[0].limb, 1);
}

TEST(EventsCsv, TimeColumnRoundsToNearestFrame) {
  // frame = round(time_s x capture rate) (CHANGELOG.md, events CSV).
  // 0.5 s x 250 = 125; 0.1019 s x 250 = 25.475 -> 25; 0.1021 x 250 = 25.525 -> 26.
  EventsCsvOptions options;
  options.captureRate = Rational{250, 1};
  const EventsCsv csv = parseEventsCsv(
      "limb,event,time_s\nLH,touchdown,0.5\nLH,liftoff,0.1019\nLF,liftoff,0.1021\n", "a", options);
  EXPECT_TRUE(csv.timeColumn);
  EXPECT_EQ(csv.events[0].frame, 125);
  EXPECT_EQ(csv.events[1].frame, 25);
  EXPECT_EQ(csv.events[2].frame, 26);
}

TEST(EventsCsv, TimeColumnWithoutRateNamesTheHeaderLine) {
  const std::string message = errorOf("# note\nlimb,event,time_s\nLH,touchdown,0.5\n");
  EXPECT_NE(message.find("trial.csv:2:"), std::string::npos) << message;
  EXPECT_NE(message.find("--fps"), std::string::npos) << message;
}

struct BadCase {
  const char* name;
  std::string text;
  long line;
  const char* says;  // a word the message must contain
};

class EventsCsvRejects : public ::testing::TestWithParam<BadCase> {};

TEST_P(EventsCsvRejects, WithFileLineAndReason) {
  const BadCase& bad = GetParam();
  EventsCsvOptions options;
  options.captureRate = Rational{240, 1};
  const std::string message = errorOf(bad.text, options);
  ASSERT_FALSE(message.empty()) << bad.name << " was accepted";
  EXPECT_EQ(message.rfind("trial.csv:" + std::to_string(bad.line) + ": ", 0), 0u) << message;
  EXPECT_NE(message.find(bad.says), std::string::npos) << message;
  EXPECT_NE(message.find(" — "), std::string::npos) << "no advice in: " << message;
}

INSTANTIATE_TEST_SUITE_P(
    Malformed, EventsCsvRejects,
    ::testing::Values(
        BadCase{"empty", "", 1, "no header"},
        BadCase{"comments only", "# fps: 240\n\n", 2, "no header"},
        BadCase{"wrong header", "limb,kind,frame\nLH,touchdown,1\n", 1, "unknown column 'kind'"},
        BadCase{"two columns", "limb,event\n", 1, "2 columns"},
        BadCase{"repeated column", "limb,limb,frame\n", 1, "twice"},
        BadCase{"frame and time", "frame,event,time_s\n", 1, "both"},
        BadCase{"unknown limb", "limb,event,frame\nLH,touchdown,1\nXX,liftoff,2\n", 3,
                "LF, RF, LH, RH"},
        BadCase{"empty limb", "limb,event,frame\n,touchdown,1\n", 2, "limb field is empty"},
        BadCase{"unknown event", "limb,event,frame\nLH,td,1\n", 2, "unknown event 'td'"},
        BadCase{"capitalised event", "limb,event,frame\nLH,Touchdown,1\n", 2, "unknown event"},
        BadCase{"non-numeric frame", "limb,event,frame\nLH,touchdown,abc\n", 2, "not a number"},
        BadCase{"negative frame", "limb,event,frame\nLH,touchdown,-3\n", 2, "negative"},
        BadCase{"fractional frame", "limb,event,frame\nLH,touchdown,12.5\n", 2,
                "not a whole number"},
        BadCase{"huge frame", "limb,event,frame\nLH,touchdown,99999999999999999999999\n", 2,
                "too large"},
        BadCase{"empty frame", "limb,event,frame\nLH,touchdown,\n", 2, "frame field is empty"},
        BadCase{"nan time", "limb,event,time_s\nLH,touchdown,nan\n", 2, "not a finite"},
        BadCase{"inf time", "limb,event,time_s\nLH,touchdown,inf\n", 2, "not a finite"},
        BadCase{"negative time", "limb,event,time_s\nLH,touchdown,-0.5\n", 2, "negative"},
        BadCase{"text time", "limb,event,time_s\nLH,touchdown,half\n", 2, "not a number"},
        BadCase{"too many fields", "limb,event,frame\nLH,touchdown,1,2\n", 2, "found 4"},
        BadCase{"too few fields", "limb,event,frame\nLH,touchdown\n", 2, "found 2"},
        BadCase{"NUL byte", std::string("limb,event,frame\nLH,touch\0down,1\n", 32), 2,
                "not a text CSV"},
        BadCase{"invalid UTF-8", "limb,event,frame\nLH,touchdown,1\n\xC3\x28,x,1\n", 3,
                "not a text CSV"},
        BadCase{"overlong UTF-8", "limb,event,frame\n\xC0\xAF\n", 2, "not a text CSV"},
        BadCase{"bad fps comment", "# fps: fast\nlimb,event,frame\n", 1, "capture rate"},
        BadCase{"bad limb set comment", "# limbs: octopus\nlimb,event,frame\n", 1,
                "unknown limb set"},
        BadCase{"reference not in set", "# reference: L9\nlimb,event,frame\n", 1,
                "reference limb 'L9'"}),
    [](const ::testing::TestParamInfo<BadCase>& param) {
      std::string name = param.param.name;
      for (char& c : name) {
        if (!std::isalnum(static_cast<unsigned char>(c))) c = '_';
      }
      return name;
    });

TEST(EventsCsv, BinaryGarbageIsNotText) {
  std::string garbage;
  std::mt19937 random(7);  // seed printed by being fixed: 7
  for (int i = 0; i < 4096; ++i) garbage += static_cast<char>(random() & 0xFF);
  const std::string message = errorOf(garbage);
  EXPECT_NE(message.find("not a text CSV"), std::string::npos) << message;
  EXPECT_EQ(message.rfind("trial.csv:", 0), 0u) << message;
}

TEST(EventsCsv, ValidUtf8InCommentsIsFine) {
  const EventsCsv csv =
      parseEventsCsv("# Stute \"Möwe\", 3 Jahre — trab ±\nlimb,event,frame\nLH,touchdown,1\n", "a");
  EXPECT_EQ(csv.events.size(), 1u);
}

TEST(EventsCsv, WriterRoundTripsEveryLimbSet) {
  for (const LimbSet& limbs :
       {LimbSet::quadruped(), LimbSet::biped(), LimbSet::hexapod(), LimbSet::multiPair(7)}) {
    model::Annotation annotation;
    annotation.limbs = limbs;
    annotation.captureRate = Rational{30000, 1001};
    annotation.referenceLimb = limbs.size() - 1;
    for (int limb = 0; limb < limbs.size(); ++limb) {
      for (int k = 0; k < 5; ++k) {
        annotation.events.push_back({100 * k + limb, limb, EventKind::touchdown});
        annotation.events.push_back({100 * k + limb + 40, limb, EventKind::liftoff});
      }
    }
    annotation.normalize();
    const std::string text = formatEventsCsv(annotation, "unit test");
    ASSERT_EQ(text.rfind("# ", 0), 0u);
    const EventsCsv back = parseEventsCsv(text, "round-trip.csv");
    EXPECT_EQ(back.limbs, limbs);
    EXPECT_EQ(*back.captureRate, annotation.captureRate);
    EXPECT_EQ(*back.referenceLimb, annotation.referenceLimb);
    std::vector<model::Event> events = back.events;
    std::sort(events.begin(), events.end());
    EXPECT_EQ(events, annotation.events) << limbs.name();
  }
}

TEST(EventsCsv, WriterEmitsFrameOrderAfterHeaderComments) {
  model::Annotation annotation;
  annotation.captureRate = Rational{120, 1};
  annotation.events = {{30, 0, EventKind::touchdown}, {10, 2, EventKind::touchdown}};
  annotation.normalize();
  const std::string text = formatEventsCsv(annotation);
  const auto header = text.find("limb,event,frame\n");
  ASSERT_NE(header, std::string::npos);
  EXPECT_EQ(text.substr(header), "limb,event,frame\nLH,touchdown,10\nLF,touchdown,30\n");
  EXPECT_NE(text.find("# fps: 120\n"), std::string::npos);
}

TEST(EventsCsv, ReadsAFileAndNamesAMissingOne) {
  testing::TempFolder folder;
  const auto path = folder / "tags.csv";
  testing::writeText(path, "limb,event,frame\nL,touchdown,4\n");
  EventsCsvOptions options;
  options.limbs = LimbSet::biped();
  EXPECT_EQ(readEventsCsv(path, options).events.size(), 1u);
  try {
    readEventsCsv(folder / "missing.csv");
    FAIL() << "no error for a missing file";
  } catch (const Error& e) {
    EXPECT_EQ(e.category(), ErrorCategory::io);
    EXPECT_NE(std::string(e.what()).find("missing.csv: cannot open"), std::string::npos);
  }
}

}  // namespace
}  // namespace stridemark::formats

namespace stridemark::formats {
namespace {

TEST(EventsCsv, ToAnnotationGivesModelOrderWhateverTheFileOrder) {
  EventsCsvOptions options;
  options.captureRate = Rational{100, 1};
  for (const std::string body : {"LH,touchdown,5\nLF,touchdown,7\nLH,liftoff,9\nLF,liftoff,9\n",
                                 "LF,liftoff,9\nLH,liftoff,9\nLF,touchdown,7\nLH,touchdown,5\n",
                                 "LH,liftoff,9\nLH,touchdown,9\nLH,touchdown,5\n"}) {
    EventsCsv csv = parseEventsCsv("# reference: RF\nlimb,event,frame\n" + body, "a", options);
    std::vector<model::Event> expected = csv.events;
    std::sort(expected.begin(), expected.end());
    const model::Annotation annotation = toAnnotation(std::move(csv));
    EXPECT_EQ(annotation.events, expected) << body;
    EXPECT_EQ(annotation.referenceLimb, 1);
    EXPECT_EQ(annotation.captureRate, (Rational{100, 1}));
  }
}

}  // namespace
}  // namespace stridemark::formats
