#pragma once
// Support patterns (METHODS.md §5): which limbs are in stance, frame by frame, summarised as
// the share of time with k limbs down and per named combination. Time where any limb's state is
// unknown (before its first tag, after its last, hidden, or flagged) is not scored.
#include <cstdint>
#include <map>
#include <string>
#include <unordered_map>
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
  bool complete = false;  // every frame of the window had a known state
  bool aerial = false;    // some known frame had no limb in stance
};

class SupportTimeline {
 public:
  // Combination names are kept for sets of at most 64 limbs.
  SupportTimeline(const model::LimbSet& limbs, const std::vector<LimbTrack>& tracks);

  // Shares over frames [first, end).
  SupportShares window(std::int64_t first, std::int64_t end) const;
  // Shares over every frame where all limbs' states are known.
  SupportShares overall() const;

 private:
  struct Segment {
    std::int64_t first = 0;
    std::int64_t end = 0;
    std::uint64_t mask = 0;
    int count = 0;
    bool known = false;
  };
  void build(const std::vector<LimbTrack>& tracks);
  SupportShares summarise(std::vector<Segment>::const_iterator begin, std::int64_t first,
                          std::int64_t end) const;
  const std::string& nameOf(std::uint64_t mask) const;

  model::LimbSet limbs_;
  bool named_ = false;
  std::vector<Segment> segments_;
  mutable std::unordered_map<std::uint64_t, std::string> names_;
  mutable std::vector<std::pair<std::uint64_t, std::int64_t>> scratch_;
};

}  // namespace stridemark::analysis
