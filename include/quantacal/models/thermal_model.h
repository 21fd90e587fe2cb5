// SPDX-License-Identifier: Apache-2.0
/**
 * @file thermal_model.h
 * @brief What a property table needs from a model: exact (U, C, dC/dT) at any T.
 */
#ifndef QUANTACAL_MODELS_THERMAL_MODEL_H
#define QUANTACAL_MODELS_THERMAL_MODEL_H

#include <quantacal/models/thermal_state.h>

#include <string>
#include <vector>

namespace quantacal {

/**
 * A thermal model evaluated exactly (to close to double precision).
 *
 * This is the seam between the model layer and the table layer: a
 * PropertyTable is built from any ThermalModel, so tests can feed it a
 * reference function and a solver can feed it a model of its own.
 */
class ThermalModel {
public:
  virtual ~ThermalModel() = default;

  /**
   * @param temperature T in K, inside [lower_temperature(), upper_temperature()]
   * @return U (J/mol), C (J/mol/K), dC/dT (J/mol/K^2) at @p temperature
   * @throws RangeError if T <= 0, NaN, inf or outside the domain of definition
   */
  virtual ThermalState evaluate(double temperature) const = 0;

  /** Lowest temperature at which evaluate() is defined, K; 0 means every T > 0. */
  virtual double lower_temperature() const = 0;
  /** Highest temperature at which evaluate() is defined, K (may be inf). */
  virtual double upper_temperature() const = 0;

  /**
   * Temperatures (K) where C or one of its first two derivatives is not smooth,
   * or where C has a narrow peak: knots of tabulated data, ends of a Shomate
   * range, centres of latent-heat transitions. A table builder places nodes on
   * or refines around them. Sorted, ascending; may be empty.
   */
  virtual std::vector<double> breakpoints() const { return {}; }

  /** Name used in error messages (the material's name). */
  virtual std::string name() const = 0;
};

} // namespace quantacal

#endif
