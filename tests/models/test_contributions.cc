// SPDX-License-Identifier: Apache-2.0
// Properties every contribution must have (U = int C, dC/dT = C'), and the checks of
// the individual terms against published values and reference libraries.
#include "support.h"

#include <quantacal/common/exceptions.h>
#include <quantacal/models/contribution.h>
#include <quantacal/models/heat_capacity_model.h>

#include <gsl/gsl_cdf.h>
#include <gsl/gsl_randist.h>

#include <boost/math/interpolators/pchip.hpp>
#include <boost/math/tools/roots.hpp>

#include <gtest/gtest.h>

#include <cmath>
#include <cstdio>
#include <functional>
#include <limits>
#include <map>
#include <stdexcept>
#include <string>

namespace {

using quantacal::ContributionPtr;
using quantacal::gas_constant;
using quantacal::LowerExtension;
using quantacal_test::relative_difference;

LowerExtension t3_below() {
  return LowerExtension{LowerExtension::Kind::debye_t3, 0.0};
}
LowerExtension energy_below(double u) {
  return LowerExtension{LowerExtension::Kind::energy, u};
}

// Illustrative measured points: a Debye solid with theta = 343 K (Cu, Kittel), 3 modes.
ContributionPtr illustrative_tabulated() {
  const auto debye = quantacal::make_debye(343.0, 3.0);
  std::vector<double> t{10.0, 20.0, 40.0, 80.0, 160.0, 300.0, 600.0};
  std::vector<double> c;
  for (double x : t)
    c.push_back(debye->evaluate(x).capacity);
  return quantacal::make_tabulated(t, c, t3_below());
}

// NIST Chemistry WebBook Shomate coefficients of solid aluminium, 298-933.45 K (from
// memory).
const std::vector<double> aluminium_shomate{28.08920, -5.414849, 8.560423, 3.427370,
                                            -0.277375};

struct Case {
  std::string label;
  ContributionPtr term;
};

std::vector<Case> all_cases() {
  return {
      {"einstein", quantacal::make_einstein(240.0, 3.0)}, // illustrative theta
      {"debye", quantacal::make_debye(343.0, 3.0)},       // Cu, Kittel
      {"electronic",
       quantacal::make_electronic(0.695e-3)}, // Cu gamma, Kittel (from memory)
      {"schottky", quantacal::make_schottky(10.0, 3.0, 0.01)}, // illustrative
      {"transition", quantacal::make_transition(
                         933.47, 10710.0, 5.0)}, // Al fusion, CRC; width illustrative
      {"transition_wide",
       quantacal::make_transition(60.0, 500.0, 25.0)}, // illustrative, tail reaches 0 K
      {"tabulated", illustrative_tabulated()},
      {"shomate_t3",
       quantacal::make_shomate(aluminium_shomate, 298.0, 933.0, t3_below())},
      {"shomate_energy",
       quantacal::make_shomate(aluminium_shomate, 298.0, 933.0,
                               energy_below(4540.0))}, // CODATA Al H298-H0
      {"magnetic",
       quantacal::make_magnetic(1043.0, 2.22, 0.40)}, // bcc Fe, Dinsdale 1991 (SGTE)
  };
}

std::vector<double> sample_temperatures(const quantacal::Contribution& c) {
  std::vector<double> out;
  for (double t : {0.5, 2.0, 7.0, 15.0, 35.0, 60.0, 77.0, 150.0, 298.0, 300.0, 450.0,
                   600.0, 900.0, 925.0, 933.0, 933.47, 940.0, 1500.0, 3000.0})
    if (t >= c.lower_temperature() && t <= c.upper_temperature())
      out.push_back(t);
  return out;
}

// U(T) - U(T_lo) equals Boost.Math Gauss-Kronrod quadrature of C from T_lo (0 or the
// term's lower temperature) to T, split at the breakpoints.
TEST(EveryContribution, EnergyIsTheIntegralOfCapacity) {
  for (const Case& k : all_cases()) {
    const auto& c = *k.term;
    const double lo = c.lower_temperature();
    const double u_lo = lo > 0.0 ? c.evaluate(lo).energy : 0.0;
    double worst = 0.0;
    for (double t : sample_temperatures(c)) {
      if (t <= lo)
        continue;
      const double integral = quantacal_test::integrate(
          [&](double s) { return c.evaluate(s).capacity; }, lo, t, c.breakpoints());
      const double e = relative_difference(c.evaluate(t).energy - u_lo, integral);
      worst = std::max(worst, e);
      EXPECT_LE(e, 1e-10) << k.label << " T = " << t; // the bound
    }
    std::printf("[ worst ] %-16s U vs quadrature of C: %.3g\n", k.label.c_str(), worst);
  }
}

// dC/dT against a Richardson-extrapolated central difference of C (away from knots).
TEST(EveryContribution, CapacityDerivativeMatchesRichardsonDifference) {
  for (const Case& k : all_cases()) {
    const auto& c = *k.term;
    double worst = 0.0;
    const std::vector<double> knots = c.breakpoints();
    for (double t : sample_temperatures(c)) {
      const quantacal::ThermalState here = c.evaluate(t);
      if (!(here.capacity > 1e-280))
        continue; // underflowed tail (transition far below T_t)
      // step: 1e-3 of the shorter of T and the length C/|C'| over which C changes
      const double length = here.capacity_derivative != 0.0
                                ? here.capacity / std::fabs(here.capacity_derivative)
                                : t;
      const double h = 1e-3 * std::min(t, length);
      bool near_knot = t - h < c.lower_temperature() || t + h > c.upper_temperature();
      for (double b : knots)
        near_knot =
            near_knot || (std::fabs(t - b) <= h && k.term->kind() != "transition");
      if (near_knot)
        continue;
      const double fd = quantacal_test::richardson_derivative(
          [&](double s) { return c.evaluate(s).capacity; }, t, h);
      const double exact = here.capacity_derivative;
      // relative to the derivative scale C/T (the derivative itself passes through 0)
      const double scale = std::max(std::fabs(exact), here.capacity / t);
      const double e = std::fabs(fd - exact) / scale;
      worst = std::max(worst, e);
      // numerical: O(h^4) truncation plus eps C/h rounding of the difference;
      // measured worst 4e-10 (transition, rounding of T - T_t in the difference)
      EXPECT_LE(e, 2e-9) << k.label << " T = " << t;
    }
    std::printf("[ worst ] %-16s dC/dT vs Richardson: %.3g\n", k.label.c_str(), worst);
  }
}

TEST(EveryContribution, EnergyIsZeroAtZeroAndIncreasing) {
  for (const Case& k : all_cases()) {
    const auto& c = *k.term;
    if (c.lower_temperature() == 0.0) {
      EXPECT_LE(c.evaluate(1e-300).energy, 1e-200) << k.label; // U(0) = 0 by definition
    }
    double prev = -std::numeric_limits<double>::infinity();
    const double lo = std::max(c.lower_temperature(), 0.1);
    const double hi = std::min(c.upper_temperature(), 2000.0);
    for (int i = 0; i <= 2000; ++i) {
      const double t = lo * std::pow(hi / lo, i / 2000.0);
      const quantacal::ThermalState s = c.evaluate(t);
      EXPECT_GE(s.capacity, 0.0) << k.label << " T = " << t;
      EXPECT_GE(s.energy, prev) << k.label << " T = " << t; // C >= 0: U never falls
      prev = s.energy;
    }
  }
}

// Parameter names equal the card keys, and with_parameter changes exactly one.
TEST(EveryContribution, ParametersRoundTrip) {
  const std::map<std::string, std::vector<std::string>> expected{
      {"einstein", {"theta_E", "modes"}},
      {"debye", {"theta_D", "modes"}},
      {"electronic", {"gamma"}},
      {"schottky", {"gap", "degeneracy_ratio", "centres"}},
      {"transition", {"temperature", "latent_heat", "width"}},
      {"tabulated", {"scale"}},
      {"shomate", {"A", "B", "C", "D", "E"}},
      {"magnetic", {"critical_temperature", "moment", "structure_factor"}}};
  for (const Case& k : all_cases()) {
    const auto params = k.term->parameters();
    const auto& names = expected.at(k.term->kind());
    ASSERT_EQ(params.size(), names.size()) << k.label;
    for (std::size_t i = 0; i < names.size(); ++i) {
      EXPECT_EQ(params[i].name, names[i]) << k.label;
      const double changed =
          params[i].value * 0.75 + (params[i].value == 0.0 ? 1.0 : 0.0);
      const auto copy = k.term->with_parameter(params[i].name, changed);
      const auto after = copy->parameters();
      for (std::size_t j = 0; j < names.size(); ++j)
        EXPECT_EQ(after[j].value, i == j ? changed : params[j].value)
            << k.label << names[j];
      EXPECT_EQ(copy->kind(), k.term->kind());
    }
    EXPECT_THROW(k.term->with_parameter("theta", 1.0), std::invalid_argument) << k.label;
  }
  // scale multiplies the whole tabulated term, energy included
  const auto tab = illustrative_tabulated();
  const auto doubled = tab->with_parameter("scale", 2.0);
  EXPECT_DOUBLE_EQ(doubled->evaluate(55.0).capacity, 2.0 * tab->evaluate(55.0).capacity);
  EXPECT_DOUBLE_EQ(doubled->evaluate(55.0).energy, 2.0 * tab->evaluate(55.0).energy);
}

std::string message_of(const std::function<void()>& f) {
  try {
    f();
  } catch (const std::invalid_argument& e) {
    return e.what();
  }
  return "(no exception)";
}

TEST(EveryContribution, InvalidParametersAreNamed) {
  const double nan = std::numeric_limits<double>::quiet_NaN();
  EXPECT_EQ(message_of([] { quantacal::make_debye(-3.0); }),
            "debye: theta_D = -3 K: expected > 0 K");
  EXPECT_EQ(message_of([] { quantacal::make_debye(300.0, 0.0); }),
            "debye: modes = 0: expected > 0");
  EXPECT_EQ(message_of([&] { quantacal::make_einstein(nan); }),
            "einstein: theta_E = nan K: expected a finite value > 0 K");
  EXPECT_EQ(message_of([] { quantacal::make_electronic(-1e-3); }),
            "electronic: gamma = -0.001 J/mol/K^2: expected >= 0 J/mol/K^2");
  EXPECT_EQ(message_of([] { quantacal::make_schottky(10.0, 0.0, 1.0); }),
            "schottky: degeneracy_ratio = 0: expected > 0");
  EXPECT_EQ(message_of([] { quantacal::make_transition(900.0, 1e4, 0.0); }),
            "transition: width = 0 K: expected > 0 K");
  EXPECT_EQ(message_of([] { quantacal::make_transition(900.0, -1e4, 3.0); }),
            "transition: latent_heat = -10000 J/mol: expected > 0 J/mol");
  EXPECT_EQ(
      message_of([] {
        quantacal::make_tabulated({10.0, 10.0}, {1.0, 2.0}, t3_below());
      }),
      "tabulated: temperatures[1] = 10 K: expected > temperatures[0] = 10 K (strictly "
      "increasing)");
  EXPECT_EQ(message_of([] {
              quantacal::make_tabulated({10.0, 20.0}, {1.0, -2.0}, t3_below());
            }),
            "tabulated: capacities[1] = -2 J/mol/K: expected >= 0 J/mol/K");
  EXPECT_EQ(message_of([] { quantacal::make_tabulated({10.0}, {1.0}, t3_below()); }),
            "tabulated: 1 points: expected at least 2");
  EXPECT_EQ(message_of([] {
              quantacal::make_shomate(aluminium_shomate, 500.0, 300.0, t3_below());
            }),
            "shomate: t_high = 300 K: expected > t_low = 500 K");
  EXPECT_EQ(message_of([] {
              quantacal::make_shomate({1.0, 2.0}, 300.0, 500.0, t3_below());
            }),
            "shomate: 2 coefficients: expected 5 (A, B, C, D, E)");
  const auto model = std::make_shared<const quantacal::HeatCapacityModel>(
      "copper", std::vector<ContributionPtr>{quantacal::make_debye(343.0)});
  EXPECT_EQ(message_of([&] { quantacal::make_scaled(model, 1.5); }),
            "scaled: mole_fraction = 1.5: expected 0 < x <= 1");
  EXPECT_EQ(
      message_of([] { quantacal::make_debye(300.0)->with_parameter("theta", 1.0); }),
      "debye: no parameter named \"theta\" (parameters: theta_D, modes)");
}

// Schottky two-level anomaly, g = 1: the peak lies at x = Delta/T = 2.3994 with
// C_max = 0.4392 R (Gopal, Specific Heats at Low Temperatures, 1966, ch. 5; Kittel,
// Introduction to Solid State Physics, problem on two-level systems; from memory).
TEST(Schottky, PeakPositionAndHeight) {
  const auto s = quantacal::make_schottky(1.0, 1.0, 1.0);
  boost::math::tools::eps_tolerance<double> tol(50);
  std::uintmax_t iterations = 100;
  const auto root = boost::math::tools::toms748_solve(
      [&](double t) { return s->evaluate(t).capacity_derivative; }, 0.2, 1.0, tol,
      iterations);
  const double t_peak = 0.5 * (root.first + root.second);
  const double x_peak = 1.0 / t_peak;
  EXPECT_NEAR(x_peak, 2.3994, 1e-4); // Gopal (from memory), printed to 5 digits
  // the peak condition d/dx [x^2 e^x/(1+e^x)^2] = 0 is x tanh(x/2) = 2 (analytic)
  EXPECT_NEAR(x_peak * std::tanh(0.5 * x_peak), 2.0, 1e-12);
  EXPECT_NEAR(s->evaluate(t_peak).capacity / gas_constant, 0.4392,
              1e-4); // Gopal (from memory)
  // high-T limit of U: n R Delta g/(1+g) (two-level populations equal, analytic)
  const auto s3 = quantacal::make_schottky(10.0, 3.0, 0.5);
  EXPECT_NEAR(s3->evaluate(1e9).energy, 0.5 * gas_constant * 10.0 * 0.75, 1e-7);
}

// The transition against GSL's normal distribution (gsl_cdf_gaussian_P/Q,
// gsl_ran_gaussian_pdf).
TEST(Transition, MatchesGslNormalDistribution) {
  const double tt = 933.47, latent = 10710.0,
               w = 5.0; // Al: T_m, dH_fus (CRC); width illustrative
  const auto tr = quantacal::make_transition(tt, latent, w);
  double worst_u = 0.0, worst_c = 0.0;
  for (int i = -600; i <= 600; ++i) {
    const double d = i * 0.05 * w; // -30 w .. 30 w
    const double t = tt + d;
    const quantacal::ThermalState s = tr->evaluate(t);
    const double c_ref = latent * gsl_ran_gaussian_pdf(d, w);
    const double u_ref =
        d <= 0.0 ? latent * (gsl_cdf_gaussian_P(d, w) - gsl_cdf_gaussian_P(-tt, w))
                 : latent * (gsl_cdf_gaussian_Q(-tt, w) - gsl_cdf_gaussian_Q(d, w));
    if (c_ref > 1e-300)
      worst_c = std::max(worst_c, relative_difference(s.capacity, c_ref));
    if (u_ref > 1e-300)
      worst_u = std::max(worst_u, relative_difference(s.energy, u_ref));
  }
  std::printf("[ worst ] transition vs GSL normal: U %.3g, C %.3g\n", worst_u, worst_c);
  // numerical: measured 1.1e-13 (C) and 1.3e-13 (U) at |z| = 30, the condition number
  // z^2 = 900 of the Gaussian tail times the rounding of T; tails come from erfc on both
  // sides, so nothing cancels
  EXPECT_LE(worst_c, 3e-13);
  EXPECT_LE(worst_u, 3e-13);
  EXPECT_EQ(tr->breakpoints(), std::vector<double>{tt});
  // the peak height L/(w sqrt(2 pi)) at T_t (normal density; common practice)
  EXPECT_NEAR(tr->evaluate(tt).capacity, latent / (w * std::sqrt(2.0 * M_PI)), 1e-12);
}

// The tabulated term against Boost.Math's pchip (the outside reference of the
// interpolant).
TEST(Tabulated, MatchesBoostPchipAndItsPointsExactly) {
  const std::vector<double> t{4.0, 10.0, 15.0, 30.0, 50.0, 80.0, 120.0, 200.0};
  // illustrative points with a plateau and a peak (exercises the zero-slope rule)
  const std::vector<double> c{0.01, 0.2, 0.2, 3.0, 9.0, 7.0, 12.0, 20.0};
  const auto tab = quantacal::make_tabulated(t, c, t3_below());
  auto tx = t;
  auto cx = c;
  const boost::math::interpolators::pchip<std::vector<double>> ref(std::move(tx),
                                                                   std::move(cx));
  double worst_v = 0.0, worst_d = 0.0;
  for (int i = 0; i <= 1960; ++i) {
    const double x = 4.0 + i * 0.1;
    const quantacal::ThermalState s = tab->evaluate(x);
    worst_v = std::max(worst_v, std::fabs(s.capacity - ref(x)) / 20.0);
    worst_d = std::max(worst_d, std::fabs(s.capacity_derivative - ref.prime(x)) / 1.0);
  }
  std::printf(
      "[ worst ] tabulated vs boost pchip: C %.3g (of max C), dC/dT %.3g J/mol/K^2\n",
      worst_v, worst_d);
  EXPECT_LE(worst_v, 1e-15); // numerical: same cubic, different evaluation order
  EXPECT_LE(worst_d, 1e-14); // numerical
  for (std::size_t i = 0; i < t.size(); ++i)
    EXPECT_EQ(tab->evaluate(t[i]).capacity, c[i])
        << t[i]; // passes through the points exactly
  // monotone between monotone data: the plateau stays flat, no overshoot at the peak
  for (double x = 10.0; x <= 15.0; x += 0.01)
    EXPECT_NEAR(tab->evaluate(x).capacity, 0.2, 1e-15);
  for (double x = 50.0; x <= 80.0; x += 0.01) {
    EXPECT_LE(tab->evaluate(x).capacity, 9.0);
    EXPECT_GE(tab->evaluate(x).capacity, 7.0);
  }
  EXPECT_EQ(tab->breakpoints(), t);
  EXPECT_EQ(tab->upper_temperature(), 200.0);
}

TEST(Tabulated, LowerExtensions) {
  const std::vector<double> t{10.0, 20.0, 40.0};
  const std::vector<double> c{0.5, 3.0, 10.0};
  // debye_t3: C = C1 (T/T1)^3 below T1, U(T1) = C1 T1/4 (Debye T^3 law, Kittel)
  const auto a = quantacal::make_tabulated(t, c, t3_below());
  EXPECT_EQ(a->lower_temperature(), 0.0);
  EXPECT_DOUBLE_EQ(a->evaluate(10.0).energy, 0.5 * 10.0 / 4.0);
  EXPECT_DOUBLE_EQ(a->evaluate(5.0).capacity, 0.5 / 8.0);
  EXPECT_DOUBLE_EQ(a->evaluate(5.0).energy, 0.5 / 8.0 * 5.0 / 4.0);
  // both sides of the T1 crossover (T^3 branch / cubic): C and U continuous (U by
  // construction of the prefix sums, C because the extension starts at C1)
  const double t1m = 10.0 * (1.0 - 1e-12), t1p = 10.0 * (1.0 + 1e-12);
  EXPECT_LE(relative_difference(a->evaluate(t1m).capacity, a->evaluate(t1p).capacity),
            1e-10);
  EXPECT_LE(relative_difference(a->evaluate(t1m).energy, a->evaluate(t1p).energy), 1e-11);
  // energy: U(T1) given, undefined below (the model refuses T < T1)
  const auto b = quantacal::make_tabulated(t, c, energy_below(1.75));
  EXPECT_EQ(b->lower_temperature(), 10.0);
  EXPECT_DOUBLE_EQ(b->evaluate(10.0).energy, 1.75);
  const quantacal::HeatCapacityModel m("sample", {b});
  EXPECT_THROW(m.evaluate(9.0), quantacal::RangeError);
  EXPECT_THROW(m.evaluate(40.5), quantacal::RangeError);
  EXPECT_NO_THROW(m.evaluate(40.0));
}

// Shomate aluminium (NIST WebBook coefficients, from memory) against the handbook value.
TEST(Shomate, AluminiumAgainstHandbook) {
  const auto s =
      quantacal::make_shomate(aluminium_shomate, 298.0, 933.0, energy_below(4540.0));
  // Cp(298.15 K) = 24.200 J/mol/K (CRC Handbook); model limit: the fit, 0.1 %
  EXPECT_NEAR(s->evaluate(298.15).capacity, 24.200, 0.024);
  EXPECT_EQ(s->lower_temperature(), 298.0);
  EXPECT_EQ(s->upper_temperature(), 933.0);
  EXPECT_EQ(s->breakpoints(), std::vector<double>{298.0});
  EXPECT_DOUBLE_EQ(s->evaluate(298.0).energy,
                   4540.0); // CODATA H(298.15)-H(0), 4.540 kJ/mol
  const auto t3 = quantacal::make_shomate(aluminium_shomate, 298.0, 933.0, t3_below());
  const double c_low = t3->evaluate(298.0).capacity;
  EXPECT_DOUBLE_EQ(t3->evaluate(149.0).capacity, c_low / 8.0); // T^3 below t_low
  EXPECT_DOUBLE_EQ(t3->evaluate(298.0).energy, c_low * 298.0 / 4.0);
  // both sides of the t_low crossover: C and U continuous
  const double lo = 298.0 * (1.0 - 1e-12), hi = 298.0 * (1.0 + 1e-12);
  EXPECT_LE(relative_difference(t3->evaluate(lo).capacity, t3->evaluate(hi).capacity),
            1e-10);
  EXPECT_LE(relative_difference(t3->evaluate(lo).energy, t3->evaluate(hi).energy), 1e-11);
}

} // namespace
