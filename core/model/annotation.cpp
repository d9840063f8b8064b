#include "model/annotation.h"

#include <algorithm>
#include <tuple>

namespace stridemark::model {

std::string_view eventWord(EventKind kind) {
  return kind == EventKind::touchdown ? "touchdown" : "liftoff";
}

std::optional<EventKind> parseEventWord(std::string_view word) {
  if (word == "touchdown") return EventKind::touchdown;
  if (word == "liftoff") return EventKind::liftoff;
  return std::nullopt;
}

bool isCalendarDate(std::string_view text) {
  if (text.size() != 10 || text[4] != '-' || text[7] != '-') return false;
  int parts[3] = {0, 0, 0};
  const std::size_t starts[3] = {0, 5, 8}, lengths[3] = {4, 2, 2};
  for (int i = 0; i < 3; ++i) {
    for (std::size_t k = starts[i]; k < starts[i] + lengths[i]; ++k) {
      if (text[k] < '0' || text[k] > '9') return false;
      parts[i] = parts[i] * 10 + (text[k] - '0');
    }
  }
  const int year = parts[0], month = parts[1], day = parts[2];
  if (month < 1 || month > 12 || day < 1) return false;
  const bool leap = (year % 4 == 0 && year % 100 != 0) || year % 400 == 0;
  const int days[12] = {31, leap ? 29 : 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31};
  return day <= days[month - 1];
}

void Annotation::normalize() {
  // Total orders (every field breaks ties), so one set of tags has one order whatever order
  // it came in, and a saved file reads back to the same bytes.
  std::sort(events.begin(), events.end());
  std::sort(hidden.begin(), hidden.end(), [](const HiddenSpan& a, const HiddenSpan& b) {
    return std::tie(a.limb, a.first, a.last) < std::tie(b.limb, b.first, b.last);
  });
  std::sort(excluded.begin(), excluded.end(),
            [](const StrideExclusion& a, const StrideExclusion& b) {
              return std::tie(a.startFrame, a.reason) < std::tie(b.startFrame, b.reason);
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

std::filesystem::path resolveVideoPath(const std::filesystem::path& projectPath,
                                       const std::string& linkedPath) {
  const std::filesystem::path linked(linkedPath);
  if (linked.is_absolute()) return linked;
  return projectPath.parent_path() / linked;
}

}  // namespace stridemark::model
