#include "common/rational.h"

#include <algorithm>
#include <charconv>
#include <cmath>
#include <numeric>

#include "common/error.h"

namespace stridemark {

Rational reduced(Rational r) {
  if (r.den < 0) {
    r.num = -r.num;
    r.den = -r.den;
  }
  const std::int64_t g = std::gcd(r.num, r.den);
  if (g > 1) {
    r.num /= g;
    r.den /= g;
  }
  return r;
}

Rational rationalFromDouble(double value, std::int64_t maxDen) {
  // No 64-bit numerator near or above 2^63: the conversion below would overflow.
  if (!std::isfinite(value) || value <= 0 || value >= 9e18) return {0, 1};
  // Continued-fraction convergents until the denominator bound is hit.
  std::int64_t h0 = 0, h1 = 1, k0 = 1, k1 = 0;
  double x = value;
  for (int i = 0; i < 64; ++i) {
    const double a = std::floor(x);
    // Stop before the next convergent's terms could overflow 64 bits.
    if (a * static_cast<double>(std::max(h1, k1)) + static_cast<double>(std::max(h0, k0)) >= 9e18)
      break;
    const auto ai = static_cast<std::int64_t>(a);
    const std::int64_t h2 = ai * h1 + h0;
    const std::int64_t k2 = ai * k1 + k0;
    if (k2 > maxDen) break;
    h0 = h1;
    h1 = h2;
    k0 = k1;
    k1 = k2;
    const double frac = x - a;
    if (frac < 1e-12 ||
        std::fabs(static_cast<double>(h1) / static_cast<double>(k1) - value) < 1e-12 * value)
      break;
    x = 1.0 / frac;
  }
  return reduced({h1, k1});
}

Rational parseRate(std::string_view text, std::string_view what) {
  const std::string s(text);
  auto fail = [&]() -> Rational {
    throw Error(ErrorCategory::format,
                std::string(what) + " '" + s +
                    "' is not a positive rate: write it as 240, 239.76 or 30000/1001");
  };
  if (s.empty()) return fail();
  const auto slash = s.find('/');
  try {
    if (slash != std::string::npos) {
      std::size_t used1 = 0, used2 = 0;
      const std::string a = s.substr(0, slash), b = s.substr(slash + 1);
      const long long n = std::stoll(a, &used1);
      const long long d = std::stoll(b, &used2);
      if (used1 != a.size() || used2 != b.size() || n <= 0 || d <= 0) return fail();
      return reduced({n, d});
    }
    // Whole numbers exactly: through a double, text above 2^53 would change its value (and a
    // rate we write as "N" would not read back as N).
    long long whole = 0;
    const auto [end, ec] = std::from_chars(s.data(), s.data() + s.size(), whole);
    if (ec == std::errc() && end == s.data() + s.size()) {
      if (whole <= 0) return fail();
      return {whole, 1};
    }
    std::size_t used = 0;
    const double v = std::stod(s, &used);
    if (used != s.size() || !std::isfinite(v) || v <= 0) return fail();
    const Rational r = rationalFromDouble(v, 1000000);
    if (!r.valid()) return fail();
    return r;
  } catch (const std::logic_error&) {
    return fail();
  }
}

std::string toString(Rational r) {
  if (r.den == 1) return std::to_string(r.num);
  return std::to_string(r.num) + "/" + std::to_string(r.den);
}

std::int64_t secondsToFrame(double seconds, Rational rate) {
  return static_cast<std::int64_t>(
      std::llround(seconds * static_cast<double>(rate.num) / static_cast<double>(rate.den)));
}

}  // namespace stridemark
