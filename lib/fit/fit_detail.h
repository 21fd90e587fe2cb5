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

} // namespace quantacal::fit::detail

#endif
