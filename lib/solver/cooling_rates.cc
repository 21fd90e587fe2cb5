// SPDX-License-Identifier: Apache-2.0
// Cooling rates at the probes from the TR-BDF2 stage values (cooling_rates.h).
#include "cooling_rates.h"

#include <cmath>
#include <limits>

namespace quantacal::solver::detail {

template <int dim>
std::vector<double> probe_rates(const Discretization<dim>& discretization,
                                const ProbeSet<dim>& probes, const Vector& start,
                                const Vector& stage, const Vector& end, double step,
                                const RateWeights& weights) {
  if (probes.size() == 0)
    return {};
  Vector rate(end);
  rate *= weights.end / step;
  rate.add(weights.stage / step, stage, weights.start / step, start);
  Vector ghosted = discretization.ghosted_vector();
  ghosted = rate;
  return probes.values(ghosted);
}

void append_rates(RunResult& result, const std::vector<double>& end_rates) {
  result.probe_rates.resize(end_rates.size());
  for (std::size_t p = 0; p < end_rates.size(); ++p) {
    auto& history = result.probe_rates[p];
    if (history.empty()) // t = 0
      history.push_back(std::numeric_limits<double>::quiet_NaN());
    history.push_back(end_rates[p]);
  }
}

template <int dim>
void record_step_rates(RunResult& result, const Discretization<dim>& discretization,
                       const ProbeSet<dim>& probes, const Vector& start,
                       const Vector& stage, const Vector& end, double step) {
  append_rates(result, probe_rates(discretization, probes, start, stage, end, step,
                                   end_rate_weights()));
}

template void record_step_rates<2>(RunResult&, const Discretization<2>&,
                                   const ProbeSet<2>&, const Vector&, const Vector&,
                                   const Vector&, double);
template void record_step_rates<3>(RunResult&, const Discretization<3>&,
                                   const ProbeSet<3>&, const Vector&, const Vector&,
                                   const Vector&, double);
template std::vector<double> probe_rates<2>(const Discretization<2>&, const ProbeSet<2>&,
                                            const Vector&, const Vector&, const Vector&,
                                            double, const RateWeights&);
template std::vector<double> probe_rates<3>(const Discretization<3>&, const ProbeSet<3>&,
                                            const Vector&, const Vector&, const Vector&,
                                            double, const RateWeights&);

} // namespace quantacal::solver::detail
