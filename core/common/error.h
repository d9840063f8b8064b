#pragma once
// The one exception type that crosses core boundaries. Its message must let a user act:
// which file, line or frame, what is wrong, and what to do about it.
#include <stdexcept>
#include <string>
#include <string_view>

namespace stridemark {

enum class ErrorCategory { io, decode, seek, format, analysis, export_ };

std::string_view categoryName(ErrorCategory category);

class Error : public std::runtime_error {
 public:
  Error(ErrorCategory category, const std::string& message)
      : std::runtime_error(message), category_(category) {}
  ErrorCategory category() const noexcept { return category_; }

 private:
  ErrorCategory category_;
};

// Convenience for "FILE:LINE: what is wrong. what to do" messages.
std::string atLine(std::string_view file, long line, std::string_view message);

}  // namespace stridemark
