#include "video/libav_handles.h"

#include <filesystem>
#include <system_error>

#include "common/error.h"

extern "C" {
#include <libavutil/error.h>
}

namespace stridemark::video::detail {

FramePtr makeFrame() {
  FramePtr frame(av_frame_alloc());
  if (!frame) throw Error(ErrorCategory::decode, "out of memory allocating a video frame");
  return frame;
}

PacketPtr makePacket() {
  PacketPtr packet(av_packet_alloc());
  if (!packet) throw Error(ErrorCategory::decode, "out of memory allocating a video packet");
  return packet;
}

std::string avErrorText(int code) {
  char text[AV_ERROR_MAX_STRING_SIZE] = {};
  av_strerror(code, text, sizeof text);
  return text;
}

namespace {

void checkFileIsThere(const std::string& path) {
  std::error_code ec;
  const auto status = std::filesystem::status(path, ec);
  if (ec || !std::filesystem::exists(status))
    throw Error(ErrorCategory::io, path + ": file not found. Check the path and try again.");
  if (std::filesystem::is_directory(status))
    throw Error(ErrorCategory::io, path + ": is a folder, not a video file.");
  if (std::filesystem::file_size(path, ec) == 0 && !ec)
    throw Error(ErrorCategory::format,
                path + ": the file is empty (0 bytes). Copy the video again.");
}

}  // namespace

OpenedInput openVideoInput(const std::string& path) {
  checkFileIsThere(path);
  AVFormatContext* raw = nullptr;
  if (const int rc = avformat_open_input(&raw, path.c_str(), nullptr, nullptr); rc < 0) {
    throw Error(ErrorCategory::format,
                path + ": not a video file FFmpeg can read (" + avErrorText(rc) +
                    "). Check that the file is a complete video and not renamed from something "
                    "else.");
  }
  OpenedInput input;
  input.format.reset(raw);
  if (const int rc = avformat_find_stream_info(raw, nullptr); rc < 0) {
    throw Error(ErrorCategory::format, path + ": cannot read the stream layout (" +
                                           avErrorText(rc) + "). The file may be damaged.");
  }
  const int best = av_find_best_stream(raw, AVMEDIA_TYPE_VIDEO, -1, -1, nullptr, 0);
  if (best < 0 || (raw->streams[best]->disposition & AV_DISPOSITION_ATTACHED_PIC)) {
    throw Error(ErrorCategory::format,
                path +
                    ": has no video stream (only audio, subtitles or data). Pick the video "
                    "file of this recording.");
  }
  input.streamIndex = best;
  // Only the chosen stream is demuxed; the others are dropped by the demuxer.
  for (unsigned i = 0; i < raw->nb_streams; ++i)
    if (static_cast<int>(i) != best) raw->streams[i]->discard = AVDISCARD_ALL;
  return input;
}

CodecContextPtr openDecoder(const AVStream& stream, int threads, const std::string& path) {
  const AVCodec* codec = avcodec_find_decoder(stream.codecpar->codec_id);
  if (!codec) {
    throw Error(ErrorCategory::decode,
                path + ": no decoder for codec '" +
                    std::string(avcodec_get_name(stream.codecpar->codec_id)) +
                    "' in this FFmpeg build. Convert the clip (e.g. to H.264) and try again.");
  }
  CodecContextPtr ctx(avcodec_alloc_context3(codec));
  if (!ctx) throw Error(ErrorCategory::decode, "out of memory allocating a decoder");
  if (const int rc = avcodec_parameters_to_context(ctx.get(), stream.codecpar); rc < 0)
    throw Error(ErrorCategory::decode, path + ": bad codec parameters (" + avErrorText(rc) + ")");
  ctx->pkt_timebase = stream.time_base;
  ctx->thread_count = threads < 1 ? 1 : threads;
  ctx->thread_type = FF_THREAD_FRAME | FF_THREAD_SLICE;
  if (const int rc = avcodec_open2(ctx.get(), codec, nullptr); rc < 0)
    throw Error(ErrorCategory::decode,
                path + ": cannot open the " + codec->name + " decoder (" + avErrorText(rc) + ")");
  return ctx;
}

}  // namespace stridemark::video::detail
