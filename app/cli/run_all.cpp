#include "cli/run.h"

namespace stridemark::cli {

int runCommandLine(int argc, char** argv) {
  // One line per verb, in the order `--help` lists them:
  static constexpr AddVerb kVerbs[] = {addProbeVerb, addFrameVerb, addScoreVerb, addSynthVerb,
                                       addExportVerb, addSuggestVerb};
  return runVerbs(argc, argv, kVerbs);
}

}  // namespace stridemark::cli
