// `stridemark frame VIDEO --index N (--png OUT | --md5)`: one exact frame, as a PNG or as the
// MD5 of its raw planes in native pixel format (the value `ffmpeg -f framemd5` prints). Frames
// of videos with a display rotation are turned upright first, as ffmpeg does by default.
#include <iostream>
#include <memory>

#include "cli/arguments.h"
#include "cli/verbs.h"
#include "common/error.h"
#include "video/convert.h"
#include "video/frame_index.h"
#include "video/frame_reader.h"

extern "C" {
#include <libavutil/log.h>
}

namespace stridemark::cli {

namespace {

struct FrameOptions {
  std::string video;
  std::string index;  // as given; parsed strictly (no hex, no clamping)
  std::string png;
  bool md5 = false;
};

int runFrame(const FrameOptions& options) {
  av_log_set_level(AV_LOG_FATAL);  // our own messages name the frame and the reason
  const std::int64_t wanted = parseFrameNumber(options.index, "--index");
  if (!options.png.empty())
    refuseToReplaceInputs(options.png, "--png", {{"the video", options.video}});
  auto index =
      std::make_shared<const video::FrameIndex>(video::FrameIndex::openCached(options.video));
  if (!index->sidecarProblem().empty())
    std::cerr << "stridemark: note: " << index->sidecarProblem() << '\n';
  if (wanted >= index->frameCount())
    throw Error(ErrorCategory::seek, options.video + ": frame " + std::to_string(wanted) +
                                         " does not exist; the clip has frames 0.." +
                                         std::to_string(index->frameCount() - 1) + ".");
  video::FrameReader reader(options.video, index);
  const video::DecodedFrame frame = reader.frameAt(wanted);
  // A concealed picture is not the recorded frame: never hand it out as an exact one.
  if (frame.damaged)
    throw Error(ErrorCategory::decode,
                options.video + ": frame " + std::to_string(wanted) + " is damaged: it " +
                    video::kConcealedDamage +
                    ", "
                    "so it is not the recorded picture. `stridemark probe` lists every damaged "
                    "frame; pick a neighbouring frame.");
  if (options.md5) std::cout << frame.md5() << '\n';
  if (!options.png.empty()) video::writePng(frame, options.png);
  return 0;
}

}  // namespace

void addFrameVerb(CLI::App& app, VerbAction& action) {
  auto options = std::make_shared<FrameOptions>();
  CLI::App* verb = app.add_subcommand("frame", "Extract one exact frame as PNG or print its MD5");
  verb->add_option("VIDEO", options->video, "video file")->required()->check(regularFileInput());
  verb->add_option("--index", options->index, "frame number (0-based, presentation order)")
      ->required();
  auto* png = verb->add_option("--png", options->png, "write the frame as an RGB PNG")
                  ->check(nonEmptyPath("a file name for the PNG"));
  auto* md5 = verb->add_flag("--md5", options->md5,
                             "print the MD5 of the raw planes in native pixel format, as "
                             "`ffmpeg -f framemd5` does");
  png->excludes(md5);
  md5->excludes(png);
  verb->callback([options, &action] {
    if (options->png.empty() && !options->md5)
      throw CLI::RequiredError("one of --png OUT or --md5");
    action = [options] { return runFrame(*options); };
  });
}

}  // namespace stridemark::cli
