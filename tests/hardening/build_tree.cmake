# SPDX-License-Identifier: Apache-2.0
# Configures and builds one sanitizer tree of quantacal for the hardening tests
# (tests/hardening/CMakeLists.txt, docs/reliability.md):
#   cmake -DSOURCE=<src> -DBINARY=<tree> -DGENERATOR=<generator> -DJOBS=<n>
#         -DOPTIONS=<-Da=1|-Db=2> -DTARGETS=<t1|t2> -P build_tree.cmake
# Lists are separated by "|". Configuring an existing tree again only updates it.
foreach(_v SOURCE BINARY GENERATOR JOBS OPTIONS TARGETS)
  if(NOT DEFINED ${_v})
    message(FATAL_ERROR "build_tree.cmake: ${_v} is not set")
  endif()
endforeach()
string(REPLACE "|" ";" _options "${OPTIONS}")
string(REPLACE "|" ";" _targets "${TARGETS}")
string(TIMESTAMP _start "%s")
execute_process(COMMAND "${CMAKE_COMMAND}" -S "${SOURCE}" -B "${BINARY}" -G "${GENERATOR}"
                        ${_options}
                RESULT_VARIABLE _rc)
if(NOT _rc EQUAL 0)
  message(FATAL_ERROR "hardening: configuring ${BINARY} failed (${_rc})")
endif()
execute_process(COMMAND "${CMAKE_COMMAND}" --build "${BINARY}" -j ${JOBS} --target ${_targets}
                RESULT_VARIABLE _rc)
if(NOT _rc EQUAL 0)
  message(FATAL_ERROR "hardening: building ${_targets} in ${BINARY} failed (${_rc})")
endif()
string(TIMESTAMP _end "%s")
math(EXPR _seconds "${_end} - ${_start}")
message(STATUS "hardening: ${BINARY} built in ${_seconds} s")
