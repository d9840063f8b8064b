#pragma once
// Per-limb cycles (touchdown -> next touchdown) and the checks on a limb's tag sequence
// (docs/methods.md §1.1, §1.3). Problems never abort: each is reported with frame, limb and what to
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

// One tag of one limb. 8 bytes instead of 16: a long annotation holds one per event. Frames
// past kLastTagFrame (beyond any real clip) are reported and ignored rather than cut to 62 bits.
inline constexpr std::int64_t kLastTagFrame = (std::int64_t{1} << 61) - 1;
struct Tag {
  Tag() = default;
  Tag(std::int64_t f, model::EventKind k) : frame(f), kind(k) {}
  std::int64_t frame : 62 = 0;
  model::EventKind kind : 2 = model::EventKind::touchdown;  // 2 bits: the enum type is signed
};
static_assert(sizeof(Tag) == 8);

// What a pair of consecutive tags says about the frames between them.
enum class PairStatus : std::uint8_t {
  ok,        // a touchdown then a lift-off, or the reverse, on different frames
  occluded,  // like tags around a hidden span, which holds the missing one
  bad,       // an annotation problem: the state between them is unknown
};

// Where one limb's state is known, as ascending, disjoint intervals: from each checked tag to
// the next, less hidden spans and problems. Read from the tags themselves rather than stored:
// intervals would take 16 more bytes per tag of a long annotation.
class KnownStates {
 public:
  KnownStates() = default;
  // `tags` ascending and checked, `status` of each consecutive pair, `hidden` merged spans.
  KnownStates(HugeVector<Tag> tags, HugeVector<PairStatus> status,
              std::vector<StateInterval> hidden);

  // One interval as the reader gives it: plain fields, read once per change of a support sweep.
  struct Interval {
    std::int64_t first = 0;
    std::int64_t end = 0;
    bool stance = false;
  };

  // Reads the intervals forwards, one at a time.
  class Reader {
   public:
    explicit Reader(const KnownStates& states);
    bool done() const { return done_; }
    const Interval& current() const { return current_; }
    void next();

   private:
    void fill();
    void take(const StateInterval& piece) { current_ = {piece.first, piece.end, piece.stance}; }
    const KnownStates* states_;
    Interval current_;
    bool done_ = false;
    std::size_t pair_ = 0;               // next pair of tags to read
    std::vector<StateInterval> pieces_;  // the pair last read, when hidden spans cut it up
    std::size_t piece_ = 0;
  };

 private:
  HugeVector<Tag> tags_;
  HugeVector<PairStatus> status_;
  std::vector<StateInterval> hidden_;
};

// Frames [first, last] (inclusive) that an annotation problem makes untrustworthy.
struct FlaggedSpan {
  std::int64_t first = 0;
  std::int64_t last = 0;
};

struct LimbTrack {
  // Every usable touchdown, ascending. A plain vector on purpose: ~1 MB per limb of 10^6
  // events fits in the memory the events just freed, where whole huge pages (2 MiB each) were
  // fresh memory to clear: 8 MB more peak memory and a slower scan (tests/bench/score_bench).
  std::vector<std::int64_t> touchdowns;
  std::span<const LimbCycle> cycles;  // complete cycles without problems, ascending
  KnownStates known;                  // where the limb's state is known
  std::vector<FlaggedSpan> flagged;   // ascending by first
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
