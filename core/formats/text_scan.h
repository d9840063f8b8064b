#pragma once
// Small text helpers shared by the readers: trimming, strict number parsing, text checks.
#include <cstddef>
#include <string>
#include <string_view>

namespace stridemark::formats::text {

std::string_view trim(std::string_view s);

// Offset of the first byte that makes `s` not UTF-8 text (a NUL byte or an invalid sequence),
// or std::string_view::npos when the whole text is fine.
std::size_t firstNonTextByte(std::string_view s);

// 1-based line number of a byte offset.
long lineOfOffset(std::string_view s, std::size_t offset);

// Walks the text line by line; a line ends at LF, CRLF or a lone CR (old Mac spreadsheets).
class LineCursor {
 public:
  explicit LineCursor(std::string_view text) : text_(text) {}
  bool next(std::string_view& line) {
    if (pos_ >= text_.size()) return false;
    std::size_t end = text_.find_first_of("\r\n", pos_);
    if (end == std::string_view::npos) end = text_.size();
    line = text_.substr(pos_, end - pos_);
    pos_ = end + 1;
    if (end < text_.size() && text_[end] == '\r' && pos_ < text_.size() && text_[pos_] == '\n')
      ++pos_;
    ++number_;
    return true;
  }
  long number() const { return number_; }

 private:
  std::string_view text_;
  std::size_t pos_ = 0;
  long number_ = 0;
};

// Shortest text that reads back as the same double ("0.48", "1e-07").
std::string formatDouble(double value);
void appendDouble(std::string& out, double value);
void appendInt(std::string& out, long long value);

}  // namespace stridemark::formats::text
