#pragma once
// A small streaming JSON writer. Building a whole nlohmann tree for a report with 10^5 strides
// costs hundreds of MB, so reports are written straight to their sink in 1 MiB chunks.
// Non-finite numbers are written as null: JSON has no NaN.
#include <cstdint>
#include <functional>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

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

  void finish();  // newline and final flush; call once at the end

 private:
  void beforeValue();
  void newline(std::size_t depth);
  void flushIfLarge();
  struct Level {
    bool object = false;
    bool empty = true;
  };
  Sink sink_;
  int breakDepth_;
  std::string buffer_;
  std::vector<Level> stack_;
  bool afterKey_ = false;
};

// Appends `value` as a quoted JSON string.
void appendJsonString(std::string& out, std::string_view value);

}  // namespace stridemark::formats
