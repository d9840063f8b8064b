#pragma once
// Per-limb cycles (touchdown -> next touchdown) and the checks on a limb's tag sequence
// (docs/methods.md §1.1, §1.3). Problems never abort: each is reported with frame, limb and
// what to do, and the frames it touches are listed so strides over them can be left out.
#include <cstdint>
#include <vector>

#include "analysis/report.h"
#include "model/annotation.h"

namespace stridemark::analysis {

// Frames [first, end): a limb in one known state (stance or swing).
struct StateInterval {
  std::int64_t first = 0;
  std::int64_t end = 0;
  bool stance = false;
};

// Frames [first, last] (inclusive) that an annotation problem makes untrustworthy.
struct FlaggedSpan {
  std::int64_t first = 0;
  std::int64_t last = 0;
};

// Tags beyond this frame (far past any real clip) are reported and ignored, so that frame
// differences can never overflow.
inline constexpr std::int64_t kLastTagFrame = (std::int64_t{1} << 61) - 1;

struct LimbTrack {
  std::vector<std::int64_t> touchdowns;  // every usable touchdown, ascending
  std::vector<LimbCycle> cycles;         // complete cycles without problems, ascending
  std::vector<StateInterval> known;      // where the limb's state is known, ascending, disjoint
  std::vector<FlaggedSpan> flagged;      // ascending by first
};

struct CycleScan {
  std::vector<LimbTrack> tracks;  // indexed by limb
  std::vector<Problem> problems;  // ordered by frame, then limb
};

// Reads the tags of every limb (the annotation need not be normalized). A first lift-off or a
// last touchdown (clip starting or ending mid-stance) is normal. Hidden spans make the state
// unknown: cycles across them keep their stride time but lose stance, swing and duty factor.
CycleScan scanCycles(const model::Annotation& annotation);

// The cycle of `track` that starts exactly at `touchdown`, if it is complete and valid.
const LimbCycle* cycleStartingAt(const LimbTrack& track, std::int64_t touchdown);

}  // namespace stridemark::analysis
