// `stridemark score INPUT [--fps F] [--limbs SET] [--reference LIMB] [--speed M_S]
//                         [--leg-length M] [--json OUT|-] [--csv DIR]`
// INPUT is an events CSV or a project file. Without --json/--csv a short summary is printed.
#include <cstdio>
#include <filesystem>
#include <iostream>
#include <memory>
#include <optional>
#include <string>

#include "analysis/analyse.h"
#include "cli/run.h"
#include "cli/verbs.h"
#include "common/error.h"
#include "formats/events_csv.h"
#include "formats/file_io.h"
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
  std::optional<double> speed;
  std::optional<double> legLength;
  std::string json;
  std::string csv;
};

// A flag that does not fit the input (exit 2, like other usage errors).
struct UsageProblem {
  std::string message;
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

analysis::AnalysisOptions analysisOptions(const ScoreOptions& options,
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
  result.speedMs = options.speed;
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
        << bout.lastStride << ", frames " << bout.startFrame << "-" << bout.endFrame << '\n';
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

void writeJson(const ScoreOptions& options, const analysis::Report& report) {
  if (options.json == "-") {
    const std::string text = formats::reportJsonText(report);
    if (std::fwrite(text.data(), 1, text.size(), stdout) != text.size() || std::fflush(stdout))
      throw Error(ErrorCategory::io, "could not write the report to standard output");
  } else {
    formats::writeReportJsonFile(options.json, report);
    std::cerr << "wrote " << options.json << '\n';
  }
}

int runScore(const ScoreOptions& options) {
  try {
    const model::Project project = loadInput(options);
    const analysis::Report report =
        analysis::analyse(project, analysisOptions(options, project.annotation));
    if (!options.json.empty()) writeJson(options, report);
    if (!options.csv.empty()) {
      const auto files =
          formats::writeTables(options.csv, project.annotation, report, {options.input});
      std::cerr << "wrote " << files.size() << " tables to " << options.csv << '\n';
    }
    if (options.json.empty() && options.csv.empty()) printSummary(options, report);
    return kExitOk;
  } catch (const UsageProblem& problem) {
    std::cerr << "stridemark score: " << problem.message << '\n';
    return kExitUsage;
  }
}

std::function<std::string(const std::string&)> checkedBy(void (*parse)(const std::string&)) {
  return [parse](const std::string& value) -> std::string {
    try {
      parse(value);
      return {};
    } catch (const Error& e) {
      return e.what();
    }
  };
}

}  // namespace

void addScoreVerb(CLI::App& app, VerbAction& action) {
  auto options = std::make_shared<ScoreOptions>();
  CLI::App* verb = app.add_subcommand(
      "score", "Score touchdown/lift-off tags: strides, duty factors, phases, gaits, symmetry");
  verb->add_option("INPUT", options->input,
                   "events CSV (limb,event,frame) or project file (.stridemark)")
      ->required();
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
  verb->add_option("--speed", options->speed, "belt or ground speed, m/s")
      ->check(CLI::NonNegativeNumber);
  verb->add_option("--leg-length", options->legLength, "leg length (hip height), m")
      ->check(CLI::PositiveNumber);
  verb->add_option("--json", options->json,
                   "write the report (stridemark.report.v1) to this file, or - for stdout");
  verb->add_option("--csv", options->csv, "write tidy CSV tables into this folder");
  verb->callback([options, &action] { action = [options] { return runScore(*options); }; });
}

}  // namespace stridemark::cli
