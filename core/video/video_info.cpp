#include "video/video_info.h"

#include <algorithm>
#include <cmath>
#include <cstdio>

#include "common/error.h"
#include "video/libav_handles.h"

extern "C" {
#include <libavutil/pixdesc.h>
}

namespace stridemark::video {

namespace {

Rational toRational(AVRational r) {
  return reduced(Rational{r.num, r.den});
}

double medianOf(std::vector<std::int64_t> values) {
  if (values.empty()) return 0;
  std::sort(values.begin(), values.end());
  const std::size_t mid = values.size() / 2;
  return values.size() % 2 ? static_cast<double>(values[mid])
                           : 0.5 * static_cast<double>(values[mid - 1] + values[mid]);
}

std::vector<std::int64_t> ptsSteps(const FrameIndex& index) {
  std::vector<std::int64_t> steps;
  for (std::int64_t n = 1; n < index.frameCount(); ++n)
    steps.push_back(index.frame(n).pts - index.frame(n - 1).pts);
  return steps;
}

// Capture-rate metadata written by phones that store slow motion at a playback rate.
std::optional<Rational> captureRateTag(const AVFormatContext& format, const AVStream& stream) {
  for (const AVDictionary* dict : {stream.metadata, format.metadata}) {
    if (const AVDictionaryEntry* tag = av_dict_get(dict, "com.android.capture.fps", nullptr, 0)) {
      try {
        return parseRate(tag->value, "capture rate tag");
      } catch (const Error&) {
        return std::nullopt;  // unusable tag: fall back to the file rate
      }
    }
  }
  return std::nullopt;
}

std::string rateText(Rational r) {
  char text[64];
  std::snprintf(text, sizeof text, "%.3f", r.toDouble());
  return text;
}

void addRateWarnings(VideoInfo& info, const std::vector<std::int64_t>& steps, double median) {
  if (steps.empty() || median <= 0) return;
  const double tolerance = std::max(1.0, 0.02 * median);
  const auto irregular = std::count_if(steps.begin(), steps.end(), [&](std::int64_t s) {
    return std::abs(static_cast<double>(s) - median) > tolerance;
  });
  if (irregular > 0 && static_cast<double>(irregular) > 0.01 * static_cast<double>(steps.size())) {
    info.variableFrameRate = true;
    info.warnings.push_back("variable frame rate: " + std::to_string(irregular) + " of " +
                            std::to_string(steps.size()) +
                            " frame steps differ from the typical step; frame numbers stay exact, "
                            "but times use the capture rate you set");
  }
  if (info.fileRate.valid() && info.indexRate.valid()) {
    const double claimed = info.fileRate.toDouble();
    const double measured = info.indexRate.toDouble();
    if (std::abs(claimed - measured) > 0.01 * measured)
      info.warnings.push_back("the container claims " + rateText(info.fileRate) +
                              " fps but the timestamps advance at " + rateText(info.indexRate) +
                              " fps; set the capture rate explicitly");
  }
  if (median < 10) {
    info.warnings.push_back("time base " + toString(info.timeBase) +
                            " is too coarse for this rate (" +
                            std::to_string(static_cast<long long>(median)) +
                            " ticks per frame): timestamps are rounded; prefer MP4 over MKV for "
                            "high-speed footage");
  }
}

void listDamagedFrameNumbers(VideoInfo& info) {
  info.damagedFrames.clear();
  for (const auto& d : info.damage) info.damagedFrames.push_back(d.frame);
}

}  // namespace

void addDamageWarning(VideoInfo& info) {
  listDamagedFrameNumbers(info);
  if (info.damage.empty()) return;
  info.warnings.push_back(
      std::to_string(info.damage.size()) + " damaged frame(s), first at frame " +
      std::to_string(info.damage.front().frame) + " (" + info.damage.front().reason +
      "); `frame` refuses them and a marked-clip export skips them");
}

VideoInfo describeVideo(const std::string& path, const FrameIndex& index) {
  detail::OpenedInput input = detail::openVideoInput(path);
  const AVStream& stream = *input.stream();
  const AVCodecParameters& par = *stream.codecpar;
  VideoInfo info;
  info.path = path;
  info.codec = avcodec_get_name(par.codec_id);
  info.container = input.format->iformat->name;
  info.pixelFormatId = par.format;
  const char* pixName = av_get_pix_fmt_name(static_cast<AVPixelFormat>(par.format));
  info.pixelFormat = pixName ? pixName : "unknown";
  info.storedWidth = par.width;
  info.storedHeight = par.height;
  info.rotation = displayRotationOf(stream, par.format);
  info.width = turnedWidth(info.rotation, par.width, par.height);
  info.height = turnedHeight(info.rotation, par.width, par.height);
  info.frameCount = index.frameCount();
  info.timeBase = index.timeBase();
  info.fileRate = toRational(stream.avg_frame_rate);
  if (!info.fileRate.valid()) info.fileRate = toRational(stream.r_frame_rate);

  const auto steps = ptsSteps(index);
  const double median = medianOf(steps);
  if (median > 0) {
    const double ticksPerSecond = info.timeBase.toDouble() > 0 ? 1.0 / info.timeBase.toDouble() : 0;
    // rate = 1 / (median * timebase); keep it exact when the median is a whole number of ticks
    if (median == std::floor(median))
      info.indexRate = reduced(
          Rational{info.timeBase.den, info.timeBase.num * static_cast<std::int64_t>(median)});
    else
      info.indexRate = rationalFromDouble(ticksPerSecond / median);
  }
  if (!info.fileRate.valid()) info.fileRate = info.indexRate;
  if (auto tag = captureRateTag(*input.format, stream)) {
    info.captureRate = *tag;
    info.captureRateFromMetadata = true;
  } else {
    info.captureRate = info.fileRate;
  }
  const double span =
      static_cast<double>(index.frame(info.frameCount - 1).pts - index.frame(0).pts) +
      (median > 0 ? median : 0);
  info.durationSeconds = span * info.timeBase.toDouble();

  const auto intervals = index.keyframeIntervals();
  info.keyframeInterval.min = *std::min_element(intervals.begin(), intervals.end());
  info.keyframeInterval.max = index.maxKeyframeInterval();
  info.keyframeInterval.median = medianOf(intervals);

  addRateWarnings(info, steps, median);
  if (info.rotation.applied)
    info.warnings.push_back("the file asks for a " + std::to_string(info.rotation.degrees) +
                            " degree counter-clockwise display rotation: frames, frame MD5s and "
                            "exports are turned upright, as the ffmpeg CLI shows them");
  else if (info.rotation.degrees != 0)
    info.warnings.push_back("the file asks for a " + std::to_string(info.rotation.degrees) +
                            " degree display rotation that is NOT applied (" +
                            info.rotation.notApplied +
                            "): frames are shown as stored, and frame MD5s differ from "
                            "`ffmpeg -f framemd5`; use `-noautorotate` there to compare");
  info.indexCacheNote = index.sidecarProblem();
  for (const std::int64_t n : index.damagedFrames())
    info.damage.push_back({n, "the container flags its data as corrupt"});
  addDamageWarning(info);
  if (index.missingPackets() > 0)
    info.warnings.push_back(
        "the file ends early: " + std::to_string(index.missingPackets()) +
        " frame(s) listed by the container could not be read (truncated copy?)");
  else if (!index.scanProblem().empty())
    info.warnings.push_back("reading stopped early: " + index.scanProblem());
  if (index.timestampsSynthesised())
    info.warnings.push_back("some frames have no timestamp; their order was taken from the file");
  if (info.keyframeInterval.max > 600)
    info.warnings.push_back("long keyframe interval (" + std::to_string(info.keyframeInterval.max) +
                            " frames): stepping backwards will pause while windows are decoded");
  return info;
}

VideoInfo probeVideo(const std::string& path, bool decodeEveryFrame) {
  const FrameIndex index = FrameIndex::openCached(path);
  VideoInfo info = describeVideo(path, index);
  if (!decodeEveryFrame) return info;
  // Replace the index's view (container flags only) by a full decode's.
  std::erase_if(info.warnings, [](const std::string& w) {
    return w.find("damaged frame(s)") != std::string::npos;
  });
  info.damage = findDamagedFrames(path, index);
  info.everyFrameDecoded = true;
  addDamageWarning(info);
  return info;
}

}  // namespace stridemark::video
