// SPDX-License-Identifier: Apache-2.0
// The temperature scale of the result files (temperature_scale.h).
#include "temperature_scale.h"

#include <quantacal/cards/units.h>

namespace quantacal::solver::detail {

const char* temperature_unit_name(TemperatureUnit unit) {
  switch (unit) {
  case TemperatureUnit::celsius:
    return "degC";
  case TemperatureUnit::fahrenheit:
    return "degF";
  default:
    return "K";
  }
}

TemperatureScale::TemperatureScale(TemperatureUnit unit)
    : symbol_(temperature_unit_name(unit)) {
  const Unit parsed = parse_unit(symbol_); // the card units' factor and offset
  scale_ = parsed.scale;
  offset_ = parsed.offset;
  rate_symbol_ = unit == TemperatureUnit::fahrenheit ? "degF/s" : "K/s";
}

std::string TemperatureScale::rate_key() const {
  return rate_symbol_ == "K/s" ? "K_per_s" : "degF_per_s";
}

} // namespace quantacal::solver::detail
