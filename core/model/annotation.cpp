#include "model/annotation.h"

#include <algorithm>

namespace stridemark::model {

std::string_view eventWord(EventKind kind) {
  return kind == EventKind::touchdown ? "touchdown" : "liftoff";
}

std::optional<EventKind> parseEventWord(std::string_view word) {
  if (word == "touchdown") return EventKind::touchdown;
  if (word == "liftoff") return EventKind::liftoff;
  return std::nullopt;
}

void Annotation::normalize() {
  std::sort(events.begin(), events.end());
  std::sort(hidden.begin(), hidden.end(), [](const HiddenSpan& a, const HiddenSpan& b) {
    return a.limb != b.limb ? a.limb < b.limb : a.first < b.first;
  });
  std::sort(excluded.begin(), excluded.end(),
            [](const StrideExclusion& a, const StrideExclusion& b) {
              return a.startFrame < b.startFrame;
            });
}

std::vector<Event> Annotation::eventsOf(int limb) const {
  const auto first = std::lower_bound(events.begin(), events.end(), limb,
                                      [](const Event& e, int l) { return e.limb < l; });
  const auto last =
      std::upper_bound(first, events.end(), limb, [](int l, const Event& e) { return l < e.limb; });
  return {first, last};
}

bool Annotation::inStance(int limb, std::int64_t frame) const {
  const Event probe{frame, limb, EventKind::liftoff};
  auto it = std::upper_bound(events.begin(), events.end(), probe);
  if (it == events.begin()) return false;
  --it;
  if (it->limb != limb) return false;
  return it->kind == EventKind::touchdown;
}

}  // namespace stridemark::model
