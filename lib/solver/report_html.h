// SPDX-License-Identifier: Apache-2.0
// Internal: the parts of report.html (write_report in solver.h; docs/results.md,
// "Report"). The page is one self-contained file: inline CSS, the plots as
// data: URIs, no scripts and no external links. Every number of a metrics table
// carries, for programs, its place in summary.yaml and its exact value
// (data-key = the path as a JSON array, data-value = the number as summary.yaml
// writes it); the cell's text is the same number to 4 significant digits. No
// deal.II here.
#ifndef QUANTACAL_LIB_SOLVER_REPORT_HTML_H
#define QUANTACAL_LIB_SOLVER_REPORT_HTML_H

#include "temperature_scale.h"

#include <quantacal/solver/solver.h>

#include <string>
#include <vector>

namespace quantacal::solver::detail {

/** @p value to 4 significant digits, without an exponent from 1e4 to 1e9. */
std::string display_number(double value);

/** One element of a summary.yaml path: a key or a list index. */
struct PathPart {
  std::string key;
  long index = -1; ///< >= 0: a list index
};

/**
 * A table cell with a number of summary.yaml: `<td class="num" data-key=...
 * data-value=...>` and the value to 4 significant digits (@p shown, in the unit of
 * the summary).
 */
std::string number_cell(const std::vector<PathPart>& path, double shown);

/** A table cell with text (escaped). */
std::string text_cell(const std::string& text);

// The sections, each `<section id="ID">` with its heading (ids in brackets).
/** Materials with their card, valid range and sources [materials]. */
std::string materials_section(const CaseDescription& description,
                              const TemperatureScale& scale);
/** Boundary conditions [boundaries]. */
std::string boundaries_section(const CaseDescription& description,
                               const TemperatureScale& scale);
/** Mesh size and ranks [mesh]. */
std::string mesh_section(const CaseDescription& description, const RunResult& result);
/** Steps, iterations and wall time [solver]. */
std::string solver_section(const RunResult& result);
/** Final temperature and crossing times of every probe [glance]. */
std::string glance_section(const CaseDescription& description, const RunResult& result,
                           const TemperatureScale& scale);
/** The window passages [windows]. */
std::string windows_section(const RunResult& result, const TemperatureScale& scale);
/** The crossings with dT/dt there [crossings]. */
std::string crossings_section(const RunResult& result, const TemperatureScale& scale);
/** The closure of the energy ledger [ledger]. */
std::string ledger_section(const CaseDescription& description, const RunResult& result);

} // namespace quantacal::solver::detail

#endif
