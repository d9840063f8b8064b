#include "formats/json_out.h"

#include <algorithm>
#include <cmath>

#include "formats/text_scan.h"

namespace stridemark::formats {

void appendJsonString(std::string& out, std::string_view value) {
  static constexpr char kHex[] = "0123456789abcdef";
  out += '"';
  const bool plain = std::none_of(value.begin(), value.end(), [](char c) {
    return c == '"' || c == '\\' || static_cast<unsigned char>(c) < 0x20;
  });
  if (plain) {  // the usual case: keys, labels, gait names
    out.append(value);
    out += '"';
    return;
  }
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

JsonOut::JsonOut(Sink sink, int breakDepth) : sink_(std::move(sink)), breakDepth_(breakDepth) {
  buffer_.reserve(1 << 20);
}

void JsonOut::newline(std::size_t depth) {
  buffer_ += '\n';
  buffer_.append(2 * depth, ' ');
}

void JsonOut::flushIfLarge() {
  if (buffer_.size() >= (1u << 20)) {
    sink_(buffer_);
    buffer_.clear();
  }
}

void JsonOut::beforeValue() {
  if (afterKey_) {
    afterKey_ = false;
    return;
  }
  if (stack_.empty()) return;
  Level& level = stack_.back();
  if (!level.empty) buffer_ += ',';
  level.empty = false;
  if (static_cast<int>(stack_.size()) <= breakDepth_) newline(stack_.size());
}

void JsonOut::key(std::string_view name) {
  Level& level = stack_.back();
  if (!level.empty) buffer_ += ',';
  level.empty = false;
  if (static_cast<int>(stack_.size()) <= breakDepth_) newline(stack_.size());
  appendJsonString(buffer_, name);
  buffer_ += ':';
  afterKey_ = true;
}

void JsonOut::beginObject() {
  beforeValue();
  buffer_ += '{';
  stack_.push_back({true, true});
}

void JsonOut::beginArray() {
  beforeValue();
  buffer_ += '[';
  stack_.push_back({false, true});
}

void JsonOut::endObject() {
  const bool hadElements = !stack_.back().empty;
  stack_.pop_back();
  if (hadElements && static_cast<int>(stack_.size()) < breakDepth_) newline(stack_.size());
  buffer_ += '}';
  flushIfLarge();
}

void JsonOut::endArray() {
  const bool hadElements = !stack_.back().empty;
  stack_.pop_back();
  if (hadElements && static_cast<int>(stack_.size()) < breakDepth_) newline(stack_.size());
  buffer_ += ']';
  flushIfLarge();
}

void JsonOut::integer(long long value) {
  beforeValue();
  text::appendInt(buffer_, value);
}

void JsonOut::number(double value) {
  beforeValue();
  if (std::isfinite(value)) {
    text::appendDouble(buffer_, value);
  } else {
    buffer_ += "null";
  }
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
  buffer_ += value ? "true" : "false";
}

void JsonOut::string(std::string_view value) {
  beforeValue();
  appendJsonString(buffer_, value);
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
  buffer_ += "null";
}

void JsonOut::finish() {
  buffer_ += '\n';
  sink_(buffer_);
  buffer_.clear();
}

}  // namespace stridemark::formats
