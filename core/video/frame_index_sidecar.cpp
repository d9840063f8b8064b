// The index sidecar, version 2: plain text, so a damaged one can be read by eye.
//
//   SMKFIDX 2 fnv1a64=<16 hex digits> bytes=<payload length>
//   signature <signatureText of the video>
//   stream <stream index> <time base num> <time base den> <synthesised 0|1> <missing> <packets>
//   <pts> <dts> <pos> <size> <flags>        one line per packet, decode order
//
// The checksum covers every byte after the header line. A sidecar is trusted only when the
// checksum, the video's signature and every line check out; anything else means a rebuild.
#include <charconv>
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <iterator>

#include "common/checksum.h"
#include "common/error.h"
#include "video/frame_index.h"

namespace stridemark::video {

namespace {

constexpr std::string_view kMagic = "SMKFIDX";
// "0 0 0 0 0\n": no packet line is shorter (found by fuzz_frame_index: a count that only
// had to fit the video's size made the reader reserve terabytes).
constexpr std::size_t kShortestPacketLine = 10;

// Splits one line into tokens separated by single spaces; false on a doubled or edge space.
bool splitTokens(std::string_view line, std::vector<std::string_view>& tokens) {
  tokens.clear();
  std::size_t start = 0;
  for (;;) {
    const std::size_t space = line.find(' ', start);
    const std::string_view token = line.substr(start, space - start);
    if (token.empty()) return false;
    tokens.push_back(token);
    if (space == std::string_view::npos) return true;
    start = space + 1;
  }
}

template <typename T>
bool parseNumber(std::string_view text, T& value, int base = 10) {
  const char* end = text.data() + text.size();
  const auto [ptr, ec] = std::from_chars(text.data(), end, value, base);
  return ec == std::errc() && ptr == end;
}

// Hands out the payload's lines one by one (each must end in a newline).
class LineReader {
 public:
  explicit LineReader(std::string_view text) : text_(text) {}
  bool next(std::string_view& line) {
    const std::size_t end = text_.find('\n', at_);
    if (end == std::string_view::npos) return false;
    line = text_.substr(at_, end - at_);
    at_ = end + 1;
    return true;
  }
  bool atEnd() const { return at_ == text_.size(); }

