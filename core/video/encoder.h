#pragma once
// Writes frames to a video file: H.264 (libx264, yuv420p) in MP4, or MJPEG in AVI.
// The caller hands packed BGR / RGBA / BGRA rows (pointer + stride); the encoder converts them
// with swscale. Frame i gets pts i in a time base of 1 / file rate, so frame numbers in the
// written file are exactly the order of write() calls.
#include <cstdint>
#include <filesystem>
#include <memory>
#include <string>

#include "common/rational.h"

namespace stridemark::video {

enum class VideoCodec { h264, mjpeg };
// Packed BGR / RGBA / BGRA, or planar I420 (Y plane then U then V, each plane contiguous with
// strides width, width/2, width/2 when `stride` is the width) which skips the conversion.
enum class PixelLayout { bgr24, rgba32, bgra32, yuv420p };

struct EncoderOptions {
  std::filesystem::path path;  // .mp4 for H.264, .avi for MJPEG (the container follows the codec)
  int width = 0;               // even numbers (yuv420p)
  int height = 0;
  Rational fileRate{30, 1};  // the rate the container claims (stored / playback rate)
  VideoCodec codec = VideoCodec::h264;
  PixelLayout input = PixelLayout::bgr24;
  // libx264 with threads=auto was 2-3x slower on 2 vCPUs (VIDEO-NOTES §0.10): always explicit.
  int threads = 2;
  std::string x264Preset = "veryfast";
  int x264Crf = 23;
  int keyframeInterval = 0;  // 0: libx264 default; otherwise a closed GOP of this many frames
  int mjpegQuality = 4;      // qscale 2 (best) .. 31 (worst)
  std::string comment;       // written as the container's "comment" tag when not empty
};

class Encoder {
 public:
  // Opens the file and the codec. Throws stridemark::Error(export_) naming the file on failure.
  explicit Encoder(const EncoderOptions& options);
  ~Encoder();
  Encoder(const Encoder&) = delete;
  Encoder& operator=(const Encoder&) = delete;

  // One frame of options().width x height pixels in the input layout; `stride` in bytes (for
  // yuv420p: the Y plane's stride; chroma planes follow with half of it).
  void write(const std::uint8_t* pixels, std::ptrdiff_t stride);
  // Drains the codec and writes the trailer. Called by the destructor if not called before
  // (errors are then swallowed); call it yourself to see them.
  void finish();

  std::int64_t framesWritten() const;
  const EncoderOptions& options() const;

 private:
  struct State;
  std::unique_ptr<State> state_;
};

}  // namespace stridemark::video
