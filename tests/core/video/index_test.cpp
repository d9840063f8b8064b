// Index, sidecar cache and probe figures against ffprobe / known clip recipes.
#include <gtest/gtest.h>

#include <cstdlib>
#include <filesystem>
#include <fstream>

#include "common/error.h"
#include "video/frame_index.h"
#include "video/video_info.h"
#include "video_test_support.h"

extern "C" {
#include <libavutil/log.h>
}

namespace stridemark::video {
namespace {

namespace fs = std::filesystem;

class IndexTest : public ::testing::Test {
 protected:
  void SetUp() override { av_log_set_level(AV_LOG_ERROR); }
};

TEST_F(IndexTest, EditListClipReallyHasAnEditListAndHidesLeadingFrames) {
  const std::string path = testing::makeClip(testing::clipNamed("edit_list.mp4"));
  // Source: ffprobe's trace log of the mov demuxer lists the 'elst' box it parsed.
  std::string log;
  testing::runCommand("ffprobe -v trace '" + path + "' 2>&1", &log);
  ASSERT_NE(log.find("type:'elst'"), std::string::npos) << "the test clip has no edit list";
  const FrameIndex index = FrameIndex::build(path);
  std::int64_t hidden = 0;
  for (const auto& p : index.packets()) hidden += p.discarded ? 1 : 0;
  EXPECT_GT(hidden, 0) << "packets before the edit start are decoded but never shown";
  EXPECT_EQ(index.frameCount(), static_cast<std::int64_t>(testing::referenceFrameMd5(path).size()));
}

TEST_F(IndexTest, KeyframesAndCountMatchFfprobePackets) {
  const std::string path = testing::makeClip(testing::clipNamed("h264_bframes_gop250.mp4"));
  // Source: ffprobe -show_packets (demux only), flags column has K for keyframes.
  std::string csv;
  testing::runCommand(
      "ffprobe -v error -select_streams v:0 -show_entries packet=pts,flags -of csv=p=0 '" + path +
          "'",
      &csv);
  std::istringstream lines(csv);
  std::string line;
  std::vector<std::int64_t> keyPts;
  std::int64_t packets = 0;
  while (std::getline(lines, line)) {
    if (line.empty()) continue;
    ++packets;
    const auto comma = line.find(',');
    if (line.find('K', comma) != std::string::npos)
      keyPts.push_back(std::stoll(line.substr(0, comma)));
  }
  const FrameIndex index = FrameIndex::build(path);
  EXPECT_EQ(static_cast<std::int64_t>(index.packets().size()), packets);
  std::vector<std::int64_t> ours;
  for (const auto& p : index.packets())
    if (p.keyframe) ours.push_back(p.pts);
  EXPECT_EQ(ours, keyPts);
  // The recipe asks for a keyframe every 250 frames: frames 0 and 250.
  ASSERT_EQ(index.frameCount(), 300);
  EXPECT_TRUE(index.frame(0).keyframe);
  EXPECT_TRUE(index.frame(250).keyframe);
  EXPECT_EQ(index.maxKeyframeInterval(), 250);
  EXPECT_EQ(index.packets()[static_cast<std::size_t>(index.keyPacketFor(249))].frame, 0);
  EXPECT_EQ(index.packets()[static_cast<std::size_t>(index.keyPacketFor(250))].frame, 250);
}

TEST_F(IndexTest, SidecarRoundTripAndStaleSidecarIsRebuilt) {
  const std::string source = testing::makeClip(testing::clipNamed("mjpeg.avi"));
  const std::string path = testing::clipFolder() + "/sidecar-copy.avi";
  const std::string sidecar = path + ".smidx";
  fs::copy_file(source, path, fs::copy_options::overwrite_existing);
  fs::remove(sidecar);

  const FrameIndex first = FrameIndex::buildOrLoad(path, sidecar);
  EXPECT_FALSE(first.loadedFromSidecar());
  EXPECT_TRUE(first.sidecarWritten());
  const FrameIndex second = FrameIndex::buildOrLoad(path, sidecar);
  EXPECT_TRUE(second.loadedFromSidecar());
  ASSERT_EQ(second.frameCount(), first.frameCount());
  for (std::int64_t n = 0; n < first.frameCount(); ++n) {
    EXPECT_EQ(second.frame(n).pts, first.frame(n).pts);
    EXPECT_EQ(second.frame(n).pos, first.frame(n).pos);
  }
  // Replace the video by a different clip under the same name: the sidecar is stale.
  const std::string other = testing::makeClip(testing::clipNamed("prores_422_10bit.mov"));
  fs::copy_file(other, path, fs::copy_options::overwrite_existing);
  const FrameIndex third = FrameIndex::buildOrLoad(path, sidecar);
  EXPECT_FALSE(third.loadedFromSidecar());
  EXPECT_EQ(third.frameCount(), 60);
  // A damaged sidecar is ignored, not trusted.
  std::ofstream(sidecar, std::ios::binary | std::ios::trunc) << "garbage";
  const FrameIndex fourth = FrameIndex::buildOrLoad(path, sidecar);
  EXPECT_FALSE(fourth.loadedFromSidecar());
  EXPECT_EQ(fourth.frameCount(), 60);
}

TEST_F(IndexTest, CommandLineIndexCacheIsPerUserAndReusedWhileTheFileIsUnchanged) {
  const std::string cache = testing::clipFolder() + "/index-cache";
  fs::remove_all(cache);
  ::setenv("STRIDEMARK_INDEX_CACHE", cache.c_str(), 1);
  const std::string path = testing::makeClip(testing::clipNamed("mjpeg.avi"));
  const std::string sidecar = defaultSidecarPath(path);
  EXPECT_EQ(fs::path(sidecar).parent_path(), fs::path(cache));
  // The same file named another way maps to the same sidecar.
  EXPECT_EQ(defaultSidecarPath(testing::clipFolder() + "/./mjpeg.avi"), sidecar);
  const FrameIndex first = FrameIndex::openCached(path);
  EXPECT_FALSE(first.loadedFromSidecar());
  EXPECT_TRUE(fs::exists(sidecar));
  const FrameIndex second = FrameIndex::openCached(path);
  EXPECT_TRUE(second.loadedFromSidecar());
  EXPECT_EQ(second.frameCount(), first.frameCount());
  EXPECT_EQ(probeVideo(path).frameCount, first.frameCount());
  ::setenv("STRIDEMARK_INDEX_CACHE", "off", 1);
  EXPECT_TRUE(defaultSidecarPath(path).empty());
  EXPECT_FALSE(FrameIndex::openCached(path).loadedFromSidecar());
  ::unsetenv("STRIDEMARK_INDEX_CACHE");
}

TEST_F(IndexTest, ProbeReportsRatesSizeAndGop) {
  const VideoInfo info = probeVideo(testing::makeClip(testing::clipNamed("h264_1000fps.mp4")));
  EXPECT_EQ(info.frameCount, 300);
  EXPECT_EQ(info.width, 160);
  EXPECT_EQ(info.height, 120);
  EXPECT_EQ(info.codec, "h264");
  EXPECT_EQ(info.pixelFormat, "yuv420p");
  EXPECT_EQ(info.fileRate, (Rational{1000, 1}));
  EXPECT_EQ(info.indexRate, (Rational{1000, 1}));
  EXPECT_EQ(info.captureRate, (Rational{1000, 1}));
  EXPECT_NEAR(info.durationSeconds, 0.3, 1e-9);
  EXPECT_EQ(info.keyframeInterval.max, 100);
  EXPECT_FALSE(info.variableFrameRate);
}

TEST_F(IndexTest, ProbeWarnsAboutVariableFrameRate) {
  const VideoInfo info = probeVideo(testing::makeClip(testing::clipNamed("vfr.mp4")));
  EXPECT_TRUE(info.variableFrameRate);
  EXPECT_FALSE(info.warnings.empty());
}

TEST_F(IndexTest, ProbeWarnsAboutACoarseTimeBase) {
  // Matroska stores 1 ms timestamps: at 1000 fps that is one tick per frame.
  testing::makeClip(testing::clipNamed("h264_1000fps.mp4"));
  const std::string mkv = testing::makeClip(
      {"h264_1000fps.mkv", "-i " + testing::clipFolder() + "/h264_1000fps.mp4 -c copy"});
  const VideoInfo coarse = probeVideo(mkv);
  bool coarseWarned = false;
  for (const auto& w : coarse.warnings) coarseWarned |= w.find("too coarse") != std::string::npos;
  EXPECT_TRUE(coarseWarned);
}

TEST_F(IndexTest, ProbeDerivesTheRateFromTimestampsNotFromCounting) {
  // Stretch every timestamp 33x (a 1000 fps capture stored for playback at ~30 fps): the
  // frame count stays 300, the timestamp rate becomes 1000/33 and the capture rate is left
  // for the user to set (no capture-rate metadata in this file).
  testing::makeClip(testing::clipNamed("h264_1000fps.mp4"));
  const std::string retimed = testing::makeClip(
      {"retimed.mp4", "-itsscale 33 -i " + testing::clipFolder() + "/h264_1000fps.mp4 -c copy"});
  const VideoInfo slow = probeVideo(retimed);
  EXPECT_EQ(slow.frameCount, 300);
  EXPECT_NEAR(slow.indexRate.toDouble(), 1000.0 / 33.0, 0.01);
  EXPECT_FALSE(slow.captureRateFromMetadata);
}

}  // namespace
}  // namespace stridemark::video
