#include "formats/number_text.h"

#include <bit>
#include <charconv>
#include <cmath>
#include <cstring>

namespace stridemark::formats::text {
namespace {

constexpr int kSlotBits = 12;  // 4096 slots, 160 KiB: stays in a core's L2 cache
// A NaN payload that write() never looks up (it converts non-finite values directly).
constexpr std::uint64_t kEmpty = 0x7FF8DEADBEEF0001ULL;

std::size_t slotOf(std::uint64_t bits) {
  return static_cast<std::size_t>((bits * 0x9E3779B97F4A7C15ULL) >> (64 - kSlotBits));
}

}  // namespace

NumberText::NumberText() : slots_(std::size_t{1} << kSlotBits, Slot{kEmpty, 0, {}}) {}

char* NumberText::write(char* out, double value) {
  if (value == 0) value = 0;  // "-0" reads back as integer 0 in most JSON and CSV readers
  if (!std::isfinite(value)) return std::to_chars(out, out + kRoom, value).ptr;
  const auto bits = std::bit_cast<std::uint64_t>(value);
  Slot& slot = slots_[slotOf(bits)];
  if (slot.bits != bits) {
    const auto result = std::to_chars(slot.text, slot.text + kRoom, value);
    slot.length = static_cast<std::uint32_t>(result.ptr - slot.text);
    slot.bits = bits;
  }
  std::memcpy(out, slot.text, kRoom);  // fixed size: two vector moves instead of a loop
  return out + slot.length;
}

}  // namespace stridemark::formats::text
