// The memoised number writer must print exactly what std::to_chars prints (shortest text that
// reads back as the same double), whether a value is met for the first time, again, or after
// another value took its slot.
#include <gtest/gtest.h>

#include <charconv>
#include <cstdlib>
#include <limits>
#include <random>
#include <string>
#include <vector>

#include "formats/number_text.h"
#include "formats/text_scan.h"

namespace stridemark::formats::text {
namespace {

std::string viaCache(NumberText& numbers, double value) {
  char buffer[NumberText::kRoom + 8];
  return std::string(buffer, numbers.write(buffer, value));
}

// Source: C++17 [charconv.to.chars] - to_chars without a format gives the shortest text that
// round-trips; strtod (C11 7.22.1.3) reads it back.
TEST(NumberText, SameTextAsToCharsAndReadsBack) {
  std::mt19937_64 random(20261202);
  std::uniform_int_distribution<int> frames(1, 400);
  std::uniform_real_distribution<double> any(-1e6, 1e6);
  std::vector<double> values = {0.0,
                                -0.0,
                                0.5,
                                1e-7,
                                0.0001,
                                123456789012345680.0,
                                -2.2250738585072014e-308,
                                std::numeric_limits<double>::max(),
                                std::numeric_limits<double>::denorm_min()};
  for (int i = 0; i < 20000; ++i) values.push_back(frames(random) / double(frames(random)));
  for (int i = 0; i < 20000; ++i) values.push_back(any(random));
  NumberText numbers;
  for (int pass = 0; pass < 2; ++pass) {  // second pass: mostly cache hits
    for (const double v : values) {
      const std::string text = viaCache(numbers, v);
      ASSERT_EQ(text, formatDouble(v)) << "value " << v << " pass " << pass;
      ASSERT_EQ(std::strtod(text.c_str(), nullptr), v == 0 ? 0.0 : v) << text;
    }
  }
}

TEST(NumberText, NegativeZeroIsWrittenAsZero) {
  NumberText numbers;
  EXPECT_EQ(viaCache(numbers, -0.0), "0");  // Common practice, no source: "-0" confuses readers
}

}  // namespace
}  // namespace stridemark::formats::text
