include(GoogleTest)
# stridemark_add_test(NAME name SOURCES a.cpp b.cpp LIBS lib... [LABELS l...] [TIMEOUT s] [SERIAL])
# SERIAL: the executable's test cases share files on disk, so ctest -j must not overlap them.
# One helper declares every GoogleTest executable so flags and discovery stay uniform.
function(stridemark_add_test)
  cmake_parse_arguments(T "SERIAL" "NAME;TIMEOUT" "SOURCES;LIBS;LABELS" ${ARGN})
  if(NOT T_TIMEOUT)
    set(T_TIMEOUT 300)
  endif()
  add_executable(${T_NAME} ${T_SOURCES})
  target_link_libraries(${T_NAME} PRIVATE ${T_LIBS} GTest::gtest GTest::gtest_main stridemark_warnings)
  target_include_directories(${T_NAME} PRIVATE ${PROJECT_SOURCE_DIR})  # "tests/support/..."
  target_compile_definitions(${T_NAME} PRIVATE
    STRIDEMARK_SOURCE_DIR="${PROJECT_SOURCE_DIR}" STRIDEMARK_BINARY_DIR="${PROJECT_BINARY_DIR}")
  set(lock "")
  if(T_SERIAL)
    set(lock RESOURCE_LOCK ${T_NAME})
  endif()
  gtest_discover_tests(${T_NAME} DISCOVERY_TIMEOUT 60
    PROPERTIES TIMEOUT ${T_TIMEOUT} LABELS "${T_LABELS}" ${lock})
endfunction()
