#pragma once
// Display rotation (the display-matrix side data that phones write, or the old `rotate` tag,
// which FFmpeg turns into one). The ffmpeg CLI turns such frames upright before hashing them
// (`-autorotate`, on by default), and people expect to see and export them upright, so the
// reader delivers frames turned the same way: an exact quarter-turn copy of every plane, the
// same bytes as ffmpeg's transpose/hflip+vflip filters.
#include <cstdint>
#include <string>

#include "video/decoded_frame.h"

struct AVStream;

namespace stridemark::video {

struct DisplayRotation {
  // Counter-clockwise degrees as ffprobe reports the display matrix, normalised to 0..359.
  int degrees = 0;
  bool applied = false;    // frames are delivered turned upright
  std::string notApplied;  // why not, when degrees != 0 and !applied
  bool swapsSize() const { return applied && (degrees == 90 || degrees == 270); }
};

// The stream's display rotation and whether frames of `pixelFormat` (AVPixelFormat) can be
// turned exactly (planar formats with whole-byte samples; quarter turns also need the same
// chroma subsampling both ways, as ffmpeg's transpose filter does).
DisplayRotation displayRotationOf(const AVStream& stream, int pixelFormat);

// Size of a frame of width x height once turned.
int turnedWidth(const DisplayRotation& rotation, int width, int height);
int turnedHeight(const DisplayRotation& rotation, int width, int height);

// Copies the planes of a decoded picture (libav layout: data/linesize, width x height before
// turning) into `out`, whose layout must be planeLayoutFor(turned size, pixelFormat).
void copyTurned(const std::uint8_t* const data[4], const int linesize[4], int width, int height,
                int pixelFormat, const DisplayRotation& rotation, DecodedFrame& out);

}  // namespace stridemark::video
