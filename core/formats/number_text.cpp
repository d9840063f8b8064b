#include "formats/number_text.h"

#include <charconv>
#include <cmath>
#include <cstring>

namespace stridemark::formats::text {

char* NumberText::write(char* out, double value) {
  if (value == 0) value = 0;  // "-0" reads back as integer 0 in most JSON and CSV readers
  if (!std::isfinite(value)) return std::to_chars(out, out + kRoom, value).ptr;
  const Text& text = texts_.get(value, [](double v) {
    Text made{};
    made.length =
        static_cast<std::uint32_t>(std::to_chars(made.text, made.text + kRoom, v).ptr - made.text);
    return made;
  });
  std::memcpy(out, text.text, kRoom);  // fixed size: two vector moves instead of a loop
  return out + text.length;
}

}  // namespace stridemark::formats::text
