#include "analysis/bouts.h"

namespace stridemark::analysis {

std::vector<Bout> findBouts(const std::vector<StrideRecord>& strides) {
  BoutFinder finder;
  for (std::size_t i = 0; i < strides.size(); ++i) finder.add(strides[i], static_cast<int>(i));
  return finder.take();
}

void BoutFinder::add(const StrideRecord& s, int index) {
  const bool continues =
      !bouts_.empty() && bouts_.back().gait == s.gait && bouts_.back().endFrame == s.startFrame;
  if (continues) {
    bouts_.back().lastStride = index;
    bouts_.back().endFrame = s.endFrame;
  } else {
    bouts_.push_back({s.gait, index, index, s.startFrame, s.endFrame});
  }
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
