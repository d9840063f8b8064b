#include "analysis/symmetry.h"

#include <algorithm>
#include <cmath>
#include <numbers>

namespace stridemark::analysis {

double symmetryIndex(double right, double left) {
  return (right - left) / (0.5 * (right + left)) * 100.0;
}

double symmetryRatio(double right, double left) {
  return right / left;
}

double minBasedAsymmetryIndex(double left, double right) {
  return std::abs(left - right) / std::min(left, right) * 100.0;
}

double symmetryAngle(double left, double right) {
  const double degrees = std::atan(left / right) * 180.0 / std::numbers::pi;
  return (45.0 - degrees) / 90.0 * 100.0;
}

std::vector<LimbPair> leftRightPairs(const model::LimbSet& limbs) {
  std::vector<LimbPair> out;
  for (int segment = 0; segment < limbs.pairs(); ++segment) {
    const auto left = limbs.at(model::Side::left, segment);
    const auto right = limbs.at(model::Side::right, segment);
    if (!left || !right) continue;
    std::string name;
    switch (limbs.kind()) {
      case model::LimbSetKind::quadruped:
        name = segment == 0 ? "fore" : "hind";
        break;
      case model::LimbSetKind::biped:
        name = "pair";
        break;
      default:
        name = "segment" + std::to_string(segment + 1);
    }
    out.push_back({std::move(name), *left, *right});
  }
  return out;
}

}  // namespace stridemark::analysis
