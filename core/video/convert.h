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

int bytesPerPixel(PackedFormat format);

// Converts one frame into a caller-owned buffer of height rows of `stride` bytes. Holds a
// cached swscale context, so keep one converter per thread (it is not thread-safe).
class FrameConverter {
 public:
  FrameConverter();
  ~FrameConverter();
  FrameConverter(const FrameConverter&) = delete;
  FrameConverter& operator=(const FrameConverter&) = delete;

  void convert(const DecodedFrame& frame, PackedFormat format, std::uint8_t* dst, int stride);

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
