// SPDX-License-Identifier: Apache-2.0
// Adaptive refinement and coarsening of the mesh of a run (remesh.h).
#include "remesh.h"

#include <deal.II/base/mpi.h>
#include <deal.II/distributed/grid_refinement.h>
#include <deal.II/distributed/solution_transfer.h>
#include <deal.II/dofs/dof_tools.h>
#include <deal.II/numerics/error_estimator.h>

#include <algorithm>
#include <cmath>
#include <map>

namespace quantacal::solver::detail {

using namespace dealii;

template <int dim>
dealii::Vector<float> temperature_indicator(const Discretization<dim>& discretization,
                                            const Vector& temperature) {
  const auto& triangulation = discretization.triangulation;
  dealii::Vector<float> indicator(triangulation.n_active_cells());
  // faces of every boundary count as Dirichlet faces: no contribution (the jump is
  // between cells; the boundary layer shows in the jumps next to the boundary)
  KellyErrorEstimator<dim>::estimate(
      discretization.mapping, discretization.dof_handler, discretization.face_quadrature,
      std::map<types::boundary_id, const Function<dim>*>(), temperature, indicator,
      ComponentMask(), nullptr, numbers::invalid_unsigned_int,
      triangulation.locally_owned_subdomain());
  for (const auto& cell : triangulation.active_cell_iterators()) {
    float& value = indicator[cell->active_cell_index()];
    if (!cell->is_locally_owned()) {
      value = 0.0f;
      continue;
    }
    value = static_cast<float>(value * cell->diameter() / std::sqrt(cell->measure()));
  }
  return indicator;
}

namespace {

/** Refinement flags on at most a fraction of the cells, the largest indicators first.
 */
template <int dim>
void refine_largest(parallel::distributed::Triangulation<dim>& triangulation,
                    const dealii::Vector<float>& candidates, unsigned long long allowed,
                    unsigned long long active) {
  for (const auto& cell : triangulation.active_cell_iterators())
    if (cell->is_locally_owned())
      cell->clear_refine_flag();
  if (allowed == 0)
    return;
  // candidates holds the indicator of refinable cells above the threshold, 0
  // elsewhere: the `allowed` largest of it are all candidates
  parallel::distributed::GridRefinement::refine_and_coarsen_fixed_number(
      triangulation, candidates, static_cast<double>(allowed) / active, 0.0);
  for (const auto& cell : triangulation.active_cell_iterators())
    if (cell->is_locally_owned()) {
      cell->clear_coarsen_flag();
      if (candidates[cell->active_cell_index()] <= 0.0f)
        cell->clear_refine_flag();
    }
}

} // namespace

template <int dim>
RemeshMarks mark_cells(Discretization<dim>& discretization, const Vector& temperature,
                       const AdaptivitySpec& spec, unsigned int base_level) {
  auto& triangulation = discretization.triangulation;
  const dealii::Vector<float> indicator =
      temperature_indicator(discretization, temperature);
  dealii::Vector<float> candidates(indicator.size());
  const unsigned int top_level = base_level + spec.levels;
  RemeshMarks marks;
  unsigned long long refine = 0;
  double largest = 0.0;
  for (const auto& cell : triangulation.active_cell_iterators()) {
    if (!cell->is_locally_owned())
      continue;
    const unsigned int index = cell->active_cell_index();
    const double value = indicator[index];
    largest = std::max(largest, value);
    cell->clear_refine_flag();
    cell->clear_coarsen_flag();
    if (value > spec.refine_above &&
        static_cast<unsigned int>(cell->level()) < top_level) {
      candidates[index] = indicator[index];
      ++refine;
    }
  }
  const MPI_Comm communicator = discretization.communicator;
  marks.active = triangulation.n_global_active_cells();
  marks.refine = Utilities::MPI::sum(refine, communicator);
  marks.largest = Utilities::MPI::max(largest, communicator);
  // each refinement adds 2^dim - 1 cells
  const unsigned long long children = (1u << dim) - 1;
  const unsigned long long room =
      spec.max_cells > marks.active ? (spec.max_cells - marks.active) / children : 0;
  if (marks.refine > room) {
    refine_largest(triangulation, candidates, room, marks.active);
    marks.refine = room;
  } else {
    for (const auto& cell : triangulation.active_cell_iterators())
      if (cell->is_locally_owned() && candidates[cell->active_cell_index()] > 0.0f)
        cell->set_refine_flag();
  }
  unsigned long long coarsen = 0;
  for (const auto& cell : triangulation.active_cell_iterators())
    if (cell->is_locally_owned() && !cell->refine_flag_set() &&
        indicator[cell->active_cell_index()]<
            spec.coarsen_below&& static_cast<unsigned int>(cell->level())>
            base_level) {
      cell->set_coarsen_flag();
      ++coarsen;
    }
  marks.coarsen = Utilities::MPI::sum(coarsen, communicator);
  return marks;
}

template <int dim>
void refine_and_transfer(Discretization<dim>& discretization,
                         const CaseDescription& description,
                         const std::vector<std::size_t>& fixed_boundaries,
                         const std::vector<Vector*>& fields) {
  std::vector<Vector> ghosted;
  ghosted.reserve(fields.size());
  for (const Vector* field : fields) {
    ghosted.push_back(discretization.ghosted_vector());
    ghosted.back() = *field;
  }
  std::vector<const Vector*> attached;
  for (const Vector& v : ghosted)
    attached.push_back(&v);
  parallel::distributed::SolutionTransfer<dim, Vector> transfer(
      discretization.dof_handler);
  discretization.triangulation.prepare_coarsening_and_refinement();
  transfer.prepare_for_coarsening_and_refinement(attached);
  discretization.triangulation.execute_coarsening_and_refinement();
  discretization.setup(description, fixed_boundaries);

  std::vector<Vector> moved;
  moved.reserve(fields.size());
  for (std::size_t i = 0; i < fields.size(); ++i)
    moved.push_back(discretization.owned_vector());
  std::vector<Vector*> targets;
  for (Vector& v : moved)
    targets.push_back(&v);
  transfer.interpolate(targets);
  // hanging nodes take the values of their parents' edges (the fixed-temperature
  // rows of discretization.constraints are homogeneous Newton-update constraints:
  // these nodes keep the interpolated values, which are their boundary values)
  AffineConstraints<double> hanging(discretization.relevant_dofs);
  DoFTools::make_hanging_node_constraints(discretization.dof_handler, hanging);
  hanging.close();
  for (std::size_t i = 0; i < fields.size(); ++i) {
    hanging.distribute(moved[i]);
    *fields[i] = std::move(moved[i]);
  }
}

template dealii::Vector<float> temperature_indicator<2>(const Discretization<2>&,
                                                        const Vector&);
template dealii::Vector<float> temperature_indicator<3>(const Discretization<3>&,
                                                        const Vector&);
template RemeshMarks mark_cells<2>(Discretization<2>&, const Vector&,
                                   const AdaptivitySpec&, unsigned int);
template RemeshMarks mark_cells<3>(Discretization<3>&, const Vector&,
                                   const AdaptivitySpec&, unsigned int);
template void refine_and_transfer<2>(Discretization<2>&, const CaseDescription&,
                                     const std::vector<std::size_t>&,
                                     const std::vector<Vector*>&);
template void refine_and_transfer<3>(Discretization<3>&, const CaseDescription&,
                                     const std::vector<std::size_t>&,
                                     const std::vector<Vector*>&);

} // namespace quantacal::solver::detail
