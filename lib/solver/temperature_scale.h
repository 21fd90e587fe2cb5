// SPDX-License-Identifier: Apache-2.0
// Internal: the scale temperatures are written in (OutputSpec::temperature_unit):
// K, degC or degF, from the card parser's units (parse_unit), so the offsets and
// factors live in one place. Rates are intervals per second: K/s for K and degC
// (a degree Celsius is a kelvin wide), degF/s for degF. No deal.II here.
#ifndef QUANTACAL_LIB_SOLVER_TEMPERATURE_SCALE_H
#define QUANTACAL_LIB_SOLVER_TEMPERATURE_SCALE_H

#include <quantacal/solver/case.h>

#include <string>

namespace quantacal::solver::detail {

class TemperatureScale {
public:
  explicit TemperatureScale(TemperatureUnit unit);

  /** A temperature, K, in this scale. */
  double value(double kelvin) const { return kelvin / scale_ - offset_; }
  /** A temperature difference or a rate (per K), in this scale's degrees. */
  double interval(double kelvin) const { return kelvin / scale_; }

  /** "K", "degC" or "degF": in headers, labels and YAML keys. */
  const std::string& symbol() const { return symbol_; }
  /** The unit of a rate: "K/s" (K and degC) or "degF/s". */
  const std::string& rate_symbol() const { return rate_symbol_; }
  /** The rate unit in a YAML key: "K_per_s" or "degF_per_s". */
  std::string rate_key() const;

private:
  std::string symbol_, rate_symbol_;
  double scale_ = 1.0;  ///< K per degree
  double offset_ = 0.0; ///< degrees between the scale's zero and 0 K
};

/** "K", "degC" or "degF". */
const char* temperature_unit_name(TemperatureUnit unit);

} // namespace quantacal::solver::detail

#endif
