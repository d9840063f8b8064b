#include "formats/json_out.h"

#include <algorithm>
#include <charconv>
#include <cmath>
#include <cstring>

namespace stridemark::formats {
namespace {

constexpr std::size_t kFlushBytes = std::size_t{1} << 20;

bool isPlain(std::string_view value) {
  return std::none_of(value.begin(), value.end(), [](char c) {
    return c == '"' || c == '\\' || static_cast<unsigned char>(c) < 0x20;
  });
}

char* copy(char* out, std::string_view text) {
  std::memcpy(out, text.data(), text.size());
  return out + text.size();
}

}  // namespace

char* writeJsonString(char* out, std::string_view value) {
  static constexpr char kHex[] = "0123456789abcdef";
  *out++ = '"';
  if (isPlain(value)) {  // the usual case: keys, labels, gait names
    out = copy(out, value);
    *out++ = '"';
    return out;
  }
  for (const char c : value) {
    const auto byte = static_cast<unsigned char>(c);
    switch (c) {
      case '"':
        out = copy(out, "\\\"");
        break;
      case '\\':
        out = copy(out, "\\\\");
        break;
      case '\n':
        out = copy(out, "\\n");
        break;
      case '\r':
        out = copy(out, "\\r");
        break;
      case '\t':
        out = copy(out, "\\t");
        break;
      default:
        if (byte < 0x20) {
          out = copy(out, "\\u00");
          *out++ = kHex[byte >> 4];
          *out++ = kHex[byte & 0xF];
        } else {
          *out++ = c;
        }
    }
  }
  *out++ = '"';
  return out;
}

void appendJsonString(std::string& out, std::string_view value) {
  const std::size_t start = out.size();
  out.resize(start + jsonStringRoom(value));
  char* end = writeJsonString(out.data() + start, value);
  out.resize(static_cast<std::size_t>(end - out.data()));
}

JsonOut::JsonOut(Sink sink, int breakDepth)
    : sink_(std::move(sink)),
      breakDepth_(breakDepth),
      buffer_(std::make_unique_for_overwrite<char[]>(2 * kFlushBytes)),
      capacity_(2 * kFlushBytes) {}

char* JsonOut::room(std::size_t bytes) {
  if (size_ + bytes > capacity_) {
    sink_(std::string_view(buffer_.get(), size_));
    size_ = 0;
    if (bytes > capacity_) {  // one huge string value: a buffer that holds it
      buffer_ = std::make_unique_for_overwrite<char[]>(bytes);
      capacity_ = bytes;
    }
  }
  return buffer_.get() + size_;
}

void JsonOut::put(std::string_view text) {
  std::memcpy(room(text.size()), text.data(), text.size());
  size_ += text.size();
}

void JsonOut::put(char c) {
  *room(1) = c;
  ++size_;
}

void JsonOut::newline(std::size_t depth) {
  char* out = room(1 + 2 * depth);
  *out = '\n';
  std::memset(out + 1, ' ', 2 * depth);
  size_ += 1 + 2 * depth;
}

void JsonOut::flushIfLarge() {
  if (size_ >= kFlushBytes) {
    sink_(std::string_view(buffer_.get(), size_));
    size_ = 0;
  }
}

void JsonOut::beforeValue() {
  if (afterKey_) {
    afterKey_ = false;
    return;
  }
  if (stack_.empty()) return;
  Level& level = stack_.back();
  if (!level.empty) put(',');
  level.empty = false;
  if (static_cast<int>(stack_.size()) <= breakDepth_) newline(stack_.size());
}

void JsonOut::key(std::string_view name) {
  Level& level = stack_.back();
  if (!level.empty) put(',');
  level.empty = false;
  if (static_cast<int>(stack_.size()) <= breakDepth_) newline(stack_.size());
  char* out = room(jsonStringRoom(name) + 1);
  out = writeJsonString(out, name);
  *out++ = ':';
  size_ = static_cast<std::size_t>(out - buffer_.get());
  afterKey_ = true;
}

void JsonOut::beginObject() {
  beforeValue();
  put('{');
  stack_.push_back({true, true});
}

void JsonOut::beginArray() {
  beforeValue();
  put('[');
  stack_.push_back({false, true});
}

void JsonOut::endObject() {
  const bool hadElements = !stack_.back().empty;
  stack_.pop_back();
  if (hadElements && static_cast<int>(stack_.size()) < breakDepth_) newline(stack_.size());
  put('}');
  flushIfLarge();
}

void JsonOut::endArray() {
  const bool hadElements = !stack_.back().empty;
  stack_.pop_back();
  if (hadElements && static_cast<int>(stack_.size()) < breakDepth_) newline(stack_.size());
  put(']');
  flushIfLarge();
}

void JsonOut::integer(long long value) {
  beforeValue();
  char* out = room(24);
  size_ = static_cast<std::size_t>(std::to_chars(out, out + 24, value).ptr - buffer_.get());
}

void JsonOut::number(double value) {
  if (!std::isfinite(value)) {
    null();
    return;
  }
  beforeValue();
  char* out = room(text::NumberText::kRoom);
  size_ = static_cast<std::size_t>(numbers_.write(out, value) - buffer_.get());
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
  put(value ? std::string_view("true") : std::string_view("false"));
}

void JsonOut::string(std::string_view value) {
  beforeValue();
  char* out = room(jsonStringRoom(value));
  size_ = static_cast<std::size_t>(writeJsonString(out, value) - buffer_.get());
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
  put("null");
}

char* JsonOut::beginRaw(std::size_t maxBytes) {
  beforeValue();
  return room(maxBytes);
}

void JsonOut::endRaw(char* end) {
  size_ = static_cast<std::size_t>(end - buffer_.get());
  flushIfLarge();
}

void JsonOut::beginRawText() {
  beforeValue();
}

void JsonOut::rawText(std::string_view text) {
  if (size_ + text.size() <= capacity_) {
    put(text);
    flushIfLarge();
    return;
  }
  sink_(std::string_view(buffer_.get(), size_));
  size_ = 0;
  sink_(text);
}

void JsonOut::finish() {
  put('\n');
  sink_(std::string_view(buffer_.get(), size_));
  size_ = 0;
}

}  // namespace stridemark::formats
