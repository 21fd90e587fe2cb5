// SPDX-License-Identifier: Apache-2.0
// Validation: a thin plate of constant properties (Bi of the order of 1e-4)
// cooled through a temperature-dependent surface loss, run through the solver
// in-process, against the exact lumped energy balance
//   rho c V dT/dt = -A q(T_s)      (Incropera and DeWitt, Fundamentals of Heat
//                                   and Mass Transfer, sec. 5.1-5.3)
// (tests/fe/reference/lumped_boundary.h):
//  - radiation alone to a sink, q = eps sigma (T^4 - T_a^4): the closed form
//    t(T) with its ln and atan terms (Incropera and DeWitt sec. 5.3; eq. 5.18,
//    number from memory); requirement: the centre within 0.5 % of the
//    temperature drop T_i - T_a;
//  - a tabulated boiling-type h(T_s), q = h (T - T_a): Boost.Math Gauss-Kronrod
//    quadrature of t(T) = int rho c V / (h(T) A (T - T_a)) dT split at the
//    table's knots, with h the curve's own interpolant (the Fritsch-Carlson
//    monotone cubic of docs/cases.md, taken from Boost.Math's pchip, not from
//    the project); requirement: the time to each crossing within 0.5 %.
//
// The body is the half-thickness L = 1 mm of a plate (planar 2D strip, face
// x = 0 a plane of symmetry), V/A = L. The lumped model's own error is of the
// order of the Biot number of the tangent coefficient dq/dT (Bi_t = L/k dq/dT;
// for a slab the mean-to-surface difference is about q L / (3 k), the loss is
// evaluated at the surface, so the rate is off by about Bi_t/3, and the centre
// lies q L / (6 k) above the mean); both tests compute Bi_t over their range,
// print it and require it below 1e-3, so the comparison measures the solver.
#include "reference/lumped_boundary.h"
#include "reference/validation_support.h"

#include <quantacal/fe/material_field.h>
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

// Illustrative copper-like constant properties and plate.
constexpr double density = 8960.0;                                             // kg/m^3
constexpr double specific_heat = 385.0;                                        // J/kg/K
constexpr double conductivity = 400.0;                                         // W/m/K
constexpr double half_thickness = 0.001;                                       // m, = V/A
constexpr double capacity_per_area = density * specific_heat * half_thickness; // J/m^2/K

// Requirement of the validation: 0.5 %.
constexpr double tolerance = 0.005;

/// The plate: x in [0, L] (id 0 symmetry, id 1 the cooled face), y in [0, L/2]
/// (ids 2, 3 insulated); FE_Q degree 2 on 4 x 1 cells; probe at the centre x = 0.
solver::CaseDescription plate(double initial, const solver::BoundarySpec& face) {
  solver::CaseDescription d;
  d.geometry = solver::Geometry::planar;
  d.mesh.kind = solver::MeshSpec::Kind::plate;
  d.mesh.size = {half_thickness, 0.5 * half_thickness};
  d.mesh.cells = {4, 1};
  solver::MaterialSpec m;
  m.id = 1;
  m.material = fe::make_constant_material("constant (illustrative)", density,
                                          specific_heat, conductivity, 250.0, 1300.0);
  d.materials = {m};
  d.initial_temperature = initial;
  d.boundaries = {face};
  d.boundaries.front().boundary_id = 1;
  solver::Probe centre;
  centre.name = "centre";
  centre.point = {0.0, 0.25 * half_thickness};
  d.output.probes = {centre};
  d.output.fields = false;
  d.output.plot = false;
  d.time.first_step = 1e-3;
  d.time.tolerance = 0.01; // K
  d.solver.degree = 2;
  d.solver.newton_tolerance = 1e-9;
  return d;
}

double seconds_since(std::chrono::steady_clock::time_point start) {
  return std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count();
}

TEST(LumpedBoundaryValidation, RadiationToASinkMatchesTheClosedForm) {
  constexpr double initial = 1000.0, ambient = 300.0, lowest = 400.0; // K
  constexpr double emissivity = 0.8;
  const double sigma = reference::stefan_boltzmann_constant;
  // Tangent coefficient d/dT eps sigma (T^4 - T_a^4) = 4 eps sigma T^3, largest at T_i.
  const double biot =
      4 * emissivity * sigma * std::pow(initial, 3) * half_thickness / conductivity;
  std::printf("[measured] radiation: tangent Bi = %.2e at T_i (lumped-model error about "
              "Bi/3 = %.1e relative in rate)\n",
              biot, biot / 3);
  ASSERT_LT(biot, 1e-3);

  solver::BoundarySpec face;
  face.radiation = solver::BoundarySpec::Radiation{emissivity, ambient};
  solver::CaseDescription d = plate(initial, face);
  d.name = "validation lumped radiation";
  const auto t_of = [&](double t) {
    // Incropera and DeWitt sec. 5.3 (eq. 5.18, from memory): ln and atan closed form
    return reference::radiation_cooling_time(capacity_per_area, emissivity, ambient,
                                             initial, t);
  };
  d.time.end = t_of(lowest);
  d.time.max_step = d.time.end / 50;
  d.output.interval = d.time.end / 10; // steps land on the check times
  const auto start = std::chrono::steady_clock::now();
  const solver::RunResult r = solver::run_case(d, reference::quiet_run());
  const double seconds = seconds_since(start);
  ASSERT_TRUE(r.completed) << r.stop_reason;
  double worst = 0.0;
  for (int i = 1; i <= 10; ++i) {
    const double time = d.time.end * i / 10;
    const double expected = reference::temperature_at(t_of, initial, lowest - 1.0, time);
    const double fe = reference::probe_at(r, 0, time);
    const double error = std::abs(fe - expected) / (initial - ambient);
    worst = std::max(worst, error);
    EXPECT_LT(error, tolerance) << "t = " << time << " s: FE " << fe << " K, lumped "
                                << expected << " K"; // Incropera and DeWitt sec. 5.3
  }
  std::printf("[measured] radiation: %g K -> %g K in %.2f s; worst |T_FE - T_lumped| = "
              "%.2e of (T_i - T_a); %u steps; %.2f s\n",
              initial, lowest, d.time.end, worst, r.steps.n_steps, seconds);
}

