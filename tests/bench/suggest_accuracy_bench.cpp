// Benchmark (issue 18): accuracy of proposed touchdowns and lift-offs on synthetic clips with
// exact ground truth. For each condition it renders a clip (`stridemark synth`'s generator),
// seeds every foot once, runs vision::propose and scores the proposals against the truth.
// Prints one JSON object: per condition and overall, the share of events within 0, 1 and 2
// frames, missed and spurious shares, and the mean signed error per event kind.
// Run: build/.../tests/bench/suggest_accuracy_bench [filter-substring]
#include <array>
#include <chrono>
#include <cmath>
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
  int crf = 23;
  bool occluder = false;
  double light = 1;
  int look = 0;
  bool softLanding = false;
  bool markers = false;  // a bright disc on every foot: tracking made easy, the rule measured
  int width = 640, height = 360;
};

// The cases issue 18 names: every scene type, capture rates from 60 to 240 fps, far feet
// passing behind near legs (every quadruped), hind feet landing beside fore footprints (walk),
// thin biped toes, insect legs under the body, motion blur, low light, CRF 30 and a foot hidden
// for a few frames (occluder), on several looks and both landing profiles.
std::vector<Condition> conditions() {
  using S = synth::Scene;
  using V = vision::Scene;
  using F = synth::FootStyle;
  std::vector<Condition> list;
  auto add = [&](Condition c) { list.push_back(std::move(c)); };
  add({.name = "treadmill dog walk 240", .gaits = {"walk:4"}, .fps = 240});
  add({.name = "treadmill horse trot 120 soft",
       .gaits = {"trot:4"},
       .fps = 120,
       .feet = F::hoof,
       .look = 3,
       .softLanding = true});
  add({.name = "treadmill walk-trot 120 blur noise",
       .gaits = {"walk:3", "trot:3"},
       .fps = 120,
       .blur = true,
       .noise = 6});
  add({.name = "treadmill trot 60 crf30 post",
       .gaits = {"trot:5"},
       .fps = 60,
       .noise = 3,
       .crf = 30,
       .occluder = true,
       .look = 7});
  add({.name = "panning gallop 240 hoof",
       .gaits = {"transverse-gallop:3"},
       .synthScene = S::panning,
       .scene = V::panning,
       .fps = 240,
       .feet = F::hoof});
  add({.name = "panning walk 120 dark bush",
       .gaits = {"walk:4"},
       .synthScene = S::panning,
       .scene = V::panning,
       .fps = 120,
       .noise = 4,
       .occluder = true,
       .light = 0.3,
       .look = 11});
  add({.name = "overground trot 120 post",
       .gaits = {"trot:3"},
       .synthScene = S::overground,
       .scene = V::overground,
       .fps = 120,
       .occluder = true,
       .look = 5});
  add({.name = "panning biped toes walk 120",
       .limbs = "biped",
       .gaits = {"walk:4"},
       .synthScene = S::panning,
       .scene = V::panning,
       .fps = 120,
       .feet = F::toes});
  add({.name = "overground biped run 240 noise",
       .limbs = "biped",
       .gaits = {"run:3"},
       .synthScene = S::overground,
       .scene = V::overground,
       .fps = 240,
       .noise = 8});
  add({.name = "treadmill hexapod tripod 120",
       .limbs = "hexapod",
       .gaits = {"tripod:4"},
       .fps = 120});
  add({.name = "treadmill hexapod wave 60 crf30",
       .limbs = "hexapod",
       .gaits = {"wave:6"},
       .fps = 60,
       .crf = 30,
       .look = 2});
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

// The generator's seeds.csv: each foot's drawn centre in the first frame it is visible, as a
// person would click it.
std::vector<model::FootSeed> seedsFor(const synth::SynthOptions& options,
                                      const synth::SynthResult& result) {
  return formats::readSeedsCsv(result.events.parent_path() / "seeds.csv", options.limbs);
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
      const synth::FootView view = renderer.footView(track.limb, f);
      const cv::Point2d p = view.centre;
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

// Does confidence mean something? Per confidence quarter: proposals, and the share of them
// within one frame of a true event.
struct Calibration {
  std::array<int, 4> count{}, hits{};
  void add(const model::Proposals& p, const vision::ProposalScore& s) {
    for (std::size_t i = 0; i < p.events.size(); ++i) {
      const auto bin =
          static_cast<std::size_t>(std::min(3.0, std::floor(p.events[i].confidence * 4)));
      ++count[bin];
      hits[bin] += s.absoluteError[i] >= 0 && s.absoluteError[i] <= 1;
    }
  }
  std::string json() const {
    std::string out = "[";
    for (std::size_t b = 0; b < 4; ++b) {
      char cell[96];
      std::snprintf(cell, sizeof cell,
                    "%s{\"confidence\": \"%.2f-%.2f\", \"proposals\": %d, \"within_1\": %.3f}",
                    b ? ", " : "", b / 4.0, (b + 1) / 4.0, count[b],
                    count[b] ? static_cast<double>(hits[b]) / count[b] : 0.0);
      out += cell;
    }
    return out + "]";
  }
};

int main(int argc, char** argv) {
  const std::string filter = argc > 1 ? argv[1] : "";
  const fs::path root = fs::temp_directory_path() / "stridemark-suggest-bench";
  vision::ProposalScore overall;
  Calibration calibration;
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
    o.crf = c.crf;
    o.render.occluder = c.occluder;
    o.render.light = c.light;
    o.render.look = c.look;
    o.timeline.softLanding = c.softLanding;
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
      calibration.add(result.proposals, s);
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
  std::printf("\n ],\n \"overall\": {%s},\n \"calibration\": %s\n}\n", scoreJson(overall).c_str(),
              calibration.json().c_str());
  return 0;
}
