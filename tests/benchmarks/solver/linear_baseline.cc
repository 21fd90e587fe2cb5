// SPDX-License-Identifier: Apache-2.0
// The solver benchmark's linear baseline (not a test): the 3D block of
// aluminium_block_quench.yaml (one eighth of 70 x 50 x 50 mm, 56 x 40 x 40
// trilinear cells on a p4est mesh), constant properties from
// aluminium_constant.yaml, backward Euler with the same 6 steps of 2 s, a
// constant convection coefficient on the three outer faces. The matrix
// M/dt + K + H and its ML AMG are built once; each step is one right-hand side
// and one CG solve. What a nonlinear lattice-property step costs is reported as
// a ratio to this step (run_solver_bench.sh, docs/performance.md).
//
// usage: [mpirun -np N] linear_baseline SOURCE_DIR   (prints one line of key: value
//        pairs; step_s is the slowest rank's)
#include <quantacal/cards/card.h>

#include <deal.II/base/mpi.h>
#include <deal.II/base/quadrature_lib.h>
#include <deal.II/distributed/tria.h>
#include <deal.II/dofs/dof_handler.h>
#include <deal.II/dofs/dof_tools.h>
#include <deal.II/fe/fe_q.h>
#include <deal.II/fe/fe_values.h>
#include <deal.II/grid/grid_generator.h>
#include <deal.II/lac/affine_constraints.h>
#include <deal.II/lac/dynamic_sparsity_pattern.h>
#include <deal.II/lac/solver_cg.h>
#include <deal.II/lac/solver_control.h>
#include <deal.II/lac/sparsity_tools.h>
#include <deal.II/lac/trilinos_precondition.h>
#include <deal.II/lac/trilinos_sparse_matrix.h>
#include <deal.II/lac/trilinos_vector.h>

#include <chrono>
#include <iostream>
#include <string>

namespace {

using namespace dealii;
using Clock = std::chrono::steady_clock;

double seconds_since(Clock::time_point start) {
  return std::chrono::duration<double>(Clock::now() - start).count();
}

} // namespace

