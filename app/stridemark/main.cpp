#include "cli/run.h"

int main(int argc, char** argv) { return stridemark::cli::runCommandLine(argc, argv); }
