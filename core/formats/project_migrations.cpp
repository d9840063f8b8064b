// Project schema migrations. Each step is small, pure and tested with a hand-written fixture.
//
// Version 0, the pre-release layout, was defined while the project format was being designed
// (no released build writes it); it exists so the migration path is exercised from day one:
//   { "format": "stridemark-project", "version": 0, "limbs": "quadruped", "fps": 240,
//     "reference": "LH", "tags": [["LH", "td", 12], ["LH", "lo", 80]],
//     "subject": "...", "species": "...", "observer": "...", "notes": "...", "video": "clip.mp4" }
#include <array>

#include "common/error.h"
#include "formats/json_in.h"
#include "formats/project_file.h"

namespace stridemark::formats {
namespace {

// Each JsonIn message names the file and place already; only the rate and limb-set parsers'
// messages need them added.
std::string rateText(const JsonIn& fps) {
  if (fps.raw().is_string()) {
    const std::string text = fps.text();
    try {
      return toString(parseRate(text, "capture rate"));
    } catch (const Error& e) {
      fps.fail(e.what());
    }
  }
  const double value = fps.number();
  if (fps.raw().is_number_integer() && value > 0) return std::to_string(fps.integer());
  const Rational rate = rationalFromDouble(value);
  if (!rate.valid()) fps.fail("expected a positive capture rate");
  return toString(rate);
}

model::LimbSet limbSetAt(const JsonIn& name) {
  const std::string text = name.text();
  try {
    return model::LimbSet::fromName(text);
  } catch (const Error& e) {
    name.fail(e.what());
  }
}

std::string eventWordFromV0(const JsonIn& word) {
  const std::string text = word.text();
  if (text == "td") return "touchdown";
  if (text == "lo") return "liftoff";
  word.fail("unknown tag '" + text + "' — version 0 files use td or lo");
}

void migrateV0toV1(nlohmann::json& document, std::string_view fileName) {
  const JsonIn old(document, fileName);
  nlohmann::json next = nlohmann::json::object();
  next["schema"] = std::string(kProjectSchema);
  next["schema_version"] = 1;
  next["limb_set"] = old.at("limbs").text();
  next["capture_rate"] = rateText(old.at("fps"));
  if (const auto reference = old.find("reference")) next["reference_limb"] = reference->text();
  next["clip"] = nullptr;
  nlohmann::json trial = nlohmann::json::object();
  for (const char* key : {"subject", "species", "observer", "notes"}) {
    if (const auto value = old.find(key)) trial[key] = value->text();
  }
  next["trial"] = trial;
  next["video"] = nullptr;
  if (const auto video = old.find("video")) {
    next["video"] = {
        {"path", video->text()}, {"signature", ""}, {"frame_count", 0}, {"file_rate", nullptr}};
  }
  // Tags are checked here so that errors name their place in the old file (/tags/N/...).
  const model::LimbSet limbs = limbSetAt(old.at("limbs"));
  nlohmann::json events = nlohmann::json::array();
  const JsonIn tags = old.at("tags");
  for (std::size_t i = 0; i < tags.arraySize(); ++i) {
    const JsonIn tag = tags.at(i);
    if (tag.arraySize() != 3) tag.fail("expected [limb, td|lo, frame]");
    const std::string label = tag.at(0).text();
    if (!limbs.indexOf(label)) {
      tag.at(0).fail("unknown limb '" + label + "' for limb set " + limbs.name() +
                     " — use one of " + limbs.labelList());
    }
    const std::int64_t frame = tag.at(2).integer();
    if (frame < 0) tag.at(2).fail("frame " + std::to_string(frame) + " is negative");
    events.push_back({{"limb", label}, {"event", eventWordFromV0(tag.at(1))}, {"frame", frame}});
  }
  next["events"] = std::move(events);
  next["hidden"] = nlohmann::json::array();
  document = std::move(next);
}

}  // namespace

const std::vector<ProjectMigration>& projectMigrations() {
  static const std::vector<ProjectMigration> steps = {&migrateV0toV1};
  static_assert(model::Project::kSchemaVersion == 1,
                "add a migration step when the project schema version changes");
  return steps;
}

int projectSchemaVersion(const nlohmann::json& document, std::string_view fileName) {
  const JsonIn root(document, fileName);
  if (!document.is_object()) root.fail("expected a JSON object — this is not a Stridemark project");
  if (const auto version = root.find("schema_version")) {
    const std::int64_t value = version->integer();
    if (value > model::Project::kSchemaVersion) {
      version->fail("schema_version " + std::to_string(value) +
                    " is newer than this build reads (up to " +
                    std::to_string(model::Project::kSchemaVersion) + ") — update Stridemark");
    }
    if (value < 1) version->fail("schema_version must be 1 or more");
    return static_cast<int>(value);
  }
  const auto format = root.find("format");
  if (format && format->raw() == "stridemark-project") {
    const JsonIn version = root.at("version");
    if (version.integer() != 0) version.fail("expected 0 in a pre-release project file");
    return 0;
  }
  root.fail("no schema_version — this is not a Stridemark project file");
}

}  // namespace stridemark::formats
