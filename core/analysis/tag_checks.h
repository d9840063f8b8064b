#pragma once
// Checks on a limb's tags as a whole, beyond one pair of tags (docs/methods.md §1.5): limbs
// never tagged, cycles much longer or shorter than their neighbours (a missed touchdown, an
// extra tag), and stance and swing swapped from some frame on (one key press too many).
// Each finding is a Problem with frame, limb, what is wrong and what to do.
#include "analysis/cycles.h"
#include "model/annotation.h"

namespace stridemark::analysis {

struct TagCheckSettings {
  double longCycle = 1.6;   // x the median of its neighbours: a touchdown may be missing
  double shortCycle = 0.6;  // x the median: an extra tag or a stumble
  int neighbours = 3;       // on each side
};

// Adds the problems to `scan`; suspicious cycles leave their track (so no statistic uses
// them), and frames from a swap on are flagged (strides over them are left out).
void checkTracks(const model::Annotation& annotation, int referenceLimb, CycleScan& scan,
                 const TagCheckSettings& settings = {});

// Where stance and swing look swapped from some frame on, for one limb.
struct SwappedTags {
  std::int64_t fromFrame = 0;
  double dutyBefore = 0;
  double dutyAfter = 0;
};
std::optional<SwappedTags> findSwappedTags(const std::vector<LimbTrack>& tracks, int limb);

}  // namespace stridemark::analysis
