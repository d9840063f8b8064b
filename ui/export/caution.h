#pragma once
// The clinical caution every exported report carries (on every PDF page footer).

namespace stridemark::ui::exports {

inline constexpr const char* kClinicalCaution =
    "Measurements support, and never replace, examination by a licensed veterinarian; defer to "
    "local practice and regulations for animal handling.";

}  // namespace stridemark::ui::exports
