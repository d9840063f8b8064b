#pragma once
// Test helpers for damaged clips: corrupt chosen frames' packets of a real clip in place, and
// read which frames the ffmpeg CLI's framemd5 output leaves out (the frames it cannot decode).
#include <cstdint>
#include <filesystem>
#include <fstream>
#include <iterator>
#include <random>
#include <set>
#include <sstream>
#include <string>
#include <vector>

#include "video/frame_index.h"

namespace stridemark::testsupport {

// Overwrites every byte of the packets of `frames` (length prefixes included) with the same
// pseudo-random bytes on every run.
inline void damagePackets(const std::filesystem::path& path,
                          const std::vector<std::int64_t>& frames) {
  const video::FrameIndex index = video::FrameIndex::build(path.string());
  std::string bytes;
  {
    std::ifstream in(path, std::ios::binary);
    bytes.assign(std::istreambuf_iterator<char>(in), {});
  }
  std::mt19937_64 rng(11);
  for (const std::int64_t n : frames) {
    const video::PacketEntry& p = index.frame(n);
    for (std::int32_t i = 0; i < p.size; ++i)
      bytes[static_cast<std::size_t>(p.pos + i)] = static_cast<char>(rng() & 0xff);
  }
  std::ofstream(path, std::ios::binary | std::ios::trunc)
      .write(bytes.data(), static_cast<std::streamsize>(bytes.size()));
}

// Frames in [first, last] whose pts (in the clip's frame time base) is absent from the text of
// `ffmpeg -f framemd5` (lines "stream, dts, pts, duration, size, md5").
inline std::set<std::int64_t> framesMissingFromFramemd5(const std::string& framemd5,
                                                        std::int64_t first, std::int64_t last) {
  std::set<std::int64_t> missing;
  for (std::int64_t n = first; n <= last; ++n) missing.insert(n);
  std::istringstream lines(framemd5);
  std::string line;
  while (std::getline(lines, line)) {
    if (line.empty() || line[0] == '#') continue;
    std::istringstream fields(line);
    std::string stream, dts, pts;
    std::getline(fields, stream, ',');
    std::getline(fields, dts, ',');
    std::getline(fields, pts, ',');
    missing.erase(std::stoll(pts));
  }
  return missing;
}

}  // namespace stridemark::testsupport
