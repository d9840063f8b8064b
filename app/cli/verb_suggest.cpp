// `stridemark suggest VIDEO --seeds SEEDS.csv --scene treadmill|overground|panning --limbs SET
//                     --fps RATE --csv OUT.csv [--json OUT.json] [--from F --to F]`
// `stridemark suggest PROJECT.stridemark --scene S --csv OUT.csv ...`: video, limb set, capture
// rate and seeds come from the project (--seeds replaces the project's seeds).
// Proposed touchdowns and lift-offs with a confidence each (core/vision); they are proposals for
// a person to review, never tags.
#include <iostream>
#include <memory>

#include <nlohmann/json.hpp>

#include "cli/arguments.h"
#include "cli/verbs.h"
#include "common/caution.h"
#include "common/error.h"
#include "formats/file_io.h"
#include "formats/output_set.h"
#include "formats/project_file.h"
#include "formats/seeds_csv.h"
#include "formats/text_scan.h"
#include "vision/propose.h"

extern "C" {
#include <libavutil/log.h>
}

namespace stridemark::cli {

namespace {

struct SuggestOptions {
  std::string input;
  std::string seeds;
  std::string scene;
  std::string limbs;
  std::string fps;
  std::string csv;
  std::string json;
  std::string from, to;
};

bool isProjectFile(const std::filesystem::path& path) {
  return path.extension().string() == formats::kProjectExtension;
}

vision::ProposeRequest requestFrom(const SuggestOptions& options) {
  vision::ProposeRequest request;
  request.scene = vision::parseScene(options.scene);
  const std::filesystem::path input(options.input);
  if (isProjectFile(input)) {
    const model::Project project = formats::readProjectFile(input);
    if (!project.video)
      throw UsageProblem{options.input + " links no video; open it in the desk and link its clip"};
    request.video = model::resolveVideoPath(input, project.video->path);
    request.limbs = project.annotation.limbs;
    request.captureRate = project.annotation.captureRate;
    request.seeds = project.seeds;
    if (!options.limbs.empty() && model::LimbSet::fromName(options.limbs) != request.limbs)
      throw UsageProblem{"--limbs " + options.limbs + " does not match the project's limb set " +
                         request.limbs.name() + " — drop --limbs for project files"};
    if (!options.fps.empty()) request.captureRate = parseRate(options.fps, "--fps");
  } else {
    request.video = input;
    if (options.limbs.empty())
      throw UsageProblem{
          "--limbs SET is required for a video (quadruped, biped, hexapod, "
          "multi-pair-N)"};
    if (options.fps.empty())
      throw UsageProblem{
          "--fps RATE is required for a video: the rate the camera recorded at "
          "(high-speed clips are often stored at a lower playback rate)"};
    request.limbs = model::LimbSet::fromName(options.limbs);
    request.captureRate = parseRate(options.fps, "--fps");
  }
  if (!options.seeds.empty()) request.seeds = formats::readSeedsCsv(options.seeds, request.limbs);
  if (request.seeds.empty())
    throw UsageProblem{options.input + " has no seeds: pass --seeds SEEDS.csv (limb,frame,x,y)"};
  if (!options.from.empty() || !options.to.empty()) {
    if (options.from.empty() || options.to.empty())
      throw UsageProblem{"--from and --to go together (the first and last frame of the range)"};
    request.range = model::FrameRange{parseFrameNumber(options.from, "--from"),
                                      parseFrameNumber(options.to, "--to")};
    if (request.range->last <= request.range->first)
      throw UsageProblem{"--to must be after --from"};
  }
  return request;
}

std::string suggestionsCsv(const vision::ProposeRequest& request,
                           const vision::ProposeResult& result) {
  std::string out = "# proposed by stridemark suggest (review before use; not tags)\n";
  out += "# fps: " + toString(request.captureRate) + "\n";
  out += "# limbs: " + request.limbs.name() + "\n";
  out += "# scene: " + std::string(vision::sceneName(request.scene)) + "\n";
  for (const auto& span : result.proposals.hidden)
    out += "# hidden: " + request.limbs.label(span.limb) + " " + std::to_string(span.first) + ".." +
           std::to_string(span.last) + "\n";
  out += "limb,event,frame,confidence\n";
  std::vector<model::ProposedEvent> byFrame = result.proposals.events;
  std::stable_sort(byFrame.begin(), byFrame.end(), [](const auto& a, const auto& b) {
    return a.event.frame != b.event.frame ? a.event.frame < b.event.frame
                                          : a.event.limb < b.event.limb;
  });
  for (const auto& p : byFrame) {
    out += request.limbs.label(p.event.limb) + "," + std::string(model::eventWord(p.event.kind)) +
           "," + std::to_string(p.event.frame) + ",";
    const double rounded = std::round(p.confidence * 1000) / 1000;
    formats::text::appendDouble(out, rounded);
    out += "\n";
  }
  return out;
}

std::string suggestionsJson(const vision::ProposeRequest& request,
                            const vision::ProposeResult& result) {
  using nlohmann::json;
  json events = json::array();
  for (const auto& p : result.proposals.events)
    events.push_back({{"limb", request.limbs.label(p.event.limb)},
                      {"event", std::string(model::eventWord(p.event.kind))},
                      {"frame", p.event.frame},
                      {"time_s", framesToSeconds(p.event.frame, request.captureRate)},
                      {"confidence", std::round(p.confidence * 1000) / 1000}});
  json hidden = json::array();
  for (const auto& s : result.proposals.hidden)
    hidden.push_back({{"limb", request.limbs.label(s.limb)}, {"first", s.first}, {"last", s.last}});
  json tracks = json::array();
  for (const auto& track : result.tracks) {
    std::int64_t seen = 0;
    for (const auto& point : track.points) seen += point.visible ? 1 : 0;
    tracks.push_back({{"limb", request.limbs.label(track.limb)},
                      {"first", track.first},
                      {"frames", track.points.size()},
                      {"visible_frames", seen}});
  }
  const json document{{"schema", "stridemark.suggestions.v1"},
                      {"video", request.video.string()},
                      {"scene", std::string(vision::sceneName(request.scene))},
                      {"limb_set", request.limbs.name()},
                      {"capture_rate", toString(request.captureRate)},
                      {"frames_decoded", result.framesDecoded},
                      {"events", std::move(events)},
                      {"hidden", std::move(hidden)},
                      {"tracks", std::move(tracks)},
                      {"caution", std::string(kCaution)}};
  return document.dump(1) + "\n";
}

int runSuggest(const SuggestOptions& options) {
  av_log_set_level(AV_LOG_FATAL);
  const vision::ProposeRequest request = requestFrom(options);
  std::vector<NamedInput> inputs{{"the input", options.input}, {"the video", request.video}};
  if (!options.seeds.empty()) inputs.push_back({"the seeds", options.seeds});
  refuseToReplaceInputs(options.csv, "--csv", inputs);
  if (!options.json.empty()) refuseToReplaceInputs(options.json, "--json", inputs);
  const vision::ProposeResult result =
      vision::propose(request, [](std::int64_t done, std::int64_t total) {
        if (done % 240 == 0 || done == total)
          std::cerr << "suggest: frame " << done << "/" << total << '\r' << std::flush;
        return true;
      });
  std::cerr << '\n';
  formats::OutputSet outputs(formats::Durability::regenerable);
  outputs.add(options.csv, suggestionsCsv(request, result));
  if (!options.json.empty()) outputs.add(options.json, suggestionsJson(request, result));
  outputs.commit();
  std::cerr << "proposed " << result.proposals.events.size() << " events and "
            << result.proposals.hidden.size() << " hidden spans for " << result.tracks.size()
            << " feet; wrote " << options.csv << "\n";
  return 0;
}

}  // namespace

void addSuggestVerb(CLI::App& app, VerbAction& action) {
  auto options = std::make_shared<SuggestOptions>();
  CLI::App* verb =
      app.add_subcommand("suggest", "Propose touchdowns and lift-offs from the video, for review");
  verb->add_option("INPUT", options->input, "video file or project file (.stridemark)")
      ->required()
      ->check(regularFileInput());
  verb->add_option("--seeds", options->seeds,
                   "CSV limb,frame,x,y: one click on each foot (pixels, origin top-left)")
      ->check(regularFileInput());
  verb->add_option("--scene", options->scene,
                   "treadmill (belt, still camera), overground (still camera) or panning "
                   "(camera follows the animal)")
      ->required()
      ->check(checkedBy([](const std::string& v) { vision::parseScene(v); }));
  verb->add_option("--limbs", options->limbs, "limb set: quadruped, biped, hexapod, multi-pair-N");
  verb->add_option("--fps", options->fps, "capture rate (frames per second the camera recorded)")
      ->check(checkedBy([](const std::string& v) { parseRate(v, "--fps"); }));
  verb->add_option("--csv", options->csv, "write limb,event,frame,confidence here")
      ->required()
      ->check(nonEmptyPath("a file name for the proposals CSV"));
  verb->add_option("--json", options->json, "also write the proposals, hidden spans and tracks")
      ->check(nonEmptyPath("a file name for the JSON"));
  verb->add_option("--from", options->from, "first frame of the range (default 0)");
  verb->add_option("--to", options->to, "last frame of the range (default the last frame)");
  verb->callback([options, &action] { action = [options] { return runSuggest(*options); }; });
}

}  // namespace stridemark::cli
