// Benchmark: render + encode a 720p synthetic clip (the target is >= 100 frames/s on a 2-core
// machine). Prints one JSON object. The reference in the same run is Debian's ffmpeg encoding a
// generated 720p source with the same x264 preset and thread count, to show how much of the
// time is the encoder's.
#include <algorithm>
#include <chrono>
#include <cstdio>
#include <filesystem>
#include <iostream>
#include <string>

#include <opencv2/core.hpp>

#include "synth/synth.h"
#include "video/encoder.h"

namespace {

using Clock = std::chrono::steady_clock;
namespace fs = std::filesystem;

double secondsSince(Clock::time_point start) {
  return std::chrono::duration<double>(Clock::now() - start).count();
}

}  // namespace

int main(int argc, char** argv) {
  using namespace stridemark;
  const int frames = argc > 1 ? std::stoi(argv[1]) : 480;
  const int threads = 2;
  synth::SynthOptions o;
  o.limbs = model::LimbSet::quadruped();
  o.timeline.captureRate = {120, 1};
  o.gaits = {"walk:" + std::to_string(frames / 240.0), "trot:" + std::to_string(frames / 240.0)};
  o.render.width = 1280;
  o.render.height = 720;
  // Default generator settings (no sensor noise), as `stridemark synth` without effect flags.
  const synth::Timeline timeline = synth::makeTimeline(o);
  synth::Renderer renderer(timeline, o.render);

  // Render only.
  cv::Mat frame;
  auto start = Clock::now();
  for (std::int64_t f = 0; f < timeline.frameCount(); ++f) renderer.render(f, frame);
  const double renderS = secondsSince(start);

  // Render + encode, as `stridemark synth` does (its default preset), then with the preset the
  // samples use for small files.
  const fs::path out = fs::temp_directory_path() / "stridemark-synth-bench.mp4";
  auto renderEncode = [&](const std::string& preset, std::uintmax_t& bytes) {
    const auto begin = Clock::now();
    {
      video::EncoderOptions enc;
      enc.path = out;
      enc.width = o.render.width;
      enc.height = o.render.height;
      enc.fileRate = {30, 1};
      enc.threads = threads;
      enc.x264Preset = preset;
      video::Encoder encoder(enc);
      for (std::int64_t f = 0; f < timeline.frameCount(); ++f) {
        renderer.render(f, frame);
        encoder.write(frame.data, static_cast<std::ptrdiff_t>(frame.step[0]));
      }
      encoder.finish();
    }
    const double elapsed = secondsSince(begin);
    bytes = fs::file_size(out);
    fs::remove(out);
    return elapsed;
  };
  std::uintmax_t bytes = 0, bytesSmall = 0;
  const double totalS = renderEncode(o.x264Preset, bytes);
  const double smallS = renderEncode("veryfast", bytesSmall);

  // Reference: ffmpeg CLI, same size, frame count, preset and threads, synthetic source.
  const std::string command =
      "ffmpeg -v error -f lavfi -i testsrc2=size=1280x720:rate=30 -frames:v " +
      std::to_string(timeline.frameCount()) + " -c:v libx264 -preset veryfast -crf 23 -threads " +
      std::to_string(threads) + " -pix_fmt yuv420p -f null - 2>/dev/null";
  start = Clock::now();
  const int status = std::system(command.c_str());
  const double ffmpegS = secondsSince(start);

  const double n = static_cast<double>(timeline.frameCount());
  std::printf(
      "{\"benchmark\": \"synth_render_encode_720p\", \"frames\": %lld, \"threads\": %d,\n"
      " \"preset\": \"%s\", \"render_only_fps\": %.1f, \"render_encode_fps\": %.1f,\n"
      " \"render_encode_veryfast_fps\": %.1f, \"target_fps\": 100, \"meets_target\": %s,\n"
      " \"file_bytes\": %llu, \"file_bytes_veryfast\": %llu,\n"
      " \"reference_ffmpeg_testsrc2_encode_fps\": %.1f, \"reference_ok\": %s,\n"
      " \"ratio_to_reference\": %.3f}\n",
      static_cast<long long>(timeline.frameCount()), threads, o.x264Preset.c_str(), n / renderS,
      n / totalS, n / smallS, n / totalS >= 100 ? "true" : "false",
      static_cast<unsigned long long>(bytes), static_cast<unsigned long long>(bytesSmall),
      n / ffmpegS, status == 0 ? "true" : "false", ffmpegS / totalS);
  return 0;
}
