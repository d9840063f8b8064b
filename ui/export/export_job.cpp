#include "ui/export/export_job.h"

#include <QDateTime>
#include <QString>
#include <algorithm>
#include <fstream>
#include <nlohmann/json.hpp>
#include <optional>

#include "analysis/analyse.h"
#include "common/error.h"
#include "formats/project_file.h"
#include "formats/report_json.h"
#include "formats/tables_csv.h"
#include "stridemark/version.h"
#include "ui/export/figure_set.h"
#include "ui/export/report_pdf.h"
#include "ui/export/staged_output.h"
#include "ui/figures/footfall_diagram.h"
#include "video/frame_index.h"

namespace stridemark::ui::exports {

namespace fs = std::filesystem;

namespace {

struct Context {
  const ExportOptions& options;
  const model::Project& project;
  const analysis::Report& report;
  std::string projectName;
  std::string exportedAt;
  StagedOutput& out;
  const ExportProgress& progress;
  const std::atomic<bool>& cancel;
};

void checkCancel(const Context& c) {
  if (c.cancel.load()) {
    throw Error(ErrorCategory::export_,
                "export cancelled; nothing was written to '" + c.options.outDir.string() + "'.");
  }
}

void report(const Context& c, const std::string& stage, double fraction) {
  if (c.progress) c.progress(stage, fraction);
}

void writeText(const fs::path& path, const std::string& text) {
  std::ofstream file(path, std::ios::binary);
  file << text;
  file.close();
  if (!file) {
    throw Error(ErrorCategory::io,
                "cannot write '" + path.string() + "'. Check free disk space and permissions.");
  }
}

using Json = nlohmann::ordered_json;

// The signature of the video file on disk now (null when it is not there), so a reader can tell
// whether the linked video is still the one that was scored.
Json signatureOnDisk(const std::optional<fs::path>& video) {
  std::error_code ec;
  if (!video || !fs::is_regular_file(*video, ec)) return nullptr;
  return video::signatureText(video::computeSignature(video->string()));
}

// The export's provenance. report.json and the tables stay the bytes `stridemark score` writes
// for the same project; what only an export knows goes here.
std::string exportJsonText(const Context& c, const std::optional<fs::path>& video,
                           const ExportOutcome& outcome) {
  const std::optional<model::VideoLink>& link = c.project.video;
  Json doc;
  doc["schema"] = "stridemark.export.v1";
  doc["software"] = std::string("stridemark ") + kVersion;
  doc["project"] = c.options.projectPath.string();
  doc["video"] = link ? Json(link->path) : Json(nullptr);
  doc["video_signature"] = link && !link->signature.empty() ? Json(link->signature) : Json(nullptr);
  doc["video_signature_on_disk"] = signatureOnDisk(video);
  doc["capture_rate_fps"] = toString(c.report.fps);
  doc["exported_utc"] = c.exportedAt;
  if (c.options.clip) {
    // A damaged frame is skipped, not drawn: the clip is shorter by these frames.
    Json clip;
    clip["written"] = !outcome.clipProblem;
    clip["problem"] = outcome.clipProblem ? Json(*outcome.clipProblem) : Json(nullptr);
    clip["frames"] = outcome.clip.frames;
    clip["skipped_damaged_frames"] = outcome.clip.skippedDamaged;
    clip["rotation_degrees"] = outcome.clip.rotationDegrees;
    clip["rotation_applied"] = outcome.clip.rotationApplied;
    doc["marked_clip"] = clip;
  }
  return doc.dump(2) + "\n";
}

void writeTables(const Context& c) {
  report(c, "tables", 0);
  // The bytes `stridemark score PROJECT --csv DIR --json OUT` writes for the same project
  // named the same way: the tables' "# input:" line is the project path as given.
  const formats::TableSource source{c.options.projectPath.string()};
  for (const auto& [name, text] : formats::allTables(c.project.annotation, c.report, source))
    writeText(c.out.stage(fs::path("tables") / name), text);
  writeText(c.out.stage("report.json"), formats::reportJsonText(c.report));
  report(c, "tables", 1);
}

void writeFigures(const Context& c, const std::vector<NamedFigure>& figures) {
  writeFigureFiles(figures, c.options.figureFormats, c.out, "figures",
                   [&c](std::size_t done, std::size_t total) {
                     checkCancel(c);
                     if (done > 0)
                       report(c, "figures", static_cast<double>(done) / static_cast<double>(total));
                   });
}

// Why there can be no clip, or nothing when the video is there.
std::optional<std::string> clipObstacle(const Context& c, const fs::path& video) {
  if (!c.project.video) {
    return "the project links no video, so no marked clip was made. Link the video in the "
           "workstation (Trial card) and export again.";
  }
  std::error_code ec;
  if (!fs::is_regular_file(video, ec)) {
    return "the project's video '" + video.string() +
           "' was not found, so no marked clip was made (tables and figures were written). "
           "Move the video back or relink it in the workstation, then export again with --clip.";
  }
  return std::nullopt;
}

ClipResult writeClip(const Context& c, const fs::path& video) {
  const model::Annotation& a = c.project.annotation;
  ClipSettings s;
  s.videoPath = video.string();
  s.index = std::make_shared<const video::FrameIndex>(video::FrameIndex::build(s.videoPath));
  const std::int64_t count = s.index->frameCount();
  const std::optional<ScoredRange> scored = scoredRange(a);
  s.first =
      c.options.from.value_or(scored ? std::clamp<std::int64_t>(scored->first, 0, count - 1) : 0);
  s.last = c.options.to.value_or(scored ? std::clamp<std::int64_t>(scored->last, 0, count - 1)
                                        : count - 1);
  s.playbackRate = c.options.playback.value_or(defaultPlaybackRate(a.captureRate));
  s.encoderThreads = c.options.encoderThreads;
  s.x264Preset = c.options.x264Preset;
  if (c.options.sideBySide) {
    const figures::FigureStyle style = figures::FigureStyle::print();
    const std::int64_t first = s.first;
    const std::int64_t last = s.last;
    s.sidePanel = [&a, style, first, last](QPainter& p, const QRectF& area, std::int64_t frame) {
      figures::FootfallOptions o;
      o.viewFirst = first;
      o.viewLast = std::max(last, first + 1);
      o.playhead = frame;
      o.drawTicks = false;  // the whole range is shown: ticks would crowd it
      o.labelWidth = 40;
      figures::FigureStyle big = style;
      big.fontPx = std::max(12, static_cast<int>(area.height() / 45));
      const QRectF inner = area.adjusted(area.width() * 0.03, area.height() * 0.25,
                                         -area.width() * 0.03, -area.height() * 0.25);
      figures::paintFootfallDiagram(p, inner, a, o, big);
    };
  }
  const OverlayModel overlay(a, c.report);
  const fs::path staged = c.out.stage("clip/marked_clip.mp4");
  return renderMarkedClip(
      s, overlay, staged,
      [&](std::int64_t done, std::int64_t total) {
        report(c, "clip", static_cast<double>(done) / static_cast<double>(total));
      },
      c.cancel);
}

}  // namespace

ExportOutcome runExport(const ExportOptions& options, const ExportProgress& progress,
                        const std::atomic<bool>& cancel) {
  const model::Project project = formats::readProjectFile(options.projectPath);
  // The score verb's analysis: the trial card gives speed and leg length.
  const analysis::Report analysed = analysis::analyse(project);
  if (options.from && options.to && *options.from > *options.to) {
    throw Error(ErrorCategory::format, "--from " + std::to_string(*options.from) +
                                           " is after --to " + std::to_string(*options.to) +
                                           "; give the first frame, then the last.");
  }
  StagedOutput out(options.outDir);
  const Context c{options,
                  project,
                  analysed,
                  options.projectPath.filename().string(),
                  QDateTime::currentDateTimeUtc().toString(Qt::ISODate).toStdString(),
                  out,
                  progress,
                  cancel};
  const std::optional<fs::path> video =
      project.video
          ? std::optional(model::resolveVideoPath(options.projectPath, project.video->path))
          : std::nullopt;
  ExportOutcome outcome;
  writeTables(c);
  const std::vector<NamedFigure> figures = exportFigures(project.annotation, analysed);
  writeFigures(c, figures);
  if (options.report) {
    checkCancel(c);
    report(c, "report", 0);
    const ReportSource source{&project, &analysed, c.projectName, c.exportedAt};
    outcome.reportPages =
        writeReportPdf(source, figures, QString::fromStdString(out.stage("report.pdf").string()));
    report(c, "report", 1);
  }
  if (options.clip) {
    checkCancel(c);
    outcome.clipProblem = clipObstacle(c, video.value_or(fs::path()));
    if (!outcome.clipProblem) outcome.clip = writeClip(c, *video);
  }
  writeText(out.stage("export.json"), exportJsonText(c, video, outcome));
  checkCancel(c);
  outcome.written = out.commit();
  return outcome;
}

}  // namespace stridemark::ui::exports
