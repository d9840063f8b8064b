// libFuzzer target: the report JSON reader (formats::parseReportJson). Any input either reads
// or throws stridemark::Error; a report that reads is written and read back to the same text.
#include <cstdint>
#include <string>

#include "common/error.h"
#include "formats/report_json.h"
#include "fuzz_support.h"

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  using namespace stridemark;
  std::string written;
  try {
    written =
        formats::reportJsonText(formats::parseReportJson(fuzz::asText(data, size), "fuzz.json"));
  } catch (const Error&) {
    return 0;
  }
  try {
    const auto again = formats::parseReportJson(written, "written.json");
    fuzz::requireSame(formats::reportJsonText(again), written, "report round trip is stable");
  } catch (const Error& e) {
    std::fprintf(stderr, "%s\n", e.what());
    fuzz::require(false, "a report we wrote reads back");
  }
  return 0;
}
