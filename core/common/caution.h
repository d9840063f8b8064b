#pragma once
// The one caution text. Every place that shows gait numbers to a person carries it: README,
// the desk's about box, the PDF report, report.json, the tables and the command line.
#include <string_view>

namespace stridemark {

inline constexpr std::string_view kCaution =
    "Gait measurements support, and never replace, examination by a licensed veterinarian; "
    "defer to local practice and regulations for animal handling.";

}  // namespace stridemark
