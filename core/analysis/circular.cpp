#include "analysis/circular.h"

#include <algorithm>
#include <cmath>
#include <limits>
#include <numbers>

namespace stridemark::analysis {
namespace {

constexpr double kTwoPi = 2.0 * std::numbers::pi;

struct Resultant {
  double c = 0;
  double s = 0;
  double r() const { return std::hypot(c, s); }
};

// Mean cosine and sine of the samples mapped onto the circle of the given period.
Resultant resultant(std::span<const double> samples, double high, double low) {
  Resultant out;
  if (samples.empty()) return out;
  const double scale = kTwoPi / (high - low);
  for (double x : samples) {
    const double angle = (x - low) * scale;
    out.c += std::cos(angle);
    out.s += std::sin(angle);
  }
  out.c /= static_cast<double>(samples.size());
  out.s /= static_cast<double>(samples.size());
  return out;
}

// R this close to 0 is numerically zero (sums of unit vectors that cancel).
constexpr double kZeroR = 1e-12;

}  // namespace

double meanResultantLength(std::span<const double> samples, double high, double low) {
  return std::min(1.0, resultant(samples, high, low).r());
}

namespace {

// Mean direction of a resultant on a period (NaN when R is numerically 0).
double meanOf(const Resultant& res, bool empty, double high, double low) {
  if (empty || res.r() < kZeroR) return std::numeric_limits<double>::quiet_NaN();
  double angle = std::atan2(res.s, res.c);
  if (angle < 0) angle += kTwoPi;
  double value = low + angle * (high - low) / kTwoPi;
  if (value >= high) value = low;
  return value;
}

}  // namespace

double circularMean(std::span<const double> samples, double high, double low) {
  return meanOf(resultant(samples, high, low), samples.empty(), high, low);
}

double circularSd(std::span<const double> samples, double high, double low) {
  const double r = meanResultantLength(samples, high, low);
  if (r < kZeroR) return std::numeric_limits<double>::infinity();
  return std::sqrt(-2.0 * std::log(r)) * (high - low) / kTwoPi;
}

double rayleighP(int n, double rBar) {
  if (n <= 0) return 1.0;
  const double nd = static_cast<double>(n);
  const double bigR = nd * rBar;
  const double p =
      std::exp(std::sqrt(1.0 + 4.0 * nd + 4.0 * (nd * nd - bigR * bigR)) - (1.0 + 2.0 * nd));
  return std::min(1.0, p);
}

CircularStats circularStats(std::span<const double> phases) {
  CircularStats out;
  out.n = static_cast<int>(phases.size());
  if (phases.empty()) {
    out.mean = out.r = std::numeric_limits<double>::quiet_NaN();
    out.circVar = out.circSd = out.angularDev = out.rayleighZ = out.rayleighP = out.r;
    return out;
  }
  Resultant res;
  for (const double phase : phases) {
    const double angle = phase * kTwoPi;  // as resultant() on the period [0, 1)
    res.c += std::cos(angle);
    res.s += std::sin(angle);
  }
  res.c /= static_cast<double>(out.n);
  res.s /= static_cast<double>(out.n);
  out.r = std::min(1.0, res.r());
  out.defined = out.r >= kZeroR;
  if (!out.defined) out.r = 0.0;
  out.mean = out.defined ? meanOf(res, false, 1.0, 0.0) : std::numeric_limits<double>::quiet_NaN();
  out.circVar = 1.0 - out.r;
  out.circSd = out.defined ? std::sqrt(-2.0 * std::log(out.r)) / kTwoPi
                           : std::numeric_limits<double>::infinity();
  out.angularDev = std::sqrt(2.0 * (1.0 - out.r)) / kTwoPi;
  out.rayleighZ = static_cast<double>(out.n) * out.r * out.r;
  out.rayleighP = rayleighP(out.n, out.r);
  return out;
}

double wrapPhase(double phase) {
  double w = phase - std::floor(phase);
  if (w >= 1.0) w = 0.0;  // -1e-18 wraps to 1.0 in floating point
  return w;
}

double centredPhase(double phase) {
  const double w = wrapPhase(phase);
  return w <= 0.5 ? w : w - 1.0;
}

double circularDistance(double a, double b) {
  return std::abs(centredPhase(a - b));
}

}  // namespace stridemark::analysis
