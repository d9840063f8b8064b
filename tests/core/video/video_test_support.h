#pragma once
// Test clips made at test time with the Debian ffmpeg CLI (no binaries in git), and the
// reference hashes of every frame from `ffmpeg -f framemd5`.
#include <cstdint>
#include <ostream>
#include <string>
#include <vector>

namespace stridemark::video::testing {

struct ClipRecipe {
  std::string name;       // file name inside the clip folder, e.g. "h264_bframes.mp4"
  std::string arguments;  // ffmpeg arguments between "-y" and the output path
};

// Short test names in gtest/ctest output (instead of a byte dump of the recipe).
inline void PrintTo(const ClipRecipe& recipe, std::ostream* os) {
  *os << recipe.name;
}

// Folder under the build tree where generated clips live.
std::string clipFolder();

// Runs a shell command; returns its exit code and stdout.
int runCommand(const std::string& command, std::string* output = nullptr);

// Makes the clip once (kept between runs; written to a temp name, then renamed, so parallel
// tests never see half a file). Fails the test with ffmpeg's message when it cannot.
std::string makeClip(const ClipRecipe& recipe);

// Source of truth for frame exactness: the MD5 of each decoded frame's raw planes in
// presentation order, as `ffmpeg -f framemd5` prints it (vsync passthrough, first video stream).
std::vector<std::string> referenceFrameMd5(const std::string& path);

// Seed for shuffled orders: STRIDEMARK_TEST_SEED when set, else random. Printed by the caller.
std::uint64_t testSeed();

// The awkward clips of issue 3, item 8.
std::vector<ClipRecipe> awkwardClips();
ClipRecipe clipNamed(const std::string& name);

}  // namespace stridemark::video::testing
