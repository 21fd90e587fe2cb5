// SPDX-License-Identifier: Apache-2.0
// Internal: the case bound to its mesh. Every material id of the mesh must have
// a card and an initial temperature inside its valid range; every boundary
// condition must name a boundary id of the mesh. Ids of the case not in the
// mesh, and boundary ids without a condition (insulated), are noted in the log.
#ifndef QUANTACAL_LIB_SOLVER_MESH_BINDING_H
#define QUANTACAL_LIB_SOLVER_MESH_BINDING_H

#include "mesh.h"
#include "run_log.h"

#include <quantacal/solver/case.h>

#include <deal.II/base/types.h>

#include <cstddef>
#include <map>
#include <vector>

namespace quantacal::solver::detail {

/** The materials of the mesh's material ids, and their initial temperatures. */
struct MaterialBinding {
  std::map<dealii::types::material_id, MaterialPtr> materials;
  std::map<dealii::types::material_id, double> initial_temperatures; ///< K
};

/** Which boundary conditions apply where. */
struct BoundaryBinding {
  /// indices into CaseDescription::boundaries of the fixed temperatures
  std::vector<std::size_t> fixed;
  /// convection and radiation: boundary id -> index into CaseDescription::boundaries
  std::map<dealii::types::boundary_id, std::size_t> natural;
};

/**
 * Loads the card of every material id of the mesh (unless the case holds the
 * material already).
 * @throws InputError for a missing card file, a mesh material id without a card,
 *         an initial temperature outside a material's valid range
 */
MaterialBinding bind_materials(const CaseDescription& description, const MeshIds& mesh,
                               const RunLog& log);

/**
 * Sorts the boundary conditions into fixed temperatures and natural conditions.
 * @throws InputError for a boundary id not in the mesh, a condition on the axis of
 *         an axisymmetric cylinder
 */
BoundaryBinding bind_boundaries(const CaseDescription& description, const MeshIds& mesh,
                                const RunLog& log);

} // namespace quantacal::solver::detail

#endif
