// SPDX-License-Identifier: Apache-2.0
// Internal: the mesh of a case: a Gmsh file or a built-in generator (plate,
// block, cylinder), its material ids (regions), and the global refinements.
#ifndef QUANTACAL_LIB_SOLVER_MESH_H
#define QUANTACAL_LIB_SOLVER_MESH_H

#include <quantacal/solver/case.h>

#include <deal.II/distributed/tria.h>

#include <set>
#include <string>

namespace quantacal::solver::detail {

/** The material ids of the cells and the boundary ids of the faces, over all ranks. */
struct MeshIds {
  std::set<unsigned int> materials;
  std::set<unsigned int> boundaries;
};

/**
 * Builds the mesh of @p description into the empty @p triangulation: cells get
 * their material ids (mesh.material_id, then mesh.regions by cell centre; the
 * physical tags of a Gmsh file) and boundary faces their boundary ids
 * (docs/cases.md lists them per generator).
 * @param saved_forest empty: refine the coarse mesh mesh.refinements times; else
 *        the file a checkpoint saved the refined mesh to
 *        (parallel::distributed::Triangulation::save), loaded onto the coarse mesh
 *        (on any number of ranks), with the data attached to it for
 *        SolutionTransfer::deserialize
 * @throws InputError at mesh.file for a missing or unreadable Gmsh file, at mesh
 *         for an axisymmetric mesh with r < 0
 */
template <int dim>
void build_mesh(const CaseDescription& description,
                dealii::parallel::distributed::Triangulation<dim>& triangulation,
                const std::string& saved_forest = "");

/** The ids present in @p triangulation (collective over its communicator). */
template <int dim>
MeshIds
find_mesh_ids(const dealii::parallel::distributed::Triangulation<dim>& triangulation);

} // namespace quantacal::solver::detail

#endif
