#include "video/convert.h"

#include <array>
#include <fstream>

#include <opencv2/core.hpp>
#include <opencv2/imgproc.hpp>

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

int swsFlags(ConversionQuality quality, int filter) {
  return quality == ConversionQuality::exact ? filter | SWS_ACCURATE_RND : filter;
}

// A swscale context and what it was made for.
struct CachedSws {
  detail::SwsContextPtr context;
  std::array<int, 7> made{};  // source size and format, target size and format, flags
};

// Converts with a cached swscale context into any destination format and size. The context is
// remade whenever anything differs: sws_getCachedContext stores yuvj420p as yuv420p plus a
// range flag, so alternating yuv420p and yuvj420p frames would reuse the wrong range.
void scaleInto(CachedSws& cached, const DecodedFrame& frame, AVPixelFormat dstFormat,
               std::uint8_t* dst, int stride, int width, int height, int flags) {
  if (!dst || frame.bytes() == 0)
    throw Error(ErrorCategory::decode, "cannot convert an empty frame");
  const std::array<int, 7> wanted = {frame.width(), frame.height(), frame.pixelFormat(),
                                     width,         height,         static_cast<int>(dstFormat),
                                     flags};
  if (!cached.context || cached.made != wanted) {
    cached.context.reset(sws_getContext(frame.width(), frame.height(),
                                        static_cast<AVPixelFormat>(frame.pixelFormat()), width,
                                        height, dstFormat, flags, nullptr, nullptr, nullptr));
    cached.made = wanted;
  }
  if (!cached.context)
    throw Error(ErrorCategory::decode,
                std::string("cannot convert pixel format ") +
                    av_get_pix_fmt_name(static_cast<AVPixelFormat>(frame.pixelFormat())));
  const auto planes = frame.planes();
  const std::uint8_t* src[4] = {planes[0], planes[1], planes[2], planes[3]};
  const int srcStride[4] = {frame.linesizes()[0], frame.linesizes()[1], frame.linesizes()[2],
                            frame.linesizes()[3]};
  std::uint8_t* dstPlanes[4] = {dst, nullptr, nullptr, nullptr};
  const int dstStride[4] = {stride, 0, 0, 0};
  sws_scale(cached.context.get(), src, srcStride, 0, frame.height(), dstPlanes, dstStride);
}

}  // namespace

int bytesPerPixel(PackedFormat format) {
  return format == PackedFormat::rgb24 || format == PackedFormat::bgr24 ? 3 : 4;
}

struct FrameConverter::State {
  ConversionQuality quality = ConversionQuality::exact;
  CachedSws sws;
  CachedSws swsScaled;
  cv::Mat planes[3];  // halved planes (reused between calls)
  cv::Mat i420;       // planes at the target size, one buffer in I420 order
};

FrameConverter::FrameConverter(ConversionQuality quality) : state_(std::make_unique<State>()) {
  state_->quality = quality;
}
FrameConverter::~FrameConverter() = default;

void FrameConverter::convert(const DecodedFrame& frame, PackedFormat format, std::uint8_t* dst,
                             int stride) {
  // Unscaled: the point filter avoids any resampling of chroma beyond what the format change
  // needs (VIDEO-NOTES §0.9: every filter costs the same here).
  scaleInto(state_->sws, frame, avFormatOf(format), dst, stride, frame.width(), frame.height(),
            swsFlags(state_->quality, SWS_POINT));
}

namespace {

// Resizes the three planes of an 8-bit 4:2:0 frame into `i420` (Y, then U, then V, at the
// target size), halving by area averaging first while the scale is 1/2 or less.
void resizePlanes(const DecodedFrame& frame, cv::Mat (&halved)[3], cv::Mat& i420, int width,
                  int height) {
  const auto data = frame.planes();
  const auto& lines = frame.linesizes();
  const int cw = (frame.width() + 1) / 2, ch = (frame.height() + 1) / 2;
  cv::Mat source[3] = {
      cv::Mat(frame.height(), frame.width(), CV_8UC1, const_cast<std::uint8_t*>(data[0]),
              static_cast<std::size_t>(lines[0])),
      cv::Mat(ch, cw, CV_8UC1, const_cast<std::uint8_t*>(data[1]),
              static_cast<std::size_t>(lines[1])),
      cv::Mat(ch, cw, CV_8UC1, const_cast<std::uint8_t*>(data[2]),
              static_cast<std::size_t>(lines[2]))};
  i420.create(height * 3 / 2, width, CV_8UC1);
  const int quarter = (width / 2) * (height / 2);
  cv::Mat target[3] = {i420.rowRange(0, height),
                       cv::Mat(height / 2, width / 2, CV_8UC1, i420.ptr(height)),
                       cv::Mat(height / 2, width / 2, CV_8UC1, i420.ptr(height) + quarter)};
  for (int p = 0; p < 3; ++p) {
    cv::Mat plane = source[p];
    while (plane.cols >= 2 * target[p].cols && plane.rows >= 2 * target[p].rows) {
      cv::Mat& half = halved[p];
      cv::resize(plane, half, cv::Size(plane.cols / 2, plane.rows / 2), 0, 0, cv::INTER_AREA);
      plane = half;
    }
    cv::resize(plane, target[p], target[p].size(), 0, 0, cv::INTER_LINEAR);
  }
}

}  // namespace

void FrameConverter::convertScaled(const DecodedFrame& frame, PackedFormat format,
                                   std::uint8_t* dst, int stride, int width, int height) {
  if (width == frame.width() && height == frame.height())
    return convert(frame, format, dst, stride);
  if (width <= 0 || height <= 0 || !dst || frame.bytes() == 0)
    throw Error(ErrorCategory::decode, "cannot convert a frame to " + std::to_string(width) + "x" +
                                           std::to_string(height));
  const bool fourBytes = format == PackedFormat::bgra || format == PackedFormat::rgba;
  if (frame.pixelFormat() == AV_PIX_FMT_YUV420P && fourBytes && width % 2 == 0 && height % 2 == 0) {
    resizePlanes(frame, state_->planes, state_->i420, width, height);
    cv::Mat out(height, width, CV_8UC4, dst, static_cast<std::size_t>(stride));
    // Limited-range BT.601, as swscale's default for these frames.
    cv::cvtColor(state_->i420, out,
                 format == PackedFormat::bgra ? cv::COLOR_YUV2BGRA_I420 : cv::COLOR_YUV2RGBA_I420);
    return;
  }
  scaleInto(state_->swsScaled, frame, avFormatOf(format), dst, stride, width, height,
            swsFlags(state_->quality, SWS_BILINEAR));
}

void toRgba(const DecodedFrame& frame, std::uint8_t* dst, int stride) {
  FrameConverter(ConversionQuality::exact).convert(frame, PackedFormat::rgba, dst, stride);
}

void toBgr(const DecodedFrame& frame, std::uint8_t* dst, int stride) {
  FrameConverter(ConversionQuality::exact).convert(frame, PackedFormat::bgr24, dst, stride);
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
  CachedSws sws;
  scaleInto(sws, frame, rgbFormat, rgb->data[0], rgb->linesize[0], frame.width(), frame.height(),
            swsFlags(ConversionQuality::exact, SWS_POINT));

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
