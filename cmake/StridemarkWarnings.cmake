# One interface target carries the project's warning flags; every target links it.
add_library(stridemark_warnings INTERFACE)
target_compile_options(stridemark_warnings INTERFACE
  -Wall -Wextra -Wpedantic -Wshadow -Wnon-virtual-dtor -Wold-style-cast -Wcast-align
  -Woverloaded-virtual -Wimplicit-fallthrough -Wformat=2)
if(STRIDEMARK_WERROR)
  target_compile_options(stridemark_warnings INTERFACE -Werror)
endif()
