# The parts of lacuna's build beyond the library itself: the tests (LACUNA_BUILD_TESTS), the
# examples with the command-line tool (LACUNA_BUILD_EXAMPLES) and the benchmarks
# (LACUNA_BUILD_BENCHMARKS). The library needs only Boost's headers; each part needs packages
# of its own (docs/install.md lists them).
#
# A part's option is ON by default in lacuna's own build (OFF when lacuna is added to another
# project with add_subdirectory). What a missing package does depends on who chose ON:
#   - left at its default, the part is switched off with one message saying what is missing,
#     and the option is set to OFF in the cache, so that the cache says what is built; later
#     configures of the same build directory remind of it in one line;
#   - given as -D<option>=ON (at the first configure of a build directory, or again after the
#     part was switched off), the user asked for the part: a missing package is a configure
#     error naming the Debian package to install.

# lacuna_part_option(<option> <help>): option(), remembering whether the user gave the value.
macro(lacuna_part_option name help)
  if(NOT DEFINED CACHE{${name}})
    set(${name}_EXPLICIT OFF CACHE INTERNAL "whether ${name} was given with -D")
  elseif(NOT DEFINED CACHE{${name}_EXPLICIT})
    set(${name}_EXPLICIT ON CACHE INTERNAL "whether ${name} was given with -D")
  elseif(${name} AND DEFINED CACHE{${name}_SWITCHED_OFF})
    # switched off by an earlier configure, and set to ON again since: asked for
    set(${name}_EXPLICIT ON CACHE INTERNAL "whether ${name} was given with -D")
    unset(${name}_SWITCHED_OFF CACHE)
  endif()
  option(${name} "${help}" ${PROJECT_IS_TOP_LEVEL})
  if(NOT ${name} AND DEFINED CACHE{${name}_SWITCHED_OFF})
    message(STATUS "lacuna: ${name} stays OFF (missing at an earlier configure: ${${name}_SWITCHED_OFF}); "
                   "-D${name}=ON asks for it again")
  endif()
endmacro()

# lacuna_part_requires(<option> <part> <missing>...): called by a part's CMakeLists.txt with
# the list of what it lacks (empty: nothing). Returns with lacuna_part_ok set to TRUE when the
# part can be built; otherwise switches it off (default) or stops the configure (explicit ON).
function(lacuna_part_requires name part)
  set(missing ${ARGN})
  if(NOT missing)
    set(lacuna_part_ok TRUE PARENT_SCOPE)
    return()
  endif()
  list(JOIN missing "; " missing_text)
  if(${name}_EXPLICIT)
    message(FATAL_ERROR "${name}=ON, but ${part} need what is missing here: ${missing_text}. "
                        "Install it (scripts/setup.sh installs everything), or configure with -D${name}=OFF.")
  endif()
  message(STATUS "lacuna: ${part} switched off (${name}=OFF), missing: ${missing_text}")
  get_property(help CACHE ${name} PROPERTY HELPSTRING)
  set(${name} OFF CACHE BOOL "${help}" FORCE)
  set(${name}_SWITCHED_OFF "${missing_text}" CACHE INTERNAL "what ${name} lacked")
  set(lacuna_part_ok FALSE PARENT_SCOPE)
endfunction()
