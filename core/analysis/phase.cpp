#include "analysis/phase.h"

#include <algorithm>

namespace stridemark::analysis {

double relativePhase(std::int64_t touchdown, std::int64_t start, std::int64_t end) {
  return static_cast<double>(touchdown - start) / static_cast<double>(end - start);
}

WindowPhase phaseInWindow(std::span<const std::int64_t> touchdowns, std::int64_t start,
                          std::int64_t end) {
  WindowPhase out;
  if (end <= start) return out;
  const auto first = std::lower_bound(touchdowns.begin(), touchdowns.end(), start);
  const auto last = std::lower_bound(first, touchdowns.end(), end);
  out.touchdowns = static_cast<int>(last - first);
  if (out.touchdowns > 0) out.first = *first;
  if (out.touchdowns == 1) out.phase = relativePhase(*first, start, end);
  return out;
}

std::optional<std::int64_t> nearestTouchdown(std::span<const std::int64_t> touchdowns,
                                             std::int64_t frame) {
  if (touchdowns.empty()) return std::nullopt;
  const auto after = std::lower_bound(touchdowns.begin(), touchdowns.end(), frame);
  if (after == touchdowns.begin()) return *after;
  const auto before = std::prev(after);
  if (after == touchdowns.end()) return *before;
  return (frame - *before) <= (*after - frame) ? *before : *after;
}

}  // namespace stridemark::analysis
