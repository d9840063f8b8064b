#include "video/frame_index.h"

#include <algorithm>
#include <cstdio>
#include <cstdlib>
#include <cstring>
#include <filesystem>
#include <fstream>
#include <limits>

#include "common/checksum.h"
#include "common/error.h"
#include "video/libav_handles.h"

namespace stridemark::video {

namespace {

constexpr std::uint64_t kMiB = 1 << 20;

std::uint64_t hashRange(std::ifstream& in, std::uint64_t offset, std::uint64_t size) {
  std::vector<char> buffer(static_cast<std::size_t>(size));
  in.seekg(static_cast<std::streamoff>(offset));
  in.read(buffer.data(), static_cast<std::streamsize>(size));
  return fnv1a64(std::string_view(buffer.data(), static_cast<std::size_t>(in.gcount())));
}

}  // namespace

std::string signatureText(const VideoSignature& s) {
  char text[64];
  std::snprintf(
      text, sizeof text, "%llu-%016llx-%016llx", static_cast<unsigned long long>(s.fileSize),
      static_cast<unsigned long long>(s.headHash), static_cast<unsigned long long>(s.tailHash));
  return text;
}

VideoSignature computeSignature(const std::string& path) {
  std::ifstream in(path, std::ios::binary);
  std::error_code ec;
  const auto size = std::filesystem::file_size(path, ec);
  if (!in || ec) throw Error(ErrorCategory::io, path + ": cannot read the file to sign it.");
  VideoSignature sig;
  sig.fileSize = size;
  sig.headHash = hashRange(in, 0, std::min<std::uint64_t>(size, kMiB));
  in.clear();
  const std::uint64_t tail = std::min<std::uint64_t>(size, kMiB);
  sig.tailHash = hashRange(in, size - tail, tail);
  return sig;
}

FrameIndex FrameIndex::build(const std::string& path, const std::function<bool(double)>& progress) {
  detail::OpenedInput input = detail::openVideoInput(path);
  AVStream* stream = input.stream();
  FrameIndex index;
  index.signature_ = computeSignature(path);
  index.streamIndex_ = input.streamIndex;
  index.timeBase_ = Rational{stream->time_base.num, stream->time_base.den};
  const int announced = avformat_index_get_entries_count(stream);
  const double fileSize =
      static_cast<double>(std::max<std::uint64_t>(index.signature_.fileSize, 1));

  auto packet = detail::makePacket();
  for (;;) {
    const int rc = av_read_frame(input.format.get(), packet.get());
    if (rc == AVERROR_EOF) break;
    if (rc < 0) {
      if (index.packets_.empty())
        throw Error(ErrorCategory::format,
                    path + ": cannot read any video packet (" + detail::avErrorText(rc) + ").");
      index.scanProblem_ = detail::avErrorText(rc);
      break;
    }
    if (packet->stream_index == input.streamIndex) {
      PacketEntry entry;
      entry.pts = packet->pts;
      entry.dts = packet->dts;
      entry.pos = packet->pos;
      entry.size = packet->size;
      entry.keyframe = (packet->flags & AV_PKT_FLAG_KEY) != 0;
      entry.damaged = (packet->flags & AV_PKT_FLAG_CORRUPT) != 0;
      entry.discarded = (packet->flags & AV_PKT_FLAG_DISCARD) != 0;
      index.packets_.push_back(entry);
      if (progress && index.packets_.size() % 512 == 0 && packet->pos > 0 &&
          !progress(static_cast<double>(packet->pos) / fileSize))
        throw Error(ErrorCategory::io, path + ": indexing cancelled.");
    }
    av_packet_unref(packet.get());
  }
  if (index.packets_.empty())
    throw Error(ErrorCategory::format, path + ": the video stream holds no frames.");
  const auto readCount = static_cast<int>(index.packets_.size());
  if (announced > readCount) index.missingPackets_ = announced - readCount;
  index.finish();
  if (index.frameCount() == 0)
    throw Error(ErrorCategory::format, path + ": the video stream presents no frames.");
  if (progress) progress(1.0);
  return index;
}

void FrameIndex::finish() {
  // Missing timestamps: fall back to dts, then to the previous value + 1 (keeps the order).
  std::int64_t previous = std::numeric_limits<std::int64_t>::min();
  for (auto& p : packets_) {
    if (p.pts == AV_NOPTS_VALUE) {
      synthesised_ = true;
      p.pts = p.dts != AV_NOPTS_VALUE                                ? p.dts
              : previous == std::numeric_limits<std::int64_t>::min() ? 0
                                                                     : previous + 1;
    }
    previous = p.pts;
  }
  std::vector<std::int64_t> order;
  order.reserve(packets_.size());
  for (std::size_t i = 0; i < packets_.size(); ++i)
    if (!packets_[i].discarded) order.push_back(static_cast<std::int64_t>(i));
  std::stable_sort(order.begin(), order.end(), [this](std::int64_t a, std::int64_t b) {
    return packets_[static_cast<std::size_t>(a)].pts < packets_[static_cast<std::size_t>(b)].pts;
  });
  frameToPacket_ = order;
  sortedPts_.clear();
  sortedPts_.reserve(order.size());
  for (auto& p : packets_) p.frame = -1;
  intraOnly_ = !order.empty();
  for (std::size_t n = 0; n < order.size(); ++n) {
    auto& p = packets_[static_cast<std::size_t>(order[n])];
    p.frame = static_cast<std::int64_t>(n);
    sortedPts_.push_back(p.pts);
    intraOnly_ = intraOnly_ && p.keyframe;
  }
}

const PacketEntry& FrameIndex::frame(std::int64_t n) const {
  return packets_[static_cast<std::size_t>(decodePosition(n))];
}

std::int64_t FrameIndex::decodePosition(std::int64_t n) const {
  if (n < 0 || n >= frameCount())
    throw Error(ErrorCategory::seek, "frame " + std::to_string(n) + " is outside the clip (0.." +
                                         std::to_string(frameCount() - 1) + ").");
  return frameToPacket_[static_cast<std::size_t>(n)];
}

std::int64_t FrameIndex::keyPacketFor(std::int64_t n, int skipKeys) const {
  const std::int64_t start = decodePosition(n);
  const std::int64_t targetPts = sortedPts_[static_cast<std::size_t>(n)];
  for (std::int64_t i = start; i >= 0; --i) {
    const auto& p = packets_[static_cast<std::size_t>(i)];
    if (p.keyframe && p.pts <= targetPts) {
      if (skipKeys == 0) return i;
      --skipKeys;
    }
  }
  return 0;  // no usable keyframe: decode from the first packet
}

std::int64_t FrameIndex::frameForPts(std::int64_t pts) const {
  const auto it = std::lower_bound(sortedPts_.begin(), sortedPts_.end(), pts);
  if (it == sortedPts_.end() || *it != pts) return -1;
  return it - sortedPts_.begin();
}

std::vector<std::int64_t> FrameIndex::keyframeIntervals() const {
  std::vector<std::int64_t> keys;
  for (std::int64_t n = 0; n < frameCount(); ++n)
    if (frame(n).keyframe) keys.push_back(n);
  std::vector<std::int64_t> intervals;
  for (std::size_t i = 1; i < keys.size(); ++i) intervals.push_back(keys[i] - keys[i - 1]);
  if (intervals.empty()) intervals.push_back(frameCount());  // one keyframe: the whole clip
  return intervals;
}

std::int64_t FrameIndex::maxKeyframeInterval() const {
  const auto intervals = keyframeIntervals();
  std::int64_t longest = *std::max_element(intervals.begin(), intervals.end());
  // The run after the last keyframe counts too.
  for (std::int64_t n = frameCount() - 1; n >= 0; --n)
    if (frame(n).keyframe) {
      longest = std::max(longest, frameCount() - n);
      break;
    }
  return longest;
}

std::vector<std::int64_t> FrameIndex::damagedFrames() const {
  std::vector<std::int64_t> out;
  for (const auto& p : packets_)
    if (p.damaged && p.frame >= 0) out.push_back(p.frame);
  std::sort(out.begin(), out.end());
  return out;
}

FrameIndex FrameIndex::buildOrLoad(const std::string& path, const std::string& sidecarPath,
                                   const std::function<bool(double)>& progress) {
  if (!std::filesystem::exists(path))
    throw Error(ErrorCategory::io, path + ": file not found. Check the path and try again.");
  std::string problem;
  if (auto cached = loadSidecar(sidecarPath, computeSignature(path), &problem))
    return std::move(*cached);
  FrameIndex index = build(path, progress);
  if (!problem.empty())
    index.sidecarProblem_ =
        sidecarPath + ": the index cache " + problem + "; ignored it and rebuilt the index.";
  try {
    index.saveSidecar(sidecarPath);
    index.sidecarWritten_ = true;
  } catch (const Error&) {
    index.sidecarWritten_ = false;  // read-only folder: work without a cache
  }
  return index;
}

FrameIndex FrameIndex::openCached(const std::string& path) {
  const std::string sidecar = defaultSidecarPath(path);
  return sidecar.empty() ? build(path) : buildOrLoad(path, sidecar);
}

std::string defaultSidecarPath(const std::string& videoPath) {
  namespace fs = std::filesystem;
  fs::path folder;
  const char* chosen = std::getenv("STRIDEMARK_INDEX_CACHE");
  const char* xdg = std::getenv("XDG_CACHE_HOME");
  const char* home = std::getenv("HOME");
  if (chosen && *chosen) {
    if (std::string(chosen) == "off") return {};
    folder = chosen;
  } else if (xdg && *xdg) {
    folder = fs::path(xdg) / "stridemark" / "index";
  } else if (home && *home) {
    folder = fs::path(home) / ".cache" / "stridemark" / "index";
  } else {
    return {};
  }
  std::error_code ec;
  fs::create_directories(folder, ec);
  if (ec) return {};
  const std::string absolute = fs::absolute(videoPath, ec).lexically_normal().string();
  char name[32];
  std::snprintf(name, sizeof name, "%016llx.smindex",
                static_cast<unsigned long long>(fnv1a64(absolute)));
  return (folder / name).string();
}

}  // namespace stridemark::video
