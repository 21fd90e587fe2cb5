// SPDX-License-Identifier: Apache-2.0
// The Debye energy function D3(x) and the Debye capacity.
//
// Three branches in x = theta/T (docs/theory.md, "Debye"):
//  - x < debye_series_limit (3): the Maclaurin series of t/(e^t - 1) in
//    Bernoulli numbers integrated term by term,
//      D3(x) = 1 - 3x/8 + 3 sum_k B_2k x^2k / ((2k)! (2k+3)),
//    convergent for x < 2 pi; at x = 3 the terms fall as (x/2pi)^2k, so 28
//    terms reach 1e-18. The crossover is set by the capacity slope
//    12 D3 - 9x/(e^x-1) - 3x^2 e^x/(e^x-1)^2, which the exponential branch
//    computes with cancellation by a factor 17 at x = 2 and 6 at x = 3:
//    measured worst relative error of the slope 2.0e-14 with the crossover at
//    2, 7e-15 at 3 (against 50-digit quadrature, tests/models/test_debye.cc).
//  - 3 <= x <= debye_asymptote_limit (60): the exponential sum
//      int_0^x t^3/(e^t-1) dt = pi^4/15 - sum_k e^-kx (x^3/k + 3x^2/k^2 + 6x/k^3 + 6/k^4)
//    (Abramowitz and Stegun 27.1.2 with the tail integrated in closed form),
//    stopped once a term is below 2^-55 of pi^4/15.
//  - x > 60: the largest exponential term, 3 x^2 e^-x in the slope, is below
//    1e-19 of the T^3 term 12 D3 = 12 pi^4/(5 x^3) (and the terms of D3 and of
//    the capacity are smaller still), so the pure asymptote D3 = pi^4/(5 x^3)
//    is exact in double precision.
#include <quantacal/models/detail/debye.h>

#include <boost/math/constants/constants.hpp>
#include <boost/math/special_functions/bernoulli.hpp>
#include <boost/math/special_functions/factorials.hpp>

#include <array>
#include <cmath>

namespace quantacal {
namespace detail {
namespace {

constexpr int n_series_terms = 28; // k = 1..28: (3/(2 pi))^56 < 1e-18

struct DebyeSeries {
  std::array<double, n_series_terms> energy{};   // coefficient of x^2k in D3
  std::array<double, n_series_terms> capacity{}; // coefficient of x^2k in C/(nR)
  std::array<double, n_series_terms> slope{};    // coefficient of x^2k in T dC/dT/(nR)
  DebyeSeries() {
    for (int k = 1; k <= n_series_terms; ++k) {
      const double b = boost::math::bernoulli_b2n<double>(k) /
                       boost::math::factorial<double>(static_cast<unsigned>(2 * k));
      const double m = 2.0 * k;
      energy[k - 1] = 3.0 * b / (m + 3.0);
      capacity[k - 1] = -3.0 * b * (m - 1.0) / (m + 3.0);
      slope[k - 1] = -m * capacity[k - 1];
    }
  }
};

const DebyeSeries& series() {
  static const DebyeSeries s;
  return s;
}

constexpr double pi4_15 =
    boost::math::constants::pi<double>() * boost::math::constants::pi<double>() *
    boost::math::constants::pi<double>() * boost::math::constants::pi<double>() / 15.0;

// int_0^x t^3/(e^t-1) dt for x >= 3 by the exponential sum; em = e^-x.
double debye_integral_exponential(double x, double em) noexcept {
  const double threshold = 0x1p-55 * pi4_15;
  double sum = 0.0;
  double ek = 1.0;
  for (int k = 1; k <= 64; ++k) { // at x = 3 the loop stops at k = 13
    ek *= em;
    const double r = 1.0 / k;
    const double term =
        ek * r * (x * x * x + r * (3.0 * x * x + r * (6.0 * x + 6.0 * r)));
    sum += term;
    if (!(term >= threshold))
      break;
  }
  return pi4_15 - sum;
}

} // namespace

DebyeValues debye_values(double x) noexcept {
  DebyeValues v;
  if (x < debye_series_limit) {
    const DebyeSeries& s = series();
    const double y = x * x;
    double e = s.energy[n_series_terms - 1];
    double c = s.capacity[n_series_terms - 1];
    double d = s.slope[n_series_terms - 1];
    for (int k = n_series_terms - 2; k >= 0; --k) {
      e = e * y + s.energy[k];
      c = c * y + s.capacity[k];
      d = d * y + s.slope[k];
    }
    v.energy = 1.0 - 0.375 * x + e * y;
    v.capacity = 1.0 + c * y;
    v.slope = d * y;
    return v;
  }
  if (x > debye_asymptote_limit) {
    v.energy = 3.0 * pi4_15 / (x * x * x);
    v.capacity = 4.0 * v.energy;
    v.slope = 12.0 * v.energy;
    return v;
  }
  const double em = std::exp(-x);
  const double one_minus = -std::expm1(-x); // 1 - e^-x, no cancellation
  const double b = x * em / one_minus;      // x/(e^x - 1)
  v.energy = 3.0 * debye_integral_exponential(x, em) / (x * x * x);
  v.capacity = 4.0 * v.energy - 3.0 * b;
  v.slope = 12.0 * v.energy - 9.0 * b - 3.0 * x * x * em / (one_minus * one_minus);
  return v;
}

double debye_function_3(double x) noexcept {
  if (x < debye_series_limit) {
    const DebyeSeries& s = series();
    const double y = x * x;
    double e = s.energy[n_series_terms - 1];
    for (int k = n_series_terms - 2; k >= 0; --k)
      e = e * y + s.energy[k];
    return 1.0 - 0.375 * x + e * y;
  }
  if (x > debye_asymptote_limit)
    return 3.0 * pi4_15 / (x * x * x);
  return 3.0 * debye_integral_exponential(x, std::exp(-x)) / (x * x * x);
}

} // namespace detail
} // namespace quantacal
