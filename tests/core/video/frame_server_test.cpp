// FrameServer: backward walks equal forward hashes, cancellation, byte budget.
// Source of truth for pixels: `ffmpeg -f framemd5` of the same file.
#include <gtest/gtest.h>

#include <atomic>
#include <chrono>
#include <cmath>
#include <condition_variable>
#include <mutex>
#include <thread>

#include "common/error.h"
#include "video/convert.h"
#include "video/frame_reader.h"
#include "video/frame_server.h"
#include "video_test_support.h"

extern "C" {
#include <libavutil/log.h>
}

namespace stridemark::video {
namespace {

class FrameServerTest : public ::testing::Test {
 protected:
  void SetUp() override {
    av_log_set_level(AV_LOG_ERROR);
    path_ = testing::makeClip(testing::clipNamed("h264_bframes_gop250.mp4"));
    reference_ = testing::referenceFrameMd5(path_);
    index_ = std::make_shared<const FrameIndex>(FrameIndex::build(path_));
    ASSERT_EQ(index_->frameCount(), static_cast<std::int64_t>(reference_.size()));
  }
  std::string md5At(std::int64_t n) const { return reference_[static_cast<std::size_t>(n)]; }

  std::string path_;
  std::vector<std::string> reference_;
  std::shared_ptr<const FrameIndex> index_;
};

TEST_F(FrameServerTest, ForwardThenBackwardWalkGivesTheSameFrames) {
  FrameServer server(path_, index_);
  std::vector<std::string> forward;
  for (std::int64_t n = 0; n < server.frameCount(); ++n) forward.push_back(server.get(n)->md5());
  for (std::int64_t n = server.frameCount() - 1; n >= 0; --n)
    ASSERT_EQ(server.get(n)->md5(), forward[static_cast<std::size_t>(n)]) << n;
  for (std::int64_t n = 0; n < server.frameCount(); ++n)
    ASSERT_EQ(forward[static_cast<std::size_t>(n)], md5At(n));
}

TEST_F(FrameServerTest, BackwardStepsAreMostlyCacheHits) {
  FrameServer server(path_, index_);
  server.get(server.frameCount() - 1);
  for (std::int64_t n = server.frameCount() - 2; n >= 0; --n) {
    ASSERT_EQ(server.get(n)->md5(), md5At(n)) << n;
    std::this_thread::sleep_for(std::chrono::milliseconds(2));  // a person holding the key
  }
  const FrameServerStats stats = server.stats();
  // Each step re-decoding its GOP would be ~300 misses; windows make it a handful.
  EXPECT_LT(stats.misses, 12) << "hits " << stats.hits;
  EXPECT_GT(stats.windowRefills, 0);
}

TEST_F(FrameServerTest, ByteBudgetIsRespected) {
  FrameServerOptions options;
  const std::size_t frameBytes = FrameServer(path_, index_).get(0)->bytes();
  options.budgetBytes = 40 * frameBytes;
  FrameServer server(path_, index_, options);
  for (std::int64_t n = server.frameCount() - 1; n >= 0; n -= 3)
    ASSERT_EQ(server.get(n)->md5(), md5At(n));
  for (std::int64_t n = 0; n < server.frameCount(); n += 7)
    ASSERT_EQ(server.get(n)->md5(), md5At(n));
  const FrameServerStats stats = server.stats();
  EXPECT_LE(stats.peakCachedBytes, options.budgetBytes);
  EXPECT_LE(stats.cachedBytes, options.budgetBytes);
  // 40 frames: a reserve of 40/8 = 5 behind the playhead, 35 ahead, refills of half that.
  EXPECT_EQ(stats.windowFrames, 17);
  // Lowering the budget evicts at once.
  server.setBudget(5 * frameBytes);
  EXPECT_LE(server.stats().cachedBytes, 5 * frameBytes);
  EXPECT_EQ(server.get(123)->md5(), md5At(123));
}

TEST_F(FrameServerTest, ALaterRequestCancelsAnEarlierOneAndNothingIsLost) {
  FrameServerOptions options;
  options.budgetBytes = 64ull << 20;
  FrameServer server(path_, index_, options);
  std::mutex mutex;
  std::condition_variable done;
  std::map<std::int64_t, std::string> answers;  // frame -> md5 or "cancelled"
  int calls = 0;
  auto callback = [&](std::int64_t n, std::shared_ptr<const DecodedFrame> frame,
                      std::exception_ptr error) {
    std::lock_guard lock(mutex);
    ++calls;
    EXPECT_FALSE(error);
    if (frame) {
      EXPECT_EQ(frame->index(), n);
    }
    answers[n] = frame ? frame->md5() : "cancelled";
    done.notify_all();
  };
  // Far-apart frames deep inside GOPs: each costs a long decode, so later ones supersede.
  const std::vector<std::int64_t> targets = {240, 120, 299, 200, 60};
  for (const std::int64_t n : targets) server.request(n, callback);
  std::unique_lock lock(mutex);
  ASSERT_TRUE(done.wait_for(lock, std::chrono::seconds(60), [&] { return calls == 5; }));
  // The last request always arrives, exact; the others are exact or cancelled, never wrong.
  EXPECT_EQ(answers[60], md5At(60));
  int cancelled = 0;
  for (const std::int64_t n : targets) {
    if (answers[n] == "cancelled") {
      ++cancelled;
    } else {
      EXPECT_EQ(answers[n], md5At(n)) << n;
    }
  }
  EXPECT_GT(cancelled, 0) << "requests queued behind a long decode should be superseded";
}

TEST_F(FrameServerTest, TryGetNeverBlocksAndEventuallyHasTheFrame) {
  FrameServer server(path_, index_);
  std::shared_ptr<const DecodedFrame> frame;
  const auto deadline = std::chrono::steady_clock::now() + std::chrono::seconds(30);
  while (!(frame = server.tryGet(180)) && std::chrono::steady_clock::now() < deadline)
    std::this_thread::sleep_for(std::chrono::milliseconds(5));
  ASSERT_TRUE(frame);
  EXPECT_EQ(frame->md5(), md5At(180));
}

// Common practice, no source: a look-up made ahead of the user changes nothing the user's own
// steps drive (playhead, hit/miss counts, decode demands).
TEST_F(FrameServerTest, PeekChangesNothing) {
  FrameServerOptions options;  // 40 frames: decode-ahead never reaches the clip's end from 30
  options.budgetBytes = 40 * FrameServer(path_, index_).get(0)->bytes();
  FrameServer server(path_, index_, options);
  const auto shown = server.get(30);
  ASSERT_TRUE(shown);
  const auto deadline = std::chrono::steady_clock::now() + std::chrono::seconds(30);
  while (!server.peek(31) && std::chrono::steady_clock::now() < deadline)  // decode-ahead
    std::this_thread::sleep_for(std::chrono::milliseconds(5));
  const FrameServerStats before = server.stats();
  const auto next = server.peek(31);
  ASSERT_TRUE(next);
  EXPECT_EQ(next->md5(), md5At(31));
  EXPECT_EQ(server.peek(server.frameCount() - 1), nullptr);  // far away: not decoded, not asked for
  const FrameServerStats after = server.stats();
  EXPECT_EQ(after.hits, before.hits);
  EXPECT_EQ(after.misses, before.misses);
  std::this_thread::sleep_for(std::chrono::milliseconds(300));
  EXPECT_EQ(server.peek(server.frameCount() - 1), nullptr);  // still not decoded: no demand
}

TEST_F(FrameServerTest, OutOfRangeIsASeekError) {
  FrameServer server(path_, index_);
  EXPECT_THROW(server.get(-1), Error);
  EXPECT_THROW(server.get(server.frameCount()), Error);
}

TEST_F(FrameServerTest, RgbaConversionMatchesFfmpeg) {
  // Source: ffmpeg's swscale via the CLI (-pix_fmt rgba, rawvideo) for frame 37; our
  // conversion must produce the same bytes for the same source frame.
  FrameServer server(path_, index_);
  const auto frame = server.get(37);
  std::vector<std::uint8_t> rgba(static_cast<std::size_t>(frame->width() * frame->height() * 4));
  FrameConverter converter;
  converter.convert(*frame, PackedFormat::rgba, rgba.data(), frame->width() * 4);
  std::string out;
  testing::runCommand("ffmpeg -nostdin -v error -i '" + path_ +
                          "' -vf \"select=eq(n\\,37)\" -fps_mode passthrough -frames:v 1 "
                          "-sws_flags neighbor+accurate_rnd -pix_fmt rgba -f rawvideo - ",
                      &out);
  ASSERT_EQ(out.size(), rgba.size());
  std::size_t maxDiff = 0;
  for (std::size_t i = 0; i < rgba.size(); ++i)
    maxDiff = std::max<std::size_t>(
        maxDiff,
        static_cast<std::size_t>(std::abs(static_cast<int>(rgba[i]) -
                                          static_cast<int>(static_cast<std::uint8_t>(out[i])))));
  EXPECT_LE(maxDiff, 2u) << "RGBA differs from ffmpeg's by more than rounding";
}

namespace {

std::string ffmpegFrame37(const std::string& path, const std::string& filters,
                          const std::string& flags, const std::string& pixFmt) {
  std::string out;
  testing::runCommand("ffmpeg -nostdin -v error -i '" + path + "' -vf \"select=eq(n\\,37)" +
                          filters + "\" -fps_mode passthrough -frames:v 1 -sws_flags " + flags +
                          " -pix_fmt " + pixFmt + " -f rawvideo - ",
                      &out);
  return out;
}

double psnr(const std::vector<std::uint8_t>& ours, const std::string& theirs) {
  double sum = 0;
  for (std::size_t i = 0; i < ours.size(); ++i) {
    const double d = static_cast<double>(ours[i]) - static_cast<unsigned char>(theirs[i]);
    sum += d * d;
  }
  const double mse = sum / static_cast<double>(ours.size());
  return mse == 0 ? 99.0 : 10.0 * std::log10(255.0 * 255.0 / mse);
}

}  // namespace

TEST_F(FrameServerTest, FastDisplayConversionStaysWithinRoundingOfFfmpeg) {
  // Source: ffmpeg's swscale via the CLI without accurate rounding (its SIMD path) for frame
  // 37; the Viewer's fast conversion must give the same picture to rounding.
  FrameServer server(path_, index_);
  const auto frame = server.get(37);
  std::vector<std::uint8_t> bgra(static_cast<std::size_t>(frame->width() * frame->height() * 4));
  FrameConverter converter(ConversionQuality::fast);
  converter.convert(*frame, PackedFormat::bgra, bgra.data(), frame->width() * 4);
  const std::string out = ffmpegFrame37(path_, "", "neighbor", "bgra");
  ASSERT_EQ(out.size(), bgra.size());
  int maxDiff = 0;
  for (std::size_t i = 0; i < bgra.size(); ++i)
    maxDiff = std::max(maxDiff, std::abs(static_cast<int>(bgra[i]) -
                                         static_cast<int>(static_cast<unsigned char>(out[i]))));
  EXPECT_LE(maxDiff, 3) << "fast BGRA differs from ffmpeg's by more than rounding";
}

TEST_F(FrameServerTest, ScaledDisplayConversionLooksLikeFfmpegsScaler) {
  // Source: ffmpeg's scale filter (bilinear / area) via the CLI. Resamplers differ in detail,
  // and this 160x120 clip is mostly per-pixel temporal noise, which shows every kernel
  // difference, so the check is PSNR above 24 dB (common practice, no source) and that the
  // neighbouring frame 38 is at least 3 dB further away (about 21 dB here).
  FrameServer server(path_, index_);
  const auto frame = server.get(37);
  const auto next = server.get(38);
  FrameConverter converter(ConversionQuality::fast);
  struct Case {
    int width, height;
    const char* flags;
  };
  // Downscale by 0.78 (plain bilinear) and by 0.4 (halved first, then bilinear).
  for (const Case c :
       {Case{frame->width() * 78 / 100 / 2 * 2, frame->height() * 78 / 100 / 2 * 2, "bilinear"},
        Case{frame->width() * 2 / 5 / 2 * 2, frame->height() * 2 / 5 / 2 * 2, "area"}}) {
    std::vector<std::uint8_t> ours(static_cast<std::size_t>(c.width * c.height * 4));
    std::vector<std::uint8_t> neighbour(ours.size());
    converter.convertScaled(*frame, PackedFormat::bgra, ours.data(), c.width * 4, c.width,
                            c.height);
    converter.convertScaled(*next, PackedFormat::bgra, neighbour.data(), c.width * 4, c.width,
                            c.height);
    const std::string theirs =
        ffmpegFrame37(path_, ",scale=" + std::to_string(c.width) + ":" + std::to_string(c.height),
                      c.flags, "bgra");
    ASSERT_EQ(theirs.size(), ours.size());
    const double same = psnr(ours, theirs);
    const double other = psnr(neighbour, theirs);
    EXPECT_GT(same, 24.0) << c.width << "x" << c.height << " other " << other;
    EXPECT_GT(same, other + 3.0) << c.width << "x" << c.height;
  }
}

TEST_F(FrameServerTest, OneConverterServesFullRangeAndLimitedRangeFramesAlike) {
  // Common practice, no source: a converter's cached state must not leak between frames of
  // different pixel formats (yuv420p from H.264, yuvj420p/422p from MJPEG): each picture must
  // equal what a fresh converter makes of it.
  const std::string mjpeg = testing::makeClip(testing::clipNamed("mjpeg.avi"));
  FrameReader limited(path_, index_);
  FrameReader full(mjpeg, std::make_shared<const FrameIndex>(FrameIndex::build(mjpeg)));
  const DecodedFrame a = limited.frameAt(5);
  const DecodedFrame b = full.frameAt(5);
  ASSERT_NE(a.pixelFormat(), b.pixelFormat());
  const auto picture = [](FrameConverter& converter, const DecodedFrame& f) {
    std::vector<std::uint8_t> out(static_cast<std::size_t>(f.width() * f.height() * 4));
    converter.convert(f, PackedFormat::bgra, out.data(), f.width() * 4);
    return out;
  };
  for (const auto quality : {ConversionQuality::exact, ConversionQuality::fast}) {
    FrameConverter shared(quality), freshA(quality), freshB(quality);
    const auto firstA = picture(shared, a);
    const auto thenB = picture(shared, b);
    const auto againA = picture(shared, a);
    EXPECT_EQ(thenB, picture(freshB, b));
    EXPECT_EQ(firstA, picture(freshA, a));
    EXPECT_EQ(againA, firstA);
  }
}

}  // namespace
}  // namespace stridemark::video
