#pragma once
// Synthetic gait clips with exact ground truth. One call writes an output
// folder: the video (H.264 MP4 or MJPEG AVI), the ground-truth events CSV, a project file that
// links both, and a manifest JSON with every parameter.
#include <cstdint>
#include <filesystem>
#include <functional>
#include <string>
#include <vector>

#include "common/rational.h"
#include "model/annotation.h"
#include "synth/gait.h"
#include "synth/render.h"
#include "synth/timeline.h"

namespace stridemark::synth {

enum class ClipCodec { h264, mjpeg };

struct SynthOptions {
  std::filesystem::path outDir;
  model::LimbSet limbs = model::LimbSet::quadruped();
  std::vector<std::string> gaits = {"walk"};  // "NAME[:SECONDS][@HZ]" (see parseGaitSegment)
  TimelineOptions timeline;
  RenderOptions render;
  Rational fileRate{0, 1};  // stored rate; {0,1} = same as the capture rate
  ClipCodec codec = ClipCodec::h264;
  bool writeVideo = true;  // false: ground truth, project and manifest only
  int encoderThreads = 2;
  std::string x264Preset = "ultrafast";  // fastest; "veryfast" gives files ~5x smaller
  int crf = 23;  // H.264 constant rate factor 0-51 (libx264's default 23; 30 = heavy loss)
  std::string subject = "synthetic subject";
  std::string species;  // free text for the trial card
  std::string condition;
  std::string note;  // free text stored in the manifest (e.g. the scenario)
  // The synth command line that reproduces this clip (without --out), kept in the manifest.
  std::vector<std::string> arguments;
};

struct SynthResult {
  std::filesystem::path video, events, project, manifest;
  std::filesystem::path feet, seeds;  // per-frame foot positions; one click per foot
  std::int64_t frameCount = 0;
  std::size_t eventCount = 0;
  double meanSpeedMs = 0;
};

using SynthProgress = std::function<void(std::int64_t framesDone, std::int64_t framesTotal)>;

// The annotation that is the ground truth of these options (no rendering).
model::Annotation groundTruth(const SynthOptions& options);

// Renders and writes everything. Throws stridemark::Error (format for bad options, io/export_
// for files) with a message that names the problem and what to do.
SynthResult generate(const SynthOptions& options, const SynthProgress& progress = {});

// Pieces the CLI and tests share.
std::vector<GaitSegment> parseSchedule(const model::LimbSet& limbs,
                                       const std::vector<std::string>& gaits);
Timeline makeTimeline(const SynthOptions& options);
// feet.csv: every frame and limb, the drawn foot's centre and whether it can be seen.
std::string feetCsv(const Timeline& timeline, const Renderer& renderer);
// seeds.csv: per limb, the centre at the first frame where that foot can be seen.
std::string seedsCsv(const Timeline& timeline, const Renderer& renderer);
std::string manifestJson(const SynthOptions& options, const Timeline& timeline,
                         const SynthResult& result);

}  // namespace stridemark::synth
