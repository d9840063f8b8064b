#include "video_test_support.h"

#include <gtest/gtest.h>

#include <unistd.h>
#include <array>
#include <cstdio>
#include <cstdlib>
#include <filesystem>
#include <memory>
#include <random>
#include <sstream>

namespace stridemark::video::testing {

namespace {

// Every clip: 160x120 (odd one 321x241), 60..300 frames, testsrc2 with temporal noise so frames
// differ.
std::string source(const std::string& size, const std::string& rate, int frames) {
  return "-f lavfi -i testsrc2=size=" + size + ":rate=" + rate +
         ",noise=alls=12:allf=t -frames:v " + std::to_string(frames) + " ";
}

struct PipeCloser {
  void operator()(FILE* f) const { pclose(f); }
};

}  // namespace

std::string clipFolder() {
  const std::string folder = std::string(STRIDEMARK_BINARY_DIR) + "/test-clips/video";
  std::filesystem::create_directories(folder);
  return folder;
}

int runCommand(const std::string& command, std::string* output) {
  FILE* pipe = popen(command.c_str(), "r");
  if (!pipe) return -1;
  std::string text;
  std::array<char, 4096> buffer{};
  std::size_t got = 0;
  while ((got = fread(buffer.data(), 1, buffer.size(), pipe)) > 0) text.append(buffer.data(), got);
  const int status = pclose(pipe);
  if (output) *output = text;
  return WIFEXITED(status) ? WEXITSTATUS(status) : -1;
}

std::string makeClip(const ClipRecipe& recipe) {
  const std::string path = clipFolder() + "/" + recipe.name;
  if (std::filesystem::exists(path)) return path;
  if (recipe.name == "edit_list.mp4") makeClip(clipNamed("h264_bframes_gop250.mp4"));
  const std::string temp = clipFolder() + "/.part-" + std::to_string(getpid()) + "-" + recipe.name;
  std::string log;
  const std::string command =
      "ffmpeg -nostdin -v error -y " + recipe.arguments + " '" + temp + "' 2>&1";
  const int rc = runCommand(command, &log);
  if (rc != 0) {
    ADD_FAILURE() << "cannot make test clip " << recipe.name << " (is Debian's ffmpeg "
                  << "installed?)\n"
                  << command << "\n"
                  << log;
    return path;
  }
  std::filesystem::rename(temp, path);
  return path;
}

std::vector<std::string> referenceFrameMd5(const std::string& path) {
  // Source: ffmpeg's own framemd5 muxer (ffmpeg-formats(1), "framemd5"): one line per frame,
  // MD5 of the rawvideo packet = planes packed without padding, in native pixel format.
  std::string out;
  const int rc = runCommand("ffmpeg -nostdin -v error -i '" + path +
                                "' -map 0:v:0 -fps_mode passthrough -f framemd5 - 2>/dev/null",
                            &out);
  EXPECT_EQ(rc, 0) << "ffmpeg -f framemd5 failed on " << path;
  std::vector<std::string> hashes;
  std::istringstream lines(out);
  std::string line;
  while (std::getline(lines, line)) {
    if (line.empty() || line[0] == '#') continue;
    const auto comma = line.rfind(',');
    std::string hash = line.substr(comma + 1);
    hash.erase(0, hash.find_first_not_of(' '));
    hashes.push_back(hash);
  }
  return hashes;
}

std::uint64_t testSeed() {
  if (const char* text = std::getenv("STRIDEMARK_TEST_SEED"))
    return std::strtoull(text, nullptr, 10);
  return std::random_device{}();
}

std::vector<ClipRecipe> awkwardClips() {
  const std::string x264 = "-c:v libx264 -preset veryfast -pix_fmt yuv420p -sc_threshold 0 ";
  return {
      // H.264 with B-frames (3) and a 250-frame GOP.
      {"h264_bframes_gop250.mp4", source("160x120", "25", 300) + x264 + "-bf 3 -g 250"},
      // The same with one keyframe only.
      {"h264_one_keyframe.mp4",
       source("160x120", "25", 240) + x264 + "-bf 3 -x264-params keyint=infinite:scenecut=0"},
      // HEVC, x265's default open GOP (CRA + leading RASL frames), short GOP for many CRAs.
      {"hevc_open_gop.mp4",
       source("160x120", "25", 200) +
           "-c:v libx265 -preset veryfast -pix_fmt yuv420p -tag:v hvc1 -x265-params "
           "keyint=48:min-keyint=48:open-gop=1:bframes=4:scenecut=0:log-level=error"},
      // MJPEG in AVI (intra only, full-range yuvj).
      {"mjpeg.avi", source("160x120", "25", 150) + "-c:v mjpeg -q:v 5 -pix_fmt yuvj420p"},
      // An MP4 whose edit list hides the first 52 frames (stream copy from 2.1 s of a clip whose
      // only keyframe before is frame 0).
      {"edit_list.mp4", "-ss 2.1 -i " + clipFolder() + "/h264_bframes_gop250.mp4 -c copy -t 6"},
      // Variable frame rate: 25 fps for 100 frames, then 50 fps.
      {"vfr.mp4", source("160x120", "50", 200) +
                      "-vf \"setpts='if(lt(N\\,100)\\,2*N\\,100+N)/(50*TB)'\" -fps_mode vfr " +
                      x264 + "-bf 2 -g 60 -video_track_timescale 1000"},
      // Odd dimensions, FFV1 in Matroska.
      {"odd_321x241.mkv", source("321x241", "25", 120) + "-c:v ffv1 -pix_fmt yuv420p -g 30"},
      // 10-bit 4:2:2: ProRes 422 in MOV.
      {"prores_422_10bit.mov",
       source("160x120", "25", 60) + "-c:v prores_ks -profile:v 2 -pix_fmt yuv422p10le"},
      // 1000 fps MP4 with B-frames.
      {"h264_1000fps.mp4", source("160x120", "1000", 300) + x264 + "-bf 2 -g 100"},
  };
}

ClipRecipe clipNamed(const std::string& name) {
  for (auto& recipe : awkwardClips())
    if (recipe.name == name) return recipe;
  ADD_FAILURE() << "no clip recipe named " << name;
  return {};
}

}  // namespace stridemark::video::testing