// A boiling-type curve: the knots and the shape of example (a)'s illustrative
// water curve (examples/a-aluminium-bar-water-quench/case.yaml: convection,
// onset of nucleate boiling, peak, transition, Leidenfrost minimum, film
// boiling), its coefficients divided by 200 so that the tangent Biot number
// stays below 1e-3. Illustrative.
const std::vector<double> knots = {313.15, 373.15, 403.15, 443.15, 493.15, 803.15}; // K
const std::vector<double> coefficients = {5.0, 15.0, 63.0, 15.0, 1.25, 1.75}; // W/m^2/K

/// h(T) by Boost.Math's pchip (Fritsch-Carlson with Fritsch-Butland weights, one-sided
/// end slopes), held constant beyond the end points as docs/cases.md states.
class BoostCurve {
public:
  BoostCurve() : spline_(std::vector<double>(knots), std::vector<double>(coefficients)) {}
  double operator()(double t) const {
    if (t <= knots.front())
      return coefficients.front();
    if (t >= knots.back())
      return coefficients.back();
    return spline_(t);
  }
  double slope(double t) const {
    return t <= knots.front() || t >= knots.back() ? 0.0 : spline_.prime(t);
  }

private:
  boost::math::interpolators::pchip<std::vector<double>> spline_;
};

TEST(LumpedBoundaryValidation, BoilingCurveMatchesTheQuadratureOfItsInterpolant) {
  constexpr double initial = 803.15, ambient = 303.15; // K
  const BoostCurve h;
  const solver::Curve curve{knots, coefficients};
  // The case's curve and Boost's pchip are one interpolant (independent codes).
  double worst_curve = 0.0, biot = 0.0;
  for (double t = 280.0; t <= 850.0; t += 0.05) {
    worst_curve = std::max(worst_curve, std::abs(curve.value(t) - h(t)) / h(t));
    biot = std::max(biot, std::abs(h(t) + h.slope(t) * (t - ambient)) * half_thickness /
                              conductivity);
  }
  std::printf("[measured] boiling curve: case curve vs Boost pchip %.1e relative; "
              "tangent Bi up to %.2e\n",
              worst_curve, biot);
  ASSERT_LT(worst_curve, 1e-12);
  ASSERT_LT(biot, 1e-3);

  const std::vector<double> crossings = {750, 650, 550, 480, 450, 420,
                                         400, 380, 360, 340, 320}; // K
  const double last = 315.0;
  solver::BoundarySpec face;
  face.convection = solver::BoundarySpec::Convection{curve, ambient};
  solver::CaseDescription d = plate(initial, face);
  d.name = "validation lumped boiling curve";
  d.time.end = reference::curve_cooling_time(
      capacity_per_area, [&h](double t) { return h(t); }, knots, ambient, initial, last);
  d.time.max_step = d.time.end / 200;
  d.output.crossing_temperatures = crossings;
  const auto start = std::chrono::steady_clock::now();
  const solver::RunResult r = solver::run_case(d, reference::quiet_run());
  const double seconds = seconds_since(start);
  ASSERT_TRUE(r.completed) << r.stop_reason;
  ASSERT_EQ(r.crossings.size(), crossings.size());
  double worst = 0.0, quadrature = 0.0;
  for (const solver::Crossing& c : r.crossings) {
    ASSERT_TRUE(c.crossed) << c.temperature;
    double err = 0.0;
    const double expected = reference::curve_cooling_time(
        capacity_per_area, [&h](double t) { return h(t); }, knots, ambient, initial,
        c.temperature, &err);
    quadrature = std::max(quadrature, err / expected);
    const double error = std::abs(c.time / expected - 1.0);
    worst = std::max(worst, error);
    std::printf("[measured] boiling curve: %.0f K at %.3f s, lumped %.3f s, error %.2e\n",
                c.temperature, c.time, expected, error);
    // Incropera and DeWitt sec. 5.1-5.3: lumped balance, quadrature of the interpolant
    EXPECT_LT(error, tolerance) << c.temperature << " K";
  }
  std::printf("[measured] boiling curve: worst relative time error %.2e (quadrature "
              "%.0e); %u steps; %.2f s\n",
              worst, quadrature, r.steps.n_steps, seconds);
}

} // namespace
