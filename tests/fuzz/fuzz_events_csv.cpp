// libFuzzer target: the events CSV reader (formats::parseEventsCsv). Any input either reads or
// throws stridemark::Error; an accepted file written back out reads back to the same text.
#include <cstdint>
#include <string>

#include "common/error.h"
#include "formats/events_csv.h"
#include "fuzz_support.h"

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  using namespace stridemark;
  std::string written;
  try {
    written = formats::formatEventsCsv(
        formats::toAnnotation(formats::parseEventsCsv(fuzz::asText(data, size), "fuzz.csv")));
  } catch (const Error&) {
    return 0;  // refused with a message: what a bad file should get
  }
  try {
    const auto again = formats::toAnnotation(formats::parseEventsCsv(written, "written.csv"));
    fuzz::requireSame(formats::formatEventsCsv(again), written, "events CSV round trip is stable");
  } catch (const Error& e) {
    std::fprintf(stderr, "%s\n", e.what());
    fuzz::require(false, "an events CSV we wrote reads back");
  }
  return 0;
}
