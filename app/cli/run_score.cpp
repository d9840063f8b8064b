#include "cli/run.h"

namespace stridemark::cli {

int runScoreCommandLine(int argc, char** argv) {
  static constexpr AddVerb kVerbs[] = {addScoreVerb};
  return runVerbs(argc, argv, kVerbs);
}

}  // namespace stridemark::cli
