// SPDX-License-Identifier: Apache-2.0
// The Einstein contribution against the exact counting of quanta and 50-digit forms.
#include "support.h"

#include <quantacal/models/contribution.h>

#include <boost/multiprecision/cpp_bin_float.hpp>

#include <gtest/gtest.h>

#include <cmath>
#include <cstdio>

namespace {

using quantacal::gas_constant;
using quantacal_test::relative_difference;
using mp = boost::multiprecision::cpp_bin_float_50;

// ln of the number of ways to place q quanta in n oscillators, binomial(q + n - 1, q)
// (Schroeder, An Introduction to Thermal Physics, sec. 2.2), by lgamma.
double log_multiplicity(double q, double n) {
  return std::lgamma(q + n) - std::lgamma(q + 1.0) - std::lgamma(n);
}

// theta/T of the microcanonical ensemble, 1/T = dS/dU with S = k ln(multiplicity) and
// U = q k theta: a central difference of ln(multiplicity) over q +- 1.
double micro_x(double q, double n) {
  return 0.5 * (log_multiplicity(q + 1.0, n) - log_multiplicity(q - 1.0, n));
}

TEST(EinsteinContribution, MatchesCountingOfQuantaAtLargeN) {
  const double theta = 240.0;                                 // illustrative
  const auto einstein = quantacal::make_einstein(theta, 1.0); // one mode per formula unit
  const double n = 1e6;                                       // oscillators
  double worst_u = 0.0, worst_c = 0.0;
  for (double occupancy : {0.01, 0.05, 0.2, 0.5, 1.0, 2.0, 5.0, 10.0}) {
    const double q = std::round(occupancy * n);
    const double t = theta / micro_x(q, n);
    // mean quanta per oscillator of the model at the microcanonical T
    const double u_model = einstein->evaluate(t).energy / (gas_constant * theta);
    const double e_u = relative_difference(u_model, q / n);
    // C per oscillator from the counting: dU/dT with U = q k theta/N, over q +- 0.1 %
    const double dq = 1e-3 * q;
    const double t1 = theta / micro_x(q - dq, n);
    const double t2 = theta / micro_x(q + dq, n);
    const double c_micro =
        (2.0 * dq / n) * theta / (t2 - t1); // in units of k per oscillator
    const double c_model = einstein->evaluate(t).capacity / gas_constant;
    const double e_c = relative_difference(c_model, c_micro);
    worst_u = std::max(worst_u, e_u);
    worst_c = std::max(worst_c, e_c);
    // 1e-3: the bound (model limit: finite N, O(1/q) corrections)
    EXPECT_LE(e_u, 1e-3) << "occupancy " << occupancy; // Schroeder sec. 2.2 counting
    EXPECT_LE(e_c, 1e-3) << "occupancy " << occupancy; // Schroeder sec. 2.2 counting
  }
  std::printf("[ worst ] Einstein vs counting of quanta (N = 1e6): U %.3g, C %.3g\n",
              worst_u, worst_c);
}

struct MpEinstein {
  double energy, capacity, derivative;
};
// U = n R theta/(e^x-1), C = n R x^2 e^x/(e^x-1)^2 and dC/dT = C (x coth(x/2) - 2)/T in
// 50 digits (Einstein 1907; Kittel, Introduction to Solid State Physics, ch. 5).
MpEinstein mp_einstein(double theta, double modes, double t) {
  const mp x = mp(theta) / mp(t);
  const mp em1 = boost::multiprecision::expm1(x);
  const mp nr = mp(modes) * mp(gas_constant);
  const mp c = nr * x * x * boost::multiprecision::exp(x) / (em1 * em1);
  const mp coth = 1 / boost::multiprecision::tanh(x / 2);
  return {static_cast<double>(nr * mp(theta) / em1), static_cast<double>(c),
          static_cast<double>(c * (x * coth - 2) / mp(t))};
}

TEST(EinsteinContribution, MatchesFiftyDigitFormsOnBothSidesOfTheCrossover) {
  const double theta = 300.0;
  const auto einstein = quantacal::make_einstein(theta, 3.0);
  std::vector<double> xs;
  for (int i = 0; i <= 140; ++i)
    xs.push_back(std::pow(10.0, -4.0 + i * 0.05)); // 1e-4 .. 1e3
  for (double f : {1.0 - 1e-9, 1.0 - 2e-16, 1.0, 1.0 + 2e-16, 1.0 + 1e-9})
    xs.push_back(2.0 * f); // series / closed-form crossover of x coth(x/2) - 2
  double worst_u = 0.0, worst_c = 0.0, worst_d = 0.0;
  for (double x : xs) {
    const double t = theta / x;
    const quantacal::ThermalState s = einstein->evaluate(t);
    const MpEinstein r = mp_einstein(theta, 3.0, t);
    worst_u = std::max(worst_u, relative_difference(s.energy, r.energy));
    worst_c = std::max(worst_c, relative_difference(s.capacity, r.capacity));
    worst_d = std::max(worst_d, relative_difference(s.capacity_derivative, r.derivative));
  }
  std::printf("[ worst ] Einstein vs 50-digit forms: U %.3g, C %.3g, dC/dT %.3g\n",
              worst_u, worst_c, worst_d);
  // numerical: measured 3.1e-14 at x = 1e3, the condition number x of e^-x times the
  // rounding of x = theta/T; below x = 10 the error is a few 1e-16
  EXPECT_LE(worst_u, 6e-14);
  EXPECT_LE(worst_c, 6e-14);
  EXPECT_LE(worst_d, 6e-14);
}

TEST(EinsteinContribution, LimitsAndMonotonicity) {
  const double theta = 300.0;
  const auto einstein = quantacal::make_einstein(theta, 3.0);
  const double nr = 3.0 * gas_constant;
  // high T: C/(nR) = (x/2)^2/sinh^2(x/2) = 1 - x^2/12 + x^4/240 - ... (Dulong-Petit,
  // Kittel)
  for (double x : {1e-2, 1e-4, 1e-8})
    EXPECT_NEAR(einstein->evaluate(theta / x).capacity / nr,
                1.0 - x * x / 12.0 + x * x * x * x / 240.0,
                5e-16); // numerical: expm1 rounding, measured 2.2e-16
  // low T: C/(nR) -> x^2 e^-x (Einstein 1907; Kittel ch. 5)
  for (double x : {40.0, 100.0, 600.0}) {
    const double c = einstein->evaluate(theta / x).capacity / nr;
    EXPECT_LE(relative_difference(c, x * x * std::exp(-x)), 1e-15 * x)
        << x; // exp rounding
  }
  quantacal::ThermalState prev = einstein->evaluate(1.0);
  for (int i = 1; i <= 3000; ++i) {
    const double t = std::pow(10.0, i * 0.001);
    const quantacal::ThermalState s = einstein->evaluate(t);
    EXPECT_GT(s.capacity, prev.capacity) << t; // common practice: C rises monotonically
    EXPECT_GT(s.energy, prev.energy) << t;
    prev = s;
  }
}

} // namespace
