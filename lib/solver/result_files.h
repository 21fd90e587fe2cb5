// SPDX-License-Identifier: Apache-2.0
// Internal: the result files of a run other than the fields (no deal.II):
// probes.csv, energy.csv, summary.yaml and the gnuplot script of the cooling
// curves. Every file is written to a temporary name in the same folder and
// renamed (quantacal::write_file_atomically), so a crash never leaves a
// truncated file behind.
#ifndef QUANTACAL_LIB_SOLVER_RESULT_FILES_H
#define QUANTACAL_LIB_SOLVER_RESULT_FILES_H

#include <quantacal/common/files.h>
#include <quantacal/solver/solver.h>

#include <string>
#include <vector>

namespace quantacal::solver::detail {

/** Checks that @p folder exists or can be made, and can be written; throws InputError
 * at @p where. */
void prepare_output_folder(const std::string& folder, const std::string& case_file,
                           const CaseLocation& where);

/** probes.csv text: header time_s then one column per probe, K. */
std::string probes_csv(const RunResult& result);

/** energy.csv text:
 * time_s,stored_energy_J,boundary_heat_J,source_heat_J,relative_imbalance. */
std::string energy_csv(const RunResult& result);

/** summary.yaml text. */
std::string summary_yaml(const CaseDescription& description, const RunResult& result);

/** First crossing of each requested temperature by each probe, and the rate there. */
std::vector<Crossing> find_crossings(const RunResult& result,
                                     const std::vector<double>& temperatures);

/**
 * Writes the gnuplot script cooling_curves.gp next to probes.csv: run in that
 * folder, it plots every probe history into cooling_curves.svg.tmp. Nothing is
 * written without probes.
 * @return the script's path (also appended to @p written), or "" if none was written
 */
std::string write_plot_script(const std::string& folder, const RunResult& result,
                              const std::string& title,
                              std::vector<std::string>& written);

/** Shortest round-trip text of a double. */
std::string number(double value);

/** @p text as a double-quoted YAML scalar (\" and \\ escaped). */
std::string quoted(const std::string& text);

} // namespace quantacal::solver::detail

#endif
