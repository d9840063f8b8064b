#pragma once
// The order in which proposals are reviewed, and stepping through it (issue 18 item 3): by
// frame (then limb), or least confident first. The current proposal is remembered by value,
// so after an accept or reject (it is gone) the next one is the one after where it stood.
#include <cstdint>
#include <optional>
#include <vector>

#include "model/annotation.h"

namespace stridemark::ui {

enum class ReviewOrder { byFrame, leastConfidentFirst };

// True when `a` comes before `b` in `order` (a total order: ties broken by frame, limb, kind).
bool reviewsBefore(const model::ProposedEvent& a, const model::ProposedEvent& b, ReviewOrder order);
std::vector<model::ProposedEvent> inReviewOrder(const model::Proposals& proposals,
                                                ReviewOrder order);

// The proposal after (direction > 0) or before (< 0) `current` in `order`. With no current
// proposal, by frame starts from the playhead (the first at or after it going forwards, the
// last before it going backwards); least confident first starts at either end.
std::optional<model::ProposedEvent> stepProposal(const model::Proposals& proposals,
                                                 ReviewOrder order,
                                                 const std::optional<model::ProposedEvent>& current,
                                                 std::int64_t playhead, int direction);

// 1-based place of `current` in `order`, 0 when it is not among the proposals.
int reviewPosition(const model::Proposals& proposals, ReviewOrder order,
                   const model::ProposedEvent& current);

}  // namespace stridemark::ui
