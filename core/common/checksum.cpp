#include "common/checksum.h"

#include <cstdio>

namespace stridemark {

std::uint64_t fnv1a64(std::string_view bytes) {
  std::uint64_t hash = 14695981039346656037ULL;  // offset basis
  for (const char c : bytes) {
    hash ^= static_cast<unsigned char>(c);
    hash *= 1099511628211ULL;  // prime
  }
  return hash;
}

std::string fnv1a64Hex(std::string_view bytes) {
  char text[17];
  std::snprintf(text, sizeof text, "%016llx", static_cast<unsigned long long>(fnv1a64(bytes)));
  return text;
}

}  // namespace stridemark
