#pragma once

namespace stridemark::cli {

// Runs `stridemark-full` (beside this executable) in this process's place with the same
// arguments. Every verb but `score` loads Qt and the video libraries, which take ~50 ms to load
// and which `stridemark score` never needs (see app/CMakeLists.txt). Returns only when it
// cannot: an exit code, after saying why on stderr.
int handOverToFullCommandLine(char** argv);

}  // namespace stridemark::cli
