// Pictures made ahead in the direction of travel (ui/session/video_source): a step that continues
// the last one is answered at once with the next frame's picture, which must be exactly the
// frame asked for (checked against the ffmpeg CLI's decode) and never a stale one after a
// jump or a change of display size.
#include <gtest/gtest.h>

#include <QImage>
#include <filesystem>
#include <vector>

#include "tests/support/process.h"
#include "tests/ui/frame_reference.h"
#include "tests/ui/test_support.h"
#include "ui/session/video_source.h"

namespace stridemark::ui {
namespace {

namespace fs = std::filesystem;

constexpr int kWidth = 320, kHeight = 240;

fs::path makeClip(const fs::path& dir) {
  const fs::path clip = dir / "steps.mp4";
  const auto r = testsupport::runShell(
      "ffmpeg -v error -y -f lavfi -i testsrc2=size=320x240:rate=30 -frames:v 90 -c:v libx264 "
      "-preset veryfast -g 30 -pix_fmt yuv420p " +
      testsupport::shellQuote(clip.string()));
  EXPECT_EQ(r.exitCode, 0) << r.err;
  return clip;
}

// Records every picture the source hands out and whether it came inside request().
struct Recorder {
  explicit Recorder(VideoSource& source) : source_(source) {
    QObject::connect(&source, &VideoSource::frameReady, [this](qint64 f, const QImage& image) {
      frame = f;
      picture = image.copy();
      ++received;
    });
  }
  // Asks for `n` and waits for it; true when it came at once (no trip through the decoder).
  bool show(std::int64_t n) {
    const int before = received;
    source_.request(n);
    const bool atOnce = received > before && frame == n;
    EXPECT_TRUE(test::waitUntil([&] { return received > before && frame == n; }));
    // Let the work queued behind the paint run, as the event loop would before the next key.
    test::waitUntil([] { return false; }, 30);
    return atOnce;
  }
  VideoSource& source_;
  std::int64_t frame = -1;
  QImage picture;
  int received = 0;
};

// Source: the ffmpeg CLI's decode of the same frame (the fast display conversion is within a
// few levels: well above 30 dB) and of its neighbours (clearly worse: testsrc2 moves).
void expectFrame(const QImage& shown, const fs::path& clip, int n, const fs::path& dir) {
  const double same = test::psnr(shown, test::ffmpegFrameBgra(clip, n, kWidth, kHeight, dir));
  const double next = test::psnr(shown, test::ffmpegFrameBgra(clip, n + 1, kWidth, kHeight, dir));
  const double prev = test::psnr(shown, test::ffmpegFrameBgra(clip, n - 1, kWidth, kHeight, dir));
  EXPECT_GT(same, 30.0) << "frame " << n;
  EXPECT_GT(same, next + 3.0) << "frame " << n;
  EXPECT_GT(same, prev + 3.0) << "frame " << n;
}

TEST(PrepareAhead, ContinuedStepsGetTheRightPictureAtOnce) {
  testsupport::TempFolder tmp("stridemark-prepare-");
  const fs::path clip = makeClip(tmp.path());
  VideoSource source(QString::fromStdString(clip.string()));
  Recorder rec(source);
  rec.show(12);  // decodes and caches the neighbourhood
  rec.show(10);
  rec.show(11);  // a step of +1: the picture of 12 is made behind the paint
  EXPECT_EQ(source.preparedFrame(), 12);
  const auto madeAhead = source.preparedShown();
  const auto lookups = source.stats().hits + source.stats().misses;
  EXPECT_TRUE(rec.show(12));
  EXPECT_EQ(source.preparedShown(), madeAhead + 1);
  // The server still followed the step (its decode-ahead and refills plan from the user's
  // frame): one look-up for frame 12, and none for making the picture ahead.
  EXPECT_EQ(source.stats().hits + source.stats().misses, lookups + 1);
  expectFrame(rec.picture, clip, 12, tmp.path());

  // Backwards: 12 -> 11 is a step of -1, so 10 is made ahead.
  rec.show(11);
  EXPECT_EQ(source.preparedFrame(), 10);
  EXPECT_TRUE(rec.show(10));
  EXPECT_EQ(source.preparedShown(), madeAhead + 2);
  expectFrame(rec.picture, clip, 10, tmp.path());
}

TEST(PrepareAhead, JumpsAndSizeChangesNeverShowAStalePicture) {
  testsupport::TempFolder tmp("stridemark-prepare-");
  const fs::path clip = makeClip(tmp.path());
  VideoSource source(QString::fromStdString(clip.string()));
  Recorder rec(source);
  rec.show(40);
  rec.show(20);
  rec.show(21);  // prepares 22
  const auto madeAhead = source.preparedShown();
  rec.show(40);  // a jump: the picture of 22 must not be used, nor one predicted from the jump
  EXPECT_EQ(source.preparedShown(), madeAhead);
  EXPECT_EQ(rec.frame, 40);
  expectFrame(rec.picture, clip, 40, tmp.path());
  EXPECT_EQ(source.preparedFrame(), -1);  // 19 frames on: a jump, not a step; no guess

  rec.show(41);                                 // prepares 42 at full size
  source.setDisplaySize(QSize(160, 120), 1.0);  // re-sends 41 at the new size
  test::waitUntil([&] { return rec.picture.size() == QSize(160, 120); });
  rec.show(42);
  EXPECT_EQ(rec.frame, 42);
  EXPECT_EQ(rec.picture.size(), QSize(160, 120));  // not the full-size picture made before
}

}  // namespace
}  // namespace stridemark::ui
