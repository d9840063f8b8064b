#pragma once
// The events CSV (contract in CHANGELOG.md): the interchange file of touchdown / lift-off tags.
//
//   # fps: 240            optional header comments: capture rate, limb set, reference limb
//   # limbs: quadruped
//   # reference: LH
//   limb,event,frame      header (columns in any order; `time_s` may replace `frame`)
//   LH,touchdown,12
//
// `time_s` may also stand beside `frame` (the events table of `score --csv` has both): the frame
// counts and time_s must agree with it. Lines end with LF, CRLF or a lone CR.
// The reader is strict: every problem is reported as "FILE:LINE: what is wrong — what to do".
#include <filesystem>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "common/rational.h"
#include "model/annotation.h"

namespace stridemark::formats {

// What the caller already knows (e.g. from command-line flags). Values given here win over the
// file's header comments.
struct EventsCsvOptions {
  std::optional<model::LimbSet> limbs;
  std::optional<Rational> captureRate;
};

struct EventsCsv {
  model::LimbSet limbs = model::LimbSet::quadruped();  // options, else "# limbs:", else quadruped
  std::optional<Rational> captureRate;                 // options, else "# fps:"
  std::optional<int> referenceLimb;                    // from "# reference:"
  bool timeColumn = false;                             // the file gave time_s, not frame
  std::vector<model::Event> events;                    // in file order
};

// `fileName` only labels messages. Throws stridemark::Error(format) on the first bad line.
EventsCsv parseEventsCsv(std::string_view text, std::string_view fileName,
                         const EventsCsvOptions& options = {});
EventsCsv readEventsCsv(const std::filesystem::path& path, const EventsCsvOptions& options = {});

// The annotation an events CSV describes (limb set, capture rate, reference limb, events in
// model order).
model::Annotation toAnnotation(EventsCsv&& csv);

// Header comment block (software version, limb set, capture rate, reference limb, optional
// source note) followed by limb,event,frame rows in frame order.
std::string formatEventsCsv(const model::Annotation& annotation, std::string_view source = {});
void writeEventsCsv(const std::filesystem::path& path, const model::Annotation& annotation,
                    std::string_view source = {});

}  // namespace stridemark::formats
