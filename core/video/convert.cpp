#include "video/convert.h"

#include <fstream>

#include "common/error.h"
#include "video/libav_handles.h"

extern "C" {
#include <libavutil/imgutils.h>
#include <libavutil/pixdesc.h>
}

namespace stridemark::video {

namespace {

AVPixelFormat avFormatOf(PackedFormat format) {
  switch (format) {
    case PackedFormat::rgba:
      return AV_PIX_FMT_RGBA;
    case PackedFormat::bgra:
      return AV_PIX_FMT_BGRA;
    case PackedFormat::rgb24:
      return AV_PIX_FMT_RGB24;
    case PackedFormat::bgr24:
      return AV_PIX_FMT_BGR24;
  }
  return AV_PIX_FMT_RGBA;
}

// Converts with a cached swscale context into any destination format.
void scaleInto(detail::SwsContextPtr& cached, const DecodedFrame& frame, AVPixelFormat dstFormat,
               std::uint8_t* dst, int stride) {
  if (!dst || frame.bytes() == 0)
    throw Error(ErrorCategory::decode, "cannot convert an empty frame");
  // Unscaled conversion: the point filter avoids any resampling of chroma beyond what the
  // format change needs (VIDEO-NOTES §0.9: every flag costs the same here).
  // sws_getCachedContext frees the old context itself when it has to make a new one.
  cached.reset(sws_getCachedContext(cached.release(), frame.width(), frame.height(),
                                    static_cast<AVPixelFormat>(frame.pixelFormat()), frame.width(),
                                    frame.height(), dstFormat, SWS_POINT | SWS_ACCURATE_RND,
                                    nullptr, nullptr, nullptr));
  if (!cached)
    throw Error(ErrorCategory::decode,
                std::string("cannot convert pixel format ") +
                    av_get_pix_fmt_name(static_cast<AVPixelFormat>(frame.pixelFormat())));
  const auto planes = frame.planes();
  const std::uint8_t* src[4] = {planes[0], planes[1], planes[2], planes[3]};
  const int srcStride[4] = {frame.linesizes()[0], frame.linesizes()[1], frame.linesizes()[2],
                            frame.linesizes()[3]};
  std::uint8_t* dstPlanes[4] = {dst, nullptr, nullptr, nullptr};
  const int dstStride[4] = {stride, 0, 0, 0};
  sws_scale(cached.get(), src, srcStride, 0, frame.height(), dstPlanes, dstStride);
}

}  // namespace

int bytesPerPixel(PackedFormat format) {
  return format == PackedFormat::rgb24 || format == PackedFormat::bgr24 ? 3 : 4;
}

struct FrameConverter::State {
  detail::SwsContextPtr sws;
};

FrameConverter::FrameConverter() : state_(std::make_unique<State>()) {}
FrameConverter::~FrameConverter() = default;

void FrameConverter::convert(const DecodedFrame& frame, PackedFormat format, std::uint8_t* dst,
                             int stride) {
  scaleInto(state_->sws, frame, avFormatOf(format), dst, stride);
}

void toRgba(const DecodedFrame& frame, std::uint8_t* dst, int stride) {
  FrameConverter().convert(frame, PackedFormat::rgba, dst, stride);
}

void toBgr(const DecodedFrame& frame, std::uint8_t* dst, int stride) {
  FrameConverter().convert(frame, PackedFormat::bgr24, dst, stride);
}

void writePng(const DecodedFrame& frame, const std::string& path) {
  const AVPixFmtDescriptor* desc =
      av_pix_fmt_desc_get(static_cast<AVPixelFormat>(frame.pixelFormat()));
  const bool deep = desc && desc->comp[0].depth > 8;
  const AVPixelFormat rgbFormat = deep ? AV_PIX_FMT_RGB48BE : AV_PIX_FMT_RGB24;

  const AVCodec* png = avcodec_find_encoder(AV_CODEC_ID_PNG);
  if (!png) throw Error(ErrorCategory::export_, "this FFmpeg build has no PNG encoder");
  detail::CodecContextPtr enc(avcodec_alloc_context3(png));
  if (!enc) throw Error(ErrorCategory::export_, "out of memory creating the PNG encoder");
  enc->width = frame.width();
  enc->height = frame.height();
  enc->pix_fmt = rgbFormat;
  enc->time_base = AVRational{1, 1};
  if (const int rc = avcodec_open2(enc.get(), png, nullptr); rc < 0)
    throw Error(ErrorCategory::export_,
                "cannot open the PNG encoder (" + detail::avErrorText(rc) + ")");

  detail::FramePtr rgb = detail::makeFrame();
  rgb->width = frame.width();
  rgb->height = frame.height();
  rgb->format = rgbFormat;
  if (av_frame_get_buffer(rgb.get(), 0) < 0)
    throw Error(ErrorCategory::export_, "out of memory converting the frame for PNG");
  detail::SwsContextPtr sws;
  scaleInto(sws, frame, rgbFormat, rgb->data[0], rgb->linesize[0]);

  detail::PacketPtr packet = detail::makePacket();
  if (avcodec_send_frame(enc.get(), rgb.get()) < 0 || avcodec_send_frame(enc.get(), nullptr) < 0 ||
      avcodec_receive_packet(enc.get(), packet.get()) < 0)
    throw Error(ErrorCategory::export_, path + ": PNG encoding failed");
  std::ofstream out(path, std::ios::binary | std::ios::trunc);
  out.write(reinterpret_cast<const char*>(packet->data), packet->size);
  if (!out)
    throw Error(ErrorCategory::export_,
                path + ": cannot write the PNG. Check that the folder exists and is writable.");
}

}  // namespace stridemark::video
