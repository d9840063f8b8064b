#include "analysis/cycles.h"

#include <algorithm>
#include <string>

#include "analysis/parallel.h"
#include "common/huge_pages.h"

namespace stridemark::analysis {
namespace {

using model::EventKind;

std::string describe(EventKind kind) {
  return kind == EventKind::touchdown ? "touchdown" : "lift-off";
}

// Merged hidden spans of one limb as half-open intervals [first, last + 1).
std::vector<StateInterval> hiddenIntervals(const model::Annotation& annotation, int limb,
                                           std::vector<Problem>& problems) {
  std::vector<StateInterval> spans;
  for (const model::HiddenSpan& span : annotation.hidden) {
    if (span.limb != limb) continue;
    if (span.last < span.first) {
      problems.push_back({span.first, limb,
                          "hidden span of " + annotation.limbs.label(limb) + " ends (frame " +
                              std::to_string(span.last) +
                              ") before it starts; it was ignored - "
                              "fix its first and last frame"});
      continue;
    }
    spans.push_back({span.first, span.last + 1, false});
  }
  std::sort(spans.begin(), spans.end(),
            [](const StateInterval& a, const StateInterval& b) { return a.first < b.first; });
  std::vector<StateInterval> merged;
  for (const StateInterval& s : spans) {
    if (!merged.empty() && s.first <= merged.back().end) {
      merged.back().end = std::max(merged.back().end, s.end);
    } else {
      merged.push_back(s);
    }
  }
  return merged;
}

// True when any hidden interval overlaps frames [first, end).
bool overlapsHidden(const std::vector<StateInterval>& hidden, std::int64_t first,
                    std::int64_t end) {
  auto it = std::upper_bound(hidden.begin(), hidden.end(), first,
                             [](std::int64_t f, const StateInterval& s) { return f < s.end; });
  return it != hidden.end() && it->first < end;
}

// Appends [first, end) minus the hidden intervals to `out`.
void appendVisible(const std::vector<StateInterval>& hidden, StateInterval interval,
                   std::vector<StateInterval>& out) {
  auto it = std::upper_bound(hidden.begin(), hidden.end(), interval.first,
                             [](std::int64_t f, const StateInterval& s) { return f < s.end; });
  std::int64_t cursor = interval.first;
  for (; it != hidden.end() && it->first < interval.end; ++it) {
    if (it->first > cursor) out.push_back({cursor, it->first, interval.stance});
    cursor = std::max(cursor, it->end);
  }
  if (cursor < interval.end) out.push_back({cursor, interval.end, interval.stance});
}

// One limb's slice of the shared cycle vector: limbs are scanned in parallel, each writing
// into room sized for its tags, and the slices are closed up afterwards.
struct CycleSlice {
  LimbCycle* data = nullptr;
  std::size_t room = 0;
  std::size_t count = 0;
  void push(const LimbCycle& cycle) { data[count++] = cycle; }  // room >= tags / 2 + 1 >= count
};

class LimbScanner {
 public:
  LimbScanner(const model::Annotation& annotation, int limb, std::vector<Problem>& problems,
              CycleSlice& cycles)
      : annotation_(annotation), limb_(limb), problems_(problems), cycles_(cycles) {
    hidden_ = hiddenIntervals(annotation, limb, problems);
  }

  LimbTrack scan(HugeVector<Tag> tags) {
    const auto byFrameThenKind = [](const Tag& a, const Tag& b) {
      return a.frame != b.frame ? a.frame < b.frame : a.kind < b.kind;
    };
    // Normalized annotations arrive sorted: checking is one cheap pass, sorting is not.
    if (!std::is_sorted(tags.begin(), tags.end(), byFrameThenKind))
      std::sort(tags.begin(), tags.end(), byFrameThenKind);
    dropUnusable(tags);
    orderSameFrame(tags);
    track_.touchdowns.reserve(tags.size() / 2 + 1);
    HugeVector<PairStatus> status = checkPairs(tags);
    buildCycles(tags, status);
    for (const Tag& t : tags)
      if (t.kind == EventKind::touchdown) track_.touchdowns.push_back(t.frame);
    std::sort(track_.flagged.begin(), track_.flagged.end(),
              [](const FlaggedSpan& a, const FlaggedSpan& b) { return a.first < b.first; });
    track_.known = KnownStates(std::move(tags), std::move(status), std::move(hidden_));
    return std::move(track_);
  }

 private:
  const std::string& label() const { return annotation_.limbs.label(limb_); }

