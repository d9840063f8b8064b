// libFuzzer target: the frame-index sidecar reader (video::FrameIndex::loadSidecar, format
// version 2 of core/video/frame_index_sidecar.cpp). An input that starts with the magic is
// written as it is (the header's checks are fuzzed); any other input is taken as the payload and
// given a correct header, so mutations reach the signature, stream and packet lines instead of
// stopping at the checksum. The signature the sidecar must match is read from the payload's
// first line. A sidecar either loads or is refused (nullopt); a loaded index answers every
// lookup without crashing.
#include <algorithm>
#include <cstdint>
#include <cstdio>
#include <string>
#include <string_view>

#include "common/checksum.h"
#include "common/error.h"
#include "fuzz_support.h"
#include "video/frame_index.h"

namespace {

using stridemark::video::VideoSignature;

VideoSignature signatureIn(std::string_view payload) {
  VideoSignature s;
  unsigned long long size = 0, head = 0, tail = 0;
  const std::string firstLine(payload.substr(0, payload.find('\n')));
  if (std::sscanf(firstLine.c_str(), "signature %llu-%16llx-%16llx", &size, &head, &tail) == 3)
    s = VideoSignature{size, head, tail};
  return s;
}

std::string withHeader(std::string_view payload) {
  return "SMKFIDX " + std::to_string(stridemark::video::FrameIndex::kSidecarVersion) +
         " fnv1a64=" + stridemark::fnv1a64Hex(payload) +
         " bytes=" + std::to_string(payload.size()) + "\n" + std::string(payload);
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
  const std::string_view input = stridemark::fuzz::asText(data, size);
  const bool whole = input.substr(0, 7) == "SMKFIDX";
  const std::string_view payload =
      whole ? input.substr(std::min(input.size(), input.find('\n') + 1)) : input;
  const std::string bytes = whole ? std::string(input) : withHeader(input);
  const auto index = stridemark::video::FrameIndex::loadSidecar(
      file.write(reinterpret_cast<const std::uint8_t*>(bytes.data()), bytes.size()),
      signatureIn(payload));
  if (index) lookUpEverything(*index);
  return 0;
}
