# SPDX-License-Identifier: Apache-2.0
# quantacal_case_parser_sources(<var>): the sources of the case-file reader in
# lib/solver that have no deal.II in them (case_*.cc but the fingerprint, and
# the quenchant library the boundary reader looks names up in). The fuzz target
# fuzz_case and the test test_case compile them, so both build with
# -DQUANTACAL_WITH_SOLVER=OFF. A new case_*.cc file joins them; it must not
# include deal.II.
function(quantacal_case_parser_sources out)
  file(GLOB _sources CONFIGURE_DEPENDS "${PROJECT_SOURCE_DIR}/lib/solver/case_*.cc"
       "${PROJECT_SOURCE_DIR}/lib/solver/quenchant.cc")
  list(FILTER _sources EXCLUDE REGEX "/case_fingerprint\\.cc$")
  set(${out} ${_sources} PARENT_SCOPE)
endfunction()

# quantacal_add_case_parser(<target>): compiles the case-file reader into <target>
# with the include folders it needs.
function(quantacal_add_case_parser target)
  quantacal_case_parser_sources(_sources)
  target_sources(${target} PRIVATE ${_sources})
  quantacal_stage_headers(${target} solver)
  target_include_directories(${target} PRIVATE "${PROJECT_SOURCE_DIR}/lib/solver"
                             "${PROJECT_BINARY_DIR}/include-layers/${target}")
  target_link_libraries(${target} PRIVATE quantacal_cards_internal)
endfunction()
