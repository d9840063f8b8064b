// End-to-end tests of `stridemark export` and the export pipeline, checked with tools outside
// the project: ffprobe (Debian ffmpeg) for the clip, poppler's pdfinfo/pdftoppm/pdftotext for
// the PDF report, /usr/bin/python3 with pandas and xml.etree for tables and SVGs.
#include <gtest/gtest.h>

#include <QCoreApplication>
#include <QImage>
#include <QPushButton>
#include <atomic>
#include <chrono>
#include <filesystem>
#include <nlohmann/json.hpp>
#include <regex>
#include <set>
#include <string>
#include <vector>

#include "analysis/analyse.h"
#include "common/error.h"
#include "export_fixture.h"
#include "formats/project_file.h"
#include "stridemark/version.h"
#include "ui/export/clip_compositor.h"
#include "ui/export/clip_overlay.h"
#include "ui/export/export_dialog.h"
#include "ui/export/export_job.h"
#include "video/frame_index.h"

namespace fs = std::filesystem;
using namespace stridemark;
using namespace stridemark::testing;

namespace {

const std::string kSourceDir = STRIDEMARK_SOURCE_DIR;

// Frame count, size, rate, pixel format and codec of the first video stream, as ffprobe sees
// it after decoding every frame.
std::string probeClip(const fs::path& clip) {
  return run("ffprobe -v error -select_streams v:0 -count_frames -show_entries "
             "stream=codec_name,pix_fmt,width,height,r_frame_rate,nb_read_frames "
             "-of default=nw=1 '" +
             clip.string() + "'")
      .out;
}

int pdfPages(const fs::path& pdf) {
  const CommandResult r = run("pdfinfo '" + pdf.string() + "'");
  std::smatch m;
  static const std::regex pages(R"(Pages:\s+(\d+))");
  return std::regex_search(r.out, m, pages) ? std::stoi(m[1]) : -1;
}

std::vector<fs::path> filesUnder(const fs::path& dir) {
  std::vector<fs::path> files;
  for (const auto& e : fs::recursive_directory_iterator(dir)) {
    if (e.is_regular_file()) files.push_back(e.path());
  }
  return files;
}

class ExportTest : public ::testing::Test {
 protected:
  static void SetUpTestSuite() {
    dir_ = freshFolder("suite");
    makeClip(dir_ / "trot.mp4", 200);
    formats::writeProjectFile(dir_ / "trot.stridemark", trotProject("trot.mp4", 200));
  }
  static fs::path dir_;
};
fs::path ExportTest::dir_;

// Source: ffprobe (Debian ffmpeg 5.1) decoding the written file; expected values are the
// requested range (frames 10..129 -> 120 frames), the source size and the chosen playback rate.
TEST_F(ExportTest, ClipReportTablesAndFiguresFromTheCommandLine) {
  const fs::path out = dir_ / "full";
  fs::remove_all(out);
  const CommandResult r =
      run(stridemarkBinary() + " export '" + (dir_ / "trot.stridemark").string() + "' --out '" +
          out.string() + "' --clip --from 10 --to 129 --playback 30 --report");
  ASSERT_EQ(r.exitCode, 0) << r.out;

  const std::string probe = probeClip(out / "clip" / "marked_clip.mp4");
  EXPECT_NE(probe.find("codec_name=h264"), std::string::npos) << probe;
  EXPECT_NE(probe.find("pix_fmt=yuv420p"), std::string::npos) << probe;
  EXPECT_NE(probe.find("width=320"), std::string::npos) << probe;
  EXPECT_NE(probe.find("height=240"), std::string::npos) << probe;
  EXPECT_NE(probe.find("r_frame_rate=30/1"), std::string::npos) << probe;
  EXPECT_NE(probe.find("nb_read_frames=120"), std::string::npos) << probe;

  // Source: poppler-utils pdfinfo / pdftoppm / pdftotext read the report independently.
  const fs::path pdf = out / "report.pdf";
  const int pages = pdfPages(pdf);
  ASSERT_GE(pages, 2) << run("pdfinfo '" + pdf.string() + "'").out;
  const fs::path renders = dir_ / "full_pages";
  fs::remove_all(renders);
  fs::create_directories(renders);
  ASSERT_EQ(run("pdftoppm -r 40 -png '" + pdf.string() + "' '" + (renders / "page").string() + "'")
                .exitCode,
            0);
  EXPECT_EQ(static_cast<int>(filesUnder(renders).size()), pages);
  for (int page = 1; page <= pages; ++page) {
    const std::string text = run("pdftotext -f " + std::to_string(page) + " -l " +
                                 std::to_string(page) + " '" + pdf.string() + "' -")
                                 .out;
    // The clinical caution on every page footer .
    EXPECT_NE(text.find("examination by a licensed veterinarian"), std::string::npos)
        << "page " << page << ":\n"
        << text;
  }
  const std::string first = run("pdftotext -f 1 -l 1 '" + pdf.string() + "' -").out;
  // Issue 16 item 7: the report names the exam date, the scorer and the software version.
  for (const char* needle : {"Trial card", "Bramble", "Scorer", "Export test", "Exam date",
                             "2026-03-14", "Stridemark 0."}) {
    EXPECT_NE(first.find(needle), std::string::npos) << needle << " missing on page 1";
  }
  const std::string all = run("pdftotext '" + pdf.string() + "' -").out;
  for (const char* needle :
       {"Per limb", "Symmetry index", "Hildebrand values", "Gait bouts", "Footfall diagram",
        "Gait map", "Phase dial", "Problems found", "Strides left out of the", "Methods"}) {
    EXPECT_NE(all.find(needle), std::string::npos) << needle << " missing in the report";
  }

  // Source: pandas read_csv (Debian python3-pandas) against Python's json module.
  const CommandResult tables = run("/usr/bin/python3 '" + kSourceDir +
                                   "/tests/export/check_tables.py' '" + out.string() + "'");
  EXPECT_EQ(tables.exitCode, 0) << tables.out;

  // Source: Python's xml.etree parses every SVG.
  std::string svgs;
  int pdfFigures = 0;
  for (const fs::path& f : filesUnder(out / "figures")) {
    if (f.extension() == ".svg") svgs += " '" + f.string() + "'";
    if (f.extension() == ".pdf") {
      ++pdfFigures;
      EXPECT_EQ(pdfPages(f), 1) << f;
    }
  }
  EXPECT_GE(pdfFigures, 5);
  const CommandResult svg =
      run("/usr/bin/python3 '" + kSourceDir + "/tests/export/check_svg.py'" + svgs);
  EXPECT_EQ(svg.exitCode, 0) << svg.out;

  // PNGs carry 300 dpi (11811 dots per metre) and are 85 mm wide: 1004 px.
  ensureQt();
  const QImage png(QString::fromStdString((out / "figures" / "gait_map.png").string()));
  ASSERT_FALSE(png.isNull());
  EXPECT_EQ(png.dotsPerMeterX(), 11811);
  EXPECT_EQ(png.width(), 1004);

  for (const fs::path& f : filesUnder(out)) {
    EXPECT_EQ(f.filename().string().rfind(".part-", 0), std::string::npos) << "left over: " << f;
  }
}

// The export's report.json and tables are the very bytes `stridemark score` writes for the same
// project, named the same way; the provenance is in export.json. Source: the score verb's own
// output, run as a separate process, compared byte for byte with cmp(1).
TEST(ExportSamples, ReportAndTablesAreTheBytesScoreWrites) {
  const std::vector<std::string> tables = {"events",  "strides", "limbs",    "phases",
                                           "support", "bouts",   "symmetry", "dap"};
  for (const char* sample : {"dog-rehab-treadmill", "lab-hexapod", "paddock-gallop"}) {
    SCOPED_TRACE(sample);
    const fs::path work = freshFolder(std::string("sample-") + sample);
    const fs::path project = fs::path(kSourceDir) / "samples" / sample / "trial.stridemark";
    const std::string quoted = " '" + project.string() + "'";
    // --json alone and --json with --csv take different paths through the score verb.
    ASSERT_EQ(run(stridemarkBinary() + " score" + quoted + " --json '" +
                  (work / "alone.json").string() + "'")
                  .exitCode,
              0);
    ASSERT_EQ(run(stridemarkBinary() + " score" + quoted + " --json '" +
                  (work / "score.json").string() + "' --csv '" + (work / "score").string() + "'")
                  .exitCode,
              0);
    const CommandResult exported = run(stridemarkBinary() + " export" + quoted + " --out '" +
                                       (work / "export").string() + "' --figures none");
    ASSERT_EQ(exported.exitCode, 0) << exported.out;

    const auto same = [](const fs::path& a, const fs::path& b) {
      return run("cmp '" + a.string() + "' '" + b.string() + "'");
    };
    for (const char* score : {"alone.json", "score.json"}) {
      const CommandResult r = same(work / score, work / "export" / "report.json");
      EXPECT_EQ(r.exitCode, 0) << score << ": " << r.out;
    }
    // The same set of files: a table score writes and export forgets fails here.
    std::set<std::string> scoreFiles, exportFiles;
    for (const auto& e : fs::directory_iterator(work / "score"))
      scoreFiles.insert(e.path().filename().string());
    for (const auto& e : fs::directory_iterator(work / "export" / "tables"))
      exportFiles.insert(e.path().filename().string());
    EXPECT_EQ(scoreFiles, exportFiles);
    EXPECT_EQ(scoreFiles.size(), tables.size());
    for (const std::string& table : tables) {
      const std::string name = table + ".csv";
      const CommandResult r = same(work / "score" / name, work / "export" / "tables" / name);
      EXPECT_EQ(r.exitCode, 0) << name << ": " << r.out;
    }

    // Source: the project file (read by core/formats) and the sample's video on disk.
    const model::Project p = formats::readProjectFile(project);
    ASSERT_TRUE(p.video.has_value());
    const auto provenance = nlohmann::json::parse(readText(work / "export" / "export.json"));
    EXPECT_EQ(provenance.value("schema", ""), "stridemark.export.v1");
    EXPECT_EQ(provenance.value("software", ""), std::string("stridemark ") + kVersion);
    EXPECT_EQ(provenance.value("project", ""), project.string());
    EXPECT_EQ(provenance.value("video", ""), p.video->path);
    EXPECT_EQ(provenance.value("video_signature", ""), p.video->signature);
    EXPECT_EQ(provenance.value("video_signature_on_disk", ""),
              video::signatureText(
                  video::computeSignature((project.parent_path() / p.video->path).string())));
    EXPECT_EQ(provenance.value("capture_rate_fps", ""), toString(p.annotation.captureRate));
    // Common practice, no source: ISO 8601 UTC, second resolution.
    static const std::regex utc(R"(\d{4}-\d\d-\d\dT\d\d:\d\d:\d\dZ)");
    EXPECT_TRUE(std::regex_match(provenance.value("exported_utc", ""), utc)) << provenance.dump();
  }
}

// A project whose video is gone: tables and figures are still written, the clip is not, and
// the exit code (1) and message say why.
TEST_F(ExportTest, MissingVideoStillWritesTablesAndFigures) {
  const fs::path work = freshFolder("missing");
  formats::writeProjectFile(work / "lost.stridemark", trotProject("moved-away.mp4", 200));
  const fs::path out = work / "out";
  const CommandResult r =
      run(stridemarkBinary() + " export '" + (work / "lost.stridemark").string() + "' --out '" +
          out.string() + "' --clip --figures svg");
  EXPECT_EQ(r.exitCode, 1) << r.out;
  EXPECT_NE(r.out.find("moved-away.mp4' was not found"), std::string::npos) << r.out;
  EXPECT_NE(r.out.find("no marked clip"), std::string::npos) << r.out;
  EXPECT_TRUE(fs::exists(out / "tables" / "strides.csv"));
  EXPECT_TRUE(fs::exists(out / "report.json"));
  EXPECT_TRUE(fs::exists(out / "figures" / "footfall_diagram.svg"));
  EXPECT_FALSE(fs::exists(out / "figures" / "footfall_diagram.png"));
  EXPECT_FALSE(fs::exists(out / "clip"));
}

// Cancelling in the middle of the clip leaves no file at all behind.
TEST_F(ExportTest, CancelledExportLeavesNothingBehind) {
  ensureQt();
  const fs::path out = dir_ / "cancelled";
  fs::remove_all(out);
  ui::exports::ExportOptions options;
  options.projectPath = dir_ / "trot.stridemark";
  options.outDir = out;
  options.report = true;
  options.clip = true;
  std::atomic<bool> cancel{false};
  double clipSeen = 0;
  auto progress = [&](const std::string& stage, double fraction) {
    if (stage == "clip") {
      clipSeen = fraction;
      if (fraction > 0.2) cancel = true;
    }
  };
  EXPECT_THROW(ui::exports::runExport(options, progress, cancel), Error);
  EXPECT_GT(clipSeen, 0.2);
  EXPECT_FALSE(fs::exists(out)) << "left: " << (fs::exists(out) ? filesUnder(out).size() : 0u);
}

// A failure (bad frame range) after tables and figures were staged leaves nothing either.
TEST_F(ExportTest, FailedExportLeavesNothingBehind) {
  const fs::path out = dir_ / "failed";
  fs::remove_all(out);
  const CommandResult r =
      run(stridemarkBinary() + " export '" + (dir_ / "trot.stridemark").string() + "' --out '" +
          out.string() + "' --clip --from 150 --to 400");
  EXPECT_EQ(r.exitCode, 1) << r.out;
  EXPECT_NE(r.out.find("outside the video"), std::string::npos) << r.out;
  EXPECT_FALSE(fs::exists(out));
}

// Side by side: the footfall panel widens the frame by 0.8 x height (192 px), still even.
TEST_F(ExportTest, SideBySideClipIsWiderAndDefaultsToSlowMotion) {
  const fs::path out = dir_ / "side";
  fs::remove_all(out);
  const CommandResult r =
      run(stridemarkBinary() + " export '" + (dir_ / "trot.stridemark").string() + "' --out '" +
          out.string() + "' --clip --side-by-side --from 0 --to 47 --figures none");
  ASSERT_EQ(r.exitCode, 0) << r.out;
  const std::string probe = probeClip(out / "clip" / "marked_clip.mp4");
  EXPECT_NE(probe.find("width=512"), std::string::npos) << probe;
  EXPECT_NE(probe.find("nb_read_frames=48"), std::string::npos) << probe;
  // Capture 240 fps -> 30 fps playback by default (8x slow motion).
  EXPECT_NE(probe.find("r_frame_rate=30/1"), std::string::npos) << probe;
  EXPECT_FALSE(fs::exists(out / "figures"));
}

// The overlay's stance state follows the tags, including a clip that starts mid-stance.
// Common practice, no source: stance is [touchdown, lift-off).
TEST(ClipOverlay, StanceStateFollowsTags) {
  const model::Project p = trotProject("x.mp4", 200);
  const analysis::Report report = analysis::analyse(p.annotation);
  const ui::exports::OverlayModel m(p.annotation, report);
  const int lh = *p.annotation.limbs.indexOf("LH");
  const int lf = *p.annotation.limbs.indexOf("LF");
  EXPECT_TRUE(m.inStance(lh, 0));   // before its first lift-off at 3
  EXPECT_FALSE(m.inStance(lh, 3));  // lift-off frame starts swing
  EXPECT_TRUE(m.inStance(lh, 5));
  EXPECT_TRUE(m.inStance(lh, 30));
  EXPECT_FALSE(m.inStance(lh, 31));
  EXPECT_FALSE(m.inStance(lf, 5));
  EXPECT_TRUE(m.inStance(lf, 29));
  EXPECT_TRUE(m.inStance(lh, 500));  // the last touchdown at 197 stays open
  ASSERT_TRUE(m.strideAt(60).has_value());
  EXPECT_EQ(*m.strideAt(60), 1u);
  EXPECT_FALSE(m.strideAt(2).has_value());
  EXPECT_TRUE(m.hidden(*p.annotation.limbs.indexOf("RH"), 63));
}

// Common practice, no source: high-speed footage plays back at 30 fps, normal footage as is.
TEST(ClipOverlay, DefaultPlaybackRate) {
  EXPECT_EQ(ui::exports::defaultPlaybackRate({240, 1}), (Rational{30, 1}));
  EXPECT_EQ(ui::exports::defaultPlaybackRate({1000, 1}), (Rational{30, 1}));
  EXPECT_EQ(ui::exports::defaultPlaybackRate({25, 1}), (Rational{25, 1}));
  EXPECT_EQ(ui::exports::defaultPlaybackRate({30000, 1001}), (Rational{30000, 1001}));
}

}  // namespace

