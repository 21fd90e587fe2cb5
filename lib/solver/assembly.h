// SPDX-License-Identifier: Apache-2.0
// Internal: assembly of the residual and the Jacobian of one implicit stage.
//
// Equation (energy form): d E(T)/dt = div(k(T) grad T) + q, E = rho e(T) per
// reference volume. Weak residual per test function phi_i, with w = 1 (planar,
// solid) or w = 2 pi r (axisymmetric):
//
//   M_i(T) = int w phi_i E(T)                      (stored energy)
//   F_i(T) = - int w k(T) grad T . grad phi_i + int_Gamma w q_b(T) phi_i
//            + int w q phi_i                       (heat flow)
//
// A stage solves M(T) - known - beta h F(T) = 0, whose Jacobian is
// dM/dT - beta h dF/dT: the capacity, dk/dT and the boundary derivatives (not
// symmetric, because of dk/dT). The stored energy is lumped at the nodes or
// consistent on Gauss points (SolverSpec::Mass). The capacity form replaces
// E(T) by C(T) (T - T_ref) with C at the new temperature.
#ifndef QUANTACAL_LIB_SOLVER_ASSEMBLY_H
#define QUANTACAL_LIB_SOLVER_ASSEMBLY_H

#include "discretization.h"
#include "energy_ledger.h"

#include <quantacal/fe/material_field.h>
#include <quantacal/solver/solver.h>

#include <map>
#include <string>
#include <utility>
#include <vector>

namespace quantacal::solver::detail {

/** A failure inside a stage solve; the step is rejected and retried smaller. */
struct StageFailure {
  std::string reason;
};

template <int dim>
class Assembler {
public:
  /**
   * @param description the case (geometry, formulation, sources, boundaries)
   * @param discretization the mesh, element, constraints and Jacobian
   * @param field the materials by material id
   * @param energy_shift E(T_initial) per material id, J/m^3: subtracted inside the
   *        residual so that the assembled energies are small differences (less
   *        round-off); the ledger adds it back
   * @param natural_boundaries convection and radiation by boundary id
   * @param timings assembly and material_evaluation wall time are added here
   */
  Assembler(const CaseDescription& description, Discretization<dim>& discretization,
            const fe::MaterialField<dim>& field,
            std::map<dealii::types::material_id, double> energy_shift,
            std::map<dealii::types::boundary_id, std::size_t> natural_boundaries,
            PhaseTimes& timings);

  /**
   * Assembles M(T), F(T) and the round-off scale int w phi_i |E| at the ghosted
   * field @p temperature, and the Jacobian dM/dT - beta_h dF/dT if @p with_jacobian.
   * @param time s (sources switch on and off)
   * @param beta_h the stage's factor of F
   * @param capacity_reference T_ref of the capacity form (ghosted; ignored in energy
   * form)
   * @return the global sums (stored energy, boundary heat flow, source power, shift)
   * @throws StageFailure if a material cannot be evaluated (temperature outside its
   *         range, not positive, not finite), with the first message of the lowest rank
   */
  AssembledSums assemble(const Vector& temperature, double time, double beta_h,
                         const Vector* capacity_reference, bool with_jacobian);

  /** M(T) of the last assembly. */
  const Vector& stored_energy() const { return stored_energy_; }
  /** F(T) of the last assembly. */
  const Vector& heat_flow() const { return heat_flow_; }
  /** int w phi_i |E(T)| of the last assembly (E without the shift): round-off scale. */
  const Vector& absolute_energy() const { return absolute_energy_; }

private:
  struct CellScratch;
  using Cell = typename dealii::DoFHandler<dim>::active_cell_iterator;

  void reset(bool with_jacobian);
  void gather_temperatures(const Cell& cell, const Vector& temperature,
                           const Vector* capacity_reference, CellScratch& scratch) const;
  void evaluate_materials(const Cell& cell, CellScratch& scratch) const;
  double source_density(dealii::types::material_id id, double time) const;
  /** The lumped weights of each material at its owned nodes (NodalMass). */
  void build_nodal_masses();
  /** @p weights with each hanging node's entry moved to its parents. */
  Vector condense_hanging(const Vector& weights) const;
  void add_lumped_energy(const Vector& temperature, const Vector* capacity_reference,
                         bool with_jacobian, AssembledSums& sums, bool& failed,
                         std::string& message);
  void add_consistent_energy(const Cell& cell, double shift, bool with_jacobian,
                             CellScratch& scratch, AssembledSums& sums) const;
  void add_conduction_and_source(double source, double beta_h, bool with_jacobian,
                                 CellScratch& scratch, AssembledSums& sums) const;
  void add_natural_boundaries(const Cell& cell, const Vector& temperature, double beta_h,
                              bool with_jacobian, CellScratch& scratch,
                              AssembledSums& sums) const;
  void distribute(const Cell& cell, bool with_jacobian, CellScratch& scratch);
  AssembledSums global_sums(const AssembledSums& local, bool failed,
                            std::string message) const;
  /** w: 2 pi r for an axisymmetric case, else 1. */
  double weight(const dealii::Point<dim>& point) const;

  const CaseDescription& description_;
  Discretization<dim>& discretization_;
  const fe::MaterialField<dim>& field_;
  const std::map<dealii::types::material_id, double> energy_shift_;
  const std::map<dealii::types::boundary_id, std::size_t> natural_boundaries_;
  PhaseTimes& timings_;
  const bool axisymmetric_;
  const bool capacity_form_;
  Vector stored_energy_, heat_flow_, absolute_energy_;

  /**
   * Lumped stored energy, one material: M_i += m_i E(T_i) at its locally owned
   * nodes, with m_i = int w phi_i over the material's cells (on every rank, summed
   * at the owner). Evaluated node by node in one batch per material instead of
   * once per adjacent cell (8 times per node in 3D).
   */
  struct NodalMass {
    dealii::types::material_id id = 0;
    double shift = 0.0; ///< E(T_initial), J/m^3, as energy_shift_
    std::vector<dealii::types::global_dof_index> dofs;
    std::vector<double> weights;   ///< m_i, m^3 (w-weighted)
    std::vector<char> constrained; ///< 1 for a fixed-temperature node
    std::vector<double> temperature, reference, energy, absolute;
    fe::PointProperties properties;
  };
  std::vector<NodalMass> nodal_masses_;
};

/**
 * Heat flux into the body through a convection and radiation boundary at surface
 * temperature @p surface, W/m^2, and its derivative with respect to @p surface.
 */
std::pair<double, double> boundary_heat_flux(const BoundarySpec& boundary,
                                             double surface);

} // namespace quantacal::solver::detail

#endif
