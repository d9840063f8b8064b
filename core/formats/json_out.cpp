#include "formats/json_out.h"

#include <cmath>

#include "formats/text_scan.h"

namespace stridemark::formats {

void appendJsonString(std::string& out, std::string_view value) {
  static constexpr char kHex[] = "0123456789abcdef";
  out += '"';
  for (const char c : value) {
    const auto byte = static_cast<unsigned char>(c);
    switch (c) {
      case '"':
        out += "\\\"";
        break;
      case '\\':
        out += "\\\\";
        break;
      case '\n':
        out += "\\n";
        break;
      case '\r':
        out += "\\r";
        break;
      case '\t':
        out += "\\t";
        break;
      default:
        if (byte < 0x20) {
          out += "\\u00";
          out += kHex[byte >> 4];
          out += kHex[byte & 0xF];
        } else {
          out += c;
        }
    }
  }
  out += '"';
}

void JsonOut::newline(std::size_t depth) {
  text_ += '\n';
  text_.append(2 * depth, ' ');
}

void JsonOut::beforeValue() {
  if (afterKey_) {
    afterKey_ = false;
    return;
  }
  if (stack_.empty()) return;
  Level& level = stack_.back();
  if (!level.empty) text_ += ',';
  level.empty = false;
  if (static_cast<int>(stack_.size()) <= breakDepth_) newline(stack_.size());
}

void JsonOut::key(std::string_view name) {
  Level& level = stack_.back();
  if (!level.empty) text_ += ',';
  level.empty = false;
  if (static_cast<int>(stack_.size()) <= breakDepth_) newline(stack_.size());
  appendJsonString(text_, name);
  text_ += ':';
  afterKey_ = true;
}

void JsonOut::beginObject() {
  beforeValue();
  text_ += '{';
  stack_.push_back({true, true});
}

void JsonOut::beginArray() {
  beforeValue();
  text_ += '[';
  stack_.push_back({false, true});
}

void JsonOut::endObject() {
  const bool hadElements = !stack_.back().empty;
  stack_.pop_back();
  if (hadElements && static_cast<int>(stack_.size()) < breakDepth_) newline(stack_.size());
  text_ += '}';
}

void JsonOut::endArray() {
  const bool hadElements = !stack_.back().empty;
  stack_.pop_back();
  if (hadElements && static_cast<int>(stack_.size()) < breakDepth_) newline(stack_.size());
  text_ += ']';
}

void JsonOut::integer(long long value) {
  beforeValue();
  text::appendInt(text_, value);
}

void JsonOut::number(double value) {
  if (!std::isfinite(value)) {
    null();
    return;
  }
  beforeValue();
  text::appendDouble(text_, value);
}

void JsonOut::number(const std::optional<double>& value) {
  if (value) {
    number(*value);
  } else {
    null();
  }
}

void JsonOut::boolean(bool value) {
  beforeValue();
  text_ += value ? "true" : "false";
}

void JsonOut::string(std::string_view value) {
  beforeValue();
  appendJsonString(text_, value);
}

void JsonOut::stringOrNull(const std::optional<std::string>& value) {
  if (value) {
    string(std::string_view(*value));
  } else {
    null();
  }
}

void JsonOut::null() {
  beforeValue();
  text_ += "null";
}

std::string JsonOut::finish() {
  text_ += '\n';
  return std::move(text_);
}

}  // namespace stridemark::formats
