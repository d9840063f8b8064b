// The seeds file and the seed checks: every problem names the line or seed and what to do.
#include <gtest/gtest.h>

#include "common/error.h"
#include "formats/seeds_csv.h"
#include "vision/propose.h"

namespace stridemark {
namespace {

std::string errorOf(const std::string& text) {
  try {
    formats::parseSeedsCsv(text, "s.csv", model::LimbSet::quadruped());
  } catch (const Error& e) {
    return e.what();
  }
  return "";
}

// Issue 18 item 2 (SEEDS.csv: header limb,frame,x,y); the layout is ours.
TEST(SeedsCsv, ReadsSeedsAndRoundTrips) {
  const auto seeds =
      formats::parseSeedsCsv("# clicked\r\nlimb,frame,x,y\r\nLF,0,212.5,301\r\nRH,14,90,288.25\r\n",
                             "s.csv", model::LimbSet::quadruped());
  ASSERT_EQ(seeds.size(), 2u);
  EXPECT_EQ(seeds[1].limb, 3);
  EXPECT_EQ(seeds[1].frame, 14);
  EXPECT_DOUBLE_EQ(seeds[1].y, 288.25);
  const std::string text = formats::formatSeedsCsv(seeds, model::LimbSet::quadruped());
  EXPECT_EQ(formats::parseSeedsCsv(text, "t.csv", model::LimbSet::quadruped()), seeds);
}

// Issue 18 item 2: bad seeds get a message that says what to fix (file and line).
TEST(SeedsCsv, RejectsBadLinesNamingTheLine) {
  EXPECT_NE(errorOf("frame,limb,x,y\n").find("s.csv:1: expected the header limb,frame,x,y"),
            std::string::npos);
  EXPECT_NE(errorOf("limb,frame,x,y\nL1,0,1,2\n").find("s.csv:2: unknown limb 'L1'"),
            std::string::npos);
  EXPECT_NE(errorOf("limb,frame,x,y\nLF,-3,1,2\n").find("s.csv:2: frame '-3' is not a frame"),
            std::string::npos);
  EXPECT_NE(errorOf("limb,frame,x,y\nLF,3,left,2\n").find("s.csv:2: x 'left' is not a number"),
            std::string::npos);
  EXPECT_NE(errorOf("limb,frame,x,y\nLF,3,1\n").find("s.csv:2: has 3 fields, not 4"),
            std::string::npos);
  EXPECT_NE(errorOf("limb,frame,x,y\n").find("no seeds"), std::string::npos);
}

// Issue 18 item 2: seeds outside the frame, out of the clip or doubled are refused with the
// seed named.
TEST(SeedProblem, NamesTheSeedAndTheFix) {
  const auto limbs = model::LimbSet::quadruped();
  EXPECT_EQ(vision::seedProblem({{0, 5, 10, 10}}, limbs, 100, 640, 360), "");
  // Pixel i spans [i - 0.5, i + 0.5) (common practice, no source): edge clicks are inside.
  EXPECT_EQ(vision::seedProblem({{0, 5, -0.4, 359.4}}, limbs, 100, 640, 360), "");
  EXPECT_NE(vision::seedProblem({{0, 5, 639.5, 10}}, limbs, 100, 640, 360), "");
  EXPECT_NE(vision::seedProblem({{0, 5, 700, 10}}, limbs, 100, 640, 360)
                .find("seed LF at frame 5: position (700"),
            std::string::npos);
  EXPECT_NE(vision::seedProblem({{1, 100, 10, 10}}, limbs, 100, 640, 360)
                .find("seed RF at frame 100: the clip has frames 0..99"),
            std::string::npos);
  EXPECT_NE(
      vision::seedProblem({{2, 1, 1, 1}, {2, 1, 3, 3}}, limbs, 100, 640, 360).find("given twice"),
      std::string::npos);
  EXPECT_NE(vision::seedProblem({}, limbs, 100, 640, 360).find("no seeds"), std::string::npos);
}

}  // namespace
}  // namespace stridemark