int main(int argc, char** argv) {
  Utilities::MPI::MPI_InitFinalize mpi(argc, argv, 1);
  const MPI_Comm comm = MPI_COMM_WORLD;
  if (argc != 2) {
    std::cerr << "usage: linear_baseline SOURCE_DIR\n";
    return 2;
  }
  const std::string source = argv[1];
  // Constant properties: the benchmark's constant twin of the aluminium card.
  const quantacal::MaterialPtr card =
      quantacal::load_card(source + "/tests/benchmarks/solver/aluminium_constant.yaml");
  const double rho_c = card->thermal(553.0, quantacal::Basis::volume).capacity; // J/m^3/K
  const double k = card->conductivity(553.0).value;                             // W/m/K
  const double h = 350.0;          // W/m^2/K, the film-boiling value of the case
  const double t_ambient = 303.15; // K
  const double t_start = 803.15;   // K
  const double dt = 2.0;           // s
  const int n_steps = 6;

  const auto setup_start = Clock::now();
  parallel::distributed::Triangulation<3> tria(comm);
  GridGenerator::subdivided_hyper_rectangle(tria, {7u, 5u, 5u}, Point<3>(0, 0, 0),
                                            Point<3>(0.035, 0.025, 0.025), true);
  tria.refine_global(3);
  const FE_Q<3> fe(1);
  DoFHandler<3> dofs(tria);
  dofs.distribute_dofs(fe);
  const IndexSet owned = dofs.locally_owned_dofs();
  IndexSet relevant;
  DoFTools::extract_locally_relevant_dofs(dofs, relevant);
  AffineConstraints<double> constraints(relevant);
  constraints.close();

  DynamicSparsityPattern dsp(relevant);
  DoFTools::make_sparsity_pattern(dofs, dsp, constraints, false);
  SparsityTools::distribute_sparsity_pattern(dsp, owned, comm, relevant);
  TrilinosWrappers::SparseMatrix system, mass;
  system.reinit(owned, owned, dsp, comm);
  mass.reinit(owned, owned, dsp, comm);
  TrilinosWrappers::MPI::Vector boundary_load(owned, comm);

  const QGauss<3> quadrature(2);
  const QGauss<2> face_quadrature(2);
  FEValues<3> values(fe, quadrature,
                     update_values | update_gradients | update_JxW_values);
  FEFaceValues<3> face_values(fe, face_quadrature, update_values | update_JxW_values);
  const unsigned int n = fe.n_dofs_per_cell();
  FullMatrix<double> cell_system(n, n), cell_mass(n, n);
  Vector<double> cell_load(n);
  std::vector<types::global_dof_index> indices(n);
  for (const auto& cell : dofs.active_cell_iterators()) {
    if (!cell->is_locally_owned())
      continue;
    values.reinit(cell);
    cell_system = 0;
    cell_mass = 0;
    cell_load = 0;
    for (unsigned int q = 0; q < quadrature.size(); ++q)
      for (unsigned int i = 0; i < n; ++i)
        for (unsigned int j = 0; j < n; ++j) {
          const double m = rho_c / dt * values.shape_value(i, q) *
                           values.shape_value(j, q) * values.JxW(q);
          cell_mass(i, j) += m;
          cell_system(i, j) +=
              m + k * values.shape_grad(i, q) * values.shape_grad(j, q) * values.JxW(q);
        }
    for (const unsigned int f : cell->face_indices()) {
      const auto id = cell->face(f)->boundary_id();
      if (!cell->face(f)->at_boundary() || (id != 1 && id != 3 && id != 5))
        continue; // the outer faces x, y, z = max; the others are symmetry planes
      face_values.reinit(cell, f);
      for (unsigned int q = 0; q < face_quadrature.size(); ++q)
        for (unsigned int i = 0; i < n; ++i) {
          cell_load(i) +=
              h * t_ambient * face_values.shape_value(i, q) * face_values.JxW(q);
          for (unsigned int j = 0; j < n; ++j)
            cell_system(i, j) += h * face_values.shape_value(i, q) *
                                 face_values.shape_value(j, q) * face_values.JxW(q);
        }
    }
    cell->get_dof_indices(indices);
    constraints.distribute_local_to_global(cell_system, cell_load, indices, system,
                                           boundary_load);
    constraints.distribute_local_to_global(cell_mass, indices, mass);
  }
  system.compress(VectorOperation::add);
  mass.compress(VectorOperation::add);
  boundary_load.compress(VectorOperation::add);

  TrilinosWrappers::PreconditionAMG amg;
  TrilinosWrappers::PreconditionAMG::AdditionalData amg_data;
  amg_data.elliptic = true;
  amg_data.smoother_sweeps = 2;
  amg_data.aggregation_threshold = 0.02; // as the quench solver's stage solves
  amg.initialize(system, amg_data);
  const double setup_seconds = seconds_since(setup_start);

  TrilinosWrappers::MPI::Vector temperature(owned, comm), rhs(owned, comm);
  temperature = t_start;
  unsigned int iterations = 0;
  const auto steps_start = Clock::now();
  for (int s = 0; s < n_steps; ++s) {
    mass.vmult(rhs, temperature);
    rhs += boundary_load;
    SolverControl control(1000, 1e-10 * rhs.l2_norm());
    SolverCG<TrilinosWrappers::MPI::Vector> cg(control);
    cg.solve(system, temperature, rhs, amg);
    iterations += control.last_step();
  }
  // every rank takes part in these reductions (the mean is a collective too:
  // called on rank 0 alone, it left that rank waiting for ever on 2 ranks)
  const double step_seconds =
      Utilities::MPI::max(seconds_since(steps_start) / n_steps, comm);
  const double slowest_setup = Utilities::MPI::max(setup_seconds, comm);
  const double mean_temperature = temperature.mean_value();
  if (Utilities::MPI::this_mpi_process(comm) == 0)
    std::cout << "unknowns: " << dofs.n_dofs()
              << ", ranks: " << Utilities::MPI::n_mpi_processes(comm)
              << ", setup_s: " << slowest_setup << ", step_s: " << step_seconds
              << ", cg_iterations_per_step: " << double(iterations) / n_steps
              << ", mean_temperature_K: " << mean_temperature << "\n";
  return 0;
}
