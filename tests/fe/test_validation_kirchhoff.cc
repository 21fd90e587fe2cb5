// SPDX-License-Identifier: Apache-2.0
// Validation: steady conduction through a slab with a temperature-dependent
// conductivity and fixed temperatures on both faces, run through the solver
// in-process (a long transient to steady state), against the Kirchhoff
// transformation U(T) = int k dT, U(T(x)) = (x/L) U(T_L) (Carslaw and Jaeger,
// Conduction of Heat in Solids, 2nd ed., sec. 1.12; Ozisik, Heat Conduction,
// the Kirchhoff transformation; tests/fe/reference/kirchhoff.h).
// Requirement: within 1e-4 of the face temperature difference.
//
// The card tests/fe/data/linear_conductivity_slab.yaml is illustrative: its
// conductivity table samples k = k0 (1 + b T) and is joined, as every card
// table, by a Fritsch-Carlson cubic through (ln T, ln k) (docs/cards.md). The
// reference integrates that interpolant, taken from Boost.Math's pchip (an
// implementation independent of the project's), not the linear law.
#include "reference/kirchhoff.h"
#include "reference/validation_support.h"

#include <quantacal/solver/solver.h>

#include <boost/math/interpolators/pchip.hpp>

#include <gtest/gtest.h>

#include <algorithm>
#include <chrono>
#include <cmath>
#include <cstdio>
#include <string>
#include <vector>

