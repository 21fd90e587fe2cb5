// SPDX-License-Identifier: Apache-2.0
// Fast crossings of equilibrium transformations (see transformation_watch.h).
#include "transformation_watch.h"

#include <quantacal/common/format.h>

#include <deal.II/base/mpi.h>

#include <algorithm>
#include <cmath>
#include <iomanip>
#include <limits>
#include <sstream>

namespace quantacal::solver::detail {

using namespace dealii;

template <int dim>
TransformationWatch<dim>::TransformationWatch(
    const Discretization<dim>& discretization,
    const std::map<types::material_id, MaterialPtr>& materials)
    : discretization_(discretization) {
  std::map<types::material_id, std::uint64_t> bits;
  for (const auto& [id, material] : materials) {
    const auto& layout = material->data().phase_layout;
    if (!layout)
      continue;
    const auto& phases = material->data().phases;
    const auto& boundaries = layout->boundaries();
    for (std::size_t i = 0; i < boundaries.size(); ++i) {
      if (!(boundaries[i].latent_heat > 0.0) || watched_.size() == 64)
        continue;
      Watched w;
      w.material = material->name();
      w.from_phase = phases[i].name;
      w.to_phase = phases[i + 1].name;
      w.temperature = boundaries[i].temperature;
      w.lower = boundaries[i].temperature - 0.5 * boundaries[i].width;
      w.upper = boundaries[i].temperature + 0.5 * boundaries[i].width;
      bits[id] |= std::uint64_t(1) << watched_.size();
      watched_.push_back(w);
    }
  }
  if (watched_.empty())
    return;
  masks_.assign(discretization.owned_dofs.n_elements(), 0);
  std::vector<types::global_dof_index> dofs(discretization.fe.n_dofs_per_cell());
  for (const auto& cell : discretization.dof_handler.active_cell_iterators()) {
    if (!cell->is_locally_owned())
      continue;
    const auto it = bits.find(cell->material_id());
    if (it == bits.end())
      continue;
    cell->get_dof_indices(dofs);
    for (const auto d : dofs)
      if (discretization.owned_dofs.is_element(d))
        masks_[discretization.owned_dofs.index_within_set(d)] |= it->second;
  }
}

template <int dim>
void TransformationWatch<dim>::step(const Vector& before, const Vector& after,
                                    double step, double end_time) {
  if (watched_.empty())
    return;
  std::size_t k = 0;
  for (const auto i : discretization_.owned_dofs) {
    const std::uint64_t mask = masks_[k++];
    if (mask == 0)
      continue;
    const double a = before[i], b = after[i];
    const double rate = std::abs(b - a) / step;
    if (!(rate > equilibrium_rate_limit))
      continue;
    for (std::size_t w = 0; w < watched_.size(); ++w) {
      if (!(mask & (std::uint64_t(1) << w)))
        continue;
      Watched& x = watched_[w];
      if (std::max(a, b) < x.lower || std::min(a, b) > x.upper)
        continue;
      x.fastest = std::max(x.fastest, rate);
      if (x.first_time < 0.0)
        x.first_time = end_time;
    }
  }
}

template <int dim>
std::vector<std::string> TransformationWatch<dim>::warnings() const {
  std::vector<std::string> out;
  const MPI_Comm comm = discretization_.communicator;
  for (const Watched& x : watched_) {
    const double fastest = Utilities::MPI::max(x.fastest, comm);
    const double first = Utilities::MPI::min(
        x.first_time < 0.0 ? std::numeric_limits<double>::infinity() : x.first_time,
        comm);
    if (!(fastest > 0.0))
      continue;
    std::ostringstream text;
    text << x.material << ": " << x.from_phase << " -> " << x.to_phase << " at "
         << format_double(x.temperature) << " K crossed at up to "
         << format_double(std::round(fastest * 10.0) / 10.0)
         << " K/s (first at t = " << std::setprecision(3) << first
         << " s); the card's transformation heat is the "
         << "equilibrium (slow, under " << format_double(equilibrium_rate_limit)
         << " K/s) one: at this rate the transformation is undercooled or suppressed, "
         << "which is not modelled, so temperatures near " << format_double(x.temperature)
         << " K and the heat released there are estimates";
    out.push_back(text.str());
  }
  return out;
}

template <int dim>
std::vector<std::pair<double, double>> TransformationWatch<dim>::reduced_state() const {
  std::vector<std::pair<double, double>> out;
  const MPI_Comm comm = discretization_.communicator;
  for (const Watched& x : watched_) {
    const double fastest = Utilities::MPI::max(x.fastest, comm);
    const double first = Utilities::MPI::min(
        x.first_time < 0.0 ? std::numeric_limits<double>::infinity() : x.first_time,
        comm);
    out.emplace_back(fastest, std::isfinite(first) ? first : -1.0);
  }
  return out;
}

template <int dim>
void TransformationWatch<dim>::restore(
    const std::vector<std::pair<double, double>>& state) {
  AssertThrow(state.size() == watched_.size(),
              ExcMessage("the checkpoint watches another number of transformations"));
  for (std::size_t w = 0; w < watched_.size(); ++w) {
    watched_[w].fastest = state[w].first;
    watched_[w].first_time = state[w].second;
  }
}

template class TransformationWatch<2>;
template class TransformationWatch<3>;

} // namespace quantacal::solver::detail
