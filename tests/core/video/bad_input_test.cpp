// Bad input (issue 3 item 7): each case gives a clear stridemark::Error naming the file, or for
// damage inside a clip a usable index with the damaged frames reported. Never a crash or hang.
#include <gtest/gtest.h>

#include <filesystem>
#include <fstream>

#include "common/error.h"
#include "video/frame_index.h"
#include "video/frame_reader.h"
#include "video/video_info.h"
#include "video_test_support.h"

extern "C" {
#include <libavutil/log.h>
}

namespace stridemark::video {
namespace {

namespace fs = std::filesystem;

std::string scratchFile(const std::string& name) {
  return testing::clipFolder() + "/bad-" + name;
}

// Expects probeVideo to throw Error whose message names the file and contains `words`.
void expectClearError(const std::string& path, const std::string& words) {
  try {
    probeVideo(path);
    ADD_FAILURE() << "no error for " << path;
  } catch (const Error& e) {
    const std::string message = e.what();
    EXPECT_NE(message.find(path), std::string::npos) << message;
    EXPECT_NE(message.find(words), std::string::npos) << message;
  }
}

void copyPrefix(const std::string& from, const std::string& to, double fraction) {
  std::ifstream in(from, std::ios::binary);
  std::vector<char> bytes((std::istreambuf_iterator<char>(in)), {});
  bytes.resize(static_cast<std::size_t>(static_cast<double>(bytes.size()) * fraction));
  std::ofstream(to, std::ios::binary)
      .write(bytes.data(), static_cast<std::streamsize>(bytes.size()));
}

class BadInput : public ::testing::Test {
 protected:
  void SetUp() override { av_log_set_level(AV_LOG_QUIET); }
};

TEST_F(BadInput, MissingFile) {
  expectClearError(scratchFile("does-not-exist.mp4"), "not found");
}

TEST_F(BadInput, ZeroBytes) {
  const std::string path = scratchFile("empty.mp4");
  std::ofstream(path, std::ios::trunc).close();
  expectClearError(path, "empty");
}

TEST_F(BadInput, TextFileNamedMp4) {
  const std::string path = scratchFile("notes.mp4");
  std::ofstream(path) << "limb,event,frame\nLH,touchdown,12\nThis is not a video.\n";
  expectClearError(path, "not a video file");
}

TEST_F(BadInput, NoVideoStream) {
  const std::string path = testing::makeClip(
      {"bad-audio-only.m4a", "-f lavfi -i sine=frequency=440:duration=1 -c:a aac"});
  expectClearError(path, "no video stream");
}

TEST_F(BadInput, TruncatedMp4WithIndexAtTheEnd) {
  // ffmpeg writes the sample table (moov) last by default: cutting the file loses it.
  const std::string source = testing::makeClip(testing::clipNamed("h264_bframes_gop250.mp4"));
  const std::string path = scratchFile("truncated-moov-last.mp4");
  copyPrefix(source, path, 0.6);
  expectClearError(path, "not a video file");
}

TEST_F(BadInput, TruncatedMp4WithIndexAtTheStartKeepsTheFramesThatArePresent) {
  testing::makeClip(testing::clipNamed("h264_bframes_gop250.mp4"));  // the source, first
  const std::string source = testing::makeClip(
      {"faststart.mp4",
       "-i " + testing::clipFolder() + "/h264_bframes_gop250.mp4 -c copy -movflags +faststart"});
  const std::string path = scratchFile("truncated-faststart.mp4");
  copyPrefix(source, path, 0.6);
  const auto index = std::make_shared<const FrameIndex>(FrameIndex::build(path));
  EXPECT_GT(index->missingPackets(), 0);
  EXPECT_GT(index->frameCount(), 100);
  EXPECT_LT(index->frameCount(), 300);
  const VideoInfo info = describeVideo(path, *index);
  bool warned = false;
  for (const auto& w : info.warnings) warned = warned || w.find("ends early") != std::string::npos;
  EXPECT_TRUE(warned);
  // Every listed frame either decodes or fails with a clear error; nothing crashes.
  FrameReader reader(path, index);
  std::int64_t decoded = 0;
  for (std::int64_t n = 0; n < index->frameCount(); ++n) {
    try {
      reader.frameAt(n);
      ++decoded;
    } catch (const Error& e) {
      EXPECT_NE(std::string(e.what()).find("frame " + std::to_string(n)), std::string::npos);
    }
  }
  EXPECT_GT(decoded, 100);
}

TEST_F(BadInput, CorruptPacketInTheMiddleIsReportedNotFatal) {
  // Overwrite the middle of frame 70's JPEG data in an MJPEG AVI with garbage.
  const std::string source = testing::makeClip(testing::clipNamed("mjpeg.avi"));
  const std::string path = scratchFile("corrupt-middle.avi");
  fs::copy_file(source, path, fs::copy_options::overwrite_existing);
  const FrameIndex clean = FrameIndex::build(path);
  const PacketEntry& victim = clean.frame(70);
  {
    std::fstream file(path, std::ios::binary | std::ios::in | std::ios::out);
    file.seekp(victim.pos + 8 + victim.size / 3);
    const std::string garbage(static_cast<std::size_t>(victim.size / 3), '\xA5');
    file.write(garbage.data(), static_cast<std::streamsize>(garbage.size()));
  }
  const auto index = std::make_shared<const FrameIndex>(FrameIndex::build(path));
  EXPECT_EQ(index->frameCount(), clean.frameCount()) << "damage must not lose frames";
  FrameReader reader(path, index);
  const auto reference = testing::referenceFrameMd5(source);
  for (std::int64_t n = 0; n < index->frameCount(); ++n) {
    try {
      const DecodedFrame frame = reader.frameAt(n);
      ASSERT_EQ(frame.index(), n);
      // Undamaged frames are still bit-exact; the damaged one differs (or is flagged).
      if (n != 70) {
        EXPECT_EQ(frame.md5(), reference[static_cast<std::size_t>(n)]) << n;
      } else {
        EXPECT_TRUE(frame.damaged || frame.md5() != reference[70]);
      }
    } catch (const Error& e) {
      EXPECT_EQ(n, 70) << e.what();
      EXPECT_NE(std::string(e.what()).find("frame 70"), std::string::npos) << e.what();
    }
  }
}

TEST_F(BadInput, FrameOutsideTheClipIsASeekError) {
  const std::string path = testing::makeClip(testing::clipNamed("mjpeg.avi"));
  auto index = std::make_shared<const FrameIndex>(FrameIndex::build(path));
  FrameReader reader(path, index);
  EXPECT_THROW(reader.frameAt(-1), Error);
  EXPECT_THROW(reader.frameAt(index->frameCount()), Error);
}

}  // namespace
}  // namespace stridemark::video
