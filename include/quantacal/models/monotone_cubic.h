// SPDX-License-Identifier: Apache-2.0
/**
 * @file monotone_cubic.h
 * @brief A monotone piecewise cubic y(x) through given points (Fritsch-Carlson).
 *
 * Why it exists: tabulated data (a boiling curve h(T_surface), a temperature
 * history T(t), measured capacities) must be interpolated without the
 * overshoot of a spline: between two points the curve stays between their
 * values, and it is monotone wherever the data are. The slopes at the points
 * are computed once, when the curve is made, so evaluating it neither
 * allocates nor searches more than one binary search.
 *
 * Slopes: Fritsch and Carlson, "Monotone piecewise cubic interpolation",
 * SIAM J. Numer. Anal. 17 (1980) 238, in the weighted-harmonic-mean form of
 * Fritsch and Butland, SIAM J. Sci. Stat. Comput. 5 (1984) 300: zero at a
 * local extremum of the data, the one-sided secant at both ends. These are
 * the rules of Boost.Math's pchip with its default end derivatives.
 *
 * @code
 *   // h against the surface temperature, W/m^2/K against K
 *   const quantacal::MonotoneCubic h({313.15, 373.15, 403.15},
 *                                    {1000.0, 3000.0, 12600.0});
 *   const double h_350 = h.value(350.0);          // W/m^2/K
 *   const double slope_350 = h.derivative(350.0); // W/m^2/K^2
 * @endcode
 */
#ifndef QUANTACAL_MODELS_MONOTONE_CUBIC_H
#define QUANTACAL_MODELS_MONOTONE_CUBIC_H

#include <cstddef>
#include <vector>

namespace quantacal {

/**
 * The monotone cubic Hermite interpolant through points (x_i, y_i), constant
 * beyond the end points (y_0 below x_0, y_n above x_n, derivative 0 there).
 * One point makes a constant; a default-constructed curve has no points and
 * is 0 everywhere.
 *
 * Immutable after construction, so safe to share between threads.
 */
class MonotoneCubic {
public:
  /** No points: value() and derivative() are 0 everywhere. */
  MonotoneCubic() = default;

  /**
   * Builds the curve and its Fritsch-Carlson slopes.
   * @param x abscissae, finite and strictly increasing (at least one)
   * @param y ordinates, finite, as many as @p x
   * @throws InputError naming the first offending entry (sizes differ, no points,
   *         x not strictly increasing, a value not finite)
   */
  MonotoneCubic(std::vector<double> x, std::vector<double> y);

  /**
   * y at @p x: the cubic of the interval holding @p x, y_0 at and below x_0,
   * y_n at and above x_n (NaN for a NaN @p x).
   */
  double value(double x) const;

  /**
   * dy/dx at @p x (0 at and beyond the end points, and for fewer than two points;
   * NaN for a NaN @p x).
   */
  double derivative(double x) const;

  /** Number of points. */
  std::size_t size() const noexcept { return x_.size(); }
  /** True for a curve without points. */
  bool empty() const noexcept { return x_.empty(); }
  /** The abscissae as given. */
  const std::vector<double>& x() const noexcept { return x_; }
  /** The ordinates as given. */
  const std::vector<double>& y() const noexcept { return y_; }
  /** dy/dx at each point (the Fritsch-Carlson slopes; 0 for a single point). */
  const std::vector<double>& slopes() const noexcept { return slopes_; }

private:
  /** Index i of the interval [x_i, x_{i+1}) holding @p x, for x_0 < x < x_n. */
  std::size_t interval(double x) const;

  std::vector<double> x_;
  std::vector<double> y_;
  std::vector<double> slopes_;
};

} // namespace quantacal

#endif
