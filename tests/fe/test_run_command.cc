// SPDX-License-Identifier: Apache-2.0
// `quantacal run` as a command: its options (the shared option parser, with "did
// you mean"), and the plot of the cooling curves, which the command makes with
// gnuplot from the script the library writes (the library itself starts no
// program), also in an output folder whose name has blanks and both quotes.
#include "cli/cli_support.h"

#include <quantacal/solver/solver.h>

#include <gtest/gtest.h>

#include <cstdlib>
#include <filesystem>
#include <sstream>
#include <string>
#include <unistd.h>

namespace {

namespace fs = std::filesystem;
using quantacal::test::read_file;
using quantacal::test::run_quantacal;
using quantacal::test::TempDir;

/** True if an executable `name` is on PATH. */
bool on_path(const std::string& name) {
  const char* path = std::getenv("PATH");
  if (!path)
    return false;
  std::istringstream folders(path);
  for (std::string folder; std::getline(folders, folder, ':');)
    if (!folder.empty() && ::access((fs::path(folder) / name).c_str(), X_OK) == 0)
      return true;
  return false;
}

/** A small case (axisymmetric aluminium cylinder quenched for 0.4 s), two probes. */
std::string tiny_case(const std::string& folder) {
  return "name: tiny \"quoted\" quench\n"
         "geometry: axisymmetric\n"
         "mesh: {generator: cylinder, radius: \"5 mm\", length: \"10 mm\", cells: [2, "
         "4]}\n"
         "materials:\n"
         "  - {id: 1, card: \"" +
         std::string(QUANTACAL_SOURCE_DIR) +
         "/materials/aluminium.yaml\"}\n"
         "initial_temperature: \"500 degC\"\n"
         "boundaries:\n"
         "  - id: 0\n"
         "    convection: {ambient: \"30 degC\", h: \"2 kW/m^2/K\"}\n"
         "time: {end: \"0.4 s\", first_step: \"0.05 s\"}\n"
         "output:\n"
         "  folder: \"" +
         folder +
         "\"\n"
         "  fields: false\n"
         "  probes:\n"
         "    - {name: centre, point: [\"0 mm\", \"5 mm\"]}\n"
         "    - {name: surface, point: [\"5 mm\", \"5 mm\"]}\n";
}

TEST(RunCommand, PlotsIntoAFolderWithBlanksAndQuotes) {
  if (!on_path("gnuplot"))
    GTEST_SKIP() << "gnuplot is not on PATH (.ci/deps installs gnuplot-nox)";
  TempDir dir;
  const std::string case_file = dir.write("case.yaml", tiny_case("unused"));
  const fs::path out = dir.path() / "out dir \"q\" it's";
  const auto r = run_quantacal({"run", case_file, "--output", out.string(), "--quiet"});
  ASSERT_EQ(r.exit_code, 0) << r.err;
  EXPECT_TRUE(r.err.empty()) << r.err;
  EXPECT_TRUE(fs::exists(out / "probes.csv"));
  EXPECT_TRUE(fs::exists(out / "cooling_curves.gp"));
  ASSERT_TRUE(fs::exists(out / "cooling_curves.svg"));
  EXPECT_FALSE(fs::exists(out / "cooling_curves.svg.tmp"));
  const std::string svg = read_file(out / "cooling_curves.svg");
  EXPECT_NE(svg.find("<svg"), std::string::npos);
  EXPECT_NE(svg.find("centre"), std::string::npos); // the probes' column headers
  EXPECT_NE(svg.find("surface"), std::string::npos);
}

// In-process, run_case writes the script and reports it, but makes no SVG: the
// library starts no program.
TEST(RunCommand, LibraryWritesThePlotScriptAndStartsNoProgram) {
  TempDir dir;
  const fs::path out = dir.path() / "out";
  const std::string case_file = dir.write("case.yaml", tiny_case(out.string()));
  const quantacal::solver::CaseDescription c = quantacal::solver::load_case(case_file);
  quantacal::solver::RunOptions options;
  options.communicator = MPI_COMM_SELF;
  const quantacal::solver::RunResult r = quantacal::solver::run_case(c, options);
  ASSERT_TRUE(r.completed);
  EXPECT_EQ(r.plot_script, (out / "cooling_curves.gp").string());
  const std::string script = read_file(out / "cooling_curves.gp");
  EXPECT_NE(script.find("'probes.csv' using 1:i"), std::string::npos) << script;
  EXPECT_NE(script.find("plot for [i=2:3]"), std::string::npos) << script;
  EXPECT_FALSE(fs::exists(out / "cooling_curves.svg"));
  EXPECT_FALSE(fs::exists(out / "cooling_curves.svg.tmp"));
}

TEST(RunCommand, MisspeltOptionGetsDidYouMean) {
  TempDir dir;
  const std::string case_file = dir.write("case.yaml", tiny_case("out"));
  const auto r = run_quantacal({"run", case_file, "--no-plto"});
  EXPECT_EQ(r.exit_code, 2);
  EXPECT_NE(r.err.find("unknown option '--no-plto' (did you mean '--no-plot'?)"),
            std::string::npos)
      << r.err;
  EXPECT_TRUE(r.out.empty()) << r.out;
  EXPECT_FALSE(fs::exists(dir.path() / "out"));
}

TEST(RunCommand, BadValuesAndArgumentsAreRejected) {
  TempDir dir;
  const std::string case_file = dir.write("case.yaml", tiny_case("out"));
  const auto degree = run_quantacal({"run", case_file, "--degree", "4"});
  EXPECT_EQ(degree.exit_code, 2);
  EXPECT_NE(degree.err.find("option --degree = \"4\": expected one of 1, 2, 3"),
            std::string::npos)
      << degree.err;
  const auto form = run_quantacal({"run", case_file, "--formulation=enthalpy"});
  EXPECT_EQ(form.exit_code, 2);
  EXPECT_NE(form.err.find("expected one of energy, capacity"), std::string::npos)
      << form.err;
  const auto two = run_quantacal({"run", case_file, case_file});
  EXPECT_EQ(two.exit_code, 2);
  EXPECT_NE(two.err.find("one case file expected"), std::string::npos) << two.err;
  const auto none = run_quantacal({"run"});
  EXPECT_EQ(none.exit_code, 2);
  EXPECT_NE(none.err.find("usage: quantacal run"), std::string::npos) << none.err;
  EXPECT_FALSE(fs::exists(dir.path() / "out"));
}

TEST(RunCommand, HelpListsEveryOption) {
  const auto r = run_quantacal({"run", "--help"});
  EXPECT_EQ(r.exit_code, 0) << r.err;
  for (const char* option :
       {"--output DIR", "--formulation F", "--degree P", "--no-fields", "--no-plot",
        "--quiet", "--resume", "mpirun -np N"})
    EXPECT_NE(r.out.find(option), std::string::npos) << option << "\n" << r.out;
}

} // namespace
