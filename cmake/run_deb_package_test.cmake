# The Debian package, as a user makes and uses it:
#   1. `cpack -G DEB` on the build directory LACUNA_BINARY_DIR (cpack builds the tool if it is
#      not up to date) gives one lacuna_<VERSION>_<arch>.deb;
#   2. its control fields, read back by dpkg-deb: package lacuna, version VERSION (project()),
#      a maintainer, and dependencies on libboost-dev (the headers) and libc6 (found by
#      dpkg-shlibdeps in the tool);
#   3. `dpkg -x` unpacks it into a scratch root; the downstream consumer in CONSUMER_DIR finds
#      lacuna there with find_package (CMAKE_PREFIX_PATH=<root>/usr), builds and runs;
#   4. the packaged tool <root>/usr/bin/lacuna prints "lacuna VERSION" for --version.
# Arguments: LACUNA_BINARY_DIR, CONSUMER_DIR, WORK_DIR, CXX, CPACK, VERSION.
file(REMOVE_RECURSE ${WORK_DIR})
file(MAKE_DIRECTORY ${WORK_DIR})
function(run)
  execute_process(COMMAND ${ARGV} RESULT_VARIABLE rc OUTPUT_VARIABLE out ERROR_VARIABLE err)
  if(NOT rc EQUAL 0)
    message(FATAL_ERROR "command failed: ${ARGV}\n${out}\n${err}")
  endif()
  set(output "${out}" PARENT_SCOPE)
endfunction()

# 1. make the package
execute_process(COMMAND ${CPACK} -G DEB --config ${LACUNA_BINARY_DIR}/CPackConfig.cmake -B ${WORK_DIR}/cpack
                WORKING_DIRECTORY ${LACUNA_BINARY_DIR} RESULT_VARIABLE rc OUTPUT_VARIABLE out ERROR_VARIABLE out)
if(NOT rc EQUAL 0)
  file(GLOB logs ${WORK_DIR}/cpack/_CPack_Packages/*/DEB/*.log)
  set(log_text)
  foreach(log ${logs})
    file(READ ${log} text)
    string(APPEND log_text "\n--- ${log}:\n${text}")
  endforeach()
  message(FATAL_ERROR "cpack -G DEB failed:\n${out}${log_text}")
endif()
file(GLOB debs ${WORK_DIR}/cpack/lacuna_${VERSION}_*.deb)
list(LENGTH debs n)
if(NOT n EQUAL 1)
  message(FATAL_ERROR "expected one lacuna_${VERSION}_<arch>.deb, found ${n}:\n${out}")
endif()
message(STATUS "package: ${debs}")

# 2. its control fields
foreach(field Package Version Maintainer Depends)
  run(dpkg-deb --field ${debs} ${field})
  string(STRIP "${output}" ${field})
  message(STATUS "${field}: ${${field}}")
endforeach()
if(NOT Package STREQUAL "lacuna" OR NOT Version STREQUAL "${VERSION}" OR NOT Maintainer MATCHES ".+<.+@.+>")
  message(FATAL_ERROR "unexpected control fields: Package '${Package}', Version '${Version}' "
                      "(project version ${VERSION}), Maintainer '${Maintainer}'")
endif()
if(NOT Depends MATCHES "(^|, )libboost-dev \\(>= 1\\.74\\)" OR NOT Depends MATCHES "(^|, )libc6 ")
  message(FATAL_ERROR "Depends should name libboost-dev (>= 1.74) and libc6 (dpkg-shlibdeps): '${Depends}'")
endif()

# 3. unpack it and build a consumer against it
set(root ${WORK_DIR}/root)
run(dpkg -x ${debs} ${root})
run(${CMAKE_COMMAND} -S ${CONSUMER_DIR} -B ${WORK_DIR}/consumer -DCMAKE_CXX_COMPILER=${CXX}
    -DCMAKE_BUILD_TYPE=Release -DCMAKE_PREFIX_PATH=${root}/usr)
file(STRINGS ${WORK_DIR}/consumer/CMakeCache.txt found_dir REGEX "^lacuna_DIR:")
if(NOT found_dir MATCHES "=${root}/usr/share/cmake/lacuna$")
  message(FATAL_ERROR "the consumer did not find the unpacked package: ${found_dir}")
endif()
run(${CMAKE_COMMAND} --build ${WORK_DIR}/consumer)
run(${WORK_DIR}/consumer/consumer)
if(NOT output MATCHES "consumer ok")
  message(FATAL_ERROR "the consumer did not report success: ${output}")
endif()
message(STATUS "consumer printed: ${output}")

# 4. the packaged tool
run(${root}/usr/bin/lacuna --version)
string(STRIP "${output}" version_line)
if(NOT version_line STREQUAL "lacuna ${VERSION}")
  message(FATAL_ERROR "${root}/usr/bin/lacuna --version printed '${version_line}', not 'lacuna ${VERSION}'")
endif()
message(STATUS "packaged tool: ${version_line}")
