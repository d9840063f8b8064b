#pragma once
// The marked-clip pipeline: decode (core/video FrameReader) -> draw (QPainter on an RGBA
// QImage) -> encode (core/video Encoder, H.264 yuv420p MP4). Decoding and drawing run on a
// worker thread, encoding on the calling thread, joined by a small bounded queue of recycled
// images. Progress is reported per encoded frame; a cancel flag stops both ends promptly.
#include <QImage>
#include <atomic>
#include <cstdint>
#include <filesystem>
#include <functional>
#include <memory>
#include <string>
#include <vector>

#include "common/rational.h"
#include "ui/export/clip_overlay.h"

namespace stridemark::video {
class FrameIndex;
}

namespace stridemark::ui::exports {

// Paints the right-hand panel of the side-by-side layout for one frame.
using SidePanelPaint = std::function<void(QPainter&, const QRectF& area, std::int64_t frame)>;

struct ClipSettings {
  std::string videoPath;
  std::shared_ptr<const video::FrameIndex> index;  // built from videoPath when null
  std::int64_t first = 0;
  std::int64_t last = 0;  // inclusive
  Rational playbackRate{30, 1};
  SidePanelPaint sidePanel;          // side-by-side layout when set
  double sidePanelWidthShare = 0.8;  // panel width as a share of the frame height
  // Encoder settings; threads always explicit (libx264 threads=auto is slow on 2 vCPUs).
  std::string x264Preset = "veryfast";
  int x264Crf = 20;
  int encoderThreads = 2;
  int decoderThreads = 2;
  bool drawOverlay = true;  // false only for benchmarks of the bare pipeline
};

// Called after each encoded frame with (frames done, frames total); runs on the caller's thread.
using ClipProgress = std::function<void(std::int64_t done, std::int64_t total)>;

struct ClipResult {
  std::int64_t frames = 0;  // frames encoded
  int width = 0;
  int height = 0;
  // Damaged frames of the range that were skipped (not encoded), with the decoder's reason.
  std::vector<std::int64_t> skippedDamaged;
  std::string firstDamageReason;
  int rotationDegrees = 0;  // display rotation of the video (rotation.h); frames are upright
  bool rotationApplied = false;
};

// The default playback rate: slow motion for high-speed footage (capture above 60 fps is
// played at 30 fps), real time otherwise.
Rational defaultPlaybackRate(Rational captureRate);

// Renders frames [first, last] to an MP4 at `outPath`. Throws stridemark::Error(export_) on
// failure and Error(export_, "... cancelled") when `cancel` becomes true; in both cases the
// file at outPath may be incomplete (callers write to a staged name and discard it).
ClipResult renderMarkedClip(const ClipSettings& settings, const OverlayModel& overlay,
                            const std::filesystem::path& outPath, const ClipProgress& progress,
                            const std::atomic<bool>& cancel);

}  // namespace stridemark::ui::exports