namespace {

using namespace quantacal;

// The card's conductivity rows (tests/fe/data/linear_conductivity_slab.yaml).
const std::vector<double> table_t = {250, 400, 600, 850, 1150}; // K
const std::vector<double> table_k = {15, 18, 22, 27, 33};       // W/m/K

/// k(T) = exp(p(ln T)), p Boost.Math's pchip through (ln T_i, ln k_i).
class LogLogConductivity {
public:
  LogLogConductivity() : p_(logs(table_t), logs(table_k)) {}
  double operator()(double t) const { return std::exp(p_(std::log(t))); }

private:
  static std::vector<double> logs(const std::vector<double>& v) {
    std::vector<double> out;
    for (const double x : v)
      out.push_back(std::log(x));
    return out;
  }
  boost::math::interpolators::pchip<std::vector<double>> p_;
};

TEST(ReferenceKirchhoff, LinearConductivityGivesTheQuadraticProfile) {
  // k = k0 (1 + b T): U = k0 [(T - T0) + b (T^2 - T0^2)/2], so T(x) is the root of a
  // quadratic (Carslaw and Jaeger sec. 1.12). Illustrative k0, b.
  const double k0 = 10.0, b = 2e-3, t0 = 300.0, tl = 1100.0;
  const reference::KirchhoffSlab slab([&](double t) { return k0 * (1 + b * t); }, {}, t0,
                                      tl);
  const double ul = k0 * ((tl - t0) + 0.5 * b * (tl * tl - t0 * t0));
  for (const double f : {0.0, 0.1, 1.0 / 3.0, 0.5, 0.9, 1.0}) {
    const double c = 1.0 / b + t0;
    const double exact = -1.0 / b + std::sqrt(c * c + 2.0 * f * ul / (k0 * b));
    EXPECT_NEAR(slab.temperature(f), exact, 1e-9 * tl) << f;
  }
}

std::string slab_case(double length, unsigned int cells, unsigned int degree,
                      double end) {
  const std::string l = std::to_string(length * 1e3) + " mm";
  const std::string h = std::to_string(length * 1e2) + " mm";
  return "name: Kirchhoff slab (illustrative)\n"
         "geometry: planar\n"
         "mesh: {generator: plate, size: [\"" +
         l + "\", \"" + h + "\"], cells: [" + std::to_string(cells) +
         ", 1]}\n"
         "materials:\n"
         "  - {id: 1, card: linear_conductivity_slab.yaml}\n"
         "initial_temperature: \"700 K\"\n"
         "boundaries:\n" // faces ramped from the initial 700 K over 1 s, then held
         "  - {id: 0, temperature: [[\"0 s\", \"700 K\"], [\"1 s\", \"300 K\"]]}\n"
         "  - {id: 1, temperature: [[\"0 s\", \"700 K\"], [\"1 s\", \"1100 K\"]]}\n"
         "time: {end: \"" +
         std::to_string(end) +
         " s\", first_step: \"0.01 s\", tolerance: \"0.05 K\"}\n"
         "output:\n"
         "  folder: unused\n"
         "  fields: false\n"
         "  plot: false\n"
         "  probes:\n"
         "    - {name: eighth, point: [\"" +
         std::to_string(length * 1e3 / 8) +
         " mm\", \"0 mm\"]}\n"
         "    - {name: third, point: [\"" +
         std::to_string(length * 1e3 / 3) +
         " mm\", \"0 mm\"]}\n"
         "    - {name: half, point: [\"" +
         std::to_string(length * 1e3 / 2) +
         " mm\", \"0 mm\"]}\n"
         "    - {name: three_quarters, point: [\"" +
         std::to_string(length * 1e3 * 3 / 4) +
         " mm\", \"0 mm\"]}\n"
         "solver: {degree: " +
         std::to_string(degree) + ", newton_tolerance: 1e-10}\n";
}

TEST(KirchhoffValidation, SteadySlabMatchesTheKirchhoffTransform) {
  const double t0 = 300.0, tl = 1100.0; // K, the faces
  const double length = 0.01;           // m
  const std::string data = reference::source_root() + "/tests/fe/data";
  // Slowest decay rate of the transient: pi^2 alpha_min / L^2 with alpha_min =
  // k_min / (rho c) = 15 / (5000 x 500) m^2/s; 40 / rate leaves e^-40 of it.
  const double alpha_min = 15.0 / (5000.0 * 500.0);
  const double end = 40.0 * length * length / (M_PI * M_PI * alpha_min);
  const solver::CaseDescription d = solver::load_case_from_string(
      slab_case(length, 16, 2, end), "kirchhoff_slab.yaml", data);
  ASSERT_EQ(d.materials.size(), 1u);
  ASSERT_TRUE(d.materials.front().material);

  const LogLogConductivity k;
  // The card's conductivity (the cached table the solver reads) against Boost's pchip.
  double worst_k = 0.0;
  for (double t = 250.0; t <= 1150.0; t += 0.25)
    worst_k = std::max(
        worst_k,
        std::abs(d.materials.front().material->conductivity(t).value / k(t) - 1));
  std::printf("[measured] Kirchhoff: card conductivity vs Boost pchip in log-log %.1e "
              "relative\n",
              worst_k);
  EXPECT_LT(worst_k, 1e-8);

  const auto start = std::chrono::steady_clock::now();
  const solver::RunResult r = solver::run_case(d, reference::quiet_run());
  const double seconds =
      std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count();
  ASSERT_TRUE(r.completed) << r.stop_reason;
  const reference::KirchhoffSlab slab([&k](double t) { return k(t); }, table_t, t0, tl);
  const double fractions[] = {1.0 / 8, 1.0 / 3, 1.0 / 2, 3.0 / 4};
  double worst = 0.0, drift = 0.0;
  for (std::size_t p = 0; p < 4; ++p) {
    const auto& history = r.probe_temperatures[p];
    const double fe = history.back();
    drift = std::max(drift, std::abs(fe - history[history.size() - 2]));
    const double expected = slab.temperature(fractions[p]);
    const double error = std::abs(fe - expected) / (tl - t0);
    worst = std::max(worst, error);
    std::printf("[measured] Kirchhoff: x/L = %.4f FE %.6f K, exact %.6f K, error %.2e of "
                "(T_L - T_0)\n",
                fractions[p], fe, expected, error);
    // Carslaw and Jaeger sec. 1.12; Ozisik, the Kirchhoff transformation
    EXPECT_LT(error, 1e-4) << r.probe_names[p];
  }
  // Steady: the last step changed the probes by far less than the requirement.
  EXPECT_LT(drift, 1e-6 * (tl - t0));
  // The linear law that the table samples differs from its interpolant: shown, not
  // checked (it is not what the solver is given).
  const double k0 = 10.0, b = 2e-3, c = 1.0 / b + t0;
  const double ul = k0 * ((tl - t0) + 0.5 * b * (tl * tl - t0 * t0));
  const double linear_half = -1.0 / b + std::sqrt(c * c + 2.0 * 0.5 * ul / (k0 * b));
  std::printf("[measured] Kirchhoff: worst error %.2e of (T_L - T_0); last-step drift "
              "%.1e K; %u steps; %.2f s (linear-law profile at x/L = 1/2: %.3f K)\n",
              worst, drift, r.steps.n_steps, seconds, linear_half);
}

} // namespace
