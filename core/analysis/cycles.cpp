#include "analysis/cycles.h"

#include <algorithm>
#include <string>

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

// What a pair of consecutive tags says about the frames between them.
enum class PairStatus {
  ok,        // a touchdown then a lift-off, or the reverse, on different frames
  occluded,  // like tags around a hidden span, which holds the missing one
  bad,       // an annotation problem: the state between them is unknown
};

struct Tag {
  std::int64_t frame = 0;
  EventKind kind = EventKind::touchdown;
};

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

// Checks one limb's tags and turns them into its track.
class LimbScanner {
 public:
  LimbScanner(const model::Annotation& annotation, int limb, std::vector<Problem>& problems)
      : annotation_(annotation), limb_(limb), problems_(problems) {
    hidden_ = hiddenIntervals(annotation, limb, problems);
  }

  LimbTrack scan(std::vector<Tag> tags) {
    std::sort(tags.begin(), tags.end(), [](const Tag& a, const Tag& b) {
      return a.frame != b.frame ? a.frame < b.frame : a.kind < b.kind;
    });
    dropUnusable(tags);
    orderSameFrame(tags);
    const std::vector<PairStatus> status = checkPairs(tags);
    buildCycles(tags, status);
    addKnownStates(tags, status);
    for (const Tag& t : tags)
      if (t.kind == EventKind::touchdown) track_.touchdowns.push_back(t.frame);
    std::sort(track_.flagged.begin(), track_.flagged.end(),
              [](const FlaggedSpan& a, const FlaggedSpan& b) { return a.first < b.first; });
    return std::move(track_);
  }

 private:
  const std::string& label() const { return annotation_.limbs.label(limb_); }

  void report(std::int64_t frame, std::string message, std::int64_t flagFrom) {
    problems_.push_back({frame, limb_, std::move(message)});
    track_.flagged.push_back({flagFrom, frame});
  }

  // Duplicates, tags outside the clip and tags inside hidden spans are reported and ignored.
  void dropUnusable(std::vector<Tag>& tags) {
    std::vector<Tag> kept;
    const auto& clip = annotation_.clip;
    for (const Tag& t : tags) {
      const auto what = [&] {
        return describe(t.kind) + " of " + label() + " at frame " + std::to_string(t.frame);
      };
      if (!kept.empty() && kept.back().frame == t.frame && kept.back().kind == t.kind) {
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
        kept.push_back(t);
      }
    }
    tags = std::move(kept);
  }

  // A touchdown and a lift-off on one frame: read them in the order the state implies (a limb
  // in stance lifts off first), so the zero-length phase is the one reported.
  static void orderSameFrame(std::vector<Tag>& tags) {
    for (std::size_t i = 0; i + 1 < tags.size(); ++i) {
      if (tags[i].frame != tags[i + 1].frame) continue;
      const bool inStance = i > 0 && tags[i - 1].kind == EventKind::touchdown;
      if (inStance && tags[i].kind == EventKind::touchdown) std::swap(tags[i], tags[i + 1]);
    }
  }

  std::vector<PairStatus> checkPairs(const std::vector<Tag>& tags) {
    std::vector<PairStatus> status(tags.empty() ? 0 : tags.size() - 1, PairStatus::ok);
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

  // A cycle runs from a touchdown to the next one when no pair between them is bad and no
  // hidden span lies between them; its lift-off is the one tag between them.
  void buildCycles(const std::vector<Tag>& tags, const std::vector<PairStatus>& status) {
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
      // A hidden span inside may hold a touchdown: the cycle is unknown, never double-length.
      if (overlapsHidden(hidden_, tags[i].frame, tags[next].frame)) continue;
      LimbCycle cycle{limb_, tags[i].frame, tags[next].frame, std::nullopt};
      if (next == i + 2) cycle.liftoff = tags[i + 1].frame;
      track_.cycles.push_back(cycle);
    }
  }

  // Known state between consecutive tags: an ordinary pair gives its span less any hidden
  // part; a pair of like tags around a hidden span, the parts on either side; a bad pair none.
  void addKnownStates(const std::vector<Tag>& tags, const std::vector<PairStatus>& status) {
    for (std::size_t i = 0; i < status.size(); ++i) {
      const Tag& a = tags[i];
      const Tag& b = tags[i + 1];
      if (status[i] == PairStatus::ok) {
        appendVisible(hidden_, {a.frame, b.frame, a.kind == EventKind::touchdown}, track_.known);
      } else if (status[i] == PairStatus::occluded) {
        appendAroundOcclusion(hidden_, a, b, track_.known);
      }
    }
  }

  const model::Annotation& annotation_;
  int limb_;
  std::vector<Problem>& problems_;
  std::vector<StateInterval> hidden_;
  LimbTrack track_;
};

// Each limb's tags, in the order of the events; tags naming no limb of the set are reported.
std::vector<std::vector<Tag>> tagsByLimb(const model::Annotation& annotation,
                                         std::vector<Problem>& problems) {
  const int limbCount = annotation.limbs.size();
  std::vector<std::vector<Tag>> tags(static_cast<std::size_t>(limbCount));
  for (const model::Event& e : annotation.events) {
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

void reportForeignHiddenSpans(const model::Annotation& annotation, std::vector<Problem>& problems) {
  const int limbCount = annotation.limbs.size();
  for (const model::HiddenSpan& span : annotation.hidden) {
    if (span.limb >= 0 && span.limb < limbCount) continue;
    problems.push_back({span.first, std::nullopt,
                        "hidden span at frames " + std::to_string(span.first) + "-" +
                            std::to_string(span.last) + " names limb #" +
                            std::to_string(span.limb) + ", which the " + annotation.limbs.name() +
                            " limb set does not have; it was ignored"});
  }
}

}  // namespace

CycleScan scanCycles(const model::Annotation& annotation) {
  CycleScan scan;
  std::vector<std::vector<Tag>> tags = tagsByLimb(annotation, scan.problems);
  reportForeignHiddenSpans(annotation, scan.problems);
  for (std::size_t limb = 0; limb < tags.size(); ++limb) {
    LimbScanner scanner(annotation, static_cast<int>(limb), scan.problems);
    scan.tracks.push_back(scanner.scan(std::move(tags[limb])));
  }
  std::stable_sort(scan.problems.begin(), scan.problems.end(),
                   [](const Problem& a, const Problem& b) {
                     if (a.frame != b.frame) return a.frame < b.frame;
                     return a.limb.value_or(-1) < b.limb.value_or(-1);
                   });
  return scan;
}

const LimbCycle* cycleStartingAt(const LimbTrack& track, std::int64_t touchdown) {
  auto it = std::lower_bound(track.cycles.begin(), track.cycles.end(), touchdown,
                             [](const LimbCycle& c, std::int64_t f) { return c.touchdown < f; });
  if (it == track.cycles.end() || it->touchdown != touchdown) return nullptr;
  return &*it;
}

}  // namespace stridemark::analysis
