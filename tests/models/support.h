// SPDX-License-Identifier: Apache-2.0
// Shared helpers of the model tests: independent references built from
// Boost.Math quadrature and a Richardson-extrapolated central difference.
#ifndef QUANTACAL_TESTS_MODELS_SUPPORT_H
#define QUANTACAL_TESTS_MODELS_SUPPORT_H

#include <quantacal/models/contribution.h>

#include <boost/math/quadrature/gauss_kronrod.hpp>

#include <algorithm>
#include <cmath>
#include <functional>
#include <vector>

namespace quantacal_test {

inline double relative_difference(double a, double b) {
  if (a == b)
    return 0.0;
  return std::fabs(a - b) / std::max(std::fabs(a), std::fabs(b));
}

/**
 * int_a^b f by adaptive Gauss-Kronrod 61 (Boost.Math), split at the given
 * interior points (breakpoints of the integrand), asked for 1e-14 relative (a
 * tighter request only makes the adaptive scheme subdivide to its depth limit).
 */
inline double integrate(const std::function<double(double)>& f, double a, double b,
                        std::vector<double> splits = {}) {
  std::vector<double> edges{a};
  std::sort(splits.begin(), splits.end());
  for (double s : splits)
    if (s > a && s < b)
      edges.push_back(s);
  edges.push_back(b);
  double sum = 0.0;
  for (std::size_t i = 0; i + 1 < edges.size(); ++i)
    sum += boost::math::quadrature::gauss_kronrod<double, 61>::integrate(
        f, edges[i], edges[i + 1], 12, 1e-14);
  return sum;
}

/**
 * f'(x) by a central difference with step h, Richardson-extrapolated once:
 * (4 D(h/2) - D(h))/3, error O(h^4) plus rounding of order eps f / h.
 */
inline double richardson_derivative(const std::function<double(double)>& f, double x,
                                    double h) {
  const auto central = [&](double s) { return (f(x + s) - f(x - s)) / (2.0 * s); };
  return (4.0 * central(0.5 * h) - central(h)) / 3.0;
}

} // namespace quantacal_test

#endif
