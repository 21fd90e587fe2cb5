// SPDX-License-Identifier: Apache-2.0
// Validation: observed orders of convergence of the solver, in time (fixed
// steps, TR-BDF2 is second order) and in space (FE_Q of degree p converges like
// h^(p+1) at a point between nodes), measured against the exact series for an
// infinite cylinder cooled by convection (Carslaw and Jaeger, Conduction of
// Heat in Solids, ch. 7; tests/fe/reference/conduction_series.h).
// Requirement: time order between 1.8 and 2.2; space order as expected for
// the degree (2 for p = 1 within +-10 %; at least 3 - 10 % for p = 2).
#include "reference/conduction_series.h"
#include "reference/validation_support.h"

#include <quantacal/fe/material_field.h>
#include <quantacal/solver/solver.h>

#include <gtest/gtest.h>

#include <cmath>
#include <cstdio>
#include <vector>

namespace {

using namespace quantacal;

// Illustrative constant properties; Bi = 1.
constexpr double density = 8000.0, specific_heat = 500.0, conductivity = 50.0;
constexpr double radius = 0.05; // m
constexpr double biot = 1.0;
constexpr double t_initial = 1100.0, t_fluid = 300.0; // K
constexpr double time_scale =
    radius * radius * density * specific_heat / conductivity; // s
constexpr double fourier_end = 0.2;

/// theta* at r = R/3 (between nodes on every mesh below) at Fo = 0.2, FE minus exact.
double error_at_third(unsigned int radial_cells, unsigned int degree,
                      double fourier_step) {
  solver::CaseDescription d;
  d.name = "validation convergence";
  d.geometry = solver::Geometry::axisymmetric;
  d.mesh.kind =
      solver::MeshSpec::Kind::cylinder; // ends (ids 1, 2) insulated: infinite cylinder
  d.mesh.radius = radius;
  d.mesh.length = 0.002;
  d.mesh.cells = {radial_cells, 1};
  solver::MaterialSpec m;
  m.id = 1;
  m.material = fe::make_constant_material("constant (illustrative)", density,
                                          specific_heat, conductivity, 250.0, 1200.0);
  d.materials = {m};
  d.initial_temperature = t_initial;
  solver::BoundarySpec b;
  b.boundary_id = 0;
  b.convection = solver::BoundarySpec::Convection{
      solver::Curve{{t_fluid}, {biot * conductivity / radius}}, t_fluid};
  d.boundaries = {b};
  d.time.end = fourier_end * time_scale;
  d.time.first_step = fourier_step * time_scale;
  d.time.adaptive = false;
  solver::Probe p;
  p.name = "third";
  p.point = {radius / 3.0, 0.001};
  d.output.probes = {p};
  d.output.fields = false;
  d.output.plot = false;
  d.solver.degree = degree;
  d.solver.newton_tolerance = 1e-10;
  const solver::RunResult r = solver::run_case(d, reference::quiet_run());
  EXPECT_TRUE(r.completed) << r.stop_reason;
  const reference::ConvectionSeries series(reference::Geometry::cylinder, biot, 100);
  const double theta = (r.probe_temperatures[0].back() - t_fluid) / (t_initial - t_fluid);
  return theta - series.temperature(1.0 / 3.0, fourier_end);
}

TEST(ConvergenceValidation, SecondOrderInTime) {
  // Degree 3 on 16 cells: the spatial error (degree 2 on 16 cells is already
  // 7e-8 of dT) is far below the time errors (7.7e-5 .. 5.1e-6).
  const std::vector<double> steps = {0.02, 0.01, 0.005};
  std::vector<double> errors;
  for (const double s : steps)
    errors.push_back(std::abs(error_at_third(16, 3, s)));
  for (std::size_t i = 0; i + 1 < steps.size(); ++i) {
    const double order =
        std::log(errors[i] / errors[i + 1]) / std::log(steps[i] / steps[i + 1]);
    std::printf("[measured] time: Fo step %g -> %g: error %.3e -> %.3e, order %.3f\n",
                steps[i], steps[i + 1], errors[i], errors[i + 1], order);
    EXPECT_GE(order, 1.8); // requirement of the validation (issue, section 6)
    EXPECT_LE(order, 2.2);
  }
}

TEST(ConvergenceValidation, OrderDegreePlusOneInSpace) {
  // Fixed step Fo 2.5e-4: the time error (about 1e-8 of dT, from the time test's
  // constant) is below the spatial errors. r = R/3 lies at 1/3 or 2/3 of a cell on every
  // mesh of 2^k cells, where the interpolation error has the same magnitude for p = 1
  // and 2.
  for (const unsigned int degree : {1u, 2u}) {
    const std::vector<unsigned int> cells = {4, 8, 16};
    std::vector<double> errors;
    for (const unsigned int n : cells)
      errors.push_back(std::abs(error_at_third(n, degree, 2.5e-4)));
    const double expected = degree + 1.0;
    for (std::size_t i = 0; i + 1 < cells.size(); ++i) {
      const double order = std::log(errors[i] / errors[i + 1]) / std::log(2.0);
      std::printf(
          "[measured] space: degree %u, %u -> %u cells: error %.3e -> %.3e, order %.3f\n",
          degree, cells[i], cells[i + 1], errors[i], errors[i + 1], order);
      EXPECT_GE(order, 0.9 * expected);
      if (degree == 1) {
        EXPECT_LE(order, 1.1 * expected);
      }
      // Degree 2 is measured at 3.8 and 4.5 here: at these mesh sizes an h^4 term
      // still dominates the h^3 interpolation error at r = R/3, and the last error
      // (8e-8) nears the time-error floor (1e-8), so only the lower bound is
      // asserted.
    }
  }
}

} // namespace
