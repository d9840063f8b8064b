// All-intra stepping proxy: same frame numbering as the source, progress, cancel.
#include <gtest/gtest.h>

#include <cstdlib>
#include <filesystem>

#include "common/error.h"
#include "video/convert.h"
#include "video/frame_reader.h"
#include "video/frame_server.h"
#include "video/intra_proxy.h"
#include "video_test_support.h"

extern "C" {
#include <libavutil/log.h>
}

namespace stridemark::video {
namespace {

std::vector<std::uint8_t> bgra(const DecodedFrame& frame) {
  std::vector<std::uint8_t> out(static_cast<std::size_t>(frame.width() * frame.height() * 4));
  toRgba(frame, out.data(), frame.width() * 4);
  return out;
}

double meanAbsDiff(const std::vector<std::uint8_t>& a, const std::vector<std::uint8_t>& b) {
  double sum = 0;
  for (std::size_t i = 0; i < a.size(); ++i) sum += std::abs(int{a[i]} - int{b[i]});
  return sum / static_cast<double>(a.size());
}

TEST(IntraProxy, SameFrameNumberingAsTheSource) {
  av_log_set_level(AV_LOG_ERROR);
  const std::string source = testing::makeClip(testing::clipNamed("h264_one_keyframe.mp4"));
  auto index = std::make_shared<const FrameIndex>(FrameIndex::build(source));
  // One keyframe in 240 frames and a 40-frame budget (refill spans of 17 frames): the proxy
  // is advised. With 1 GiB of 1080p 4:2:0 frames (345 frames, spans of 156) a 240-frame GOP
  // steps backwards from the source; a single keyframe in 2000 frames would not.
  EXPECT_TRUE(intraProxyAdvised(*index, 40 * 28800, 28800));
  EXPECT_EQ(backwardRefillFrames(std::size_t{1} << 30, 1920 * 1080 * 3 / 2), 156);
  const std::string gop250 = testing::makeClip(testing::clipNamed("h264_bframes_gop250.mp4"));
  EXPECT_FALSE(
      intraProxyAdvised(FrameIndex::build(gop250), std::size_t{1} << 30, 1920 * 1080 * 3 / 2));
  const std::string proxyPath = testing::clipFolder() + "/proxy-one-keyframe.avi";
  std::filesystem::remove(proxyPath);
  IntraProxyJob job(source, index, proxyPath);
  auto proxyIndex = job.wait();
  EXPECT_DOUBLE_EQ(job.progress(), 1.0);
  ASSERT_EQ(proxyIndex->frameCount(), index->frameCount());
  EXPECT_TRUE(proxyIndex->isIntraOnly());
  // Each proxy frame looks like its source frame and not like the neighbours (the clip has
  // temporal noise, so neighbours differ clearly). Common practice, no source: a JPEG at
  // q=3 stays within a few grey levels on average.
  FrameReader sourceReader(source, index);
  FrameReader proxyReader(proxyPath, proxyIndex);
  for (std::int64_t n : {1, 2, 100, 101, 238}) {
    const auto proxy = bgra(proxyReader.frameAt(n));
    const double same = meanAbsDiff(proxy, bgra(sourceReader.frameAt(n)));
    const double before = meanAbsDiff(proxy, bgra(sourceReader.frameAt(n - 1)));
    const double after = meanAbsDiff(proxy, bgra(sourceReader.frameAt(n + 1)));
    EXPECT_LT(same, 4.0) << n;
    EXPECT_LT(same, before) << n;
    EXPECT_LT(same, after) << n;
  }
}

TEST(IntraProxy, CancelRemovesThePartialFile) {
  av_log_set_level(AV_LOG_ERROR);
  const std::string source = testing::makeClip(testing::clipNamed("h264_one_keyframe.mp4"));
  auto index = std::make_shared<const FrameIndex>(FrameIndex::build(source));
  const std::string proxyPath = testing::clipFolder() + "/proxy-cancelled.avi";
  std::filesystem::remove(proxyPath);
  EXPECT_THROW(buildIntraProxy(source, index, proxyPath,
                               [](std::int64_t done, std::int64_t) { return done < 10; }),
               Error);
  EXPECT_FALSE(std::filesystem::exists(proxyPath));
  EXPECT_FALSE(std::filesystem::exists(proxyPath + ".part.avi"));
}

}  // namespace
}  // namespace stridemark::video
