// SPDX-License-Identifier: Apache-2.0
/**
 * @file conduction_series.h
 * @brief Exact series for transient conduction with convection in a plane
 *        wall, an infinite cylinder and a sphere (constant properties).
 *
 * Header-only (the tests link no extra library).
 *
 * Why it exists: the validation tests compare the solver against a solution
 * that owes nothing to the project. A body at uniform initial temperature
 * T_i is cooled from t = 0 by convection (coefficient h) to a fluid at
 * T_inf. With the dimensionless temperature
 * \f$\theta^* = (T - T_\infty)/(T_i - T_\infty)\f$, the position
 * \f$x^* = x/L\f$ (L the half-thickness or the outer radius), the Fourier
 * number \f$Fo = \alpha t / L^2\f$ and the Biot number \f$Bi = h L / k\f$,
 *
 * \f[ \theta^*(x^*, Fo) = \sum_{n \ge 1} C_n e^{-\zeta_n^2 Fo} X(\zeta_n x^*) \f]
 *
 * with (Carslaw and Jaeger, Conduction of Heat in Solids, 2nd ed., ch. 3
 * (slab), ch. 7 (cylinder), ch. 9 (sphere), "radiation at the surface";
 * Incropera and DeWitt, Fundamentals of Heat and Mass Transfer, sec. 5.5
 * and 5.6 with Table 5.1):
 *
 * | geometry | eigen-equation | X(z) | C_n |
 * |---|---|---|---|
 * | plane wall | \f$\zeta \tan\zeta = Bi\f$ | \f$\cos z\f$ | \f$4\sin\zeta/(2\zeta + \sin
 * 2\zeta)\f$ | | cylinder | \f$\zeta J_1(\zeta)/J_0(\zeta) = Bi\f$ | \f$J_0(z)\f$ |
 * \f$(2/\zeta) J_1/(J_0^2 + J_1^2)\f$ | | sphere | \f$1 - \zeta\cot\zeta = Bi\f$ |
 * \f$\sin z / z\f$ | \f$4(\sin\zeta - \zeta\cos\zeta)/(2\zeta - \sin 2\zeta)\f$ |
 *
 * The eigenvalues are found, one per bracketing interval, with Boost.Math's
 * TOMS 748 root finder (boost::math::tools::toms748_solve); the Bessel
 * functions are boost::math::cyl_bessel_j and the interval ends for the
 * cylinder are boost::math::cyl_bessel_j_zero. No deal.II, no quantacal.
 */
#ifndef QUANTACAL_TESTS_REFERENCE_CONDUCTION_SERIES_H
#define QUANTACAL_TESTS_REFERENCE_CONDUCTION_SERIES_H

#include <cstddef>
#include <vector>

namespace quantacal::reference {

/** The three one-dimensional geometries of the series. */
enum class Geometry {
  plane_wall, ///< slab -L <= x <= L, both faces cooled
  cylinder,   ///< infinite cylinder 0 <= r <= L
  sphere      ///< sphere 0 <= r <= L
};

/**
 * The exact series solution for one geometry and one Biot number.
 *
 * The eigenvalues and coefficients are computed once in the constructor;
 * evaluation is then a sum of @p n_terms terms.
 */
class ConvectionSeries {
public:
  /**
   * @param geometry plane wall, cylinder or sphere
   * @param biot Bi = h L / k (> 0, finite)
   * @param n_terms number of eigenvalues kept (>= 1); 100 is ample for Fo >= 1e-3
   * @throws std::invalid_argument for Bi <= 0 or n_terms == 0
   * @throws std::runtime_error if a root finder does not converge
   */
  ConvectionSeries(Geometry geometry, double biot, std::size_t n_terms = 100);

  /** @return the geometry */
  Geometry geometry() const noexcept { return geometry_; }
  /** @return Bi, dimensionless */
  double biot() const noexcept { return biot_; }
  /** @return the number of terms kept */
  std::size_t n_terms() const noexcept { return zeta_.size(); }

  /**
   * @param n 0-based index (n = 0 is the first eigenvalue zeta_1)
   * @return zeta_{n+1}, dimensionless
   */
  double eigenvalue(std::size_t n) const { return zeta_.at(n); }
  /**
   * @param n 0-based index
   * @return C_{n+1}, dimensionless
   */
  double coefficient(std::size_t n) const { return coefficient_.at(n); }

  /**
   * The dimensionless temperature.
   * @param position x* = x/L or r/L, in [0, 1]
   * @param fourier Fo = alpha t / L^2 (> 0)
   * @return theta* = (T - T_inf)/(T_i - T_inf)
   */
  double temperature(double position, double fourier) const;

