// SPDX-License-Identifier: Apache-2.0
// Internal: the gnuplot scripts of a run (docs/results.md, "Plots"), written next
// to probes.csv and energy.csv, each to be run in that folder:
//
//   cooling_curves.gp   T(t) of every probe, the windows as horizontal bands;
//   cooling_rates.gp    the cooling rate -dT/dt against T of every probe, the
//                       temperature falling to the right (the trade's habit), the
//                       windows as vertical bands;
//   energy_ledger.gp    the change of stored energy and the heat that entered
//                       (boundary and sources) against time, and the relative
//                       imbalance on a log scale.
//
// Each writes STEM.svg.tmp and STEM.png.tmp; the caller renames them (the library
// starts no program: `quantacal run` runs gnuplot). Temperatures are in the case's
// output unit, as in probes.csv. No deal.II here.
#ifndef QUANTACAL_LIB_SOLVER_RESULT_PLOTS_H
#define QUANTACAL_LIB_SOLVER_RESULT_PLOTS_H

#include <quantacal/solver/solver.h>

#include <string>

namespace quantacal::solver::detail {

/**
 * Writes the scripts into description.output.folder (atomically) and records them
 * in @p result: plot_scripts, plot_script (cooling_curves.gp, "" without probes)
 * and written_files. Without probes only energy_ledger.gp is written.
 */
void write_plot_scripts(const CaseDescription& description, RunResult& result);

/** @p text as a single-quoted gnuplot string ('' for a quote inside). */
std::string gnuplot_string(const std::string& text);

} // namespace quantacal::solver::detail

#endif
