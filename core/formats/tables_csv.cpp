#include "formats/tables_csv.h"

#include <algorithm>
#include <cmath>

#include "common/error.h"
#include "formats/file_io.h"
#include "formats/report_json.h"
#include "formats/text_scan.h"
#include "stridemark/version.h"

namespace stridemark::formats {
namespace {

using analysis::Report;

// Builds CSV text row by row; strings are quoted only when they must be.
class CsvText {
 public:
  CsvText(std::string_view title, const TableSource& source, Rational fps) {
    text_ += "# stridemark ";
    text_ += kVersion;
    text_ += " - ";
    text_ += title;
    text_ += "\n# input: " + source.input + "\n";
    if (fps.valid()) text_ += "# capture_rate_fps: " + toString(fps) + "\n";
    text_ += "# ";
    text_ += kCaution;
    text_ += "\n";
  }
  void note(std::string_view line) {
    text_ += "# ";
    text_ += line;
    text_ += '\n';
  }
  void header(std::initializer_list<std::string_view> names) {
    for (const auto name : names) cell(name);
    endRow();
  }
  void cell(std::string_view value) {
    separate();
    if (value.find_first_of(",\"\n\r") == std::string_view::npos) {
      text_ += value;
      return;
    }
    text_ += '"';
    for (const char c : value) {
      if (c == '"') text_ += '"';
      text_ += c;
    }
    text_ += '"';
  }
  void optionalText(const std::optional<std::string>& value) {
    if (value) {
      cell(std::string_view(*value));
    } else {
      empty();
    }
  }
  void cell(double value) {
    separate();
    if (std::isfinite(value)) text::appendDouble(text_, value);
  }
  void cell(const std::optional<double>& value) { cell(value.value_or(analysis::kUndefined)); }
  void integer(long long value) {
    separate();
    text::appendInt(text_, value);
  }
  void boolean(bool value) { cell(std::string_view(value ? "true" : "false")); }
  void empty() { separate(); }
  void endRow() {
    text_ += '\n';
    rowStart_ = true;
  }
  std::string take() { return std::move(text_); }

