#pragma once
// A hand-computable quadruped trial for the formats tests.
// Source: docs/methods.md suggested checks 1 and 2 (definitions §1.1, Hildebrand phase per
// Usherwood & Self Davies 2017): LH TD 100, LO 160, TD 225 at 250 fps -> stride 0.500 s,
// stance 0.240 s, duty factor 0.480; LF TD at 131 -> limb phase 0.248.
// Every limb repeats a 125-frame stride with a 60-frame stance; LF, RH, RF touch down
// 31, 62 and 93 frames after LH (a lateral-sequence pattern).
#include <cmath>
#include <utility>
#include <vector>

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

// A quadruped that walks, then trots, at 250 fps (invented; our own numbers):
// - walk: 4 strides of 100 frames, duty factor 0.65, LH 0, LF 25, RH 50, RF 75 frames;
// - trot: 5 strides of 80 frames from frame 400, duty factor 0.40, LH 0, RF 2, RH 40, LF 43
//   frames: RF lands 2 frames (8 ms) after LH and LF 3 frames (12 ms) after RH, so the DAP of
//   the LH-RF diagonal is +8 ms (2.5 %) and of RH-LF +12 ms (3.75 %), hind first.
// Each lift-off is at the segment's duty factor of the limb's own cycle. RF's walk-to-trot
// cycle (375-402) is much shorter than its neighbours, so the reference stride 300-400 is left
// out: it belongs to no bout.
inline model::Annotation walkThenTrotTrial() {
  model::Annotation annotation;
  annotation.limbs = model::LimbSet::quadruped();
  annotation.captureRate = Rational{250, 1};
  annotation.referenceLimb = 2;               // LH
  const int walkOffset[4] = {25, 75, 0, 50};  // LF, RF, LH, RH
  const int trotOffset[4] = {43, 2, 0, 40};
  for (int limb = 0; limb < 4; ++limb) {
    std::vector<std::pair<std::int64_t, double>> touchdowns;  // frame, duty factor
    for (int k = 0; k < 4; ++k) touchdowns.push_back({100 * k + walkOffset[limb], 0.65});
    for (int k = 0; k <= 5; ++k) touchdowns.push_back({400 + 80 * k + trotOffset[limb], 0.40});
    for (std::size_t i = 0; i < touchdowns.size(); ++i) {
      const auto [frame, duty] = touchdowns[i];
      annotation.events.push_back({frame, limb, model::EventKind::touchdown});
      if (i + 1 == touchdowns.size()) break;
      const auto cycle = static_cast<double>(touchdowns[i + 1].first - frame);
      annotation.events.push_back(
          {frame + std::llround(duty * cycle), limb, model::EventKind::liftoff});
    }
  }
  annotation.normalize();
  return annotation;
}

}  // namespace stridemark::testing
