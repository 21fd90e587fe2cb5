# SPDX-License-Identifier: Apache-2.0
# Install-tree test: install this build into a staging prefix under the build folder,
# then configure, build and run tests/consumer (find_package(quantacal)) against it.
set(_qc_consumer_targets quantacal_cards quantacal_fit quantacal_cli quantacal_c)
set(_qc_consumer_fortran -DFORTRAN=OFF)
if(TARGET quantacal_fortran)
  list(APPEND _qc_consumer_targets quantacal_fortran)
  set(_qc_consumer_fortran -DFORTRAN=ON)
endif()
if(TARGET quantacal_solver)
  list(APPEND _qc_consumer_targets quantacal_fe quantacal_solver)
endif()
set(_qc_consumer_python)
if(TARGET quantacal_python)
  list(APPEND _qc_consumer_targets quantacal_python)
  set(_qc_consumer_python -DPYTHON_EXECUTABLE=${Python3_EXECUTABLE}
                          -DPYTHON_SITE=${QUANTACAL_PYTHON_INSTALL_DIR})
endif()
string(REPLACE ";" "\\;" _qc_consumer_targets_arg "${_qc_consumer_targets}")
add_test(NAME consumer.find_package_install_tree
         COMMAND ${CMAKE_COMMAND}
                 -DBINARY_DIR=${PROJECT_BINARY_DIR}
                 -DSOURCE_DIR=${PROJECT_SOURCE_DIR}
                 -DWORK_DIR=${PROJECT_BINARY_DIR}/consumer-test
                 "-DBUILD_TARGETS=${_qc_consumer_targets_arg}"
                 -DCXX_COMPILER=${CMAKE_CXX_COMPILER}
                 ${_qc_consumer_python} ${_qc_consumer_fortran}
                 -P ${CMAKE_CURRENT_SOURCE_DIR}/consumer/run_consumer.cmake)
set_tests_properties(consumer.find_package_install_tree PROPERTIES
                     LABELS consumer TIMEOUT 300 RUN_SERIAL TRUE)
