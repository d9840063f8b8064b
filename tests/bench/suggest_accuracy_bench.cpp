// Benchmark (issue 18): accuracy of proposed touchdowns and lift-offs on synthetic clips with
// exact ground truth. For each condition it renders a clip (`stridemark synth`'s generator),
// seeds every foot once, runs vision::propose and scores the proposals against the truth.
// Prints one JSON object: per condition and overall, the share of events within 0, 1 and 2
// frames, missed and spurious shares, and the mean signed error per event kind.
// Run: build/.../tests/bench/suggest_accuracy_bench [filter-substring]
#include <chrono>
#include <cstdio>
#include <cstdlib>
#include <filesystem>
#include <string>
#include <vector>

#include "common/error.h"
#include "formats/seeds_csv.h"
#include "synth/synth.h"
#include "vision/proposal_score.h"
#include "vision/propose.h"

namespace {

namespace fs = std::filesystem;
using namespace stridemark;

struct Condition {
  std::string name;
  std::string limbs = "quadruped";
  std::vector<std::string> gaits;
  synth::Scene synthScene = synth::Scene::treadmill;
  vision::Scene scene = vision::Scene::treadmill;
  int fps = 120;
  synth::FootStyle feet = synth::FootStyle::paw;
  bool blur = false;
  double noise = 0;
  int blockiness = 0;
  int width = 640, height = 360;
  bool markers = false;  // a bright disc on every foot: tracking made easy, the rule measured
};

std::vector<Condition> conditions() {
  using S = synth::Scene;
  using V = vision::Scene;
  std::vector<Condition> list;
  list.push_back(
      {"treadmill quadruped walk 240", "quadruped", {"walk:4"}, S::treadmill, V::treadmill, 240});
  list.push_back({"treadmill quadruped trot 120 hoof",
                  "quadruped",
                  {"trot:4"},
                  S::treadmill,
                  V::treadmill,
                  120,
                  synth::FootStyle::hoof});
  list.push_back({"treadmill walk-trot 120 blur noise",
                  "quadruped",
                  {"walk:3", "trot:3"},
                  S::treadmill,
                  V::treadmill,
                  120,
                  synth::FootStyle::paw,
                  true,
                  6});
  list.push_back({"treadmill trot 60 blocky30",
                  "quadruped",
                  {"trot:5"},
                  S::treadmill,
                  V::treadmill,
                  60,
                  synth::FootStyle::paw,
                  false,
                  3,
                  30});
  list.push_back({"panning quadruped gallop 240",
                  "quadruped",
                  {"transverse-gallop:3"},
                  S::overground,
                  V::panning,
                  240,
                  synth::FootStyle::hoof});
  list.push_back({"panning biped walk 120", "biped", {"walk:4"}, S::overground, V::panning, 120});
  list.push_back({"panning biped run 240 noise",
                  "biped",
                  {"run:3"},
                  S::overground,
                  V::panning,
                  240,
                  synth::FootStyle::paw,
                  false,
                  8});
  list.push_back(
      {"treadmill hexapod tripod 120", "hexapod", {"tripod:4"}, S::treadmill, V::treadmill, 120});
  list.push_back(
      {"treadmill hexapod wave 60", "hexapod", {"wave:6"}, S::treadmill, V::treadmill, 60});
  // The same scenes with foot markers: what the stance rule does when tracking is easy.
  const std::size_t plain = list.size();
  for (std::size_t i = 0; i < plain; ++i) {
    Condition marked = list[i];
    marked.name += " markers";
    marked.markers = true;
    list.push_back(marked);
  }
  return list;
}

std::vector<model::FootSeed> seedsFor(const synth::SynthOptions& options,
                                      const synth::SynthResult& result) {
  const fs::path file = result.events.parent_path() / "seeds.csv";
  if (fs::exists(file)) return formats::readSeedsCsv(file, options.limbs);
  // The generator's own foot positions at frame 0, as a person would click them.
  const synth::Timeline timeline = synth::makeTimeline(options);
  synth::Renderer renderer(timeline, options.render);
  std::vector<model::FootSeed> seeds;
  for (int limb = 0; limb < options.limbs.size(); ++limb) {
    const cv::Point2d p = renderer.footPixel(limb, 0);
    // Markers sit one marker radius above the contact point (synth/body.cpp).
    const double marker =
        std::max(3.0, 0.05 * options.timeline.legLengthM * renderer.pixelsPerMetre());
    seeds.push_back({limb, 0, p.x,
                     options.render.markers ? p.y - marker : p.y - 0.012 * options.render.height});
  }
  return seeds;
}

// For diagnosis: each frame's tracked and true foot position and the true stance state.
void dumpTracks(const synth::SynthOptions& o, const model::Annotation& truth,
                const vision::ProposeResult& result, const fs::path& file) {
  const synth::Timeline timeline = synth::makeTimeline(o);
  synth::Renderer renderer(timeline, o.render);
  std::FILE* out = std::fopen(file.string().c_str(), "w");
  if (!out) return;
  std::fprintf(out, "limb,frame,x,y,quality,visible,true_x,true_y,true_stance,proposed\n");
  for (const auto& track : result.tracks) {
    for (std::size_t i = 0; i < track.points.size(); ++i) {
      const std::int64_t f = track.first + static_cast<std::int64_t>(i);
      const cv::Point2d p = renderer.footPixel(track.limb, static_cast<double>(f));
      const auto& t = track.points[i];
      std::string proposed;
      for (const auto& e : result.proposals.events)
        if (e.event.limb == track.limb && e.event.frame == f)
          proposed = e.event.kind == model::EventKind::touchdown ? "TD" : "LO";
      std::fprintf(out, "%d,%lld,%.2f,%.2f,%.2f,%d,%.2f,%.2f,%d,%s\n", track.limb,
                   static_cast<long long>(f), t.x, t.y, t.quality, t.visible ? 1 : 0, p.x, p.y,
                   truth.inStance(track.limb, f) ? 1 : 0, proposed.c_str());
    }
  }
  std::fclose(out);
}

std::string scoreJson(const vision::ProposalScore& s) {
  char buffer[512];
  std::snprintf(buffer, sizeof buffer,
                "\"events\": %d, \"proposed\": %d, \"within_0\": %.3f, \"within_1\": %.3f, "
                "\"within_2\": %.3f, \"missed\": %.3f, \"spurious\": %.3f, \"deferred\": %d, "
                "\"mean_error_touchdown\": %.2f, \"mean_error_liftoff\": %.2f",
                s.truth, s.proposed, s.share(s.within0), s.share(s.within1), s.share(s.within2),
                s.share(s.missed), s.spuriousShare(), s.deferred,
                s.meanSignedError(model::EventKind::touchdown),
                s.meanSignedError(model::EventKind::liftoff));
  return buffer;
}

}  // namespace

