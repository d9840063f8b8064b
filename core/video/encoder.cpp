#include "video/encoder.h"

#include <array>

extern "C" {
#include <libavcodec/avcodec.h>
#include <libavformat/avformat.h>
#include <libavutil/dict.h>
#include <libavutil/error.h>
#include <libavutil/frame.h>
#include <libavutil/imgutils.h>
#include <libavutil/opt.h>
#include <libswscale/swscale.h>
}

#include "common/error.h"

namespace stridemark::video {
namespace {

struct OutputFormatCloser {
  void operator()(AVFormatContext* ctx) const {
    if (ctx->pb && !(ctx->oformat->flags & AVFMT_NOFILE)) avio_closep(&ctx->pb);
    avformat_free_context(ctx);
  }
};
struct CodecCloser {
  void operator()(AVCodecContext* ctx) const { avcodec_free_context(&ctx); }
};
struct FrameCloser {
  void operator()(AVFrame* frame) const { av_frame_free(&frame); }
};
struct PacketCloser {
  void operator()(AVPacket* packet) const { av_packet_free(&packet); }
};
struct ScalerCloser {
  void operator()(SwsContext* ctx) const { sws_freeContext(ctx); }
};
struct DictCloser {
  void operator()(AVDictionary* dict) const { av_dict_free(&dict); }
};

std::string libavText(int code) {
  std::array<char, AV_ERROR_MAX_STRING_SIZE> text{};
  av_strerror(code, text.data(), text.size());
  return text.data();
}

AVPixelFormat libavLayout(PixelLayout layout) {
  switch (layout) {
    case PixelLayout::bgr24:
      return AV_PIX_FMT_BGR24;
    case PixelLayout::rgba32:
      return AV_PIX_FMT_RGBA;
    case PixelLayout::bgra32:
      return AV_PIX_FMT_BGRA;
    case PixelLayout::yuv420p:
      return AV_PIX_FMT_YUV420P;
  }
  return AV_PIX_FMT_BGR24;
}

}  // namespace

struct Encoder::State {
  EncoderOptions options;
  std::unique_ptr<AVFormatContext, OutputFormatCloser> format;
  std::unique_ptr<AVCodecContext, CodecCloser> codec;
  std::unique_ptr<AVFrame, FrameCloser> frame;
  std::unique_ptr<AVPacket, PacketCloser> packet;
  std::unique_ptr<SwsContext, ScalerCloser> scaler;
  AVStream* stream = nullptr;
  std::int64_t written = 0;
  bool finished = false;

  [[noreturn]] void fail(const std::string& what, int code) const {
    std::string message = "cannot write video '" + options.path.string() + "': " + what;
    if (code != 0) message += " (" + libavText(code) + ")";
    message += ". Check that the folder exists and is writable and the disk has room.";
    throw Error(ErrorCategory::export_, message);
  }

  void check(int code, const std::string& what) const {
    if (code < 0) fail(what, code);
  }

  void openContainer() {
    const char* muxer = options.codec == VideoCodec::h264 ? "mp4" : "avi";
    AVFormatContext* raw = nullptr;
    check(avformat_alloc_output_context2(&raw, nullptr, muxer, options.path.string().c_str()),
          "no muxer for this file");
    format.reset(raw);
    if (!options.comment.empty())
      av_dict_set(&format->metadata, "comment", options.comment.c_str(), 0);
  }

  void openCodec() {
    const bool h264 = options.codec == VideoCodec::h264;
    const AVCodec* encoder =
        h264 ? avcodec_find_encoder_by_name("libx264") : avcodec_find_encoder(AV_CODEC_ID_MJPEG);
    if (!encoder) fail(h264 ? "libx264 is not available in this FFmpeg" : "no MJPEG encoder", 0);
    codec.reset(avcodec_alloc_context3(encoder));
    if (!codec) fail("out of memory", 0);
    codec->width = options.width;
    codec->height = options.height;
    codec->time_base =
        AVRational{static_cast<int>(options.fileRate.den), static_cast<int>(options.fileRate.num)};
    codec->framerate =
        AVRational{static_cast<int>(options.fileRate.num), static_cast<int>(options.fileRate.den)};
    codec->pix_fmt = h264 ? AV_PIX_FMT_YUV420P : AV_PIX_FMT_YUVJ420P;
    codec->thread_count = options.threads;
    // Demote libx264's per-run statistics (info) to verbose; warnings and errors still show.
    codec->log_level_offset = AV_LOG_VERBOSE - AV_LOG_INFO;
    if (options.keyframeInterval > 0) codec->gop_size = options.keyframeInterval;
    if (format->oformat->flags & AVFMT_GLOBALHEADER) codec->flags |= AV_CODEC_FLAG_GLOBAL_HEADER;

    AVDictionary* raw = nullptr;
    if (h264) {
      av_dict_set(&raw, "preset", options.x264Preset.c_str(), 0);
      av_dict_set_int(&raw, "crf", options.x264Crf, 0);
      av_dict_set_int(&raw, "threads", options.threads, 0);
    } else {
      codec->flags |= AV_CODEC_FLAG_QSCALE;
      codec->global_quality = FF_QP2LAMBDA * options.mjpegQuality;
    }
    std::unique_ptr<AVDictionary, DictCloser> settings(raw);
    AVDictionary* pass = settings.release();
    const int opened = avcodec_open2(codec.get(), encoder, &pass);
    settings.reset(pass);
    check(opened, "cannot open the encoder");
  }

