#pragma once
// Relative phase of a limb to a reference stride (docs/methods.md §1.2): the first touchdown of the
// limb in [start, end) as a fraction of the stride. Null when the window holds no touchdown;
// null and flagged when it holds more than one (stride mismatch, stumble).
#include <cstdint>
#include <optional>
#include <span>

namespace stridemark::analysis {

struct WindowPhase {
  int touchdowns = 0;                 // touchdowns of the limb inside the window
  std::optional<std::int64_t> first;  // frame of the first of them
  std::optional<double> phase;        // set only when exactly one
  bool ambiguous() const { return touchdowns > 1; }
};

// (touchdown - start) / (end - start); requires end > start.
double relativePhase(std::int64_t touchdown, std::int64_t start, std::int64_t end);

// `touchdowns` ascending. O(log n).
WindowPhase phaseInWindow(std::span<const std::int64_t> touchdowns, std::int64_t start,
                          std::int64_t end);

// The touchdown nearest to `frame` (ties: the earlier), if any. O(log n).
std::optional<std::int64_t> nearestTouchdown(std::span<const std::int64_t> touchdowns,
                                             std::int64_t frame);

}  // namespace stridemark::analysis
