// SPDX-License-Identifier: Apache-2.0
// Internal: the result files of a run other than the fields (no deal.II):
// probes.csv, energy.csv and summary.yaml (the crossings and windows in
// cooling_metrics.h, the gnuplot scripts in result_plots.h). Every file is written to a
// temporary name in the same folder and renamed (quantacal::write_file_atomically), so a
// crash never leaves a truncated file behind.
#ifndef QUANTACAL_LIB_SOLVER_RESULT_FILES_H
#define QUANTACAL_LIB_SOLVER_RESULT_FILES_H

#include "cooling_metrics.h"
#include "result_plots.h"
#include "temperature_scale.h"

#include <quantacal/common/files.h>
#include <quantacal/solver/solver.h>

#include <string>
#include <vector>

namespace quantacal::solver::detail {

/** Checks that @p folder exists or can be made, and can be written; throws InputError
 * at @p where. */
void prepare_output_folder(const std::string& folder, const std::string& case_file,
                           const CaseLocation& where);

/**
 * probes.csv text: `time [s]`, one temperature column per probe (`centre [degC]`,
 * in OutputSpec::temperature_unit), then one dT/dt column per probe
 * (`centre dT/dt [K/s]`, RunResult::probe_rates).
 */
std::string probes_csv(const CaseDescription& description, const RunResult& result);

/** energy.csv text:
 * time_s,stored_energy_J,boundary_heat_J,source_heat_J,remesh_change_J,
 * relative_imbalance. */
std::string energy_csv(const RunResult& result);

/** summary.yaml text. */
std::string summary_yaml(const CaseDescription& description, const RunResult& result);

/** Shortest round-trip text of a double. */
std::string number(double value);

/** @p text as a double-quoted YAML scalar (\" and \\ escaped). */
std::string quoted(const std::string& text);

} // namespace quantacal::solver::detail

#endif
