#pragma once
// RAII owners for every libav object this module touches: one unique_ptr alias per type, each
// with the matching free function, so no libav resource is ever released by hand.
#include <memory>

extern "C" {
#include <libavcodec/avcodec.h>
#include <libavformat/avformat.h>
#include <libavutil/frame.h>
#include <libswscale/swscale.h>
}

namespace stridemark::video::detail {

struct FormatContextCloser {
  void operator()(AVFormatContext* ctx) const { avformat_close_input(&ctx); }
};
struct CodecContextFreer {
  void operator()(AVCodecContext* ctx) const { avcodec_free_context(&ctx); }
};
struct FrameFreer {
  void operator()(AVFrame* frame) const { av_frame_free(&frame); }
};
struct PacketFreer {
  void operator()(AVPacket* packet) const { av_packet_free(&packet); }
};
struct SwsFreer {
  void operator()(SwsContext* ctx) const { sws_freeContext(ctx); }
};

using FormatContextPtr = std::unique_ptr<AVFormatContext, FormatContextCloser>;
using CodecContextPtr = std::unique_ptr<AVCodecContext, CodecContextFreer>;
using FramePtr = std::unique_ptr<AVFrame, FrameFreer>;
using PacketPtr = std::unique_ptr<AVPacket, PacketFreer>;
using SwsContextPtr = std::unique_ptr<SwsContext, SwsFreer>;

FramePtr makeFrame();
PacketPtr makePacket();

// libav error code -> readable text ("Invalid data found when processing input").
std::string avErrorText(int code);

// Opens `path` for demuxing and finds the first video stream. Throws stridemark::Error with a
// message naming the file for: missing file, empty file, unreadable container, no video stream.
struct OpenedInput {
  FormatContextPtr format;
  int streamIndex = -1;
  AVStream* stream() const { return format->streams[streamIndex]; }
};
OpenedInput openVideoInput(const std::string& path);

// A decoder for the stream, opened with an explicit thread count (VIDEO-NOTES §4.5: the API
// default is 1 thread; frame threads add throughput and latency).
CodecContextPtr openDecoder(const AVStream& stream, int threads, const std::string& path);

}  // namespace stridemark::video::detail
