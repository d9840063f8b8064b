#pragma once
// Conversion of native-format frames for display and export (sws_scale, unscaled path), and
// PNG output through libav's png encoder. The cache never stores converted frames.
#include <cstdint>
#include <memory>
#include <string>
#include <vector>

#include "video/decoded_frame.h"

namespace stridemark::video {

enum class PackedFormat { rgba, bgra, rgb24, bgr24 };

// exact: swscale's accurate rounding (PNG, export), the bytes `ffmpeg -sws_flags
// neighbor+accurate_rnd` gives. fast: swscale's SIMD path, within 1-2 levels of exact and about
// 5x quicker on 1080p (VIDEO-NOTES §0.9), for the Viewer, which converts a frame per step.
enum class ConversionQuality { exact, fast };

int bytesPerPixel(PackedFormat format);

// Converts one frame into a caller-owned buffer of height rows of `stride` bytes. Holds a
// cached swscale context, so keep one converter per thread (it is not thread-safe).
class FrameConverter {
 public:
  explicit FrameConverter(ConversionQuality quality = ConversionQuality::exact);
  ~FrameConverter();
  FrameConverter(const FrameConverter&) = delete;
  FrameConverter& operator=(const FrameConverter&) = delete;

  void convert(const DecodedFrame& frame, PackedFormat format, std::uint8_t* dst, int stride);
  // Converts and resizes to width x height in one pass (bilinear; planes are first halved by
  // area averaging while the scale is 1/2 or less, so small views do not alias). 8-bit 4:2:0
  // frames resize their planes with OpenCV and convert once at the target size; other formats
  // go through swscale. For a Viewer that shows the frame smaller than its pixel size.
  void convertScaled(const DecodedFrame& frame, PackedFormat format, std::uint8_t* dst, int stride,
                     int width, int height);

 private:
  struct State;
  std::unique_ptr<State> state_;
};

// One-shot helpers (a converter per call; fine outside hot loops).
void toRgba(const DecodedFrame& frame, std::uint8_t* dst, int stride);
void toBgr(const DecodedFrame& frame, std::uint8_t* dst, int stride);

// Encodes the frame as an RGB PNG (8-bit, or 16-bit for formats deeper than 8 bits) and writes
// it to `path`. Throws Error(export_) naming the file on failure.
void writePng(const DecodedFrame& frame, const std::string& path);

}  // namespace stridemark::video
