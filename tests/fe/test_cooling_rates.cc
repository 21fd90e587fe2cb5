// SPDX-License-Identifier: Apache-2.0
// The cooling rate dT/dt written for the probes (lib/solver/cooling_rates.h: the
// BDF2 difference of the TR-BDF2 stage values, Bank et al. 1985, Hosea and
// Shampine 1996), the crossings and the window passages (cooling_metrics.h), run
// in-process and checked against analytic solutions:
//  - a uniformly heated insulated body, T = T_0 + q t / (rho c) (energy balance):
//    the rate is q / (rho c) at every sample after t = 0;
//  - a small-Biot body (Bi = 1e-4) with constant properties cooled by convection,
//    T - T_inf = (T_i - T_inf) exp(-t / tau), tau = rho c V / (h A) (lumped
//    capacitance; Incropera and DeWitt, Fundamentals of Heat and Mass Transfer,
//    eq. 5.6): the rate -(T - T_inf)/tau at every sample, the crossing time and
//    rate, and the time, mean and largest cooling rate inside a window.
#include "reference/validation_support.h"

#include <quantacal/fe/material_field.h>
#include <quantacal/solver/solver.h>

#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <cstdio>

namespace {

using namespace quantacal;

// Illustrative constant properties (steel-like heat capacity; a conductivity high
// enough that the body stays uniform to Bi = 1e-4).
constexpr double density = 8000.0;      // kg/m^3
constexpr double specific_heat = 500.0; // J/kg/K
constexpr double radius = 0.01;         // m
constexpr double height = 0.02;         // m

solver::CaseDescription cylinder(double conductivity) {
  solver::CaseDescription d;
  d.name = "cooling rate check";
  d.geometry = solver::Geometry::axisymmetric;
  d.mesh.kind = solver::MeshSpec::Kind::cylinder;
  d.mesh.radius = radius;
  d.mesh.length = height;
  d.mesh.cells = {2, 4};
  solver::MaterialSpec m;
  m.id = 1;
  m.material = fe::make_constant_material("constant (illustrative)", density,
                                          specific_heat, conductivity, 200.0, 1500.0);
  d.materials = {m};
  solver::Probe centre, surface;
  centre.name = "centre";
  centre.point = {0.0, height / 2};
  surface.name = "surface";
  surface.point = {radius, height / 2};
  d.output.probes = {centre, surface};
  d.output.fields = false;
  d.output.plot = false;
  d.solver.newton_tolerance = 1e-10;
  return d;
}

// Insulated body with a uniform source q: dT/dt = q / (rho c) exactly (lumped energy
// balance, Incropera and DeWitt sec. 5.3 with no surface loss); the quadratic of a
// step reproduces a linear T(t), so the BDF2 difference is exact. No rate at t = 0,
// where the history starts.
void expect_uniform_rate(double power_density, const char* label) {
  solver::CaseDescription d = cylinder(50.0);
  d.initial_temperature = 400.0;
  solver::HeatSource q;
  q.power_density = power_density;
  d.sources = {q};
  d.time.end = 20.0;
  d.time.first_step = 0.1;
  const double expected = q.power_density / (density * specific_heat);
  const solver::RunResult r = solver::run_case(d, reference::quiet_run());
  ASSERT_TRUE(r.completed) << r.stop_reason;
  ASSERT_EQ(r.probe_rates.size(), 2u);
  double worst = 0.0;
  for (const auto& rates : r.probe_rates) {
    ASSERT_EQ(rates.size(), r.times.size());
    EXPECT_TRUE(std::isnan(rates.front()));
    for (std::size_t k = 1; k < rates.size(); ++k)
      worst = std::max(worst, std::abs(rates[k] / expected - 1.0));
  }
  std::printf("[measured] %s: worst relative rate error %.2e over %zu samples\n", label,
              worst, r.times.size());
  EXPECT_LT(worst, 1e-8); // Newton tolerance 1e-10 of the stage's energy change
  EXPECT_NEAR(r.probe_temperatures[0].back(), 400.0 + expected * d.time.end,
              1e-8 * 400.0);
}

TEST(CoolingRates, UniformHeatingGivesTheSourceRateAtEverySample) {
  expect_uniform_rate(4.0e6, "uniform heating, 4 MW/m^3 (+1 K/s)");
}

TEST(CoolingRates, ANegativeSourceIsAUniformSink) {
  // a negative power density is accepted on purpose: a volumetric sink (docs/cases.md)
  expect_uniform_rate(-4.0e6, "uniform sink, -4 MW/m^3 (-1 K/s)");
}

struct Lumped {
  double tau, initial, fluid;
  double temperature(double t) const {
    return fluid + (initial - fluid) * std::exp(-t / tau);
  }
  double rate(double t) const { return -(temperature(t) - fluid) / tau; }
  double time_at(double temperature) const {
    return tau * std::log((initial - fluid) / (temperature - fluid));
  }
};

class LumpedRates : public ::testing::Test {
protected:
  static void SetUpTestSuite() {
    const double h = 100.0, conductivity = 1.0e4; // Bi = h R / k = 1e-4
    solver::CaseDescription d = cylinder(conductivity);
    d.initial_temperature = exact_.initial;
    for (unsigned int id : {0u, 1u, 2u}) { // mantle and both ends
      solver::BoundarySpec b;
      b.boundary_id = id;
      b.convection = solver::BoundarySpec::Convection{solver::Curve{{exact_.fluid}, {h}},
                                                      exact_.fluid};
      d.boundaries.push_back(b);
    }
    d.time.end = 1.5 * exact_.tau;
    d.time.first_step = 0.01;
    d.time.max_step = exact_.tau / 50.0;
    d.time.tolerance = 0.01;
    d.output.crossing_temperatures = {600.0};
    d.output.windows = {{700.0, 500.0, {}}};
    result_ = new solver::RunResult(solver::run_case(d, reference::quiet_run()));
  }
  static void TearDownTestSuite() {
    delete result_;
    result_ = nullptr;
  }
  // V/A = R H / (2 (R + H)) for the whole cylinder surface
  static constexpr double volume_to_area = radius * height / (2.0 * (radius + height));
  static inline const Lumped exact_{density * specific_heat * volume_to_area / 100.0,
                                    800.0, 300.0};
  static inline solver::RunResult* result_ = nullptr;
};

TEST_F(LumpedRates, RateAtEverySampleFollowsTheExponential) {
  const solver::RunResult& r = *result_;
  ASSERT_TRUE(r.completed) << r.stop_reason;
  // after the conduction transient of the first steps (R^2 / alpha = 0.04 s): from 1 s
  double worst = 0.0, worst_difference = 0.0;
  for (std::size_t p = 0; p < 2; ++p)
    for (std::size_t k = 1; k < r.times.size(); ++k) {
      if (r.times[k] < 1.0)
        continue;
      const double exact = exact_.rate(r.times[k]);
      worst = std::max(worst, std::abs(r.probe_rates[p][k] / exact - 1.0));
      // what a backward difference of the written rows would give
      const double difference =
          (r.probe_temperatures[p][k] - r.probe_temperatures[p][k - 1]) /
          (r.times[k] - r.times[k - 1]);
      worst_difference = std::max(worst_difference, std::abs(difference / exact - 1.0));
    }
  std::printf("[measured] lumped cooling, tau = %.2f s, %u steps: worst relative rate "
              "error %.2e (backward difference of the rows: %.2e)\n",
              exact_.tau, r.steps.n_steps, worst, worst_difference);
  EXPECT_LT(worst, 2e-4);                   // measured 4.0e-5 (time step and Bi = 1e-4)
  EXPECT_LT(worst, 0.1 * worst_difference); // measured 1.0e-2 for the difference
}

TEST_F(LumpedRates, CrossingTimeAndRateMatchTheExponential) {
  const solver::RunResult& r = *result_;
  ASSERT_EQ(r.crossings.size(), 2u);
  for (const solver::Crossing& c : r.crossings) {
    ASSERT_TRUE(c.crossed) << c.probe;
    const double t = exact_.time_at(600.0);
    std::printf("[measured] %s crosses 600 K at %.4f s (exact %.4f s), dT/dt %.5f K/s "
                "(exact %.5f K/s)\n",
                c.probe.c_str(), c.time, t, c.rate, exact_.rate(t));
    EXPECT_NEAR(c.time / t, 1.0, 5e-4) << c.probe;              // measured 1.5e-4
    EXPECT_NEAR(c.rate / exact_.rate(t), 1.0, 2e-4) << c.probe; // measured 2.7e-5
  }
}

TEST_F(LumpedRates, WindowTimeAndRatesMatchTheExponential) {
  const solver::RunResult& r = *result_;
  ASSERT_EQ(r.windows.size(), 2u);
  const double t_in = exact_.time_at(700.0), t_out = exact_.time_at(500.0);
  for (const solver::WindowPassage& w : r.windows) {
    ASSERT_TRUE(w.entered) << w.probe;
    EXPECT_TRUE(w.passed) << w.probe;
    EXPECT_EQ(w.upper, 700.0);
    EXPECT_EQ(w.lower, 500.0);
    // time inside tau ln 2; mean rate 200 K over it; largest rate at the entry
    const double inside = t_out - t_in, mean = 200.0 / inside,
                 fastest = -exact_.rate(t_in);
    std::printf("[measured] %s in 700..500 K: %.4f s (exact %.4f), mean %.5f K/s "
                "(exact %.5f), max %.5f K/s (exact %.5f)\n",
                w.probe.c_str(), w.time_inside, inside, w.mean_cooling_rate, mean,
                w.max_cooling_rate, fastest);
    // tolerances about 5 times the measured errors (2e-5 to 1.5e-4)
    EXPECT_NEAR(w.first_in / t_in, 1.0, 5e-4);
    EXPECT_NEAR(w.last_in / t_out, 1.0, 5e-4);
    EXPECT_NEAR(w.time_inside / inside, 1.0, 2e-4);
    EXPECT_NEAR(w.mean_cooling_rate / mean, 1.0, 2e-4);
    EXPECT_NEAR(w.max_cooling_rate / fastest, 1.0, 2e-4);
  }
}

} // namespace