  void report(std::int64_t frame, std::string message, std::int64_t flagFrom) {
    problems_.push_back({frame, limb_, std::move(message)});
    track_.flagged.push_back({flagFrom, frame});
  }

  // Duplicates, tags outside the clip and tags inside hidden spans are reported and ignored.
  // Filters in place: long annotations should not pay for a second copy.
  void dropUnusable(HugeVector<Tag>& tags) {
    std::size_t kept = 0;
    const auto& clip = annotation_.clip;
    for (std::size_t i = 0; i < tags.size(); ++i) {
      const Tag t = tags[i];  // a copy: slot i may be overwritten below
      const auto what = [&] {
        return describe(t.kind) + " of " + label() + " at frame " + std::to_string(t.frame);
      };
      if (kept > 0 && tags[kept - 1].frame == t.frame && tags[kept - 1].kind == t.kind) {
        report(t.frame, "duplicate " + what() + "; delete one of the two tags", t.frame);
      } else if (clip && (t.frame < clip->first || t.frame > clip->last)) {
        report(t.frame,
               what() + " lies outside the clip (frames " + std::to_string(clip->first) + "-" +
                   std::to_string(clip->last) + "); it was ignored - delete or move the tag",
               t.frame);
      } else if (overlapsHidden(hidden_, t.frame, t.frame + 1)) {
        report(t.frame,
               what() + " lies inside a span where " + label() +
                   " is marked hidden; it was ignored - delete the tag or shorten the span",
               t.frame);
      } else {
        tags[kept++] = t;
      }
    }
    tags.resize(kept);
  }

  // A touchdown and a lift-off on one frame: read them in the order the state implies (a limb
  // in stance lifts off first), so the zero-length phase is the one reported.
  static void orderSameFrame(HugeVector<Tag>& tags) {
    for (std::size_t i = 0; i + 1 < tags.size(); ++i) {
      if (tags[i].frame != tags[i + 1].frame) continue;
      const bool inStance = i > 0 && tags[i - 1].kind == EventKind::touchdown;
      if (inStance && tags[i].kind == EventKind::touchdown) std::swap(tags[i], tags[i + 1]);
    }
  }

  HugeVector<PairStatus> checkPairs(const HugeVector<Tag>& tags) {
    HugeVector<PairStatus> status(tags.size() > 0 ? tags.size() - 1 : 0, PairStatus::ok);
    for (std::size_t i = 0; i + 1 < tags.size(); ++i) {
      const Tag& a = tags[i];
      const Tag& b = tags[i + 1];
      const auto at = [&] { return " of " + label() + " at frame " + std::to_string(b.frame); };
      if (a.kind != b.kind) {
        if (a.frame == b.frame) {
          const bool stance = a.kind == EventKind::touchdown;
          report(b.frame,
                 std::string(stance ? "zero-length stance" : "zero-length swing") + at() +
                     (stance ? ": touchdown and lift-off" : ": lift-off and touchdown") +
                     " on the same frame - move one of them",
                 a.frame);
          status[i] = PairStatus::bad;
        }
      } else if (overlapsHidden(hidden_, a.frame + 1, b.frame)) {
        status[i] = PairStatus::occluded;  // the missing tag fell in a hidden span
      } else {
        status[i] = PairStatus::bad;
        if (a.kind == EventKind::touchdown) {
          report(b.frame,
                 "second touchdown" + at() + " inside the stance that began at frame " +
                     std::to_string(a.frame) +
                     "; tag the missing lift-off between them or delete one touchdown",
                 a.frame);
        } else {
          report(b.frame,
                 "lift-off" + at() + " has no touchdown since the lift-off at frame " +
                     std::to_string(a.frame) +
                     "; tag the missing touchdown between them or delete one lift-off",
                 a.frame);
        }
      }
    }
    return status;
  }

  void buildCycles(const HugeVector<Tag>& tags, const HugeVector<PairStatus>& status) {
    std::size_t next = 0;
    for (std::size_t i = 0; i < tags.size(); ++i) {
      if (tags[i].kind != EventKind::touchdown) continue;
      next = std::max(next, i + 1);
      while (next < tags.size() && tags[next].kind != EventKind::touchdown) ++next;
      if (next >= tags.size()) break;
      const bool clean = std::all_of(status.begin() + static_cast<std::ptrdiff_t>(i),
                                     status.begin() + static_cast<std::ptrdiff_t>(next),
                                     [](PairStatus s) { return s != PairStatus::bad; });
      if (!clean) continue;
      LimbCycle cycle(limb_, tags[i].frame, tags[next].frame);
      if (next == i + 2 && !overlapsHidden(hidden_, tags[i].frame, tags[next].frame) &&
          !cycle.setLiftoff(tags[i + 1].frame)) {
        report(tags[i + 1].frame,
               "stance of " + label() + " from frame " + std::to_string(tags[i].frame) +
                   " is longer than 2^31 - 1 frames; the cycle was left out - check the frame "
                   "numbers",
               tags[i].frame);
        continue;
      }
      cycles_.push(cycle);
    }
  }

