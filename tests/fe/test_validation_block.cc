// SPDX-License-Identifier: Apache-2.0
// Validation: a rectangular block (3D, `mesh: generator: block`) cooled by
// convection on all six faces, constant h and constant properties, run through
// the solver in-process, against the exact product solution
//   theta*(x, y, z, t) = P(x/Lx, Fo_x; Bi_x) P(y/Ly, Fo_y; Bi_y) P(z/Lz, Fo_z; Bi_z)
// of three plane walls of half-thicknesses Lx, Ly, Lz (Carslaw and Jaeger,
// Conduction of Heat in Solids, 2nd ed., sec. 1.15 (product of solutions) and
// sec. 3.11 (slab with radiation at the surface); Incropera and DeWitt,
// Fundamentals of Heat and Mass Transfer, sec. 5.8, multidimensional effects).
// P is the plane-wall series of tests/fe/reference/conduction_series.h (100
// terms, eigenvalues of zeta tan zeta = Bi by Boost.Math TOMS 748 on
// (n pi, (n + 1/2) pi)), which test_reference_series.cc checks against
// Incropera and DeWitt Table 5.1 (plane wall Bi = 1: zeta_1 = 0.8603, C_1 =
// 1.1191; Bi = 10: 1.4289, 1.2620; from memory).
//
// One eighth of the block is modelled: the faces x = 0, y = 0, z = 0 (boundary
// ids 0, 2, 4) are planes of symmetry, left insulated. Requirement: centre and
// corner temperatures within 0.5 % of (T_i - T_inf), with Q1 and with Q2.
#include "reference/conduction_series.h"
#include "reference/validation_support.h"

#include <quantacal/fe/material_field.h>
#include <quantacal/solver/solver.h>

#include <gtest/gtest.h>

#include <chrono>
#include <cmath>
#include <cstdio>
#include <string>

