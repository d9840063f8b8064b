// Marked-clip export throughput against the ffmpeg CLI transcoding the same frame range with
// the same encoder settings (libx264, same preset and CRF, explicit encoder threads, yuv420p),
// measured in the same run, interleaved. Prints JSON. Target (issue 6): ratio >= 0.7.
//
//   export_bench [--size 1280x720] [--frames 480] [--reps 3] [--preset veryfast] [--threads 2]
#include <unistd.h>
#include <QGuiApplication>
#include <algorithm>
#include <array>
#include <atomic>
#include <chrono>
#include <cstdio>
#include <cstdlib>
#include <filesystem>
#include <iostream>
#include <string>
#include <vector>

#include "analysis/analyse.h"
#include "bench_timing.h"
#include "model/annotation.h"
#include "ui/export/clip_compositor.h"
#include "ui/export/clip_overlay.h"
#include "video/frame_index.h"

namespace fs = std::filesystem;
using namespace stridemark;
using stridemark::bench::Clock;
using stridemark::bench::median;

namespace {

struct Args {
  std::string size = "1280x720";
  int frames = 480;
  int reps = 3;
  std::string preset = "veryfast";
  int threads = 2;
  int crf = 20;
};

Args parse(int argc, char** argv) {
  Args a;
  for (int i = 1; i + 1 < argc; i += 2) {
    const std::string key = argv[i];
    const std::string value = argv[i + 1];
    if (key == "--size")
      a.size = value;
    else if (key == "--frames")
      a.frames = std::stoi(value);
    else if (key == "--reps")
      a.reps = std::stoi(value);
    else if (key == "--preset")
      a.preset = value;
    else if (key == "--threads")
      a.threads = std::stoi(value);
    else {
      std::cerr << "unknown option " << key << '\n';
      std::exit(2);
    }
  }
  return a;
}

double seconds(Clock::time_point a, Clock::time_point b) {
  return std::chrono::duration<double>(b - a).count();
}

void shell(const std::string& command) {
  if (std::system(command.c_str()) != 0) {
    std::cerr << "failed: " << command << '\n';
    std::exit(3);
  }
}

// An invented walk so the overlay has stance bars, a limb pad and stride labels to draw.
model::Annotation walkTags(std::int64_t frames) {
  model::Annotation a;
  a.captureRate = {240, 1};
  const int period = 96;
  for (int limb = 0; limb < 4; ++limb) {
    const std::int64_t offset = std::array<int, 4>{48, 0, 24, 72}[static_cast<std::size_t>(limb)];
    for (std::int64_t t = offset; t < frames; t += period) {
      a.events.push_back({t, limb, model::EventKind::touchdown});
      if (t + 62 < frames) a.events.push_back({t + 62, limb, model::EventKind::liftoff});
    }
  }
  a.normalize();
  return a;
}

}  // namespace

int main(int argc, char** argv) {
  const Args args = parse(argc, argv);
  setenv("QT_QPA_PLATFORM", "offscreen", 0);
  int qtArgc = 1;
  QGuiApplication app(qtArgc, argv);

  const fs::path dir =
      fs::temp_directory_path() / ("stridemark_export_bench_" + std::to_string(getpid()));
  fs::create_directories(dir);
  const fs::path clip = dir / "source.mp4";
  // Source: a long-GOP H.264 clip like high-speed footage (240 fps, GOP 240).
  shell("ffmpeg -nostdin -v error -y -f lavfi -i testsrc2=size=" + args.size +
        ":rate=240 -frames:v " + std::to_string(args.frames) +
        " -c:v libx264 -preset ultrafast -g 240 -pix_fmt yuv420p -threads 2 '" + clip.string() +
        "'");

  const model::Annotation tags = walkTags(args.frames);
  const analysis::Report report = analysis::analyse(tags);
  const ui::exports::OverlayModel overlay(tags, report);
  auto index = std::make_shared<const video::FrameIndex>(video::FrameIndex::build(clip.string()));

  const std::string threads = std::to_string(args.threads);
  // `-r 30` as an INPUT option retimes every frame to 30 fps; as an output option it would
  // drop 7 of every 8 frames of the 240 fps clip and flatter the reference.
  const std::string ffmpeg = "ffmpeg -nostdin -v error -y -threads " + threads + " -r 30 -i '" +
                             clip.string() + "' -frames:v " + std::to_string(args.frames) +
                             " -c:v libx264 -preset " + args.preset + " -crf " +
                             std::to_string(args.crf) + " -threads " + threads +
                             " -pix_fmt yuv420p '" + (dir / "reference.mp4").string() + "'";

  std::vector<double> ours, theirs;
  const std::atomic<bool> cancel{false};
  for (int rep = 0; rep < args.reps; ++rep) {
    auto t0 = Clock::now();
    shell(ffmpeg);
    auto t1 = Clock::now();
    theirs.push_back(seconds(t0, t1));

    ui::exports::ClipSettings s;
    s.videoPath = clip.string();
    s.index = index;
    s.first = 0;
    s.last = args.frames - 1;
    s.playbackRate = {30, 1};
    s.x264Preset = args.preset;
    s.x264Crf = args.crf;
    s.encoderThreads = args.threads;
    s.decoderThreads = args.threads;
    t0 = Clock::now();
    ui::exports::renderMarkedClip(s, overlay, dir / "marked.mp4", {}, cancel);
    t1 = Clock::now();
    ours.push_back(seconds(t0, t1));
  }
  // Both outputs must hold every frame, or the comparison is unfair.
  auto frameCount = [](const fs::path& file) {
    const std::string cmd =
        "ffprobe -v error -count_frames -select_streams v:0 -show_entries "
        "stream=nb_read_frames -of csv=p=0 '" +
        file.string() + "'";
    long n = -1;
    if (FILE* pipe = popen(cmd.c_str(), "r")) {
      if (std::fscanf(pipe, "%ld", &n) != 1) n = -1;
      pclose(pipe);
    }
    return n;
  };
  const long refFrames = frameCount(dir / "reference.mp4");
  const long ourFrames = frameCount(dir / "marked.mp4");
  const double ourFps = args.frames / median(ours);
  const double refFps = args.frames / median(theirs);
  const double ratio = ourFps / refFps;
  const bool pass = ratio >= 0.7 && refFrames == ourFrames && ourFrames == args.frames;
  std::printf(
      "{\n  \"benchmark\": \"export_marked_clip\",\n  \"size\": \"%s\",\n  \"frames\": %d,\n"
      "  \"reps\": %d,\n  \"preset\": \"%s\",\n  \"crf\": %d,\n  \"threads\": %d,\n"
      "  \"reference\": \"ffmpeg CLI transcode of the same frames, same encoder settings\",\n"
      "  \"marked_clip_fps\": %.1f,\n  \"ffmpeg_transcode_fps\": %.1f,\n"
      "  \"marked_frames_written\": %ld,\n  \"reference_frames_written\": %ld,\n"
      "  \"ratio\": %.3f,\n  \"target_ratio\": 0.7,\n  \"pass\": %s\n}\n",
      args.size.c_str(), args.frames, args.reps, args.preset.c_str(), args.crf, args.threads,
      ourFps, refFps, ourFrames, refFrames, ratio, pass ? "true" : "false");
  fs::remove_all(dir);
  return 0;
}
