// The `stridemark` command line: every verb (app/cli/run_all.cpp).
#include "cli/run.h"

int main(int argc, char** argv) {
  return stridemark::cli::runCommandLine(argc, argv);
}
