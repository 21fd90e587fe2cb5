// SPDX-License-Identifier: Apache-2.0
// The mesh of a case: Gmsh file or built-in generator, material ids, refinement.
#include "mesh.h"

#include "case_errors.h"

#include <deal.II/base/mpi.h>
#include <deal.II/grid/grid_generator.h>
#include <deal.II/grid/grid_in.h>
#include <deal.II/grid/grid_tools.h>
#include <deal.II/grid/manifold_lib.h>
#include <deal.II/grid/tria.h>

#include <algorithm>
#include <cmath>
#include <filesystem>
#include <fstream>
#include <limits>
#include <map>

namespace quantacal::solver::detail {
namespace {

using namespace dealii;

/** Coarse cells per direction by aspect ratio (1 along the shortest side, at most 64). */
std::vector<unsigned int> cells_by_aspect_ratio(const std::vector<double>& size) {
  const double smallest = *std::min_element(size.begin(), size.end());
  std::vector<unsigned int> repetitions;
  for (const double s : size)
    repetitions.push_back(std::max(
        1u, std::min(64u, static_cast<unsigned int>(std::lround(s / smallest)))));
  return repetitions;
}

template <int dim>
void read_gmsh_file(const CaseDescription& description,
                    Triangulation<dim>& triangulation) {
  const MeshSpec& mesh = description.mesh;
  if (!std::filesystem::exists(mesh.file))
    throw case_error(description, mesh.where, "mesh.file",
                     "an existing Gmsh .msh file (not found: " + mesh.file + ")");
  GridIn<dim> reader;
  reader.attach_triangulation(triangulation);
  std::ifstream file(mesh.file);
  if (!file)
    throw case_error(description, mesh.where, "mesh.file",
                     "a readable Gmsh .msh file (" + mesh.file + ")");
  try {
    reader.read_msh(file);
  } catch (const std::exception& e) {
    std::string what = e.what();
    if (what.size() > 600)
      what = what.substr(0, 600);
    throw case_error(description, mesh.where, "mesh.file",
                     "a " + std::to_string(dim) +
                         "D Gmsh .msh mesh that deal.II can read (" + mesh.file +
                         "): " + what);
  }
}

/** Plate (2D) or block (3D) from origin to origin + size, boundary ids by colour. */
template <int dim>
void build_box(const MeshSpec& mesh, Triangulation<dim>& triangulation) {
  Point<dim> lower, upper;
  for (int i = 0; i < dim; ++i) {
    const double origin = i < static_cast<int>(mesh.origin.size()) ? mesh.origin[i] : 0.0;
    lower[i] = origin;
    upper[i] = origin + mesh.size[i];
  }
  const std::vector<unsigned int> repetitions =
      mesh.cells.empty() ? cells_by_aspect_ratio(mesh.size) : mesh.cells;
  GridGenerator::subdivided_hyper_rectangle(triangulation, repetitions, lower, upper,
                                            /*colorize=*/true);
}

/** Axisymmetric cylinder: the rectangle r in [0, R], z in [0, L]. */
void build_cylinder(const MeshSpec& mesh, Triangulation<2>& triangulation) {
  const std::vector<unsigned int> repetitions =
      mesh.cells.empty() ? cells_by_aspect_ratio({mesh.radius, mesh.length}) : mesh.cells;
  GridGenerator::subdivided_hyper_rectangle(triangulation, repetitions, Point<2>(0, 0),
                                            Point<2>(mesh.radius, mesh.length), true);
  // deal.II colours 0: r = 0, 1: r = R, 2: z = 0, 3: z = L -> ours (case.h)
  const std::map<types::boundary_id, types::boundary_id> renumber{
      {0, 3}, {1, 0}, {2, 1}, {3, 2}};
  for (const auto& cell : triangulation.active_cell_iterators())
    for (const auto& face : cell->face_iterators())
      if (face->at_boundary())
        face->set_boundary_id(renumber.at(face->boundary_id()));
}

/** Solid cylinder: axis z, 0 <= z <= L, curved mantle (manifold 0). */
void build_cylinder(const MeshSpec& mesh, Triangulation<3>& triangulation) {
  Triangulation<3> serial;
  const unsigned int axial =
      mesh.cells.empty()
          ? std::max(1u,
                     static_cast<unsigned int>(std::lround(mesh.length / mesh.radius)))
          : mesh.cells[0];
  GridGenerator::subdivided_cylinder(serial, axial, mesh.radius, mesh.length / 2);
  // axis x -> z (cyclic permutation, orientation preserved), end x = -L/2 -> z = 0
  const double half = mesh.length / 2;
  GridTools::transform(
      [half](const Point<3>& x) { return Point<3>(x[1], x[2], x[0] + half); }, serial);
  serial.set_all_manifold_ids(numbers::flat_manifold_id);
  serial.set_all_manifold_ids_on_boundary(0, 0);
  triangulation.copy_triangulation(serial);
  triangulation.set_all_manifold_ids(numbers::flat_manifold_id);
  triangulation.set_all_manifold_ids_on_boundary(0, 0);
  triangulation.set_manifold(0, CylindricalManifold<3>(2));
}

/** Regions: the last box holding a cell's centre gives the cell its material id. */
template <int dim>
void assign_regions(const MeshSpec& mesh, Triangulation<dim>& triangulation) {
  for (const auto& cell : triangulation.active_cell_iterators()) {
    if (cell->is_artificial())
      continue;
    const Point<dim> centre = cell->center();
    for (const auto& region : mesh.regions) {
      bool inside = true;
      for (int i = 0; i < dim; ++i)
        inside = inside && centre[i] >= region.lower[i] && centre[i] <= region.upper[i];
      if (inside)
        cell->set_material_id(static_cast<types::material_id>(region.material_id));
    }
  }
}

/** x = r >= 0 on every rank's cells (to round-off). */
template <int dim>
void check_axisymmetric(const CaseDescription& description,
                        const parallel::distributed::Triangulation<dim>& triangulation) {
  double r_min = std::numeric_limits<double>::infinity();
  for (const auto& cell : triangulation.active_cell_iterators())
    if (cell->is_locally_owned())
      for (const unsigned int v : cell->vertex_indices())
        r_min = std::min(r_min, cell->vertex(v)[0]);
  r_min = Utilities::MPI::min(r_min, triangulation.get_communicator());
  if (r_min < -1e-12)
    throw case_error(description, description.mesh.where, "mesh",
                     "an axisymmetric mesh with x = r >= 0 everywhere (found r = " +
                         format_double(r_min) + " m)");
}

} // namespace

template <int dim>
void build_mesh(const CaseDescription& description,
                parallel::distributed::Triangulation<dim>& triangulation,
                const std::string& saved_forest) {
  const MeshSpec& mesh = description.mesh;
  if (mesh.kind == MeshSpec::Kind::gmsh)
    read_gmsh_file(description, triangulation);
  else if (mesh.kind == MeshSpec::Kind::plate || mesh.kind == MeshSpec::Kind::block)
    build_box(mesh, triangulation);
  else
    build_cylinder(mesh, triangulation);
  if (mesh.kind != MeshSpec::Kind::gmsh)
    for (const auto& cell : triangulation.active_cell_iterators())
      cell->set_material_id(static_cast<types::material_id>(mesh.material_id));
  // the refinement: global, or as saved by a checkpoint (material ids, boundary
  // and manifold ids are inherited from the coarse cells either way)
  if (saved_forest.empty())
    triangulation.refine_global(mesh.refinements);
  else
    triangulation.load(saved_forest);
  if (mesh.kind != MeshSpec::Kind::gmsh && !mesh.regions.empty())
    assign_regions(mesh, triangulation);
  if (description.geometry == Geometry::axisymmetric)
    check_axisymmetric(description, triangulation);
}

template <int dim>
MeshIds find_mesh_ids(const parallel::distributed::Triangulation<dim>& triangulation) {
  MeshIds ids;
  for (const auto& cell : triangulation.active_cell_iterators())
    if (cell->is_locally_owned()) {
      ids.materials.insert(cell->material_id());
      for (const auto& face : cell->face_iterators())
        if (face->at_boundary())
          ids.boundaries.insert(face->boundary_id());
    }
  const MPI_Comm communicator = triangulation.get_communicator();
  ids.materials = Utilities::MPI::compute_set_union(ids.materials, communicator);
  ids.boundaries = Utilities::MPI::compute_set_union(ids.boundaries, communicator);
  return ids;
}

template void build_mesh<2>(const CaseDescription&,
                            parallel::distributed::Triangulation<2>&, const std::string&);
template void build_mesh<3>(const CaseDescription&,
                            parallel::distributed::Triangulation<3>&, const std::string&);
template MeshIds find_mesh_ids<2>(const parallel::distributed::Triangulation<2>&);
template MeshIds find_mesh_ids<3>(const parallel::distributed::Triangulation<3>&);

} // namespace quantacal::solver::detail
