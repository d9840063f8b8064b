// `stridemark score` runs here; every other verb (and --help, --version) in stridemark-full.
#include <string_view>

#include "cli/hand_over.h"
#include "cli/run.h"

int main(int argc, char** argv) {
  using namespace stridemark::cli;
  if (argc >= 2 && std::string_view(argv[1]) == "score") return runScoreCommandLine(argc, argv);
  return handOverToFullCommandLine(argv);
}