  void openStream() {
    stream = avformat_new_stream(format.get(), nullptr);
    if (!stream) fail("cannot add a video stream", 0);
    stream->time_base = codec->time_base;
    stream->avg_frame_rate = codec->framerate;
    check(avcodec_parameters_from_context(stream->codecpar, codec.get()), "codec parameters");
    check(avio_open(&format->pb, options.path.string().c_str(), AVIO_FLAG_WRITE),
          "cannot create the file");
    AVDictionary* raw = nullptr;
    // Index at the front: the file opens and seeks without reading to the end.
    if (options.codec == VideoCodec::h264) av_dict_set(&raw, "movflags", "+faststart", 0);
    const int written_header = avformat_write_header(format.get(), &raw);
    av_dict_free(&raw);
    check(written_header, "cannot write the file header");
  }

  void allocateBuffers() {
    frame.reset(av_frame_alloc());
    packet.reset(av_packet_alloc());
    if (!frame || !packet) fail("out of memory", 0);
    frame->format = codec->pix_fmt;
    frame->width = options.width;
    frame->height = options.height;
    check(av_frame_get_buffer(frame.get(), 0), "cannot allocate a frame");
    scaler.reset(sws_getContext(options.width, options.height, libavLayout(options.input),
                                options.width, options.height, codec->pix_fmt, SWS_BILINEAR,
                                nullptr, nullptr, nullptr));
    if (!scaler) fail("cannot set up the colour conversion", 0);
  }

  // Sends one frame (or nullptr to drain) and writes every packet the codec returns.
  void encode(AVFrame* input) {
    check(avcodec_send_frame(codec.get(), input), "encoding failed");
    while (true) {
      const int got = avcodec_receive_packet(codec.get(), packet.get());
      if (got == AVERROR(EAGAIN) || got == AVERROR_EOF) return;
      check(got, "encoding failed");
      av_packet_rescale_ts(packet.get(), codec->time_base, stream->time_base);
      packet->stream_index = stream->index;
      check(av_interleaved_write_frame(format.get(), packet.get()), "cannot write to the file");
    }
  }
};

Encoder::Encoder(const EncoderOptions& options) : state_(std::make_unique<State>()) {
  state_->options = options;
  if (options.width <= 0 || options.height <= 0 || options.width % 2 || options.height % 2)
    state_->fail("frame size " + std::to_string(options.width) + "x" +
                     std::to_string(options.height) + " must be positive and even",
                 0);
  if (!options.fileRate.valid()) state_->fail("the file rate must be positive", 0);
  if (options.threads < 1) state_->fail("the encoder needs at least one thread", 0);
  state_->openContainer();
  state_->openCodec();
  state_->openStream();
  state_->allocateBuffers();
}

Encoder::~Encoder() {
  try {
    finish();
  } catch (const Error&) {
    // A destructor cannot report; callers who care call finish() themselves.
  }
}

void Encoder::write(const std::uint8_t* pixels, std::ptrdiff_t stride) {
  State& s = *state_;
  if (s.finished) throw Error(ErrorCategory::export_, "internal: write() after finish()");
  s.check(av_frame_make_writable(s.frame.get()), "cannot reuse the frame buffer");
  const int w = s.options.width, h = s.options.height;
  const auto ys = static_cast<int>(stride);
  if (s.options.input == PixelLayout::yuv420p) {
    const std::uint8_t* const planes[3] = {pixels, pixels + static_cast<std::ptrdiff_t>(ys) * h,
                                           pixels + static_cast<std::ptrdiff_t>(ys) * h +
                                               static_cast<std::ptrdiff_t>(ys / 2) * (h / 2)};
    const int strides[3] = {ys, ys / 2, ys / 2};
    if (s.codec->pix_fmt == AV_PIX_FMT_YUV420P) {
      // Already what the codec takes: copy the planes (the caller's conversion is often faster
      // than swscale's plain-C BGR path).
      av_image_copy_plane(s.frame->data[0], s.frame->linesize[0], planes[0], strides[0], w, h);
      for (int p = 1; p < 3; ++p)
        av_image_copy_plane(s.frame->data[p], s.frame->linesize[p], planes[p], strides[p], w / 2,
                            h / 2);
    } else {  // MJPEG wants full-range YUV: let swscale convert the range
      sws_scale(s.scaler.get(), planes, strides, 0, h, s.frame->data, s.frame->linesize);
    }
  } else {
    const std::uint8_t* const planes[1] = {pixels};
    const int strides[1] = {ys};
    sws_scale(s.scaler.get(), planes, strides, 0, h, s.frame->data, s.frame->linesize);
  }
  s.frame->pts = s.written;
  s.encode(s.frame.get());
  ++s.written;
}

void Encoder::finish() {
  State& s = *state_;
  if (s.finished) return;
  s.finished = true;
  s.encode(nullptr);
  s.check(av_write_trailer(s.format.get()), "cannot finish the file");
}

std::int64_t Encoder::framesWritten() const {
  return state_->written;
}
const EncoderOptions& Encoder::options() const {
  return state_->options;
}

}  // namespace stridemark::video
