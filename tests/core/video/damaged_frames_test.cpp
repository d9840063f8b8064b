// Issue 17 item 11: frames the decoder cannot decode. `probe` lists them (findDamagedFrames),
// `frame N` on one fails naming it, and a span that tolerates damage (the marked-clip export)
// skips exactly those frames and goes on. Which frames are undecodable is what the ffmpeg CLI
// says: the frames missing from `ffmpeg -f framemd5`.
#include <gtest/gtest.h>

#include <filesystem>
#include <fstream>
#include <iterator>
#include <memory>
#include <random>
#include <set>
#include <sstream>

#include "common/error.h"
#include "tests/support/damaged_clip.h"
#include "video/damage_scan.h"
#include "video/frame_index.h"
#include "video/frame_reader.h"
#include "video_test_support.h"

extern "C" {
#include <libavutil/log.h>
}

namespace stridemark::video {
namespace {

namespace fs = std::filesystem;

// A copy of `source` named `name` whose `frames` have corrupted packets.
std::string damagedCopy(const std::string& source, const std::string& name,
                        const std::vector<std::int64_t>& frames) {
  const std::string path = testing::clipFolder() + "/" + name;
  fs::copy_file(source, path, fs::copy_options::overwrite_existing);
  testsupport::damagePackets(path, frames);
  return path;
}

// Source: the ffmpeg CLI. Frame numbers (pts in the 1/25 time base of a 25 fps clip) that
// `ffmpeg -f framemd5` does not output.
std::set<std::int64_t> framesFfmpegCannotDecode(const std::string& path, std::int64_t count) {
  std::string out;
  testing::runCommand("ffmpeg -nostdin -v quiet -i '" + path +
                          "' -map 0:v:0 -fps_mode passthrough -f framemd5 - 2>/dev/null",
                      &out);
  EXPECT_NE(out.find("#tb 0: 1/25"), std::string::npos) << out.substr(0, 400);
  return testsupport::framesMissingFromFramemd5(out, 0, count - 1);
}

class DamagedFrames : public ::testing::Test {
 protected:
  void SetUp() override {
    av_log_set_level(AV_LOG_QUIET);
    source_ = testing::makeClip(testing::clipNamed("h264_bframes_gop250.mp4"));
    ASSERT_FALSE(HasFailure());
    path_ = damagedCopy(source_, "damaged_packets.mp4", {40, 41, 177});
    expected_ = framesFfmpegCannotDecode(path_, 300);
    index_ = std::make_shared<const FrameIndex>(FrameIndex::build(path_));
  }
  std::string source_;
  std::string path_;
  std::set<std::int64_t> expected_;
  std::shared_ptr<const FrameIndex> index_;
};

TEST_F(DamagedFrames, ProbeFindsTheFramesFfmpegCannotDecode) {
  // Common practice, no source: the corruption must really break frames for the test to count.
  ASSERT_FALSE(expected_.empty());
  std::set<std::int64_t> found;
  for (const auto& d : findDamagedFrames(path_, *index_)) {
    found.insert(d.frame);
    EXPECT_FALSE(d.reason.empty());
  }
  std::cout << "damaged frames: ffmpeg cannot decode " << expected_.size() << ", probe lists "
            << found.size() << "\n";
  EXPECT_EQ(found, expected_);
  // Source: the undamaged clip decodes completely in ffmpeg, and probe lists nothing.
  EXPECT_TRUE(findDamagedFrames(source_, FrameIndex::build(source_)).empty());
}

TEST_F(DamagedFrames, FrameOnADamagedFrameFailsNamingIt) {
  ASSERT_FALSE(expected_.empty());
  const std::int64_t bad = *expected_.begin();
  FrameReader reader(path_, index_);
  try {
    reader.frameAt(bad);
    ADD_FAILURE() << "frame " << bad << " decoded although ffmpeg cannot decode it";
  } catch (const Error& e) {
    // Source: issue 17 item 11: a clear message naming the frame.
    EXPECT_NE(std::string(e.what()).find("frame " + std::to_string(bad) + " is damaged"),
              std::string::npos)
        << e.what();
  }
  // Common practice, no source: frames before the damage are still exact.
  const std::vector<std::string> reference = testing::referenceFrameMd5(source_);
  EXPECT_EQ(reader.frameAt(bad - 5).md5(), reference[static_cast<std::size_t>(bad - 5)]);
}

TEST_F(DamagedFrames, TolerantSpanSkipsExactlyTheDamagedFramesAndFinishes) {
  FrameReader reader(path_, index_, ReaderOptions{2, true});
  std::set<std::int64_t> skipped;
  std::int64_t delivered = 0;
  const std::int64_t last = reader.decodeSpan(
      0, 299,
      [&](DecodedFrame&&) {
        ++delivered;
        return true;
      },
      [&](std::int64_t n, const std::string& reason) {
        EXPECT_FALSE(reason.empty());
        skipped.insert(n);
      });
  EXPECT_EQ(last, 299);
  EXPECT_EQ(skipped, expected_);
  EXPECT_EQ(delivered + static_cast<std::int64_t>(skipped.size()), 300);
}

// Common practice, no source: no false alarms on the awkward but whole clips.
TEST(DamagedFramesWholeClips, NoneListedForWholeClips) {
  av_log_set_level(AV_LOG_QUIET);
  for (const auto& recipe : testing::awkwardClips()) {
    const std::string path = testing::makeClip(recipe);
    const auto damage = findDamagedFrames(path, FrameIndex::build(path));
    EXPECT_TRUE(damage.empty()) << recipe.name << ": frame " << damage.front().frame << " "
                                << damage.front().reason;
  }
}

}  // namespace
}  // namespace stridemark::video
