// Found by tests/fuzz (fuzz_frame_index): a sidecar whose packet count is damaged made
// FrameIndex::loadSidecar size its table from that count before reading a single packet. For a
// large video (the count is only checked against the video's size) that is terabytes, and the
// allocation failure escaped as std::bad_alloc / std::length_error instead of "rebuild the
// index". The count is now checked against the bytes the sidecar really holds.
#include <gtest/gtest.h>

#include <cstdint>
#include <filesystem>
#include <fstream>
#include <string>

#include "video/frame_index.h"

namespace stridemark::video {
namespace {

template <typename T>
void put(std::ofstream& out, T value) {
  out.write(reinterpret_cast<const char*>(&value), sizeof value);
}

// The sidecar layout of frame_index.cpp (version 1): magic, version, signature, stream, time
// base, synthesised flag, missing packets, packet count, then the packets.
void writeHeader(const std::string& path, const VideoSignature& signature, std::uint64_t count) {
  std::ofstream out(path, std::ios::binary | std::ios::trunc);
  out.write("SMKFIDX\n", 8);
  put(out, FrameIndex::kSidecarVersion);
  put(out, signature.fileSize);
  put(out, signature.headHash);
  put(out, signature.tailHash);
  put(out, std::int32_t{0});
  put(out, std::int64_t{1});
  put(out, std::int64_t{120});
  put(out, std::uint8_t{0});
  put(out, std::int64_t{0});
  put(out, count);
  // One whole packet record: pts, dts, pos, size, flags (keyframe).
  put(out, std::int64_t{0});
  put(out, std::int64_t{0});
  put(out, std::int64_t{48});
  put(out, std::int32_t{100});
  put(out, std::uint8_t{1});
}

TEST(SidecarCount, ACountBeyondTheRecordsIsRefusedWithoutSizingATable) {
  const auto folder = std::filesystem::temp_directory_path() / "stridemark-sidecar-count";
  std::filesystem::create_directories(folder);
  const std::string path = (folder / "damaged.smindex").string();
  // A 4 TiB video: its signature allows up to 2^42 packets.
  const VideoSignature signature{std::uint64_t{1} << 42, 0x1234, 0x5678};
  writeHeader(path, signature, std::uint64_t{1} << 41);
  // Common practice, no source: a damaged cache is a cache miss (the caller rebuilds it).
  std::optional<FrameIndex> loaded;
  EXPECT_NO_THROW(loaded = FrameIndex::loadSidecar(path, signature));
  EXPECT_FALSE(loaded.has_value());
  // The same header with the count it really holds still loads.
  writeHeader(path, signature, 1);
  loaded = FrameIndex::loadSidecar(path, signature);
  ASSERT_TRUE(loaded.has_value());
  EXPECT_EQ(loaded->frameCount(), 1);
  std::filesystem::remove_all(folder);
}

}  // namespace
}  // namespace stridemark::video
