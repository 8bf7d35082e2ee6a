# KIND=find_package: installs lacuna's library component (headers, CMake package; not the tool,
# which this test does not need built) from LACUNA_BINARY_DIR into a temporary prefix, then
# configures, builds and runs the consumer in CONSUMER_DIR against it.
# KIND=add_subdirectory: the consumer adds LACUNA_SOURCE_DIR as a subdirectory.
# KIND=find_package_distributed: as find_package, for a consumer of the MPI part
# (find_package(lacuna COMPONENTS distributed)); the consumer is run by MPIEXEC on 2 processes
# (the test's ENVIRONMENT carries what OpenMPI needs as root in a container).
file(REMOVE_RECURSE ${WORK_DIR})
file(MAKE_DIRECTORY ${WORK_DIR})
function(run)
  execute_process(COMMAND ${ARGV} RESULT_VARIABLE rc OUTPUT_VARIABLE out ERROR_VARIABLE out)
  if(NOT rc EQUAL 0)
    message(FATAL_ERROR "command failed: ${ARGV}\n${out}")
  endif()
  set(last_output "${out}" PARENT_SCOPE)
endfunction()
set(args -DCMAKE_CXX_COMPILER=${CXX} -DCMAKE_BUILD_TYPE=Release)
if(KIND MATCHES "^find_package")
  run(${CMAKE_COMMAND} --install ${LACUNA_BINARY_DIR} --prefix ${WORK_DIR}/prefix --component lacuna_library)
  list(APPEND args -DCMAKE_PREFIX_PATH=${WORK_DIR}/prefix)
else()
  list(APPEND args -DLACUNA_SOURCE_DIR=${LACUNA_SOURCE_DIR})
endif()
run(${CMAKE_COMMAND} -S ${CONSUMER_DIR} -B ${WORK_DIR}/build ${args})
run(${CMAKE_COMMAND} --build ${WORK_DIR}/build)
if(KIND STREQUAL "find_package_distributed")
  run(${MPIEXEC} -np 2 --oversubscribe
      ${WORK_DIR}/build/consumer_distributed ${WORK_DIR}/volume.nrrd)
else()
  run(${WORK_DIR}/build/consumer)
endif()
message(STATUS "consumer printed: ${last_output}")
if(NOT last_output MATCHES "consumer ok")
  message(FATAL_ERROR "the consumer did not report success")
endif()
