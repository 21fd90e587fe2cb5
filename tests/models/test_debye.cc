// SPDX-License-Identifier: Apache-2.0
// The Debye function and the Debye contribution against outside references.
#include "support.h"

#include <quantacal/models/contribution.h>
#include <quantacal/models/detail/debye.h>

#include <gsl/gsl_errno.h>
#include <gsl/gsl_sf_debye.h>

#include <boost/math/constants/constants.hpp>
#include <boost/math/quadrature/gauss_kronrod.hpp>
#include <boost/multiprecision/cpp_bin_float.hpp>

#include <gtest/gtest.h>

#include <cmath>
#include <cstdio>

namespace {

using quantacal::gas_constant;
using quantacal::detail::debye_function_3;
using quantacal::detail::debye_values;
using quantacal_test::relative_difference;
using mp = boost::multiprecision::cpp_bin_float_50;

constexpr double R = gas_constant;

double gsl_d3(double x) {
  gsl_sf_result r;
  gsl_set_error_handler_off();
  const int status = gsl_sf_debye_3_e(x, &r);
  EXPECT_EQ(status, GSL_SUCCESS) << "x = " << x;
  return r.val;
}

// D3(x) by Boost.Math Gauss-Kronrod on cpp_bin_float_50 (independent of the code under
// test).
mp mp_d3(mp x) {
  const auto f = [](mp t) {
    if (t == 0)
      return mp(0);
    return t * t * t / boost::multiprecision::expm1(t);
  };
  return 3 *
         boost::math::quadrature::gauss_kronrod<mp, 31>::integrate(f, mp(0), x, 25,
                                                                   mp(1e-35)) /
         (x * x * x);
}

struct MpDebye {
  double energy, capacity, slope;
};
// D3, 4 D3 - 3x/(e^x-1) and 12 D3 - 9x/(e^x-1) - 3x^2 e^x/(e^x-1)^2 in 50 digits.
MpDebye mp_debye(double xd) {
  const mp x = xd;
  const mp d3 = mp_d3(x);
  const mp em1 = boost::multiprecision::expm1(x);
  const mp b = x / em1;
  const mp q = x * x * boost::multiprecision::exp(x) / (em1 * em1);
  return {static_cast<double>(d3), static_cast<double>(4 * d3 - 3 * b),
          static_cast<double>(12 * d3 - 9 * b - 3 * q)};
}

// D3 against GSL's gsl_sf_debye_3 from x = 1e-4 to 1e3 (GSL 2.7, reference library).
TEST(DebyeFunction, MatchesGslOverTheWholeRange) {
  const auto debye = quantacal::make_debye(343.0, 3.0);
  double worst_d3 = 0.0, worst_c = 0.0, worst_u = 0.0, at = 0.0;
  for (int i = 0; i <= 700; ++i) {
    const double x = std::pow(10.0, -4.0 + i * 0.01);
    const double g = gsl_d3(x);
    const double e = relative_difference(debye_function_3(x), g);
    if (e > worst_d3) {
      worst_d3 = e;
      at = x;
    }
    const double t = 343.0 / x;
    const quantacal::ThermalState s = debye->evaluate(t);
    const double c_ref =
        3.0 * R * (4.0 * g - 3.0 * x / std::expm1(x)); // Debye C from GSL's D3
    worst_c = std::max(worst_c, relative_difference(s.capacity, c_ref));
    worst_u =
        std::max(worst_u, relative_difference(s.energy, 3.0 * R * t * g)); // U = 3 R T D3
  }
  std::printf("[ worst ] D3 vs GSL %.3g (x = %.4g), C %.3g, U %.3g\n", worst_d3, at,
              worst_c, worst_u);
  // 1e-11 (the bound): numerical; measured 2.0e-13 (C 2.8e-13), which is GSL's
  // own error near x = 4 (its Chebyshev fit); against 50-digit quadrature ours is
  // 7.9e-16 (next test).
  EXPECT_LE(worst_d3, 1e-11);
  EXPECT_LE(worst_c, 1e-11);
  EXPECT_LE(worst_u, 1e-11);
}

// D3, C and T dC/dT against 50-digit Boost.Math quadrature, dense in x and on both
// sides of both crossovers (x = 2 series/exponential sum, x = 60 exponential
// sum/asymptote).
TEST(DebyeFunction, MatchesFiftyDigitQuadratureOnBothSidesOfEachCrossover) {
  std::vector<double> xs;
  for (int i = 0; i <= 120; ++i)
    xs.push_back(std::pow(10.0, -3.0 + i * 0.04)); // 1e-3 .. 63
  for (double c :
       {quantacal::detail::debye_series_limit, quantacal::detail::debye_asymptote_limit})
    for (double f : {1.0 - 1e-9, 1.0 - 2e-16, 1.0, 1.0 + 2e-16, 1.0 + 1e-9})
      xs.push_back(c * f);
  double worst_e = 0.0, worst_c = 0.0, worst_s = 0.0;
  for (double x : xs) {
    const MpDebye ref = mp_debye(x);
    const quantacal::detail::DebyeValues v = debye_values(x);
    worst_e = std::max(worst_e, relative_difference(v.energy, ref.energy));
    worst_c = std::max(worst_c, relative_difference(v.capacity, ref.capacity));
    worst_s = std::max(worst_s, relative_difference(v.slope, ref.slope));
    EXPECT_EQ(debye_function_3(x), v.energy) << x;
  }
  std::printf("[ worst ] vs 50-digit quadrature: D3 %.3g, C %.3g, T dC/dT %.3g\n",
              worst_e, worst_c, worst_s);
  // tolerances: twice the measured worst, numerical (rounding; the slope loses a
  // factor 6 to cancellation in 12 D3 - 9b - 3q just above x = 3)
  EXPECT_LE(worst_e, 2e-15);   // measured 7.9e-16
  EXPECT_LE(worst_c, 3e-15);   // measured 1.5e-15
  EXPECT_LE(worst_s, 1.2e-14); // measured 5.7e-15
}

// Pässler, Advances in Condensed Matter Physics 2017, art. 9321439, Table 7: Cv/(3R) and
// D3.
TEST(DebyeFunction, MatchesPublishedTable) {
  struct Row {
    double x, cv_3r;
  };
  const Row rows[] = {
      {0.1, 0.9995001785},   // Pässler 2017, Table 7
      {0.5, 0.9876107521},   // Pässler 2017, Table 7
      {1.0, 0.9517321357},   // Pässler 2017, Table 7
      {2.0, 0.8254080384},   // Pässler 2017, Table 7 (computed there)
      {5.0, 0.3686348236},   // Pässler 2017, Table 7
      {10.0, 0.07582100303}, // Pässler 2017, Table 7
      {15.0, 0.02307128730}, // Pässler 2017, Table 7
  };
  for (const Row& r : rows) {
    // the table prints 10 significant digits: half a unit of the last digit (plus 1e-15
    // for our own error) is the tolerance
    const double half_unit = 0.5 * std::pow(10.0, std::floor(std::log10(r.cv_3r)) - 9.0);
    EXPECT_NEAR(debye_values(r.x).capacity, r.cv_3r, half_unit + 1e-15) << r.x;
  }
  EXPECT_NEAR(debye_function_3(1.0), 0.6744155641, 0.6e-10);   // Pässler 2017, Table 7
  EXPECT_NEAR(debye_function_3(5.0), 0.1175974118, 0.6e-10);   // Pässler 2017, Table 7
  EXPECT_NEAR(debye_function_3(10.0), 0.01929576569, 0.6e-11); // Pässler 2017, Table 7
}

// The T^3 law C = (12 pi^4/5) R (T/theta)^3 and the Dulong-Petit limit 3R (Kittel,
// Introduction to Solid State Physics, ch. 5).
TEST(DebyeContribution, LowAndHighTemperatureLimits) {
  const double theta = 343.0; // Cu, Kittel
  const auto debye = quantacal::make_debye(theta, 3.0);
  // 12 pi^4 R/5 = 1943.770 J/mol/K (Arblaster, J. Phase Equilib. Diffus. 36 (2015) 573)
  for (double x : {61.0, 100.0, 1e3, 1e5}) {
    const double t = theta / x;
    const quantacal::ThermalState s = debye->evaluate(t);
    EXPECT_NEAR(s.capacity * x * x * x, 1943.770, 0.0005) << x; // printed to 7 digits
    EXPECT_NEAR(s.energy / (t * s.capacity), 0.25, 1e-15); // U = C T/4 on the T^3 law
    EXPECT_NEAR(s.capacity_derivative * t / s.capacity, 3.0, 1e-14);
  }
  // just below x = 60 the exponential terms are still computed; at x = 50 they are
  // 5e-17 of the T^3 term (3 x^4 e^-x 5/(4 pi^4), analytic)
  EXPECT_NEAR(debye->evaluate(theta / 50.0).capacity * 125000.0, 1943.770, 0.0005);
  // Dulong-Petit 3R (Kittel): C/(3R) = 1 - x^2/20 + x^4/560 - O(x^6) (expansion of the
  // Debye function, Abramowitz and Stegun 27.1.1; the x^6 term is 5.5e-17 at x = 1e-2)
  for (double x : {1e-2, 1e-4, 1e-8}) {
    const double c = debye->evaluate(theta / x).capacity;
    EXPECT_NEAR(c / (3.0 * R), 1.0 - x * x / 20.0 + x * x * x * x / 560.0, 2e-16) << x;
  }
  // U -> 3R (T - 3 theta/8 + theta^2/(20 T)) at high T (same expansion of D3)
  const double t = 1e6;
  EXPECT_NEAR(debye->evaluate(t).energy,
              3.0 * R * (t - 3.0 * theta / 8.0 + theta * theta / (20.0 * t)),
              1e-15 * 3 * R * t);
}

// Monotone: C and U increase with T, D3 decreases with x (common practice).
TEST(DebyeContribution, IsMonotone) {
  const auto debye = quantacal::make_debye(428.0, 3.0); // Al, Kittel
  quantacal::ThermalState prev = debye->evaluate(0.1);
  for (int i = 1; i <= 4000; ++i) {
    const double t = 0.1 * std::pow(10.0, i * 0.001);
    const quantacal::ThermalState s = debye->evaluate(t);
    EXPECT_GT(s.capacity, prev.capacity) << t;
    EXPECT_GT(s.energy, prev.energy) << t;
    EXPECT_GT(s.capacity_derivative, 0.0) << t;
    prev = s;
  }
}

// The modes parameter scales linearly (n R per mode triple; common practice).
TEST(DebyeContribution, ModesScaleTheCapacity) {
  const auto a = quantacal::make_debye(300.0, 3.0);
  const auto b = quantacal::make_debye(300.0, 6.0);
  for (double t : {1.0, 30.0, 300.0, 3000.0}) {
    EXPECT_DOUBLE_EQ(b->evaluate(t).capacity, 2.0 * a->evaluate(t).capacity);
    EXPECT_DOUBLE_EQ(b->evaluate(t).energy, 2.0 * a->evaluate(t).energy);
  }
}

} // namespace
