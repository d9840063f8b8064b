#include "formats/tables_csv.h"

#include <algorithm>
#include <cmath>
#include <fstream>
#include <tuple>

#include "analysis/summary.h"
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
  // A row index, empty when negative (none).
  void index(int value) {
    if (value < 0) {
      empty();
    } else {
      integer(value);
    }
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

// The sets of strides a summary row describes (docs/methods.md §11), in table order: the
// pooled trial, each gait over all its bouts, each bout.
struct Scope {
  std::string_view scope;  // "trial", "gait", "bout"
  std::string_view gait;   // empty for a single-gait trial, "mixed" for a trial of several
  int bout = -1;           // row of bouts.csv for scope "bout"
  const analysis::Summary* summary = nullptr;
};

// File names in table order (allTables).
constexpr std::string_view kTableFileNames[] = {"events.csv",   "strides.csv", "limbs.csv",
                                                "phases.csv",   "support.csv", "bouts.csv",
                                                "symmetry.csv", "dap.csv"};

constexpr std::string_view kScopeNote =
    "scope trial = the pooled trial (gait \"mixed\" when it has bouts of more than one gait), "
    "gait = all bouts of that gait, bout = one bout (bout = its row in bouts.csv)";

class Scopes {
 public:
  explicit Scopes(const Report& report) : trial_(analysis::trialSummary(report)) {
    all_.push_back({"trial", report.mixedGaits ? "mixed" : "", -1, &trial_});
    for (const auto& [gait, summary] : report.byGait) all_.push_back({"gait", gait, -1, &summary});
    for (std::size_t i = 0; i < report.bouts.size(); ++i) {
      const analysis::Bout& bout = report.bouts[i];
      all_.push_back({"bout", bout.gait, static_cast<int>(i), &bout.summary});
    }
  }
  Scopes(const Scopes&) = delete;
  Scopes& operator=(const Scopes&) = delete;
  const std::vector<Scope>& all() const { return all_; }

 private:
  analysis::Summary trial_;
  std::vector<Scope> all_;
};

void scopeCells(CsvText& csv, const Scope& scope) {
  csv.cell(scope.scope);
  csv.cell(scope.gait);
  csv.index(scope.bout);
}

}  // namespace

std::string eventsTable(const model::Annotation& annotation, const TableSource& source) {
  CsvText csv("events (one row per tag)", source, annotation.captureRate);
  // The events CSV's own header comments, so `score` reads this table back (events_csv.h).
  csv.note("limbs: " + annotation.limbs.name());
  csv.note("reference: " + annotation.limbs.label(annotation.referenceLimb));
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
           "touchdown; bout = row of bouts.csv, empty when the stride is in none; steady = "
           "false when a limb's cycle differs from the stride by more than the tolerance; "
           "note says why a stride is unclassified or left out of the summaries");
  csv.note(std::string("dap: ") + std::string(kDapConvention) +
           "; dap_ms and dap_percent are the mean of the two diagonals");
  csv.header({"stride",
              "start_frame",
              "end_frame",
              "duration_s",
              "limb",
              "duty_factor",
              "phase_cycles",
              "gait",
              "bout",
              "band",
              "quadrant",
              "sequence",
              "lead",
              "hind_lead",
              "symmetrical",
              "steady",
              "complete",
              "aerial",
              "hind_duty_factor",
              "limb_phase_cycles",
              "dap_ms",
              "dap_percent",
              "dap_lh_rf_ms",
              "dap_rh_lf_ms",
              "dap_lh_rf_percent",
              "dap_rh_lf_percent",
              "ipsilateral_lag_cycles",
              "wave_direction",
              "note"});
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
      csv.index(stride.bout);
      csv.optionalText(stride.band);
      csv.optionalText(stride.quadrant);
      csv.optionalText(stride.sequence);
      csv.optionalText(stride.lead);
      csv.optionalText(stride.hindLead);
      csv.boolean(stride.symmetrical);
      csv.boolean(stride.steady);
      csv.boolean(stride.complete);
      csv.boolean(stride.aerial);
      csv.cell(stride.hindDutyFactor);
      csv.cell(stride.limbPhase);
      csv.cell(stride.dapMs);
      csv.cell(stride.dapPercent);
      csv.cell(stride.dapLhRfMs);
      csv.cell(stride.dapRhLfMs);
      csv.cell(stride.dapLhRfPercent);
      csv.cell(stride.dapRhLfPercent);
      csv.cell(stride.ipsilateralLag);
      csv.optionalText(stride.waveDirection);
      csv.optionalText(stride.note);
      csv.endRow();
    }
  }
  return csv.take();
}

