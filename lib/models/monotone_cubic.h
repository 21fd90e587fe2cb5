// SPDX-License-Identifier: Apache-2.0
// Monotone piecewise cubic Hermite interpolation (internal to the model layer),
// shared by the tabulated capacity and the conductivity table.
//
// Slopes: Fritsch and Carlson, "Monotone piecewise cubic interpolation",
// SIAM J. Numer. Anal. 17 (1980) 238, in the weighted-harmonic-mean form of
// Fritsch and Butland, SIAM J. Sci. Stat. Comput. 5 (1984) 300: zero at a
// local extremum of the data, otherwise
//   d_k = (w1 + w2) / (w1/s_{k-1} + w2/s_k),  w1 = 2h_k + h_{k-1}, w2 = h_k + 2h_{k-1},
// and the one-sided secant at both ends. These are the rules of
// boost/math/interpolators/pchip.hpp with default end derivatives, which the
// tests use as the outside reference.
#ifndef QUANTACAL_LIB_MODELS_MONOTONE_CUBIC_H
#define QUANTACAL_LIB_MODELS_MONOTONE_CUBIC_H

#include <cstddef>
#include <vector>

namespace quantacal {
namespace detail {

/** Fritsch-Carlson slopes at the knots; x strictly increasing, x.size() == y.size() >= 2.
 */
inline std::vector<double> monotone_slopes(const std::vector<double>& x,
                                           const std::vector<double>& y) {
  const std::size_t n = x.size();
  std::vector<double> d(n, 0.0);
  d[0] = (y[1] - y[0]) / (x[1] - x[0]);
  d[n - 1] = (y[n - 1] - y[n - 2]) / (x[n - 1] - x[n - 2]);
  for (std::size_t k = 1; k + 1 < n; ++k) {
    const double hkm1 = x[k] - x[k - 1];
    const double hk = x[k + 1] - x[k];
    const double skm1 = (y[k] - y[k - 1]) / hkm1;
    const double sk = (y[k + 1] - y[k]) / hk;
    if (skm1 == 0.0 || sk == 0.0 || (skm1 > 0.0) != (sk > 0.0)) {
      d[k] = 0.0;
    } else {
      const double w1 = 2.0 * hk + hkm1;
      const double w2 = hk + 2.0 * hkm1;
      d[k] = (w1 + w2) / (w1 / skm1 + w2 / sk);
    }
  }
  return d;
}

/** Value, first and second derivative of one cubic Hermite segment. */
struct HermitePoint {
  double value;
  double first;
  double second;
};

/** The cubic on [x0, x0 + h] with end values y0, y1 and end slopes d0, d1, at x. */
inline HermitePoint hermite_point(double x0, double h, double y0, double y1, double d0,
                                  double d1, double x) noexcept {
  const double t = (x - x0) / h;
  const double t2 = t * t;
  const double t3 = t2 * t;
  const double dy = y1 - y0;
  HermitePoint p;
  // y0 h00 + y1 h01 = y0 + dy (3t^2 - 2t^3)
  p.value =
      y0 + dy * (3.0 * t2 - 2.0 * t3) + h * (d0 * (t3 - 2.0 * t2 + t) + d1 * (t3 - t2));
  p.first = dy * (6.0 * t - 6.0 * t2) / h + d0 * (3.0 * t2 - 4.0 * t + 1.0) +
            d1 * (3.0 * t2 - 2.0 * t);
  p.second =
      dy * (6.0 - 12.0 * t) / (h * h) + (d0 * (6.0 * t - 4.0) + d1 * (6.0 * t - 2.0)) / h;
  return p;
}

/** Exact integral of the same cubic from x0 to x. */
inline double hermite_integral(double x0, double h, double y0, double y1, double d0,
                               double d1, double x) noexcept {
  const double s = (x - x0) / h;
  const double s2 = s * s;
  const double s3 = s2 * s;
  const double s4 = s3 * s;
  // int_0^s of h00, h01, h10, h11
  const double i00 = 0.5 * s4 - s3 + s;
  const double i01 = -0.5 * s4 + s3;
  const double i10 = 0.25 * s4 - (2.0 / 3.0) * s3 + 0.5 * s2;
  const double i11 = 0.25 * s4 - s3 / 3.0;
  return h * (y0 * i00 + y1 * i01 + h * (d0 * i10 + d1 * i11));
}

} // namespace detail
} // namespace quantacal

#endif
