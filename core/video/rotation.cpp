#include "video/rotation.h"

#include <cmath>

#include "common/error.h"

extern "C" {
#include <libavformat/avformat.h>
#include <libavutil/display.h>
#include <libavutil/pixdesc.h>
}

namespace stridemark::video {

namespace {

// Bytes per sample when every component sits alone in its plane; 0 when the format is not
// planar that way (packed, semi-planar, paletted, bitstream, hardware).
int planarSampleBytes(const AVPixFmtDescriptor& desc) {
  if (!(desc.flags & AV_PIX_FMT_FLAG_PLANAR) ||
      (desc.flags & (AV_PIX_FMT_FLAG_PAL | AV_PIX_FMT_FLAG_BITSTREAM | AV_PIX_FMT_FLAG_HWACCEL)))
    return 0;
  const int bytes = desc.comp[0].depth > 8 ? 2 : 1;
  for (int c = 0; c < desc.nb_components; ++c)
    if (desc.comp[c].step != bytes || desc.comp[c].offset != 0 || desc.comp[c].depth > 16) return 0;
  return bytes;
}

struct PlaneSize {
  int width = 0;
  int height = 0;
};

PlaneSize planeSize(const AVPixFmtDescriptor& desc, int plane, int width, int height) {
  const bool chroma = plane == 1 || plane == 2;
  return chroma ? PlaneSize{AV_CEIL_RSHIFT(width, desc.log2_chroma_w),
                            AV_CEIL_RSHIFT(height, desc.log2_chroma_h)}
                : PlaneSize{width, height};
}

// One plane, `e` bytes per sample. Destination pixel (x, y) takes the source pixel that the
// turn brings there: 90 ccw display rotation means turning the picture 90 degrees
// counter-clockwise (ffmpeg: transpose=cclock), 270 clockwise (transpose=clock), 180 both flips.
void turnPlane(const std::uint8_t* src, int srcStride, PlaneSize s, std::uint8_t* dst,
               int dstStride, int degrees, int e) {
  const int dstWidth = degrees == 180 ? s.width : s.height;
  const int dstHeight = degrees == 180 ? s.height : s.width;
  for (int y = 0; y < dstHeight; ++y) {
    std::uint8_t* row = dst + static_cast<std::ptrdiff_t>(y) * dstStride;
    for (int x = 0; x < dstWidth; ++x) {
      int sx = 0;
      int sy = 0;
      if (degrees == 90) {  // counter-clockwise turn
        sx = s.width - 1 - y;
        sy = x;
      } else if (degrees == 270) {  // clockwise turn
        sx = y;
        sy = s.height - 1 - x;
      } else {
        sx = s.width - 1 - x;
        sy = s.height - 1 - y;
      }
      const std::uint8_t* from = src + static_cast<std::ptrdiff_t>(sy) * srcStride + sx * e;
      for (int b = 0; b < e; ++b) row[x * e + b] = from[b];
    }
  }
}

int normalisedDegrees(double ccw) {
  const int rounded = static_cast<int>(std::lround(ccw));
  return ((rounded % 360) + 360) % 360;
}

}  // namespace

DisplayRotation displayRotationOf(const AVStream& stream, int pixelFormat) {
  DisplayRotation r;
  const std::uint8_t* matrix = av_stream_get_side_data(&stream, AV_PKT_DATA_DISPLAYMATRIX, nullptr);
  if (!matrix) return r;
  const double ccw = av_display_rotation_get(reinterpret_cast<const std::int32_t*>(matrix));
  if (std::isnan(ccw)) return r;  // a degenerate matrix: nothing to turn
  r.degrees = normalisedDegrees(ccw);
  if (r.degrees == 0) return r;
  if (std::abs(ccw - std::round(ccw / 90.0) * 90.0) > 1.0 || r.degrees % 90 != 0) {
    r.notApplied = "only quarter turns are applied";
    return r;
  }
  const AVPixFmtDescriptor* desc = av_pix_fmt_desc_get(static_cast<AVPixelFormat>(pixelFormat));
  if (!desc || planarSampleBytes(*desc) == 0) {
    r.notApplied = std::string("pixel format ") + (desc ? desc->name : "unknown") +
                   " cannot be turned exactly";
    return r;
  }
  if (r.degrees != 180 && desc->log2_chroma_w != desc->log2_chroma_h) {
    r.notApplied = std::string("pixel format ") + desc->name +
                   " has different horizontal and vertical chroma subsampling";
    return r;
  }
  r.applied = true;
  return r;
}

int turnedWidth(const DisplayRotation& rotation, int width, int height) {
  return rotation.swapsSize() ? height : width;
}

int turnedHeight(const DisplayRotation& rotation, int width, int height) {
  return rotation.swapsSize() ? width : height;
}

void copyTurned(const std::uint8_t* const data[4], const int linesize[4], int width, int height,
                int pixelFormat, const DisplayRotation& rotation, DecodedFrame& out) {
  const AVPixFmtDescriptor* desc = av_pix_fmt_desc_get(static_cast<AVPixelFormat>(pixelFormat));
  const int e = desc ? planarSampleBytes(*desc) : 0;
  if (!rotation.applied || e == 0 || out.width() != turnedWidth(rotation, width, height) ||
      out.height() != turnedHeight(rotation, width, height))
    throw Error(ErrorCategory::decode,
                "internal: a frame cannot be turned to its display "
                "orientation (format or size changed mid-stream)");
  const auto planes = out.mutablePlanes();
  const int count = av_pix_fmt_count_planes(static_cast<AVPixelFormat>(pixelFormat));
  for (int p = 0; p < count && p < 4; ++p)
    turnPlane(data[p], linesize[p], planeSize(*desc, p, width, height),
              planes[static_cast<std::size_t>(p)], out.linesizes()[static_cast<std::size_t>(p)],
              rotation.degrees, e);
}

}  // namespace stridemark::video
