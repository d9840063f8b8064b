// `stridemark synth`: writes a synthetic clip with exact ground truth (contract in CHANGELOG.md).
#include <cstdio>
#include <iostream>
#include <memory>
#include <string>
#include <vector>

#include "cli/run.h"
#include "cli/verbs.h"
#include "common/error.h"
#include "common/rational.h"
#include "model/limb_set.h"
#include "synth/synth.h"

namespace stridemark::cli {
namespace {

struct SynthArgs {
  std::string out;
  std::string limbs = "quadruped";
  std::vector<std::string> gaits;
  std::string scene = "treadmill";
  std::string feet = "paw";
  std::string captureFps = "120";
  std::string fileFps;
  std::string size = "640x360";
  std::uint64_t seed = 1;
  double noise = 0;
  bool blur = false;
  double flicker = 0;
  int blockiness = 0;
  double drift = 0;
  bool occluder = false;
  double light = 1;
  int look = 0;
  std::string landing = "sharp";
  int crf = 23;
  bool markers = false;
  bool mjpeg = false;
  bool noVideo = false;
  double legLength = 0;  // 0: default for the limb set
  double speed = 0;      // 0: from each gait
  double startCycle = 0.3;
  int threads = 2;
  std::string preset = "ultrafast";
  std::string subject = "synthetic subject", species, condition, note;
};

void parseSize(const std::string& text, int& width, int& height) {
  const auto x = text.find('x');
  try {
    if (x == std::string::npos) throw std::invalid_argument(text);
    std::size_t used = 0;
    width = std::stoi(text.substr(0, x), &used);
    if (used != x) throw std::invalid_argument(text);
    height = std::stoi(text.substr(x + 1), &used);
    if (used != text.size() - x - 1) throw std::invalid_argument(text);
  } catch (const std::logic_error&) {
    throw Error(ErrorCategory::format, "--size '" + text + "' should look like 640x360");
  }
}

double defaultLegLength(const model::LimbSet& limbs) {
  switch (limbs.kind()) {
    case model::LimbSetKind::quadruped:
      return 0.55;  // a mid-sized dog
    case model::LimbSetKind::biped:
      return 0.9;  // a large ground bird
    case model::LimbSetKind::hexapod:
      return 0.012;  // a large beetle
    case model::LimbSetKind::multiPair:
      return 0.008;  // a millipede
  }
  return 0.5;
}

int runSynth(const SynthArgs& a, const std::vector<std::string>& arguments) {
  synth::SynthOptions o;
  o.outDir = a.out;
  o.limbs = model::LimbSet::fromName(a.limbs);
  o.gaits = a.gaits;
  if (o.gaits.empty()) o.gaits = {synth::presetNames(o.limbs).front() + ":4"};
  o.timeline.captureRate = parseRate(a.captureFps, "--capture-fps");
  if (!a.fileFps.empty()) o.fileRate = parseRate(a.fileFps, "--file-fps");
  o.timeline.legLengthM = a.legLength > 0 ? a.legLength : defaultLegLength(o.limbs);
  if (a.speed > 0) o.timeline.speedMs = a.speed;
  o.timeline.startCycle = a.startCycle;
  parseSize(a.size, o.render.width, o.render.height);
  o.render.scene = synth::parseScene(a.scene);
  o.render.feet = synth::parseFootStyle(a.feet);
  o.render.markers = a.markers;
  o.render.noise = a.noise;
  o.render.blur = a.blur;
  o.render.flicker = a.flicker;
  o.render.blockiness = a.blockiness;
  o.render.drift = a.drift;
  o.render.occluder = a.occluder;
  o.render.light = a.light;
  o.render.look = a.look;
  o.timeline.softLanding = a.landing == "soft";
  o.crf = a.crf;
  o.render.seed = a.seed;
  o.codec = a.mjpeg ? synth::ClipCodec::mjpeg : synth::ClipCodec::h264;
  o.writeVideo = !a.noVideo;
  o.encoderThreads = a.threads;
  o.x264Preset = a.preset;
  o.subject = a.subject;
  o.species = a.species;
  o.condition = a.condition;
  o.note = a.note;
  o.arguments = arguments;

  std::int64_t lastShown = -1;
  const auto progress = [&](std::int64_t done, std::int64_t total) {
    const std::int64_t percent = done * 100 / total;
    if (percent == lastShown && done != total) return;
    lastShown = percent;
    std::cerr << "\rsynth: frame " << done << "/" << total << " (" << percent << "%)"
              << (done == total ? "\n" : "") << std::flush;
  };
  const synth::SynthResult r = synth::generate(o, progress);
  std::cout << "frames: " << r.frameCount << "\nevents: " << r.eventCount
            << "\nmean speed m/s: " << r.meanSpeedMs << '\n';
  if (o.writeVideo) std::cout << "video: " << r.video.string() << '\n';
  std::cout << "events csv: " << r.events.string() << "\nfeet csv: " << r.feet.string()
            << "\nseeds csv: " << r.seeds.string() << "\nproject: " << r.project.string()
            << "\nmanifest: " << r.manifest.string() << '\n';
  return kExitOk;
}

}  // namespace

void addSynthVerb(CLI::App& app, VerbAction& action) {
  auto args = std::make_shared<SynthArgs>();
  auto* cmd = app.add_subcommand(
      "synth",
      "Write a synthetic side-view gait clip with exact ground-truth events, a project file and "
      "a manifest (invented data, for demos and tests)");
  cmd->add_option("--out", args->out, "Output folder (created if missing)")->required();
  cmd->add_option("--limbs", args->limbs, "Limb set: quadruped, biped, hexapod, multi-pair-N");
  cmd->add_option("--gait", args->gaits,
                  "Schedule segment NAME[:SECONDS][@HZ], repeatable. NAME is a preset (quadruped: "
                  "walk amble trot pace canter transverse-gallop rotary-gallop half-bound bound "
                  "pronk; biped: walk run hop skip; hexapod: tripod tetrapod wave; multi-pair: "
                  "wave) or custom,df=X,LIMB=PHASE,...")
      ->take_all();
  cmd->add_option("--scene", args->scene,
                  "treadmill (still camera, moving belt), panning (camera follows the animal "
                  "over a paddock) or overground (still camera, the animal crosses the frame)");
  cmd->add_option("--feet", args->feet, "paw or hoof (quadrupeds), toes (bipeds: thin toes)");
  cmd->add_option("--capture-fps", args->captureFps, "Capture rate of the virtual camera");
  cmd->add_option("--file-fps", args->fileFps,
                  "Rate stored in the file (e.g. 30 for a high-speed camera); default = capture");
  cmd->add_option("--size", args->size, "Frame size WxH (even numbers)");
  cmd->add_option("--seed", args->seed, "Random seed: same seed, same events and frames");
  cmd->add_option("--noise", args->noise, "Sensor noise SD in grey levels");
  cmd->add_flag("--blur", args->blur, "Motion blur across the exposure");
  cmd->add_option("--flicker", args->flicker, "Mains-light flicker, relative amplitude (0.05)");
  cmd->add_option("--blocky", args->blockiness, "JPEG-like blockiness: quality 1-100 (0 = off)");
  cmd->add_option("--drift", args->drift,
                  "Panning: imperfect follow, the animal sways by this share of the width (0-0.2)");
  cmd->add_flag("--occluder", args->occluder,
                "Foreground posts / bushes that hide a foot now and then (from the seed)");
  cmd->add_option("--light", args->light, "Scene brightness 0.1-1 (low light; noise stays)");
  cmd->add_option("--look", args->look,
                  "Colours and textures: 0 original, 1-9999 another coat, ground and backdrop");
  cmd->add_option("--landing", args->landing,
                  "sharp (default) or soft: the foot slows and settles before touchdown and "
                  "breaks over gently at lift-off (events unchanged)")
      ->check(CLI::IsMember({"sharp", "soft"}));
  cmd->add_option("--crf", args->crf,
                  "H.264 constant rate factor 0-51 (default 23; 30 = heavy compression)");
  cmd->add_flag("--markers", args->markers, "Draw a bright marker on every foot");
  cmd->add_flag("--mjpeg", args->mjpeg, "Write MJPEG in AVI instead of H.264 in MP4");
  cmd->add_flag("--no-video", args->noVideo, "Write only events, project and manifest");
  cmd->add_option("--leg-length", args->legLength, "Leg length (hip height) in metres");
  cmd->add_option("--speed", args->speed,
                  "Constant belt / ground speed in m/s (default: each gait's own speed)");
  cmd->add_option("--start-phase", args->startCycle, "Stride clock at frame 0 (0-1)");
  cmd->add_option("--threads", args->threads, "Encoder threads (explicit; default 2)");
  cmd->add_option("--x264-preset", args->preset,
                  "libx264 preset: ultrafast (default, fastest) .. veryfast (files ~5x smaller)")
      ->check(CLI::IsMember({"ultrafast", "superfast", "veryfast", "faster", "fast", "medium"}));
  cmd->add_option("--subject", args->subject, "Trial card: subject");
  cmd->add_option("--species", args->species, "Trial card: species");
  cmd->add_option("--condition", args->condition, "Trial card: condition");
  cmd->add_option("--note", args->note, "Free text stored in the manifest and trial notes");
  cmd->callback([args, cmd, &action] {
    // Keep the command line (minus the output folder) so the manifest can reproduce the clip.
    std::vector<std::string> arguments;
    for (const auto* opt : cmd->get_options()) {
      if (opt->count() == 0 || opt->get_name() == "--out" || opt->get_name() == "--help") continue;
      const auto results = opt->results();
      if (opt->get_type_size() == 0) {
        arguments.push_back(opt->get_name());
        continue;
      }
      for (const auto& value : results) {
        arguments.push_back(opt->get_name());
        arguments.push_back(value);
      }
    }
    action = [args, arguments] { return runSynth(*args, arguments); };
  });
}

}  // namespace stridemark::cli
