// SPDX-License-Identifier: Apache-2.0
// Internal: adaptive refinement and coarsening of the mesh of a run
// (AdaptivitySpec, docs/cases.md "Adaptive meshes"): the cells to refine and
// coarsen from the temperature field, and the move of the level vectors onto
// the new mesh.
#ifndef QUANTACAL_LIB_SOLVER_REMESH_H
#define QUANTACAL_LIB_SOLVER_REMESH_H

#include "discretization.h"

#include <vector>

namespace quantacal::solver::detail {

/** What a call of mark_cells decided, counted over all ranks. */
struct RemeshMarks {
  unsigned long long active = 0;  ///< active cells before
  unsigned long long refine = 0;  ///< cells flagged for refinement
  unsigned long long coarsen = 0; ///< cells flagged for coarsening
  double largest = 0.0;           ///< largest indicator, K
  bool any() const { return refine + coarsen > 0; }
};

/**
 * The indicator of each locally owned cell, K: the Kelly estimate eta_K of the
 * ghosted @p temperature (jumps of the normal gradient across the faces, deal.II's
 * KellyErrorEstimator) times h_K / sqrt(|K|), which is about half of h_K times the
 * jump of the normal gradient: a temperature error across the cell. Other cells: 0.
 */
template <int dim>
dealii::Vector<float> temperature_indicator(const Discretization<dim>& discretization,
                                            const Vector& temperature);

/**
 * Flags cells for refinement and coarsening (AdaptivitySpec): refine where the
 * indicator exceeds spec.refine_above below level @p base_level + spec.levels, the
 * largest first when the refinements would take the mesh past spec.max_cells;
 * coarsen where it is below spec.coarsen_below above @p base_level.
 */
template <int dim>
RemeshMarks mark_cells(Discretization<dim>& discretization, const Vector& temperature,
                       const AdaptivitySpec& spec, unsigned int base_level);

/**
 * Carries out the flagged refinement and coarsening, redoes the discretization's
 * setup (fixed-temperature boundaries @p fixed_boundaries) and moves each vector
 * of @p fields (owned entries; nodal temperatures) onto the new mesh by
 * interpolation, hanging nodes made conforming.
 */
template <int dim>
void refine_and_transfer(Discretization<dim>& discretization,
                         const CaseDescription& description,
                         const std::vector<std::size_t>& fixed_boundaries,
                         const std::vector<Vector*>& fields);

} // namespace quantacal::solver::detail

#endif
