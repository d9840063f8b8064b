#include "formats/project_file.h"

#include <algorithm>
#include <cmath>

#include "common/error.h"
#include "formats/file_io.h"
#include "formats/json_in.h"

namespace stridemark::formats {
namespace {

using Json = nlohmann::ordered_json;

Json optionalNumber(const std::optional<double>& value) {
  return value ? Json(*value) : Json(nullptr);
}

Json speedChangesJson(const std::vector<model::SpeedStep>& changes) {
  Json list = Json::array();
  for (const model::SpeedStep& step : changes)
    list.push_back({{"from_frame", step.fromFrame}, {"m_s", step.ms}});
  return list;
}

Json trialJson(const model::TrialCard& trial) {
  Json card{{"subject", trial.subject},
            {"species", trial.species},
            {"condition", trial.condition},
            {"observer", trial.observer},
            {"notes", trial.notes},
            {"speed_m_s", optionalNumber(trial.speedMs)},
            {"speed_changes", speedChangesJson(trial.speedChanges)},
            {"speed_source", trial.speedSource},
            {"leg_length_m", optionalNumber(trial.legLengthM)}};
  // Only when given, so files without a date keep their bytes.
  if (!trial.examDate.empty()) card["exam_date"] = trial.examDate;
  return card;
}

Json videoJson(const std::optional<model::VideoLink>& video) {
  if (!video) return nullptr;
  return Json{
      {"path", video->path},
      {"signature", video->signature},
      {"frame_count", video->frameCount},
      {"file_rate", video->fileRate.valid() ? Json(toString(video->fileRate)) : Json(nullptr)}};
}

// ---- reading ----

std::string textOr(const JsonIn& object, std::string_view key, std::string fallback = {}) {
  const auto value = object.find(key);
  return value ? value->text() : fallback;
}

Rational rateAt(const JsonIn& value) {
  const std::string text = value.text();  // its own message names the place already
  try {
    return parseRate(text, "rate");
  } catch (const Error& e) {
    value.fail(e.what());
  }
}

int limbAt(const JsonIn& value, const model::LimbSet& limbs) {
  const std::string label = value.text();
  const auto index = limbs.indexOf(label);
  if (!index) {
    value.fail("unknown limb '" + label + "' for limb set " + limbs.name() + " — use one of " +
               limbs.labelList());
  }
  return *index;
}

std::int64_t frameAt(const JsonIn& value) {
  const std::int64_t frame = value.integer();
  if (frame < 0)
    value.fail("frame " + std::to_string(frame) + " is negative — frames count from 0");
  return frame;
}

std::optional<double> positiveOrNull(const JsonIn& object, std::string_view key) {
  const auto value = object.find(key);
  if (!value) return std::nullopt;
  const double number = value->number();
  if (number <= 0) value->fail("expected a positive number or null");
  return number;
}

// The belt's later speeds (docs/methods.md §12): each from a frame after the previous one, a
// speed of 0 m/s or more, and only after a speed from the start (speed_m_s).
std::vector<model::SpeedStep> readSpeedChanges(const JsonIn& in, bool hasStartSpeed) {
  std::vector<model::SpeedStep> changes;
  for (std::size_t i = 0; i < in.arraySize(); ++i) {
    const JsonIn item = in.at(i);
    const JsonIn frame = item.at("from_frame");
    model::SpeedStep step;
    step.fromFrame = frame.integer();
    if (step.fromFrame <= 0) {
      frame.fail("expected a frame after 0 (the speed from frame 0 is speed_m_s), got " +
                 std::to_string(step.fromFrame));
    }
    if (!changes.empty() && step.fromFrame <= changes.back().fromFrame) {
      frame.fail("frame " + std::to_string(step.fromFrame) + " does not follow frame " +
                 std::to_string(changes.back().fromFrame) +
                 " — list speed changes in ascending frame order");
    }
    const JsonIn speed = item.at("m_s");
    step.ms = speed.number();
    if (!(step.ms >= 0)) speed.fail("expected a speed of 0 m/s or more");
    changes.push_back(step);
  }
  if (!changes.empty() && !hasStartSpeed) {
    in.fail(
        "speed changes without a speed from the start — set trial speed_m_s, or remove the "
        "changes");
  }
  return changes;
}

model::TrialCard readTrial(const JsonIn& in) {
  model::TrialCard trial;
  trial.subject = textOr(in, "subject");
  trial.species = textOr(in, "species");
  trial.condition = textOr(in, "condition");
  trial.observer = textOr(in, "observer");
  trial.examDate = textOr(in, "exam_date");
  if (!trial.examDate.empty() && !model::isCalendarDate(trial.examDate)) {
    in.at("exam_date").fail("expected a calendar date as YYYY-MM-DD (e.g. 2026-03-14), or \"\"");
  }
  trial.notes = textOr(in, "notes");
  trial.speedMs = positiveOrNull(in, "speed_m_s");
  if (const auto changes = in.find("speed_changes"))
    trial.speedChanges = readSpeedChanges(*changes, trial.speedMs.has_value());
  trial.speedSource = textOr(in, "speed_source", "belt");
  if (trial.speedSource != "belt" && trial.speedSource != "ground") {
    in.at("speed_source").fail("expected \"belt\" or \"ground\"");
  }
  trial.legLengthM = positiveOrNull(in, "leg_length_m");
  return trial;
}

model::VideoLink readVideo(const JsonIn& in) {
  model::VideoLink video;
  video.path = in.at("path").text();
  video.signature = textOr(in, "signature");
  if (const auto frames = in.find("frame_count")) {
    video.frameCount = frames->integer();
    if (video.frameCount < 0) frames->fail("expected 0 or more frames");
  }
  if (const auto rate = in.find("file_rate")) video.fileRate = rateAt(*rate);
  return video;
}

void readEvents(const JsonIn& in, model::Annotation& annotation) {
  const std::size_t n = in.arraySize();
  annotation.events.reserve(n);
  for (std::size_t i = 0; i < n; ++i) {
    const JsonIn item = in.at(i);
    model::Event event;
    event.limb = limbAt(item.at("limb"), annotation.limbs);
    const JsonIn word = item.at("event");
    const auto kind = model::parseEventWord(word.text());
    if (!kind) word.fail("unknown event '" + word.text() + "' — use touchdown or liftoff");
    event.kind = *kind;
    event.frame = frameAt(item.at("frame"));
    annotation.events.push_back(event);
  }
}

void readHidden(const JsonIn& in, model::Annotation& annotation) {
  for (std::size_t i = 0; i < in.arraySize(); ++i) {
    const JsonIn item = in.at(i);
    model::HiddenSpan span;
    span.limb = limbAt(item.at("limb"), annotation.limbs);
    span.first = frameAt(item.at("first"));
    span.last = frameAt(item.at("last"));
    if (span.last < span.first) item.at("last").fail("last frame is before the first frame");
    annotation.hidden.push_back(span);
  }
}

void readExcluded(const JsonIn& in, model::Annotation& annotation) {
  for (std::size_t i = 0; i < in.arraySize(); ++i) {
    const JsonIn item = in.at(i);
    annotation.excluded.push_back({frameAt(item.at("start_frame")), item.at("reason").text()});
  }
}

double finiteAt(const JsonIn& value) {
  const double number = value.number();
  if (!std::isfinite(number)) value.fail("expected a finite number");
  return number;
}

void readSeeds(const JsonIn& in, const model::LimbSet& limbs, model::Project& project) {
  for (std::size_t i = 0; i < in.arraySize(); ++i) {
    const JsonIn item = in.at(i);
    model::FootSeed seed;
    seed.limb = limbAt(item.at("limb"), limbs);
    seed.frame = frameAt(item.at("frame"));
    seed.x = finiteAt(item.at("x"));
    seed.y = finiteAt(item.at("y"));
    project.seeds.push_back(seed);
  }
}

void readProposals(const JsonIn& in, const model::LimbSet& limbs, model::Proposals& proposals) {
  const JsonIn events = in.at("events");
  for (std::size_t i = 0; i < events.arraySize(); ++i) {
    const JsonIn item = events.at(i);
    model::ProposedEvent proposal;
    proposal.event.limb = limbAt(item.at("limb"), limbs);
    const JsonIn word = item.at("event");
    const auto kind = model::parseEventWord(word.text());
    if (!kind) word.fail("unknown event '" + word.text() + "' — use touchdown or liftoff");
    proposal.event.kind = *kind;
    proposal.event.frame = frameAt(item.at("frame"));
    const JsonIn confidence = item.at("confidence");
    proposal.confidence = finiteAt(confidence);
    if (proposal.confidence < 0 || proposal.confidence > 1)
      confidence.fail("expected a confidence from 0 to 1");
    proposals.events.push_back(proposal);
  }
  if (const auto hidden = in.find("hidden")) {
    model::Annotation spans;
    spans.limbs = limbs;
    readHidden(*hidden, spans);
    proposals.hidden = std::move(spans.hidden);
  }
  std::sort(proposals.events.begin(), proposals.events.end(),
            [](const auto& a, const auto& b) { return a.event < b.event; });
}

Json seedsJson(const model::Project& project) {
  Json seeds = Json::array();
  for (const auto& seed : project.seeds) {
    seeds.push_back({{"limb", project.annotation.limbs.label(seed.limb)},
                     {"frame", seed.frame},
                     {"x", seed.x},
                     {"y", seed.y}});
  }
  return seeds;
}

Json proposalsJson(const model::Project& project) {
  const model::LimbSet& limbs = project.annotation.limbs;
  Json events = Json::array();
  for (const auto& p : project.proposals.events) {
    events.push_back({{"limb", limbs.label(p.event.limb)},
                      {"event", std::string(model::eventWord(p.event.kind))},
                      {"frame", p.event.frame},
                      {"confidence", p.confidence}});
  }
  Json hidden = Json::array();
  for (const auto& span : project.proposals.hidden)
    hidden.push_back({{"limb", limbs.label(span.limb)}, {"first", span.first}, {"last", span.last}});
  return Json{{"events", std::move(events)}, {"hidden", std::move(hidden)}};
}

model::Project readCurrent(const JsonIn& root) {
  const JsonIn schema = root.at("schema");
  if (schema.text() != kProjectSchema) {
    schema.fail("expected \"" + std::string(kProjectSchema) + "\"");
  }
  model::Project project;
  model::Annotation& annotation = project.annotation;
  const std::string limbSet = root.at("limb_set").text();
  try {
    annotation.limbs = model::LimbSet::fromName(limbSet);
  } catch (const Error& e) {
    root.at("limb_set").fail(e.what());
  }
  annotation.captureRate = rateAt(root.at("capture_rate"));
  const auto reference = root.find("reference_limb");
  annotation.referenceLimb =
      reference ? limbAt(*reference, annotation.limbs) : annotation.limbs.defaultReference();
  if (const auto clip = root.find("clip")) {
    const model::FrameRange range{frameAt(clip->at("first")), frameAt(clip->at("last"))};
    if (range.last < range.first) clip->at("last").fail("last frame is before the first frame");
    annotation.clip = range;
  }
  if (const auto trial = root.find("trial")) project.trial = readTrial(*trial);
  if (const auto video = root.find("video")) project.video = readVideo(*video);
  readEvents(root.at("events"), annotation);
  if (const auto hidden = root.find("hidden")) readHidden(*hidden, annotation);
  if (const auto excluded = root.find("excluded_strides")) readExcluded(*excluded, annotation);
  // Seeds and proposals (optional: files from before proposals have neither).
  if (const auto seeds = root.find("foot_seeds")) readSeeds(*seeds, annotation.limbs, project);
  if (const auto proposals = root.find("proposals"))
    readProposals(*proposals, annotation.limbs, project.proposals);
  annotation.normalize();
  return project;
}

}  // namespace

std::string projectJsonText(const model::Project& project) {
  const model::Annotation& annotation = project.annotation;
  Json events = Json::array();
  std::vector<model::Event> sorted = annotation.events;
  std::sort(sorted.begin(), sorted.end());
  for (const auto& event : sorted) {
    events.push_back({{"limb", annotation.limbs.label(event.limb)},
                      {"event", std::string(model::eventWord(event.kind))},
                      {"frame", event.frame}});
  }
  Json hidden = Json::array();
  for (const auto& span : annotation.hidden) {
    hidden.push_back(
        {{"limb", annotation.limbs.label(span.limb)}, {"first", span.first}, {"last", span.last}});
  }
  Json document{{"schema", std::string(kProjectSchema)},
                {"schema_version", model::Project::kSchemaVersion},
                {"limb_set", annotation.limbs.name()},
                {"reference_limb", annotation.limbs.label(annotation.referenceLimb)},
                {"capture_rate", toString(annotation.captureRate)},
                {"clip", annotation.clip ? Json{{"first", annotation.clip->first},
                                                {"last", annotation.clip->last}}
                                         : Json(nullptr)},
                {"trial", trialJson(project.trial)},
                {"video", videoJson(project.video)},
                {"events", std::move(events)},
                {"hidden", std::move(hidden)}};
  // Strides a person left out of the statistics (optional: older files have none).
  if (!annotation.excluded.empty()) {
    Json excluded = Json::array();
    for (const auto& x : annotation.excluded)
      excluded.push_back({{"start_frame", x.startFrame}, {"reason", x.reason}});
    document["excluded_strides"] = std::move(excluded);
  }
  if (!project.seeds.empty()) document["foot_seeds"] = seedsJson(project);
  if (!project.proposals.events.empty() || !project.proposals.hidden.empty())
    document["proposals"] = proposalsJson(project);
  return document.dump(1) + "\n";
}

void writeProjectFile(const std::filesystem::path& path, const model::Project& project) {
  writeFileAtomically(path, projectJsonText(project));
}

model::Project parseProjectJson(std::string_view text, std::string_view fileName) {
  nlohmann::json document = parseJsonText(text, fileName);
  int version = projectSchemaVersion(document, fileName);
  const auto& steps = projectMigrations();
  while (version < model::Project::kSchemaVersion) {
    steps.at(static_cast<std::size_t>(version))(document, fileName);
    ++version;
  }
  return readCurrent(JsonIn(document, fileName));
}

model::Project readProjectFile(const std::filesystem::path& path) {
  const std::string text = readWholeFile(path);
  return parseProjectJson(text, path.string());
}

}  // namespace stridemark::formats
