#include "formats/seeds_csv.h"

#include <charconv>
#include <cmath>
#include <string>

#include "common/error.h"
#include "formats/file_io.h"
#include "formats/text_scan.h"

namespace stridemark::formats {

namespace {

constexpr std::string_view kHeader = "limb,frame,x,y";

std::vector<std::string_view> splitFields(std::string_view line) {
  std::vector<std::string_view> fields;
  std::size_t start = 0;
  for (std::size_t i = 0; i <= line.size(); ++i) {
    if (i == line.size() || line[i] == ',') {
      fields.push_back(text::trim(line.substr(start, i - start)));
      start = i + 1;
    }
  }
  return fields;
}

std::string shown(std::string_view value) {
  return "'" + std::string(value.substr(0, 40)) + (value.size() > 40 ? "…'" : "'");
}

}  // namespace

std::vector<model::FootSeed> parseSeedsCsv(std::string_view text, std::string_view fileName,
                                           const model::LimbSet& limbs) {
  if (const auto bad = text::firstNonTextByte(text); bad != std::string_view::npos)
    throw Error(ErrorCategory::format,
                atLine(fileName, text::lineOfOffset(text, bad),
                       "is not text (binary data); a seeds file is CSV with the header " +
                           std::string(kHeader)));
  std::vector<model::FootSeed> seeds;
  bool header = false;
  text::LineCursor cursor(text);
  std::string_view raw;
  while (cursor.next(raw)) {
    const long lineNo = cursor.number();
    const std::string_view line = text::trim(raw);
    if (line.empty() || line.front() == '#') continue;
    auto fail = [&](const std::string& what) {
      throw Error(ErrorCategory::format, atLine(fileName, lineNo, what));
    };
    if (!header) {
      if (line != kHeader)
        fail("expected the header " + std::string(kHeader) + ", found " + shown(line) +
             " — x and y are pixels of the upright frame, origin top-left");
      header = true;
      continue;
    }
    const auto fields = splitFields(line);
    if (fields.size() != 4)
      fail("has " + std::to_string(fields.size()) + " fields, not 4 (" + std::string(kHeader) +
           ")");
    model::FootSeed seed;
    const auto limb = limbs.indexOf(fields[0]);
    if (!limb)
      fail("unknown limb " + shown(fields[0]) + " for limb set " + limbs.name() + " — use one of " +
           limbs.labelList());
    seed.limb = *limb;
    const std::string_view frame = fields[1];
    const auto [end, ec] = std::from_chars(frame.data(), frame.data() + frame.size(), seed.frame);
    if (ec != std::errc() || end != frame.data() + frame.size() || frame.empty() || frame[0] == '-')
      fail("frame " + shown(frame) + " is not a frame number (0, 1, 2, ...)");
    double* coordinates[] = {&seed.x, &seed.y};
    for (int i = 0; i < 2; ++i) {
      const std::string value(fields[2 + static_cast<std::size_t>(i)]);
      std::size_t used = 0;
      double number = NAN;
      try {
        number = std::stod(value, &used);
      } catch (const std::exception&) {
        used = 0;
      }
      if (value.empty() || used != value.size() || !std::isfinite(number))
        fail(std::string(i == 0 ? "x " : "y ") + shown(value) + " is not a number of pixels");
      *coordinates[i] = number;
    }
    seeds.push_back(seed);
  }
  if (!header)
    throw Error(ErrorCategory::format, std::string(fileName) +
                                           ": no header line; a seeds file starts with " +
                                           std::string(kHeader));
  if (seeds.empty())
    throw Error(
        ErrorCategory::format,
        std::string(fileName) + ": no seeds; add one line per foot (" + std::string(kHeader) + ")");
  return seeds;
}

std::vector<model::FootSeed> readSeedsCsv(const std::filesystem::path& path,
                                          const model::LimbSet& limbs) {
  return parseSeedsCsv(readWholeFile(path), path.string(), limbs);
}

std::string formatSeedsCsv(const std::vector<model::FootSeed>& seeds, const model::LimbSet& limbs) {
  std::string out = std::string(kHeader) + "\n";
  for (const auto& seed : seeds) {
    out += limbs.label(seed.limb) + "," + std::to_string(seed.frame) + ",";
    text::appendDouble(out, seed.x);
    out += ",";
    text::appendDouble(out, seed.y);
    out += "\n";
  }
  return out;
}

}  // namespace stridemark::formats
