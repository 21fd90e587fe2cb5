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

/**
 * Options of PropertyTable::build.
 *
 * The default tolerance asks for a worst relative error of C of 1e-9 against
 * the exact model; the table then costs of the order of 10-100 KiB per
 * material (see docs/performance.md).
 */
struct TableOptions {
  double tolerance = 1e-9;          ///< worst relative error of C allowed
  double lower_temperature = 0.0;   ///< K; 0 means the model's lower temperature
  double upper_temperature = 0.0;   ///< K; 0 means the model's upper temperature
  std::size_t max_bytes = 4u << 20; ///< memory cap; build throws NumericalError past it
};

/** Statistics of a built table. */
struct TableStatistics {
  std::size_t n_segments = 0;     ///< number of polynomial segments
  std::size_t bytes = 0;          ///< memory held by the table, bytes
  double worst_error = 0.0;       ///< worst relative error of C found by the build check
  double worst_temperature = 0.0; ///< K, where worst_error was found
  std::size_t n_checked = 0;      ///< number of independent sample points checked
  /// worst relative error of U, |U_table - U_model| / U_model, on the same sample
  double worst_energy_error = 0.0;
  std::size_t n_cells = 0;       ///< number of lookup cells (blocks of uniform segments)
  std::size_t n_evaluations = 0; ///< exact-model evaluations spent by the build
};

/**
 * A piecewise quintic U(T) with O(1) segment lookup, built from a ThermalModel.
 *
 * Representation. On each segment [T_k, T_k + h] with t = (T - T_k)/h, the
 * capacity is the quartic C(t) that matches the model's C and dC/dT at both
 * ends and C at the midpoint; the energy is its exact integral,
 * \f$ U(T) = U_\mathrm{model}(T_\mathrm{lower}) + \int_{T_\mathrm{lower}}^{T} C\,dT' \f$,
 * stored as the six coefficients of a quintic in t. So the returned C is the
 * derivative of the returned U and the returned dC/dT its second derivative,
 * and U, C, dC/dT are continuous across segments. (U is integrated rather
 * than interpolated from the model's U because the model's U may be a
 * quadrature result less consistent with its C than the table must be; the
 * returned U differs from the model's U by at most the tolerance times U.)
 *
 * Lookup. The octave of T comes from its IEEE exponent, the cell inside the
 * octave from the top mantissa bits (a number of bits chosen per octave);
 * each cell holds at most one breakpoint of the model, and the two sides of
 * it are divided into uniform segments whose number was chosen by error
 * control. Nodes fall exactly on the model's breakpoints and on both ends of
 * the range. No search on the hot path.
 *
 * Out-of-range rule: evaluate() throws RangeError for T outside
 * [lower_temperature(), upper_temperature()] or NaN; the table never
 * extrapolates.
 */
class PropertyTable {
public:
  /**
   * Builds the table of @p model over [lower, upper] (options or the model's).
   *
   * Error control: a coarse pilot pass estimates the node density needed
   * (the C error of a segment falls as h^5), which chooses the cells of each
   * octave; each run of uniform segments is then refined until the relative
   * error of C at the two extremes of the leading error term of every segment
   * is below tolerance/3; finally two pseudo-random points per segment (not
   * used before) and both range ends are checked against the model, and runs
   * that fail are refined again (TableStatistics records this check). Cost: a
   * few thousand model evaluations for a typical card.
   *
   * @param model the exact model; it must give finite values and C > 0 on the
   *        range (it is not kept: the table owns everything it needs)
   * @param options tolerance, range and memory cap; a model whose lower
   *        temperature is 0 K needs options.lower_temperature > 0
   * @throws NumericalError if the tolerance cannot be met within max_bytes,
   *         or the model gives a non-finite value or C <= 0 (with the figures)
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
   * Gives the same numbers as the scalar evaluate(), bit for bit; with all
   * three outputs on a CPU with AVX2 it runs a vector kernel chosen at run time.
   * @param temperatures n temperatures, K
   * @param energy U, J/mol
   * @param capacity C, J/mol/K
   * @param capacity_derivative dC/dT, J/mol/K^2
   * @throws RangeError naming the first offending temperature (outputs then unspecified)
   */
  void evaluate(const double* temperatures, std::size_t n, double* energy,
                double* capacity, double* capacity_derivative) const;

  /**
   * Inverse of the interpolated U: the T at which evaluate(T).energy == energy,
   * solved on the same piecewise polynomial (exact for the interpolant).
   * @param energy U, J/mol, inside [U(lower), U(upper)]
   * @return T, K
   * @throws RangeError outside the energy range
   */
  double temperature_from_energy(double energy) const;

  /** Lower end of the table's range, K. */
  double lower_temperature() const noexcept;
  /** Upper end of the table's range, K. */
  double upper_temperature() const noexcept;
  /** What the build measured: segments, bytes, worst errors on the check sample. */
  const TableStatistics& statistics() const noexcept;
  /** The model's name (used in error messages). */
  const std::string& name() const noexcept;

  /**
   * The node temperatures (segment ends), ascending, from lower to upper, K.
   * For comparisons with other interpolants on the same nodes; allocates.
   */
  std::vector<double> node_temperatures() const;

private:
  struct Impl;
  explicit PropertyTable(std::unique_ptr<Impl> impl);
  std::unique_ptr<Impl> impl_;
};

using TablePtr = std::shared_ptr<const PropertyTable>;

} // namespace quantacal

#endif
