// SPDX-License-Identifier: Apache-2.0
/**
 * @file stefan.h
 * @brief Neumann's similarity solution of the two-phase Stefan problem.
 *
 * Header-only (the tests link no extra library).
 *
 * Why it exists: it is the exact reference for a moving phase-change front
 * (Carslaw and Jaeger, Conduction of Heat in Solids, 2nd ed., ch. 11,
 * "Neumann's solution"). A semi-infinite liquid x > 0 at uniform T_i >= T_m
 * has its face x = 0 held at T_0 < T_m from t = 0. The solid occupies
 * 0 < x < X(t) with \f$X = 2\lambda\sqrt{\alpha_s t}\f$ and
 *
 * \f[ T_s = T_0 + (T_m - T_0)\,\frac{\mathrm{erf}(x/2\sqrt{\alpha_s
 * t})}{\mathrm{erf}\lambda}, \qquad T_l = T_i - (T_i -
 * T_m)\,\frac{\mathrm{erfc}(x/2\sqrt{\alpha_l t})}{\mathrm{erfc}(\lambda\nu)}, \quad \nu
 * = \sqrt{\alpha_s/\alpha_l}, \f]
 *
 * where lambda is the root of the Stefan condition
 * \f$k_s \partial_x T_s - k_l \partial_x T_l = \rho L\, dX/dt\f$ at the front:
 *
 * \f[ \frac{e^{-\lambda^2}}{\mathrm{erf}\lambda}
 *   - \frac{k_l \nu}{k_s} \frac{T_i - T_m}{T_m - T_0}
 * \frac{e^{-\lambda^2\nu^2}}{\mathrm{erfc}(\lambda\nu)} = \frac{\lambda L \sqrt{\pi}}{c_s
 * (T_m - T_0)}. \f]
 *
 * The left side minus the right side falls strictly from +inf at lambda -> 0
 * to -inf, so the root is unique; it is bracketed by doubling and solved with
 * Boost.Math's TOMS 748 (boost::math::tools::toms748_solve). T_i = T_m gives
 * the one-phase problem. Both phases share one density (the problem's
 * assumption). SI units throughout.
 */
#ifndef QUANTACAL_TESTS_REFERENCE_STEFAN_H
#define QUANTACAL_TESTS_REFERENCE_STEFAN_H

namespace quantacal::reference {

/** Constant properties of one phase. */
struct PhaseProperties {
  double conductivity = 0.0;  ///< k, W/m/K (> 0)
  double specific_heat = 0.0; ///< c, J/kg/K (> 0)
};

/** The data of a solidification problem on a half-space. */
struct StefanProblem {
  double density = 0.0;             ///< rho, kg/m^3, both phases (> 0)
  double latent_heat = 0.0;         ///< L, J/kg (> 0)
  double melting_temperature = 0.0; ///< T_m, K
  double initial_temperature = 0.0; ///< T_i of the liquid, K (>= T_m)
  double surface_temperature = 0.0; ///< T_0 at x = 0, K (< T_m)
  PhaseProperties solid;            ///< 0 < x < X(t)
  PhaseProperties liquid;           ///< x > X(t)
};

/** Neumann's solution of one StefanProblem. */
class NeumannSolution {
public:
  /**
   * Solves the transcendental equation for lambda.
   * @param problem the data
   * @throws std::invalid_argument for non-physical data
   * @throws std::runtime_error if the root finder fails
   */
  explicit NeumannSolution(const StefanProblem& problem);

  /** @return the similarity constant lambda, dimensionless */
  double lambda() const noexcept { return lambda_; }

  /**
   * @param time t, s (>= 0)
   * @return front position X(t) = 2 lambda sqrt(alpha_s t), m
   */
  double front_position(double time) const;

  /**
   * @param position x, m (>= 0)
   * @param time t, s (> 0)
   * @return T(x, t), K
   */
  double temperature(double position, double time) const;

  /** @return alpha_s = k_s/(rho c_s), m^2/s */
  double solid_diffusivity() const noexcept { return alpha_s_; }
  /** @return alpha_l = k_l/(rho c_l), m^2/s */
  double liquid_diffusivity() const noexcept { return alpha_l_; }

