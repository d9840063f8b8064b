#pragma once
// One export of a project: tables (tidy CSVs + report JSON, the very bytes `stridemark score`
// writes), export.json (provenance: software, project, video and its signature, capture rate,
// export time), figures (SVG, PNG at 300 dpi, PDF), the PDF report and the marked clip. Used by
// `stridemark export` and by the Export dialog. Everything is staged under temporary names and
// renamed into place only when the whole export succeeded; a failure or a cancel leaves no file
// behind. Needs a QGuiApplication (the offscreen platform is enough) for fonts.
#include <atomic>
#include <cstdint>
#include <filesystem>
#include <functional>
#include <optional>
#include <string>
#include <vector>

#include "common/rational.h"
#include "ui/export/clip_compositor.h"
#include "ui/export/figure_output.h"

namespace stridemark::ui::exports {

struct ExportOptions {
  std::filesystem::path projectPath;
  std::filesystem::path outDir;
  std::vector<FigureFormat> figureFormats{FigureFormat::svg, FigureFormat::png, FigureFormat::pdf};
  bool report = false;
  bool clip = false;
  std::optional<std::int64_t> from;  // clip range; default: the scored frames
  std::optional<std::int64_t> to;
  std::optional<Rational> playback;  // default: defaultPlaybackRate(capture rate)
  bool sideBySide = false;           // clip with the footfall diagram beside the frame
  int encoderThreads = 2;
  std::string x264Preset = "veryfast";
};

struct ExportOutcome {
  std::vector<std::filesystem::path> written;
  // Set when a clip was asked for but could not be made (e.g. the video is missing); the
  // rest of the export was still written.
  std::optional<std::string> clipProblem;
  int reportPages = 0;
  ClipResult clip;
};

// stage: "tables", "figures", "report", "clip"; fraction of that stage in [0, 1].
using ExportProgress = std::function<void(const std::string& stage, double fraction)>;

// Throws stridemark::Error (bad project, unwritable folder, cancelled export).
ExportOutcome runExport(const ExportOptions& options, const ExportProgress& progress,
                        const std::atomic<bool>& cancel);

}  // namespace stridemark::ui::exports
