#include "synth/synth.h"

#include <cmath>
#include <cstdio>
#include <system_error>

#include <nlohmann/json.hpp>
#include <opencv2/core.hpp>
#include <opencv2/imgproc.hpp>

#include "common/error.h"
#include "formats/events_csv.h"
#include "formats/file_io.h"
#include "formats/project_file.h"
#include "video/encoder.h"
#include "video/frame_index.h"

namespace stridemark::synth {
namespace {

Rational storedRate(const SynthOptions& options) {
  return options.fileRate.valid() ? options.fileRate : options.timeline.captureRate;
}

void makeFolder(const std::filesystem::path& dir) {
  if (dir.empty()) throw Error(ErrorCategory::io, "no output folder given: pass --out DIR");
  std::error_code ec;
  std::filesystem::create_directories(dir, ec);
  if (ec || !std::filesystem::is_directory(dir))
    throw Error(ErrorCategory::io, "cannot create output folder '" + dir.string() +
                                       "': " + (ec ? ec.message() : "not a folder") +
                                       ". Choose a writable location.");
}

void renderVideo(const SynthOptions& options, const Timeline& timeline, Renderer& renderer,
                 const std::filesystem::path& path, const SynthProgress& progress) {
  video::EncoderOptions enc;
  enc.path = path;
  enc.width = options.render.width;
  enc.height = options.render.height;
  enc.fileRate = storedRate(options);
  enc.codec = options.codec == ClipCodec::h264 ? video::VideoCodec::h264 : video::VideoCodec::mjpeg;
  enc.threads = options.encoderThreads;
  enc.x264Preset = options.x264Preset;
  enc.x264Crf = options.crf;
  enc.comment = "Synthetic clip made by stridemark synth; capture rate " +
                toString(options.timeline.captureRate) + " fps";
  // OpenCV's vectorised BGR -> I420 (BT.601, limited range like swscale's default) is faster
  // than swscale's plain-C path for BGR24 input.
  enc.input = video::PixelLayout::yuv420p;
  video::Encoder encoder(enc);
  cv::Mat frame, planar;
  const std::int64_t total = timeline.frameCount();
  for (std::int64_t f = 0; f < total; ++f) {
    renderer.render(f, frame);
    cv::cvtColor(frame, planar, cv::COLOR_BGR2YUV_I420);
    encoder.write(planar.data, options.render.width);
    if (progress) progress(f + 1, total);
  }
  encoder.finish();
}

nlohmann::json rateJson(Rational r) {
  return toString(r);
}

std::string pixel(double v) {
  char text[32];
  std::snprintf(text, sizeof text, "%.2f", v);
  return text;
}

const char* kTruthNote =
    "# Pixels of the stored frames: origin top-left, x right, y down; the centre of the drawn\n"
    "# foot. visible = the centre is inside the picture and not behind a foreground occluder\n"
    "# (a leg passing in front of another leg is NOT counted as hiding it).\n";

void checkEncoderOptions(const SynthOptions& options) {
  if (options.crf < 0 || options.crf > 51)
    throw Error(ErrorCategory::format,
                "--crf " + std::to_string(options.crf) +
                    " is out of range: use an H.264 constant rate factor from 0 (lossless) to 51 "
                    "(worst); 23 is the default, 30 is heavy compression");
  if (options.crf != 23 && options.codec != ClipCodec::h264)
    throw Error(ErrorCategory::format,
                "--crf sets H.264 compression and cannot be used with --mjpeg; drop one of them");
}

}  // namespace

std::vector<GaitSegment> parseSchedule(const model::LimbSet& limbs,
                                       const std::vector<std::string>& gaits) {
  if (gaits.empty())
    throw Error(ErrorCategory::format,
                "no gait given: add --gait NAME[:SECONDS], e.g. --gait walk:4");
  std::vector<GaitSegment> segments;
  for (const auto& text : gaits) segments.push_back(parseGaitSegment(limbs, text));
  return segments;
}

Timeline makeTimeline(const SynthOptions& options) {
  return Timeline(options.limbs, parseSchedule(options.limbs, options.gaits), options.timeline);
}

model::Annotation groundTruth(const SynthOptions& options) {
  const Timeline timeline = makeTimeline(options);
  model::Annotation annotation;
  annotation.limbs = options.limbs;
  annotation.captureRate = options.timeline.captureRate;
  annotation.referenceLimb = options.limbs.defaultReference();
  annotation.events = timeline.events();
  annotation.clip = model::FrameRange{0, timeline.frameCount() - 1};
  annotation.normalize();
  return annotation;
}

std::string feetCsv(const Timeline& timeline, const Renderer& renderer) {
  std::string out = "# Stridemark synth foot positions (ground truth)\n";
  out += kTruthNote;
  out += "frame,limb,x,y,visible\n";
  const auto& limbs = timeline.limbs();
  for (std::int64_t f = 0; f < timeline.frameCount(); ++f)
    for (int l = 0; l < limbs.size(); ++l) {
      const FootView foot = renderer.footView(l, f);
      out += std::to_string(f) + ',' + limbs.label(l) + ',' + pixel(foot.centre.x) + ',' +
             pixel(foot.centre.y) + ',' + (foot.visible() ? '1' : '0') + '\n';
    }
  return out;
}

std::string seedsCsv(const Timeline& timeline, const Renderer& renderer) {
  std::string out =
      "# Stridemark synth foot seeds: one click per foot, at its first visible frame\n";
  out += kTruthNote;
  out += "# A foot never visible in the clip has no row.\n";
  out += "limb,frame,x,y\n";
  const auto& limbs = timeline.limbs();
  for (int l = 0; l < limbs.size(); ++l)
    for (std::int64_t f = 0; f < timeline.frameCount(); ++f) {
      const FootView foot = renderer.footView(l, f);
      if (!foot.visible()) continue;
      out += limbs.label(l) + ',' + std::to_string(f) + ',' + pixel(foot.centre.x) + ',' +
             pixel(foot.centre.y) + '\n';
      break;
    }
  return out;
}

std::string manifestJson(const SynthOptions& options, const Timeline& timeline,
                         const SynthResult& result) {
  using nlohmann::json;
  json m;
  m["schema"] = "stridemark.synth-manifest.v1";
  m["note"] = options.note;
  m["arguments"] = options.arguments;
  m["synthetic"] = true;
  m["limb_set"] = options.limbs.name();
  m["gaits"] = options.gaits;
  m["capture_fps"] = rateJson(options.timeline.captureRate);
  m["file_fps"] = rateJson(storedRate(options));
  m["frames"] = timeline.frameCount();
  m["leg_length_m"] = options.timeline.legLengthM;
  m["start_cycle"] = options.timeline.startCycle;
  if (options.timeline.speedMs) m["speed_m_s"] = *options.timeline.speedMs;
  m["mean_speed_m_s"] = result.meanSpeedMs;
  const auto& r = options.render;
  m["render"] = {{"width", r.width},
                 {"height", r.height},
                 {"scene", sceneName(r.scene)},
                 {"feet", footStyleName(r.feet)},
                 {"markers", r.markers},
                 {"noise", r.noise},
                 {"blur", r.blur},
                 {"flicker", r.flicker},
                 {"blockiness", r.blockiness},
                 {"seed", r.seed}};
  if (r.drift > 0) m["render"]["drift"] = r.drift;
  if (r.occluder) m["render"]["occluder"] = true;
  if (r.light < 1) m["render"]["light"] = r.light;
  if (r.look != 0) m["render"]["look"] = r.look;
  if (options.timeline.softLanding) m["landing"] = "soft";
  m["codec"] = options.codec == ClipCodec::h264 ? "h264" : "mjpeg";
  if (options.codec == ClipCodec::h264) m["crf"] = options.crf;
  json segments = json::array();
  for (const auto& s : timeline.segments())
    segments.push_back({{"gait", s.gait},
                        {"first_frame", s.firstFrame},
                        {"last_frame", s.lastFrame},
                        {"stride_hz", s.strideHz},
                        {"speed_m_s", s.speedMs}});
  m["segments"] = segments;
  m["files"] = {{"video", result.video.filename().string()},
                {"events", result.events.filename().string()},
                {"project", result.project.filename().string()},
                {"feet", result.feet.filename().string()},
                {"seeds", result.seeds.filename().string()}};
  m["event_count"] = result.eventCount;
  return m.dump(2) + "\n";
}

SynthResult generate(const SynthOptions& options, const SynthProgress& progress) {
  const Timeline timeline = makeTimeline(options);
  // Check render and encoder options before writing anything.
  checkEncoderOptions(options);
  Renderer renderer(timeline, options.render);
  makeFolder(options.outDir);
  SynthResult result;
  result.frameCount = timeline.frameCount();
  result.eventCount = timeline.events().size();
  result.meanSpeedMs = timeline.meanSpeed();
  result.video = options.outDir / (options.codec == ClipCodec::h264 ? "clip.mp4" : "clip.avi");
  result.events = options.outDir / "events.csv";
  result.project =
      options.outDir / (std::string("trial") + std::string(formats::kProjectExtension));
  result.manifest = options.outDir / "manifest.json";
  result.feet = options.outDir / "feet.csv";
  result.seeds = options.outDir / "seeds.csv";

  model::Project project;
  project.annotation = groundTruth(options);
  project.trial.subject = options.subject;
  project.trial.species = options.species;
  project.trial.condition = options.condition;
  project.trial.observer = "stridemark synth (ground truth)";
  project.trial.notes = "Synthetic, invented data made by stridemark synth. " + options.note;
  project.trial.speedMs = result.meanSpeedMs;
  project.trial.speedSource = options.render.scene == Scene::treadmill ? "belt" : "ground";
  project.trial.legLengthM = options.timeline.legLengthM;

  if (options.writeVideo) {
    renderVideo(options, timeline, renderer, result.video, progress);
    model::VideoLink link;
    link.path = result.video.filename().string();
    link.signature = video::signatureText(video::computeSignature(result.video.string()));
    link.frameCount = timeline.frameCount();
    link.fileRate = storedRate(options);
    project.video = link;
  }
  formats::writeEventsCsv(result.events, project.annotation, "stridemark synth ground truth");
  formats::writeProjectFile(result.project, project);
  formats::writeFileAtomically(result.feet, feetCsv(timeline, renderer));
  formats::writeFileAtomically(result.seeds, seedsCsv(timeline, renderer));
  formats::writeFileAtomically(result.manifest, manifestJson(options, timeline, result));
  return result;
}

}  // namespace stridemark::synth
