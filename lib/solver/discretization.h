// SPDX-License-Identifier: Apache-2.0
// Internal: the finite-element discretization of a case (deal.II step programs
// call this "setup"): the distributed mesh, FE_Q of the case's degree with its
// mapping and quadratures, the degrees of freedom each rank owns and sees, the
// constraints (fixed-temperature nodes), the sparsity of the Jacobian and the
// initial temperature field.
#ifndef QUANTACAL_LIB_SOLVER_DISCRETIZATION_H
#define QUANTACAL_LIB_SOLVER_DISCRETIZATION_H

#include <quantacal/solver/case.h>

#include <deal.II/base/index_set.h>
#include <deal.II/base/quadrature_lib.h>
#include <deal.II/distributed/tria.h>
#include <deal.II/dofs/dof_handler.h>
#include <deal.II/fe/fe_q.h>
#include <deal.II/fe/mapping_q.h>
#include <deal.II/lac/affine_constraints.h>
#include <deal.II/lac/trilinos_sparse_matrix.h>
#include <deal.II/lac/trilinos_vector.h>

#include <cstddef>
#include <map>
#include <utility>
#include <vector>

namespace quantacal::solver::detail {

using Vector = dealii::TrilinosWrappers::MPI::Vector;

template <int dim>
class Discretization {
public:
  /** The empty mesh and the element of @p description (built by build_mesh, then setup).
   */
  Discretization(const CaseDescription& description, MPI_Comm communicator);

  /**
   * Distributes the degrees of freedom, constrains the nodes of the fixed-temperature
   * boundaries @p fixed_boundaries (indices into description.boundaries) and makes the
   * Jacobian's sparsity.
   */
  void setup(const CaseDescription& description,
             const std::vector<std::size_t>& fixed_boundaries);

  /**
   * The initial field: each node takes the initial temperature of the lowest
   * material id among its cells (@p by_material_id, else the case's).
   */
  Vector initial_temperature(
      const CaseDescription& description,
      const std::map<dealii::types::material_id, double>& by_material_id) const;

  /** Sets the fixed-temperature nodes of @p temperature to their values at @p time. */
  void apply_fixed_temperatures(Vector& temperature, const CaseDescription& description,
                                double time) const;

  /** Sum over the fixed-temperature rows of @p residual (all ranks): the reaction heat.
   */
  double reaction_sum(const Vector& residual) const;

  /** A vector of the owned degrees of freedom. */
  Vector owned_vector() const;
  /** A vector of the owned degrees of freedom with ghosts (the relevant ones). */
  Vector ghosted_vector() const;

  MPI_Comm communicator;
  unsigned int rank = 0;
  unsigned int n_ranks = 1;
  dealii::parallel::distributed::Triangulation<dim> triangulation;
  dealii::FE_Q<dim> fe;
  dealii::MappingQ<dim> mapping;
  dealii::DoFHandler<dim> dof_handler;
  dealii::QGauss<dim> cell_quadrature;     ///< conduction and sources
  dealii::QGauss<dim> mass_quadrature;     ///< stored energy (consistent mass)
  dealii::QGauss<dim - 1> face_quadrature; ///< convection and radiation
  /// stored energy lumped at the nodes (else consistent on mass_quadrature)
  bool lumped_mass = true;
  dealii::IndexSet owned_dofs;
  dealii::IndexSet relevant_dofs;
  dealii::AffineConstraints<double> constraints;
  /// the mesh has hanging nodes somewhere (on any rank): an adapted mesh
  bool has_hanging_nodes = false;
  /// owned fixed-temperature nodes and the index of their boundary condition
  std::vector<std::pair<dealii::types::global_dof_index, std::size_t>> fixed_dofs;
  dealii::TrilinosWrappers::SparseMatrix jacobian;
};

} // namespace quantacal::solver::detail

#endif
