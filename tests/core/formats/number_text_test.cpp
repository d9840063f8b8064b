// Numbers in reports and tables are the shortest text that reads back as the same double.
#include <gtest/gtest.h>

#include <cstdlib>
#include <limits>
#include <random>
#include <string>
#include <vector>

#include "formats/text_scan.h"

namespace stridemark::formats::text {
namespace {

// Source: C++17 [charconv.to.chars] - to_chars without a format gives the shortest text that
// round-trips; strtod (C11 7.22.1.3) reads it back.
TEST(NumberText, ShortestTextReadsBackExactly) {
  std::mt19937_64 random(20261202);
  std::uniform_int_distribution<int> frames(1, 400);
  std::uniform_real_distribution<double> any(-1e6, 1e6);
  std::vector<double> values = {0.5,
                                1e-7,
                                0.0001,
                                123456789012345680.0,
                                -2.2250738585072014e-308,
                                std::numeric_limits<double>::max(),
                                std::numeric_limits<double>::denorm_min()};
  for (int i = 0; i < 20000; ++i) values.push_back(frames(random) / double(frames(random)));
  for (int i = 0; i < 20000; ++i) values.push_back(any(random));
  for (const double v : values) {
    const std::string text = formatDouble(v);
    ASSERT_EQ(std::strtod(text.c_str(), nullptr), v) << text;
  }
  EXPECT_EQ(formatDouble(0.5), "0.5");
  EXPECT_EQ(formatDouble(0.1), "0.1");  // shortest, not 0.1000000000000000055...
}

TEST(NumberText, NegativeZeroIsWrittenAsZero) {
  EXPECT_EQ(formatDouble(-0.0), "0");  // Common practice, no source: "-0" confuses readers
}

}  // namespace
}  // namespace stridemark::formats::text
