// Every frame of each awkward clip, forwards, backwards and shuffled, against ffmpeg.
// Source of truth: `ffmpeg -f framemd5` of the same file (issue 3 item 8).
#include <gtest/gtest.h>

#include <algorithm>
#include <numeric>
#include <random>

#include "video/frame_index.h"
#include "video/frame_reader.h"
#include "video/frame_server.h"
#include "video_test_support.h"

extern "C" {
#include <libavutil/log.h>
}

namespace stridemark::video {
namespace {

using testing::ClipRecipe;

class AwkwardClip : public ::testing::TestWithParam<ClipRecipe> {
 protected:
  void SetUp() override {
    av_log_set_level(AV_LOG_ERROR);
    path_ = testing::makeClip(GetParam());
    ASSERT_FALSE(HasFailure());
    reference_ = testing::referenceFrameMd5(path_);
    ASSERT_FALSE(reference_.empty()) << path_;
    index_ = std::make_shared<const FrameIndex>(FrameIndex::build(path_));
  }

  void expectFrame(FrameReader& reader, std::int64_t n, const char* order) {
    const DecodedFrame frame = reader.frameAt(n);
    ASSERT_EQ(frame.index(), n);
    ASSERT_EQ(frame.md5(), reference_[static_cast<std::size_t>(n)])
        << order << " order, frame " << n << " of " << path_;
  }

  std::string path_;
  std::vector<std::string> reference_;
  std::shared_ptr<const FrameIndex> index_;
};

TEST_P(AwkwardClip, IndexCountsTheFramesFfmpegDecodes) {
  EXPECT_EQ(index_->frameCount(), static_cast<std::int64_t>(reference_.size()));
}

TEST_P(AwkwardClip, ForwardEveryFrame) {
  FrameReader reader(path_, index_);
  for (std::int64_t n = 0; n < index_->frameCount(); ++n) {
    expectFrame(reader, n, "forward");
    if (HasFatalFailure()) return;
  }
  EXPECT_LE(reader.seekCount(), 1) << "forward stepping should decode on, not seek";
}

TEST_P(AwkwardClip, BackwardEveryFrame) {
  FrameReader reader(path_, index_);
  for (std::int64_t n = index_->frameCount() - 1; n >= 0; --n) {
    expectFrame(reader, n, "backward");
    if (HasFatalFailure()) return;
  }
}

TEST_P(AwkwardClip, ShuffledEveryFrame) {
  const std::uint64_t seed = testing::testSeed();
  std::cout << "shuffle seed " << seed << " (set STRIDEMARK_TEST_SEED to repeat)\n";
  std::vector<std::int64_t> order(static_cast<std::size_t>(index_->frameCount()));
  std::iota(order.begin(), order.end(), 0);
  std::mt19937_64 rng(seed);
  std::shuffle(order.begin(), order.end(), rng);
  FrameReader reader(path_, index_, ReaderOptions{2, true});
  for (const std::int64_t n : order) {
    expectFrame(reader, n, "shuffled");
    if (HasFatalFailure()) return;
  }
}

TEST_P(AwkwardClip, ServerBackwardWalkMatchesFfmpeg) {
  FrameServerOptions options;
  options.budgetBytes = 64ull << 20;
  FrameServer server(path_, index_, options);
  for (std::int64_t n = index_->frameCount() - 1; n >= 0; --n) {
    const auto frame = server.get(n);
    ASSERT_EQ(frame->md5(), reference_[static_cast<std::size_t>(n)])
        << "server backward walk, frame " << n << " of " << path_;
  }
}

INSTANTIATE_TEST_SUITE_P(Video, AwkwardClip, ::testing::ValuesIn(testing::awkwardClips()),
                         [](const auto& param) {
                           std::string name = param.param.name;
                           for (char& c : name)
                             if (!std::isalnum(static_cast<unsigned char>(c))) c = '_';
                           return name;
                         });

}  // namespace
}  // namespace stridemark::video
