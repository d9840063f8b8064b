#pragma once
// Circular statistics for phases (docs/methods.md §8). Phases are in cycles; angles = 2 pi phase.
// When the mean resultant length is 0 the mean direction does not exist: `defined` is false and
// the mean is NaN, so callers can say "undefined" instead of printing a silent NaN.
#include <span>

namespace stridemark::analysis {

struct CircularStats {
  int n = 0;
  bool defined = false;   // false when n == 0 or R == 0 (mean direction does not exist)
  double mean = 0;        // cycles in [0, 1) when defined, NaN otherwise
  double r = 0;           // mean resultant length R in [0, 1]
  double circVar = 0;     // 1 - R
  double circSd = 0;      // sqrt(-2 ln R), cycles; +inf when R == 0
  double angularDev = 0;  // sqrt(2 (1 - R)), cycles
  double rayleighZ = 0;   // n R^2
  double rayleighP = 1;   // Zar's approximation
};

// Statistics of phases given in cycles (any real value; wrapped implicitly).
CircularStats circularStats(std::span<const double> phases);

// Circular mean of samples on a period [low, high) like scipy.stats.circmean; NaN when R == 0.
double circularMean(std::span<const double> samples, double high, double low = 0.0);
// Circular SD sqrt(-2 ln R) scaled to the period, like scipy.stats.circstd.
double circularSd(std::span<const double> samples, double high, double low = 0.0);
// Mean resultant length on a period.
double meanResultantLength(std::span<const double> samples, double high, double low = 0.0);

// Rayleigh p-value for n samples with mean resultant length rBar (Zar 1999, eq. 27.4).
double rayleighP(int n, double rBar);

// Phase wrapped into [0, 1).
double wrapPhase(double phase);
// Centred form: phase if phase <= 0.5 else phase - 1, range (-0.5, 0.5] (docs/methods.md §1.2).
double centredPhase(double phase);
// Shortest distance between two phases on the circle, in [0, 0.5].
double circularDistance(double a, double b);

}  // namespace stridemark::analysis