  const model::Annotation& annotation_;
  int limb_;
  std::vector<Problem>& problems_;
  CycleSlice& cycles_;
  std::vector<StateInterval> hidden_;
  LimbTrack track_;
};

// Each limb's tags, in the order of `events`; tags naming no limb of the set are reported.
std::vector<HugeVector<Tag>> tagsByLimb(const model::Annotation& annotation,
                                        std::span<const model::Event> events,
                                        std::vector<Problem>& problems) {
  const int limbCount = annotation.limbs.size();
  std::vector<HugeVector<Tag>> tags(static_cast<std::size_t>(limbCount));
  std::vector<std::size_t> perLimb(static_cast<std::size_t>(limbCount), 0);
  for (const model::Event& e : events)
    if (e.limb >= 0 && e.limb < limbCount) ++perLimb[static_cast<std::size_t>(e.limb)];
  for (std::size_t i = 0; i < tags.size(); ++i) reserveHuge(tags[i], perLimb[i]);
  for (const model::Event& e : events) {
    if (e.limb < 0 || e.limb >= limbCount) {
      problems.push_back({e.frame, std::nullopt,
                          "tag at frame " + std::to_string(e.frame) + " names limb #" +
                              std::to_string(e.limb) + ", which the " + annotation.limbs.name() +
                              " limb set does not have (" + annotation.limbs.labelList() +
                              "); it was ignored"});
      continue;
    }
    if (e.frame > kLastTagFrame || e.frame < -kLastTagFrame - 1) {
      problems.push_back({e.frame, e.limb,
                          "tag of " + annotation.limbs.label(e.limb) + " at frame " +
                              std::to_string(e.frame) +
                              " is beyond frame 2^61 - 1; it was ignored - check the frame "
                              "number"});
      continue;
    }
    tags[static_cast<std::size_t>(e.limb)].push_back({e.frame, e.kind});
  }
  return tags;
}

CycleScan scanTags(const model::Annotation& annotation, std::vector<HugeVector<Tag>> tags,
                   std::vector<Problem> problems) {
  CycleScan scan;
  scan.problems = std::move(problems);
  const int limbCount = annotation.limbs.size();
  for (const model::HiddenSpan& span : annotation.hidden) {
    if (span.limb >= 0 && span.limb < limbCount) continue;
    scan.problems.push_back({span.first, std::nullopt,
                             "hidden span at frames " + std::to_string(span.first) + "-" +
                                 std::to_string(span.last) + " names limb #" +
                                 std::to_string(span.limb) + ", which the " +
                                 annotation.limbs.name() +
                                 " limb set does not have; it was "
                                 "ignored"});
  }
  // Each limb gets room for tags / 2 + 1 cycles at its own offset (a cycle starts at a
  // touchdown); limbs are scanned in parallel, then their cycles are closed up in limb order.
  std::vector<CycleSlice> slices(tags.size());
  std::size_t cycleRoom = 0;
  for (std::size_t i = 0; i < tags.size(); ++i)
    cycleRoom += slices[i].room = tags[i].size() / 2 + 1;
  reserveHuge(scan.cycles, cycleRoom);
  scan.cycles.resize(cycleRoom);
  for (std::size_t i = 0, offset = 0; i < slices.size(); offset += slices[i++].room)
    slices[i].data = scan.cycles.data() + offset;
  scan.tracks.resize(tags.size());
  std::vector<std::vector<Problem>> limbProblems(tags.size());
  forEachParallel(tags.size(), [&](std::size_t i) {
    LimbScanner scanner(annotation, static_cast<int>(i), limbProblems[i], slices[i]);
    scan.tracks[i] = scanner.scan(std::move(tags[i]));
  });
  std::size_t kept = 0;
  for (std::size_t i = 0; i < slices.size(); ++i) {
    if (slices[i].data != scan.cycles.data() + kept)  // slices only move towards the front
      std::copy_n(slices[i].data, slices[i].count, scan.cycles.data() + kept);
    scan.tracks[i].cycles = std::span<const LimbCycle>(scan.cycles.data() + kept, slices[i].count);
    kept += slices[i].count;
  }
  scan.cycles.resize(kept);
  for (auto& found : limbProblems)
    scan.problems.insert(scan.problems.end(), std::make_move_iterator(found.begin()),
                         std::make_move_iterator(found.end()));
  std::stable_sort(scan.problems.begin(), scan.problems.end(),
                   [](const Problem& a, const Problem& b) {
                     if (a.frame != b.frame) return a.frame < b.frame;
                     return a.limb.value_or(-1) < b.limb.value_or(-1);
                   });
  return scan;
}

// Two like tags around a hidden span: the state is known from the first tag up to the span
// and from the span up to the second tag.
void appendAroundOcclusion(const std::vector<StateInterval>& hidden, const Tag& a, const Tag& b,
                           std::vector<StateInterval>& out) {
  auto first = std::upper_bound(hidden.begin(), hidden.end(), a.frame,
                                [](std::int64_t f, const StateInterval& s) { return f < s.end; });
  const bool stanceAfterA = a.kind == EventKind::touchdown;
  if (first->first > a.frame) out.push_back({a.frame, first->first, stanceAfterA});
  auto last = std::lower_bound(hidden.begin(), hidden.end(), b.frame,
                               [](const StateInterval& s, std::int64_t f) { return s.first < f; });
  --last;  // the last span starting before b
  if (last->end < b.frame) out.push_back({last->end, b.frame, !stanceAfterA});
}

}  // namespace

KnownStates::KnownStates(HugeVector<Tag> tags, HugeVector<PairStatus> status,
                         std::vector<StateInterval> hidden)
    : tags_(std::move(tags)), status_(std::move(status)), hidden_(std::move(hidden)) {}

KnownStates::Reader::Reader(const KnownStates& states) : states_(&states) {
  fill();
}

void KnownStates::Reader::next() {
  if (piece_ + 1 < pieces_.size()) {
    take(pieces_[++piece_]);
  } else {
    fill();
  }
}

// The first interval of the next pair of tags that has any: an ordinary pair gives its span
// less any hidden part; a pair of like tags around a hidden span, the parts on either side.
// Without hidden spans (the usual case) an ordinary pair is one interval, read straight off.
void KnownStates::Reader::fill() {
  pieces_.clear();
  piece_ = 0;
  const auto& tags = states_->tags_;
  const auto& hidden = states_->hidden_;
  for (; pair_ < states_->status_.size(); ++pair_) {
    const Tag& a = tags[pair_];
    const Tag& b = tags[pair_ + 1];
    const PairStatus status = states_->status_[pair_];
    if (status == PairStatus::ok && hidden.empty()) {
      current_ = {a.frame, b.frame, a.kind == EventKind::touchdown};
      ++pair_;
      return;
    }
    if (status == PairStatus::ok) {
      appendVisible(hidden, {a.frame, b.frame, a.kind == EventKind::touchdown}, pieces_);
    } else if (status == PairStatus::occluded) {
      appendAroundOcclusion(hidden, a, b, pieces_);
    }
    if (!pieces_.empty()) {
      take(pieces_.front());
      ++pair_;
      return;
    }
  }
  done_ = true;
}

CycleScan scanCycles(const model::Annotation& annotation) {
  std::vector<Problem> problems;
  std::vector<HugeVector<Tag>> tags = tagsByLimb(annotation, annotation.events, problems);
  return scanTags(annotation, std::move(tags), std::move(problems));
}

CycleScan scanCycles(const model::Annotation& rest, std::vector<model::Event>&& events) {
  std::vector<Problem> problems;
  std::vector<HugeVector<Tag>> tags = tagsByLimb(rest, events, problems);
  std::vector<model::Event>().swap(events);  // its memory now holds the cycles
  return scanTags(rest, std::move(tags), std::move(problems));
}

const LimbCycle* cycleStartingAt(const LimbTrack& track, std::int64_t touchdown) {
  auto it = std::lower_bound(track.cycles.begin(), track.cycles.end(), touchdown,
                             [](const LimbCycle& c, std::int64_t f) { return c.touchdown < f; });
  if (it == track.cycles.end() || it->touchdown != touchdown) return nullptr;
  return &*it;
}

}  // namespace stridemark::analysis
