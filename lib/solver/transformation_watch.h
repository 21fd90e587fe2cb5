// SPDX-License-Identifier: Apache-2.0
// Internal: watches the nodes of materials whose cards have phase changes with
// a latent heat. A card's transformation heat is the equilibrium one; a node
// that crosses a transformation join faster than 1 K/s is in a regime where the
// real transformation is undercooled or suppressed (not modelled), and the run
// says so once per transformation, with the fastest rate seen.
#ifndef QUANTACAL_LIB_SOLVER_TRANSFORMATION_WATCH_H
#define QUANTACAL_LIB_SOLVER_TRANSFORMATION_WATCH_H

#include "discretization.h"

#include <quantacal/material/material.h>

#include <cstdint>
#include <map>
#include <string>
#include <utility>
#include <vector>

namespace quantacal::solver::detail {

/** The rate above which a crossing is reported, K/s (common practice for "slow"). */
constexpr double equilibrium_rate_limit = 1.0;

template <int dim>
class TransformationWatch {
public:
  TransformationWatch(const Discretization<dim>& discretization,
                      const std::map<dealii::types::material_id, MaterialPtr>& materials);

  /** Records the crossings of one accepted step from @p before to @p after. */
  void step(const Vector& before, const Vector& after, double step, double end_time);

  /** The warnings (same on all ranks; collective). */
  std::vector<std::string> warnings() const;

  /**
   * Per watched transformation, the fastest rate (K/s, 0: none) and the time of
   * the first fast crossing (s, -1: none), reduced over the ranks (collective):
   * what a checkpoint saves.
   */
  std::vector<std::pair<double, double>> reduced_state() const;
  /** Sets every rank's record to @p state (from reduced_state()). */
  void restore(const std::vector<std::pair<double, double>>& state);

private:
  struct Watched {
    std::string material;
    std::string from_phase, to_phase;
    double temperature = 0.0; ///< K
    double lower = 0.0;       ///< join start, K
    double upper = 0.0;       ///< join end, K
    double fastest = 0.0;     ///< K/s, above the limit (0: none)
    double first_time = -1.0; ///< s, of the first fast crossing (-1: none)
  };
  const Discretization<dim>& discretization_;
  std::vector<Watched> watched_;
  /// per owned dof (in owned_dofs order), a bit per entry of watched_
  std::vector<std::uint64_t> masks_;
};

} // namespace quantacal::solver::detail

#endif
