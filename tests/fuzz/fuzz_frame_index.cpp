// libFuzzer target: the frame-index sidecar reader (video::FrameIndex::loadSidecar). The
// signature the sidecar must match is taken from the input itself (bytes 12..35, where the
// writer puts it), so mutations reach the packet table instead of stopping at the signature.
// A sidecar either loads or is refused (nullopt); a loaded index answers every lookup without
// crashing.
#include <algorithm>
#include <cstdint>
#include <cstring>

#include "common/error.h"
#include "fuzz_support.h"
#include "video/frame_index.h"

namespace {

stridemark::video::VideoSignature signatureIn(const std::uint8_t* data, std::size_t size) {
  stridemark::video::VideoSignature signature;
  constexpr std::size_t kAt = 12;  // after the 8-byte magic and the 4-byte version
  if (size >= kAt + 24) {
    std::memcpy(&signature.fileSize, data + kAt, 8);
    std::memcpy(&signature.headHash, data + kAt + 8, 8);
    std::memcpy(&signature.tailHash, data + kAt + 16, 8);
  }
  return signature;
}

void lookUpEverything(const stridemark::video::FrameIndex& index) {
  const std::int64_t count = index.frameCount();
  const std::int64_t samples[] = {0, count / 2, count - 1};
  for (const std::int64_t n : samples) {
    const auto& entry = index.frame(n);
    stridemark::fuzz::keep(index.keyPacketFor(n));
    stridemark::fuzz::keep(index.keyPacketFor(n, 2));
    stridemark::fuzz::keep(index.frameForPts(entry.pts));
  }
  stridemark::fuzz::keep(index.maxKeyframeInterval());
  stridemark::fuzz::keep(static_cast<std::int64_t>(index.damagedFrames().size()));
  try {
    index.frame(count);  // one past the end: must be refused, not read
    stridemark::fuzz::require(false, "frame(count) is refused");
  } catch (const stridemark::Error&) {
  }
}

}  // namespace

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  static stridemark::fuzz::InputFile file(".smindex");
  const auto index =
      stridemark::video::FrameIndex::loadSidecar(file.write(data, size), signatureIn(data, size));
  if (index) lookUpEverything(*index);
  return 0;
}
