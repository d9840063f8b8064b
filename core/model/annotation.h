#pragma once
// The annotation value types: events keyed by frame, spans where a limb is not visible, the
// trial card and the project document. Plain values: the UI changes them only inside undo
// commands; analysis reads them.
#include <compare>
#include <cstdint>
#include <filesystem>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "common/rational.h"
#include "model/limb_set.h"

namespace stridemark::model {

enum class EventKind { touchdown, liftoff };

std::string_view eventWord(EventKind kind);                      // "touchdown" / "liftoff"
std::optional<EventKind> parseEventWord(std::string_view word);  // exact lower-case words

// True for an ISO 8601 calendar date "YYYY-MM-DD" that exists (2024-02-29 yes, 2023-02-29 no).
bool isCalendarDate(std::string_view text);

struct Event {
  std::int64_t frame = 0;
  int limb = 0;
  EventKind kind = EventKind::touchdown;
  // Order: by limb, then frame, then touchdown before lift-off.
  friend auto operator<=>(const Event& a, const Event& b) {
    if (auto c = a.limb <=> b.limb; c != 0) return c;
    if (auto c = a.frame <=> b.frame; c != 0) return c;
    return static_cast<int>(a.kind) <=> static_cast<int>(b.kind);
  }
  friend bool operator==(const Event&, const Event&) = default;
};

// Frames [first, last] (inclusive) in which a limb cannot be seen; analysis treats its state
// there as unknown.
struct HiddenSpan {
  int limb = 0;
  std::int64_t first = 0;
  std::int64_t last = 0;
  friend bool operator==(const HiddenSpan&, const HiddenSpan&) = default;
};

struct FrameRange {
  std::int64_t first = 0;
  std::int64_t last = 0;  // inclusive
  friend bool operator==(const FrameRange&, const FrameRange&) = default;
};

// What analysis consumes: a limb set, a capture rate and the tags.
// A reference stride a person left out of the statistics, keyed by the frame it starts on
// (the reference limb's touchdown); it stays visible, with its reason.
struct StrideExclusion {
  std::int64_t startFrame = 0;
  std::string reason;
  friend bool operator==(const StrideExclusion&, const StrideExclusion&) = default;
};

struct Annotation {
  LimbSet limbs = LimbSet::quadruped();
  Rational captureRate{240, 1};
  int referenceLimb = LimbSet::quadruped().defaultReference();
  std::vector<Event> events;  // kept sorted (see Event ordering) by normalize()
  std::vector<HiddenSpan> hidden;
  std::optional<FrameRange> clip;         // frames that exist in the video, when known
  std::vector<StrideExclusion> excluded;  // ascending by start frame

  void normalize();  // sort events and hidden spans
  // Events of one limb in frame order (the vector must be normalized).
  std::vector<Event> eventsOf(int limb) const;
  // Tag state at `frame`: true if the limb is in stance (the last event at or before the frame
  // is a touchdown). Used by tag keys: a press marks touchdown in swing, lift-off in stance.
  bool inStance(int limb, std::int64_t frame) const;
};

// A treadmill belt's speed from a frame on (docs/methods.md §12).
struct SpeedStep {
  std::int64_t fromFrame = 0;
  double ms = 0;
  friend bool operator==(const SpeedStep&, const SpeedStep&) = default;
};

struct TrialCard {
  std::string subject;
  std::string species;
  std::string condition;
  std::string observer;  // the scorer
  std::string examDate;  // "YYYY-MM-DD" (isCalendarDate), empty when not given
  std::string notes;
  std::optional<double> speedMs;        // belt or ground speed, m/s (from the start)
  std::vector<SpeedStep> speedChanges;  // later speeds, ascending by frame
  std::string speedSource = "belt";     // "belt" or "ground"
  std::optional<double> legLengthM;     // hip height / leg length used for Froude, m
  friend bool operator==(const TrialCard&, const TrialCard&) = default;
};

struct VideoLink {
  std::string path;       // as saved: relative to the project file when possible
  std::string signature;  // size + hash of first and last MiB (core/video)
  std::int64_t frameCount = 0;
  Rational fileRate{0, 1};  // what the container claims
  friend bool operator==(const VideoLink&, const VideoLink&) = default;
};

// Where a linked video is on disk: a relative link is relative to the project file's folder.
std::filesystem::path resolveVideoPath(const std::filesystem::path& projectPath,
                                       const std::string& linkedPath);

// Where a person clicked a foot in one frame: the start of that foot's track when events are
// proposed from the video (core/vision). Pixels of the upright frame, origin top-left, x right,
// y down.
struct FootSeed {
  int limb = 0;
  std::int64_t frame = 0;
  double x = 0, y = 0;
  friend bool operator==(const FootSeed&, const FootSeed&) = default;
};

// An event proposed from the video, waiting for review. It is never a tag (analysis never sees
// it) until a person accepts it; confidence is 0-1 from the evidence (core/vision).
struct ProposedEvent {
  Event event;
  double confidence = 0;
  friend bool operator==(const ProposedEvent&, const ProposedEvent&) = default;
};

// Proposals of one run: events, and spans where the foot could not be seen (offered as hidden
// spans). Kept in the project so a review can stop and go on later.
struct Proposals {
  std::vector<ProposedEvent> events;  // sorted by event (Event ordering)
  std::vector<HiddenSpan> hidden;
  friend bool operator==(const Proposals&, const Proposals&) = default;
};

struct Project {
  static constexpr int kSchemaVersion = 1;
  Annotation annotation;
  TrialCard trial;
  std::optional<VideoLink> video;
  std::vector<FootSeed> seeds;  // by limb, then frame
  Proposals proposals;
};

}  // namespace stridemark::model
