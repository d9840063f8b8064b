// `stridemark probe VIDEO [--json]`: frame count, rates, size, codec and GOP statistics.
#include <iomanip>
#include <iostream>
#include <sstream>

#include <nlohmann/json.hpp>

#include "cli/arguments.h"
#include "cli/verbs.h"
#include "video/video_info.h"

extern "C" {
#include <libavutil/log.h>
}

namespace stridemark::cli {

namespace {

struct ProbeOptions {
  std::string video;
  bool json = false;
  bool quick = false;
};

nlohmann::json toJson(const video::VideoInfo& info) {
  nlohmann::json j;
  j["path"] = info.path;
  j["frame_count"] = info.frameCount;
  j["capture_fps"] = info.captureRate.toDouble();
  j["capture_fps_exact"] = toString(info.captureRate);
  j["capture_fps_source"] = info.captureRateFromMetadata ? "metadata" : "file rate";
  j["file_fps"] = info.fileRate.valid() ? info.fileRate.toDouble() : 0.0;
  j["file_fps_exact"] = info.fileRate.valid() ? toString(info.fileRate) : "unknown";
  j["timestamp_fps"] = info.indexRate.valid() ? info.indexRate.toDouble() : 0.0;
  j["time_base"] = toString(info.timeBase);
  j["width"] = info.width;
  j["height"] = info.height;
  j["pixel_format"] = info.pixelFormat;
  j["codec"] = info.codec;
  j["container"] = info.container;
  j["duration_s"] = info.durationSeconds;
  j["variable_frame_rate"] = info.variableFrameRate;
  j["keyframe_interval"] = {{"min", info.keyframeInterval.min},
                            {"median", info.keyframeInterval.median},
                            {"max", info.keyframeInterval.max}};
  j["stored_width"] = info.storedWidth;
  j["stored_height"] = info.storedHeight;
  j["rotation"] = info.rotation.degrees;  // counter-clockwise, as ffprobe's display matrix
  j["rotation_applied"] = info.rotation.applied;
  j["damaged_frames"] = info.damagedFrames;
  j["damaged_frames_checked"] = info.everyFrameDecoded ? "every frame decoded" : "container flags";
  nlohmann::json details = nlohmann::json::array();
  for (const auto& d : info.damage) details.push_back({{"frame", d.frame}, {"reason", d.reason}});
  j["damaged_frame_details"] = details;
  j["warnings"] = info.warnings;
  return j;
}

void printText(const video::VideoInfo& info) {
  std::ostringstream out;
  out << info.path << '\n'
      << "  frames        " << info.frameCount << '\n'
      << "  size          " << info.width << 'x' << info.height << "  " << info.pixelFormat << '\n'
      << "  codec         " << info.codec << " in " << info.container << '\n'
      << "  file rate     " << (info.fileRate.valid() ? toString(info.fileRate) : "unknown")
      << " fps\n"
      << "  capture rate  " << toString(info.captureRate) << " fps ("
      << (info.captureRateFromMetadata ? "from metadata" : "assumed = file rate; set per project")
      << ")\n"
      << "  duration      " << std::fixed << std::setprecision(3) << info.durationSeconds << " s\n"
      << "  keyframes     every " << info.keyframeInterval.min << ".." << info.keyframeInterval.max
      << " frames (median " << info.keyframeInterval.median << ")\n"
      << "  rotation      " << info.rotation.degrees << " degrees"
      << (info.rotation.degrees == 0 ? ""
          : info.rotation.applied
              ? " (counter-clockwise; applied: frames are turned upright)"
              : " (counter-clockwise; NOT applied: " + info.rotation.notApplied + ")")
      << '\n'
      << "  damaged       "
      << (info.damage.empty()
              ? std::string("none")
              : std::to_string(info.damage.size()) + " frame(s): " + frameList(info.damagedFrames))
      << (info.everyFrameDecoded ? " (every frame decoded)"
                                 : " (container flags only; run without --quick to decode)")
      << '\n';
  for (const auto& d : info.damage) out << "    frame " << d.frame << ": " << d.reason << '\n';
  for (const auto& w : info.warnings) out << "  warning: " << w << '\n';
  std::cout << out.str();
}

}  // namespace

void addProbeVerb(CLI::App& app, VerbAction& action) {
  auto options = std::make_shared<ProbeOptions>();
  CLI::App* verb = app.add_subcommand(
      "probe",
      "Frame count, rates, size, rotation, codec, keyframe spacing and damaged frames of a video");
  verb->add_option("VIDEO", options->video, "video file")->required()->check(regularFileInput());
  verb->add_flag("--json", options->json, "print JSON instead of text");
  verb->add_flag("--quick", options->quick,
                 "skip decoding every frame (damaged frames are then only those the container "
                 "flags)");
  verb->callback([options, &action] {
    action = [options] {
      // Decoder complaints about damaged frames would flood stderr; probe lists them itself.
      av_log_set_level(AV_LOG_FATAL);
      const video::VideoInfo info = video::probeVideo(options->video, !options->quick);
      if (!info.indexCacheNote.empty())
        std::cerr << "stridemark: note: " << info.indexCacheNote << '\n';
      if (options->json)
        std::cout << toJson(info).dump(2) << '\n';
      else
        printText(info);
      return 0;
    };
  });
}

}  // namespace stridemark::cli
