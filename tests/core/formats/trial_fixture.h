#pragma once
// A hand-computable quadruped trial for the formats tests.
// Source: docs/methods.md suggested checks 1 and 2 (definitions §1.1, Hildebrand phase per
// Usherwood & Self Davies 2017): LH TD 100, LO 160, TD 225 at 250 fps -> stride 0.500 s,
// stance 0.240 s, duty factor 0.480; LF TD at 131 -> limb phase 0.248.
// Every limb repeats a 125-frame stride with a 60-frame stance; LF, RH, RF touch down
// 31, 62 and 93 frames after LH (a lateral-sequence pattern).
#include "model/annotation.h"

namespace stridemark::testing {

inline model::Annotation checkOneTrial(int strides = 3) {
  model::Annotation annotation;
  annotation.limbs = model::LimbSet::quadruped();
  annotation.captureRate = Rational{250, 1};
  annotation.referenceLimb = 2;           // LH
  const int offset[4] = {31, 93, 0, 62};  // LF, RF, LH, RH
  for (int limb = 0; limb < 4; ++limb) {
    for (int k = 0; k <= strides; ++k) {
      const std::int64_t touchdown = 100 + offset[limb] + 125 * k;
      annotation.events.push_back({touchdown, limb, model::EventKind::touchdown});
      if (k < strides)
        annotation.events.push_back({touchdown + 60, limb, model::EventKind::liftoff});
    }
  }
  annotation.normalize();
  return annotation;
}

}  // namespace stridemark::testing
