# An install of lacuna on a machine that has only the library's own dependencies (Boost's
# headers): every package of the tests, the tool and the benchmarks is hidden from CMake with
# CMAKE_DISABLE_FIND_PACKAGE_<name>, and so is range-v3, which the headers no longer use.
#   1. lacuna configures with LACUNA_BUILD_* at their defaults: the tests, the examples with the
#      tool and the benchmarks each switch off with exactly one message naming what is missing,
#      and the cache says OFF for each;
#   2. a second configure of the same directory succeeds and reminds of each in one line;
#   3. it installs (header-only: nothing to build) into a prefix, and the downstream consumer in
#      CONSUMER_DIR, with the same packages hidden, finds it there, builds and runs;
#   4. asked for with -DLACUNA_BUILD_TESTS=ON, in a new build directory and in the one where the
#      tests were switched off, the same lack stops the configure with an error naming doctest.
# Arguments: LACUNA_SOURCE_DIR, CONSUMER_DIR, WORK_DIR, CXX.
cmake_minimum_required(VERSION 3.21)  # for IN_LIST and the policies of the project
file(REMOVE_RECURSE ${WORK_DIR})
file(MAKE_DIRECTORY ${WORK_DIR})

# run(<expect: 0 or FAIL> <command>...): runs it, sets `output` to what it printed.
function(run expect)
  execute_process(COMMAND ${ARGN} RESULT_VARIABLE rc OUTPUT_VARIABLE out ERROR_VARIABLE out)
  if(expect STREQUAL "0" AND NOT rc EQUAL 0)
    message(FATAL_ERROR "command failed: ${ARGN}\n${out}")
  elseif(expect STREQUAL "FAIL" AND rc EQUAL 0)
    message(FATAL_ERROR "command succeeded, but it must fail: ${ARGN}\n${out}")
  endif()
  set(output "${out}" PARENT_SCOPE)
endfunction()

# count_matches(<var> <regex> <text>): how many times regex matches text.
function(count_matches var regex text)
  string(REPLACE ";" "," text "${text}")  # a match holding ';' would count as several list items
  string(REGEX MATCHALL "${regex}" found "${text}")
  list(LENGTH found n)
  set(${var} ${n} PARENT_SCOPE)
endfunction()

function(expect_once regex text what)
  count_matches(n "${regex}" "${text}")
  if(NOT n EQUAL 1)
    message(FATAL_ERROR "${what}: expected exactly one line matching '${regex}', found ${n}:\n${text}")
  endif()
endfunction()

set(hidden doctest FLINT EXPAT nlohmann_json CLI11 benchmark ZLIB range-v3)
set(hide)
foreach(name ${hidden})
  list(APPEND hide -DCMAKE_DISABLE_FIND_PACKAGE_${name}=ON)
endforeach()
set(common -DCMAKE_CXX_COMPILER=${CXX} -DCMAKE_BUILD_TYPE=Release ${hide})

# 1. the first configure
set(build ${WORK_DIR}/lacuna-build)
run(0 ${CMAKE_COMMAND} -S ${LACUNA_SOURCE_DIR} -B ${build} ${common})
set(first "${output}")
expect_once("lacuna: the tests switched off \\(LACUNA_BUILD_TESTS=OFF\\), missing: [^\n]*doctest[^\n]*FLINT[^\n]*expat[^\n]*nlohmann[^\n]*lacuna tool"
            "${first}" "tests")
expect_once("lacuna: the examples and the lacuna tool switched off \\(LACUNA_BUILD_EXAMPLES=OFF\\), missing: CLI11"
            "${first}" "examples and tool")
expect_once("lacuna: the benchmarks switched off \\(LACUNA_BUILD_BENCHMARKS=OFF\\), missing: Google Benchmark"
            "${first}" "benchmarks")
count_matches(n "switched off" "${first}")
if(NOT n EQUAL 3)
  message(FATAL_ERROR "expected three 'switched off' messages, one per part, found ${n}:\n${first}")
endif()
file(STRINGS ${build}/CMakeCache.txt cache REGEX "^LACUNA_BUILD_(TESTS|EXAMPLES|BENCHMARKS):BOOL=")
foreach(part TESTS EXAMPLES BENCHMARKS)
  if(NOT "LACUNA_BUILD_${part}:BOOL=OFF" IN_LIST cache)
    message(FATAL_ERROR "the cache should say LACUNA_BUILD_${part}=OFF; it has: ${cache}")
  endif()
endforeach()

# 2. a second configure
run(0 ${CMAKE_COMMAND} ${build})
count_matches(n "switched off" "${output}")
count_matches(reminders "lacuna: LACUNA_BUILD_[A-Z]+ stays OFF" "${output}")
if(NOT n EQUAL 0 OR NOT reminders EQUAL 3)
  message(FATAL_ERROR "the second configure should give three one-line reminders and no new message:\n${output}")
endif()

# 3. install and build a consumer against it
run(0 ${CMAKE_COMMAND} --install ${build} --prefix ${WORK_DIR}/prefix)
if(NOT EXISTS ${WORK_DIR}/prefix/include/lacuna/lacuna.hpp OR EXISTS ${WORK_DIR}/prefix/bin/lacuna)
  message(FATAL_ERROR "the install should hold the headers and, with the tool switched off, no bin/lacuna")
endif()
run(0 ${CMAKE_COMMAND} -S ${CONSUMER_DIR} -B ${WORK_DIR}/consumer ${common} -DCMAKE_PREFIX_PATH=${WORK_DIR}/prefix)
file(STRINGS ${WORK_DIR}/consumer/CMakeCache.txt found_dir REGEX "^lacuna_DIR:")
if(NOT found_dir MATCHES "=${WORK_DIR}/prefix/")
  message(FATAL_ERROR "the consumer found another lacuna: ${found_dir}")
endif()
run(0 ${CMAKE_COMMAND} --build ${WORK_DIR}/consumer)
run(0 ${WORK_DIR}/consumer/consumer)
if(NOT output MATCHES "consumer ok")
  message(FATAL_ERROR "the consumer did not report success: ${output}")
endif()
message(STATUS "consumer printed: ${output}")

# 4. asked for explicitly, the tests' lack is an error
run(FAIL ${CMAKE_COMMAND} -S ${LACUNA_SOURCE_DIR} -B ${WORK_DIR}/explicit ${common} -DLACUNA_BUILD_TESTS=ON)
if(NOT output MATCHES "LACUNA_BUILD_TESTS=ON, but the tests need[ \n]+what is missing here:[ \n]+doctest")
  message(FATAL_ERROR "the configure with -DLACUNA_BUILD_TESTS=ON failed without naming doctest:\n${output}")
endif()
run(FAIL ${CMAKE_COMMAND} ${build} -DLACUNA_BUILD_TESTS=ON)
if(NOT output MATCHES "LACUNA_BUILD_TESTS=ON, but the tests need[ \n]+what is missing here:[ \n]+doctest")
  message(FATAL_ERROR "asking again for the switched-off tests failed without naming doctest:\n${output}")
endif()
message(STATUS "configure messages, install and consumer as expected")