 private:
  void separate() {
    if (!rowStart_) text_ += ',';
    rowStart_ = false;
  }
  std::string text_;
  bool rowStart_ = true;
};

template <typename Values>
const auto* elementOrNull(const Values& values, int index) {
  const auto i = static_cast<std::size_t>(index);
  return i < values.size() ? &values[i] : nullptr;
}

}  // namespace

std::string eventsTable(const model::Annotation& annotation, const TableSource& source) {
  CsvText csv("events (one row per tag)", source, annotation.captureRate);
  csv.header({"limb", "event", "frame", "time_s"});
  std::vector<model::Event> events = annotation.events;
  std::sort(events.begin(), events.end(), [](const model::Event& a, const model::Event& b) {
    return a.frame != b.frame ? a.frame < b.frame : a < b;
  });
  for (const auto& event : events) {
    csv.cell(annotation.limbs.label(event.limb));
    csv.cell(model::eventWord(event.kind));
    csv.integer(event.frame);
    csv.cell(framesToSeconds(event.frame, annotation.captureRate));
    csv.endRow();
  }
  return csv.take();
}

std::string stridesTable(const Report& report, const TableSource& source) {
  CsvText csv("strides (one row per reference stride x limb)", source, report.fps);
  csv.note("reference limb: " + report.limbs.label(report.referenceLimb) +
           "; phase_cycles = share of the reference stride from its touchdown to the limb's "
           "touchdown; dap > 0 when the hind foot lands first");
  csv.header({"stride",
              "start_frame",
              "end_frame",
              "duration_s",
              "limb",
              "duty_factor",
              "phase_cycles",
              "gait",
              "band",
              "quadrant",
              "sequence",
              "lead",
              "symmetrical",
              "aerial",
              "hind_duty_factor",
              "limb_phase_cycles",
              "dap_ms",
              "dap_percent",
              "ipsilateral_lag_cycles",
              "wave_direction"});
  for (std::size_t k = 0; k < report.strides.size(); ++k) {
    const auto& stride = report.strides[k];
    for (int limb = 0; limb < report.limbs.size(); ++limb) {
      csv.integer(static_cast<long long>(k));
      csv.integer(stride.startFrame);
      csv.integer(stride.endFrame);
      csv.cell(stride.durationS);
      csv.cell(report.limbs.label(limb));
      const auto* duty = elementOrNull(stride.dutyFactor, limb);
      csv.cell(duty ? *duty : std::nullopt);
      const auto* phase = elementOrNull(stride.phase, limb);
      csv.cell(phase ? *phase : std::nullopt);
      csv.cell(std::string_view(stride.gait));
      csv.optionalText(stride.band);
      csv.optionalText(stride.quadrant);
      csv.optionalText(stride.sequence);
      csv.optionalText(stride.lead);
      csv.boolean(stride.symmetrical);
      csv.boolean(stride.aerial);
      csv.cell(stride.hindDutyFactor);
      csv.cell(stride.limbPhase);
      csv.cell(stride.dapMs);
      csv.cell(stride.dapPercent);
      csv.cell(stride.ipsilateralLag);
      csv.optionalText(stride.waveDirection);
      csv.endRow();
    }
  }
  return csv.take();
}

std::string limbsTable(const Report& report, const TableSource& source) {
  CsvText csv("per-limb summaries (one row per limb x measure; sd is the sample SD)", source,
              report.fps);
  csv.header({"limb", "strides", "measure", "n", "mean", "sd", "cv"});
  for (int limb = 0; limb < report.limbs.size(); ++limb) {
    const auto* summary = elementOrNull(report.limbSummary, limb);
    if (!summary) continue;
    const std::pair<std::string_view, const analysis::Stat*> measures[] = {
        {"stride_s", &summary->strideS},
        {"stance_s", &summary->stanceS},
        {"swing_s", &summary->swingS},
        {"duty_factor", &summary->dutyFactor}};
    for (const auto& [name, stat] : measures) {
      csv.cell(report.limbs.label(limb));
      csv.integer(summary->strides);
      csv.cell(name);
      csv.integer(stat->n);
      csv.cell(stat->mean);
      csv.cell(stat->sd);
      csv.cell(stat->cv);
      csv.endRow();
    }
  }
  return csv.take();
}

std::string phasesTable(const Report& report, const TableSource& source) {
  CsvText csv("relative phase to the reference limb, circular statistics (cycles)", source,
              report.fps);
  csv.note("reference limb: " + report.limbs.label(report.referenceLimb) +
           "; rayleigh_p uses Zar's approximation");
  csv.header({"limb", "n", "mean_cycles", "r", "circ_sd_cycles", "angular_deviation_cycles",
              "rayleigh_z", "rayleigh_p"});
  for (int limb = 0; limb < report.limbs.size(); ++limb) {
    const auto* phase = elementOrNull(report.phase, limb);
    if (!phase) continue;
    csv.cell(report.limbs.label(limb));
    csv.integer(phase->n);
    csv.cell(phase->mean);
    csv.cell(phase->r);
    csv.cell(phase->circSd);
    csv.cell(phase->angularDeviation);
    csv.cell(phase->rayleighZ);
    csv.cell(phase->rayleighP);
    csv.endRow();
  }
  return csv.take();
}

std::string supportTable(const Report& report, const TableSource& source) {
  CsvText csv("support patterns (share of scored time)", source, report.fps);
  csv.header({"pattern_kind", "pattern", "limbs_in_stance", "share"});
  for (std::size_t k = 0; k < report.support.size(); ++k) {
    csv.cell(std::string_view("count"));
    csv.cell(std::to_string(k) + " limbs");
    csv.integer(static_cast<long long>(k));
    csv.cell(report.support[k]);
    csv.endRow();
  }
  for (const auto& [name, share] : report.supportByCombination) {
    csv.cell(std::string_view("combination"));
    csv.cell(std::string_view(name));
    csv.empty();
    csv.cell(share);
    csv.endRow();
  }
  return csv.take();
}

std::string boutsTable(const Report& report, const TableSource& source) {
  CsvText csv("bouts of consecutive same-gait strides", source, report.fps);
  csv.header({"bout", "gait", "first_stride", "last_stride", "strides", "start_frame", "end_frame",
              "duration_s"});
  for (std::size_t i = 0; i < report.bouts.size(); ++i) {
    const auto& bout = report.bouts[i];
    csv.integer(static_cast<long long>(i));
    csv.cell(std::string_view(bout.gait));
    csv.integer(bout.firstStride);
    csv.integer(bout.lastStride);
    csv.integer(bout.lastStride - bout.firstStride + 1);
    csv.integer(bout.startFrame);
    csv.integer(bout.endFrame);
    csv.cell(framesToSeconds(bout.endFrame - bout.startFrame, report.fps));
    csv.endRow();
  }
  return csv.take();
}

std::string symmetryTable(const Report& report, const TableSource& source) {
  CsvText csv("left/right symmetry (Robinson index, % ; positive = right larger)", source,
              report.fps);
  csv.header({"measure", "pair", "symmetry_index_percent", "ratio_right_left"});
  for (const analysis::SymmetryMeasure& measure : analysis::kSymmetryMeasures) {
    const analysis::SymmetryValues& values = report.symmetry.*measure.values;
    for (const auto& [pair, si] : values.si) {
      csv.cell(std::string_view(measure.key));
      csv.cell(std::string_view(pair));
      csv.cell(si);
      const auto ratio = values.ratio.find(pair);
      csv.cell(ratio != values.ratio.end() ? ratio->second : analysis::kUndefined);
      csv.endRow();
    }
  }
  return csv.take();
}

std::vector<std::filesystem::path> writeTables(const std::filesystem::path& folder,
                                               const model::Annotation& annotation,
                                               const Report& report, const TableSource& source) {
  std::error_code ec;
  std::filesystem::create_directories(folder, ec);
  if (ec || !std::filesystem::is_directory(folder)) {
    throw Error(ErrorCategory::io, folder.string() + ": cannot create the table folder (" +
                                       (ec ? ec.message() : std::string("not a folder")) +
                                       ") — choose another --csv folder");
  }
  const std::pair<const char*, std::string> tables[] = {
      {"events.csv", eventsTable(annotation, source)},
      {"strides.csv", stridesTable(report, source)},
      {"limbs.csv", limbsTable(report, source)},
      {"phases.csv", phasesTable(report, source)},
      {"support.csv", supportTable(report, source)},
      {"bouts.csv", boutsTable(report, source)},
      {"symmetry.csv", symmetryTable(report, source)}};
  std::vector<std::filesystem::path> written;
  for (const auto& [name, text] : tables) {
    written.push_back(folder / name);
    writeFileAtomically(written.back(), text, Durability::regenerable);
  }
  return written;
}

}  // namespace stridemark::formats
