#pragma once
// The seeds CSV: where a person clicked each foot, the starts of proposal tracking.
//
//   # comments allowed before the header
//   limb,frame,x,y        header (this order); pixels of the upright frame, origin top-left
//   LF,0,212.5,301
//
// Lines end with LF, CRLF or a lone CR. Every problem is "FILE:LINE: what is wrong — what to do".
#include <filesystem>
#include <string_view>
#include <vector>

#include "model/annotation.h"

namespace stridemark::formats {

std::vector<model::FootSeed> parseSeedsCsv(std::string_view text, std::string_view fileName,
                                           const model::LimbSet& limbs);
std::vector<model::FootSeed> readSeedsCsv(const std::filesystem::path& path,
                                          const model::LimbSet& limbs);
std::string formatSeedsCsv(const std::vector<model::FootSeed>& seeds, const model::LimbSet& limbs);

}  // namespace stridemark::formats
