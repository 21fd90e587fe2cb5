// SPDX-License-Identifier: Apache-2.0
// Probes: located once, read at every accepted step (see probes.h).
#include "probes.h"

#include "case_errors.h"

#include <deal.II/base/bounding_box.h>
#include <deal.II/base/mpi.h>
#include <deal.II/fe/fe_values.h>
#include <deal.II/fe/mapping.h>

namespace quantacal::solver::detail {

using namespace dealii;

template <int dim>
ProbeSet<dim>::ProbeSet(const CaseDescription& description,
                        const Discretization<dim>& discretization)
    : discretization_(discretization) {
  const auto& probes = description.output.probes;
  sites_.assign(probes.size(), Site{});
  for (std::size_t p = 0; p < probes.size(); ++p) {
    Point<dim> x;
    for (int i = 0; i < dim; ++i)
      x[i] = probes[p].point[i];
    const bool found = find(x, sites_[p]);
    const unsigned int owner =
        Utilities::MPI::min(found ? discretization.rank : discretization.n_ranks,
                            discretization.communicator);
    if (owner == discretization.n_ranks) {
      std::string text;
      for (int i = 0; i < dim; ++i)
        text += (i ? ", " : "") + format_double(x[i]) + " m";
      throw case_error(description, probes[p].where, "output.probes",
                       "a probe point inside the mesh (" + probes[p].name + " at (" +
                           text + ") is outside)");
    }
    sites_[p].mine = owner == discretization.rank;
  }
}

template <int dim>
bool ProbeSet<dim>::find(const Point<dim>& x, Site& site) const {
  for (const auto& cell : discretization_.dof_handler.active_cell_iterators()) {
    if (!cell->is_locally_owned())
      continue;
    // cheap bounding-box test first
    const BoundingBox<dim> box = cell->bounding_box();
    bool near = true;
    for (int i = 0; i < dim; ++i) {
      const double pad = 1e-9 * (box.get_boundary_points().second[i] -
                                 box.get_boundary_points().first[i]) +
                         1e-14;
      near = near && x[i] >= box.get_boundary_points().first[i] - pad &&
             x[i] <= box.get_boundary_points().second[i] + pad;
    }
    if (!near)
      continue;
    try {
      const Point<dim> unit =
          discretization_.mapping.transform_real_to_unit_cell(cell, x);
      if (GeometryInfo<dim>::is_inside_unit_cell(unit, 1e-9)) {
        site.cell = cell;
        site.unit = GeometryInfo<dim>::project_to_unit_cell(unit);
        return true;
      }
    } catch (const typename Mapping<dim>::ExcTransformationFailed&) {
    }
  }
  return false;
}

template <int dim>
std::vector<double> ProbeSet<dim>::values(const Vector& temperature) const {
  std::vector<double> here(sites_.size(), 0.0);
  for (std::size_t p = 0; p < sites_.size(); ++p)
    if (sites_[p].mine) {
      const Quadrature<dim> point(std::vector<Point<dim>>{sites_[p].unit},
                                  std::vector<double>{1.0});
      FEValues<dim> fe_values(discretization_.mapping, discretization_.fe, point,
                              update_values);
      fe_values.reinit(sites_[p].cell);
      std::vector<double> value(1);
      fe_values.get_function_values(temperature, value);
      here[p] = value[0];
    }
  std::vector<double> sums(here.size(), 0.0);
  if (!here.empty())
    Utilities::MPI::sum(here, discretization_.communicator, sums);
  return sums;
}

template class ProbeSet<2>;
template class ProbeSet<3>;

} // namespace quantacal::solver::detail
