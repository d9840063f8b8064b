#pragma once
// Exact, single-threaded access to one clip: frameAt(n) returns frame n of the index or throws.
//
// Seek policy (documented here, relied on by FrameServer):
//  1. Pick the start keyframe by the decode-order rule (FrameIndex::keyPacketFor).
//  2. If the decoder is already positioned before n and no further from it than the keyframe
//     is, keep decoding instead of seeking (forward stepping and short forward jumps).
//  3. Otherwise seek the demuxer to the keyframe's dts (AVSEEK_FLAG_BACKWARD), flush the
//     decoder, and drop packets that come before the keyframe in decode order. If the demuxer
//     lands after the keyframe, seek again to an earlier keyframe; as a last resort restart
//     from the beginning of the file.
//  4. Identify every decoded frame by its timestamp through the index, never by counting.
//     If frame n is skipped by the decoder (e.g. a leading frame), retry from one keyframe
//     earlier, up to kMaxBackoffs times, then throw Error(seek) naming the frame.
//  5. Frames before the wanted span are decoded with skip_frame=NONREF where the index says
//     they are not needed by kept frames (VIDEO-NOTES §4.2.3).
#include <cstdint>
#include <functional>
#include <memory>
#include <string>

#include "video/decoded_frame.h"
#include "video/frame_index.h"
#include "video/rotation.h"

namespace stridemark::video {

struct ReaderOptions {
  int decodeThreads = 1;  // 1 for latency (random access), 2 for throughput (refill, play)
  bool skipNonReferencePreroll = true;
  // Turn frames upright when the stream carries a display rotation (rotation.h), as the ffmpeg
  // CLI does; false gives the stored orientation.
  bool upright = true;
};

class FrameReader {
 public:
  static constexpr int kMaxBackoffs = 3;

  FrameReader(const std::string& path, std::shared_ptr<const FrameIndex> index,
              ReaderOptions options = {}, std::shared_ptr<FramePool> pool = nullptr);
  ~FrameReader();
  FrameReader(const FrameReader&) = delete;
  FrameReader& operator=(const FrameReader&) = delete;

  // Exactly frame n in native pixel format. Throws Error(seek) for n out of range or when the
  // frame cannot be reached, Error(decode) when the decoder fails on it.
  DecodedFrame frameAt(std::int64_t n);

  // Decodes frames first..last (inclusive, presentation order) and hands each to `sink` in
  // order. `sink` returns false to stop early (cancellation). Returns the last frame number
  // delivered, or first-1 when none was.
  //
  // A frame the decoder cannot produce throws Error(decode) naming it, unless `onDamaged` is
  // given: then it is reported there (frame number, reason), skipped, and decoding goes on.
  // Frames decoded with errors reach `sink` with DecodedFrame::damaged set.
  using FrameSink = std::function<bool(DecodedFrame&&)>;
  using DamageSink = std::function<void(std::int64_t frame, const std::string& reason)>;
  std::int64_t decodeSpan(std::int64_t first, std::int64_t last, const FrameSink& sink,
                          const DamageSink& onDamaged = {});

  // The frame number the decoder would output next without seeking (-1 when unknown).
  std::int64_t nextSequentialFrame() const;
  const FrameIndex& index() const { return *index_; }
  const DisplayRotation& rotation() const;
  std::int64_t seekCount() const;  // seeks done so far (for tests and benchmarks)

 private:
  struct State;
  std::unique_ptr<State> state_;
  std::shared_ptr<const FrameIndex> index_;
};

}  // namespace stridemark::video
