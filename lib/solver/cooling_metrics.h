// SPDX-License-Identifier: Apache-2.0
// Internal: what a heat-treater reads from the probe histories after a run
// (docs/results.md): the first crossing of each requested temperature with the
// rate there, and the passage through each temperature window (time inside, mean
// and largest cooling rate); and the per-probe part of summary.yaml in the case's
// temperature unit. Between samples a history is linear in time and the solver's
// rates (RunResult::probe_rates, cooling_rates.h) are interpolated linearly in
// time. No deal.II here.
#ifndef QUANTACAL_LIB_SOLVER_COOLING_METRICS_H
#define QUANTACAL_LIB_SOLVER_COOLING_METRICS_H

#include "temperature_scale.h"

#include <quantacal/solver/solver.h>

#include <string>
#include <vector>

namespace quantacal::solver::detail {

/** First crossing of each requested temperature by each probe, and dT/dt there. */
std::vector<Crossing> find_crossings(const RunResult& result,
                                     const std::vector<double>& temperatures);

/** The passage of each probe through each window (probe-major order). */
std::vector<WindowPassage>
find_window_passages(const RunResult& result,
                     const std::vector<TemperatureWindow>& windows);

/**
 * The `probes:` block of summary.yaml: per probe the final temperature, the
 * crossings and the window passages, temperatures in @p scale.
 */
std::string probe_summary_yaml(const RunResult& result, const TemperatureScale& scale);

} // namespace quantacal::solver::detail

#endif
