// SPDX-License-Identifier: Apache-2.0
// Adaptive meshes (docs/cases.md, "Adaptive meshes"): a constant-property
// cylinder quenched by convection on a mesh that refines and coarsens in time,
// against the exact series of Carslaw and Jaeger (Conduction of Heat in Solids,
// ch. 7; eigenvalues by a Boost.Math root finder, tests/fe/reference/); the
// energy ledger with the remesh change kept apart; a resume after a crash on an
// adapted mesh; the errors of the `adaptivity` block.
#include "checkpoint_support.h"
#include "reference/conduction_series.h"
#include "reference/validation_support.h"

#include <quantacal/common/exceptions.h>
#include <quantacal/fe/material_field.h>
#include <quantacal/solver/solver.h>

#include <gtest/gtest.h>

#include <cmath>
#include <cstdio>
#include <filesystem>
#include <string>

namespace {

using namespace quantacal;
namespace qs = quantacal::solver;

// Illustrative constant properties (steel-like); only Bi and Fo matter.
constexpr double density = 8000.0;      // kg/m^3
constexpr double specific_heat = 500.0; // J/kg/K
constexpr double conductivity = 50.0;   // W/m/K
constexpr double radius = 0.05;         // m
constexpr double t_initial = 1100.0;    // K
constexpr double t_fluid = 300.0;       // K
constexpr double biot = 10.0;
constexpr double diffusivity = conductivity / (density * specific_heat); // m^2/s
constexpr double time_scale = radius * radius / diffusivity;             // s per unit Fo

/**
 * An infinite cylinder (a short axisymmetric strip with insulated ends) at Bi = 10
 * on a coarse mesh of 4 x 1 cells (degree 1) that may refine 3 levels, with fixed
 * steps of Fo 0.002 landing on Fo = 0.2 and 1.0.
 */
qs::CaseDescription adaptive_cylinder(bool adaptive) {
  qs::CaseDescription d;
  d.name = "adaptive cylinder";
  d.geometry = qs::Geometry::axisymmetric;
  qs::MaterialSpec m;
  m.id = 1;
  m.material = fe::make_constant_material("constant (illustrative)", density,
                                          specific_heat, conductivity, 250.0, 1200.0);
  d.materials = {m};
  d.initial_temperature = t_initial;
  qs::BoundarySpec b;
  b.boundary_id = 0; // mantle r = R; the ends (1, 2) and the axis are insulated
  b.convection = qs::BoundarySpec::Convection{
      qs::Curve{{t_fluid}, {biot * conductivity / radius}}, t_fluid};
  d.boundaries = {b};
  d.mesh.kind = qs::MeshSpec::Kind::cylinder;
  d.mesh.radius = radius;
  d.mesh.length = radius / 4;
  d.mesh.cells = {8, 1};
  d.adaptivity.enabled = adaptive;
  d.adaptivity.every = 2;
  d.adaptivity.levels = 2;
  d.adaptivity.refine_above = 0.5;   // K
  d.adaptivity.coarsen_below = 0.05; // K
  qs::Probe centre, surface;
  centre.name = "centre";
  surface.name = "surface";
  centre.point = {0.0, radius / 8};
  surface.point = {radius, radius / 8};
  d.output.probes = {centre, surface};
  d.time.end = 1.0 * time_scale;
  d.time.adaptive = false;
  d.time.first_step = 0.002 * time_scale;
  d.output.interval = 0.2 * time_scale;
  d.output.fields = false;
  d.output.plot = false;
  d.solver.degree = 1;
  d.solver.newton_tolerance = 1e-9;
  return d;
}

TEST(AdaptiveMesh, CylinderQuenchMatchesTheExactSeries) {
  const qs::RunResult r = qs::run_case(adaptive_cylinder(true), reference::quiet_run());
  ASSERT_TRUE(r.completed) << r.stop_reason;
  // Carslaw and Jaeger, exact series of the infinite cylinder with convection
  const reference::ConvectionSeries series(reference::Geometry::cylinder, biot, 100);
  for (const double fo : {0.2, 1.0})
    for (std::size_t p = 0; p < 2; ++p) {
      const double theta =
          (reference::probe_at(r, p, fo * time_scale) - t_fluid) / (t_initial - t_fluid);
      const double exact = series.temperature(p == 0 ? 0.0 : 1.0, fo);
      std::printf("[measured] adaptive cylinder Bi=10 Fo=%g %s: FE %.6f exact %.6f "
                  "error %.2e of dT\n",
                  fo, p == 0 ? "centre" : "surface", theta, exact,
                  std::abs(theta - exact));
      // requirement of the series validations (test_validation_series.cc): 0.5 % of dT
      EXPECT_NEAR(theta, exact, 0.005) << "Fo = " << fo << ", probe " << p;
    }
  std::printf("[measured] adaptive cylinder: %u remeshes, unknowns %llu..%llu, "
              "final %llu\n",
              r.steps.n_remeshes, r.steps.fewest_dofs, r.steps.most_dofs, r.n_dofs);
  EXPECT_GT(r.steps.n_remeshes, 0u);
  // it refined the boundary layer and coarsened as the cylinder equalised
  EXPECT_GT(r.steps.most_dofs, 4 * r.steps.fewest_dofs);
  EXPECT_LT(r.n_dofs, r.steps.most_dofs);
}

TEST(AdaptiveMesh, LedgerBalancesWithTheRemeshChangeApart) {
  const qs::RunResult r = qs::run_case(adaptive_cylinder(true), reference::quiet_run());
  ASSERT_TRUE(r.completed) << r.stop_reason;
  const qs::EnergyRecord& last = r.energy.back();
  const double change = last.stored_energy - r.energy.front().stored_energy;
  std::printf("[measured] adaptive cylinder: stored change %.6e J, remesh change "
              "%.3e J (%.2e of it), worst imbalance %.2e\n",
              change, last.remesh_change, std::abs(last.remesh_change / change),
              r.worst_relative_imbalance);
  // the balance with the remesh change kept apart holds to the Newton tolerance, as
  // on a fixed mesh (test_solver_energy.cc)
  EXPECT_LE(r.worst_relative_imbalance, 1e-8);
  // coarsening a Q1 field loses a little energy: bounded, and not zero
  EXPECT_NE(last.remesh_change, 0.0);
  EXPECT_LT(std::abs(last.remesh_change), 1e-3 * std::abs(change));
}

TEST(AdaptiveMesh, FixedMeshTwinIsUnchangedByTheAdaptivityCode) {
  // adaptivity off: no remesh, the mesh of the case, the remesh column 0
  const qs::RunResult r = qs::run_case(adaptive_cylinder(false), reference::quiet_run());
  ASSERT_TRUE(r.completed) << r.stop_reason;
  EXPECT_EQ(r.steps.n_remeshes, 0u);
  EXPECT_EQ(r.n_dofs, 18u); // 9 x 2 nodes of Q1
  EXPECT_EQ(r.energy.back().remesh_change, 0.0);
}

TEST(AdaptiveMesh, ResumedAfterACrashOnAnAdaptedMeshGivesTheSameHistories) {
  test::TempDir dir;
  const std::string adaptivity =
      "adaptivity: {every: 3, levels: 2, refine_above: \"0.3 K\", coarsen_below: "
      "\"0.03 K\"}\n";
  const auto description = [&](const std::string& name) {
    return qs::load_case_from_string(test::checkpoint_case((dir.path() / name).string()) +
                                         adaptivity,
                                     "case.yaml", dir.path().string());
  };
  qs::RunOptions options;
  options.communicator = MPI_COMM_SELF;
  const qs::RunResult uninterrupted = qs::run_case(description("a"), options);
  ASSERT_TRUE(uninterrupted.completed);
  ASSERT_GT(uninterrupted.steps.n_remeshes, 0u);
  struct Crash {};
  int checkpoints = 0;
  options.on_checkpoint = [&checkpoints](const std::string& point) {
    if (point == "committed")
      ++checkpoints;
  };
  options.on_step = [&checkpoints](double, double) {
    if (checkpoints == 3)
      throw Crash{};
  };
  const qs::CaseDescription b = description("b");
  EXPECT_THROW(qs::run_case(b, options), Crash);
  options.on_step = nullptr;
  options.resume = true;
  const qs::RunResult resumed = qs::run_case(b, options);
  ASSERT_TRUE(resumed.completed);
  // the same steps and meshes; the values to 1e-12 relative (the resumed run starts
  // each Newton solve from a freshly built Jacobian, as after any remesh)
  const auto relative = [](double a, double b) {
    return std::abs(a - b) / std::max(std::abs(b), 1e-300);
  };
  ASSERT_EQ(resumed.times.size(), uninterrupted.times.size());
  double worst = 0.0;
  for (std::size_t i = 0; i < resumed.times.size(); ++i) {
    worst = std::max(worst, relative(resumed.times[i], uninterrupted.times[i]));
    for (std::size_t p = 0; p < resumed.probe_temperatures.size(); ++p)
      worst = std::max(worst, relative(resumed.probe_temperatures[p][i],
                                       uninterrupted.probe_temperatures[p][i]));
  }
  std::printf("[measured] adaptive resume: worst relative difference %.2e\n", worst);
  EXPECT_LE(worst, 1e-12);
  EXPECT_EQ(resumed.steps.n_remeshes, uninterrupted.steps.n_remeshes);
  EXPECT_EQ(resumed.n_dofs, uninterrupted.n_dofs);
  ASSERT_EQ(resumed.energy.size(), uninterrupted.energy.size());
  EXPECT_LE(relative(resumed.energy.back().remesh_change,
                     uninterrupted.energy.back().remesh_change),
            1e-9);
  EXPECT_LE(resumed.worst_relative_imbalance, 1e-8);
}

/** The error of a case whose `adaptivity` block is @p block. */
std::string adaptivity_error(const std::string& block) {
  const std::string text = "mesh: {generator: plate, size: [\"1 cm\", \"1 cm\"]}\n"
                           "materials: [{id: 1, card: none.yaml}]\n"
                           "initial_temperature: \"500 K\"\n"
                           "time: {end: \"1 s\", first_step: \"0.1 s\"}\n"
                           "output: {folder: out}\n"
                           "adaptivity: " +
                           block + "\n";
  try {
    qs::load_case_from_string(text, "case.yaml", ".", false);
  } catch (const InputError& e) {
    return e.what();
  }
  return "(no error)";
}

TEST(AdaptiveMesh, BadAdaptivityBlocksAreLocatedErrors) {
  struct Row {
    const char* block;
    const char* expected;
  };
  const Row rows[] = {
      {"{every: 0}", "case.yaml:6:21: adaptivity.every"},
      {"{levels: 9}", "adaptivity.levels"},
      {"{refine_above: \"-1 K\"}", "adaptivity.refine_above"},
      {"{refine_above: \"1 s\"}", "adaptivity.refine_above"},
      {"{refine_above: \"1 K\", coarsen_below: \"2 K\"}", "adaptivity.coarsen_below"},
      {"{refin_above: \"1 K\"}", "refine_above"}, // did you mean
      {"maybe", "adaptivity"},
  };
  for (const Row& row : rows) {
    const std::string message = adaptivity_error(row.block);
    EXPECT_NE(message.find(row.expected), std::string::npos)
        << row.block << " -> " << message;
    EXPECT_NE(message.find("case.yaml:6:"), std::string::npos) << message;
  }
  EXPECT_EQ(adaptivity_error("true"), "(no error)");
  EXPECT_EQ(adaptivity_error("{every: 4, max_cells: 1000}"), "(no error)");
}

} // namespace
