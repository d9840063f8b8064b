#pragma once
// The project file: one JSON document holding a whole model::Project (limb set, reference limb,
// capture rate as exact rational text, events, hidden spans, trial card, video link).
//
//   { "schema": "stridemark.project.v1", "schema_version": 1, "limb_set": "quadruped",
//     "reference_limb": "LH", "capture_rate": "240", "clip": null | {"first","last"},
//     "trial": {...}, "video": null | {...}, "events": [{"limb","event","frame"}...],
//     "hidden": [{"limb","first","last"}...] }
//
// The trial card's belt speed is "speed_m_s" from the start plus optional "speed_changes":
// [{"from_frame": F, "m_s": V}...] (docs/methods.md §12); files without the key still read.
//
// Older layouts are brought up to date one version at a time by projectMigrations(). Saves are
// atomic (write a temporary file beside the target, fsync, rename over).
#include <filesystem>
#include <string>
#include <string_view>
#include <vector>

#include <nlohmann/json.hpp>

#include "model/annotation.h"

namespace stridemark::formats {

inline constexpr std::string_view kProjectSchema = "stridemark.project.v1";
// Our own extension for project files.
inline constexpr std::string_view kProjectExtension = ".stridemark";

std::string projectJsonText(const model::Project& project);
void writeProjectFile(const std::filesystem::path& path, const model::Project& project);

// Errors name the file and the JSON path of the bad value. Older schema versions are migrated.
model::Project parseProjectJson(std::string_view text, std::string_view fileName);
model::Project readProjectFile(const std::filesystem::path& path);

// The migration hook: step n turns a document of schema_version n into n + 1, in place.
// Version 0 is the pre-release layout (see project_migrations.cpp); no released build wrote it.
using ProjectMigration = void (*)(nlohmann::json& document, std::string_view fileName);
const std::vector<ProjectMigration>& projectMigrations();

// The schema version a parsed document declares (0 for the pre-release layout).
int projectSchemaVersion(const nlohmann::json& document, std::string_view fileName);

}  // namespace stridemark::formats