namespace {

// Runs the dialog's export by pressing its Export button and waits for the worker to finish.
// Returns the finished message; `cancelAtClip` presses Cancel once the clip is under way.
std::pair<bool, QString> runDialog(ui::exports::ExportDialog& dialog, bool cancelAtClip) {
  bool done = false;
  std::pair<bool, QString> result;
  QMetaObject::Connection onFinished, onProgress;
  onFinished = QObject::connect(&dialog, &ui::exports::ExportDialog::exportFinished,
                                [&](bool ok, const QString& message) {
                                  done = true;
                                  result = {ok, message};
                                });
  QPushButton* exportButton = nullptr;
  QPushButton* cancelButton = nullptr;
  // After a previous run the dialog turns "Cancel" back into "Close" through a queued signal:
  // let the event loop deliver it before looking for the buttons.
  const auto waitStart = std::chrono::steady_clock::now();
  while (std::chrono::steady_clock::now() - waitStart < std::chrono::seconds(10)) {
    exportButton = cancelButton = nullptr;
    for (QPushButton* b : dialog.findChildren<QPushButton*>()) {
      if (b->text() == QStringLiteral("Export") && b->isEnabled()) exportButton = b;
      if (b->text() == QStringLiteral("Close")) cancelButton = b;
    }
    if (exportButton && cancelButton) break;
    QCoreApplication::processEvents(QEventLoop::AllEvents, 20);
  }
  if (!exportButton || !cancelButton) return {false, QStringLiteral("buttons not found")};
  if (cancelAtClip) {
    onProgress = QObject::connect(&dialog, &ui::exports::ExportDialog::exportProgressed,
                                  [cancelButton](const QString& stage, double fraction) {
                                    if (stage == QStringLiteral("clip") && fraction > 0.1)
                                      cancelButton->click();
                                  });
  }
  exportButton->click();
  const auto start = std::chrono::steady_clock::now();
  while (!done && std::chrono::steady_clock::now() - start < std::chrono::seconds(120)) {
    QCoreApplication::processEvents(QEventLoop::AllEvents, 50);
  }
  QObject::disconnect(onFinished);
  QObject::disconnect(onProgress);
  return result;
}

}  // namespace

