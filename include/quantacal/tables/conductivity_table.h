// SPDX-License-Identifier: Apache-2.0
/**
 * @file conductivity_table.h
 * @brief Cached table of the thermal conductivity k(T) and dk/dT, O(1) per point.
 *
 * Why it exists: a conduction term needs k and dk/dT at every Gauss point of
 * every Newton iteration. The conductivity models cost a `log`, a binary
 * search and an `exp` (the log-log table) or two series (the metal model) per
 * point; the table costs a lookup and two Horner chains.
 *
 * It is the PropertyTable machinery applied to k: the table's "capacity" is
 * k(T), its "capacity derivative" dk/dT. So on each segment k is the quartic
 * that matches the model's k and dk/dT at both ends and k at the midpoint, the
 * nodes are placed by the same error control (worst relative error of k below
 * the tolerance, checked again on an independent sample), they fall exactly
 * on the model's breakpoints (the knots of a table, the ends of each phase
 * join), and the lookup is the same O(1) octave/cell index (no search, no
 * log, no exp). The returned dk/dT is the exact derivative of the returned k
 * (to rounding), so a Newton Jacobian built from it is consistent with the
 * residual built from k.
 *
 * A constant conductivity (kind "constant") is not tabulated: evaluate()
 * returns the value and 0.
 *
 * Immutable once built; share it between threads through
 * std::shared_ptr<const ConductivityTable>.
 */
#ifndef QUANTACAL_TABLES_CONDUCTIVITY_TABLE_H
#define QUANTACAL_TABLES_CONDUCTIVITY_TABLE_H

#include <quantacal/models/conductivity.h>
#include <quantacal/tables/property_table.h>

#include <cstddef>
#include <memory>
#include <string>
#include <vector>

namespace quantacal {

/**
 * k(T) and dk/dT of a ConductivityModel over a closed temperature range, as a
 * piecewise quartic with O(1) segment lookup (see the file comment).
 *
 * Out-of-range rule (as PropertyTable): evaluate() throws RangeError for T
 * outside [lower_temperature(), upper_temperature()] or NaN.
 */
class ConductivityTable {
public:
  /**
   * Builds the table of @p model over [options.lower_temperature,
   * options.upper_temperature] (both required, 0 < lower < upper) to the
   * relative tolerance options.tolerance on k.
   * @param model the conductivity model (not kept: the table owns what it needs)
   * @param name used in error messages (the material's name)
   * @param options tolerance, range and memory cap, as for PropertyTable::build
   * @throws NumericalError if the tolerance cannot be met within max_bytes or the
   *         model gives a non-finite value or k <= 0
   * @throws RangeError if the range is empty or not positive
   */
  static std::shared_ptr<const ConductivityTable> build(const ConductivityModel& model,
                                                        const std::string& name,
                                                        const TableOptions& options);

  /**
   * @param temperature T, K, inside the range
   * @return k (W/m/K) and dk/dT (W/m/K^2) of the table
   * @throws RangeError outside the range or for NaN
   */
  ConductivityValue evaluate(double temperature) const;

  /**
   * Batch evaluation; the same numbers as the scalar evaluate(), bit for bit.
   * Output arrays may be null to skip them.
   * @param temperatures n temperatures, K
   * @param conductivity k, W/m/K
   * @param derivative dk/dT, W/m/K^2
   * @throws RangeError naming the first offending temperature (outputs then
   *         unspecified)
   */
  void evaluate(const double* temperatures, std::size_t n, double* conductivity,
                double* derivative) const;

  /** True for a constant conductivity (no table: k is stored, dk/dT = 0). */
  bool is_constant() const noexcept { return !table_; }
  /** Lower end of the range, K. */
  double lower_temperature() const noexcept { return lower_; }
  /** Upper end of the range, K. */
  double upper_temperature() const noexcept { return upper_; }
  /**
   * What the build measured: segments, bytes, and in worst_error /
   * worst_temperature the worst relative error of k against the model on the
   * build's independent check sample. worst_energy_error does not apply (0).
   * All zero for a constant conductivity.
   */
  const TableStatistics& statistics() const noexcept { return statistics_; }
  /** Node temperatures (segment ends), ascending, K; {lower, upper} if constant. */
  std::vector<double> node_temperatures() const;

private:
  ConductivityTable() = default;
  std::string name_;
  double lower_ = 0.0;
  double upper_ = 0.0;
  double constant_ = 0.0; ///< k of a constant conductivity, W/m/K
  TablePtr table_; ///< "capacity" = k, "capacity derivative" = dk/dT; null if constant
  TableStatistics statistics_;
};

using ConductivityTablePtr = std::shared_ptr<const ConductivityTable>;

} // namespace quantacal

#endif
