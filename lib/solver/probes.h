// SPDX-License-Identifier: Apache-2.0
// Internal: the probes of a case: each point is found once in the cell (and
// rank) that holds it; its temperature is then read from the finite-element
// field at every accepted step. The crossing times are found from the
// histories after the run (result_files.h).
#ifndef QUANTACAL_LIB_SOLVER_PROBES_H
#define QUANTACAL_LIB_SOLVER_PROBES_H

#include "discretization.h"

#include <deal.II/base/point.h>

#include <vector>

namespace quantacal::solver::detail {

template <int dim>
class ProbeSet {
public:
  /**
   * Locates every probe of @p description (collective).
   * @throws InputError at the probe for a point outside the mesh
   */
  ProbeSet(const CaseDescription& description, const Discretization<dim>& discretization);

  /** The temperature at each probe, K, of the ghosted field @p temperature (all ranks).
   */
  std::vector<double> values(const Vector& temperature) const;

  std::size_t size() const { return sites_.size(); }

private:
  struct Site {
    bool mine = false; ///< this rank holds the probe's cell
    typename dealii::DoFHandler<dim>::active_cell_iterator cell;
    dealii::Point<dim> unit; ///< the point in the cell's reference coordinates
  };
  /** The cell of this rank holding @p x, if any. */
  bool find(const dealii::Point<dim>& x, Site& site) const;

  const Discretization<dim>& discretization_;
  std::vector<Site> sites_;
};

} // namespace quantacal::solver::detail

#endif