 private:
  std::string_view text_;
  std::size_t at_ = 0;
};

}  // namespace

void FrameIndex::saveSidecar(const std::string& sidecarPath) const {
  std::string payload = "signature " + signatureText(signature_) + "\n";
  payload += "stream " + std::to_string(streamIndex_) + " " + std::to_string(timeBase_.num) + " " +
             std::to_string(timeBase_.den) + " " + (synthesised_ ? "1" : "0") + " " +
             std::to_string(missingPackets_) + " " + std::to_string(packets_.size()) + "\n";
  for (const auto& p : packets_) {
    const int flags = (p.keyframe ? 1 : 0) | (p.damaged ? 2 : 0) | (p.discarded ? 4 : 0);
    payload += std::to_string(p.pts) + " " + std::to_string(p.dts) + " " + std::to_string(p.pos) +
               " " + std::to_string(p.size) + " " + std::to_string(flags) + "\n";
  }
  const std::string header = std::string(kMagic) + " " + std::to_string(kSidecarVersion) +
                             " fnv1a64=" + fnv1a64Hex(payload) +
                             " bytes=" + std::to_string(payload.size()) + "\n";
  const std::string temp = sidecarPath + ".part";
  {
    std::ofstream out(temp, std::ios::binary | std::ios::trunc);
    if (!out) throw Error(ErrorCategory::io, sidecarPath + ": cannot write the index cache.");
    out << header << payload;
    out.close();
    if (!out) {
      std::error_code ignored;
      std::filesystem::remove(temp, ignored);
      throw Error(ErrorCategory::io, sidecarPath + ": writing the index cache failed.");
    }
  }
  std::error_code ec;
  std::filesystem::rename(temp, sidecarPath, ec);
  if (ec) throw Error(ErrorCategory::io, sidecarPath + ": cannot replace the index cache.");
}

std::optional<FrameIndex> FrameIndex::loadSidecar(const std::string& sidecarPath,
                                                  const VideoSignature& expected,
                                                  std::string* problem) {
  std::string ignored;
  std::string& why = problem ? *problem : ignored;
  why.clear();
  std::error_code ec;
  if (!std::filesystem::exists(sidecarPath, ec)) return std::nullopt;  // no cache yet
  std::ifstream in(sidecarPath, std::ios::binary);
  if (!in) {
    why = "cannot be read";
    return std::nullopt;
  }
  const std::string text((std::istreambuf_iterator<char>(in)), {});
  const auto fail = [&why](const std::string& reason) {
    why = reason;
    return std::nullopt;
  };

  // Header: magic, version, checksum and length of the payload.
  const std::size_t headerEnd = text.find('\n');
  std::vector<std::string_view> tokens;
  if (headerEnd == std::string::npos ||
      !splitTokens(std::string_view(text).substr(0, headerEnd), tokens) || tokens[0] != kMagic)
    return fail("is not a Stridemark index cache (bad first line)");
  std::uint32_t version = 0;
  if (tokens.size() < 2 || !parseNumber(tokens[1], version) || version != kSidecarVersion)
    return fail("has another format version than " + std::to_string(kSidecarVersion));
  std::uint64_t checksum = 0;
  std::uint64_t length = 0;
  if (tokens.size() != 4 || tokens[2].substr(0, 8) != "fnv1a64=" || tokens[2].size() != 8 + 16 ||
      !parseNumber(tokens[2].substr(8), checksum, 16) || tokens[3].substr(0, 6) != "bytes=" ||
      !parseNumber(tokens[3].substr(6), length))
    return fail("is damaged (bad first line)");
  const std::string_view payload = std::string_view(text).substr(headerEnd + 1);
  if (payload.size() != length) return fail("is damaged (cut short or extended)");
  if (fnv1a64(payload) != checksum) return fail("is damaged (checksum mismatch)");

  // The video it describes: the signature the rest of the program names clips by.
  LineReader lines(payload);
  std::string_view line;
  if (!lines.next(line) || line != "signature " + signatureText(expected))
    return fail("belongs to another video (or the video changed since it was written)");

  FrameIndex index;
  index.signature_ = expected;
  int synthesised = 0;
  std::uint64_t count = 0;
  if (!lines.next(line) || !splitTokens(line, tokens) || tokens.size() != 7 ||
      tokens[0] != "stream" || !parseNumber(tokens[1], index.streamIndex_) ||
      !parseNumber(tokens[2], index.timeBase_.num) ||
      !parseNumber(tokens[3], index.timeBase_.den) || !parseNumber(tokens[4], synthesised) ||
      !parseNumber(tokens[5], index.missingPackets_) || !parseNumber(tokens[6], count) ||
      index.streamIndex_ < 0 || index.timeBase_.num <= 0 || index.timeBase_.den <= 0 ||
      synthesised < 0 || synthesised > 1 || index.missingPackets_ < 0 ||
      count > expected.fileSize ||  // every packet takes at least one byte of the file
      count > payload.size() / kShortestPacketLine)  // nor may a count size the table alone
    return fail("is damaged (bad stream line)");
  index.packets_.reserve(static_cast<std::size_t>(count));
  for (std::uint64_t i = 0; i < count; ++i) {
    PacketEntry p;
    int flags = 0;
    if (!lines.next(line) || !splitTokens(line, tokens) || tokens.size() != 5 ||
        !parseNumber(tokens[0], p.pts) || !parseNumber(tokens[1], p.dts) ||
        !parseNumber(tokens[2], p.pos) || !parseNumber(tokens[3], p.size) ||
        !parseNumber(tokens[4], flags) || p.size < 0 || flags < 0 || flags > 7)
      return fail("is damaged (bad packet line " + std::to_string(i + 1) + ")");
    p.keyframe = flags & 1;
    p.damaged = flags & 2;
    p.discarded = flags & 4;
    index.packets_.push_back(p);
  }
  if (!lines.atEnd()) return fail("is damaged (extra lines)");
  index.finish();
  index.synthesised_ = synthesised != 0;
  if (index.frameCount() == 0) return fail("is damaged (no frames)");
  index.loadedFromSidecar_ = true;
  return index;
}

}  // namespace stridemark::video
