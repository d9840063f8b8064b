#pragma once
// Internal: stance from a foot's track and the ground's motion under it (docs/methods.md §13).
//
// The foot is in stance while it moves with the ground: |v_foot - v_ground| stays below a
// threshold scaled to this foot's own swing speed (hysteresis: a lower threshold to enter
// stance than to leave it), and phases shorter than a minimum are merged into their
// neighbours. Each boundary is then checked by a second cue, the foot's position relative to
// the ground: touchdown is the first frame within a tolerance of where the foot stands, lift-off
// the first frame outside it. Frames where the foot was not seen are unknown: no event is
// placed inside them or next to them, and they come back as a hidden span.
#include <cstdint>
#include <optional>
#include <vector>

#include "model/annotation.h"

namespace stridemark::vision::detail {

struct Vec2 {
  double x = 0, y = 0;
};

struct FootMotion {
  std::int64_t first = 0;                   // frame of index 0
  std::vector<Vec2> position;               // per frame (pixels)
  std::vector<double> quality;              // per frame, 0-1
  std::vector<bool> visible;                // per frame
  std::vector<std::optional<Vec2>> ground;  // per frame pair t -> t+1; empty optional: unknown
};

struct RuleSettings {
  double fps = 240;  // capture rate
};

struct LimbProposals {
  std::vector<model::ProposedEvent> events;
  std::vector<model::HiddenSpan> hidden;
};

LimbProposals proposeFromMotion(int limb, const FootMotion& motion, const RuleSettings& settings);

}  // namespace stridemark::vision::detail
