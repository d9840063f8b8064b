// Workstation stepping latency (issue 5): holding the step key on a 1080p 240 fps H.264 clip
// (GOP 240), key press -> painted frame in the real main window, against the video engine's
// own step measured in the same run on the same clip: FrameServer::get plus the conversion to
// the picture the Viewer shows (BGRA at the Viewer's fitted pixel size, the fast conversion),
// which is what a step costs before any widget is involved. Prints JSON.
// A desk step ends when the repaint that drew the frame has finished (all widgets painted, the
// window flushed); work the desk queues behind the repaint, such as making the picture of the
// next frame ahead (ui/session/video_source.h), is not latency and is not counted. How many steps
// were answered with a picture made ahead is printed as desk_steps_made_ahead.
// "Holding" presses the key at an auto-repeat rate (30 per second, as X11 and macOS repeat
// fast keys); the unpaced runs (next press as soon as the frame is painted) are printed too.
// Usage: desk_step_bench [steps] [clip.mp4]   (default: 600 steps; clip made with ffmpeg)
#include <QApplication>
#include <QElapsedTimer>
#include <QProcess>
#include <QStandardPaths>
#include <QTemporaryDir>
#include <QTest>
#include <algorithm>
#include <chrono>
#include <cstdio>
#include <cstdlib>
#include <functional>
#include <thread>
#include <vector>

#include "tests/bench/repaint_probe.h"
#include "ui/main_window.h"
#include "ui/widgets/footfall_lanes.h"
#include "ui/widgets/viewer.h"
#include "video/convert.h"
#include "video/frame_server.h"

namespace {

using Clock = std::chrono::steady_clock;

struct Series {
  std::vector<double> ms;      // per step
  std::vector<double> atSec;   // when the step started, seconds since the direction began
  std::int64_t madeAhead = 0;  // desk steps answered with a picture made ahead
  double median() const {
    auto v = ms;
    std::sort(v.begin(), v.end());
    return v.empty() ? 0 : v[v.size() / 2];
  }
  double maxAfter(double seconds) const {
    double worst = 0;
    for (std::size_t i = 0; i < ms.size(); ++i)
      if (atSec[i] > seconds) worst = std::max(worst, ms[i]);
    return worst;
  }
};

double msSince(Clock::time_point t) {
  return std::chrono::duration<double, std::milli>(Clock::now() - t).count();
}

// Auto-repeat period of a held key; zero means "press again as soon as the frame is shown".
using Period = std::chrono::microseconds;
constexpr Period kHeld{33333};
constexpr Period kUnpaced{0};

// The yardstick: the engine's blocking exact step, frame by frame, converted to BGRA at the
// given size as the Viewer's source does.
Series engineSteps(const std::string& clip, std::int64_t from, std::int64_t to, Period period,
                   QSize shown) {
  using namespace stridemark::video;
  auto index = std::make_shared<const FrameIndex>(FrameIndex::build(clip));
  FrameServer server(clip, index);
  FrameConverter converter(ConversionQuality::fast);
  server.get(from);
  const int stride = shown.width() * 4;
  std::vector<std::uint8_t> bgra(static_cast<std::size_t>(stride) *
                                 static_cast<std::size_t>(shown.height()));
  Series s;
  const auto start = Clock::now();
  auto tick = start;
  const int dir = to > from ? 1 : -1;
  for (auto n = from + dir; n != to + dir; n += dir) {
    std::this_thread::sleep_until(tick);
    tick += period;
    const auto t = Clock::now();
    s.atSec.push_back(msSince(start) / 1000.0);
    const auto frame = server.get(n);
    converter.convertScaled(*frame, PackedFormat::bgra, bgra.data(), stride, shown.width(),
                            shown.height());
    s.ms.push_back(msSince(t));
  }
  return s;
}

using BenchApplication = stridemark::bench::RepaintProbeApplication;

// Key press -> the Viewer painted that frame.
Series deskSteps(stridemark::ui::MainWindow& w, std::int64_t from, std::int64_t to, Period period) {
  w.seek(from);
  QElapsedTimer guard;
  guard.start();
  while (w.viewer()->shownFrame() != from && guard.elapsed() < 20000)
    QCoreApplication::processEvents(QEventLoop::AllEvents, 5);
  Series s;
  // "Painted" = the repaint in which the Viewer drew the frame has finished: every dirty widget
  // painted and the window flushed (not later work the desk queues behind the repaint).
  std::int64_t drawn = -1, painted = -1;
  Clock::time_point paintedAt;
  auto conn = QObject::connect(w.viewer(), &stridemark::ui::Viewer::framePainted,
                               [&](qint64 f) { drawn = f; });
  auto& app = static_cast<BenchApplication&>(*QCoreApplication::instance());
  app.afterRepaint = [&] {
    if (drawn == painted) return;
    painted = drawn;
    paintedAt = Clock::now();
  };
  const auto key = to > from ? Qt::Key_Right : Qt::Key_Left;
  const auto madeAheadBefore = w.video()->preparedShown();
  const auto start = Clock::now();
  auto tick = start;
  for (auto n = from; n != to;) {
    n += to > from ? 1 : -1;
    while (Clock::now() < tick) QCoreApplication::processEvents(QEventLoop::AllEvents, 1);
    tick += period;
    const auto t = Clock::now();
    s.atSec.push_back(msSince(start) / 1000.0);
    QTest::keyClick(w.windowHandle(), key);
    while (painted != n) {
      QCoreApplication::processEvents(QEventLoop::AllEvents);
      if (msSince(t) > 30000) {
        std::fprintf(stderr, "desk_step_bench: frame %lld never painted (playhead %lld)\n",
                     static_cast<long long>(n), static_cast<long long>(w.playhead()));
        std::exit(3);
      }
    }
    s.ms.push_back(std::chrono::duration<double, std::milli>(paintedAt - t).count());
  }
  QObject::disconnect(conn);
  app.afterRepaint = nullptr;
  s.madeAhead = w.video()->preparedShown() - madeAheadBefore;
  return s;
}

QString makeClip(const QTemporaryDir& dir) {
  const QString out = dir.filePath(QStringLiteral("step-1080p240.mp4"));
  // Source: VIDEO-NOTES.md §0 (test clips of this kind: testsrc2, 240-frame closed GOP).
  QProcess ffmpeg;
  ffmpeg.start(QStringLiteral("ffmpeg"), {"-v",
                                          "error",
                                          "-y",
                                          "-f",
                                          "lavfi",
                                          "-i",
                                          "testsrc2=size=1920x1080:rate=240,noise=alls=12:allf=t",
                                          "-t",
                                          "4",
                                          "-c:v",
                                          "libx264",
                                          "-preset",
                                          "ultrafast",
                                          "-threads",
                                          "2",
                                          "-g",
                                          "240",
                                          "-keyint_min",
                                          "240",
                                          "-sc_threshold",
                                          "0",
                                          "-pix_fmt",
                                          "yuv420p",
                                          out});
  if (!ffmpeg.waitForFinished(300000) || ffmpeg.exitCode() != 0) {
    std::fprintf(stderr, "desk_step_bench: ffmpeg failed: %s\n",
                 ffmpeg.readAllStandardError().constData());
    std::exit(3);
  }
  return out;
}

void printSeries(const char* name, const Series& desk, const Series& engine, bool last) {
  // Source: issue 5 item 9 (median <= 1.5x the engine's step; no step over 100 ms after 1 s).
  const double ratio = engine.median() > 0 ? desk.median() / engine.median() : 0;
  std::printf(
      "  \"%s\": {\"steps\": %zu, \"desk_median_ms\": %.3f, \"engine_median_ms\": %.3f, "
      "\"ratio\": %.3f, \"desk_max_after_1s_ms\": %.3f, \"engine_max_after_1s_ms\": %.3f, "
      "\"desk_steps_made_ahead\": %lld, \"ratio_ok\": %s, \"max_ok\": %s}%s\n",
      name, desk.ms.size(), desk.median(), engine.median(), ratio, desk.maxAfter(1.0),
      engine.maxAfter(1.0), static_cast<long long>(desk.madeAhead), ratio <= 1.5 ? "true" : "false",
      desk.maxAfter(1.0) <= 100.0 ? "true" : "false", last ? "" : ",");
}

}  // namespace

