#pragma once
// A small streaming JSON writer. Building a whole nlohmann tree for a report with 10^5 strides
// costs hundreds of MB, so reports are written straight to their sink in 1 MiB chunks.
// Non-finite numbers are written as null: JSON has no NaN.
#include <cstdint>
#include <functional>
#include <memory>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "formats/number_text.h"

namespace stridemark::formats {

class JsonOut {
 public:
  using Sink = std::function<void(std::string_view)>;
  // Elements nested up to `breakDepth` start on their own indented line; deeper ones stay inline.
  explicit JsonOut(Sink sink, int breakDepth = 2);

  void beginObject();
  void endObject();
  void beginArray();
  void endArray();
  void key(std::string_view name);

  void integer(long long value);
  void number(double value);  // null when not finite
  void number(const std::optional<double>& value);
  void boolean(bool value);
  void string(std::string_view value);
  void stringOrNull(const std::optional<std::string>& value);
  void null();

  // For hot loops that format a whole compact value themselves (one array element, or the value
  // after key()): beginRaw returns room for `maxBytes` of JSON text, endRaw takes its end.
  char* beginRaw(std::size_t maxBytes);
  void endRaw(char* end);
  // The writer's memoised number texts, for use inside beginRaw/endRaw.
  text::NumberText& numbers() { return numbers_; }

  // For elements the caller formatted earlier, separators included: beginRawText once, then
  // rawText for each piece of the text, which goes to the sink as it is (no copy when large).
  void beginRawText();
  void rawText(std::string_view text);

  void finish();  // newline and final flush; call once at the end

 private:
  void beforeValue();
  void newline(std::size_t depth);
  void flushIfLarge();
  char* room(std::size_t bytes);  // flushes or grows so that `bytes` more fit
  void put(std::string_view text);
  void put(char c);
  struct Level {
    bool object = false;
    bool empty = true;
  };
  Sink sink_;
  int breakDepth_;
  std::unique_ptr<char[]> buffer_;
  std::size_t size_ = 0;
  std::size_t capacity_ = 0;
  std::vector<Level> stack_;
  bool afterKey_ = false;
  text::NumberText numbers_;
};

// Appends `value` as a quoted JSON string.
void appendJsonString(std::string& out, std::string_view value);

// Writes `value` as a quoted JSON string at `out` (room: jsonStringRoom) and returns its end.
char* writeJsonString(char* out, std::string_view value);
constexpr std::size_t jsonStringRoom(std::string_view value) {
  return 6 * value.size() + 2;
}

}  // namespace stridemark::formats
