#include "ui/session/proposal_review.h"

#include <algorithm>
#include <tuple>

namespace stridemark::ui {

namespace {

auto frameKey(const model::ProposedEvent& p) {
  return std::make_tuple(p.event.frame, p.event.limb, static_cast<int>(p.event.kind));
}

}  // namespace

bool reviewsBefore(const model::ProposedEvent& a, const model::ProposedEvent& b,
                   ReviewOrder order) {
  if (order == ReviewOrder::leastConfidentFirst && a.confidence != b.confidence)
    return a.confidence < b.confidence;
  return frameKey(a) < frameKey(b);
}

std::vector<model::ProposedEvent> inReviewOrder(const model::Proposals& proposals,
                                                ReviewOrder order) {
  auto list = proposals.events;
  std::sort(list.begin(), list.end(),
            [order](const auto& a, const auto& b) { return reviewsBefore(a, b, order); });
  return list;
}

std::optional<model::ProposedEvent> stepProposal(const model::Proposals& proposals,
                                                 ReviewOrder order,
                                                 const std::optional<model::ProposedEvent>& current,
                                                 std::int64_t playhead, int direction) {
  const auto list = inReviewOrder(proposals, order);
  if (list.empty()) return std::nullopt;
  if (!current) {
    if (order == ReviewOrder::leastConfidentFirst)
      return direction > 0 ? list.front() : list.back();
    if (direction > 0) {
      for (const auto& p : list)
        if (p.event.frame >= playhead) return p;
    } else {
      for (auto it = list.rbegin(); it != list.rend(); ++it)
        if (it->event.frame < playhead) return *it;
    }
    return std::nullopt;
  }
  const auto before = [order](const auto& a, const auto& b) { return reviewsBefore(a, b, order); };
  if (direction > 0) {
    const auto it = std::upper_bound(list.begin(), list.end(), *current, before);
    if (it != list.end()) return *it;
  } else {
    const auto it = std::lower_bound(list.begin(), list.end(), *current, before);
    if (it != list.begin()) return *std::prev(it);
  }
  return std::nullopt;
}

int reviewPosition(const model::Proposals& proposals, ReviewOrder order,
                   const model::ProposedEvent& current) {
  const auto list = inReviewOrder(proposals, order);
  const auto it = std::find(list.begin(), list.end(), current);
  return it == list.end() ? 0 : static_cast<int>(it - list.begin()) + 1;
}

}  // namespace stridemark::ui
