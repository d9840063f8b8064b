#pragma once
// Reading JSON documents with messages a user can act on: every error names the file and the
// JSON path (RFC 6901 pointer, e.g. /events/12/frame) of the value that is wrong.
#include <cstdint>
#include <optional>
#include <string>
#include <string_view>
#include <utility>
#include <vector>

#include <nlohmann/json.hpp>

namespace stridemark::formats {

// Deepest nesting of arrays and objects a file may have; our files nest a few levels.
inline constexpr std::size_t kMaxJsonDepth = 256;

// Parses text as JSON; a syntax error, or nesting deeper than kMaxJsonDepth (refused before a
// document is built), becomes Error(format) "FILE:LINE:COLUMN: ...".
nlohmann::json parseJsonText(std::string_view text, std::string_view fileName);

class JsonIn {
 public:
  JsonIn(const nlohmann::json& value, std::string_view fileName, std::string path = "");

  JsonIn at(std::string_view key) const;                        // required member of an object
  std::optional<JsonIn> find(std::string_view key) const;       // absent or null -> nullopt
  JsonIn at(std::size_t index) const;                           // element of an array
  std::size_t arraySize() const;                                // fails unless an array
  std::vector<std::pair<std::string, JsonIn>> members() const;  // fails unless an object

  bool isNull() const { return value_->is_null(); }
  std::string text() const;
  double number() const;
  std::optional<double> numberOrNull() const;
  std::int64_t integer() const;
  bool boolean() const;

  const std::string& path() const { return path_; }
  const nlohmann::json& raw() const { return *value_; }
  [[noreturn]] void fail(std::string_view what) const;

 private:
  const nlohmann::json* value_;
  std::string_view file_;
  std::string path_;
};

}  // namespace stridemark::formats
