// SPDX-License-Identifier: Apache-2.0
// Tests of the lumped radiation and h(T) cooling times
// (tests/fe/reference/lumped_boundary.h) against an independent Boost.Math
// quadrature of the energy balance and the constant-h closed form. Nothing here
// runs the solver.
#include "reference/lumped_boundary.h"

#include <boost/math/quadrature/tanh_sinh.hpp>

#include <gtest/gtest.h>

#include <cmath>

namespace {

using namespace quantacal::reference;

constexpr double capacity_per_area = 3449.6; // J/m^2/K, illustrative (rho c V/A)

TEST(ReferenceLumpedBoundary, RadiationClosedFormIsTheIntegralOfTheBalance) {
  // t(T) = (rho c V/A) int_T^{T_i} dT' / (eps sigma (T'^4 - T_a^4)), by tanh-sinh;
  // Incropera and DeWitt sec. 5.3 (closed form eq. 5.18 for T_a > 0, eq. 5.19 for
  // T_a = 0; numbers from memory).
  const double eps = 0.8, sigma = stefan_boltzmann_constant;
  boost::math::quadrature::tanh_sinh<double> integrator;
  for (const double ambient : {0.0, 77.0, 300.0}) {
    for (const double end : {950.0, 600.0, 400.0, 310.0}) {
      if (end <= ambient)
        continue;
      const double closed =
          radiation_cooling_time(capacity_per_area, eps, ambient, 1000.0, end);
      const double a4 = std::pow(ambient, 4);
      const double quad =
          capacity_per_area *
          integrator.integrate(
              [&](double t) { return 1.0 / (eps * sigma * (t * t * t * t - a4)); }, end,
              1000.0);
      EXPECT_NEAR(closed / quad, 1.0, 1e-11) << "T_a = " << ambient << ", T = " << end;
    }
  }
}

TEST(ReferenceLumpedBoundary, ConstantCoefficientGivesTheLogarithmicLaw) {
  // Incropera and DeWitt eq. 5.5: t = (rho c V / h A) ln[(T_i - T_a)/(T - T_a)].
  const double h = 37.0, ambient = 303.15;
  for (const double end : {700.0, 400.0, 305.0}) {
    double err = 0.0;
    const double t = curve_cooling_time(
        capacity_per_area, [h](double) { return h; }, {350.0, 500.0}, ambient, 800.0, end,
        &err);
    const double expected =
        capacity_per_area / h * std::log((800.0 - ambient) / (end - ambient));
    EXPECT_NEAR(t / expected, 1.0, 1e-12) << end;
    EXPECT_LT(err, 1e-10 * expected);
  }
}

TEST(ReferenceLumpedBoundary, TemperatureAtInvertsTheCoolingTime) {
  const auto t_of = [](double t) {
    return radiation_cooling_time(capacity_per_area, 0.5, 300.0, 1000.0, t);
  };
  for (const double temperature : {990.0, 700.0, 420.0}) {
    const double time = t_of(temperature);
    EXPECT_NEAR(temperature_at(t_of, 1000.0, 400.0, time), temperature, 1e-9);
  }
  EXPECT_EQ(temperature_at(t_of, 1000.0, 400.0, 0.0), 1000.0);
  EXPECT_THROW(temperature_at(t_of, 1000.0, 400.0, 10 * t_of(400.0)),
               std::invalid_argument);
}

} // namespace