namespace {

using namespace quantacal;
using reference::ConvectionSeries;
using reference::Geometry;

// Illustrative constant properties (steel-like) and block; only Bi and Fo matter.
constexpr double density = 8000.0;                                       // kg/m^3
constexpr double specific_heat = 500.0;                                  // J/kg/K
constexpr double conductivity = 50.0;                                    // W/m/K
constexpr double diffusivity = conductivity / (density * specific_heat); // m^2/s
constexpr double half[3] = {0.03, 0.02, 0.01}; // m: Lx, Ly, Lz (block 60 x 40 x 20 mm)
constexpr double coefficient = 2500.0;         // W/m^2/K: Bi = 1.5, 1.0, 0.5
constexpr double t_initial = 1100.0;           // K
constexpr double t_fluid = 300.0;              // K
constexpr double time_scale = half[2] * half[2] / diffusivity; // s per unit Fo_z

// Requirement of the validation: 0.5 % of T_i - T_inf.
constexpr double tolerance = 0.005;

/// The exact product solution at (x, y, z) (m, from the centre) and time t (s).
class BlockSolution {
public:
  BlockSolution()
      : walls_{
            ConvectionSeries(Geometry::plane_wall, coefficient * half[0] / conductivity),
            ConvectionSeries(Geometry::plane_wall, coefficient * half[1] / conductivity),
            ConvectionSeries(Geometry::plane_wall,
                             coefficient * half[2] / conductivity)} {}
  double theta(const double (&point)[3], double time) const {
    double product = 1.0;
    for (int i = 0; i < 3; ++i)
      product *= walls_[i].temperature(point[i] / half[i],
                                       diffusivity * time / (half[i] * half[i]));
    return product;
  }

private:
  ConvectionSeries walls_[3];
};

struct Resolution {
  unsigned int degree;
  unsigned int refinements; // of the coarse 3 x 2 x 1 mesh (cells 10 mm)
};

solver::CaseDescription make_case(const Resolution& res) {
  solver::CaseDescription d;
  d.name = "validation block, degree " + std::to_string(res.degree);
  d.geometry = solver::Geometry::solid;
  d.mesh.kind = solver::MeshSpec::Kind::block;
  d.mesh.size = {half[0], half[1], half[2]}; // the eighth x, y, z >= 0
  d.mesh.cells = {3, 2, 1};
  d.mesh.refinements = res.refinements;
  solver::MaterialSpec m;
  m.id = 1;
  m.material = fe::make_constant_material("constant (illustrative)", density,
                                          specific_heat, conductivity, 250.0, 1200.0);
  d.materials = {m};
  d.initial_temperature = t_initial;
  for (unsigned int id : {1u, 3u, 5u}) { // x = Lx, y = Ly, z = Lz; 0, 2, 4: symmetry
    solver::BoundarySpec b;
    b.boundary_id = id;
    b.convection = solver::BoundarySpec::Convection{
        solver::Curve{{t_fluid}, {coefficient}}, t_fluid};
    d.boundaries.push_back(b);
  }
  d.time.end = 1.0 * time_scale;
  d.time.first_step = 1e-4 * time_scale;
  d.time.tolerance = 0.05; // K, 6e-5 of T_i - T_inf per step
  d.time.max_step = 0.02 * time_scale;
  d.output.interval = 0.2 * time_scale; // steps land on Fo_z = 0.2, 0.4, ..., 1
  d.output.fields = false;
  d.output.plot = false;
  solver::Probe centre, corner;
  centre.name = "centre";
  centre.point = {0.0, 0.0, 0.0};
  corner.name = "corner";
  corner.point = {half[0], half[1], half[2]};
  d.output.probes = {centre, corner};
  d.solver.degree = res.degree;
  d.solver.newton_tolerance = 1e-9;
  return d;
}

class BlockValidation : public ::testing::TestWithParam<Resolution> {};

TEST_P(BlockValidation, CentreAndCornerMatchTheProductOfPlaneWalls) {
  const Resolution res = GetParam();
  const auto start = std::chrono::steady_clock::now();
  const solver::RunResult r = solver::run_case(make_case(res), reference::quiet_run());
  const double seconds =
      std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count();
  ASSERT_TRUE(r.completed) << r.stop_reason;
  const BlockSolution exact;
  const double points[2][3] = {{0.0, 0.0, 0.0}, {half[0], half[1], half[2]}};
  double worst = 0.0;
  for (const double fo : {0.2, 1.0}) {
    const double time = fo * time_scale;
    for (std::size_t p = 0; p < 2; ++p) {
      const double fe_theta =
          (reference::probe_at(r, p, time) - t_fluid) / (t_initial - t_fluid);
      const double expected = exact.theta(points[p], time);
      const double error = std::abs(fe_theta - expected);
      worst = std::max(worst, error);
      std::printf(
          "[measured] block Q%u Fo_z=%g %s: FE %.6f exact %.6f error %.2e of dT\n",
          res.degree, fo, p == 0 ? "centre" : "corner", fe_theta, expected, error);
      // Carslaw and Jaeger sec. 1.15 and 3.11; Incropera and DeWitt sec. 5.8
      EXPECT_NEAR(fe_theta, expected, tolerance)
          << (p == 0 ? "centre" : "corner") << " at Fo_z = " << fo;
    }
  }
  std::printf("[measured] block Q%u: %llu cells, %llu dofs, %u steps, worst error %.2e "
              "of dT, worst relative imbalance %.1e, %.2f s\n",
              res.degree, r.n_cells, r.n_dofs, r.steps.n_steps, worst,
              r.worst_relative_imbalance, seconds);
}

INSTANTIATE_TEST_SUITE_P(CarslawJaegerProduct, BlockValidation,
                         ::testing::Values(Resolution{1, 3}, Resolution{2, 1}),
                         [](const ::testing::TestParamInfo<Resolution>& i) {
                           return "Q" + std::to_string(i.param.degree);
                         });

} // namespace
