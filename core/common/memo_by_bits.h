#pragma once
// A small direct-mapped table of values remembered per double (by its bits). Values computed
// from frame counts repeat heavily (a 10^6-event trial has a few thousand distinct phases and
// ratios), so remembering what a costly function gave turns most calls into one lookup; a key
// that lands in a taken slot replaces it. The remembered value is the function's own result, so
// callers get the same bits as computing it.
#include <bit>
#include <cstddef>
#include <cstdint>
#include <vector>

namespace stridemark {

template <typename Value, int kSlotBits>
class MemoByBits {
 public:
  MemoByBits() : slots_(std::size_t{1} << kSlotBits, Slot{kNoKey, Value{}}) {}

  // The value for finite `key`: remembered, or `make(key)` remembered now.
  template <typename Make>
  const Value& get(double key, Make make) {
    const auto bits = std::bit_cast<std::uint64_t>(key);
    Slot& slot = slots_[static_cast<std::size_t>((bits * 0x9E3779B97F4A7C15ULL) >>
                                                 (64 - kSlotBits))];  // Fibonacci hashing
    if (slot.bits != bits) slot = {bits, make(key)};
    return slot.value;
  }

 private:
  // A NaN payload no finite key has: marks an empty slot.
  static constexpr std::uint64_t kNoKey = 0x7FF8DEADBEEF0001ULL;
  struct Slot {
    std::uint64_t bits;
    Value value;
  };
  std::vector<Slot> slots_;
};

}  // namespace stridemark
