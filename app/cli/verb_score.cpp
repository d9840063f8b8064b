// `stridemark score INPUT [--fps F] [--limbs SET] [--reference LIMB] [--speed V[@FRAME]]...
//                         [--leg-length M] [--json OUT|-] [--csv DIR]`
// INPUT is an events CSV or a project file. Without --json/--csv a short summary is printed.
#include <charconv>
#include <cmath>
#include <cstdio>
#include <filesystem>
#include <iostream>
#include <memory>
#include <optional>
#include <string>

#include "analysis/analyse.h"
#include "cli/arguments.h"
#include "cli/run.h"
#include "cli/verbs.h"
#include "common/error.h"
#include "formats/events_csv.h"
#include "formats/file_io.h"
#include "formats/output_set.h"
#include "formats/project_file.h"
#include "formats/report_json.h"
#include "formats/tables_csv.h"

namespace stridemark::cli {
namespace {

struct ScoreOptions {
  std::string input;
  std::string fps;
  std::string limbs;
  std::string reference;
  std::vector<std::string> speeds;  // V or V@FRAME, as given
  std::optional<double> legLength;
  std::string json;
  std::string csv;
};

bool isProjectText(const std::filesystem::path& path, std::string_view content) {
  const std::string extension = path.extension().string();
  if (extension == formats::kProjectExtension) return true;
  if (extension == ".csv") return false;
  for (const char c : content) {
    if (c == ' ' || c == '\t' || c == '\r' || c == '\n') continue;
    return c == '{';
  }
  return false;
}

formats::EventsCsv parseEventsText(const ScoreOptions& options, std::string_view content) {
  formats::EventsCsvOptions csvOptions;
  if (!options.limbs.empty()) csvOptions.limbs = model::LimbSet::fromName(options.limbs);
  if (!options.fps.empty()) csvOptions.captureRate = parseRate(options.fps, "--fps");
  formats::EventsCsv csv = formats::parseEventsCsv(content, options.input, csvOptions);
  if (!csv.captureRate) {
    throw UsageProblem{options.input +
                       ": no capture rate — pass --fps F (frames per second the camera "
                       "recorded) or add a '# fps: F' line above the CSV header"};
  }
  return csv;
}

model::Project loadProject(const ScoreOptions& options, std::string_view content) {
  model::Project project = formats::parseProjectJson(content, options.input);
  if (!options.limbs.empty() &&
      model::LimbSet::fromName(options.limbs) != project.annotation.limbs) {
    throw UsageProblem{"--limbs " + options.limbs + " does not match the project's limb set " +
                       project.annotation.limbs.name() + " — drop --limbs for project files"};
  }
  if (!options.fps.empty()) project.annotation.captureRate = parseRate(options.fps, "--fps");
  return project;
}

// The belt speed over the trial (docs/methods.md §12): a speed from the start, then changes.
struct SpeedSchedule {
  std::optional<double> start;
  std::vector<model::SpeedStep> changes;
};

// A whole-text number; nullopt when `text` is anything else (empty, "1.0x", "1e999").
std::optional<double> wholeNumber(std::string_view text) {
  double value = 0;
  const auto [end, ec] = std::from_chars(text.data(), text.data() + text.size(), value);
  if (text.empty() || ec != std::errc() || end != text.data() + text.size()) return std::nullopt;
  return value;
}

std::optional<std::int64_t> wholeFrame(std::string_view text) {
  std::int64_t value = 0;
  const auto [end, ec] = std::from_chars(text.data(), text.data() + text.size(), value);
  if (text.empty() || ec != std::errc() || end != text.data() + text.size()) return std::nullopt;
  return value;
}

model::SpeedStep parseSpeedStep(const std::string& value) {
  const std::string what = "--speed " + shortened(value) + ": ";
  const std::size_t at = value.find('@');
  const std::string_view text(value);
  const auto speed = wholeNumber(text.substr(0, at));
  if (!speed || !std::isfinite(*speed) || *speed < 0) {
    throw UsageProblem{what +
                       "expected a speed of 0 m/s or more (1.2), or a speed from a frame on "
                       "(2.5@620)"};
  }
  if (at == std::string::npos) return {0, *speed};
  const auto frame = wholeFrame(text.substr(at + 1));
  if (!frame || *frame < 0) {
    throw UsageProblem{what + "expected a frame number (0 or more) after '@', as in 2.5@620"};
  }
  return {*frame, *speed};
}

// `--speed 1.0 --speed 2.5@620`: 1.0 m/s from the start (frame 0), 2.5 m/s from frame 620.
SpeedSchedule parseSpeedSchedule(const std::vector<std::string>& values) {
  SpeedSchedule schedule;
  for (std::size_t i = 0; i < values.size(); ++i) {
    const model::SpeedStep step = parseSpeedStep(values[i]);
    if (i == 0) {
      if (step.fromFrame != 0) {
        throw UsageProblem{"--speed " + shortened(values[i]) +
                           ": a speed change needs a speed from the start first — give --speed "
                           "V (m/s from frame 0) before any --speed V@FRAME"};
      }
      schedule.start = step.ms;
      continue;
    }
    const std::int64_t previous = schedule.changes.empty() ? 0 : schedule.changes.back().fromFrame;
    if (step.fromFrame <= previous) {
      throw UsageProblem{"--speed " + shortened(values[i]) + " after --speed " +
                         shortened(values[i - 1]) +
                         ": speed changes must start at later and later frames — give one "
                         "speed from the start, then V@FRAME in ascending frame order"};
    }
    schedule.changes.push_back(step);
  }
  return schedule;
}

analysis::AnalysisOptions analysisOptions(const ScoreOptions& options, const SpeedSchedule& speed,
                                          const model::Annotation& annotation) {
  analysis::AnalysisOptions result;
  if (!options.reference.empty()) {
    result.referenceLimb = annotation.limbs.indexOf(options.reference);
    if (!result.referenceLimb) {
      throw UsageProblem{"--reference " + options.reference + " is not a limb of the " +
                         annotation.limbs.name() + " set — use one of " +
                         annotation.limbs.labelList()};
    }
  }
  result.speedMs = speed.start;
  result.speedChanges = speed.changes;
  result.legLengthM = options.legLength;
  return result;
}

std::string fixed(double value, int decimals) {
  if (!std::isfinite(value)) return "-";
  char buffer[64];
  std::snprintf(buffer, sizeof buffer, "%.*f", decimals, value);
  return buffer;
}

std::string meanSd(const analysis::Stat& stat, int decimals) {
  if (stat.n == 0) return "-";
  std::string text = fixed(stat.mean, decimals);
  if (std::isfinite(stat.sd)) text += " ± " + fixed(stat.sd, decimals);
  return text;
}

std::string padded(std::string text, std::size_t width) {
  // Count UTF-8 code points so "±" lines up.
  std::size_t shown = 0;
  for (const char c : text) shown += (static_cast<unsigned char>(c) & 0xC0) != 0x80;
  if (shown < width) text.append(width - shown, ' ');
  return text;
}

void printSummary(const ScoreOptions& options, const analysis::Report& report) {
  std::ostream& out = std::cout;
  out << "stridemark score: " << options.input << '\n'
      << "  " << report.limbs.name() << ", capture rate " << toString(report.fps)
      << " fps, reference limb " << report.limbs.label(report.referenceLimb) << ", "
      << report.strides.size() << " reference strides\n\n";
  out << "  " << padded("limb", 6) << padded("strides", 9) << padded("stride s", 18)
      << "duty factor\n";
  for (int i = 0; i < report.limbs.size(); ++i) {
    const auto index = static_cast<std::size_t>(i);
    if (index >= report.limbSummary.size()) break;
    const auto& summary = report.limbSummary[index];
    out << "  " << padded(report.limbs.label(i), 6) << padded(std::to_string(summary.strides), 9)
        << padded(meanSd(summary.strideS, 3), 18) << meanSd(summary.dutyFactor, 3) << '\n';
  }
  if (report.hildebrand) {
    out << "\n  Hildebrand: hind duty factor " << fixed(report.hildebrand->dutyFactor, 3)
        << ", limb phase " << fixed(report.hildebrand->limbPhase, 3) << " ("
        << (report.hildebrand->band.empty() ? "-" : report.hildebrand->band) << ")\n";
  }
  out << "\n  gait bouts:" << (report.bouts.empty() ? " none" : "") << '\n';
  for (const auto& bout : report.bouts) {
    out << "    " << padded(bout.gait, 18) << "strides " << bout.firstStride << "-"
        << bout.lastStride << ", frames " << bout.startFrame << "-" << bout.endFrame;
    if (bout.summary.speed) out << ", " << fixed(bout.summary.speed->ms, 2) << " m/s";
    out << '\n';
  }
  out << "\n  problems: " << report.problems.size();
  if (!report.problems.empty()) {
    const auto& first = report.problems.front();
    out << " (first at frame " << first.frame
        << (first.limb ? ", " + report.limbs.label(*first.limb) : std::string()) << ": "
        << first.message << "; see --json for all)";
  }
  out << "\n\n" << kCaution << '\n';
}

model::Project loadInput(const ScoreOptions& options) {
  const std::filesystem::path inputPath(options.input);
  const std::string content = formats::readWholeFile(inputPath);
  if (isProjectText(inputPath, content)) return loadProject(options, content);
  model::Project project;
  project.annotation = formats::toAnnotation(parseEventsText(options, content));
  return project;
}

void writeJsonToStdout(const analysis::Report& report) {
  const std::string text = formats::reportJsonText(report);
  if (std::fwrite(text.data(), 1, text.size(), stdout) != text.size() || std::fflush(stdout))
    throw Error(ErrorCategory::io, "could not write the report to standard output");
}

// What score reads: the input and, for a project, its video. No output may replace them.
std::vector<NamedInput> inputsOf(const ScoreOptions& options, const model::Project& project) {
  std::vector<NamedInput> inputs{{"the input", options.input}};
  if (project.video)
    inputs.push_back(
        {"the project's video", model::resolveVideoPath(options.input, project.video->path)});
  return inputs;
}

// Refuses (exit 2) outputs that would replace an input, a user's file among the table names, or
// each other, before anything is written.
void checkOutputs(const ScoreOptions& options, const std::vector<NamedInput>& inputs) {
  const bool jsonFile = !options.json.empty() && options.json != "-";
  if (jsonFile) refuseToReplaceInputs(options.json, "--json", inputs);
  if (options.csv.empty()) return;
  for (const auto& table : formats::allTableNames()) {
    const std::filesystem::path path = std::filesystem::path(options.csv) / table;
    refuseToReplaceInputs(path, "--csv " + options.csv + " writes the table", inputs);
    std::error_code ec;
    if (jsonFile && std::filesystem::weakly_canonical(path, ec) ==
                        std::filesystem::weakly_canonical(options.json, ec)) {
      throw UsageProblem{"--json " + options.json + " is also the table " + path.string() +
                         " of --csv " + options.csv + " — give the report another name"};
    }
  }
  if (const auto foreign = formats::firstForeignTable(options.csv)) {
    throw UsageProblem{"--csv " + options.csv + ": " + foreign->string() +
                       " is not a table stridemark wrote (a file of yours, such as hand-tagged "
                       "events?); writing the tables there would replace it — choose an empty "
                       "or new folder for the tables, or move that file"};
  }
}

int runScore(const ScoreOptions& options) {
  try {
    const SpeedSchedule speed = parseSpeedSchedule(options.speeds);
    const model::Project project = loadInput(options);
    checkOutputs(options, inputsOf(options, project));
    const analysis::Report report =
        analysis::analyse(project, analysisOptions(options, speed, project.annotation));
    // The report and the tables are one set: all are replaced, or none (output_set.h).
    formats::OutputSet outputs(formats::Durability::regenerable);
    if (!options.json.empty() && options.json != "-")
      outputs.add(options.json, formats::reportJsonText(report));
    if (!options.csv.empty())
      formats::addTables(outputs, options.csv, project.annotation, report, {options.input});
    outputs.commit();
    if (options.json == "-") writeJsonToStdout(report);
    if (!options.json.empty() && options.json != "-") std::cerr << "wrote " << options.json << '\n';
    if (!options.csv.empty())
      std::cerr << "wrote " << formats::allTableNames().size() << " tables to " << options.csv
                << '\n';
    if (options.json.empty() && options.csv.empty()) printSummary(options, report);
    return kExitOk;
  } catch (const UsageProblem& problem) {
    std::cerr << "stridemark score: " << problem.message << '\n';
    return kExitUsage;
  }
}

}  // namespace

void addScoreVerb(CLI::App& app, VerbAction& action) {
  auto options = std::make_shared<ScoreOptions>();
  CLI::App* verb = app.add_subcommand(
      "score", "Score touchdown/lift-off tags: strides, duty factors, phases, gaits, symmetry");
  verb->add_option("INPUT", options->input,
                   "events CSV (limb,event,frame) or project file (.stridemark)")
      ->required()
      ->check(regularFileInput());
  verb->add_option("--fps", options->fps,
                   "capture rate in frames per second (240, 239.76, 30000/1001); required for "
                   "an events CSV without a '# fps:' line, overrides a project's rate")
      ->check(checkedBy([](const std::string& v) { parseRate(v, "--fps"); }));
  verb->add_option("--limbs", options->limbs,
                   "limb set of an events CSV: quadruped, biped, hexapod, multi-pair-N "
                   "(default: the file's '# limbs:' line, else quadruped)")
      ->check(checkedBy([](const std::string& v) { model::LimbSet::fromName(v); }));
  verb->add_option("--reference", options->reference,
                   "reference limb for strides and phases (default: LH, L or L1)");
  verb->add_option("--speed", options->speeds,
                   "belt or ground speed, m/s, from the start; repeat with V@FRAME for a speed "
                   "from that frame on (--speed 1.0 --speed 2.5@620); overrides the trial card's")
      ->expected(1)
      ->allow_extra_args(false)  // one value per --speed, so INPUT may follow it
      ->take_all();
  verb->add_option("--leg-length", options->legLength, "leg length (hip height), m")
      ->check(CLI::PositiveNumber);
  verb->add_option("--json", options->json,
                   "write the report (stridemark.report.v1) to this file, or - for stdout")
      ->check(nonEmptyPath("a file name for the report, or - for standard output"));
  verb->add_option("--csv", options->csv, "write tidy CSV tables into this folder")
      ->check(nonEmptyPath("a folder for the tables (. for the current folder)"));
  verb->callback([options, &action] { action = [options] { return runScore(*options); }; });
}

}  // namespace stridemark::cli
