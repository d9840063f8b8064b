#include "common/rational.h"

#include <gtest/gtest.h>

#include "common/error.h"

namespace stridemark {
namespace {

// Common practice, no source: NTSC-style rates are 30000/1001 exactly.
TEST(Rational, ParsesIntegerDecimalAndFractionRates) {
  EXPECT_EQ(parseRate("240"), (Rational{240, 1}));
  EXPECT_EQ(parseRate("30000/1001"), (Rational{30000, 1001}));
  EXPECT_EQ(parseRate("239.76"), (Rational{5994, 25}));
  EXPECT_EQ(parseRate("1000/4"), (Rational{250, 1}));
}

TEST(Rational, RejectsNonRatesWithTheTextInTheMessage) {
  for (const char* bad : {"", "abc", "-240", "0", "240fps", "1/0", "nan"}) {
    try {
      parseRate(bad, "--fps");
      ADD_FAILURE() << "accepted '" << bad << "'";
    } catch (const Error& e) {
      EXPECT_EQ(e.category(), ErrorCategory::format);
      EXPECT_NE(std::string(e.what()).find("--fps"), std::string::npos);
    }
  }
}

// Source: docs/methods.md §1.3, t = frame / fps.
TEST(Rational, FramesToSecondsIsExactForIntegerRates) {
  EXPECT_DOUBLE_EQ(framesToSeconds(125, {250, 1}), 0.5);
  EXPECT_EQ(secondsToFrame(0.5, {250, 1}), 125);
  EXPECT_EQ(secondsToFrame(1.0, {30000, 1001}), 30);
}

// Found by tests/fuzz (fuzz_journal, a capture rate of "1209223372036854775807"): a decimal
// rate beyond 64 bits overflowed the conversion to a fraction (undefined behaviour; UBSan in
// the asan-ubsan and fuzz builds stops on it). Common practice, no source: refuse, never wrap.
TEST(Rational, RatesBeyondSixtyFourBitsAreRefused) {
  for (const char* huge : {"1209223372036854775807", "9.3e18", "1e300"}) {
    EXPECT_THROW(parseRate(huge, "capture rate"), Error) << huge;
  }
  EXPECT_FALSE(rationalFromDouble(1e300).valid());
  EXPECT_EQ(rationalFromDouble(4611686018427387904.0), (Rational{4611686018427387904, 1}));
  // Large but representable: still a fraction within the function's relative 1e-12.
  const Rational near = rationalFromDouble(123456789012.345678);
  EXPECT_TRUE(near.valid());
  EXPECT_NEAR(static_cast<double>(near.num) / static_cast<double>(near.den), 123456789012.345678,
              0.13);
}

// Found by tests/fuzz (fuzz_journal: a journal's rate "00050925036228669603/3" was written back
// as "16975012076223201" and read as 16975012076223200). Common practice, no source: whole
// numbers are read exactly, so every rate we write reads back the same.
TEST(Rational, WholeNumberRatesReadExactly) {
  EXPECT_EQ(parseRate("16975012076223201"), (Rational{16975012076223201, 1}));
  EXPECT_EQ(parseRate("9223372036854775807"), (Rational{9223372036854775807, 1}));
  const Rational reduced = parseRate("00050925036228669603/3");
  EXPECT_EQ(parseRate(toString(reduced)), reduced);
  EXPECT_THROW(parseRate("9223372036854775808", "capture rate"), Error);  // beyond 64 bits
}

}  // namespace
}  // namespace stridemark
