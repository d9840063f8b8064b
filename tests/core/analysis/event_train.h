#pragma once
// Test helper: ideal event trains realising given duty factors and touchdown offsets exactly.
#include <cmath>
#include <cstdint>
#include <random>
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

// A long, untidy trial for checks that must hold on any annotation: seeded jitter on every
// stride and tag, the limbs' offsets drifting so the gait changes now and then (several bouts),
// some lift-offs missing, and now and then a second touchdown inside a stance (a problem that
// takes strides out). Limbs alternate offsets 0 and 0.5 (plus drift) along the set.
inline model::Annotation variedTrain(const model::LimbSet& limbs, int strides, std::uint32_t seed) {
  std::mt19937 random(seed);
  std::uniform_int_distribution<int> strideJitter(-4, 4), tagJitter(-2, 2), chance(0, 999);
  model::Annotation a;
  a.limbs = limbs;
  a.captureRate = Rational{250, 1};
  a.referenceLimb = limbs.defaultReference();
  std::int64_t start = 50;
  double drift = 0;
  for (int k = 0; k < strides; ++k) {
    const int length = 100 + strideJitter(random);
    if (k % 700 == 0) drift = 0.05 * (chance(random) % 5);  // a new gait every few hundred
    for (int limb = 0; limb < limbs.size(); ++limb) {
      const double offset = (limb % 2) * 0.5 + (limb >= 2 ? drift : 0.0);
      const std::int64_t touchdown =
          start + static_cast<std::int64_t>(offset * length) + tagJitter(random);
      a.events.push_back({touchdown, limb, model::EventKind::touchdown});
      if (chance(random) < 3) continue;  // lift-off not tagged
      const std::int64_t liftoff = touchdown + 45 + tagJitter(random);
      a.events.push_back({liftoff, limb, model::EventKind::liftoff});
      if (chance(random) < 2)  // a second touchdown inside the stance
        a.events.push_back({touchdown + 20, limb, model::EventKind::touchdown});
    }
    start += length;
  }
  a.normalize();
  return a;
}

inline int limbIndex(const model::LimbSet& limbs, const char* label) {
  return *limbs.indexOf(label);
}

}  // namespace stridemark::testing
