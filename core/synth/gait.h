#pragma once
// Gait patterns for the generator: per-limb duty factor and touchdown phase (relative to the
// limb set's reference limb, in cycles), a stride frequency and how far each foot travels in
// stance. Presets follow docs/methods.md (§2.5, §3.1, §3.3, §4.1, §4.2).
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "model/limb_set.h"

namespace stridemark::synth {

struct GaitPattern {
  std::string name;                // preset name or "custom"
  std::string expectedLabel;       // what scoring should call it ("" for custom patterns)
  std::vector<double> dutyFactor;  // per limb, (0, 1)
  std::vector<double> phase;       // per limb touchdown offset in [0, 1); reference limb 0
  double strideHz = 1.0;           // strides per second
  double stanceReach = 0.8;        // foot travel during stance, in leg lengths
};

// Preset names available for a limb set (for help texts and errors).
std::vector<std::string> presetNames(const model::LimbSet& limbs);

// A named preset ("walk", "trot", "transverse-gallop", "tripod", "wave", ...). Throws
// stridemark::Error(format) listing the names that fit the limb set.
GaitPattern presetGait(const model::LimbSet& limbs, std::string_view name);

// One schedule segment: a pattern held for `seconds`.
struct GaitSegment {
  GaitPattern pattern;
  double seconds = 3.0;
};

// Parses "NAME[:SECONDS][@HZ]" where NAME is a preset or an explicit pattern
// "custom,df=0.6,LF=0.25,RH=0.5,RF=0.75" (limbs not named keep phase 0; df=X sets every limb,
// df.LF=X one limb). Throws stridemark::Error(format) saying what is wrong and the accepted form.
GaitSegment parseGaitSegment(const model::LimbSet& limbs, std::string_view text);

// Checks ranges (duty factor, phase, frequency, sizes). Throws stridemark::Error(format).
void validatePattern(const model::LimbSet& limbs, const GaitPattern& pattern);

}  // namespace stridemark::synth
