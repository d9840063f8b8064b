// Issue 17 item 10: clips with a display rotation. Frames come out upright, byte for byte what
// `ffmpeg -f framemd5` gives (the ffmpeg CLI turns such frames by default, -autorotate).
#include <gtest/gtest.h>

#include <memory>
#include <string>

#include "video/frame_index.h"
#include "video/frame_reader.h"
#include "video/video_info.h"
#include "video_test_support.h"

extern "C" {
#include <libavutil/log.h>
}

namespace stridemark::video {
namespace {

// A stream copy of `base` whose display matrix asks for `tag` degrees (the old rotate tag,
// which FFmpeg 5.1's muxers turn into a display matrix).
std::string rotatedCopy(const std::string& base, int tag, const std::string& extension) {
  testing::ClipRecipe recipe{"rotate" + std::to_string(tag) + "_" + base + extension,
                             "-i " + testing::clipFolder() + "/" + base +
                                 " -c copy -metadata:s:v rotate=" + std::to_string(tag)};
  return testing::makeClip(recipe);
}

class RotatedClip : public ::testing::TestWithParam<int> {
 protected:
  void SetUp() override { av_log_set_level(AV_LOG_ERROR); }
};

TEST_P(RotatedClip, FramesAreUprightAndMatchFfmpeg) {
  testing::makeClip(testing::clipNamed("h264_bframes_gop250.mp4"));
  const std::string path = rotatedCopy("h264_bframes_gop250.mp4", GetParam(), "");
  ASSERT_FALSE(HasFailure());
  // Source: ffmpeg's framemd5 muxer of the autorotated frames (ffmpeg(1), -autorotate).
  const std::vector<std::string> reference = testing::referenceFrameMd5(path);
  ASSERT_EQ(reference.size(), 300u);
  auto index = std::make_shared<const FrameIndex>(FrameIndex::build(path));
  FrameReader reader(path, index);
  ASSERT_TRUE(reader.rotation().applied) << reader.rotation().notApplied;
  // Source: `ffprobe -show_streams` of these copies (FFmpeg 5.1) reports side data
  // rotation=90, -180 and -90 for rotate=90, 180 and 270: the same angle modulo 360.
  EXPECT_EQ(reader.rotation().degrees, GetParam());
  int wrong = 0;
  reader.decodeSpan(0, 299, [&](DecodedFrame&& frame) {
    // Source: the clip is 160x120 stored; a quarter turn swaps the sides.
    EXPECT_EQ(frame.width(), GetParam() == 180 ? 160 : 120);
    EXPECT_EQ(frame.height(), GetParam() == 180 ? 120 : 160);
    if (frame.md5() != reference[static_cast<std::size_t>(frame.index())]) ++wrong;
    return true;
  });
  for (const std::int64_t n : {251, 7, 299, 0}) {
    if (reader.frameAt(n).md5() != reference[static_cast<std::size_t>(n)]) ++wrong;
  }
  EXPECT_EQ(wrong, 0) << "frames differing from ffmpeg's upright frames, rotate=" << GetParam();

  const VideoInfo info = describeVideo(path, *index);
  EXPECT_TRUE(info.rotation.applied);
  EXPECT_EQ(info.width, GetParam() == 180 ? 160 : 120);
  EXPECT_EQ(info.storedWidth, 160);
  bool warned = false;
  for (const auto& w : info.warnings) warned = warned || w.find("upright") != std::string::npos;
  EXPECT_TRUE(warned) << "probe should say the frames are turned upright";
}

INSTANTIATE_TEST_SUITE_P(Video, RotatedClip, ::testing::Values(90, 180, 270));

TEST(RotatedClip422, HalfTurnIsAppliedQuarterTurnIsReportedNotApplied) {
  av_log_set_level(AV_LOG_ERROR);
  testing::makeClip(testing::clipNamed("prores_422_10bit.mov"));
  const std::string half = rotatedCopy("prores_422_10bit.mov", 180, "");
  const std::string quarter = rotatedCopy("prores_422_10bit.mov", 90, "");
  ASSERT_FALSE(HasFailure());
  // Source: ffmpeg turns 180 degrees with hflip+vflip, which keep yuv422p10le.
  const std::vector<std::string> reference = testing::referenceFrameMd5(half);
  auto index = std::make_shared<const FrameIndex>(FrameIndex::build(half));
  FrameReader reader(half, index);
  ASSERT_TRUE(reader.rotation().applied);
  for (std::int64_t n = 0; n < index->frameCount(); ++n)
    ASSERT_EQ(reader.frameAt(n).md5(), reference[static_cast<std::size_t>(n)]) << "frame " << n;
  // Common practice, no source: a quarter turn of 4:2:2 cannot be an exact copy (ffmpeg
  // converts the pixel format first), so it is left as stored and probe says so.
  const VideoInfo info = describeVideo(quarter, FrameIndex::build(quarter));
  EXPECT_EQ(info.rotation.degrees, 90);
  EXPECT_FALSE(info.rotation.applied);
  bool warned = false;
  for (const auto& w : info.warnings) warned = warned || w.find("NOT applied") != std::string::npos;
  EXPECT_TRUE(warned);
}

}  // namespace
}  // namespace stridemark::video
