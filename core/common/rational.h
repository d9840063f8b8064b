#pragma once
// Exact rates and time bases. Frame numbers are the key of every event; seconds are derived
// from the capture rate only when a figure is shown or exported.
#include <cstdint>
#include <string>
#include <string_view>

namespace stridemark {

struct Rational {
  std::int64_t num = 0;
  std::int64_t den = 1;

  double toDouble() const { return static_cast<double>(num) / static_cast<double>(den); }
  bool valid() const { return num > 0 && den > 0; }
  friend bool operator==(const Rational&, const Rational&) = default;
};

Rational reduced(Rational r);

// Parses "240", "239.76", "30000/1001". Throws stridemark::Error(format) with `what` in the
// message when the text is not a positive rate.
Rational parseRate(std::string_view text, std::string_view what = "rate");

// Nearest rational with a bounded denominator (continued fractions), for rates from doubles.
Rational rationalFromDouble(double value, std::int64_t maxDen = 1001000);

std::string toString(Rational r);  // "240" or "30000/1001"

// Seconds at the given rate, computed late: frames / rate.
inline double framesToSeconds(std::int64_t frames, Rational rate) {
  return static_cast<double>(frames) * static_cast<double>(rate.den) /
         static_cast<double>(rate.num);
}

// Nearest frame for a time at the given rate (round half away from zero).
std::int64_t secondsToFrame(double seconds, Rational rate);

}  // namespace stridemark
