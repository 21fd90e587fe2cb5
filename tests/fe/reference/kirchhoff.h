// SPDX-License-Identifier: Apache-2.0
/**
 * @file kirchhoff.h
 * @brief Steady conduction through a slab with a temperature-dependent
 *        conductivity and fixed face temperatures, by the Kirchhoff
 *        transformation.
 *
 * Header-only, Boost.Math only (no deal.II, no quantacal).
 *
 * Why it exists: with the Kirchhoff variable U(T) = int_{T_0}^T k(T') dT'
 * (Carslaw and Jaeger, Conduction of Heat in Solids, 2nd ed., sec. 1.12;
 * Ozisik, Heat Conduction, the Kirchhoff transformation) the steady equation
 * d/dx (k(T) dT/dx) = 0 becomes U'' = 0, so on 0 <= x <= L with T(0) = T_0,
 * T(L) = T_L
 *
 *   U(T(x)) = (x / L) U(T_L),
 *
 * and T(x) follows by inverting the monotone U (k > 0). U is integrated by
 * Boost.Math's adaptive Gauss-Kronrod rule (61 points), split at the caller's
 * knots; the inverse is found by Boost.Math TOMS 748.
 */
#ifndef QUANTACAL_TESTS_REFERENCE_KIRCHHOFF_H
#define QUANTACAL_TESTS_REFERENCE_KIRCHHOFF_H

#include <algorithm>
#include <boost/math/quadrature/gauss_kronrod.hpp>
#include <boost/math/tools/toms748_solve.hpp>
#include <cstdint>
#include <functional>
#include <stdexcept>
#include <utility>
#include <vector>

namespace quantacal::reference {

/** The steady slab of the file comment. */
class KirchhoffSlab {
public:
  /**
   * @param conductivity k(T), W/m/K, > 0 between the face temperatures
   * @param knots temperatures where k has a kink or a jump in curvature (split points)
   * @param t0 T(0), K
   * @param tl T(L), K
   */
  KirchhoffSlab(std::function<double(double)> conductivity, std::vector<double> knots,
                double t0, double tl)
      : k_(std::move(conductivity)), knots_(std::move(knots)), t0_(t0), tl_(tl),
        ul_(transform(tl)) {}

  /** U(T) = int_{T_0}^T k dT', W/m. */
  double transform(double t) const {
    const double lo = std::min(t0_, t), hi = std::max(t0_, t);
    std::vector<double> cuts{lo};
    for (const double k : knots_)
      if (k > lo && k < hi)
        cuts.push_back(k);
    std::sort(cuts.begin(), cuts.end());
    cuts.push_back(hi);
    double sum = 0.0;
    for (std::size_t i = 0; i + 1 < cuts.size(); ++i)
      if (cuts[i + 1] > cuts[i])
        sum += boost::math::quadrature::gauss_kronrod<double, 61>::integrate(
            k_, cuts[i], cuts[i + 1], 20, 1e-14);
    return t >= t0_ ? sum : -sum;
  }

  /**
   * @param fraction x/L in [0, 1]
   * @return T(x), K
   */
  double temperature(double fraction) const {
    if (fraction <= 0.0)
      return t0_;
    if (fraction >= 1.0)
      return tl_;
    const double target = fraction * ul_;
    const auto f = [&](double t) { return transform(t) - target; };
    const double lo = std::min(t0_, tl_), hi = std::max(t0_, tl_);
    std::uintmax_t iterations = 200;
    const auto r = boost::math::tools::toms748_solve(
        f, lo, hi, f(lo), f(hi), boost::math::tools::eps_tolerance<double>(50),
        iterations);
    if (iterations >= 200)
      throw std::runtime_error("KirchhoffSlab: TOMS 748 did not converge");
    return 0.5 * (r.first + r.second);
  }

private:
  std::function<double(double)> k_;
  std::vector<double> knots_;
  double t0_, tl_, ul_;
};

} // namespace quantacal::reference

#endif
