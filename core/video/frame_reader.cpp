#include "video/frame_reader.h"

#include <unordered_map>

#include "common/error.h"
#include "video/libav_handles.h"

extern "C" {
#include <libavutil/imgutils.h>
}

namespace stridemark::video {

namespace {

enum class RunResult { done, stopped, missed, landedPast };

// How packets read after a seek are matched to the index: byte position when every packet has
// a distinct one, else dts, else pts; when none works, by counting from the start of the file.
enum class PacketKey { pos, dts, pts, count };

}  // namespace

struct FrameReader::State {
  std::string path;
  const FrameIndex* index = nullptr;
  ReaderOptions options;
  DisplayRotation rotation;
  std::shared_ptr<FramePool> pool;
  detail::OpenedInput input;
  detail::CodecContextPtr codec;
  detail::PacketPtr packet = detail::makePacket();
  detail::FramePtr frame = detail::makeFrame();
  PacketKey keyKind = PacketKey::count;
  std::unordered_map<std::int64_t, std::int64_t> packetByKey;
  // Packets (decode positions) the decoder refused, with its error text: their frames are
  // damaged for good, so no retry from an earlier keyframe can help.
  std::unordered_map<std::int64_t, std::string> rejected;

  // Decoder sequence state.
  bool positioned = false;       // demuxer and decoder continue a valid sequence
  bool draining = false;         // NULL packet sent: needs a flush before more input
  bool checkLanding = false;     // the next packet is the first after a seek
  bool counting = false;         // packets identified by counting from the file start
  std::int64_t skipUntil = 0;    // drop packets before this decode position (after a seek)
  std::int64_t nextPacket = 0;   // decode position of the next packet to be read
  std::int64_t lastOutput = -1;  // last frame number the decoder produced in this sequence
  std::int64_t seeks = 0;

