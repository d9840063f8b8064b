#include "video/damage_scan.h"

#include <map>

#include "common/error.h"
#include "video/decoded_frame.h"
#include "video/libav_handles.h"

namespace stridemark::video {

namespace {

// Reasons, worst first: the first one recorded for a frame is kept.
constexpr const char* kNoPicture = "the decoder produced no picture for it";
constexpr const char* kFlagged = "the container flags its data as corrupt";

class DamageLog {
 public:
  void note(std::int64_t frame, const std::string& reason) {
    if (frame >= 0) found_.emplace(frame, reason);  // keeps the first reason
  }
  std::vector<DamagedFrame> list() const {
    std::vector<DamagedFrame> out;
    for (const auto& [frame, reason] : found_) out.push_back({frame, reason});
    return out;
  }

 private:
  std::map<std::int64_t, std::string> found_;
};

}  // namespace

std::vector<DamagedFrame> findDamagedFrames(const std::string& path, const FrameIndex& index,
                                            const std::function<bool(double)>& progress) {
  detail::OpenedInput input = detail::openVideoInput(path);
  // One thread: with frame threads a refused packet is reported a few packets late, and the
  // reason would be pinned on the wrong frame.
  detail::CodecContextPtr codec = detail::openDecoder(*input.stream(), 1, path);
  detail::PacketPtr packet = detail::makePacket();
  detail::FramePtr frame = detail::makeFrame();
  const auto& packets = index.packets();
  std::vector<bool> produced(static_cast<std::size_t>(index.frameCount()), false);
  DamageLog log;

  const auto receiveAll = [&] {
    for (;;) {
      const int rc = avcodec_receive_frame(codec.get(), frame.get());
      if (rc == AVERROR(EAGAIN) || rc == AVERROR_EOF) return;
      if (rc < 0) continue;  // an error for some earlier packet: its frame shows up missing
      const std::int64_t pts =
          frame->pts != AV_NOPTS_VALUE ? frame->pts : frame->best_effort_timestamp;
      const std::int64_t n = index.frameForPts(pts);
      if (n >= 0) {
        produced[static_cast<std::size_t>(n)] = true;
        if (frame->decode_error_flags != 0 || (frame->flags & AV_FRAME_FLAG_CORRUPT) != 0)
          log.note(n, kConcealedDamage);
      }
      av_frame_unref(frame.get());
    }
  };

  std::size_t position = 0;  // packets come in index order: the index was read the same way
  for (;;) {
    const int rc = av_read_frame(input.format.get(), packet.get());
    if (rc < 0) break;  // end of file, or where the index scan stopped too
    if (packet->stream_index != input.streamIndex) {
      av_packet_unref(packet.get());
      continue;
    }
    const bool known = position < packets.size() && packets[position].pos == packet->pos;
    const std::int64_t shown = known ? packets[position].frame : -1;
    if ((packet->flags & AV_PKT_FLAG_CORRUPT) != 0) log.note(shown, kFlagged);
    receiveAll();  // make room, so the packet is never refused with EAGAIN
    const int sent = avcodec_send_packet(codec.get(), packet.get());
    av_packet_unref(packet.get());
    if (sent < 0 && sent != AVERROR(EAGAIN))
      log.note(shown, "the decoder rejected its data (" + detail::avErrorText(sent) + ")");
    receiveAll();
    ++position;
    if (progress && position % 256 == 0 &&
        !progress(static_cast<double>(position) / static_cast<double>(packets.size())))
      throw Error(ErrorCategory::io, path + ": checking frames cancelled.");
  }
  avcodec_send_packet(codec.get(), nullptr);  // drain the reorder buffer
  receiveAll();
  for (std::size_t n = 0; n < produced.size(); ++n)
    if (!produced[n]) log.note(static_cast<std::int64_t>(n), kNoPicture);
  if (progress) progress(1.0);
  return log.list();
}

}  // namespace stridemark::video