int main(int argc, char** argv) {
  const std::string filter = argc > 1 ? argv[1] : "";
  const fs::path root = fs::temp_directory_path() / "stridemark-suggest-bench";
  vision::ProposalScore overall;
  std::printf("{\n \"conditions\": [\n");
  bool firstRow = true;
  int index = 0;
  for (const Condition& c : conditions()) {
    ++index;
    if (!filter.empty() && c.name.find(filter) == std::string::npos) continue;
    synth::SynthOptions o;
    o.outDir = root / std::to_string(index);
    o.limbs = model::LimbSet::fromName(c.limbs);
    o.gaits = c.gaits;
    o.timeline.captureRate = {c.fps, 1};
    o.render.scene = c.synthScene;
    o.render.feet = c.feet;
    o.render.blur = c.blur;
    o.render.noise = c.noise;
    o.render.blockiness = c.blockiness;
    o.render.markers = c.markers;
    o.render.width = c.width;
    o.render.height = c.height;
    o.render.seed = static_cast<std::uint64_t>(index);
    try {
      const synth::SynthResult clip = synth::generate(o);
      const model::Annotation truth = synth::groundTruth(o);
      vision::ProposeRequest request;
      request.video = clip.video;
      request.limbs = o.limbs;
      request.captureRate = o.timeline.captureRate;
      request.scene = c.scene;
      request.seeds = seedsFor(o, clip);
      const auto start = std::chrono::steady_clock::now();
      const vision::ProposeResult result = vision::propose(request);
      const double seconds =
          std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count();
      const int window = std::max(3, c.fps / 20);
      const vision::ProposalScore s =
          vision::scoreProposals(truth.events, result.proposals, {2, clip.frameCount - 3}, window);
      overall += s;
      if (std::getenv("SUGGEST_BENCH_DUMP"))
        dumpTracks(o, truth, result, root / (std::to_string(index) + "-tracks.csv"));
      std::printf("%s  {\"name\": \"%s\", \"frames\": %lld, \"seconds\": %.2f, %s}",
                  firstRow ? "" : ",\n", c.name.c_str(), static_cast<long long>(clip.frameCount),
                  seconds, scoreJson(s).c_str());
      firstRow = false;
    } catch (const Error& e) {
      std::printf("%s  {\"name\": \"%s\", \"error\": \"%s\"}", firstRow ? "" : ",\n",
                  c.name.c_str(), e.what());
      firstRow = false;
    }
    std::fflush(stdout);
  }
  std::printf("\n ],\n \"overall\": {%s}\n}\n", scoreJson(overall).c_str());
  return 0;
}
