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

// Shortest text that reads back as the same double ("0.48", "1e-07").
std::string formatDouble(double value);
void appendDouble(std::string& out, double value);
void appendInt(std::string& out, long long value);

}  // namespace stridemark::formats::text
