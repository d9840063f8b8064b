#pragma once
// Support patterns (docs/methods.md §5): which limbs are in stance, frame by frame, summarised
// as the share of time with k limbs down and per named combination. Time where any limb's
// state is unknown (before its first tag, after its last, hidden, or flagged) is not scored.
#include <cstdint>
#include <map>
#include <string>
#include <vector>

#include "analysis/cycles.h"
#include "model/limb_set.h"

namespace stridemark::analysis {

// Name of a set of stance limbs (bit i = limb i). Quadrupeds: "suspension", "LF", "diagonal
// LH+RF", "lateral RH+RF", "fore pair", "hind pair", "tripod LF+RF+LH", "all four". Other sets:
// the sorted labels joined with "+" ("suspension" when empty).
std::string combinationName(const model::LimbSet& limbs, std::uint64_t mask);

struct SupportShares {
  std::vector<double> byCount;                  // index k = share with k limbs in stance
  std::map<std::string, double> byCombination;  // empty for sets of more than 64 limbs
  std::int64_t knownFrames = 0;
  bool complete = false;  // every frame of the range had a known state
  bool aerial = false;    // some known frame had no limb in stance
};

// Frames [first, end) in which no limb changes state.
struct SupportSegment {
  std::int64_t first = 0;
  std::int64_t end = 0;
  std::uint64_t mask = 0;  // limbs in stance (bit i = limb i; only sets of up to 64 limbs)
  int count = 0;           // limbs in stance
  bool known = false;      // every limb's state is known
};

// The whole trial as segments, ascending, from the first change of any limb's state to the last.
class SupportTimeline {
 public:
  SupportTimeline(const model::LimbSet& limbs, const std::vector<LimbTrack>& tracks);

  // Shares over frames [first, end).
  SupportShares window(std::int64_t first, std::int64_t end) const;
  // Shares over every frame where all limbs' states are known.
  SupportShares overall() const;

 private:
  SupportShares shares(std::vector<SupportSegment>::const_iterator from,
                       std::vector<SupportSegment>::const_iterator to, std::int64_t first,
                       std::int64_t end) const;

  model::LimbSet limbs_;
  std::vector<SupportSegment> segments_;
};

}  // namespace stridemark::analysis
