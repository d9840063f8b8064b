// The all-intra stepping proxy in the desk (issue 3 item 5): a long-GOP clip with a small cache
// budget gets a proxy built in the background; after the switch the Viewer shows frame N of the
// source (checked against the ffmpeg CLI's own decode of the source), export reads the source,
// and cancelling leaves no file behind. Clips are generated with the ffmpeg CLI at test time.
#include <gtest/gtest.h>
#include <QAction>
#include <QDir>
#include <QImage>
#include <QProgressBar>
#include <QPushButton>
#include <QSettings>
#include <QStatusBar>
#include <algorithm>
#include <cmath>
#include <cstring>
#include <filesystem>

#include "tests/support/process.h"
#include "tests/ui/frame_reference.h"
#include "tests/ui/test_support.h"
#include "ui/main_window.h"
#include "ui/session/video_source.h"
#include "ui/widgets/viewer.h"

namespace stridemark::ui {
namespace {

namespace fs = std::filesystem;
using testsupport::runShell;
using testsupport::shellQuote;

constexpr int kWidth = 320, kHeight = 240, kFrames = 600;
// 16 MiB holds about 70 frames of 320x240 per backward window: far less than the 600-frame GOP.
constexpr std::size_t kSmallBudget = std::size_t{16} << 20;

// One keyframe for the whole clip; testsrc2 draws a moving counter and sweep, so neighbouring
// frames differ visibly.
fs::path makeLongGopClip(const fs::path& dir) {
  const fs::path clip = dir / "long_gop.mp4";
  const auto r =
      runShell("ffmpeg -v error -y -f lavfi -i testsrc2=size=" + std::to_string(kWidth) + "x" +
               std::to_string(kHeight) + ":rate=30 -frames:v " + std::to_string(kFrames) +
               " -c:v libx264 -preset veryfast -g 600 -keyint_min 600 -sc_threshold 0 "
               "-pix_fmt yuv420p " +
               shellQuote(clip.string()));
  EXPECT_EQ(r.exitCode, 0) << r.err;
  return clip;
}

QImage ffmpegFrame(const fs::path& clip, int n, const fs::path& dir) {
  return test::ffmpegFrameBgra(clip, n, kWidth, kHeight, dir);
}

using test::psnr;

std::vector<fs::path> filesIn(const fs::path& dir) {
  std::vector<fs::path> files;
  if (!fs::exists(dir)) return files;
  for (const auto& e : fs::recursive_directory_iterator(dir))
    if (e.is_regular_file()) files.push_back(e.path());
  return files;
}

struct Window {
  explicit Window(const fs::path& proxyDir) {
    w.setRecoveryPolicy(RecoveryPolicy::discard);
    w.setBareClipPolicy(BareClipPolicy::useDefaults);
    w.setAskBeforeDiscard(false);
    VideoSourceOptions options;
    options.budgetBytes = kSmallBudget;
    options.proxyDir = QString::fromStdString(proxyDir.string());
    w.setVideoOptions(options);
    w.stepOnProxyAction()->setChecked(true);
    w.resize(1000, 700);
    w.show();
  }
  // The last frame the VideoSource handed to the Viewer.
  void watchFrames() {
    QObject::connect(w.video(), &VideoSource::frameReady, &w,
                     [this](qint64 n, const QImage& image) {
                       lastFrame = n;
                       lastImage = image;
                     });
  }
  bool showFrame(std::int64_t n) {
    w.seek(n);
    return test::waitUntil([&] { return lastFrame == n && w.viewer()->shownFrame() == n; }, 20000);
  }
  MainWindow w;
  qint64 lastFrame = -1;
  QImage lastImage;
};

TEST(SteppingProxy, BuiltForLongGopThenShowsTheSameFrameNumbers) {
  testsupport::TempFolder tmp("stridemark-proxy-");
  const fs::path videoDir = tmp / "videos";
  const fs::path proxyDir = tmp / "cache";
  fs::create_directories(videoDir);
  const fs::path clip = makeLongGopClip(videoDir);

  Window win(proxyDir);
  ASSERT_TRUE(win.w.openVideo(QString::fromStdString(clip.string())));
  win.watchFrames();
  ASSERT_TRUE(win.w.video()->proxyAdvised()) << "a 600-frame GOP over a 16 MiB budget";
  // A request made while the proxy builds must survive the switch.
  win.w.seek(300);
  EXPECT_TRUE(win.w.proxyProgressBar()->isVisible());
  EXPECT_TRUE(win.w.proxyCancelButton()->isVisible());
  ASSERT_TRUE(test::waitUntil([&] { return win.w.video()->displayingProxy(); }, 120000))
      << win.w.statusBar()->currentMessage().toStdString();
  EXPECT_FALSE(win.w.proxyProgressBar()->isVisible());
  EXPECT_EQ(win.w.playhead(), 300);
  EXPECT_TRUE(test::waitUntil([&] { return win.w.viewer()->shownFrame() == 300; }));

  // Never written next to the video; the proxy sits in the cache folder. (Beside it is only the
  // window's lock on the clip, docs/reliability.md, which goes when the window lets go.)
  auto besideClip = filesIn(videoDir);
  std::sort(besideClip.begin(), besideClip.end());
  EXPECT_EQ(besideClip, (std::vector<fs::path>{clip, clip.string() + ".smlock"}));
  EXPECT_TRUE(fs::exists(win.w.video()->proxyPath().toStdString()));

  // Stepping backwards from the end on the proxy shows exactly frame N of the source.
  ASSERT_TRUE(win.showFrame(kFrames - 1));
  for (const int n : {437, 436, 120, 1}) {
    ASSERT_TRUE(win.showFrame(n)) << "frame " << n;
    const QImage shown = win.lastImage.convertToFormat(QImage::Format_RGB32);
    // The Viewer is larger than the 320x240 clip, so it gets the picture at full size.
    ASSERT_EQ(shown.size(), QSize(kWidth, kHeight)) << "frame " << n;
    const double same = psnr(shown, ffmpegFrame(clip, n, tmp.path()));
    const double before = psnr(shown, ffmpegFrame(clip, n - 1, tmp.path()));
    const double after = psnr(shown, ffmpegFrame(clip, n + 1, tmp.path()));
    std::printf("frame %d: PSNR vs ffmpeg frame N %.1f dB, N-1 %.1f dB, N+1 %.1f dB\n", n, same,
                before, after);
    EXPECT_GT(same, 30.0) << "frame " << n;
    EXPECT_LT(before, same - 5.0) << "frame " << n << " looks like its predecessor";
    EXPECT_LT(after, same - 5.0) << "frame " << n << " looks like its successor";
  }

  // Export (frameNow) keeps reading the source: closer to ffmpeg's decode than the MJPEG proxy.
  const QImage exported = win.w.video()->frameNow(437);
  const QImage reference = ffmpegFrame(clip, 437, tmp.path());
  ASSERT_TRUE(win.showFrame(437));
  const double sourcePsnr = psnr(exported.convertToFormat(QImage::Format_RGB32), reference);
  const double proxyPsnr = psnr(win.lastImage.convertToFormat(QImage::Format_RGB32), reference);
  std::printf("frame 437: frameNow %.1f dB, proxy display %.1f dB\n", sourcePsnr, proxyPsnr);
  EXPECT_GT(sourcePsnr, proxyPsnr + 3.0);

  // View > Step on intra proxy off: back to the source, same playhead.
  win.w.stepOnProxyAction()->setChecked(false);
  EXPECT_FALSE(win.w.video()->displayingProxy());
  ASSERT_TRUE(win.showFrame(436));
  EXPECT_GT(
      psnr(win.lastImage.convertToFormat(QImage::Format_RGB32), ffmpegFrame(clip, 436, tmp.path())),
      sourcePsnr - 3.0);
  win.w.stepOnProxyAction()->setChecked(true);
  EXPECT_TRUE(win.w.video()->displayingProxy());
}

TEST(SteppingProxy, ReopeningReusesTheVerifiedProxy) {
  testsupport::TempFolder tmp("stridemark-proxy-");
  const fs::path clip = makeLongGopClip(tmp.path());
  const fs::path proxyDir = tmp / "cache";
  {
    Window first(proxyDir);
    ASSERT_TRUE(first.w.openVideo(QString::fromStdString(clip.string())));
    ASSERT_TRUE(test::waitUntil([&] { return first.w.video()->displayingProxy(); }, 120000));
  }
  const auto proxies = filesIn(proxyDir);
  ASSERT_EQ(proxies.size(), 1u);
  const auto written = fs::last_write_time(proxies.front());
  Window second(proxyDir);
  ASSERT_TRUE(second.w.openVideo(QString::fromStdString(clip.string())));
  EXPECT_TRUE(second.w.video()->displayingProxy()) << "no rebuild: the proxy is on disk";
  EXPECT_FALSE(second.w.proxyProgressBar()->isVisible());
  EXPECT_EQ(fs::last_write_time(proxies.front()), written);
}

// Settings > Frame cache applies at once: a clip opened with room for its whole keyframe spacing
// gets no proxy; shrinking the budget below it offers one, as opening the clip would have.
TEST(SteppingProxy, ShrinkingTheFrameCacheOffersTheProxyAtOnce) {
  testsupport::TempFolder tmp("stridemark-proxy-");
  const fs::path clip = makeLongGopClip(tmp.path());
  const fs::path proxyDir = tmp / "cache";
  Window win(proxyDir);
  win.w.setFrameCacheBudget(std::size_t{1} << 30);  // 1 GiB: the 600-frame GOP fits (~70 MB)
  ASSERT_TRUE(win.w.openVideo(QString::fromStdString(clip.string())));
  EXPECT_FALSE(win.w.video()->proxyAdvised());
  EXPECT_FALSE(win.w.video()->proxyBuilding());
  EXPECT_FALSE(win.w.proxyCancelButton()->isVisible());
  win.watchFrames();
  ASSERT_TRUE(win.showFrame(10));
  const std::int64_t bigWindow = win.w.video()->stats().windowFrames;
  EXPECT_GT(bigWindow, 0);

  win.w.setFrameCacheBudget(kSmallBudget);
  EXPECT_EQ(win.w.video()->budget(), kSmallBudget);
  EXPECT_LT(win.w.video()->stats().windowFrames, bigWindow) << "the source's cache shrank";
  EXPECT_TRUE(win.w.video()->proxyAdvised());
  EXPECT_TRUE(win.w.video()->proxyBuilding() || win.w.video()->hasProxy());
  EXPECT_TRUE(win.w.proxyCancelButton()->isVisible() || win.w.video()->hasProxy());
  EXPECT_EQ(QSettings().value(QStringLiteral("video/cacheBudgetMiB")).toULongLong(),
            kSmallBudget >> 20);
  if (win.w.video()->proxyBuilding()) win.w.proxyCancelButton()->click();
  win.w.setFrameCacheBudget(std::size_t{1} << 30);  // leave the saved setting as it was
}

TEST(SteppingProxy, CancelLeavesNoFileAndTheSourceKeepsWorking) {
  testsupport::TempFolder tmp("stridemark-proxy-");
  const fs::path clip = makeLongGopClip(tmp.path());
  const fs::path proxyDir = tmp / "cache";
  Window win(proxyDir);
  ASSERT_TRUE(win.w.openVideo(QString::fromStdString(clip.string())));
  win.watchFrames();
  auto* cancel = win.w.proxyCancelButton();
  ASSERT_TRUE(cancel->isVisible());
  EXPECT_FALSE(cancel->accessibleName().isEmpty());
  EXPECT_TRUE(cancel->focusPolicy() & Qt::TabFocus) << "the Cancel button is keyboard reachable";
  cancel->click();
  EXPECT_FALSE(win.w.video()->proxyBuilding());
  EXPECT_FALSE(win.w.video()->hasProxy());
  EXPECT_FALSE(cancel->isVisible());
  EXPECT_TRUE(win.w.statusBar()->currentMessage().contains(QStringLiteral("cancelled")))
      << win.w.statusBar()->currentMessage().toStdString();
  EXPECT_TRUE(filesIn(proxyDir).empty()) << "a cancelled build leaves nothing behind";
  ASSERT_TRUE(win.showFrame(250));
  EXPECT_GT(
      psnr(win.lastImage.convertToFormat(QImage::Format_RGB32), ffmpegFrame(clip, 250, tmp.path())),
      30.0);
}

TEST(SteppingProxy, UnwritableCacheGivesAStatusMessageAndTheSourceKeepsWorking) {
  testsupport::TempFolder tmp("stridemark-proxy-");
  const fs::path clip = makeLongGopClip(tmp.path());
  // A folder cannot be made below a regular file, so the proxy cannot be written.
  const fs::path blocker = tmp / "not_a_folder";
  testsupport::writeText(blocker, "x");
  Window win(blocker / "cache");
  ASSERT_TRUE(win.w.openVideo(QString::fromStdString(clip.string())));
  win.watchFrames();
  ASSERT_TRUE(test::waitUntil([&] { return !win.w.video()->proxyBuilding(); }, 60000));
  EXPECT_FALSE(win.w.video()->hasProxy());
  EXPECT_TRUE(win.w.statusBar()->currentMessage().contains(QStringLiteral("proxy")))
      << win.w.statusBar()->currentMessage().toStdString();
  ASSERT_TRUE(win.showFrame(599));
  ASSERT_TRUE(win.showFrame(598));
}

}  // namespace
}  // namespace stridemark::ui
