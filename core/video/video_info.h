#pragma once
// What `probe` reports about a clip. Rates are exact rationals. The file rate is what the
// container claims; the nominal rate is derived from the index (median pts step); the capture
// rate is what the camera recorded (from metadata such as com.android.capture.fps when present,
// else the file rate) and is meant to be overridden per project.
#include <cstdint>
#include <string>
#include <vector>

#include "common/rational.h"
#include "video/damage_scan.h"
#include "video/frame_index.h"
#include "video/rotation.h"

namespace stridemark::video {

struct KeyframeIntervalStats {
  std::int64_t min = 0;
  double median = 0;
  std::int64_t max = 0;
};

struct VideoInfo {
  std::string path;
  std::string codec;        // e.g. "h264"
  std::string container;    // e.g. "mov,mp4,m4a,3gp,3g2,mj2"
  std::string pixelFormat;  // e.g. "yuv420p"
  int pixelFormatId = -1;   // AVPixelFormat
  int width = 0;            // as frames are delivered: upright when the rotation is applied
  int height = 0;
  int storedWidth = 0;  // as coded in the file
  int storedHeight = 0;
  DisplayRotation rotation;
  std::int64_t frameCount = 0;  // presented frames, from the index
  Rational timeBase{1, 1};
  Rational fileRate;     // container's claimed rate (r_frame_rate / avg_frame_rate)
  Rational indexRate;    // 1 / median pts step, from the index
  Rational captureRate;  // metadata capture rate, else fileRate
  bool captureRateFromMetadata = false;
  double durationSeconds = 0;  // frameCount / fileRate
  bool variableFrameRate = false;
  KeyframeIntervalStats keyframeInterval;
  std::vector<std::int64_t> damagedFrames;  // frame numbers of `damage`
  std::vector<DamagedFrame> damage;         // flagged by the container, or found by decoding
  bool everyFrameDecoded = false;           // `damage` comes from a full decode, not the index
  std::vector<std::string> warnings;
  std::string indexCacheNote;  // FrameIndex::sidecarProblem(): a cache was rebuilt, and why
};

// Opens the file, scans the index (or loads it from the index cache) and fills VideoInfo. Throws
// stridemark::Error with a message naming the file for missing/empty/unreadable files and files
// without video.
// With `decodeEveryFrame` it also decodes the whole clip once to find damaged frames
// (findDamagedFrames), which costs what a plain decode of the clip costs.
VideoInfo probeVideo(const std::string& path, bool decodeEveryFrame = true);
// Lists `damage` in damagedFrames and adds the warning about them (used by probeVideo).
void addDamageWarning(VideoInfo& info);
// Same as probeVideo without the full decode, reusing an index already built for this file.
VideoInfo describeVideo(const std::string& path, const FrameIndex& index);

}  // namespace stridemark::video