  void openDecoder() { codec = detail::openDecoder(*input.stream(), options.decodeThreads, path); }
  void restartFromBeginning();
  void seekToPacket(std::int64_t key, int fallback);
  std::int64_t identify(const AVPacket& p) const;
  RunResult run(std::int64_t first, std::int64_t last, std::int64_t& delivered,
                const FrameReader::FrameSink& sink);
  RunResult feedOnePacket(std::int64_t first);
  DecodedFrame copyOut(std::int64_t n) const;
  std::int64_t framePts() const {
    return frame->pts != AV_NOPTS_VALUE ? frame->pts : frame->best_effort_timestamp;
  }
};

namespace {

// PacketEntry (the index) and AVPacket (the demuxer) name the three keys alike.
template <typename Packet>
std::int64_t keyOf(const Packet& p, PacketKey kind) {
  switch (kind) {
    case PacketKey::pos:
      return p.pos;
    case PacketKey::dts:
      return p.dts;
    case PacketKey::pts:
      return p.pts;
    case PacketKey::count:
      break;
  }
  return -1;
}

bool keyUsable(const FrameIndex& index, PacketKey kind,
               std::unordered_map<std::int64_t, std::int64_t>& map) {
  map.clear();
  const auto& packets = index.packets();
  for (std::size_t i = 0; i < packets.size(); ++i) {
    const std::int64_t key = keyOf(packets[i], kind);
    if (key == AV_NOPTS_VALUE || (kind == PacketKey::pos && key < 0)) return false;
    if (!map.emplace(key, static_cast<std::int64_t>(i)).second) return false;
  }
  return true;
}

char pictureTypeLetter(AVPictureType type) {
  switch (type) {
    case AV_PICTURE_TYPE_I:
      return 'I';
    case AV_PICTURE_TYPE_P:
      return 'P';
    case AV_PICTURE_TYPE_B:
      return 'B';
    default:
      return '?';
  }
}

}  // namespace

void FrameReader::State::restartFromBeginning() {
  input = detail::openVideoInput(path);
  openDecoder();
  positioned = true;
  draining = false;
  checkLanding = false;
  counting = keyKind == PacketKey::count;
  nextPacket = 0;
  lastOutput = -1;
  ++seeks;
}

// Positions demuxer and decoder so the next packet fed is `key` (a packet index). `fallback`
// counts earlier attempts that landed after the key: each one aims one keyframe earlier, and
// the last resort reopens the file.
void FrameReader::State::seekToPacket(std::int64_t key, int fallback) {
  skipUntil = key;
  const auto& packets = index->packets();
  std::int64_t aim = key;
  for (int i = 0; i < fallback && aim > 0; ++i) {
    --aim;
    while (aim > 0 && !packets[static_cast<std::size_t>(aim)].keyframe) --aim;
  }
  if (keyKind == PacketKey::count || aim == 0 || fallback > FrameReader::kMaxBackoffs) {
    restartFromBeginning();
    return;
  }
  const PacketEntry& target = packets[static_cast<std::size_t>(aim)];
  const std::int64_t ts = target.dts != AV_NOPTS_VALUE ? target.dts : target.pts;
  avcodec_flush_buffers(codec.get());
  if (av_seek_frame(input.format.get(), input.streamIndex, ts, AVSEEK_FLAG_BACKWARD) < 0) {
    restartFromBeginning();
    return;
  }
  ++seeks;
  positioned = true;
  draining = false;
  checkLanding = true;
  counting = false;
  nextPacket = -1;
  lastOutput = -1;
}

std::int64_t FrameReader::State::identify(const AVPacket& p) const {
  if (counting) return nextPacket;
  const auto it = packetByKey.find(keyOf(p, keyKind));
  return it == packetByKey.end() ? -1 : it->second;
}

DecodedFrame FrameReader::State::copyOut(std::int64_t n) const {
  const bool turn = rotation.applied;
  const PlaneLayout layout =
      planeLayoutFor(turnedWidth(rotation, frame->width, frame->height),
                     turnedHeight(rotation, frame->width, frame->height), frame->format);
  DecodedFrame out(n, layout, pool);
  if (turn) {
    copyTurned(frame->data, frame->linesize, frame->width, frame->height, frame->format, rotation,
               out);
  } else {
    auto dst = out.mutablePlanes();
    std::uint8_t* dstData[4] = {dst[0], dst[1], dst[2], dst[3]};
    int dstLines[4] = {layout.linesize[0], layout.linesize[1], layout.linesize[2],
                       layout.linesize[3]};
    av_image_copy(dstData, dstLines, const_cast<const std::uint8_t**>(frame->data), frame->linesize,
                  static_cast<AVPixelFormat>(frame->format), frame->width, frame->height);
  }
  out.pts = framePts();
  out.keyframe = frame->key_frame != 0;
  out.pictureType = pictureTypeLetter(frame->pict_type);
  out.damaged = frame->decode_error_flags != 0 || (frame->flags & AV_FRAME_FLAG_CORRUPT) != 0;
  return out;
}

// Reads one packet and sends it to the decoder (or starts draining at the end of the file).
RunResult FrameReader::State::feedOnePacket(std::int64_t first) {
  for (;;) {
    const int rc = av_read_frame(input.format.get(), packet.get());
    if (rc < 0) {
      // End of file, or a read error: drain what the decoder holds either way.
      avcodec_send_packet(codec.get(), nullptr);
      draining = true;
      return RunResult::done;
    }
    if (packet->stream_index != input.streamIndex) {
      av_packet_unref(packet.get());
      continue;
    }
    const std::int64_t position = identify(*packet);
    if (checkLanding) {
      checkLanding = false;
      if (position < 0 || position > skipUntil) {
        av_packet_unref(packet.get());
        return RunResult::landedPast;
      }
    }
    if (position >= 0)
      nextPacket = position + 1;
    else if (counting)
      ++nextPacket;
    if (position >= 0 && position < skipUntil) {
      av_packet_unref(packet.get());
      continue;  // before the start keyframe: not needed
    }
    // Pre-roll: frames before the span may be skipped when nothing references them.
    const std::int64_t shown =
        position >= 0 ? index->packets()[static_cast<std::size_t>(position)].frame : first;
    codec->skip_frame = options.skipNonReferencePreroll && shown >= 0 && shown < first
                            ? AVDISCARD_NONREF
                            : AVDISCARD_DEFAULT;
    const int sent = avcodec_send_packet(codec.get(), packet.get());
    av_packet_unref(packet.get());
    // A packet the decoder rejects shows up as a missing frame in run(); remember why.
    if (sent < 0 && sent != AVERROR(EAGAIN) && position >= 0)
      rejected.emplace(position, detail::avErrorText(sent));
    return RunResult::done;
  }
}

RunResult FrameReader::State::run(std::int64_t first, std::int64_t last, std::int64_t& delivered,
                                  const FrameReader::FrameSink& sink) {
  for (;;) {
    const int rc = avcodec_receive_frame(codec.get(), frame.get());
    if (rc == 0) {
      const std::int64_t n = index->frameForPts(framePts());
      if (n < 0 || n <= lastOutput) {
        av_frame_unref(frame.get());
        continue;  // not a presented frame, or a repeat
      }
      lastOutput = n;
      if (n < first) {
        av_frame_unref(frame.get());
        continue;
      }
      if (n > delivered + 1) {
        av_frame_unref(frame.get());
        positioned = false;  // the decoder skipped the frame we need next
        return RunResult::missed;
      }
      DecodedFrame out = copyOut(n);
      av_frame_unref(frame.get());
      delivered = n;
      if (!sink(std::move(out))) return RunResult::stopped;
      if (n == last) return RunResult::done;
    } else if (rc == AVERROR(EAGAIN)) {
      if (draining) {
        positioned = false;
        return RunResult::missed;
      }
      if (feedOnePacket(first) == RunResult::landedPast) return RunResult::landedPast;
    } else if (rc == AVERROR_EOF) {
      positioned = false;
      return RunResult::missed;  // stream ended before `last`
    } else {
      // A hard decoder error: start over from a keyframe on the next attempt.
      positioned = false;
      return RunResult::missed;
    }
  }
}

FrameReader::FrameReader(const std::string& path, std::shared_ptr<const FrameIndex> index,
                         ReaderOptions options, std::shared_ptr<FramePool> pool)
    : state_(std::make_unique<State>()), index_(std::move(index)) {
  if (!index_) throw Error(ErrorCategory::seek, path + ": no frame index given to the reader");
  state_->path = path;
  state_->index = index_.get();
  state_->options = options;
  state_->pool = pool ? std::move(pool) : FramePool::create();
  state_->input = detail::openVideoInput(path);
  if (state_->input.streamIndex != index_->streamIndex())
    throw Error(ErrorCategory::seek, path +
                                         ": the frame index belongs to another stream; delete "
                                         "the index cache and open the file again");
  state_->openDecoder();
  if (options.upright)
    state_->rotation =
        displayRotationOf(*state_->input.stream(), state_->input.stream()->codecpar->format);
  // A freshly opened file is positioned at its first packet: frame 0 needs no seek.
  state_->positioned = true;
  for (PacketKey kind : {PacketKey::pos, PacketKey::dts, PacketKey::pts}) {
    if (keyUsable(*index_, kind, state_->packetByKey)) {
      state_->keyKind = kind;
      break;
    }
  }
  if (state_->keyKind == PacketKey::count) state_->packetByKey.clear();
  state_->counting = state_->keyKind == PacketKey::count;
}

FrameReader::~FrameReader() = default;

const DisplayRotation& FrameReader::rotation() const {
  return state_->rotation;
}

std::int64_t FrameReader::seekCount() const {
  return state_->seeks;
}

std::int64_t FrameReader::nextSequentialFrame() const {
  return state_->positioned ? state_->lastOutput + 1 : -1;
}

std::int64_t FrameReader::decodeSpan(std::int64_t first, std::int64_t last, const FrameSink& sink,
                                     const DamageSink& onDamaged) {
  const std::int64_t count = index_->frameCount();
  if (first < 0 || last >= count || first > last)
    throw Error(ErrorCategory::seek, state_->path + ": frames " + std::to_string(first) + ".." +
                                         std::to_string(last) + " are outside the clip (0.." +
                                         std::to_string(count - 1) + ")");
  State& s = *state_;
  std::int64_t delivered = first - 1;
  int backoff = 0;    // keyframes further back than the rule picks (decoder skipped a frame)
  int landFails = 0;  // seeks that landed after the keyframe
  std::int64_t stuckAt = -1;
  for (;;) {
    const std::int64_t want = delivered + 1;
    const std::int64_t key = index_->keyPacketFor(want, backoff);
    // Keep decoding when the decoder is before `want` and the keyframe is not further ahead.
    const bool canContinue = s.positioned && s.lastOutput < want &&
                             (s.counting || s.nextPacket < 0 || key <= s.nextPacket);
    if (!canContinue) s.seekToPacket(key, landFails);
    const RunResult result = s.run(want, last, delivered, sink);
    if (result == RunResult::done || result == RunResult::stopped) return delivered;
    if (result == RunResult::landedPast) {
      ++landFails;
      s.positioned = false;
      continue;
    }
    // missed: frame delivered+1 did not come out; go back further, then give up loudly (or
    // skip it when the caller takes damaged frames).
    if (delivered + 1 != stuckAt) {
      stuckAt = delivered + 1;
      backoff = 0;
    }
    s.positioned = false;
    const auto refused = s.rejected.find(index_->decodePosition(stuckAt));
    const bool hopeless = refused != s.rejected.end();  // an earlier start cannot help
    if (!hopeless && ++backoff <= kMaxBackoffs) continue;
    const std::string reason = hopeless ? "the decoder rejected its data (" + refused->second + ")"
                                        : "the decoder produced no picture for it, even starting " +
                                              std::to_string(kMaxBackoffs) + " keyframes earlier";
    if (!onDamaged)
      throw Error(ErrorCategory::decode,
                  s.path + ": frame " + std::to_string(stuckAt) + " is damaged: " + reason +
                      " (packet at byte " + std::to_string(index_->frame(stuckAt).pos) +
                      "). Other frames may be fine: `stridemark probe` lists every damaged "
                      "frame; re-copy the clip from the camera if it should be whole.");
    onDamaged(stuckAt, reason);
    delivered = stuckAt;  // skip it
    if (delivered == last) return delivered;
  }
}

DecodedFrame FrameReader::frameAt(std::int64_t n) {
  DecodedFrame result;
  decodeSpan(n, n, [&result](DecodedFrame&& f) {
    result = std::move(f);
    return true;
  });
  return result;
}

}  // namespace stridemark::video
