#pragma once
// Speed-normalised measures (docs/methods.md §6) and timing helpers (§1.3, §7.3).
#include <cstdint>

#include "common/rational.h"

namespace stridemark::analysis {

inline constexpr double kGravity = 9.81;  // m/s^2, team decision

// Froude number v^2 / (g h).
double froudeNumber(double speedMs, double legLengthM);
// Dimensionless speed v / sqrt(g h) = sqrt(Fr).
double dimensionlessSpeed(double speedMs, double legLengthM);
// Speed at which a leg of length h reaches the Froude number fr: sqrt(fr g h).
double speedAtFroude(double froude, double legLengthM);
// Stride length = v * stride time.
double strideLength(double speedMs, double strideS);
// Alexander 1976: u = 0.25 g^0.5 lambda^1.67 h^-1.17 (stride length lambda, hip height h).
double alexanderSpeed(double strideLengthM, double hipHeightM);
// Relative stride length lambda / h predicted from Fr: Alexander 1976 form 2.3 Fr^0.3.
double relativeStrideAlexander1976(double froude);
// Alexander 1991 fit: ln(s/l) = 0.618 + 0.308 ln Fr + 0.035 (ln Fr)^2.
double relativeStrideAlexander1991(double froude);

// Largest duty-factor error from frame quantisation: (1 + beta) / (fps * T).
double dutyFactorQuantisationBound(double fps, double strideS, double dutyFactor);

struct AdvancedPlacement {
  double ms = 0;       // fore touchdown - hind touchdown (positive = hind first)
  double percent = 0;  // of the stride
};
// Diagonal advanced placement (docs/methods.md §7.3) from frames at the capture rate.
AdvancedPlacement advancedPlacement(std::int64_t hindTouchdown, std::int64_t foreTouchdown,
                                    std::int64_t strideFrames, Rational fps);

}  // namespace stridemark::analysis
