// SPDX-License-Identifier: Apache-2.0
// Parameter checks of the make_* factories (internal to the model layer).
// Each failure is an InputError (a std::invalid_argument) whose text names the
// contribution, the parameter, its value with unit and what is expected, e.g.
//   "debye: theta_D = -3 K: expected > 0 K"
// The card loader turns it into a located CardError.
#ifndef QUANTACAL_LIB_MODELS_VALIDATION_H
#define QUANTACAL_LIB_MODELS_VALIDATION_H

#include <quantacal/common/exceptions.h>

#include <cmath>
#include <stdexcept>
#include <string>

namespace quantacal {
namespace detail {

inline std::string with_unit(const std::string& number, const std::string& unit) {
  return unit.empty() || unit == "1" ? number : number + " " + unit;
}

[[noreturn]] inline void invalid_parameter(const std::string& kind,
                                           const std::string& name, double value,
                                           const std::string& unit,
                                           const std::string& expected) {
  throw InputError::argument(kind, name, with_unit(format_double(value), unit), expected);
}

/** Requires a finite value > 0. */
inline void require_positive(const std::string& kind, const std::string& name,
                             double value, const std::string& unit) {
  if (!std::isfinite(value))
    invalid_parameter(kind, name, value, unit,
                      "a finite value > " + with_unit("0", unit));
  if (!(value > 0.0))
    invalid_parameter(kind, name, value, unit, "> " + with_unit("0", unit));
}

/** Requires a finite value >= 0. */
inline void require_non_negative(const std::string& kind, const std::string& name,
                                 double value, const std::string& unit) {
  if (!std::isfinite(value))
    invalid_parameter(kind, name, value, unit,
                      "a finite value >= " + with_unit("0", unit));
  if (!(value >= 0.0))
    invalid_parameter(kind, name, value, unit, ">= " + with_unit("0", unit));
}

/** Requires a finite value. */
inline void require_finite(const std::string& kind, const std::string& name, double value,
                           const std::string& unit) {
  if (!std::isfinite(value))
    invalid_parameter(kind, name, value, unit, "a finite value");
}

[[noreturn]] inline void unknown_parameter(const std::string& kind,
                                           const std::string& name,
                                           const std::string& known) {
  throw InputError::argument(
      kind, "", "", "no parameter named \"" + name + "\" (parameters: " + known + ")");
}

} // namespace detail
} // namespace quantacal

#endif
