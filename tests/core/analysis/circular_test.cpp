#include "analysis/circular.h"

#include <gtest/gtest.h>

#include <bit>
#include <cmath>
#include <cstdint>
#include <limits>
#include <numbers>
#include <vector>

namespace stridemark::analysis {
namespace {

constexpr double kPi = std::numbers::pi;

TEST(Circular, WrapAroundMeanIsZeroNotArithmetic) {
  // Source: docs/methods.md check 4 [calc]; arithmetic mean 0.5 must NOT be returned.
  const std::vector<double> phases{0.95, 0.05, 0.10, 0.90};
  const CircularStats s = circularStats(phases);
  ASSERT_TRUE(s.defined);
  EXPECT_NEAR(std::abs(centredPhase(s.mean)), 0.0, 1e-12);
}

TEST(Circular, ScipyCircmeanOnUnitPeriod) {
  // Source: SciPy docs, circmean([0.2, 1.4, 2.6], high=1, low=0) = 0.4 (docs/methods.md check 5).
  const std::vector<double> x{0.2, 1.4, 2.6};
  EXPECT_NEAR(circularMean(x, 1.0, 0.0), 0.4, 1e-12);
}

TEST(Circular, ScipyCircmeanRadians) {
  // Source: SciPy docs, circmean([0.1, 2pi+0.2, 6pi+0.3]) = 0.2 (docs/methods.md check 6).
  const std::vector<double> x{0.1, 2 * kPi + 0.2, 6 * kPi + 0.3};
  EXPECT_NEAR(circularMean(x, 2 * kPi), 0.2, 1e-12);
}

TEST(Circular, ScipyCircmeanDegrees) {
  // Source: SciPy circmean([20, 30, 330], high=360) = 7.294976657784009 (docs/methods.md check 7).
  const std::vector<double> x{20, 30, 330};
  EXPECT_NEAR(circularMean(x, 360.0), 7.294976657784009, 1e-9);
}

TEST(Circular, ScipyCircstd) {
  // Source: SciPy 1.2 docs, circstd([0, 0.1pi/2, 0.001pi, 0.03pi/2]) = 0.063564063306
  // (docs/methods.md check 8).
  const std::vector<double> x{0, 0.1 * kPi / 2, 0.001 * kPi, 0.03 * kPi / 2};
  EXPECT_NEAR(circularSd(x, 2 * kPi), 0.063564063306, 1e-10);
}

TEST(Circular, CircularVarianceIsOneMinusR) {
  // Source: SciPy 1.9.2 docs (1 - R = 0.6666666666666665) and 1.7.1 docs (-2 ln R =
  // 2.19722457734) for [0, 2pi/3, 5pi/3] (docs/methods.md check 9).
  const std::vector<double> phases{0.0, 1.0 / 3.0, 5.0 / 6.0};  // the angles in cycles
  const CircularStats s = circularStats(phases);
  EXPECT_NEAR(s.r, 1.0 / 3.0, 1e-12);
  EXPECT_NEAR(s.circVar, 0.6666666666666665, 1e-9);
  EXPECT_NEAR(-2.0 * std::log(s.r), 2.19722457734, 1e-9);
}

TEST(Circular, RayleighPingouinExample) {
  // Source: pingouin docs, circ_rayleigh([0.785, 1.570, 3.141, 0.839, 5.934]) -> z = 1.236,
  // p = 0.304844 (Zar formula) (docs/methods.md check 10).
  std::vector<double> phases;
  for (double rad : {0.785, 1.570, 3.141, 0.839, 5.934}) phases.push_back(rad / (2 * kPi));
  const CircularStats s = circularStats(phases);
  EXPECT_NEAR(s.rayleighZ, 1.236, 1e-3);
  EXPECT_NEAR(s.rayleighP, 0.304844, 1e-6);
  // [calc] docs/methods.md §8.2: mean direction 1.012962 rad.
  EXPECT_NEAR(s.mean * 2 * kPi, 1.012962, 1e-6);
}

TEST(Circular, RayleighMatchesMardiaCriticalTable) {
  // Source: Mardia 1972 critical R in Davis Table A.10 + Zar p [calc] (docs/methods.md check 11).
  EXPECT_NEAR(rayleighP(10, 0.540), 0.0503, 1e-3);
  EXPECT_NEAR(rayleighP(10, 0.655), 0.0102, 1e-3);
  EXPECT_NEAR(rayleighP(20, 0.385), 0.0497, 1e-3);
}

TEST(Circular, UniformPhasesHaveUndefinedMean) {
  // Source: docs/methods.md check 12 [calc]: R = 0, mean undefined, angular deviation 81.03 deg.
  const std::vector<double> phases{0, 0.25, 0.5, 0.75};
  const CircularStats s = circularStats(phases);
  EXPECT_FALSE(s.defined);
  EXPECT_TRUE(std::isnan(s.mean));
  EXPECT_EQ(s.r, 0.0);
  EXPECT_NEAR(s.angularDev * 360.0, 81.03, 0.01);
  EXPECT_TRUE(std::isinf(s.circSd));
}

TEST(Circular, ZarTextbookAngles) {
  // From memory: Zar, Biostatistical Analysis, mean-angle example; [calc] docs/methods.md §8.2.
  std::vector<double> phases;
  for (double deg : {45, 55, 81, 96, 110, 117, 132, 154}) phases.push_back(deg / 360.0);
  const CircularStats s = circularStats(phases);
  EXPECT_NEAR(s.r, 0.82522, 1e-5);
  EXPECT_NEAR(s.mean * 360.0, 98.99, 0.01);
  EXPECT_NEAR(s.angularDev * 360.0, 33.88, 0.01);
  EXPECT_NEAR(s.circSd * 360.0, 35.51, 0.01);
  EXPECT_NEAR(s.rayleighZ, 5.4479, 1e-4);
  EXPECT_NEAR(s.rayleighP, 0.00185, 1e-5);
}

TEST(Circular, PhaseLikeData) {
  // Source: docs/methods.md §8.2 [calc]: 0.20, 0.25, 0.30 -> R 0.967371, mean 0.25, s0 0.04099,
  // s 0.04066 cycles.
  const std::vector<double> phases{0.20, 0.25, 0.30};
  const CircularStats s = circularStats(phases);
  EXPECT_NEAR(s.r, 0.967371, 1e-6);
  EXPECT_NEAR(s.mean, 0.25, 1e-12);
  EXPECT_NEAR(s.circSd, 0.04099, 1e-5);
  EXPECT_NEAR(s.angularDev, 0.04066, 1e-5);
}

TEST(Circular, EmptyInputIsUndefinedNotZero) {
  // Common practice, no source: no samples, no statistics.
  const CircularStats s = circularStats(std::vector<double>{});
  EXPECT_EQ(s.n, 0);
  EXPECT_FALSE(s.defined);
  EXPECT_TRUE(std::isnan(s.r));
}

TEST(Circular, CentredFormAndDistance) {
  // Source: docs/methods.md §1.2 centred form phi_c in (-0.5, 0.5] [choice].
  EXPECT_NEAR(centredPhase(0.976), -0.024, 1e-12);
  EXPECT_NEAR(centredPhase(0.5), 0.5, 1e-12);
  EXPECT_NEAR(centredPhase(0.25), 0.25, 1e-12);
  EXPECT_NEAR(circularDistance(0.95, 0.05), 0.1, 1e-12);
  EXPECT_NEAR(wrapPhase(-0.25), 0.75, 1e-12);
}

}  // namespace
}  // namespace stridemark::analysis
