#include "formats/json_in.h"

#include <algorithm>
#include <cmath>
#include <utility>
#include <vector>

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

constexpr std::size_t kLongestQuote = 40;

// JSON text of a string, cut to kLongestQuote characters before it is escaped.
std::string quotedPrefix(const std::string& text) {
  return nlohmann::json(text.substr(0, kLongestQuote + 1))
      .dump(-1, ' ', false, nlohmann::json::error_handler_t::replace);
}

// At most kLongestQuote characters of the value's JSON text, produced without serialising the
// rest: dump() writes all of a huge value to quote a little of it, and recurses once per level.
std::string describe(const nlohmann::json& value) {
  using Iterator = nlohmann::json::const_iterator;
  std::string out;
  std::vector<std::pair<const nlohmann::json*, Iterator>> open;  // containers being written
  const nlohmann::json* next = &value;
  while (out.size() <= kLongestQuote) {
    if (next != nullptr) {
      if (next->is_structured()) {
        out += next->is_array() ? '[' : '{';
        open.emplace_back(next, next->cbegin());
      } else {
        out += next->is_string() ? quotedPrefix(next->get_ref<const std::string&>())
                                 : next->dump();  // a number, true, false or null: short
      }
      next = nullptr;
      continue;
    }
    if (open.empty()) break;
    auto& [container, it] = open.back();
    if (it == container->cend()) {
      out += container->is_array() ? ']' : '}';
      open.pop_back();
      continue;
    }
    if (it != container->cbegin()) out += ',';
    if (container->is_object()) out += quotedPrefix(it.key()) + ':';
    next = &*it;
    ++it;
  }
  if (out.size() > kLongestQuote) out = out.substr(0, kLongestQuote) + "...";
  return out;
}

// "FILE:LINE:COLUMN" of a byte offset into the text (offset 0 is line 1, column 1).
std::string placeOf(std::string_view text, std::size_t offset, std::string_view fileName) {
  long line = 1;
  std::size_t lineStart = 0;
  for (std::size_t i = 0; i < offset; ++i) {
    if (text[i] == '\n') {
      ++line;
      lineStart = i + 1;
    }
  }
  return std::string(fileName) + ":" + std::to_string(line) + ":" +
         std::to_string(offset - lineStart + 1);
}

// Refuses text whose arrays and objects nest deeper than kMaxJsonDepth, before a document is
// built: our own readers, dump() and copies of a document recurse once per level, so a file
// nested tens of thousands of levels deep would overflow the stack. Brackets inside strings do
// not count; malformed text is left to the parser's message.
void checkNesting(std::string_view text, std::string_view fileName) {
  std::size_t depth = 0;
  bool inString = false;
  for (std::size_t i = 0; i < text.size(); ++i) {
    const char c = text[i];
    if (inString) {
      if (c == '\\') {
        ++i;  // the escaped character cannot end the string
      } else if (c == '"') {
        inString = false;
      }
    } else if (c == '"') {
      inString = true;
    } else if (c == '[' || c == '{') {
      if (++depth > kMaxJsonDepth) {
        throw Error(ErrorCategory::format,
                    placeOf(text, i, fileName) + ": values nested more than " +
                        std::to_string(kMaxJsonDepth) +
                        " levels deep; no Stridemark file nests more than a few — the file is "
                        "damaged or not ours: restore a backup copy");
      }
    } else if ((c == ']' || c == '}') && depth > 0) {
      --depth;
    }
  }
}

}  // namespace

nlohmann::json parseJsonText(std::string_view text, std::string_view fileName) {
  checkNesting(text, fileName);
  try {
    return nlohmann::json::parse(text.begin(), text.end());
  } catch (const nlohmann::json::parse_error& e) {
    // e.byte is 1-based.
    const std::size_t offset = e.byte == 0 ? 0 : std::min(e.byte - 1, text.size());
    std::string reason = e.what();
    if (const auto pos = reason.find(": "); pos != std::string::npos)
      reason = reason.substr(pos + 2);
    throw Error(ErrorCategory::format, placeOf(text, offset, fileName) + ": not valid JSON (" +
                                           reason + ") — repair the file or restore a backup copy");
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
