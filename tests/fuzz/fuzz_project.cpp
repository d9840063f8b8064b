// libFuzzer target: the project reader (formats::parseProjectJson, with migrations). Any input
// either reads or throws stridemark::Error; a project that reads saves and reopens unchanged.
#include <cstdint>
#include <string>

#include "common/error.h"
#include "formats/project_file.h"
#include "fuzz_support.h"

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  using namespace stridemark;
  std::string saved;
  try {
    saved = formats::projectJsonText(
        formats::parseProjectJson(fuzz::asText(data, size), "fuzz.stridemark"));
  } catch (const Error&) {
    return 0;
  }
  try {
    const auto reopened = formats::parseProjectJson(saved, "saved.stridemark");
    fuzz::requireSame(formats::projectJsonText(reopened), saved, "project save is stable");
  } catch (const Error& e) {
    std::fprintf(stderr, "%s\n", e.what());
    fuzz::require(false, "a project we saved reopens");
  }
  return 0;
}
