#pragma once
// Per-limb cycles (touchdown -> next touchdown) and the checks on a limb's tag sequence
// (METHODS.md §1.1, §1.3). Problems never abort: each is reported with frame, limb and what to
// do, and the frames it touches are listed so strides over them can be left out.
#include <cstdint>
#include <span>
#include <vector>

#include "analysis/report.h"
#include "common/huge_pages.h"
#include "model/annotation.h"

namespace stridemark::analysis {

// Frames [first, end): a limb in one known state (stance or swing).
// 16 bytes instead of 24: a long annotation holds about one per event.
struct StateInterval {
  std::int64_t first = 0;
  std::int64_t end : 63 = 0;
  bool stance : 1 = false;
};
static_assert(sizeof(StateInterval) == 16);

// Frames [first, last] (inclusive) that an annotation problem makes untrustworthy.
struct FlaggedSpan {
  std::int64_t first = 0;
  std::int64_t last = 0;
};

struct LimbTrack {
  HugeVector<std::int64_t> touchdowns;  // every usable touchdown, ascending
  std::span<const LimbCycle> cycles;    // complete cycles without problems, ascending
  HugeVector<StateInterval> known;      // where the limb's state is known, ascending, disjoint
  std::vector<FlaggedSpan> flagged;     // ascending by first
};

struct CycleScan {
  std::vector<LimbTrack> tracks;  // indexed by limb
  // Every limb's cycles, limb after limb (the tracks' cycles point into it): built in place,
  // it becomes Report::cycles without a copy.
  std::vector<LimbCycle> cycles;
  std::vector<Problem> problems;  // ordered by frame, then limb
};

// Reads the tags of every limb (the annotation need not be normalized). A first lift-off or a
// last touchdown (clip starting or ending mid-stance) is normal. Hidden spans make the state
// unknown: cycles across them keep their stride time but lose stance, swing and duty factor.
CycleScan scanCycles(const model::Annotation& annotation);
// Same, for a caller done with the events: `events` (moved out of the annotation, whose other
// members `rest` still holds) is freed as soon as it is read, so a long trial's cycles reuse its
// memory instead of fresh pages.
CycleScan scanCycles(const model::Annotation& rest, std::vector<model::Event>&& events);

// The cycle of `track` that starts exactly at `touchdown`, if it is complete and valid.
const LimbCycle* cycleStartingAt(const LimbTrack& track, std::int64_t touchdown);

}  // namespace stridemark::analysis