int main(int argc, char** argv) {
  if (qEnvironmentVariableIsEmpty("QT_QPA_PLATFORM")) qputenv("QT_QPA_PLATFORM", "offscreen");
  QStandardPaths::setTestModeEnabled(true);
  BenchApplication app(argc, argv);
  const int steps = argc > 1 ? std::atoi(argv[1]) : 600;
  QTemporaryDir dir;
  const QString clip = argc > 2 ? QString::fromLocal8Bit(argv[2]) : makeClip(dir);

  stridemark::ui::MainWindow w;
  w.setRecoveryPolicy(stridemark::ui::RecoveryPolicy::discard);
  w.setAskBeforeDiscard(false);
  w.resize(1600, 1000);
  w.show();
  if (!w.openVideo(clip)) return 3;
  w.activateWindow();
  if (!QTest::qWaitForWindowActive(&w, 10000)) std::fprintf(stderr, "window not active\n");
  w.lanes()->setFocus();
  const std::int64_t last = std::min<std::int64_t>(w.frameCount() - 1, steps);
  const std::string path = clip.toStdString();
  std::printf("{\n  \"benchmark\": \"desk_step\",\n  \"clip\": \"%s\",\n", path.c_str());
  std::printf("  \"held_key_period_ms\": %.3f,\n", kHeld.count() / 1000.0);
  const QSize shown = w.viewer()->displayPixels();
  std::printf("  \"viewer_pixels\": \"%dx%d\",\n", shown.width(), shown.height());
  {
    // What the simulated key press itself costs: an unbound key through the same path.
    std::vector<double> idle;
    for (int i = 0; i < 200; ++i) {
      const auto t = Clock::now();
      QTest::keyClick(w.windowHandle(), Qt::Key_F20);
      idle.push_back(msSince(t));
    }
    std::sort(idle.begin(), idle.end());
    std::printf("  \"unbound_key_press_ms\": %.4f,\n", idle[idle.size() / 2]);
  }
  // Held key (the acceptance lines), then unpaced for information. Each desk run is followed
  // by the engine on the same frames, so both see the same machine load.
  for (const Period period : {kHeld, kUnpaced}) {
    const bool held = period == kHeld;
    // Reopening gives the desk a cold cache, like the engine's fresh server.
    if (!w.openVideo(clip)) return 3;
    const Series deskForward = deskSteps(w, 0, last, period);
    const Series engineForward = engineSteps(path, 0, last, period, shown);
    if (!w.openVideo(clip)) return 3;
    const Series deskBackward = deskSteps(w, last, 0, period);
    const Series engineBackward = engineSteps(path, last, 0, period, shown);
    printSeries(held ? "held_forward" : "unpaced_forward", deskForward, engineForward, false);
    printSeries(held ? "held_backward" : "unpaced_backward", deskBackward, engineBackward, !held);
  }
  std::printf("}\n");
  return 0;
}
