#pragma once
// Support patterns (docs/methods.md §5): which limbs are in stance, frame by frame, summarised as
// the share of time with k limbs down and per named combination. Time where any limb's state is
// unknown (before its first tag, after its last, hidden, or flagged) is not scored.
//
// The timeline is swept, never stored: memory stays O(limbs + one window) however long the
// annotation is.
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

// Forward-only sweep over the limbs' known stance/swing intervals (k-way merge with a linear
// minimum over the limbs' next changes: limb sets are small, and a heap cost more). `tracks` must
// outlive the sweep. Not thread-safe.
class SupportTimeline {
 public:
  SupportTimeline(const model::LimbSet& limbs, const std::vector<LimbTrack>& tracks);

  // Shares over frames [first, end). Windows are cheapest in ascending order of `first`; an
  // earlier window restarts the sweep.
  // Without `combinations` only byCount, complete and aerial are filled (cheaper).
  SupportShares window(std::int64_t first, std::int64_t end, bool combinations = true);
  // Only whether [first, end) was wholly known and had a suspension: what window() says in
  // `complete` and `aerial`, without building the shares (one call per stride of a long trial).
  struct WindowFlags {
    bool complete = false;
    bool aerial = false;
  };
  WindowFlags flags(std::int64_t first, std::int64_t end);

  // Shares over every frame where all limbs' states are known. Windows already swept in order
  // are not swept again: every produced segment is also counted for this total.
  SupportShares overall();

 private:
  struct Segment {
    std::int64_t first = 0;
    std::int64_t end = 0;
    std::uint64_t mask = 0;
    int count = 0;
    bool known = false;
  };
  struct Cursor {
    KnownStates::Reader known;
    int state = 0;  // 0 unknown, 1 swing, 2 stance
  };
  static constexpr std::int64_t kNoChange = INT64_MAX;

  void restart();
  void advanceTo(std::int64_t first, std::int64_t end);  // buffer_ covers the window
  bool produce();  // appends the next segment to buffer_; false at the end
  // Running shares of one range: frames per count, per combination (in order of appearance).
  struct Tally {
    SupportShares shares;
    std::int64_t covered = 0;
    std::vector<std::pair<std::uint64_t, std::int64_t>> byMask;
  };
  void resetTally(Tally& tally) const;
  void accumulate(const Segment& s, std::int64_t first, std::int64_t end, Tally& tally) const;
  SupportShares finish(Tally& tally, bool combinations = true);
  const std::string& nameOf(std::uint64_t mask);

  model::LimbSet limbs_;
  const std::vector<LimbTrack>& tracks_;
  bool named_ = false;
  // Sweep state.
  std::vector<std::int64_t> nextChange_;  // per limb: frame of its next change, or kNoChange
  std::vector<Cursor> cursors_;
  int unknown_ = 0, stance_ = 0;
  std::uint64_t mask_ = 0;
  std::int64_t segmentStart_ = 0;
  bool started_ = false;
  std::int64_t producedTo_ = 0;  // end of the last segment produced
  std::vector<Segment> buffer_;  // produced segments not yet behind every window
  std::unordered_map<std::uint64_t, std::string> names_;
  Tally window_;   // the current window
  Tally overall_;  // every segment produced since the sweep (re)started at the beginning
};

}  // namespace stridemark::analysis
