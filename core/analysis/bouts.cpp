#include "analysis/bouts.h"

namespace stridemark::analysis {

std::vector<Bout> findBouts(const std::vector<StrideRecord>& strides) {
  std::vector<Bout> bouts;
  for (std::size_t i = 0; i < strides.size(); ++i) {
    const StrideRecord& s = strides[i];
    const int index = static_cast<int>(i);
    const bool continues =
        !bouts.empty() && bouts.back().gait == s.gait && bouts.back().endFrame == s.startFrame;
    if (continues) {
      bouts.back().lastStride = index;
      bouts.back().endFrame = s.endFrame;
    } else {
      bouts.push_back({s.gait, index, index, s.startFrame, s.endFrame});
    }
  }
  return bouts;
}

std::vector<Transition> findTransitions(const std::vector<Bout>& bouts) {
  std::vector<Transition> out;
  for (std::size_t i = 1; i < bouts.size(); ++i) {
    const Bout& before = bouts[i - 1];
    const Bout& after = bouts[i];
    if (before.endFrame != after.startFrame) continue;
    out.push_back({before.gait, after.gait, after.startFrame, after.firstStride});
  }
  return out;
}

}  // namespace stridemark::analysis
