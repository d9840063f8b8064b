#pragma once
// Left/right symmetry measures (docs/methods.md §7.1) and the left/right pairs of each limb set.
#include <string>
#include <vector>

#include "model/limb_set.h"

namespace stridemark::analysis {

// Robinson et al. 1987: (R - L) / (0.5 (R + L)) * 100; positive when the right value is larger.
double symmetryIndex(double right, double left);
// R / L.
double symmetryRatio(double right, double left);
// |L - R| / min(L, R) * 100.
double minBasedAsymmetryIndex(double left, double right);
// Zifchock et al. 2008: (45 deg - atan(L / R)) / 90 deg * 100.
double symmetryAngle(double left, double right);

struct LimbPair {
  std::string name;  // "fore", "hind" (quadruped); "pair" (biped); "segment1".. (others)
  int left = 0;
  int right = 0;
};
std::vector<LimbPair> leftRightPairs(const model::LimbSet& limbs);

}  // namespace stridemark::analysis
