#include "analysis/speed.h"

#include <cmath>

namespace stridemark::analysis {

double froudeNumber(double speedMs, double legLengthM) {
  return speedMs * speedMs / (kGravity * legLengthM);
}

double dimensionlessSpeed(double speedMs, double legLengthM) {
  return speedMs / std::sqrt(kGravity * legLengthM);
}

double speedAtFroude(double froude, double legLengthM) {
  return std::sqrt(froude * kGravity * legLengthM);
}

double strideLength(double speedMs, double strideS) {
  return speedMs * strideS;
}

double alexanderSpeed(double strideLengthM, double hipHeightM) {
  return 0.25 * std::sqrt(kGravity) * std::pow(strideLengthM, 1.67) * std::pow(hipHeightM, -1.17);
}

double relativeStrideAlexander1976(double froude) {
  return 2.3 * std::pow(froude, 0.3);
}

double relativeStrideAlexander1991(double froude) {
  const double l = std::log(froude);
  return std::exp(0.618 + 0.308 * l + 0.035 * l * l);
}

double dutyFactorQuantisationBound(double fps, double strideS, double dutyFactor) {
  return (1.0 + dutyFactor) / (fps * strideS);
}

AdvancedPlacement advancedPlacement(std::int64_t hindTouchdown, std::int64_t foreTouchdown,
                                    std::int64_t strideFrames, Rational fps) {
  const std::int64_t frames = foreTouchdown - hindTouchdown;
  return {framesToSeconds(frames, fps) * 1000.0,
          static_cast<double>(frames) / static_cast<double>(strideFrames) * 100.0};
}

}  // namespace stridemark::analysis
