// SPDX-License-Identifier: Apache-2.0
/**
 * @file thermal_state.h
 * @brief The three numbers every heat-capacity model and table returns.
 */
#ifndef QUANTACAL_MODELS_THERMAL_STATE_H
#define QUANTACAL_MODELS_THERMAL_STATE_H

#include <quantacal/common/constants.h>

namespace quantacal {

/**
 * Energy, heat capacity and its temperature derivative at one temperature.
 *
 * Models and tables work per mole of formula units; a Material scales to per
 * kilogram or per cubic metre of the reference configuration.
 * The invariants are `capacity = d energy / dT` and
 * `capacity_derivative = d capacity / dT`, with `energy(0 K) = 0` unless a
 * card names another reference.
 */
struct ThermalState {
  double energy = 0.0;   ///< stored energy U(T), J/mol (or J/kg, J/m^3 on a basis)
  double capacity = 0.0; ///< heat capacity C(T) = dU/dT, J/mol/K
  double capacity_derivative = 0.0; ///< dC/dT, J/mol/K^2

  ThermalState& operator+=(const ThermalState& o) noexcept {
    energy += o.energy;
    capacity += o.capacity;
    capacity_derivative += o.capacity_derivative;
    return *this;
  }
  ThermalState& operator*=(double f) noexcept {
    energy *= f;
    capacity *= f;
    capacity_derivative *= f;
    return *this;
  }
};

inline ThermalState operator+(ThermalState a, const ThermalState& b) noexcept {
  return a += b;
}
inline ThermalState operator*(double f, ThermalState a) noexcept {
  return a *= f;
}

} // namespace quantacal

#endif
