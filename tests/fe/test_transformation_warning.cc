// SPDX-License-Identifier: Apache-2.0
// A card's transformation heat is the equilibrium (slow-heating) one: `run`
// warns, in its log and in summary.yaml, when a part crosses a transformation
// join faster than 1 K/s, and stays silent when it crosses slowly. The cases are
// illustrative: a 5 mm iron cylinder starting inside the alpha-gamma join of
// materials/iron.yaml (1179.8-1189.8 K).
#include "cli/cli_support.h"

#include <gtest/gtest.h>

#include <filesystem>
#include <string>

namespace {

namespace fs = std::filesystem;
using quantacal::test::read_file;
using quantacal::test::run_quantacal;
using quantacal::test::TempDir;

std::string iron_case(const std::string& h, const std::string& end) {
  return "name: iron cylinder through the alpha-gamma join\n"
         "geometry: axisymmetric\n"
         "mesh: {generator: cylinder, radius: \"5 mm\", length: \"10 mm\", cells: [2, "
         "4]}\n"
         "materials:\n"
         "  - {id: 1, card: \"" +
         std::string(QUANTACAL_SOURCE_DIR) +
         "/materials/iron.yaml\"}\n"
         "initial_temperature: \"1186 K\"\n"
         "boundaries:\n"
         "  - id: 0\n"
         "    convection: {ambient: \"300 K\", h: \"" +
         h +
         "\"}\n"
         "time: {end: \"" +
         end +
         "\", first_step: \"0.05 s\"}\n"
         "output:\n"
         "  folder: unused\n"
         "  fields: false\n"
         "  probes:\n"
         "    - {name: centre, point: [\"0 mm\", \"5 mm\"]}\n";
}

// Lumped estimate (common practice): dT/dt = -2 h (T - T_amb) / (r rho c_p). With
// h = 5 kW/m^2/K, r = 5 mm, rho c_p of about 7874 x 800 J/m^3/K (the join's mean
// capacity, materials/iron.yaml): about 280 K/s, far above 1 K/s.
TEST(TransformationWarning, AFastCrossingIsReportedInTheLogAndTheSummary) {
  TempDir dir;
  const std::string case_file = dir.write("case.yaml", iron_case("5 kW/m^2/K", "0.5 s"));
  const fs::path out = dir.path() / "fast";
  const auto r = run_quantacal({"run", case_file, "--output", out.string()});
  ASSERT_EQ(r.exit_code, 0) << r.err;
  const std::string expected = "iron: alpha (bcc), assessed series -> gamma (fcc) at "
                               "1184.8 K crossed at up to ";
  EXPECT_NE(r.out.find("warning: " + expected), std::string::npos) << r.out;
  EXPECT_NE(r.out.find("the transformation is undercooled or suppressed"),
            std::string::npos);
  const std::string summary = read_file(out / "summary.yaml");
  EXPECT_NE(summary.find("warnings:\n  - \"" + expected), std::string::npos) << summary;
}

// h = 2 W/m^2/K: about 0.1 K/s by the same estimate, so no warning while the part
// sits in the join.
TEST(TransformationWarning, ASlowCrossingIsNotReported) {
  TempDir dir;
  const std::string case_file = dir.write("case.yaml", iron_case("2 W/m^2/K", "5 s"));
  const fs::path out = dir.path() / "slow";
  const auto r = run_quantacal({"run", case_file, "--output", out.string()});
  ASSERT_EQ(r.exit_code, 0) << r.err;
  EXPECT_EQ(r.out.find("warning: "), std::string::npos) << r.out;
  EXPECT_NE(read_file(out / "summary.yaml").find("warnings: []\n"), std::string::npos);
}

} // namespace
