// Found by tests/fuzz (fuzz_frame_index): a sidecar whose packet count was only checked against
// the video's size made FrameIndex::loadSidecar reserve its table from that count before
// reading a single packet. For a large video that is terabytes, and the allocation failure
// escaped as std::bad_alloc instead of "rebuild the index". The count must also fit the lines
// the sidecar really holds.
#include <gtest/gtest.h>

#include <cstdint>
#include <filesystem>
#include <fstream>
#include <string>

#include "common/checksum.h"
#include "video/frame_index.h"

namespace stridemark::video {
namespace {

// A version-2 sidecar (frame_index_sidecar.cpp) with a correct checksum around `payload`.
void writeSidecar(const std::string& path, const std::string& payload) {
  std::ofstream(path, std::ios::binary | std::ios::trunc)
      << "SMKFIDX " << FrameIndex::kSidecarVersion << " fnv1a64=" << fnv1a64Hex(payload)
      << " bytes=" << payload.size() << "\n"
      << payload;
}

std::string payloadWithCount(const VideoSignature& signature, std::uint64_t count) {
  return "signature " + signatureText(signature) + "\nstream 0 1 120 0 0 " + std::to_string(count) +
         "\n0 0 48 100 1\n";
}

TEST(SidecarCount, ACountBeyondTheLinesIsRefusedWithoutSizingATable) {
  const auto folder = std::filesystem::temp_directory_path() / "stridemark-sidecar-count";
  std::filesystem::create_directories(folder);
  const std::string path = (folder / "crafted.smindex").string();
  // A 4 TiB video: its size alone would allow 2^42 packets.
  const VideoSignature signature{std::uint64_t{1} << 42, 0x1234, 0x5678};
  writeSidecar(path, payloadWithCount(signature, std::uint64_t{1} << 41));
  // Common practice, no source: a damaged cache is a cache miss (the caller rebuilds it).
  std::optional<FrameIndex> loaded;
  std::string why;
  EXPECT_NO_THROW(loaded = FrameIndex::loadSidecar(path, signature, &why));
  EXPECT_FALSE(loaded.has_value());
  EXPECT_NE(why.find("bad stream line"), std::string::npos) << why;
  // The same sidecar with the count it really holds still loads.
  writeSidecar(path, payloadWithCount(signature, 1));
  loaded = FrameIndex::loadSidecar(path, signature, &why);
  ASSERT_TRUE(loaded.has_value()) << why;
  EXPECT_EQ(loaded->frameCount(), 1);
  std::filesystem::remove_all(folder);
}

}  // namespace
}  // namespace stridemark::video
