#pragma once
// The report JSON, schema stridemark.report.v1, exactly as DESIGN §5. Numbers that are
// undefined (NaN in analysis::Report) are written as null.
//
// Additions beyond DESIGN §5 live under one top-level key, "extra":
//   caution, fps_exact (rational text), phase.<limb>.{angular_deviation, rayleigh_z},
//   hildebrand.quadrant, support_by_combination, symmetry.stride_s, symmetry.ratio.<measure>,
//   speed.dimensionless_speed, transitions[{from_gait, to_gait, frame, stride}],
//   strides[i].{quadrant, hind_duty_factor, limb_phase, dap_ms, dap_percent, ipsilateral_lag,
//   wave_direction, fore_lag, hind_lag, pair_lag, template_distance} (parallel to "strides";
//   a key is present only when the value is defined).
#include <filesystem>
#include <memory>
#include <span>
#include <string>
#include <string_view>

#include "analysis/analyse.h"
#include "analysis/report.h"
#include "common/caution.h"
#include "formats/json_out.h"
#include "model/annotation.h"

namespace stridemark::formats {

inline constexpr std::string_view kReportSchema = "stridemark.report.v1";

void writeReportJson(const analysis::Report& report, JsonOut& out);
std::string reportJsonText(const analysis::Report& report);
// Atomic: a failed write leaves an existing file unchanged.
void writeReportJsonFile(const std::filesystem::path& path, const analysis::Report& report);

// Writes the report while analysis::analyseStreaming builds it: each stride is written as it
// is built, so the strides never all sit in memory (about 80 MB per 10^6 events). The bytes are
// the ones writeReportJson writes for the same report. Only the extra.strides elements wait, as
// text (about 100 bytes a stride), for the end of the report.
class ReportJsonStream final : public analysis::StrideConsumer {
 public:
  explicit ReportJsonStream(JsonOut& out);
  ~ReportJsonStream() override;
  ReportJsonStream(const ReportJsonStream&) = delete;
  ReportJsonStream& operator=(const ReportJsonStream&) = delete;

  void begin(const analysis::Report& head) override;
  void consume(std::span<const analysis::StrideRecord> strides) override;
  // Writes everything after the strides from the report analyseStreaming returned.
  void finish(const analysis::Report& report);

 private:
  struct Pending;
  JsonOut& out_;
  std::unique_ptr<Pending> pending_;
};

// Scores `project` and writes its report to `out` in one pass; returns the report without its
// strides (see analysis::analyseStreaming). Takes the project by value: move it in and its
// events are freed as soon as they are read.
analysis::Report scoreToReportJson(JsonOut& out, model::Project project,
                                   const analysis::AnalysisOptions& options);
// Same, into a file, atomically: on any failure an existing file is left unchanged.
analysis::Report scoreToReportJsonFile(const std::filesystem::path& path, model::Project project,
                                       const analysis::AnalysisOptions& options);

// Reader (tests, later export). Per-limb cycles are not part of the JSON and stay empty.
analysis::Report parseReportJson(std::string_view text, std::string_view fileName);
analysis::Report readReportJsonFile(const std::filesystem::path& path);

}  // namespace stridemark::formats
