#include "common/error.h"

namespace stridemark {

std::string_view categoryName(ErrorCategory category) {
  switch (category) {
    case ErrorCategory::io: return "io";
    case ErrorCategory::decode: return "decode";
    case ErrorCategory::seek: return "seek";
    case ErrorCategory::format: return "format";
    case ErrorCategory::analysis: return "analysis";
    case ErrorCategory::export_: return "export";
  }
  return "unknown";
}

std::string atLine(std::string_view file, long line, std::string_view message) {
  std::string out(file);
  out += ':';
  out += std::to_string(line);
  out += ": ";
  out += message;
  return out;
}

}  // namespace stridemark
