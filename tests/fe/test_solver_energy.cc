// SPDX-License-Identifier: Apache-2.0
// Solver engine: energy ledger, formulations and an analytic convection check.
#include <quantacal/common/exceptions.h>
#include <quantacal/fe/material_field.h>
#include <quantacal/solver/solver.h>

#include <gtest/gtest.h>

#include <cmath>
#include <filesystem>
#include <string>

namespace {

using namespace quantacal;
using namespace quantacal::fe;     // make_constant_material
using namespace quantacal::solver; // the case and its run

const std::string source_dir = QUANTACAL_SOURCE_DIR;

CaseDescription small_quench() {
  return load_case(source_dir + "/tests/fe/cases/small_quench.yaml");
}

RunOptions quiet_in_memory() {
  RunOptions o;
  o.write_output = false;
  o.log = nullptr;
  o.communicator = MPI_COMM_SELF;
  return o;
}

// The discrete energy balance of the energy form: with lattice properties
// (aluminium card), a boiling-curve h(T_s) and radiation, every row of the
// ledger closes to the Newton tolerance. The reference is the first law
// itself: stored change = boundary heat + source heat.
TEST(SolverEnergy, LatticeQuenchWithBoilingCurveAndRadiationBalancesEveryStep) {
  const CaseDescription c = small_quench();
  const RunResult r = run_case(c, quiet_in_memory());
  ASSERT_TRUE(r.completed);
  ASSERT_GT(r.energy.size(), 10u);
  for (std::size_t k = 1; k < r.energy.size(); ++k)
    EXPECT_LE(r.energy[k].relative_imbalance, 1e-8)
        << "row " << k << " t = " << r.energy[k].time;
  EXPECT_LE(r.worst_relative_imbalance, 1e-8);
  // the body lost heat (cooling) and the ledger is not trivially zero
  EXPECT_LT(r.energy.back().boundary_heat, 0.0);
  EXPECT_LT(r.energy.back().stored_energy, r.energy.front().stored_energy);
  EXPECT_EQ(r.times.size(), r.energy.size());
  EXPECT_EQ(r.probe_temperatures.size(), 2u);
}

// The capacity form rho c_p(T) dT/dt on the same case does not conserve
// energy: its ledger error is orders of magnitude above the energy form's.
TEST(SolverEnergy, CapacityFormulationLosesMoreEnergyThanEnergyForm) {
  CaseDescription c = small_quench();
  const RunResult energy_form = run_case(c, quiet_in_memory());
  c.solver.formulation = Formulation::capacity;
  const RunResult capacity_form = run_case(c, quiet_in_memory());
  ASSERT_TRUE(capacity_form.completed);
  EXPECT_GT(capacity_form.worst_relative_imbalance,
            1e3 * energy_form.worst_relative_imbalance);
  EXPECT_GT(capacity_form.worst_relative_imbalance, 1e-7);
}

// Plane wall of half-thickness L, constant properties, insulated at x = 0 and
// convection at x = L with Bi = h L / k = 1. For Fourier number Fo = alpha t / L^2
// = 1 the one-term solution (Incropera and DeWitt, Fundamentals of Heat and Mass
// Transfer, sec. 5.5, Table 5.1: zeta1 = 0.8603, C1 = 1.1191 at Bi = 1; Carslaw and
// Jaeger, Conduction of Heat in Solids, sec. 3.11) is
// theta/theta_i = C1 exp(-zeta1^2 Fo) cos(zeta1 x / L); the neglected second term is
// below 1e-5 of theta_i there.
TEST(SolverAnalytic, PlaneWallWithConvectionMatchesOneTermSeries) {
  const double L = 0.01, k = 20.0, rho = 8000.0, cp = 500.0, h = k / L; // Bi = 1
  const double alpha = k / (rho * cp);
  const double t_end = L * L / alpha; // Fo = 1
  const double T_i = 600.0, T_inf = 300.0;
  CaseDescription c;
  c.name = "plane wall Bi = 1";
  c.geometry = Geometry::planar;
  c.mesh.kind = MeshSpec::Kind::plate;
  c.mesh.origin = {0.0, 0.0};
  c.mesh.size = {L, L / 8};
  c.mesh.cells = {8, 1};
  c.mesh.refinements = 2;
  MaterialSpec m;
  m.id = 1;
  m.material = make_constant_material("steel-like", rho, cp, k, 200.0, 900.0);
  c.materials = {m};
  c.initial_temperature = T_i;
  BoundarySpec right;
  right.boundary_id = 1;
  right.convection = BoundarySpec::Convection{Curve{{0.0}, {h}}, T_inf};
  c.boundaries = {right};
  c.time.end = t_end;
  c.time.first_step = t_end * 1e-4;
  c.time.tolerance = 0.01;
  c.time.max_step = t_end / 50;
  c.output.probes = {Probe{"centre", {0.0, L / 16}, {}},
                     Probe{"surface", {L, L / 16}, {}},
                     Probe{"middle", {L / 2, L / 16}, {}}};
  c.solver.degree = 2;
  const RunResult r = run_case(c, quiet_in_memory());
  ASSERT_TRUE(r.completed);
  const double zeta = 0.8603, C1 = 1.1191; // Incropera and DeWitt Table 5.1, Bi = 1
  const double decay = C1 * std::exp(-zeta * zeta * 1.0);
  const double xs[3] = {0.0, 1.0, 0.5};
  for (int p = 0; p < 3; ++p) {
    const double theta = (r.probe_temperatures[p].back() - T_inf) / (T_i - T_inf);
    const double expected = decay * std::cos(zeta * xs[p]);
    EXPECT_NEAR(theta, expected, 2e-3 * expected) << r.probe_names[p];
  }
  EXPECT_LE(r.worst_relative_imbalance, 1e-8);
}

// A steady-state with a fixed temperature on both faces and a uniform source:
// the heat through the fixed-temperature faces (reaction) balances the source,
// and the centre reaches T_w + q L^2 / (2 k) (Carslaw and Jaeger, sec. 1.6:
// slab 0 <= x <= 2L with uniform heat production).
TEST(SolverAnalytic, SourceWithFixedTemperatureFacesReachesParabolicProfile) {
  const double L = 0.005, k = 50.0, q = 2e7, T_w = 300.0;
  CaseDescription c;
  c.name = "heated slab";
  c.geometry = Geometry::planar;
  c.mesh.kind = MeshSpec::Kind::plate;
  c.mesh.origin = {0.0, 0.0};
  c.mesh.size = {2 * L, L / 4};
  c.mesh.cells = {8, 1};
  c.mesh.refinements = 1;
  MaterialSpec m;
  m.id = 1;
  m.material = make_constant_material("conductor", 2000.0, 400.0, k, 100.0, 2000.0);
  c.materials = {m};
  c.initial_temperature = T_w;
  BoundarySpec left, right;
  left.boundary_id = 0;
  left.temperature = Curve{{0.0}, {T_w}};
  right.boundary_id = 1;
  right.temperature = Curve{{0.0}, {T_w}};
  c.boundaries = {left, right};
  HeatSource s;
  s.power_density = q;
  c.sources = {s};
  const double alpha = k / (2000.0 * 400.0);
  c.time.end = 20 * L * L / alpha; // Fo = 20: steady to far below 1e-6
  c.time.first_step = c.time.end * 1e-5;
  c.time.tolerance = 0.01;
  c.output.probes = {Probe{"centre", {L, L / 8}, {}}};
  c.solver.degree = 2;
  const RunResult r = run_case(c, quiet_in_memory());
  ASSERT_TRUE(r.completed);
  const double expected = T_w + q * L * L / (2 * k); // Carslaw and Jaeger sec. 1.6
  EXPECT_NEAR(r.probe_temperatures[0].back(), expected, 1e-4 * (expected - T_w));
  EXPECT_LE(r.worst_relative_imbalance, 1e-8);
  // the source heat leaves through the fixed faces (reaction heat is negative)
  EXPECT_LT(r.energy.back().boundary_heat, 0.0);
  EXPECT_GT(r.energy.back().source_heat, 0.0);
}

// Crossing times come from the probe history; a probe crossing 1 K below its
// start must be found with a negative (cooling) rate.
TEST(SolverOutputs, CrossingTimesAndRatesAreReported) {
  CaseDescription c = small_quench();
  c.output.crossing_temperatures = {c.initial_temperature - 1.0, 10.0};
  const RunResult r = run_case(c, quiet_in_memory());
  ASSERT_EQ(r.crossings.size(), 4u);
  EXPECT_TRUE(r.crossings[0].crossed);
  EXPECT_GT(r.crossings[0].time, 0.0);
  EXPECT_LT(r.crossings[0].rate, 0.0);
  EXPECT_FALSE(r.crossings[1].crossed); // 10 K is never reached
}

} // namespace
