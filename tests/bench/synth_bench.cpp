// Benchmark: render + encode a 720p synthetic clip (target: >= 100 frames/s on a 2-core
// machine). Prints one JSON object. The yardstick, measured in the same run and interleaved with
// our runs (the machine is noisy; VIDEO-NOTES §5), is Debian's ffmpeg encoding the same rendered
// frames from a raw file with the same x264 preset and thread count: the ratio shows what
// rendering and our encoder wrapper add on top of the encoder itself. Medians of the rounds.
#include <algorithm>
#include <chrono>
#include <cstdio>
#include <cstdlib>
#include <filesystem>
#include <string>
#include <vector>

#include "bench_timing.h"

#include <opencv2/core.hpp>
#include <opencv2/imgproc.hpp>

#include "synth/synth.h"
#include "video/encoder.h"

namespace {

using stridemark::bench::Clock;
using stridemark::bench::median;
using stridemark::bench::secondsSince;
namespace fs = std::filesystem;

}  // namespace

int main(int argc, char** argv) {
  using namespace stridemark;
  const int frames = argc > 1 ? std::max(60, std::stoi(argv[1])) : 360;
  const int rounds = argc > 2 ? std::max(1, std::stoi(argv[2])) : 5;
  const int threads = 2;
  synth::SynthOptions o;  // default generator settings, as `stridemark synth` without effects
  o.limbs = model::LimbSet::quadruped();
  o.timeline.captureRate = {120, 1};
  o.gaits = {"walk:" + std::to_string(frames / 240.0), "trot:" + std::to_string(frames / 240.0)};
  o.render.width = 1280;
  o.render.height = 720;
  const synth::Timeline timeline = synth::makeTimeline(o);
  synth::Renderer renderer(timeline, o.render);
  const auto n = static_cast<double>(timeline.frameCount());
  cv::Mat frame;

  auto start = Clock::now();
  for (std::int64_t f = 0; f < timeline.frameCount(); ++f) renderer.render(f, frame);
  const double renderFps = n / secondsSince(start);

  const fs::path out = fs::temp_directory_path() / "stridemark-synth-bench.mp4";
  std::uintmax_t bytes = 0;
  auto renderEncode = [&](const std::string& preset) {
    const auto begin = Clock::now();
    {
      video::EncoderOptions enc;
      enc.path = out;
      enc.width = o.render.width;
      enc.height = o.render.height;
      enc.fileRate = {30, 1};
      enc.threads = threads;
      enc.x264Preset = preset;
      enc.input = video::PixelLayout::yuv420p;  // as core/synth does
      video::Encoder encoder(enc);
      cv::Mat planar;
      for (std::int64_t f = 0; f < timeline.frameCount(); ++f) {
        renderer.render(f, frame);
        cv::cvtColor(frame, planar, cv::COLOR_BGR2YUV_I420);
        encoder.write(planar.data, o.render.width);
      }
      encoder.finish();
    }
    const double fps = n / secondsSince(begin);
    bytes = fs::file_size(out);
    fs::remove(out);
    return fps;
  };

  const fs::path raw = fs::temp_directory_path() / "stridemark-synth-bench.bgr";
  {
    std::FILE* file = std::fopen(raw.c_str(), "wb");
    if (!file) return 1;
    for (std::int64_t f = 0; f < 60; ++f) {
      renderer.render(f, frame);
      std::fwrite(frame.data, 1, frame.total() * frame.elemSize(), file);
    }
    std::fclose(file);
  }
  const std::string command =
      "ffmpeg -v error -f rawvideo -pix_fmt bgr24 -s 1280x720 -r 30 -stream_loop -1 -i " +
      raw.string() + " -frames:v " + std::to_string(timeline.frameCount()) +
      " -c:v libx264 -preset " + o.x264Preset + " -crf 23 -threads " + std::to_string(threads) +
      " -pix_fmt yuv420p -f null - 2>/dev/null";
  auto ffmpegFps = [&] {
    const auto begin = Clock::now();
    const int status = std::system(command.c_str());
    return status == 0 ? n / secondsSince(begin) : 0.0;
  };

  std::vector<double> ours, yardstick;
  for (int r = 0; r < rounds; ++r) {  // ABAB
    ours.push_back(renderEncode(o.x264Preset));
    yardstick.push_back(ffmpegFps());
  }
  const std::uintmax_t bytesDefault = bytes;
  const double veryfast = renderEncode("veryfast");
  fs::remove(raw);

  const double oursMedian = median(ours), ffmpegMedian = median(yardstick);
  std::printf(
      "{\"benchmark\": \"synth_render_encode_720p\", \"frames\": %lld, \"rounds\": %d,\n"
      " \"threads\": %d, \"preset\": \"%s\", \"render_only_fps\": %.1f,\n"
      " \"render_encode_fps_median\": %.1f, \"render_encode_fps_best\": %.1f,\n"
      " \"target_fps\": 100, \"meets_target\": %s, \"file_bytes\": %llu,\n"
      " \"render_encode_veryfast_fps\": %.1f, \"file_bytes_veryfast\": %llu,\n"
      " \"yardstick_ffmpeg_same_frames_fps_median\": %.1f, \"ratio_to_yardstick\": %.3f}\n",
      static_cast<long long>(timeline.frameCount()), rounds, threads, o.x264Preset.c_str(),
      renderFps, oursMedian, *std::max_element(ours.begin(), ours.end()),
      oursMedian >= 100 ? "true" : "false", static_cast<unsigned long long>(bytesDefault), veryfast,
      static_cast<unsigned long long>(bytes), ffmpegMedian,
      ffmpegMedian > 0 ? oursMedian / ffmpegMedian : 0.0);
  return 0;
}
