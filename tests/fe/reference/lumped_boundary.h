// SPDX-License-Identifier: Apache-2.0
/**
 * @file lumped_boundary.h
 * @brief Lumped-capacitance cooling with a constant capacity and a
 *        temperature-dependent surface loss: radiation to a sink (closed form)
 *        and a tabulated h(T) (quadrature of the curve's own interpolant).
 *
 * Header-only, Boost.Math only (no deal.II, no quantacal).
 *
 * Why it exists: for a body whose Biot number is small (Bi << 0.1) the
 * temperature is nearly uniform and the energy balance separates:
 *
 *   rho c V dT/dt = -A q(T),   t(T) = (rho c V / A) int_T^{T_i} dT' / q(T').
 *
 * Radiation alone, q = eps sigma (T^4 - T_a^4), integrates in closed form
 * (Incropera and DeWitt, Fundamentals of Heat and Mass Transfer, sec. 5.3,
 * the radiation-only lumped solution; equation numbers 5.18 and 5.19 from
 * memory):
 *
 *   t = rho c V / (4 eps A sigma T_a^3) { ln|(T_a + T)/(T_a - T)|
 *       - ln|(T_a + T_i)/(T_a - T_i)| + 2 [atan(T/T_a) - atan(T_i/T_a)] },
 *
 * and for T_a = 0: t = rho c V / (3 eps A sigma) (1/T^3 - 1/T_i^3).
 * (Its derivative is -rho c V / (eps sigma A (T^4 - T_a^4)), which
 * test_reference_lumped_boundary.cc checks against quadrature.)
 *
 * A tabulated coefficient, q = h(T) (T - T_a), is integrated by Boost.Math's
 * adaptive Gauss-Kronrod rule (61 points), split at the table's knots (where
 * the interpolant's second derivative jumps), with h from the caller (the test
 * passes Boost.Math's pchip, the Fritsch-Carlson interpolant the case format
 * uses, held constant beyond the end points).
 *
 * The inverse T(t) is found by Boost.Math TOMS 748 on [T_end, T_i].
 */
#ifndef QUANTACAL_TESTS_REFERENCE_LUMPED_BOUNDARY_H
#define QUANTACAL_TESTS_REFERENCE_LUMPED_BOUNDARY_H

#include <algorithm>
#include <boost/math/quadrature/gauss_kronrod.hpp>
#include <boost/math/tools/toms748_solve.hpp>
#include <cmath>
#include <cstdint>
#include <functional>
#include <stdexcept>
#include <vector>

namespace quantacal::reference {

/// sigma, W/m^2/K^4 (CODATA 2018, exact in the 2019 SI)
constexpr double stefan_boltzmann_constant = 5.670374419e-8;

/**
 * Time for a lumped body to cool by radiation alone from @p start to @p end.
 * @param capacity_per_area rho c V / A, J/m^2/K
 * @param emissivity eps, in (0, 1]
 * @param ambient T_a, K (>= 0; 0 uses the T_a = 0 form)
 * @param start T_i, K, > T_a
 * @param end T, K, in (T_a, T_i]
 * @return t, s
 */
inline double radiation_cooling_time(double capacity_per_area, double emissivity,
                                     double ambient, double start, double end) {
  if (!(capacity_per_area > 0.0) || !(emissivity > 0.0) || !(ambient >= 0.0) ||
      !(end > ambient) || !(start >= end))
    throw std::invalid_argument("radiation_cooling_time: requires T_a < T <= T_i");
  const double sigma = stefan_boltzmann_constant;
  if (ambient == 0.0)
    return capacity_per_area / (3.0 * emissivity * sigma) *
           (1.0 / (end * end * end) - 1.0 / (start * start * start));
  const double a = ambient;
  const auto f = [a](double t) {
    return std::log((a + t) / (t - a)) + 2.0 * std::atan(t / a);
  };
  return capacity_per_area / (4.0 * emissivity * sigma * a * a * a) * (f(end) - f(start));
}

/**
 * Time for a lumped body to cool from @p start to @p end with a surface loss
 * h(T) (T - T_a).
 * @param capacity_per_area rho c V / A, J/m^2/K
 * @param coefficient h(T), W/m^2/K (> 0 on [end, start])
 * @param knots temperatures where h has a kink or a jump in curvature (split points)
 * @param ambient T_a, K
 * @param start T_i, K, > end
 * @param end T, K, > T_a
 * @param error if not null, receives Boost's error estimate, s
 * @return t, s
 */
inline double curve_cooling_time(double capacity_per_area,
                                 const std::function<double(double)>& coefficient,
                                 const std::vector<double>& knots, double ambient,
                                 double start, double end, double* error = nullptr) {
  if (!(end > ambient) || !(start >= end))
    throw std::invalid_argument("curve_cooling_time: requires T_a < T <= T_i");
  std::vector<double> cuts{end};
  for (const double k : knots)
    if (k > end && k < start)
      cuts.push_back(k);
  std::sort(cuts.begin(), cuts.end());
  cuts.push_back(start);
  const auto integrand = [&](double t) { return 1.0 / (coefficient(t) * (t - ambient)); };
  double sum = 0.0, err_sum = 0.0;
  for (std::size_t i = 0; i + 1 < cuts.size(); ++i) {
    if (!(cuts[i + 1] > cuts[i]))
      continue;
    double err = 0.0;
    sum += boost::math::quadrature::gauss_kronrod<double, 61>::integrate(
        integrand, cuts[i], cuts[i + 1], 20, 1e-13, &err);
    err_sum += err;
  }
  if (error)
    *error = capacity_per_area * err_sum;
  return capacity_per_area * sum;
}

/**
 * The temperature at @p time of a monotone cooling law t(T) given as a
 * function, by TOMS 748 on [@p lowest, @p start].
 * @param cooling_time t(T), s, with t(start) = 0, decreasing in T
 * @param start T_i, K
 * @param lowest a temperature reached after @p time, K
 * @param time s
 * @return T, K
 */
inline double temperature_at(const std::function<double(double)>& cooling_time,
                             double start, double lowest, double time) {
  if (time <= 0.0)
    return start;
  const auto f = [&](double t) { return cooling_time(t) - time; };
  double f_lo = f(lowest);
  if (!(f_lo > 0.0))
    throw std::invalid_argument("temperature_at: the time is not reached above `lowest`");
  std::uintmax_t iterations = 200;
  const auto r = boost::math::tools::toms748_solve(
      f, lowest, start, f_lo, -time, boost::math::tools::eps_tolerance<double>(50),
      iterations);
  if (iterations >= 200)
    throw std::runtime_error("temperature_at: TOMS 748 did not converge");
  return 0.5 * (r.first + r.second);
}

} // namespace quantacal::reference

#endif
