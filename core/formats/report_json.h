#pragma once
// The report JSON, schema stridemark.report.v1, as listed in CHANGELOG.md. Numbers that are
// undefined (NaN in analysis::Report) are written as null.
//
// Additions beyond that list live under one top-level key, "extra":
//   caution, fps_exact (rational text), phase.<limb>.{angular_deviation, rayleigh_z},
//   hildebrand.quadrant, support_by_combination, symmetry.stride_s, symmetry.ratio.<measure>,
//   speed.dimensionless_speed, transitions[{from_gait, to_gait, frame, stride}],
//   strides[i].{quadrant, hind_duty_factor, limb_phase, dap_ms, dap_percent, ipsilateral_lag,
//   wave_direction, fore_lag, hind_lag, pair_lag, template_distance} (parallel to "strides";
//   a key is present only when the value is defined).
#include <filesystem>
#include <string>
#include <string_view>

#include "analysis/report.h"
#include "common/caution.h"

namespace stridemark::formats {

inline constexpr std::string_view kReportSchema = "stridemark.report.v1";
// The sign convention of diagonal advanced placement, written beside every DAP figure.
inline constexpr std::string_view kDapConvention =
    "fore touchdown minus hind touchdown of each diagonal (LH-RF, RH-LF), in ms at the capture "
    "rate and in % of the stride; positive = the hind limb lands first";

std::string reportJsonText(const analysis::Report& report);
// Atomic: a failed write leaves an existing file unchanged.
void writeReportJsonFile(const std::filesystem::path& path, const analysis::Report& report);

// Reader (tests, later export). Per-limb cycles are not part of the JSON and stay empty.
analysis::Report parseReportJson(std::string_view text, std::string_view fileName);
analysis::Report readReportJsonFile(const std::filesystem::path& path);

}  // namespace stridemark::formats
