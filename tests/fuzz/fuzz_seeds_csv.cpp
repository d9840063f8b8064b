// libFuzzer target: the seeds CSV reader (formats::parseSeedsCsv, issue 18). Any input either
// reads or throws stridemark::Error; accepted seeds written back out read back the same.
#include <cstdint>
#include <string>

#include "common/error.h"
#include "formats/seeds_csv.h"
#include "fuzz_support.h"

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  using namespace stridemark;
  const model::LimbSet limbs = model::LimbSet::quadruped();
  std::vector<model::FootSeed> seeds;
  try {
    seeds = formats::parseSeedsCsv(fuzz::asText(data, size), "fuzz.csv", limbs);
  } catch (const Error&) {
    return 0;  // refused with a message: what a bad file should get
  }
  const std::string written = formats::formatSeedsCsv(seeds, limbs);
  try {
    fuzz::require(formats::parseSeedsCsv(written, "written.csv", limbs) == seeds,
                  "seeds we wrote read back the same");
  } catch (const Error& e) {
    std::fprintf(stderr, "%s\n", e.what());
    fuzz::require(false, "a seeds CSV we wrote reads back");
  }
  return 0;
}