  /**
   * The same, from the first term only (Incropera and DeWitt, sec. 5.5 and 5.6).
   * @param position x* in [0, 1]
   * @param fourier Fo (> 0)
   * @return C_1 exp(-zeta_1^2 Fo) X(zeta_1 x*)
   */
  double one_term_temperature(double position, double fourier) const;

  /**
   * The volume-averaged dimensionless temperature, which is 1 - Q/Q_0 of
   * Incropera and DeWitt sec. 5.5 and 5.6 summed over all terms:
   * mean of X(zeta x*) over the body is sin z/z, 2 J1(z)/z, 3 (sin z - z cos z)/z^3.
   * @param fourier Fo (> 0)
   * @return (mean T - T_inf)/(T_i - T_inf)
   */
  double mean_temperature(double fourier) const;

  /**
   * The spatial eigenfunction X(z) of this geometry.
   * @param z argument zeta x*, dimensionless (>= 0)
   * @return cos z, J0(z) or sin z / z
   */
  double eigenfunction(double z) const;

  /**
   * Surface-to-volume factor A L / V of the geometry: 1 (wall), 2 (cylinder), 3 (sphere).
   * The energy balance of the body reads d(mean theta*)/dFo = -(A L / V) Bi theta*(1,
   * Fo).
   */
  double shape_factor() const noexcept;

private:
  Geometry geometry_;
  double biot_;
  std::vector<double> zeta_;
  std::vector<double> coefficient_;
};

/**
 * The n-th (0-based) eigenvalue of @p geometry for @p biot by a bracketing
 * TOMS 748 solve on the interval known to hold exactly one root:
 * wall ((n) pi, (n + 1/2) pi); cylinder (j_{1,n}, j_{0,n+1}) with j_{1,0} = 0;
 * sphere (n pi, (n + 1) pi).
 * @param geometry the geometry
 * @param biot Bi (> 0)
 * @param n 0-based index
 * @return zeta_{n+1}
 */
double convection_eigenvalue(Geometry geometry, double biot, std::size_t n);

/**
 * The coefficient C_n of the uniform initial condition, from the closed form
 * of the table above.
 * @param geometry the geometry
 * @param zeta an eigenvalue
 * @return C_n
 */
double convection_coefficient(Geometry geometry, double zeta);

} // namespace quantacal::reference

// ---- implementation (header-only, so the tests need no extra library) ----

#include <boost/math/constants/constants.hpp>
#include <boost/math/special_functions/bessel.hpp>
#include <boost/math/special_functions/sinc.hpp>
#include <boost/math/tools/toms748_solve.hpp>
#include <cmath>
#include <cstdint>
#include <stdexcept>
#include <string>