// The Export dialog runs the same export on a worker thread; Cancel leaves nothing behind.
TEST_F(ExportTest, DialogExportsAndCancels) {
  ensureQt();
  ui::exports::ExportDialog dialog(QString::fromStdString((dir_ / "trot.stridemark").string()), 200,
                                   Rational{240, 1});
  const ui::exports::ExportOptions options = dialog.options();
  EXPECT_TRUE(options.clip);
  EXPECT_TRUE(options.report);
  EXPECT_EQ(options.playback, (Rational{30, 1}));
  const fs::path out = options.outDir;
  EXPECT_EQ(out, dir_ / "trot-export");
  fs::remove_all(out);

  const auto cancelled = runDialog(dialog, true);
  EXPECT_FALSE(cancelled.first) << cancelled.second.toStdString();
  EXPECT_TRUE(cancelled.second.contains(QStringLiteral("cancelled")))
      << cancelled.second.toStdString();
  EXPECT_FALSE(fs::exists(out));

  const auto finished = runDialog(dialog, false);
  EXPECT_TRUE(finished.first) << finished.second.toStdString();
  EXPECT_TRUE(fs::exists(out / "report.pdf"));
  EXPECT_TRUE(fs::exists(out / "clip" / "marked_clip.mp4"));
  EXPECT_TRUE(fs::exists(out / "tables" / "events.csv"));
}