  /**
   * Residual of the transcendental equation (left side minus right side).
   * @param lambda trial value (> 0)
   * @return dimensionless residual; zero at lambda()
   */
  double residual(double lambda) const;

private:
  StefanProblem p_;
  double alpha_s_ = 0.0;
  double alpha_l_ = 0.0;
  double lambda_ = 0.0;
};

} // namespace quantacal::reference

// ---- implementation (header-only, so the tests need no extra library) ----

#include <boost/math/constants/constants.hpp>
#include <boost/math/special_functions/erf.hpp>
#include <boost/math/tools/toms748_solve.hpp>
#include <cmath>
#include <cstdint>
#include <stdexcept>

namespace quantacal::reference {

inline NeumannSolution::NeumannSolution(const StefanProblem& problem) : p_(problem) {
  if (!(p_.density > 0.0) || !(p_.latent_heat > 0.0) || !(p_.solid.conductivity > 0.0) ||
      !(p_.solid.specific_heat > 0.0) || !(p_.liquid.conductivity > 0.0) ||
      !(p_.liquid.specific_heat > 0.0))
    throw std::invalid_argument("NeumannSolution: requires rho, L, k and c > 0");
  if (!(p_.surface_temperature < p_.melting_temperature) ||
      !(p_.initial_temperature >= p_.melting_temperature))
    throw std::invalid_argument("NeumannSolution: requires T_0 < T_m <= T_i");
  alpha_s_ = p_.solid.conductivity / (p_.density * p_.solid.specific_heat);
  alpha_l_ = p_.liquid.conductivity / (p_.density * p_.liquid.specific_heat);

  const auto f = [this](double l) { return residual(l); };
  double lo = 1e-6;
  double hi = 1.0;
  double f_lo = f(lo);
  double f_hi = f(hi);
  if (!(f_lo > 0.0))
    throw std::runtime_error("NeumannSolution: residual not positive at lambda = 1e-6");
  for (int i = 0; i < 60 && f_hi > 0.0; ++i) { // expand the bracket by doubling
    lo = hi;
    f_lo = f_hi;
    hi *= 2.0;
    f_hi = f(hi);
  }
  if (!(f_hi < 0.0))
    throw std::runtime_error("NeumannSolution: could not bracket lambda");
  std::uintmax_t max_iter = 200;
  const auto r = boost::math::tools::toms748_solve(
      f, lo, hi, f_lo, f_hi, boost::math::tools::eps_tolerance<double>(52), max_iter);
  if (max_iter >= 200)
    throw std::runtime_error("NeumannSolution: TOMS 748 did not converge");
  lambda_ = 0.5 * (r.first + r.second);
}

inline double NeumannSolution::residual(double lambda) const {
  const double sqrt_pi = boost::math::constants::root_pi<double>();
  const double nu = std::sqrt(alpha_s_ / alpha_l_);
  const double stefan_solid = p_.solid.specific_heat *
                              (p_.melting_temperature - p_.surface_temperature) /
                              p_.latent_heat;
  const double superheat = (p_.initial_temperature - p_.melting_temperature) /
                           (p_.melting_temperature - p_.surface_temperature);
  const double solid_term = std::exp(-lambda * lambda) / boost::math::erf(lambda);
  const double liquid_term = p_.liquid.conductivity * nu / p_.solid.conductivity *
                             superheat * std::exp(-lambda * lambda * nu * nu) /
                             boost::math::erfc(lambda * nu);
  return solid_term - liquid_term - lambda * sqrt_pi / stefan_solid;
}

inline double NeumannSolution::front_position(double time) const {
  return 2.0 * lambda_ * std::sqrt(alpha_s_ * time);
}

inline double NeumannSolution::temperature(double position, double time) const {
  const double x = position;
  if (x <= front_position(time)) {
    const double eta = x / (2.0 * std::sqrt(alpha_s_ * time));
    return p_.surface_temperature + (p_.melting_temperature - p_.surface_temperature) *
                                        boost::math::erf(eta) / boost::math::erf(lambda_);
  }
  const double nu = std::sqrt(alpha_s_ / alpha_l_);
  const double eta = x / (2.0 * std::sqrt(alpha_l_ * time));
  return p_.initial_temperature - (p_.initial_temperature - p_.melting_temperature) *
                                      boost::math::erfc(eta) /
                                      boost::math::erfc(lambda_ * nu);
}

} // namespace quantacal::reference

#endif
