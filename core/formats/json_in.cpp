#include "formats/json_in.h"

#include <cmath>

#include "common/error.h"

namespace stridemark::formats {
namespace {

std::string pointerToken(std::string_view key) {
  std::string out;
  for (const char c : key) {
    if (c == '~') {
      out += "~0";
    } else if (c == '/') {
      out += "~1";
    } else {
      out += c;
    }
  }
  return out;
}

std::string describe(const nlohmann::json& value) {
  std::string text = value.dump();
  constexpr std::size_t kLongest = 40;
  if (text.size() > kLongest) text = text.substr(0, kLongest) + "...";
  return text;
}

}  // namespace

nlohmann::json parseJsonText(std::string_view text, std::string_view fileName) {
  try {
    return nlohmann::json::parse(text.begin(), text.end());
  } catch (const nlohmann::json::parse_error& e) {
    // e.byte is 1-based; find its line and column for the message.
    const std::size_t offset = e.byte == 0 ? 0 : std::min(e.byte - 1, text.size());
    long line = 1;
    std::size_t lineStart = 0;
    for (std::size_t i = 0; i < offset; ++i) {
      if (text[i] == '\n') {
        ++line;
        lineStart = i + 1;
      }
    }
    const std::string where = std::string(fileName) + ":" + std::to_string(line) + ":" +
                              std::to_string(offset - lineStart + 1);
    std::string reason = e.what();
    if (const auto pos = reason.find(": "); pos != std::string::npos)
      reason = reason.substr(pos + 2);
    throw Error(ErrorCategory::format, where + ": not valid JSON (" + reason +
                                           ") — repair the file or restore a backup copy");
  } catch (const nlohmann::json::exception& e) {
    // e.g. a number too large for a double: the parser names the number, not its place.
    std::string reason = e.what();
    if (const auto pos = reason.find("] "); pos != std::string::npos)
      reason = reason.substr(pos + 2);
    throw Error(ErrorCategory::format, std::string(fileName) + ": not valid JSON (" + reason +
                                           ") — repair the file or restore a backup copy");
  }
}

JsonIn::JsonIn(const nlohmann::json& value, std::string_view fileName, std::string path)
    : value_(&value), file_(fileName), path_(std::move(path)) {}

void JsonIn::fail(std::string_view what) const {
  throw Error(ErrorCategory::format, std::string(file_) + ": at " +
                                         (path_.empty() ? std::string("/") : path_) + ": " +
                                         std::string(what));
}

JsonIn JsonIn::at(std::string_view key) const {
  if (!value_->is_object()) fail("expected an object, found " + describe(*value_));
  const auto it = value_->find(key);
  if (it == value_->end()) {
    JsonIn(*value_, file_, path_ + "/" + pointerToken(key))
        .fail("missing — add this key (see CHANGELOG.md for the layout)");
  }
  return JsonIn(*it, file_, path_ + "/" + pointerToken(key));
}

std::optional<JsonIn> JsonIn::find(std::string_view key) const {
  if (!value_->is_object()) fail("expected an object, found " + describe(*value_));
  const auto it = value_->find(key);
  if (it == value_->end() || it->is_null()) return std::nullopt;
  return JsonIn(*it, file_, path_ + "/" + pointerToken(key));
}

JsonIn JsonIn::at(std::size_t index) const {
  return JsonIn(value_->at(index), file_, path_ + "/" + std::to_string(index));
}

std::size_t JsonIn::arraySize() const {
  if (!value_->is_array()) fail("expected an array, found " + describe(*value_));
  return value_->size();
}

std::vector<std::pair<std::string, JsonIn>> JsonIn::members() const {
  if (!value_->is_object()) fail("expected an object, found " + describe(*value_));
  std::vector<std::pair<std::string, JsonIn>> out;
  for (auto it = value_->begin(); it != value_->end(); ++it) {
    out.emplace_back(it.key(), JsonIn(it.value(), file_, path_ + "/" + pointerToken(it.key())));
  }
  return out;
}

std::string JsonIn::text() const {
  if (!value_->is_string()) fail("expected text in quotes, found " + describe(*value_));
  return value_->get<std::string>();
}

double JsonIn::number() const {
  if (!value_->is_number()) fail("expected a number, found " + describe(*value_));
  const double v = value_->get<double>();
  if (!std::isfinite(v)) fail("expected a finite number");
  return v;
}

std::optional<double> JsonIn::numberOrNull() const {
  if (value_->is_null()) return std::nullopt;
  return number();
}

std::int64_t JsonIn::integer() const {
  if (value_->is_number_integer()) return value_->get<std::int64_t>();
  if (value_->is_number_float()) {
    const double v = value_->get<double>();
    if (std::isfinite(v) && v == std::floor(v) && std::fabs(v) < 9e15) {
      return static_cast<std::int64_t>(v);
    }
  }
  fail("expected a whole number, found " + describe(*value_));
}

bool JsonIn::boolean() const {
  if (!value_->is_boolean()) fail("expected true or false, found " + describe(*value_));
  return value_->get<bool>();
}

}  // namespace stridemark::formats
