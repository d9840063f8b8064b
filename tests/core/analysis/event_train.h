#pragma once
// Test helper: ideal event trains realising given duty factors and touchdown offsets exactly.
#include <cmath>
#include <cstdint>
#include <vector>

#include "model/annotation.h"

namespace stridemark::testing {

struct LimbPattern {
  double offset = 0;      // touchdown, fraction of the stride after the train's origin
  double dutyFactor = 0;  // stance share of the stride
};

// `strides` + 1 touchdowns per limb (so the reference limb has `strides` complete strides),
// each followed by its lift-off; touchdowns at start + k * strideFrames + offset * strideFrames.
inline model::Annotation idealTrain(const model::LimbSet& limbs,
                                    const std::vector<LimbPattern>& patterns,
                                    std::int64_t strideFrames, int strides,
                                    Rational fps = {1200, 1}, std::int64_t start = 1000) {
  model::Annotation a;
  a.limbs = limbs;
  a.captureRate = fps;
  a.referenceLimb = limbs.defaultReference();
  for (int limb = 0; limb < limbs.size(); ++limb) {
    const LimbPattern& p = patterns.at(static_cast<std::size_t>(limb));
    const auto offset = static_cast<std::int64_t>(std::llround(p.offset * strideFrames));
    const auto stance = static_cast<std::int64_t>(std::llround(p.dutyFactor * strideFrames));
    for (int k = 0; k <= strides; ++k) {
      const std::int64_t td = start + k * strideFrames + offset;
      a.events.push_back({td, limb, model::EventKind::touchdown});
      a.events.push_back({td + stance, limb, model::EventKind::liftoff});
    }
  }
  a.normalize();
  return a;
}

// Quadruped train in the usual Hildebrand layout: LH at 0, RH at 0.5, LF at the limb phase,
// RF half a stride later; all limbs at one duty factor. Limb order LF, RF, LH, RH.
inline model::Annotation symmetricalQuadruped(double dutyFactor, double limbPhase,
                                              std::int64_t strideFrames = 1200, int strides = 6) {
  return idealTrain(model::LimbSet::quadruped(),
                    {{limbPhase, dutyFactor},
                     {limbPhase + 0.5, dutyFactor},
                     {0.0, dutyFactor},
                     {0.5, dutyFactor}},
                    strideFrames, strides);
}

inline int limbIndex(const model::LimbSet& limbs, const char* label) {
  return *limbs.indexOf(label);
}

}  // namespace stridemark::testing
