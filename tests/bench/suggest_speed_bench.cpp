// Benchmark (issue 18 item 5): proposing events for 4 feet on a 1080p clip against a bare decode
// of the same clip by Debian's ffmpeg (`ffmpeg -threads 2 -i CLIP -f null -`), interleaved in one
// run (the machine is noisy; medians of the rounds). Target: ratio <= 2. Prints one JSON object.
// Run: build/.../tests/bench/suggest_speed_bench [rounds] [seconds-of-clip]
#include <algorithm>
#include <chrono>
#include <cstdio>
#include <cstdlib>
#include <filesystem>
#include <string>
#include <vector>

#include "bench_timing.h"

#include "formats/seeds_csv.h"
#include "synth/synth.h"
#include "vision/propose.h"

namespace {

namespace fs = std::filesystem;
using stridemark::bench::Clock;
using stridemark::bench::median;
using stridemark::bench::secondsSince;

}  // namespace

int main(int argc, char** argv) {
  using namespace stridemark;
  const int rounds = argc > 1 ? std::max(1, std::atoi(argv[1])) : 3;
  const double seconds = argc > 2 ? std::max(1.0, std::atof(argv[2])) : 4.0;
  synth::SynthOptions o;
  o.outDir = fs::temp_directory_path() / "stridemark-suggest-speed";
  o.limbs = model::LimbSet::quadruped();
  o.gaits = {"trot:" + std::to_string(seconds)};
  o.timeline.captureRate = {120, 1};
  o.render.width = 1920;
  o.render.height = 1080;
  o.render.noise = 2;
  const synth::SynthResult clip = synth::generate(o);

  vision::ProposeRequest request;
  request.video = clip.video;
  request.limbs = o.limbs;
  request.captureRate = o.timeline.captureRate;
  request.scene =
      std::getenv("XSCENE") ? vision::parseScene(std::getenv("XSCENE")) : vision::Scene::treadmill;
  request.seeds = formats::readSeedsCsv(o.outDir / "seeds.csv", o.limbs);

  const std::string decode =
      "ffmpeg -nostdin -v error -threads 2 -i '" + clip.video.string() + "' -f null -";
  std::vector<double> ours, bare;
  std::size_t events = 0;
  for (int r = 0; r < rounds; ++r) {
    auto start = Clock::now();
    if (std::system(decode.c_str()) != 0) {
      std::fprintf(stderr, "ffmpeg failed: %s\n", decode.c_str());
      return 1;
    }
    bare.push_back(secondsSince(start));
    start = Clock::now();
    events = vision::propose(request).proposals.events.size();
    ours.push_back(secondsSince(start));
  }
  const double frames = static_cast<double>(clip.frameCount);
  std::printf(
      "{\"clip\": \"1920x1080 h264 %lld frames, 4 feet\", \"rounds\": %d, "
      "\"propose_s\": %.3f, \"ffmpeg_decode_s\": %.3f, \"ratio\": %.2f, "
      "\"propose_fps\": %.1f, \"decode_fps\": %.1f, \"events\": %zu, \"target_ratio\": 2.0}\n",
      static_cast<long long>(clip.frameCount), rounds, median(ours), median(bare),
      median(ours) / median(bare), frames / median(ours), frames / median(bare), events);
  fs::remove_all(o.outDir);
  return 0;
}
