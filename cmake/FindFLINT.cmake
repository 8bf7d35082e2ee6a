# Finds FLINT (Debian: libflint-dev) and the GMP it is built on, the outside reference that the
# tests cross-check against (tests/reference/). Debian's package ships no CMake config, hence
# this module. Defines FLINT_FOUND and the imported target FLINT::FLINT (headers under both
# <flint/...> and <...>, linked with libflint and libgmp).
find_path(FLINT_INCLUDE_DIR flint/fmpz_mat.h)
find_library(FLINT_LIBRARY flint)
find_library(FLINT_GMP_LIBRARY gmp)
include(FindPackageHandleStandardArgs)
find_package_handle_standard_args(FLINT REQUIRED_VARS FLINT_INCLUDE_DIR FLINT_LIBRARY FLINT_GMP_LIBRARY)
if(FLINT_FOUND AND NOT TARGET FLINT::FLINT)
  add_library(FLINT::FLINT INTERFACE IMPORTED)
  target_include_directories(FLINT::FLINT SYSTEM INTERFACE ${FLINT_INCLUDE_DIR} ${FLINT_INCLUDE_DIR}/flint)
  target_link_libraries(FLINT::FLINT INTERFACE ${FLINT_LIBRARY} ${FLINT_GMP_LIBRARY})
endif()
mark_as_advanced(FLINT_INCLUDE_DIR FLINT_LIBRARY FLINT_GMP_LIBRARY)
