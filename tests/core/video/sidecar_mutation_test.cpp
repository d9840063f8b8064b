// Issue 17 item 5: a damaged or foreign index sidecar must never give a wrong frame. Every
// mutant of a real sidecar is either rejected (and the index rebuilt from the video, with a note
// saying so) or gives the very frames `ffmpeg -f framemd5` gives.
#include <gtest/gtest.h>

#include <cstdint>
#include <filesystem>
#include <fstream>
#include <iterator>
#include <memory>
#include <random>
#include <string>
#include <vector>

#include "common/error.h"
#include "video/frame_index.h"
#include "video/frame_reader.h"
#include "video_test_support.h"

extern "C" {
#include <libavutil/log.h>
}

namespace stridemark::video {
namespace {

namespace fs = std::filesystem;

using Bytes = std::string;

Bytes readBytes(const std::string& path) {
  std::ifstream in(path, std::ios::binary);
  return Bytes((std::istreambuf_iterator<char>(in)), {});
}

void writeBytes(const std::string& path, const Bytes& bytes) {
  std::ofstream(path, std::ios::binary | std::ios::trunc)
      .write(bytes.data(), static_cast<std::streamsize>(bytes.size()));
}

std::vector<Bytes> splitLines(const Bytes& bytes) {
  std::vector<Bytes> lines;
  std::size_t start = 0;
  while (start < bytes.size()) {
    const std::size_t end = bytes.find('\n', start);
    const std::size_t stop = end == Bytes::npos ? bytes.size() : end + 1;
    lines.push_back(bytes.substr(start, stop - start));
    start = stop;
  }
  return lines;
}

// 300 mutants, the same on every run: 100 byte flips, 100 truncations, 100 swaps of two
// different lines. Plain modulo on mt19937_64 keeps them the same on every standard library.
std::vector<Bytes> mutantsOf(const Bytes& original) {
  std::mt19937_64 rng(17);
  std::vector<Bytes> mutants;
  for (int i = 0; i < 100; ++i) {
    Bytes m = original;
    const std::size_t at = rng() % m.size();
    m[at] = static_cast<char>(static_cast<unsigned char>(m[at]) ^ (1 + rng() % 255));
    mutants.push_back(m);
  }
  for (int i = 0; i < 100; ++i) mutants.push_back(original.substr(0, rng() % original.size()));
  const std::vector<Bytes> lines = splitLines(original);
  for (int i = 0; i < 100 && lines.size() >= 2; ++i) {
    std::vector<Bytes> swapped = lines;
    std::size_t a = 0;
    std::size_t b = 0;
    do {
      a = rng() % lines.size();
      b = rng() % lines.size();
    } while (lines[a] == lines[b]);
    std::swap(swapped[a], swapped[b]);
    Bytes m;
    for (const auto& line : swapped) m += line;
    mutants.push_back(m);
  }
  return mutants;
}

// Which frames of the clip the index gives, checked against ffmpeg: every frame forwards, then
// a few exact seeks (the ones that use byte positions and keyframe flags). Returns how many
// frames differ; a reader error counts as one.
int wrongFrames(const std::string& path, const FrameIndex& index,
                const std::vector<std::string>& reference) {
  if (index.frameCount() != static_cast<std::int64_t>(reference.size())) return 1;
  int wrong = 0;
  try {
    auto shared = std::make_shared<const FrameIndex>(index);
    FrameReader reader(path, shared);
    reader.decodeSpan(0, index.frameCount() - 1, [&](DecodedFrame&& frame) {
      if (frame.md5() != reference[static_cast<std::size_t>(frame.index())]) ++wrong;
      return true;
    });
    for (const std::int64_t n : {299, 0, 251, 137, 249, 250}) {
      FrameReader seeker(path, shared);
      if (seeker.frameAt(n).md5() != reference[static_cast<std::size_t>(n)]) ++wrong;
    }
  } catch (const Error&) {
    ++wrong;
  }
  return wrong;
}

TEST(SidecarMutation, EveryMutantIsRejectedOrGivesFfmpegsFrames) {
  av_log_set_level(AV_LOG_QUIET);
  const std::string source = testing::makeClip(testing::clipNamed("h264_bframes_gop250.mp4"));
  ASSERT_FALSE(HasFailure());
  const std::string path = testing::clipFolder() + "/sidecar-mutants.mp4";
  const std::string sidecar = path + ".smidx";
  fs::copy_file(source, path, fs::copy_options::overwrite_existing);
  fs::remove(sidecar);
  // Source: ffmpeg's framemd5 muxer (see video_test_support.cpp).
  const std::vector<std::string> reference = testing::referenceFrameMd5(path);
  ASSERT_EQ(reference.size(), 300u);
  ASSERT_TRUE(FrameIndex::buildOrLoad(path, sidecar).sidecarWritten());
  const Bytes original = readBytes(sidecar);
  ASSERT_GT(original.size(), 100u);
  // Common practice, no source: the untouched sidecar loads and gives the right frames.
  const FrameIndex intact = FrameIndex::buildOrLoad(path, sidecar);
  ASSERT_TRUE(intact.loadedFromSidecar());
  ASSERT_EQ(wrongFrames(path, intact, reference), 0);

  const std::vector<Bytes> mutants = mutantsOf(original);
  ASSERT_EQ(mutants.size(), 300u);
  int rejected = 0;
  int accepted = 0;
  int wrongMutants = 0;
  int silentRebuilds = 0;
  for (std::size_t i = 0; i < mutants.size(); ++i) {
    writeBytes(sidecar, mutants[i]);
    const FrameIndex index = FrameIndex::buildOrLoad(path, sidecar);
    if (!index.loadedFromSidecar()) {
      ++rejected;
      // Source: issue 17 ("a bad one is rebuilt"): the rebuild says so in one line.
      if (index.sidecarProblem().empty() || index.sidecarProblem().find('\n') != std::string::npos)
        ++silentRebuilds;
      continue;
    }
    ++accepted;
    const int wrong = wrongFrames(path, index, reference);
    if (wrong > 0) {
      ++wrongMutants;
      ADD_FAILURE() << "mutant " << i << " of the sidecar was trusted and gave " << wrong
                    << " wrong frame(s)";
    }
  }
  std::cout << "sidecar mutants: " << mutants.size() << " tried, " << rejected
            << " rejected and rebuilt, " << accepted << " accepted, " << wrongMutants
            << " gave wrong frames\n";
  // Source: issue 17 item 5 (26 of 300 mutants gave a wrong frame with exit 0 before the fix).
  EXPECT_EQ(wrongMutants, 0);
  EXPECT_EQ(silentRebuilds, 0);
  // Common practice, no source: after the last rebuild the sidecar on disk is whole again.
  EXPECT_TRUE(FrameIndex::buildOrLoad(path, sidecar).loadedFromSidecar());
}

TEST(SidecarMutation, ForeignSidecarIsRebuiltWithANote) {
  av_log_set_level(AV_LOG_QUIET);
  const std::string mine = testing::makeClip(testing::clipNamed("h264_bframes_gop250.mp4"));
  const std::string other = testing::makeClip(testing::clipNamed("mjpeg.avi"));
  ASSERT_FALSE(HasFailure());
  const std::string path = testing::clipFolder() + "/sidecar-foreign.mp4";
  const std::string sidecar = path + ".smidx";
  const std::string otherSidecar = testing::clipFolder() + "/sidecar-foreign-other.smidx";
  fs::copy_file(mine, path, fs::copy_options::overwrite_existing);
  fs::remove(otherSidecar);
  ASSERT_TRUE(FrameIndex::buildOrLoad(other, otherSidecar).sidecarWritten());
  fs::copy_file(otherSidecar, sidecar, fs::copy_options::overwrite_existing);
  const FrameIndex index = FrameIndex::buildOrLoad(path, sidecar);
  // Source: issue 17 item 5: a sidecar of another video is never trusted.
  EXPECT_FALSE(index.loadedFromSidecar());
  EXPECT_EQ(index.frameCount(), 300);
  EXPECT_NE(index.sidecarProblem().find("another video"), std::string::npos)
      << index.sidecarProblem();
}

}  // namespace
}  // namespace stridemark::video
