// SPDX-License-Identifier: Apache-2.0
// `quantacal fit`: one-sigma bands from the covariance of a fitted card's `fit` record.
#include "fit_detail.h"
#include <quantacal/fit/fit.h>

#include <quantacal/common/exceptions.h>

#include <algorithm>
#include <cmath>

namespace quantacal::fit {
namespace {

/** The material with @p parameters set to @p values. */
MaterialPtr with_values(const Material& material,
                        const std::vector<FreeParameter>& parameters,
                        const std::vector<double>& values) {
  const detail::ModelState s = detail::apply(material, parameters, values);
  MaterialData d = material.data();
  d.model = s.model;
  d.conductivity = s.conductivity;
  return std::make_shared<const Material>(std::move(d));
}

/** The record's parameters, resolved against @p material, after checking the record. */
std::vector<FreeParameter> recorded_parameters(const Material& material) {
  const std::optional<FitRecord>& record = material.data().fit;
  if (!record)
    throw InputError(material.data().file, 0, 0, "fit", "",
                     "no `fit` record: a band needs a card written by quantacal fit");
  const std::vector<FreeParameter> parameters = detail::free_parameters(
      resolve_card_parameters(material, record->parameters, "quantacal::fit::band"));
  const std::size_t m = parameters.size();
  bool square = record->covariance.size() == m;
  for (const auto& row : record->covariance)
    square = square && row.size() == m;
  if (!square)
    throw InputError::argument("quantacal::fit::band", "", "",
                               "expected the fit record's covariance to be a " +
                                   std::to_string(m) + " x " + std::to_string(m) +
                                   " matrix, one row and column per parameter");
  return parameters;
}

} // namespace

BandRow band(const Material& material, double temperature, Basis basis) {
  const std::vector<FreeParameter> parameters = recorded_parameters(material);
  const std::vector<std::vector<double>>& covariance = material.data().fit->covariance;
  const std::size_t m = parameters.size();
  std::vector<double> values(m);
  for (std::size_t j = 0; j < m; ++j)
    values[j] = parameters[j].start; // resolved against the fitted card: the fitted value
  BandRow row;
  const ThermalState s = material.thermal_exact(temperature, basis);
  row.capacity = s.capacity;
  row.energy = s.energy;
  row.conductivity = material.conductivity_exact(temperature).value;
  std::vector<double> gc(m), ge(m), gk(m);
  for (std::size_t j = 0; j < m; ++j) {
    const double se = std::sqrt(covariance[j][j]);
    const double h = se > 0.0 ? 1e-3 * se : 1e-7 * std::max(std::abs(values[j]), 1e-30);
    std::vector<double> plus = values, minus = values;
    plus[j] += h;
    minus[j] -= h;
    const MaterialPtr a = with_values(material, parameters, plus);
    const MaterialPtr b = with_values(material, parameters, minus);
    const ThermalState sa = a->thermal_exact(temperature, basis);
    const ThermalState sb = b->thermal_exact(temperature, basis);
    gc[j] = (sa.capacity - sb.capacity) / (2 * h);
    ge[j] = (sa.energy - sb.energy) / (2 * h);
    // the models: a difference of two tables would be dominated by their tolerance
    gk[j] = (a->conductivity_exact(temperature).value -
             b->conductivity_exact(temperature).value) /
            (2 * h);
  }
  double vc = 0.0, ve = 0.0, vk = 0.0;
  for (std::size_t a = 0; a < m; ++a)
    for (std::size_t b = 0; b < m; ++b) {
      vc += gc[a] * covariance[a][b] * gc[b];
      ve += ge[a] * covariance[a][b] * ge[b];
      vk += gk[a] * covariance[a][b] * gk[b];
    }
  row.capacity_sigma = std::sqrt(std::max(0.0, vc));
  row.energy_sigma = std::sqrt(std::max(0.0, ve));
  row.conductivity_sigma = std::sqrt(std::max(0.0, vk));
  return row;
}

} // namespace quantacal::fit
