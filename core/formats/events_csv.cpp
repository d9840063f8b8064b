#include "formats/events_csv.h"

#include <algorithm>
#include <array>
#include <charconv>
#include <cmath>
#include <cstring>

#include "common/error.h"
#include "formats/file_io.h"
#include "formats/text_scan.h"
#include "stridemark/version.h"

namespace stridemark::formats {
namespace {

constexpr std::string_view kHeaderHelp =
    "the first line that is not a comment must name the columns limb,event,frame "
    "(or limb,event,time_s, or limb,event,frame,time_s as in the tables `score --csv` writes)";

// limb, event, frame or time_s, and time_s beside frame.
constexpr std::size_t kMostColumns = 4;
using Fields = std::array<std::string_view, kMostColumns>;

[[noreturn]] void failAt(std::string_view file, long line, const std::string& message) {
  throw Error(ErrorCategory::format, atLine(file, line, message));
}

std::string shown(std::string_view s) {
  constexpr std::size_t kLongest = 40;  // keep messages readable when a line is garbage
  if (s.size() > kLongest) return "'" + std::string(s.substr(0, kLongest)) + "...'";
  return "'" + std::string(s) + "'";
}

// Splits one line at commas into `fields`; returns how many fields the line has.
std::size_t splitFields(std::string_view line, Fields& fields) {
  std::size_t count = 0;
  while (true) {
    const std::size_t comma = line.find(',');
    std::string_view field = text::trim(line.substr(0, comma));
    if (field.size() >= 2 && field.front() == '"' && field.back() == '"') {
      field = field.substr(1, field.size() - 2);  // spreadsheet programs may quote fields
    }
    if (count < fields.size()) fields[count] = field;
    ++count;
    if (comma == std::string_view::npos) return count;
    line.remove_prefix(comma + 1);
  }
}

struct Columns {
  int limb = -1;
  int event = -1;
  int frame = -1;
  int time = -1;
  std::size_t count = 3;
};

Columns parseHeader(std::string_view line, std::string_view file, long lineNumber) {
  Fields fields;
  const std::size_t count = splitFields(line, fields);
  auto bad = [&](const std::string& what) {
    failAt(file, lineNumber,
           "header " + shown(line) + " " + what + " — " + std::string(kHeaderHelp));
  };
  if (count != 3 && line.find_first_of(";\t") != std::string_view::npos) {
    bad("separates columns with ';' or tabs, not commas");
  }
  // Proposals from `stridemark suggest` are not tags until a person has reviewed them.
  if (line.find("confidence") != std::string_view::npos)
    failAt(file, lineNumber,
           "header " + shown(line) +
               " has a confidence column: these look like proposals from `stridemark suggest`, "
               "which are not tags until reviewed — review them in the desk (Review menu), or "
               "delete the confidence column to use them as tags as they are");
  if (count != 3 && count != kMostColumns)
    bad("has " + std::to_string(count) + (count == 1 ? " column" : " columns") + ", not 3");
  Columns columns;
  columns.count = count;
  for (int i = 0; i < static_cast<int>(count); ++i) {
    const std::string_view name = fields[static_cast<std::size_t>(i)];
    int* slot = name == "limb"     ? &columns.limb
                : name == "event"  ? &columns.event
                : name == "frame"  ? &columns.frame
                : name == "time_s" ? &columns.time
                                   : nullptr;
    if (!slot) bad("has an unknown column " + shown(name));
    if (*slot >= 0) bad("names the column " + shown(name) + " twice");
    *slot = i;
  }
  if (count == 3 && columns.frame >= 0 && columns.time >= 0) bad("has both frame and time_s");
  if (columns.limb < 0 || columns.event < 0) bad("lacks the limb or event column");
  if (count == kMostColumns && (columns.frame < 0 || columns.time < 0))
    bad("has 4 columns, but only time_s may stand beside frame");
  return columns;
}

// Header comments "# key: value" before the column header carry what the file knows about
// itself. Unknown keys are ordinary comments.
struct HeaderComments {
  std::optional<Rational> rate;
  std::optional<model::LimbSet> limbs;
  std::string reference;
  long referenceLine = 0;
};

void readHeaderComment(std::string_view line, std::string_view file, long lineNumber,
                       HeaderComments& into) {
  const std::string_view body = text::trim(line.substr(1));
  const std::size_t colon = body.find(':');
  if (colon == std::string_view::npos) return;
  const std::string_view key = text::trim(body.substr(0, colon));
  const std::string_view value = text::trim(body.substr(colon + 1));
  try {
    if (key == "fps" || key == "capture_rate" || key == "capture_rate_fps") {
      into.rate = parseRate(value, "capture rate");
    } else if (key == "limbs" || key == "limb_set") {
      into.limbs = model::LimbSet::fromName(value);
    } else if (key == "reference" || key == "reference_limb") {
      into.reference = std::string(value);
      into.referenceLine = lineNumber;
    }
  } catch (const Error& e) {
    failAt(file, lineNumber, std::string(e.what()) + " — fix this header comment");
  }
}

int parseLimb(std::string_view field, const std::vector<std::string>& labels,
              const model::LimbSet& limbs, std::string_view file, long line) {
  for (std::size_t i = 0; i < labels.size(); ++i) {
    if (labels[i] == field) return static_cast<int>(i);
  }
  if (field.empty())
    failAt(file, line, "the limb field is empty — give one of " + limbs.labelList());
  failAt(file, line,
         "unknown limb " + shown(field) + " for limb set " + limbs.name() + " — use one of " +
             limbs.labelList() + ", or choose the limb set that has this label");
}

model::EventKind parseEvent(std::string_view field, std::string_view file, long line) {
  if (field == "touchdown") return model::EventKind::touchdown;
  if (field == "liftoff") return model::EventKind::liftoff;
  failAt(file, line, "unknown event " + shown(field) + " — write touchdown or liftoff");
}

std::int64_t parseFrame(std::string_view field, std::string_view file, long line) {
  if (field.empty()) failAt(file, line, "the frame field is empty — give a frame number");
  const char* end = field.data() + field.size();
  std::int64_t value = 0;
  if (field.front() == '-') {
    const auto [ptr, ec] = std::from_chars(field.data() + 1, end, value);
    if (ec == std::errc() && ptr == end) {
      failAt(file, line,
             "frame " + shown(field) +
                 " is negative — frame numbers count from 0 at the clip's "
                 "first frame");
    }
    failAt(file, line, "frame " + shown(field) + " is not a number — give a whole frame number");
  }
  const auto [ptr, ec] = std::from_chars(field.data(), end, value);
  if (ec == std::errc::result_out_of_range) {
    failAt(file, line, "frame " + shown(field) + " is too large — check the number");
  }
  if (ec == std::errc() && ptr == end) return value;
  if (ec == std::errc() && (*ptr == '.' || *ptr == 'e' || *ptr == 'E')) {
    failAt(file, line,
           "frame " + shown(field) +
               " is not a whole number — frames are integers; for times in seconds name the "
               "column time_s");
  }
  failAt(file, line, "frame " + shown(field) + " is not a number — give a whole frame number");
}

std::int64_t parseTime(std::string_view field, Rational rate, std::string_view file, long line) {
  if (field.empty()) failAt(file, line, "the time_s field is empty — give a time in seconds");
  double seconds = 0;
  const char* end = field.data() + field.size();
  const auto [ptr, ec] = std::from_chars(field.data(), end, seconds);
  if (ec != std::errc() || ptr != end) {
    failAt(file, line, "time_s " + shown(field) + " is not a number — give seconds, e.g. 0.125");
  }
  if (!std::isfinite(seconds)) {
    failAt(file, line, "time_s " + shown(field) + " is not a finite number — give seconds");
  }
  if (seconds < 0) {
    failAt(file, line,
           "time_s " + shown(field) +
               " is negative — times count from 0 at the "
               "clip's first frame");
  }
  const double frame = seconds * rate.toDouble();
  if (frame > 1e15) failAt(file, line, "time_s " + shown(field) + " is too large — check it");
  return secondsToFrame(seconds, rate);
}

// time_s beside frame (our tables write both): frame counts, time_s must agree with it.
void checkTimeMatchesFrame(std::string_view field, std::int64_t frame,
                           const std::optional<Rational>& rate, std::string_view file, long line) {
  if (!rate) return;  // nothing to compare with; the frame is what counts
  const std::int64_t fromTime = parseTime(field, *rate, file, line);
  if (fromTime != frame) {
    failAt(file, line,
           "time_s " + shown(field) + " is frame " + std::to_string(fromTime) + " at " +
               toString(*rate) + " fps, but the frame column says " + std::to_string(frame) +
               " — correct one of them, or delete the time_s column (frame counts)");
  }
}

void requireText(std::string_view text, std::string_view file) {
  const std::size_t bad = text::firstNonTextByte(text);
  if (bad == std::string_view::npos) return;
  const bool nul = text[bad] == '\0';
  failAt(file, text::lineOfOffset(text, bad),
         std::string(nul ? "contains a NUL byte" : "contains bytes that are not UTF-8 text") +
             " — not a text CSV; export the events as UTF-8 text with a limb,event,frame header");
}

}  // namespace

EventsCsv parseEventsCsv(std::string_view text, std::string_view fileName,
                         const EventsCsvOptions& options) {
  constexpr std::string_view kBom = "\xEF\xBB\xBF";
  if (text.substr(0, kBom.size()) == kBom) text.remove_prefix(kBom.size());
  requireText(text, fileName);

  text::LineCursor cursor(text);
  std::string_view line;
  HeaderComments comments;
  std::optional<Columns> columns;
  while (!columns && cursor.next(line)) {
    const std::string_view trimmed = text::trim(line);
    if (trimmed.empty()) continue;
    if (trimmed.front() == '#') {
      readHeaderComment(trimmed, fileName, cursor.number(), comments);
      continue;
    }
    columns = parseHeader(trimmed, fileName, cursor.number());
  }
  if (!columns) {
    failAt(fileName, std::max(1L, cursor.number()),
           "no header line (the file is empty or only comments) — " + std::string(kHeaderHelp));
  }

  EventsCsv result;
  result.limbs = options.limbs ? *options.limbs : comments.limbs.value_or(result.limbs);
  result.captureRate = options.captureRate ? options.captureRate : comments.rate;
  result.timeColumn = columns->frame < 0;  // time_s beside frame only checks it
  const long headerLine = cursor.number();
  if (!comments.reference.empty()) {
    result.referenceLimb = result.limbs.indexOf(comments.reference);
    if (!result.referenceLimb) {
      failAt(fileName, comments.referenceLine,
             "reference limb " + shown(comments.reference) + " is not in limb set " +
                 result.limbs.name() + " — use one of " + result.limbs.labelList());
    }
  }
  if (result.timeColumn && !result.captureRate) {
    failAt(fileName, headerLine,
           "the time_s column needs the capture rate to find frames — give it (e.g. --fps 240) "
           "or add a '# fps: 240' line above the header");
  }

  std::vector<std::string> labels;
  for (const auto& limb : result.limbs.limbs()) labels.push_back(limb.label);
  const auto limbColumn = static_cast<std::size_t>(columns->limb);
  const auto eventColumn = static_cast<std::size_t>(columns->event);
  const auto whenColumn =
      static_cast<std::size_t>(result.timeColumn ? columns->time : columns->frame);
  Fields fields;
  while (cursor.next(line)) {
    const long number = cursor.number();
    const std::string_view trimmed = text::trim(line);
    if (trimmed.empty() || trimmed.front() == '#') continue;
    const std::size_t count = splitFields(trimmed, fields);
    if (count != columns->count) {
      const std::string names = columns->count == kMostColumns ? "frame, time_s"
                                : result.timeColumn            ? "time_s"
                                                               : "frame";
      failAt(fileName, number,
             "expected " + std::to_string(columns->count) + " fields (limb, event, " + names +
                 ") but found " + std::to_string(count) + " in " + shown(trimmed) +
                 " — write one event per line, fields separated by commas");
    }
    model::Event event;
    event.limb = parseLimb(fields[limbColumn], labels, result.limbs, fileName, number);
    event.kind = parseEvent(fields[eventColumn], fileName, number);
    event.frame = result.timeColumn
                      ? parseTime(fields[whenColumn], *result.captureRate, fileName, number)
                      : parseFrame(fields[whenColumn], fileName, number);
    if (columns->count == kMostColumns) {
      checkTimeMatchesFrame(fields[static_cast<std::size_t>(columns->time)], event.frame,
                            result.captureRate, fileName, number);
    }
    result.events.push_back(event);
  }
  return result;
}

model::Annotation toAnnotation(EventsCsv&& csv) {
  model::Annotation annotation;
  annotation.limbs = csv.limbs;
  if (csv.captureRate) annotation.captureRate = *csv.captureRate;
  annotation.referenceLimb = csv.referenceLimb.value_or(csv.limbs.defaultReference());
  annotation.events = std::move(csv.events);
  annotation.normalize();
  return annotation;
}

EventsCsv readEventsCsv(const std::filesystem::path& path, const EventsCsvOptions& options) {
  const std::string content = readWholeFile(path);
  return parseEventsCsv(content, path.string(), options);
}

std::string formatEventsCsv(const model::Annotation& annotation, std::string_view source) {
  std::vector<model::Event> events = annotation.events;
  std::sort(events.begin(), events.end(), [](const model::Event& a, const model::Event& b) {
    if (a.frame != b.frame) return a.frame < b.frame;
    if (a.limb != b.limb) return a.limb < b.limb;
    return a.kind < b.kind;
  });
  std::string out;
  out.reserve(200 + events.size() * 18);
  out += "# Stridemark events (stridemark ";
  out += kVersion;
  out += ")\n";
  if (!source.empty()) {
    out += "# source: ";
    out += source;
    out += '\n';
  }
  out += "# limbs: " + annotation.limbs.name() + '\n';
  out += "# fps: " + toString(annotation.captureRate) + '\n';
  out += "# reference: " + annotation.limbs.label(annotation.referenceLimb) + '\n';
  out += "limb,event,frame\n";
  for (const auto& event : events) {
    out += annotation.limbs.label(event.limb);
    out += ',';
    out += model::eventWord(event.kind);
    out += ',';
    text::appendInt(out, event.frame);
    out += '\n';
  }
  return out;
}

void writeEventsCsv(const std::filesystem::path& path, const model::Annotation& annotation,
                    std::string_view source) {
  writeFileAtomically(path, formatEventsCsv(annotation, source));
}

}  // namespace stridemark::formats
