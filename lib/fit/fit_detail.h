// SPDX-License-Identifier: Apache-2.0
// Internal helpers of the fit engine (not installed).
#ifndef QUANTACAL_LIB_FIT_DETAIL_H
#define QUANTACAL_LIB_FIT_DETAIL_H

#include <quantacal/fit/fit.h>

#include <memory>
#include <optional>
#include <string>
#include <vector>

namespace quantacal::fit::detail {

/** A whole string as a finite double, locale-free; nullopt otherwise. */
std::optional<double> parse_double(const std::string& text);

/** A model state: the heat-capacity model and the conductivity. */
struct ModelState {
  std::shared_ptr<const HeatCapacityModel> model;
  ConductivityPtr conductivity;
};

/** The model of @p start with @p parameters set to @p values (SI). */
ModelState apply(const Material& start, const std::vector<FreeParameter>& parameters,
                 const std::vector<double>& values);

/** The free parameters of @p parameters, each starting from the card's value. */
std::vector<FreeParameter> free_parameters(const std::vector<CardParameter>& parameters);

/**
 * Model value for one row in the row's unit (J/kg/K or J/mol/K, J/kg or J/mol,
 * W/m/K).
 */
double model_value(const ModelState& s, const DataPoint& p, double molar_mass);

/**
 * Fills r.diagnostics from the residual rows of @p r (runs test per observable,
 * chi-square check when @p has_sigma) and, when they flag, adds the warning with
 * the parameters of the fitted material r.material (not freed) that move the
 * flagged rows. Needs r.residuals, r.parameters, r.material and the statistics.
 */
void add_diagnostics(FitResult& r, bool has_sigma);

/** "c_p", "energy-increment" or "k". */
const char* observable_label(Observable kind);

/** The report's lines on r.diagnostics (runs test per observable, chi-square). */
std::string diagnostics_report(const FitResult& r);

} // namespace quantacal::fit::detail

#endif
