// SPDX-License-Identifier: Apache-2.0
// Tests of the lumped-capacitance cooling time (tests/fe/reference/lumped.h)
// against closed forms and an independent Boost.Math quadrature.
#include "reference/lumped.h"

#include <quantacal/material/material.h>
#include <quantacal/models/conductivity.h>
#include <quantacal/models/contribution.h>
#include <quantacal/models/heat_capacity_model.h>

#include <boost/math/quadrature/tanh_sinh.hpp>

#include <gtest/gtest.h>

#include <cmath>
#include <memory>

namespace {

using quantacal::reference::lumped_cooling_time;
using quantacal::reference::LumpedBody;

// Illustrative body: a 10 mm steel-like sphere (V/A = R/3) in oil.
LumpedBody body() {
  return {0.005 / 3.0, 300.0, 330.0};
}

TEST(ReferenceLumped, ConstantCapacityGivesTheLogarithmicLaw) {
  // Incropera and DeWitt, Fundamentals of Heat and Mass Transfer, eq. 5.5:
  // t = (rho V c / h A) ln[(T_i - T_inf)/(T - T_inf)]. Measured 1e-16 relative.
  const double rc = 7800.0 * 470.0; // J/m^3/K
  const auto b = body();
  const double t = lumped_cooling_time(
      b, [rc](double) { return rc; }, 1100.0, 400.0);
  const double expected = rc * b.volume_to_area / b.heat_transfer_coefficient *
                          std::log((1100.0 - 330.0) / (400.0 - 330.0));
  EXPECT_NEAR(t / expected, 1.0, 1e-13);
}

TEST(ReferenceLumped, LinearCapacityGivesItsClosedForm) {
  // rho c = a + b T: int (a + b T)/(T - T_inf) dT = (a + b T_inf) ln(..) + b (T1 - T2)
  // (elementary integral). Measured 0 (exact to rounding).
  const double a = 2.0e6, slope = 2.5e3;
  const auto b = body();
  const double t1 = 1000.0, t2 = 350.0, ti = b.ambient_temperature;
  const double t = lumped_cooling_time(
      b, [&](double T) { return a + slope * T; }, t1, t2);
  const double expected =
      b.volume_to_area / b.heat_transfer_coefficient *
      ((a + slope * ti) * std::log((t1 - ti) / (t2 - ti)) + slope * (t1 - t2));
  EXPECT_NEAR(t / expected, 1.0, 1e-13);
}

TEST(ReferenceLumped, HeatingIsTheMirrorOfCooling) {
  // Heating from 300 K to 600 K in 700 K surroundings, constant capacity:
  // t = (rho c V / h A) ln[(700 - 300)/(700 - 600)] (Incropera and DeWitt eq. 5.5).
  // Measured 4.4e-16.
  const double rc = 3.0e6;
  LumpedBody b = body();
  b.ambient_temperature = 700.0;
  const double t = lumped_cooling_time(
      b, [rc](double) { return rc; }, 300.0, 600.0);
  EXPECT_NEAR(t / (rc * b.volume_to_area / b.heat_transfer_coefficient * std::log(4.0)),
              1.0, 1e-13);
}

TEST(ReferenceLumped, NarrowPeakAgreesWithTanhSinhInTemperature) {
  // A latent-heat peak (normal pdf, width 2 K) on a constant capacity: the
  // logarithmic Gauss-Kronrod form split at the peak against Boost.Math
  // tanh-sinh quadrature of the original form in T, split at the same place.
  // Measured 1.2e-14 relative.
  const double rc = 3.0e6, latent = 1.0e9, tp = 800.0, w = 2.0;
  const auto cap = [&](double T) {
    const double z = (T - tp) / w;
    return rc + latent * std::exp(-0.5 * z * z) / (w * std::sqrt(2.0 * M_PI));
  };
  const auto b = body();
  const double t = lumped_cooling_time(b, cap, 1000.0, 400.0, {tp});
  boost::math::quadrature::tanh_sinh<double> ts;
  const auto f = [&](double T) { return cap(T) / (T - b.ambient_temperature); };
  const double expected = b.volume_to_area / b.heat_transfer_coefficient *
                          (ts.integrate(f, 400.0, tp) + ts.integrate(f, tp, 1000.0));
  EXPECT_NEAR(t / expected, 1.0, 1e-12);
}

TEST(ReferenceLumped, MaterialOverloadUsesTheExactModel) {
  // A material whose whole capacity is electronic, C = gamma T (per mole):
  // rho c = (rho/M) gamma T, the linear case above with a = 0. Measured 0.
  const double gamma = 0.01, molar_mass = 0.05, density = 5000.0; // illustrative
  quantacal::MaterialData d;
  d.name = "electronic-only (illustrative)";
  d.molar_mass = molar_mass;
  d.reference_density = density;
  d.lower_temperature = 10.0;
  d.upper_temperature = 2000.0;
  d.model = std::make_shared<quantacal::HeatCapacityModel>(
      d.name, std::vector<quantacal::ContributionPtr>{quantacal::make_electronic(gamma)});
  d.conductivity = quantacal::make_constant_conductivity(10.0);
  const quantacal::Material m(d);
  const auto b = body();
  const double t1 = 1000.0, t2 = 350.0, ti = b.ambient_temperature;
  const double slope = density / molar_mass * gamma;
  const double expected = b.volume_to_area / b.heat_transfer_coefficient * slope *
                          (ti * std::log((t1 - ti) / (t2 - ti)) + (t1 - t2));
  EXPECT_NEAR(lumped_cooling_time(b, m, t1, t2) / expected, 1.0, 1e-12);
}

TEST(ReferenceLumped, RejectsAnEndBeyondTheAmbient) {
  const auto b = body();
  const auto one = [](double) { return 1.0; };
  EXPECT_THROW(lumped_cooling_time(b, one, 1000.0, 300.0), std::invalid_argument);
  EXPECT_THROW(lumped_cooling_time(b, one, 400.0, 500.0), std::invalid_argument);
}

} // namespace
