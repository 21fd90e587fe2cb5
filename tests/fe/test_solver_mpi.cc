// SPDX-License-Identifier: Apache-2.0
// Run under `mpirun -np 2 test_fe --gtest_filter=Mpi*` (CTest: fe_mpi_2_ranks):
// the same case on all ranks together and on each rank alone agrees at the probes.
#include <quantacal/solver/solver.h>

#include <deal.II/base/mpi.h>

#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>

namespace {

using namespace quantacal::solver;

TEST(MpiRun, OneAndManyRanksAgreeAtTheProbes) {
  const unsigned int n = dealii::Utilities::MPI::n_mpi_processes(MPI_COMM_WORLD);
  if (n < 2)
    GTEST_SKIP() << "run with mpirun -np 2 (CTest fe_mpi_2_ranks)";
  const CaseDescription c =
      load_case(std::string(QUANTACAL_SOURCE_DIR) + "/tests/fe/cases/small_quench.yaml");
  RunOptions o;
  o.write_output = false;
  o.communicator = MPI_COMM_WORLD;
  const RunResult parallel = run_case(c, o);
  o.communicator = MPI_COMM_SELF;
  const RunResult serial = run_case(c, o);
  EXPECT_EQ(parallel.n_ranks, n);
  EXPECT_EQ(serial.n_ranks, 1u);
  EXPECT_EQ(parallel.n_dofs, serial.n_dofs);
  ASSERT_EQ(parallel.times.size(), serial.times.size());
  double worst = 0.0;
  for (std::size_t p = 0; p < serial.probe_temperatures.size(); ++p)
    for (std::size_t k = 0; k < serial.times.size(); ++k)
      worst = std::max(worst, std::abs(parallel.probe_temperatures[p][k] -
                                       serial.probe_temperatures[p][k]) /
                                  serial.probe_temperatures[p][k]);
  EXPECT_LE(worst, 1e-8);
  EXPECT_LE(parallel.worst_relative_imbalance, 1e-8);
}

} // namespace
