// SPDX-License-Identifier: Apache-2.0
/**
 * @file lumped.h
 * @brief Lumped-capacitance cooling time with a temperature-dependent capacity.
 *
 * Header-only (the tests link no extra library).
 *
 * Why it exists: for a body whose Biot number is small (Bi = h (V/A) / k <<
 * 1; Incropera and DeWitt, Fundamentals of Heat and Mass Transfer, sec. 5.1-5.2,
 * take Bi < 0.1) the temperature is nearly uniform and the energy balance
 * \f$\rho c_p(T) V\, dT/dt = -h A (T - T_\infty)\f$ separates. The time to
 * go from T_1 to T_2 is
 *
 * \f[ t = \frac{V}{h A} \int_{T_2}^{T_1} \frac{\rho c_p(T)}{T - T_\infty}\, dT
 *       = \frac{V}{h A} \int_{\ln(T_2 - T_\infty)}^{\ln(T_1 - T_\infty)} \rho
 * c_p(T_\infty + e^u)\, du , \f]
 *
 * evaluated here in the second, logarithmic form (which removes the
 * 1/(T - T_inf) growth near the end) with Boost.Math's adaptive
 * Gauss-Kronrod quadrature (boost::math::quadrature::gauss_kronrod, 61
 * points). With a constant capacity it reduces to Incropera and DeWitt's
 * \f$t = (\rho V c / h A) \ln[(T_1 - T_\infty)/(T_2 - T_\infty)]\f$.
 * Heating (T_inf above both temperatures) works the same way.
 */
#ifndef QUANTACAL_TESTS_REFERENCE_LUMPED_H
#define QUANTACAL_TESTS_REFERENCE_LUMPED_H

#include <quantacal/material/material.h>

#include <functional>
#include <vector>

namespace quantacal::reference {

/** The body and its surroundings. */
struct LumpedBody {
  double volume_to_area = 0.0;            ///< V/A, m (> 0)
  double heat_transfer_coefficient = 0.0; ///< h, W/m^2/K (> 0)
  double ambient_temperature = 0.0;       ///< T_inf, K
};

/**
 * Time for the lumped body to pass from @p start to @p end.
 * @param body V/A, h and T_inf
 * @param volumetric_capacity rho c_p(T), J/m^3/K, as a function of T in K
 * @param start T_1, K
 * @param end T_2, K, strictly between T_1 and T_inf
 * @param breakpoints temperatures (K) where the capacity has a narrow peak or
 *        a kink; the quadrature is split there (may be empty)
 * @param error if not null, receives Boost's estimate of the absolute quadrature error, s
 * @return t, s
 * @throws std::invalid_argument unless T_2 lies strictly between T_1 and T_inf
 */
double lumped_cooling_time(const LumpedBody& body,
                           const std::function<double(double)>& volumetric_capacity,
                           double start, double end,
                           const std::vector<double>& breakpoints = {},
                           double* error = nullptr);

/**
 * The same with rho c_p(T) from a quantacal Material's exact model
 * (Material::thermal_exact on the volume basis, not its cached table), split
 * at the model's breakpoints.
 * @param body V/A, h and T_inf
 * @param material the material; start and end must lie in its valid range
 * @param start T_1, K
 * @param end T_2, K
 * @param error if not null, receives the quadrature error estimate, s
 * @return t, s
 */
double lumped_cooling_time(const LumpedBody& body, const Material& material, double start,
                           double end, double* error = nullptr);

} // namespace quantacal::reference

// ---- implementation (header-only, so the tests need no extra library) ----

#include <algorithm>
#include <boost/math/quadrature/gauss_kronrod.hpp>
#include <cmath>
#include <stdexcept>

namespace quantacal::reference {

inline double lumped_cooling_time(
    const LumpedBody& body, const std::function<double(double)>& volumetric_capacity,
    double start, double end, const std::vector<double>& breakpoints, double* error) {
  const double t_inf = body.ambient_temperature;
  if (!(body.volume_to_area > 0.0) || !(body.heat_transfer_coefficient > 0.0))
    throw std::invalid_argument("lumped_cooling_time: requires V/A > 0 and h > 0");
  const double d1 = start - t_inf;
  const double d2 = end - t_inf;
  if (!(d1 * d2 > 0.0) || !(std::abs(d2) < std::abs(d1)))
    throw std::invalid_argument(
        "lumped_cooling_time: requires the end temperature strictly between the start "
        "temperature and the ambient temperature");
  const double sign = d1 > 0.0 ? 1.0 : -1.0; // T = T_inf + sign e^u
  const auto integrand = [&](double u) {
    return volumetric_capacity(t_inf + sign * std::exp(u));
  };
  // Split points in u, inside (u2, u1), ascending.
  const double u1 = std::log(std::abs(d1));
  const double u2 = std::log(std::abs(d2));
  std::vector<double> cuts{u2};
  for (const double tb : breakpoints) {
    const double d = (tb - t_inf) * sign;
    if (d > 0.0) {
      const double u = std::log(d);
      if (u > u2 && u < u1)
        cuts.push_back(u);
    }
  }
  std::sort(cuts.begin() + 1, cuts.end());
  cuts.push_back(u1);
  double sum = 0.0;
  double err_sum = 0.0;
  for (std::size_t i = 0; i + 1 < cuts.size(); ++i) {
    double err = 0.0;
    sum += boost::math::quadrature::gauss_kronrod<double, 61>::integrate(
        integrand, cuts[i], cuts[i + 1], 20, 1e-13, &err);
    err_sum += err;
  }
  const double factor = body.volume_to_area / body.heat_transfer_coefficient;
  if (error)
    *error = factor * err_sum;
  return factor * sum;
}

inline double lumped_cooling_time(const LumpedBody& body, const Material& material,
                                  double start, double end, double* error) {
  const auto capacity = [&material](double t) {
    return material.thermal_exact(t, Basis::volume).capacity;
  };
  return lumped_cooling_time(body, capacity, start, end, material.model().breakpoints(),
                             error);
}

} // namespace quantacal::reference

#endif
