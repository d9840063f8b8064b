#include "formats/text_scan.h"

#include <algorithm>
#include <charconv>
#include <cstdint>
#include <cstring>

namespace stridemark::formats::text {
namespace {

bool isBlank(char c) {
  return c == ' ' || c == '\t' || c == '\r' || c == '\f' || c == '\v';
}

// True when eight bytes are all ASCII and none is zero (the usual SWAR test).
bool plainAscii8(const char* p) {
  std::uint64_t v = 0;
  std::memcpy(&v, p, sizeof v);
  constexpr std::uint64_t kHigh = 0x8080808080808080ULL;
  constexpr std::uint64_t kOnes = 0x0101010101010101ULL;
  const bool hasZero = ((v - kOnes) & ~v & kHigh) != 0;
  return (v & kHigh) == 0 && !hasZero;
}

// Length of the valid UTF-8 sequence starting at p[0] (a byte >= 0x80), or 0 if invalid.
std::size_t utf8SequenceLength(const unsigned char* p, std::size_t available) {
  const unsigned char c = p[0];
  std::size_t length = 0;
  std::uint32_t smallest = 0;
  if ((c & 0xE0) == 0xC0) {
    length = 2;
    smallest = 0x80;
  } else if ((c & 0xF0) == 0xE0) {
    length = 3;
    smallest = 0x800;
  } else if ((c & 0xF8) == 0xF0) {
    length = 4;
    smallest = 0x10000;
  } else {
    return 0;
  }
  if (length > available) return 0;
  std::uint32_t code = c & (0x7Fu >> length);
  for (std::size_t k = 1; k < length; ++k) {
    if ((p[k] & 0xC0) != 0x80) return 0;
    code = (code << 6) | (p[k] & 0x3Fu);
  }
  const bool surrogate = code >= 0xD800 && code <= 0xDFFF;
  if (code < smallest || code > 0x10FFFF || surrogate) return 0;
  return length;
}

}  // namespace

std::string_view trim(std::string_view s) {
  while (!s.empty() && isBlank(s.front())) s.remove_prefix(1);
  while (!s.empty() && isBlank(s.back())) s.remove_suffix(1);
  return s;
}

std::size_t firstNonTextByte(std::string_view s) {
  const auto* bytes = reinterpret_cast<const unsigned char*>(s.data());
  std::size_t i = 0;
  while (i < s.size()) {
    if (i + 8 <= s.size() && plainAscii8(s.data() + i)) {
      i += 8;
      continue;
    }
    const unsigned char c = bytes[i];
    if (c == 0) return i;
    if (c < 0x80) {
      ++i;
      continue;
    }
    const std::size_t length = utf8SequenceLength(bytes + i, s.size() - i);
    if (length == 0) return i;
    i += length;
  }
  return std::string_view::npos;
}

long lineOfOffset(std::string_view s, std::size_t offset) {
  offset = std::min(offset, s.size());
  return 1 + static_cast<long>(std::count(s.begin(), s.begin() + static_cast<long>(offset), '\n'));
}

void appendDouble(std::string& out, double value) {
  if (value == 0) value = 0;  // "-0" reads back as integer 0 in most JSON and CSV readers
  char buffer[32];
  const auto result = std::to_chars(buffer, buffer + sizeof buffer, value);
  out.append(buffer, result.ptr);
}

std::string formatDouble(double value) {
  std::string out;
  appendDouble(out, value);
  return out;
}

void appendInt(std::string& out, long long value) {
  char buffer[24];
  const auto result = std::to_chars(buffer, buffer + sizeof buffer, value);
  out.append(buffer, result.ptr);
}

}  // namespace stridemark::formats::text
