# SPDX-License-Identifier: Apache-2.0
# Sanitizer and fuzzing builds (docs/reliability.md).
#
#   -DQUANTACAL_SANITIZE=address,undefined   ASan + UBSan on every target (gcc or clang)
#   -DQUANTACAL_SANITIZE=thread              TSan on every target
#   -DQUANTACAL_FUZZ=ON                      libFuzzer targets under tests/fuzz (clang only;
#                                            implies address,undefined)
#
# The flags are added to every target of the project (compile and link), so
# the static core layers, the C library, the command and the tests all carry
# them. UBSan does not recover: the first finding aborts, so a test or a fuzz
# target fails on it. System libraries (yaml-cpp, GSL, libstdc++) are not
# instrumented.
set(QUANTACAL_SANITIZE "" CACHE STRING
    "Sanitizers for every target: a comma list of address, undefined, thread (empty: none)")
option(QUANTACAL_FUZZ "Build the libFuzzer targets of tests/fuzz (needs clang)" OFF)

if(QUANTACAL_FUZZ)
  if(NOT CMAKE_CXX_COMPILER_ID STREQUAL "Clang")
    message(FATAL_ERROR "QUANTACAL_FUZZ needs clang (libFuzzer): configure with "
                        "-DCMAKE_CXX_COMPILER=clang++-14 -DCMAKE_C_COMPILER=clang-14")
  endif()
  if(QUANTACAL_SANITIZE STREQUAL "")
    set(QUANTACAL_SANITIZE "address,undefined")
  endif()
endif()

if(NOT QUANTACAL_SANITIZE STREQUAL "")
  string(REPLACE "," ";" _qc_sanitizers "${QUANTACAL_SANITIZE}")
  foreach(_qc_s IN LISTS _qc_sanitizers)
    if(NOT _qc_s MATCHES "^(address|undefined|thread)$")
      message(FATAL_ERROR "QUANTACAL_SANITIZE: unknown sanitizer '${_qc_s}' "
                          "(expected address, undefined or thread)")
    endif()
  endforeach()
  if("thread" IN_LIST _qc_sanitizers AND "address" IN_LIST _qc_sanitizers)
    message(FATAL_ERROR "QUANTACAL_SANITIZE: thread and address cannot be combined")
  endif()
  set(_qc_flags "-fsanitize=${QUANTACAL_SANITIZE}" -fno-omit-frame-pointer -g)
  if("undefined" IN_LIST _qc_sanitizers)
    list(APPEND _qc_flags -fno-sanitize-recover=all)
  endif()
  add_compile_options(${_qc_flags})
  add_link_options("-fsanitize=${QUANTACAL_SANITIZE}")
  if(QUANTACAL_FUZZ)
    # Coverage feedback for the library code; the fuzz targets link the driver.
    add_compile_options(-fsanitize=fuzzer-no-link)
  endif()
  message(STATUS "quantacal: sanitizers ${QUANTACAL_SANITIZE} on every target")
endif()
