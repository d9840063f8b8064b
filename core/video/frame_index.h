#pragma once
// The frame index: built by a demux-only scan (no decoding). Frame n is the n-th presented
// frame in pts order; packets that an edit list hides (AV_PKT_FLAG_DISCARD) stay in the decode
// order but get no frame number. Saved to a text sidecar bound to the file by its signature
// (computeSignature), a format version and a checksum of the payload, so a stale, foreign or
// damaged sidecar is rebuilt and never trusted (issue 17 item 5).
#include <cstdint>
#include <functional>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "common/rational.h"

namespace stridemark::video {

// One demuxed packet of the video stream, in decode (file) order.
struct PacketEntry {
  std::int64_t pts = 0;     // stream time base; synthesised when the file has none
  std::int64_t dts = 0;     // stream time base; INT64_MIN when the file has none
  std::int64_t pos = -1;    // byte position, -1 when unknown
  std::int32_t size = 0;    // bytes
  std::int64_t frame = -1;  // presentation-order frame number, -1 when not presented
  bool keyframe = false;
  bool damaged = false;    // demuxer flagged the packet corrupt
  bool discarded = false;  // an edit list hides it: decoded for reference, never shown
};

// A 64-bit FNV-1a over the first and last MiB plus the file size.
struct VideoSignature {
  std::uint64_t fileSize = 0;
  std::uint64_t headHash = 0;
  std::uint64_t tailHash = 0;
  friend bool operator==(const VideoSignature&, const VideoSignature&) = default;
};
VideoSignature computeSignature(const std::string& path);  // throws Error(io)
// The signature as text, "size-headhash-tailhash" (hex): how projects, proxies and exports name
// a clip, so a moved or renamed file is still recognised.
std::string signatureText(const VideoSignature& signature);

// Where index sidecars of the command line go, one per absolute video path: the folder named
// by $STRIDEMARK_INDEX_CACHE, else $XDG_CACHE_HOME/stridemark/index, else
// ~/.cache/stridemark/index (the video's own folder may be read-only). Empty when
// STRIDEMARK_INDEX_CACHE is "off" or no folder is known.
std::string defaultSidecarPath(const std::string& videoPath);

class FrameIndex {
 public:
  static constexpr std::uint32_t kSidecarVersion = 2;  // 2: text with a checksum (1: binary)

  // Demux-only scan of the first video stream. `progress(fraction)` may return false to
  // cancel, which throws Error(io, "... cancelled"). Damaged packets are recorded, not fatal.
  static FrameIndex build(const std::string& path,
                          const std::function<bool(double)>& progress = {});
  // Loads `sidecarPath` when it matches the file's signature and version; otherwise scans and
  // tries to write the sidecar (a write failure is not fatal: see sidecarWritten()).
  static FrameIndex buildOrLoad(const std::string& path, const std::string& sidecarPath,
                                const std::function<bool(double)>& progress = {});
  // buildOrLoad with the per-user index cache (defaultSidecarPath), or a plain build when
  // there is no usable cache folder.
  static FrameIndex openCached(const std::string& path);
  // Returns nothing when the sidecar is missing, unreadable, of another version, damaged
  // (checksum or content) or of another video. `problem` then says why, in a few words (empty
  // when the file is simply missing).
  static std::optional<FrameIndex> loadSidecar(const std::string& sidecarPath,
                                               const VideoSignature& expected,
                                               std::string* problem = nullptr);
  void saveSidecar(const std::string& sidecarPath) const;  // throws Error(io)

  std::int64_t frameCount() const { return static_cast<std::int64_t>(frameToPacket_.size()); }
  const std::vector<PacketEntry>& packets() const { return packets_; }  // decode order
  const PacketEntry& frame(std::int64_t n) const;                       // presentation order
  std::int64_t decodePosition(std::int64_t n) const;                    // packet index of frame n
  // The keyframe to start decoding from for frame n: walk back in decode order to a keyframe
  // whose pts is <= frame n's pts (open-GOP leading frames need the previous one; §3.4.1).
  // `skipKeys` steps further back that many keyframes (used when a landing fails).
  std::int64_t keyPacketFor(std::int64_t n, int skipKeys = 0) const;  // packet index
  // Frame number for a decoded pts; -1 when the pts belongs to no presented frame.
  std::int64_t frameForPts(std::int64_t pts) const;
  bool isIntraOnly() const { return intraOnly_; }
  // Largest number of frames between consecutive keyframes, in presentation order.
  std::int64_t maxKeyframeInterval() const;
  std::vector<std::int64_t> keyframeIntervals() const;
  std::vector<std::int64_t> damagedFrames() const;

  int streamIndex() const { return streamIndex_; }
  Rational timeBase() const { return timeBase_; }
  const VideoSignature& signature() const { return signature_; }
  bool sidecarWritten() const { return sidecarWritten_; }
  bool loadedFromSidecar() const { return loadedFromSidecar_; }
  // One line, set by buildOrLoad when a sidecar was there but not trusted (damaged, foreign,
  // other version) and the index was rebuilt instead: for a note on stderr or in the desk.
  const std::string& sidecarProblem() const { return sidecarProblem_; }
  bool timestampsSynthesised() const { return synthesised_; }
  // Packets the container announced but the scan could not read (truncated file).
  std::int64_t missingPackets() const { return missingPackets_; }
  // Empty, or why the scan stopped before the end of the file (read error text).
  const std::string& scanProblem() const { return scanProblem_; }

 private:
  void finish();  // derives frame order and lookups from packets_
  std::vector<PacketEntry> packets_;
  std::vector<std::int64_t> frameToPacket_;
  std::vector<std::int64_t> sortedPts_;  // pts of frame n, ascending
  VideoSignature signature_;
  Rational timeBase_{1, 1};
  int streamIndex_ = 0;
  bool intraOnly_ = false;
  bool synthesised_ = false;
  bool sidecarWritten_ = false;
  bool loadedFromSidecar_ = false;
  std::int64_t missingPackets_ = 0;
  std::string scanProblem_;
  std::string sidecarProblem_;
};

}  // namespace stridemark::video
