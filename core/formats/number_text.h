#pragma once
// Shortest round-trip text of doubles (std::to_chars), remembered per value. Every stride-level
// number is computed from frame counts (DESIGN §6: phases, duty factors, durations are ratios of
// small integers), so a report of 10^5 strides repeats a few thousand distinct values; a small
// direct-mapped table of their texts turns most conversions into one 24-byte copy.
#include <cstddef>
#include <cstdint>

#include "common/memo_by_bits.h"

namespace stridemark::formats::text {

class NumberText {
 public:
  // Bytes a write may touch past `out` (the longest double text is 24 characters).
  static constexpr std::size_t kRoom = 24;

  // Writes the same text as appendDouble (`-0` as `0`) at `out` and returns its end. `out` must
  // have kRoom bytes of room. Non-finite values are the caller's business (JSON writes null).
  char* write(char* out, double value);

 private:
  struct Text {
    std::uint32_t length;
    char text[kRoom];
  };
  MemoByBits<Text, 12> texts_;  // 4096 slots, 160 KiB: stays in a core's L2 cache
};

}  // namespace stridemark::formats::text