std::string limbsTable(const Report& report, const TableSource& source) {
  CsvText csv("per-limb summaries (one row per scope x limb x measure; sd is the sample SD)",
              source, report.fps);
  csv.note(kScopeNote);
  csv.header({"scope", "gait", "bout", "limb", "strides", "measure", "n", "mean", "sd", "cv"});
  const Scopes scopes(report);
  for (const Scope& scope : scopes.all()) {
    for (int limb = 0; limb < report.limbs.size(); ++limb) {
      const auto* summary = elementOrNull(scope.summary->limbs, limb);
      if (!summary) continue;
      const std::pair<std::string_view, const analysis::Stat*> measures[] = {
          {"stride_s", &summary->strideS},
          {"stance_s", &summary->stanceS},
          {"swing_s", &summary->swingS},
          {"duty_factor", &summary->dutyFactor}};
      for (const auto& [name, stat] : measures) {
        scopeCells(csv, scope);
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
  }
  return csv.take();
}

std::string phasesTable(const Report& report, const TableSource& source) {
  CsvText csv("relative phase to the reference limb, circular statistics (cycles)", source,
              report.fps);
  csv.note("reference limb: " + report.limbs.label(report.referenceLimb) +
           "; rayleigh_p uses Zar's approximation");
  csv.note(kScopeNote);
  csv.header({"scope", "gait", "bout", "limb", "n", "mean_cycles", "r", "circ_sd_cycles",
              "angular_deviation_cycles", "rayleigh_z", "rayleigh_p"});
  const Scopes scopes(report);
  for (const Scope& scope : scopes.all()) {
    for (int limb = 0; limb < report.limbs.size(); ++limb) {
      const auto* phase = elementOrNull(scope.summary->phase, limb);
      if (!phase) continue;
      scopeCells(csv, scope);
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
  }
  return csv.take();
}

std::string supportTable(const Report& report, const TableSource& source) {
  CsvText csv("support patterns (share of the scope's stride time)", source, report.fps);
  csv.note(kScopeNote);
  csv.header({"scope", "gait", "bout", "pattern_kind", "pattern", "limbs_in_stance", "share"});
  const Scopes scopes(report);
  for (const Scope& scope : scopes.all()) {
    const std::vector<double>& support = scope.summary->support;
    for (std::size_t k = 0; k < support.size(); ++k) {
      scopeCells(csv, scope);
      csv.cell(std::string_view("count"));
      csv.cell(std::to_string(k) + " limbs");
      csv.integer(static_cast<long long>(k));
      csv.cell(support[k]);
      csv.endRow();
    }
    for (const auto& [name, share] : scope.summary->supportByCombination) {
      scopeCells(csv, scope);
      csv.cell(std::string_view("combination"));
      csv.cell(std::string_view(name));
      csv.empty();
      csv.cell(share);
      csv.endRow();
    }
  }
  return csv.take();
}

std::string boutsTable(const Report& report, const TableSource& source) {
  CsvText csv("bouts of consecutive same-gait strides", source, report.fps);
  csv.note(
      "strides = strides in the bout; summarised_strides = its steady, classified strides, "
      "which every figure after them describes; reference_stride_s = mean stride time of the "
      "reference limb " +
      report.limbs.label(report.referenceLimb) +
      "; speed_m_s = the speed over the bout's strides, weighted by time");
  csv.note(std::string("dap: ") + std::string(kDapConvention) +
           "; dap_mean_ms = mean of the two diagonals' means, dap_difference_ms = LH-RF mean "
           "minus RH-LF mean");
  csv.header({"bout", "gait", "first_stride", "last_stride", "strides", "start_frame", "end_frame",
              "duration_s", "summarised_strides", "reference_stride_s", "hind_duty_factor",
              "limb_phase_cycles", "band", "speed_m_s", "stride_length_m", "relative_stride_length",
              "froude", "dap_mean_ms", "dap_difference_ms"});
  for (std::size_t i = 0; i < report.bouts.size(); ++i) {
    const auto& bout = report.bouts[i];
    const analysis::Summary& summary = bout.summary;
    csv.integer(static_cast<long long>(i));
    csv.cell(std::string_view(bout.gait));
    csv.integer(bout.firstStride);
    csv.integer(bout.lastStride);
    csv.integer(bout.lastStride - bout.firstStride + 1);
    csv.integer(bout.startFrame);
    csv.integer(bout.endFrame);
    csv.cell(framesToSeconds(bout.endFrame - bout.startFrame, report.fps));
    csv.integer(summary.strides);
    const auto* reference = elementOrNull(summary.limbs, report.referenceLimb);
    csv.cell(reference ? reference->strideS.mean : analysis::kUndefined);
    const auto& hildebrand = summary.hildebrand;
    csv.cell(hildebrand ? hildebrand->dutyFactor : analysis::kUndefined);
    csv.cell(hildebrand ? hildebrand->limbPhase : analysis::kUndefined);
    if (hildebrand && !hildebrand->band.empty()) {
      csv.cell(std::string_view(hildebrand->band));
    } else {
      csv.empty();
    }
    const auto& speed = summary.speed;
    csv.cell(speed ? speed->ms : analysis::kUndefined);
    csv.cell(speed ? speed->strideLengthM : analysis::kUndefined);
    csv.cell(speed ? speed->relativeStrideLength : std::nullopt);
    csv.cell(speed ? speed->froude : std::nullopt);
    csv.cell(summary.dap ? summary.dap->meanMs : analysis::kUndefined);
    csv.cell(summary.dap ? summary.dap->differenceMs : analysis::kUndefined);
    csv.endRow();
  }
  return csv.take();
}

std::string symmetryTable(const Report& report, const TableSource& source) {
  CsvText csv("left/right symmetry (Robinson index, % ; positive = right larger)", source,
              report.fps);
  csv.note(kScopeNote);
  csv.header(
      {"scope", "gait", "bout", "measure", "pair", "symmetry_index_percent", "ratio_right_left"});
  const Scopes scopes(report);
  for (const Scope& scope : scopes.all()) {
    for (const analysis::SymmetryMeasure& measure : analysis::kSymmetryMeasures) {
      const analysis::SymmetryValues& values = scope.summary->symmetry.*measure.values;
      for (const auto& [pair, si] : values.si) {
        scopeCells(csv, scope);
        csv.cell(std::string_view(measure.key));
        csv.cell(std::string_view(pair));
        csv.cell(si);
        const auto ratio = values.ratio.find(pair);
        csv.cell(ratio != values.ratio.end() ? ratio->second : analysis::kUndefined);
        csv.endRow();
      }
    }
  }
  return csv.take();
}

std::string dapTable(const Report& report, const TableSource& source) {
  CsvText csv("diagonal advanced placement per diagonal (trot strides of quadrupeds)", source,
              report.fps);
  csv.note(std::string("sign convention: ") + std::string(kDapConvention));
  csv.note(
      "diagonal mean = mean of the two diagonals' mean_ms, difference = LH-RF mean_ms minus "
      "RH-LF mean_ms (their n, sd and percent cells are empty)");
  csv.note(kScopeNote);
  csv.header(
      {"scope", "gait", "bout", "diagonal", "n", "mean_ms", "sd_ms", "mean_percent", "sd_percent"});
  const Scopes scopes(report);
  for (const Scope& scope : scopes.all()) {
    if (!scope.summary->dap) continue;
    const analysis::DapSummary& dap = *scope.summary->dap;
    const std::tuple<std::string_view, const analysis::Stat*, const analysis::Stat*> diagonals[] = {
        {"LH-RF", &dap.lhRfMs, &dap.lhRfPercent}, {"RH-LF", &dap.rhLfMs, &dap.rhLfPercent}};
    for (const auto& [name, ms, percent] : diagonals) {
      scopeCells(csv, scope);
      csv.cell(name);
      csv.integer(ms->n);
      csv.cell(ms->mean);
      csv.cell(ms->sd);
      csv.cell(percent->mean);
      csv.cell(percent->sd);
      csv.endRow();
    }
    const std::pair<std::string_view, double> combined[] = {{"mean", dap.meanMs},
                                                            {"difference", dap.differenceMs}};
    for (const auto& [name, value] : combined) {
      scopeCells(csv, scope);
      csv.cell(name);
      csv.empty();
      csv.cell(value);
      csv.empty();
      csv.empty();
      csv.empty();
      csv.endRow();
    }
  }
  return csv.take();
}

std::vector<NamedTable> allTables(const model::Annotation& annotation, const Report& report,
                                  const TableSource& source) {
  const auto& names = kTableFileNames;
  return {{std::string(names[0]), eventsTable(annotation, source)},
          {std::string(names[1]), stridesTable(report, source)},
          {std::string(names[2]), limbsTable(report, source)},
          {std::string(names[3]), phasesTable(report, source)},
          {std::string(names[4]), supportTable(report, source)},
          {std::string(names[5]), boutsTable(report, source)},
          {std::string(names[6]), symmetryTable(report, source)},
          {std::string(names[7]), dapTable(report, source)}};
}

std::vector<std::string_view> allTableNames() {
  return {std::begin(kTableFileNames), std::end(kTableFileNames)};
}

bool isStridemarkTable(std::string_view firstLine) {
  constexpr std::string_view kOpening = "# stridemark ";
  if (firstLine.substr(0, kOpening.size()) != kOpening) return false;
  const std::string_view rest = firstLine.substr(kOpening.size());
  const std::size_t space = rest.find(' ');
  return space != std::string_view::npos && space > 0 && rest.substr(space, 3) == " - ";
}

std::optional<std::filesystem::path> firstForeignTable(const std::filesystem::path& folder) {
  for (const std::string_view name : kTableFileNames) {
    const std::filesystem::path path = folder / name;
    if (!fileIdentity(path)) continue;
    if (!nonRegularKind(path).empty()) return path;
    std::ifstream in(path, std::ios::binary);
    std::string firstLine;
    std::getline(in, firstLine);
    if (!isStridemarkTable(firstLine)) return path;
  }
  return std::nullopt;
}

void addTables(OutputSet& outputs, const std::filesystem::path& folder,
               const model::Annotation& annotation, const Report& report,
               const TableSource& source) {
  std::error_code ec;
  std::filesystem::create_directories(folder, ec);
  if (ec || !std::filesystem::is_directory(folder)) {
    throw Error(ErrorCategory::io, folder.string() + ": cannot create the table folder (" +
                                       (ec ? ec.message() : std::string("not a folder")) +
                                       ") — choose another --csv folder");
  }
  if (const auto foreign = firstForeignTable(folder)) {
    throw Error(ErrorCategory::io, foreign->string() +
                                       ": is not a table stridemark wrote (a file of yours, "
                                       "such as hand-tagged events?), so the tables are not "
                                       "written there — choose an empty or new folder for them");
  }
  for (auto& [name, text] : allTables(annotation, report, source))
    outputs.add(folder / name, std::move(text));
}

std::vector<std::filesystem::path> writeTables(const std::filesystem::path& folder,
                                               const model::Annotation& annotation,
                                               const Report& report, const TableSource& source) {
  OutputSet outputs(Durability::regenerable);
  addTables(outputs, folder, annotation, report, source);
  return outputs.commit();
}

}  // namespace stridemark::formats
