// SPDX-License-Identifier: Apache-2.0
// Internal: output files of a run (no deal.II). Every file is written to a
// temporary name in the same folder and renamed, so a crash never leaves a
// truncated file behind.
#ifndef QUANTACAL_LIB_FE_REPORT_H
#define QUANTACAL_LIB_FE_REPORT_H

#include <quantacal/solver/solver.h>

#include <string>
#include <vector>

namespace quantacal::fe::detail {

/** Writes @p content to @p path through "<path>.tmp" and a rename; throws
 * std::ios_base::failure. */
void write_file_atomically(const std::string& path, const std::string& content);

/** Checks that @p folder exists or can be made, and can be written; throws CardError at
 * @p where. */
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
 * Writes cooling_curves.gp next to probes.csv and runs gnuplot for
 * cooling_curves.svg. Returns "" on success or a warning text (gnuplot
 * missing or failing never fails the run).
 */
std::string plot_cooling_curves(const std::string& folder, const RunResult& result,
                                const std::string& title,
                                std::vector<std::string>& written);

/** Shortest round-trip text of a double. */
std::string number(double value);

} // namespace quantacal::fe::detail

#endif
