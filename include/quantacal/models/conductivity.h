// SPDX-License-Identifier: Apache-2.0
/**
 * @file conductivity.h
 * @brief Thermal conductivity k(T) models: constant, or a table in log-log.
 */
#ifndef QUANTACAL_MODELS_CONDUCTIVITY_H
#define QUANTACAL_MODELS_CONDUCTIVITY_H

#include <memory>
#include <string>
#include <utility>
#include <vector>

namespace quantacal {

/** k and dk/dT at one temperature. */
struct ConductivityValue {
  double value = 0.0;      ///< k, W/m/K
  double derivative = 0.0; ///< dk/dT, W/m/K^2
};

/** A thermal-conductivity model. Immutable, thread-safe. */
class ConductivityModel {
public:
  virtual ~ConductivityModel() = default;
  /**
   * @param temperature T, K (> 0; the Material checks its valid range)
   * @return k (W/m/K) and dk/dT (W/m/K^2)
   */
  virtual ConductivityValue evaluate(double temperature) const = 0;
  /** Kind as written in cards ("constant", "table", ...). */
  virtual std::string kind() const = 0;
  /**
   * Temperatures (K) where k or one of its first two derivatives is not smooth:
   * the knots of a table, the ends of a phase join. A ConductivityTable places
   * nodes on them (as a PropertyTable does on ThermalModel::breakpoints()).
   * Ascending or not, may lie outside any valid range; empty for a smooth model.
   */
  virtual std::vector<double> breakpoints() const { return {}; }
};

using ConductivityPtr = std::shared_ptr<const ConductivityModel>;

/** @param value k, W/m/K (> 0) */
ConductivityPtr make_constant_conductivity(double value);

/**
 * Points (T_i, k_i) joined monotonically in log-log coordinates: a
 * Fritsch-Carlson monotone cubic through (ln T_i, ln k_i); outside the points
 * the end power laws are continued (documented, and the card's valid range
 * normally lies inside the points).
 * @param temperatures strictly increasing, K, at least 2
 * @param values k at those points, W/m/K (> 0)
 */
ConductivityPtr make_table_conductivity(std::vector<double> temperatures,
                                        std::vector<double> values);

} // namespace quantacal

#endif
