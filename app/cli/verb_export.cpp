// `stridemark export PROJECT --out DIR [--clip] [--from F --to F] [--playback FPS]
//                   [--figures svg,png,pdf|none] [--report] [--side-by-side]`
// Writes tables and figures (always), the PDF report and the marked clip (when asked).
// Exit 1 when the project is bad, or when a clip was asked for but the video is missing (the
// tables and figures are still written; the message says why there is no clip).
#include <sys/stat.h>
#include <unistd.h>

#include <atomic>
#include <cerrno>
#include <cstdlib>
#include <iostream>
#include <memory>
#include <optional>
#include <sstream>
#include <string>

#include "cli/arguments.h"
#include "cli/run.h"
#include "cli/verbs.h"
#include "common/error.h"

#ifdef STRIDEMARK_HAVE_UI
#include <QGuiApplication>

#include "ui/export/export_job.h"
#endif

namespace stridemark::cli {
namespace {

struct ExportArgs {
  std::string project;
  std::string out;
  bool clip = false;
  std::string from;  // frame numbers as given; parsed strictly (no hex, no clamping)
  std::string to;
  std::string playback;
  std::string figures = "svg,png,pdf";
  bool report = false;
  bool sideBySide = false;
  int threads = 2;
};

#ifdef STRIDEMARK_HAVE_UI

std::vector<ui::exports::FigureFormat> parseFigureList(const std::string& text) {
  std::vector<ui::exports::FigureFormat> formats;
  if (text == "none") return formats;
  std::stringstream list(text);
  std::string item;
  while (std::getline(list, item, ',')) {
    if (!item.empty()) formats.push_back(ui::exports::parseFigureFormat(item));
  }
  return formats;
}

// Offscreen Qt for fonts and painting, created only for this verb.
std::unique_ptr<QGuiApplication> startOffscreenQt() {
  setenv("QT_QPA_PLATFORM", "offscreen", 0);  // keep a platform the user chose
  // Batch machines often have no session runtime dir; give Qt a private one instead of a
  // warning on every run.
  if (std::getenv("XDG_RUNTIME_DIR") == nullptr) {
    const std::string dir = "/tmp/stridemark-runtime-" + std::to_string(getuid());
    struct stat info {};
    if ((mkdir(dir.c_str(), 0700) == 0 || errno == EEXIST) && lstat(dir.c_str(), &info) == 0 &&
        S_ISDIR(info.st_mode) && info.st_uid == getuid() && (info.st_mode & 077) == 0) {
      setenv("XDG_RUNTIME_DIR", dir.c_str(), 0);
    }
  }
  static int argc = 1;
  static char name[] = "stridemark";
  static char* argv[] = {name, nullptr};
  return std::make_unique<QGuiApplication>(argc, argv);
}

// One line per stage and per tenth of the clip, on stderr (stdout lists the files).
ui::exports::ExportProgress stderrProgress() {
  auto last = std::make_shared<std::pair<std::string, int>>("", -1);
  return [last](const std::string& stage, double fraction) {
    const int tenth = static_cast<int>(fraction * 10);
    if (stage == last->first && tenth == last->second) return;
    if (stage != "clip" && stage == last->first) return;
    *last = {stage, tenth};
    std::cerr << "export: " << stage << ' ' << tenth * 10 << " %\n";
  };
}

int runExport(const ExportArgs& args) {
  ui::exports::ExportOptions options;
  options.projectPath = args.project;
  options.outDir = args.out;
  options.figureFormats = parseFigureList(args.figures);
  options.report = args.report;
  options.clip = args.clip;
  if (!args.from.empty()) options.from = parseFrameNumber(args.from, "--from");
  if (!args.to.empty()) options.to = parseFrameNumber(args.to, "--to");
  if (!args.playback.empty()) options.playback = parseRate(args.playback, "--playback");
  options.sideBySide = args.sideBySide;
  options.encoderThreads = args.threads;
  const auto qt = startOffscreenQt();
  const std::atomic<bool> cancel{false};
  const ui::exports::ExportOutcome outcome =
      ui::exports::runExport(options, stderrProgress(), cancel);
  for (const auto& path : outcome.written) std::cout << path.string() << '\n';
  if (outcome.reportPages > 0)
    std::cerr << "export: report has " << outcome.reportPages << " pages\n";
  if (outcome.clip.frames > 0) {
    std::cerr << "export: marked clip " << outcome.clip.frames << " frames, " << outcome.clip.width
              << "x" << outcome.clip.height << '\n';
    if (outcome.clip.rotationApplied)
      std::cerr << "export: note: the video asks for a " << outcome.clip.rotationDegrees
                << " degree display rotation; the clip is turned upright\n";
    else if (outcome.clip.rotationDegrees != 0)
      std::cerr << "export: warning: the video asks for a " << outcome.clip.rotationDegrees
                << " degree display rotation that could not be applied; the clip is as stored\n";
  }
  if (!outcome.clip.skippedDamaged.empty())
    std::cerr << "export: warning: marked clip skipped " << outcome.clip.skippedDamaged.size()
              << " damaged frame(s): " << frameList(outcome.clip.skippedDamaged) << " ("
              << outcome.clip.firstDamageReason << ")\n";
  if (outcome.clipProblem) {
    std::cerr << "stridemark: no marked clip: " << *outcome.clipProblem << '\n';
    return kExitBadInput;
  }
  return kExitOk;
}

#else

int runExport(const ExportArgs&) {
  throw Error(ErrorCategory::export_,
              "this build has no Qt user interface library, so it cannot export; rebuild with "
              "-DSTRIDEMARK_BUILD_UI=ON.");
}

#endif

}  // namespace

void addExportVerb(CLI::App& app, VerbAction& action) {
  auto args = std::make_shared<ExportArgs>();
  CLI::App* verb = app.add_subcommand(
      "export", "Export tables, figures, a PDF report and a marked clip of a scored project");
  verb->add_option("PROJECT", args->project, "project file")->required()->check(regularFileInput());
  verb->add_option("--out", args->out, "output folder (created when missing)")
      ->required()
      ->check(nonEmptyPath("a folder for the export"));
  verb->add_flag("--clip", args->clip, "also render the marked clip (H.264 MP4)");
  const auto frameNumber = [](const char* flag) {
    return checkedBy([flag](const std::string& v) { parseFrameNumber(v, flag); });
  };
  verb->add_option("--from", args->from, "first frame of the clip (default: first tagged frame)")
      ->check(frameNumber("--from"));
  verb->add_option("--to", args->to, "last frame of the clip (default: last tagged frame)")
      ->check(frameNumber("--to"));
  verb->add_option("--playback", args->playback,
                   "frame rate the clip plays at (default: 30 for capture above 60 fps, else "
                   "the capture rate)");
  verb->add_option("--figures", args->figures,
                   "figure formats, comma-separated: svg,png,pdf (default all) or none");
  verb->add_flag("--report", args->report, "also write the multi-page PDF report");
  verb->add_flag("--side-by-side", args->sideBySide,
                 "clip layout with the footfall diagram beside the frame");
  verb->add_option("--threads", args->threads, "encoder threads (default 2)")
      ->check(CLI::Range(1, 64));
  verb->callback([args, &action] { action = [args] { return runExport(*args); }; });
}

}  // namespace stridemark::cli
