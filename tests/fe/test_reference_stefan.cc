// SPDX-License-Identifier: Apache-2.0
// Tests of Neumann's solution (tests/fe/reference/stefan.h): it must satisfy the
// problem it solves (heat equation in each phase, T = T_m at the front, the
// Stefan condition, global energy balance), independently of how lambda was found.
#include "reference/stefan.h"

#include <boost/math/constants/constants.hpp>
#include <boost/math/quadrature/gauss_kronrod.hpp>
#include <boost/math/special_functions/erf.hpp>

#include <gtest/gtest.h>

#include <cmath>

namespace {

using quantacal::reference::NeumannSolution;
using quantacal::reference::StefanProblem;

// Illustrative data (roughly a light alloy): the checks below hold for any data.
StefanProblem two_phase() {
  StefanProblem p;
  p.density = 2700.0;            // kg/m^3
  p.latent_heat = 3.9e5;         // J/kg
  p.melting_temperature = 900.0; // K
  p.initial_temperature = 950.0; // K
  p.surface_temperature = 600.0; // K
  p.solid = {200.0, 1000.0};     // k W/m/K, c J/kg/K
  p.liquid = {90.0, 1150.0};
  return p;
}

TEST(ReferenceStefan, OnePhaseLimitMatchesQuasiStationaryExpansion) {
  // One phase (T_i = T_m): e^{-l^2}/erf(l) = l sqrt(pi)/St. For small Stefan
  // number St = c (T_m - T_0)/L, expanding both sides gives
  // l^2 = St/2 (1 - St/3 + O(St^2)) (Carslaw and Jaeger ch. 11; the leading
  // term is the quasi-stationary front X = sqrt(2 k (T_m - T_0) t / (rho L))).
  // Measured relative deviation 7.8e-6 at St = 0.01 (the O(St^2) term: a model limit).
  StefanProblem p = two_phase();
  p.initial_temperature = p.melting_temperature;
  p.solid.specific_heat =
      0.01 * p.latent_heat / (p.melting_temperature - p.surface_temperature);
  const double st = 0.01;
  const NeumannSolution s(p);
  const double expected = std::sqrt(st / 2.0 * (1.0 - st / 3.0));
  EXPECT_NEAR(s.lambda() / expected, 1.0, 2e-5);
}

TEST(ReferenceStefan, TemperatureIsContinuousAndEqualsMeltingAtTheFront) {
  const StefanProblem p = two_phase();
  const NeumannSolution s(p);
  const double t = 10.0;
  const double x = s.front_position(t);
  EXPECT_NEAR(s.temperature(0.0, t), p.surface_temperature, 1e-12);
  EXPECT_NEAR(s.temperature(x * (1 - 1e-12), t), p.melting_temperature, 1e-8);
  EXPECT_NEAR(s.temperature(x * (1 + 1e-12), t), p.melting_temperature, 1e-8);
  // far field: the initial liquid temperature
  EXPECT_NEAR(s.temperature(50.0 * std::sqrt(s.liquid_diffusivity() * t), t),
              p.initial_temperature, 1e-9);
}

TEST(ReferenceStefan, SatisfiesHeatEquationInBothPhases) {
  // dT/dt = alpha d2T/dx2, checked by central differences (steps 1e-4 relative;
  // rounding-limited, measured 4.0e-7 relative).
  const StefanProblem p = two_phase();
  const NeumannSolution s(p);
  const double t = 5.0;
  const double front = s.front_position(t);
  for (const double f : {0.3, 0.7, 1.4, 2.5}) {
    const double x = f * front;
    const double alpha = f < 1 ? s.solid_diffusivity() : s.liquid_diffusivity();
    const double hx = 1e-4 * front, ht = 1e-4 * t;
    const double dtdt = (s.temperature(x, t + ht) - s.temperature(x, t - ht)) / (2 * ht);
    const double d2 =
        (s.temperature(x + hx, t) - 2 * s.temperature(x, t) + s.temperature(x - hx, t)) /
        (hx * hx);
    EXPECT_NEAR(dtdt, alpha * d2, 1e-5 * std::abs(dtdt)) << "x/X = " << f;
  }
}

TEST(ReferenceStefan, SatisfiesTheStefanConditionAtTheFront) {
  // k_s dT_s/dx - k_l dT_l/dx = rho L dX/dt (Carslaw and Jaeger ch. 11), by
  // one-sided differences inside each phase (second order); measured 1.5e-8 relative.
  const StefanProblem p = two_phase();
  const NeumannSolution s(p);
  const double t = 7.0;
  const double x = s.front_position(t);
  const double h = 1e-5 * x;
  const double ts = (3 * s.temperature(x - 1e-13 * x, t) - 4 * s.temperature(x - h, t) +
                     s.temperature(x - 2 * h, t)) /
                    (2 * h);
  const double tl = (-3 * s.temperature(x + 1e-13 * x, t) + 4 * s.temperature(x + h, t) -
                     s.temperature(x + 2 * h, t)) /
                    (2 * h);
  const double lhs = p.solid.conductivity * ts - p.liquid.conductivity * tl;
  const double dxdt = s.front_position(t) / (2 * t); // X ~ sqrt(t)
  const double rhs = p.density * p.latent_heat * dxdt;
  EXPECT_NEAR(lhs / rhs, 1.0, 1e-5);
}

TEST(ReferenceStefan, HeatDrawnThroughTheSurfaceEqualsEnergyLost) {
  // Global energy balance over 0 < x < inf up to time t: the heat conducted out
  // through x = 0, int_0^t k_s dT/dx(0) = 2 k_s (T_m - T_0) sqrt(t/(pi alpha_s)) /
  // erf(l), equals the loss of sensible heat plus the latent heat of the solid formed.
  // Quadrature: Boost.Math Gauss-Kronrod, split at the front; measured 2.2e-16.
  const StefanProblem p = two_phase();
  const NeumannSolution s(p);
  const double t = 12.0;
  const double front = s.front_position(t);
  const double pi = boost::math::constants::pi<double>();
  const double drawn =
      2.0 * p.solid.conductivity * (p.melting_temperature - p.surface_temperature) *
      std::sqrt(t / (pi * s.solid_diffusivity())) / boost::math::erf(s.lambda());
  using boost::math::quadrature::gauss_kronrod;
  const auto solid = [&](double x) {
    return p.density *
           (p.latent_heat +
            p.liquid.specific_heat * (p.initial_temperature - p.melting_temperature) +
            p.solid.specific_heat * (p.melting_temperature - s.temperature(x, t)));
  };
  const auto liquid = [&](double x) {
    return p.density * p.liquid.specific_heat *
           (p.initial_temperature - s.temperature(x, t));
  };
  const double far = front + 40.0 * std::sqrt(s.liquid_diffusivity() * t);
  const double lost = gauss_kronrod<double, 61>::integrate(solid, 0.0, front, 10, 1e-14) +
                      gauss_kronrod<double, 61>::integrate(liquid, front, far, 10, 1e-14);
  EXPECT_NEAR(lost / drawn, 1.0, 1e-10);
}

TEST(ReferenceStefan, ResidualVanishesAtLambda) {
  const NeumannSolution s(two_phase());
  EXPECT_NEAR(s.residual(s.lambda()), 0.0, 1e-13);
  EXPECT_GT(s.residual(0.9 * s.lambda()), 0.0);
  EXPECT_LT(s.residual(1.1 * s.lambda()), 0.0);
}

TEST(ReferenceStefan, RejectsNonPhysicalInput) {
  StefanProblem p = two_phase();
  p.surface_temperature = 950.0;
  EXPECT_THROW(NeumannSolution{p}, std::invalid_argument);
  p = two_phase();
  p.latent_heat = 0.0;
  EXPECT_THROW(NeumannSolution{p}, std::invalid_argument);
}

} // namespace