namespace quantacal::reference {

namespace detail {

constexpr double pi = boost::math::constants::pi<double>();

inline double j0(double z) {
  return boost::math::cyl_bessel_j(0, z);
}
inline double j1(double z) {
  return boost::math::cyl_bessel_j(1, z);
}

/// The eigen-equation written as a function continuous on the bracketing
/// interval and of opposite signs at its ends (see convection_eigenvalue).
inline double eigen_residual(Geometry geometry, double biot, double z) {
  switch (geometry) {
  case Geometry::plane_wall:
    return z * std::sin(z) - biot * std::cos(z); // zeta tan zeta = Bi, times cos zeta
  case Geometry::cylinder:
    return z * j1(z) - biot * j0(z); // zeta J1/J0 = Bi, times J0
  case Geometry::sphere:
    // 1 - zeta cot zeta = Bi, times sin(zeta)/zeta: finite and -Bi at zeta = 0
    return (1.0 - biot) * boost::math::sinc_pi(z) - std::cos(z);
  }
  return 0.0;
}

} // namespace detail

inline double convection_eigenvalue(Geometry geometry, double biot, std::size_t n) {
  if (!(biot > 0.0) || !std::isfinite(biot))
    throw std::invalid_argument(
        "convection_eigenvalue: requires 0 < Bi < inf but got Bi = " +
        std::to_string(biot));
  double lo = 0.0;
  double hi = 0.0;
  const double k = static_cast<double>(n);
  switch (geometry) {
  case Geometry::plane_wall:
    lo = k * detail::pi;
    hi = (k + 0.5) * detail::pi;
    break;
  case Geometry::cylinder:
    lo = n == 0 ? 0.0 : boost::math::cyl_bessel_j_zero(1.0, static_cast<int>(n));
    hi = boost::math::cyl_bessel_j_zero(0.0, static_cast<int>(n) + 1);
    break;
  case Geometry::sphere:
    lo = k * detail::pi;
    hi = (k + 1.0) * detail::pi;
    break;
  }
  const auto f = [&](double z) { return detail::eigen_residual(geometry, biot, z); };
  double f_lo = f(lo);
  double f_hi = f(hi);
  if (f_lo == 0.0)
    return lo;
  if (f_hi == 0.0)
    return hi;
  if ((f_lo < 0.0) == (f_hi < 0.0))
    throw std::runtime_error("convection_eigenvalue: no sign change on [" +
                             std::to_string(lo) + ", " + std::to_string(hi) + "]");
  std::uintmax_t max_iter = 200;
  const auto r = boost::math::tools::toms748_solve(
      f, lo, hi, f_lo, f_hi, boost::math::tools::eps_tolerance<double>(52), max_iter);
  if (max_iter >= 200)
    throw std::runtime_error("convection_eigenvalue: TOMS 748 did not converge");
  return 0.5 * (r.first + r.second);
}

inline double convection_coefficient(Geometry geometry, double zeta) {
  switch (geometry) {
  case Geometry::plane_wall:
    return 4.0 * std::sin(zeta) / (2.0 * zeta + std::sin(2.0 * zeta));
  case Geometry::cylinder: {
    const double a = detail::j0(zeta);
    const double b = detail::j1(zeta);
    return 2.0 / zeta * b / (a * a + b * b);
  }
  case Geometry::sphere:
    return 4.0 * (std::sin(zeta) - zeta * std::cos(zeta)) /
           (2.0 * zeta - std::sin(2.0 * zeta));
  }
  return 0.0;
}

inline ConvectionSeries::ConvectionSeries(Geometry geometry, double biot,
                                          std::size_t n_terms)
    : geometry_(geometry), biot_(biot) {
  if (n_terms == 0)
    throw std::invalid_argument("ConvectionSeries: requires n_terms >= 1");
  zeta_.reserve(n_terms);
  coefficient_.reserve(n_terms);
  for (std::size_t n = 0; n < n_terms; ++n) {
    const double z = convection_eigenvalue(geometry, biot, n);
    zeta_.push_back(z);
    coefficient_.push_back(convection_coefficient(geometry, z));
  }
}

inline double ConvectionSeries::eigenfunction(double z) const {
  switch (geometry_) {
  case Geometry::plane_wall:
    return std::cos(z);
  case Geometry::cylinder:
    return detail::j0(z);
  case Geometry::sphere:
    return boost::math::sinc_pi(z);
  }
  return 0.0;
}

inline double ConvectionSeries::shape_factor() const noexcept {
  switch (geometry_) {
  case Geometry::plane_wall:
    return 1.0;
  case Geometry::cylinder:
    return 2.0;
  case Geometry::sphere:
    return 3.0;
  }
  return 0.0;
}

inline double ConvectionSeries::temperature(double position, double fourier) const {
  double sum = 0.0;
  for (std::size_t n = 0; n < zeta_.size(); ++n) {
    const double decay = std::exp(-zeta_[n] * zeta_[n] * fourier);
    if (decay == 0.0)
      break; // the eigenvalues increase, so every later term underflows too
    sum += coefficient_[n] * decay * eigenfunction(zeta_[n] * position);
  }
  return sum;
}

inline double ConvectionSeries::one_term_temperature(double position,
                                                     double fourier) const {
  return coefficient_[0] * std::exp(-zeta_[0] * zeta_[0] * fourier) *
         eigenfunction(zeta_[0] * position);
}

inline double ConvectionSeries::mean_temperature(double fourier) const {
  double sum = 0.0;
  for (std::size_t n = 0; n < zeta_.size(); ++n) {
    const double z = zeta_[n];
    const double decay = std::exp(-z * z * fourier);
    if (decay == 0.0)
      break;
    double mean = 0.0; // volume mean of X(zeta x*) over 0 <= x* <= 1
    switch (geometry_) {
    case Geometry::plane_wall:
      mean = std::sin(z) / z;
      break;
    case Geometry::cylinder:
      mean = 2.0 * detail::j1(z) / z;
      break;
    case Geometry::sphere:
      mean = 3.0 * (std::sin(z) - z * std::cos(z)) / (z * z * z);
      break;
    }
    sum += coefficient_[n] * decay * mean;
  }
  return sum;
}

} // namespace quantacal::reference

#endif
