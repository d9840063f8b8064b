#pragma once
// A small JSON writer that lays out the report the way people read it: elements nested up to
// `breakDepth` start on their own indented line, deeper ones stay inline. Non-finite numbers
// are written as null: JSON has no NaN. Numbers use the shortest text that reads back exactly.
#include <optional>
#include <string>
#include <string_view>
#include <vector>

namespace stridemark::formats {

class JsonOut {
 public:
  explicit JsonOut(int breakDepth = 2) : breakDepth_(breakDepth) {}

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

  // The text so far, with the final newline; call once at the end.
  std::string finish();

 private:
  void beforeValue();
  void newline(std::size_t depth);
  struct Level {
    bool object = false;
    bool empty = true;
  };
  int breakDepth_;
  std::string text_;
  std::vector<Level> stack_;
  bool afterKey_ = false;
};

// Appends `value` as a quoted JSON string.
void appendJsonString(std::string& out, std::string_view value);

}  // namespace stridemark::formats
