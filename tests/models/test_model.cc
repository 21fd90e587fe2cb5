// SPDX-License-Identifier: Apache-2.0
// HeatCapacityModel: range checks, domains, dilation (C_p - C_v), Neumann-Kopp
// composition.
#include "support.h"

#include <quantacal/common/exceptions.h>
#include <quantacal/models/heat_capacity_model.h>

#include <gtest/gtest.h>

#include <chrono>
#include <cmath>
#include <cstdio>
#include <limits>
#include <memory>

namespace {

using quantacal::ContributionPtr;
using quantacal::Dilation;
using quantacal::gas_constant;
using quantacal::HeatCapacityModel;
using quantacal::LowerExtension;
using quantacal_test::relative_difference;

HeatCapacityModel copper(std::optional<Dilation> d = std::nullopt) {
  // theta_D = 343 K, gamma = 0.695 mJ/mol/K^2 (Kittel, Introduction to Solid State
  // Physics)
  return HeatCapacityModel(
      "copper", {quantacal::make_debye(343.0), quantacal::make_electronic(0.695e-3)}, d);
}

Dilation grueneisen_copper() {
  Dilation d;
  d.kind = Dilation::Kind::grueneisen;
  d.grueneisen = 2.02;       // computed, 3 alpha K V_m / C_p (from CRC Handbook inputs)
  d.bulk_modulus = 137.8e9;  // Pa, CRC
  d.molar_volume = 7.112e-6; // m^3/mol, computed from CRC density and molar mass
  return d;
}

Dilation nernst(double a) {
  Dilation d;
  d.kind = Dilation::Kind::nernst_lindemann;
  d.coefficient = a;
  return d;
}

quantacal::RangeError range_error_of(const HeatCapacityModel& m, double t) {
  try {
    m.evaluate(t);
  } catch (const quantacal::RangeError& e) {
    return e;
  }
  ADD_FAILURE() << "no RangeError at T = " << t;
  return quantacal::RangeError("", "", "", 0.0);
}

TEST(HeatCapacityModel, RangeErrorsNameTheMaterialAndTheValue) {
  const HeatCapacityModel m = copper();
  const quantacal::RangeError e = range_error_of(m, -3.0);
  EXPECT_STREQ(e.what(), "quantacal::HeatCapacityModel::evaluate: copper: requires 0 < T "
                         "< inf but got -3 K");
  EXPECT_EQ(e.subject(), "copper");
  EXPECT_EQ(e.condition(), "0 < T < inf");
  EXPECT_EQ(e.value(), -3.0);
  EXPECT_EQ(range_error_of(m, 0.0).value(), 0.0);
  EXPECT_TRUE(
      std::isnan(range_error_of(m, std::numeric_limits<double>::quiet_NaN()).value()));
  EXPECT_STREQ(range_error_of(m, std::numeric_limits<double>::infinity()).what(),
               "quantacal::HeatCapacityModel::evaluate: copper: requires 0 < T < inf but "
               "got inf K");
  // a bounded domain: the intersection of the terms' domains
  const HeatCapacityModel b(
      "sample",
      {quantacal::make_debye(300.0),
       quantacal::make_tabulated({10.0, 20.0, 40.0}, {0.5, 3.0, 10.0},
                                 LowerExtension{LowerExtension::Kind::energy, 1.0})});
  EXPECT_EQ(b.lower_temperature(), 10.0);
  EXPECT_EQ(b.upper_temperature(), 40.0);
  EXPECT_STREQ(
      range_error_of(b, 41.0).what(),
      "quantacal::HeatCapacityModel::evaluate: sample: requires 10 K <= T <= 40 K but "
      "got 41 K");
  EXPECT_EQ(range_error_of(b, 9.5).condition(), "10 K <= T <= 40 K");
  const HeatCapacityModel c(
      "upper_only",
      {quantacal::make_tabulated({10.0, 20.0}, {0.5, 3.0}, LowerExtension{})});
  EXPECT_EQ(range_error_of(c, 25.0).condition(), "0 < T <= 20 K");
}

TEST(HeatCapacityModel, SumsTermsAndUnitesBreakpoints) {
  const auto debye = quantacal::make_debye(343.0);
  const auto el = quantacal::make_electronic(0.695e-3);
  const auto melt =
      quantacal::make_transition(1357.77, 13260.0, 4.0); // Cu, CRC (L from memory)
  const auto tab = quantacal::make_tabulated({1357.77, 1400.0, 1500.0}, {0.0, 0.0, 0.0},
                                             LowerExtension{});
  const HeatCapacityModel m("copper", {debye, el, melt});
  for (double t : {4.0, 77.0, 300.0, 1357.0}) {
    const quantacal::ThermalState s = m.evaluate(t);
    const quantacal::ThermalState r =
        debye->evaluate(t) + el->evaluate(t) + melt->evaluate(t);
    EXPECT_EQ(s.energy, r.energy);
    EXPECT_EQ(s.capacity, r.capacity);
    EXPECT_EQ(s.capacity_derivative, r.capacity_derivative);
  }
  const HeatCapacityModel n("copper", {melt, tab, debye});
  EXPECT_EQ(n.breakpoints(),
            (std::vector<double>{1357.77, 1400.0, 1500.0})); // sorted, unique
  EXPECT_EQ(n.upper_temperature(), 1500.0);
  // with_contribution replaces one term
  const HeatCapacityModel w = m.with_contribution(0, quantacal::make_debye(300.0));
  EXPECT_EQ(w.contributions()[0]->parameters()[0].value, 300.0);
  EXPECT_NE(w.evaluate(50.0).capacity, m.evaluate(50.0).capacity);
  EXPECT_EQ(w.contributions()[1], el);
  EXPECT_THROW(m.with_contribution(3, debye), quantacal::InputError);
}

TEST(HeatCapacityModel, RejectsBadConstruction) {
  EXPECT_THROW(HeatCapacityModel("x", {}), std::invalid_argument);
  EXPECT_THROW(HeatCapacityModel("x", {nullptr}), std::invalid_argument);
  const auto shomate =
      quantacal::make_shomate({28.0, 0.0, 0.0, 0.0, 0.0}, 298.0, 933.0,
                              LowerExtension{LowerExtension::Kind::energy, 0.0});
  const auto tab = quantacal::make_tabulated({10.0, 20.0}, {1.0, 2.0}, LowerExtension{});
  EXPECT_THROW(HeatCapacityModel("x", {shomate, tab}),
               std::invalid_argument); // no overlap
  EXPECT_THROW(copper(nernst(-1.0)), std::invalid_argument);
  Dilation g = grueneisen_copper();
  g.bulk_modulus = 0.0;
  EXPECT_THROW(copper(g), std::invalid_argument);
}

// Nernst-Lindemann: the returned C_p solves C_p - C_v = A C_p^2 T (Nernst and Lindemann
// 1911; Gopal, Specific Heats at Low Temperatures), its slope matches a Richardson
// difference and its energy the quadrature of C_p.
TEST(Dilation, NernstLindemannIsExactAndEnergyConsistent) {
  const double a =
      4e-6; // mol/J, illustrative (the Grueneisen value of copper is 4.16e-6)
  const HeatCapacityModel cv = copper();
  const HeatCapacityModel cp = copper(nernst(a));
  double worst_identity = 0.0, worst_u = 0.0, worst_d = 0.0;
  for (double t : {2.0, 20.0, 77.0, 150.0, 298.15, 600.0, 1300.0}) {
    const quantacal::ThermalState p = cp.evaluate(t);
    const quantacal::ThermalState v = cv.evaluate(t);
    // residual of the defining equation, relative to C_p
    worst_identity = std::max(worst_identity, std::fabs(p.capacity - v.capacity -
                                                        a * p.capacity * p.capacity * t) /
                                                  p.capacity);
    const double u_ref = quantacal_test::integrate(
        [&](double s) { return cp.evaluate(s).capacity; }, 0.0, t);
    worst_u = std::max(worst_u, relative_difference(p.energy, u_ref));
    const double fd = quantacal_test::richardson_derivative(
        [&](double s) { return cp.evaluate(s).capacity; }, t, 1e-3 * t);
    worst_d = std::max(worst_d, relative_difference(p.capacity_derivative, fd));
  }
  std::printf(
      "[ worst ] Nernst-Lindemann: identity %.3g, U vs quadrature %.3g, dC/dT %.3g\n",
      worst_identity, worst_u, worst_d);
  EXPECT_LE(worst_identity, 5e-16); // numerical: rounding of C_p (measured in the output)
  EXPECT_LE(worst_u, 1e-10);        // the bound
  EXPECT_LE(worst_d, 1e-10);        // numerical (finite difference), measured 1.5e-12

  // no solution once 4 A T C_v >= 1: a NumericalError naming the material and T
  const HeatCapacityModel bad = copper(nernst(1e-2));
  try {
    bad.evaluate(300.0);
    ADD_FAILURE() << "no NumericalError";
  } catch (const quantacal::NumericalError& e) {
    const std::string m = e.what();
    EXPECT_NE(m.find("copper"), std::string::npos) << m;
    EXPECT_NE(m.find("T = 300 K"), std::string::npos) << m;
  }
}

// Grueneisen: C_p - C_v = A C_v^2 T; for copper at 298.15 K it must agree with the
// thermodynamic identity C_p - C_v = 9 alpha^2 K_T V_m T (Callen, Thermodynamics, ch. 3)
// evaluated with CRC alpha = 16.5e-6 /K and K_T = 137.8 GPa: 0.716 J/mol/K.
TEST(Dilation, GrueneisenCopperMatchesThermodynamicIdentity) {
  const HeatCapacityModel cv = copper();
  const HeatCapacityModel cp = copper(grueneisen_copper());
  const double t = 298.15;
  const double alpha = 16.5e-6, k = 137.8e9,
               vm = 7.112e-6; // CRC (alpha, K); V_m computed
  const double identity = 9.0 * alpha * alpha * k * vm * t;
  const double delta = cp.evaluate(t).capacity - cv.evaluate(t).capacity;
  std::printf("[ info  ] copper Cp - Cv at 298.15 K: model %.4f, identity %.4f J/mol/K\n",
              delta, identity);
  // model limit: the Debye C_v is not the true C_v, and gamma_G was derived from C_p: 5 %
  EXPECT_NEAR(delta, identity, 0.05 * identity);
  // dC_p/dT and U: same consistency checks as Nernst-Lindemann
  for (double s : {10.0, 100.0, 298.15, 1000.0}) {
    const quantacal::ThermalState p = cp.evaluate(s);
    const double u_ref = quantacal_test::integrate(
        [&](double x) { return cp.evaluate(x).capacity; }, 0.0, s);
    EXPECT_LE(relative_difference(p.energy, u_ref), 1e-10) << s; // the bound
    const double fd = quantacal_test::richardson_derivative(
        [&](double x) { return cp.evaluate(x).capacity; }, s, 1e-3 * s);
    EXPECT_LE(relative_difference(p.capacity_derivative, fd), 1e-8) << s; // numerical
  }
  // cost of one evaluate with dilation (quadrature of the correction): reported, not
  // asserted
  const auto t0 = std::chrono::steady_clock::now();
  double sink = 0.0;
  for (int i = 0; i < 200; ++i)
    sink += cp.evaluate(10.0 + 5.0 * i).energy;
  const auto t1 = std::chrono::steady_clock::now();
  std::printf("[ info  ] evaluate with Grueneisen dilation: %.1f us (sink %g)\n",
              std::chrono::duration<double, std::micro>(t1 - t0).count() / 200.0, sink);
}

// Neumann-Kopp: an alloy's molar capacity is the mole-fraction sum of its components'
// (Kopp's rule; common practice for alloys without mixing data).
TEST(NeumannKopp, ScaledComponentsAddUp) {
  const auto cu = std::make_shared<const HeatCapacityModel>(copper());
  const auto ni = std::make_shared<const HeatCapacityModel>(
      HeatCapacityModel("nickel", {quantacal::make_debye(450.0),
                                   quantacal::make_electronic(7.02e-3)})); // Kittel
  const HeatCapacityModel alloy(
      "cupronickel", {quantacal::make_scaled(cu, 0.7), quantacal::make_scaled(ni, 0.3)});
  for (double t : {4.0, 77.0, 300.0, 1000.0}) {
    const quantacal::ThermalState s = alloy.evaluate(t);
    const quantacal::ThermalState r = 0.7 * cu->evaluate(t) + 0.3 * ni->evaluate(t);
    EXPECT_DOUBLE_EQ(s.capacity, r.capacity);
    EXPECT_DOUBLE_EQ(s.energy, r.energy);
  }
  // lattice part at high T -> 3R per mole of atoms (Dulong-Petit, Kittel), plus gamma T
  const double t = 1e5;
  EXPECT_NEAR(alloy.evaluate(t).capacity,
              3.0 * gas_constant + (0.7 * 0.695e-3 + 0.3 * 7.02e-3) * t, 1e-3);
  const auto sc = quantacal::make_scaled(cu, 0.7);
  EXPECT_EQ(sc->kind(), "scaled");
  EXPECT_EQ(sc->parameters()[0].name, "mole_fraction");
  EXPECT_FALSE(sc->dilated());
  // the component checks its own range
  EXPECT_THROW(sc->evaluate(-1.0), quantacal::RangeError);
}

} // namespace
