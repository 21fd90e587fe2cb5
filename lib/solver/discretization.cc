// SPDX-License-Identifier: Apache-2.0
// The discretization of a case: degrees of freedom, constraints, sparsity,
// initial field.
#include "discretization.h"

#include <deal.II/base/mpi.h>
#include <deal.II/dofs/dof_tools.h>
#include <deal.II/lac/dynamic_sparsity_pattern.h>
#include <deal.II/lac/sparsity_tools.h>

#include <set>

namespace quantacal::solver::detail {
namespace {

using namespace dealii;

/**
 * Constrains every node of the boundaries @p fixed (indices into description.boundaries)
 * and returns the owned ones with their boundary condition.
 */
template <int dim>
std::vector<std::pair<types::global_dof_index, std::size_t>>
constrain_fixed_temperatures(const CaseDescription& description,
                             const DoFHandler<dim>& dofs, const IndexSet& owned,
                             const std::vector<std::size_t>& fixed,
                             AffineConstraints<double>& constraints) {
  std::set<types::boundary_id> fixed_ids;
  for (const std::size_t b : fixed)
    fixed_ids.insert(
        static_cast<types::boundary_id>(description.boundaries[b].boundary_id));
  if (fixed_ids.empty())
    return {};
  std::vector<types::global_dof_index> face_dofs(dofs.get_fe().n_dofs_per_face());
  std::map<types::global_dof_index, std::size_t> which;
  for (const auto& cell : dofs.active_cell_iterators()) {
    if (cell->is_artificial())
      continue;
    for (const auto& face : cell->face_iterators())
      if (face->at_boundary() && fixed_ids.count(face->boundary_id())) {
        face->get_dof_indices(face_dofs);
        std::size_t boundary = 0;
        for (const std::size_t candidate : fixed)
          if (description.boundaries[candidate].boundary_id == face->boundary_id())
            boundary = candidate;
        for (const auto i : face_dofs) {
          if (!constraints.is_constrained(i))
            constraints.add_line(i);
          if (owned.is_element(i))
            which[i] = boundary;
        }
      }
  }
  return std::vector<std::pair<types::global_dof_index, std::size_t>>(which.begin(),
                                                                      which.end());
}

} // namespace

template <int dim>
Discretization<dim>::Discretization(const CaseDescription& description, MPI_Comm comm)
    : communicator(comm), rank(Utilities::MPI::this_mpi_process(comm)),
      n_ranks(Utilities::MPI::n_mpi_processes(comm)),
      triangulation(comm, typename Triangulation<dim>::MeshSmoothing(
                              Triangulation<dim>::smoothing_on_refinement |
                              Triangulation<dim>::smoothing_on_coarsening)),
      fe(description.solver.degree), mapping(description.solver.degree),
      dof_handler(triangulation), cell_quadrature(description.solver.degree + 1),
      mass_quadrature(description.solver.degree + 1),
      face_quadrature(description.solver.degree + 1),
      lumped_mass(description.solver.mass == SolverSpec::Mass::lumped ||
                  (description.solver.mass == SolverSpec::Mass::automatic &&
                   description.solver.degree == 1)) {}

template <int dim>
void Discretization<dim>::setup(const CaseDescription& description,
                                const std::vector<std::size_t>& fixed_boundaries) {
  dof_handler.distribute_dofs(fe);
  owned_dofs = dof_handler.locally_owned_dofs();
  DoFTools::extract_locally_relevant_dofs(dof_handler, relevant_dofs);

  constraints.clear();
  constraints.reinit(relevant_dofs);
  DoFTools::make_hanging_node_constraints(dof_handler, constraints);
  has_hanging_nodes =
      Utilities::MPI::max(constraints.n_constraints() > 0 ? 1 : 0, communicator) > 0;
  fixed_dofs = constrain_fixed_temperatures(description, dof_handler, owned_dofs,
                                            fixed_boundaries, constraints);
  constraints.close();

  DynamicSparsityPattern pattern(relevant_dofs);
  DoFTools::make_sparsity_pattern(dof_handler, pattern, constraints, false);
  SparsityTools::distribute_sparsity_pattern(pattern, owned_dofs, communicator,
                                             relevant_dofs);
  jacobian.reinit(owned_dofs, owned_dofs, pattern, communicator);
}

template <int dim>
Vector Discretization<dim>::initial_temperature(
    const CaseDescription& description,
    const std::map<types::material_id, double>& by_material_id) const {
  std::map<types::global_dof_index, std::pair<types::material_id, double>> value;
  std::vector<types::global_dof_index> dofs(fe.n_dofs_per_cell());
  for (const auto& cell : dof_handler.active_cell_iterators()) {
    if (cell->is_artificial())
      continue;
    cell->get_dof_indices(dofs);
    const auto id = cell->material_id();
    const auto it = by_material_id.find(id);
    const double initial =
        it == by_material_id.end() ? description.initial_temperature : it->second;
    for (const auto i : dofs) {
      if (!owned_dofs.is_element(i))
        continue;
      const auto known = value.find(i);
      if (known == value.end() || id < known->second.first)
        value[i] = {id, initial};
    }
  }
  Vector temperature = owned_vector();
  for (const auto& [i, lowest] : value)
    temperature[i] = lowest.second;
  temperature.compress(VectorOperation::insert);
  return temperature;
}

template <int dim>
void Discretization<dim>::apply_fixed_temperatures(Vector& temperature,
                                                   const CaseDescription& description,
                                                   double time) const {
  for (const auto& [i, boundary] : fixed_dofs)
    temperature[i] = description.boundaries[boundary].temperature->value(time);
  temperature.compress(VectorOperation::insert);
}

template <int dim>
double Discretization<dim>::reaction_sum(const Vector& residual) const {
  double sum = 0.0;
  for (const auto& [i, boundary] : fixed_dofs)
    sum += residual[i];
  return Utilities::MPI::sum(sum, communicator);
}

template <int dim>
Vector Discretization<dim>::owned_vector() const {
  return Vector(owned_dofs, communicator);
}

template <int dim>
Vector Discretization<dim>::ghosted_vector() const {
  return Vector(owned_dofs, relevant_dofs, communicator);
}

template class Discretization<2>;
template class Discretization<3>;

} // namespace quantacal::solver::detail
