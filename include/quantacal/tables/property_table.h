// SPDX-License-Identifier: Apache-2.0
/**
 * @file property_table.h
 * @brief Cached, energy-consistent property table built from a ThermalModel.
 *
 * Why it exists: a finite-element solver asks for (e, c_p, dc_p/dT) at every
 * quadrature point of every Newton iteration, millions of times per second.
 * The exact model costs hundreds of nanoseconds or more per point (special
 * functions, quadrature for the dilation term); the table costs a few.
 *
 * One piecewise quintic interpolant represents U(T); the returned capacity
 * is its derivative and the returned capacity derivative its second
 * derivative, so `c_p = de/dT` holds for what is returned, not only for the
 * model (a solver in energy form then conserves energy exactly). Nodes are
 * placed by error control so that the worst relative error of C against the
 * exact model, on a dense independent sample, is below a tolerance.
 * Segment lookup is O(1) (no search on the hot path).
 *
 * Immutable once built; share it between threads through
 * std::shared_ptr<const PropertyTable>.
 */
#ifndef QUANTACAL_TABLES_PROPERTY_TABLE_H
#define QUANTACAL_TABLES_PROPERTY_TABLE_H

#include <quantacal/models/thermal_model.h>

#include <cstddef>
#include <memory>
#include <string>
#include <vector>

namespace quantacal {

/** Options of PropertyTable::build. */
struct TableOptions {
  double tolerance = 1e-9;               ///< worst relative error of C allowed
  double lower_temperature = 0.0;        ///< K; 0 means the model's lower temperature
  double upper_temperature = 0.0;        ///< K; 0 means the model's upper temperature
  std::size_t max_bytes = 4u << 20;      ///< memory cap; build throws NumericalError past it
};

/** Statistics of a built table. */
struct TableStatistics {
  std::size_t n_segments = 0;  ///< number of polynomial segments
  std::size_t bytes = 0;       ///< memory held by the table, bytes
  double worst_error = 0.0;    ///< worst relative error of C found by the build check
  double worst_temperature = 0.0; ///< K, where worst_error was found
  std::size_t n_checked = 0;   ///< number of independent sample points checked
};

class PropertyTable {
public:
  /**
   * Builds the table of @p model over [lower, upper] (options or the model's).
   * @throws NumericalError if the tolerance cannot be met within max_bytes
   * @throws RangeError if the range is empty or outside the model's domain
   */
  static std::shared_ptr<const PropertyTable> build(const ThermalModel& model,
                                                    const TableOptions& options = {});

  ~PropertyTable();
  PropertyTable(const PropertyTable&) = delete;
  PropertyTable& operator=(const PropertyTable&) = delete;

  /**
   * @param temperature T, K, inside [lower_temperature(), upper_temperature()]
   * @return U (J/mol), C (J/mol/K), dC/dT (J/mol/K^2) of the interpolant
   * @throws RangeError outside the range or for NaN (the out-of-range rule:
   *         no extrapolation, ever)
   */
  ThermalState evaluate(double temperature) const;

  /**
   * Batch evaluation of @p n points. Output arrays may be null to skip them.
   * @param temperatures n temperatures, K
   * @param energy U, J/mol
   * @param capacity C, J/mol/K
   * @param capacity_derivative dC/dT, J/mol/K^2
   * @throws RangeError naming the first offending temperature (outputs then unspecified)
   */
  void evaluate(const double* temperatures, std::size_t n, double* energy, double* capacity,
                double* capacity_derivative) const;

  /**
   * Inverse of the interpolated U: the T at which evaluate(T).energy == energy,
   * solved on the same piecewise polynomial (exact for the interpolant).
   * @param energy U, J/mol, inside [U(lower), U(upper)]
   * @return T, K
   * @throws RangeError outside the energy range
   */
  double temperature_from_energy(double energy) const;

  double lower_temperature() const noexcept;
  double upper_temperature() const noexcept;
  const TableStatistics& statistics() const noexcept;
  const std::string& name() const noexcept;

private:
  struct Impl;
  explicit PropertyTable(std::unique_ptr<Impl> impl);
  std::unique_ptr<Impl> impl_;
};

using TablePtr = std::shared_ptr<const PropertyTable>;

} // namespace quantacal

#endif
