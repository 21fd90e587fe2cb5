// SPDX-License-Identifier: Apache-2.0
// main() of test_fe: GoogleTest with MPI (and p4est/Trilinos) initialised once.
#include <deal.II/base/mpi.h>

#include <gtest/gtest.h>

int main(int argc, char** argv) {
  dealii::Utilities::MPI::MPI_InitFinalize mpi(argc, argv, 1);
  ::testing::InitGoogleTest(&argc, argv);
  // only rank 0 prints results
  if (dealii::Utilities::MPI::this_mpi_process(MPI_COMM_WORLD) != 0) {
    auto& listeners = ::testing::UnitTest::GetInstance()->listeners();
    delete listeners.Release(listeners.default_result_printer());
  }
  return RUN_ALL_TESTS();
}
