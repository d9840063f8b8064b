// Every verb of the command line; `stridemark` hands all but `score` to this program.
#include "cli/run.h"

int main(int argc, char** argv) {
  return stridemark::cli::runCommandLine(argc, argv);
}
