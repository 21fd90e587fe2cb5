// SPDX-License-Identifier: Apache-2.0
// The temperature unit of the result files (output.temperature_unit, default: the
// unit of the case's initial temperature) and the keys output.windows and
// output.report (docs/results.md): probes.csv and summary.yaml in K, degC and degF
// against the run's own kelvin histories converted by the definitions of the
// scales (T/degC = T/K - 273.15, T/degF = 1.8 T/K - 459.67; NIST SP 811, sec. 4.2.1.1
// and B.8), the located errors of bad entries, and a run killed and resumed with
// another unit, whose probes.csv is then in that unit from its first row.
#include "checkpoint_support.h"

#include <quantacal/solver/solver.h>

#include <gtest/gtest.h>

#include <cmath>
#include <csignal>
#include <cstdlib>
#include <filesystem>
#include <sys/wait.h>

namespace {

namespace fs = std::filesystem;
using namespace quantacal::test;
namespace qs = quantacal::solver;

std::string tiny_case(const std::string& folder, const std::string& output_extra) {
  return "name: units check\n"
         "geometry: axisymmetric\n"
         "mesh: {generator: cylinder, radius: \"5 mm\", length: \"10 mm\", cells: [2, "
         "4]}\n"
         "materials:\n"
         "  - {id: 1, card: \"" +
         source_path("materials/aluminium.yaml") +
         "\"}\n"
         "initial_temperature: \"500 degC\"\n"
         "boundaries:\n"
         "  - id: 0\n"
         "    convection: {ambient: \"30 degC\", h: \"20 kW/m^2/K\"}\n"
         "time: {end: \"1 s\", first_step: \"0.01 s\"}\n"
         "output:\n"
         "  folder: \"" +
         folder +
         "\"\n"
         "  fields: false\n"
         "  probes:\n"
         "    - {name: centre, point: [\"0 mm\", \"5 mm\"]}\n"
         "    - {name: surface, point: [\"5 mm\", \"5 mm\"]}\n"
         "  crossing_temperatures: [\"400 degC\"]\n" +
         output_extra;
}

qs::RunResult run_in(const std::string& case_file) {
  const qs::CaseDescription c = qs::load_case(case_file);
  qs::RunOptions options;
  options.communicator = MPI_COMM_SELF;
  return qs::run_case(c, options);
}

/** The value after "key: " on the line that starts with @p key (after blanks). */
double summary_value(const std::string& summary, const std::string& key) {
  for (const std::string& line : lines_of(summary)) {
    const auto at = line.find_first_not_of(' ');
    if (at != std::string::npos && line.compare(at, key.size() + 2, key + ": ") == 0)
      return to_double(line.substr(at + key.size() + 2));
  }
  throw std::runtime_error("no " + key + " in summary.yaml");
}

void expect_files_in(const fs::path& out, const qs::RunResult& r, const std::string& unit,
                     double factor, double offset, const std::string& rate_unit) {
  const std::string csv = read_file(out / "probes.csv");
  EXPECT_EQ(lines_of(csv).front(), "time [s],centre [" + unit + "],surface [" + unit +
                                       "],centre dT/dt [" + rate_unit +
                                       "],surface dT/dt [" + rate_unit + "]");
  const auto rows = csv_rows(csv);
  ASSERT_EQ(rows.size(), r.times.size());
  for (std::size_t k = 0; k < rows.size(); ++k)
    for (std::size_t p = 0; p < 2; ++p) {
      EXPECT_NEAR(rows[k][1 + p], factor * r.probe_temperatures[p][k] - offset, 1e-9);
      if (k == 0) // no rate at t = 0
        EXPECT_TRUE(std::isnan(rows[k][3 + p]) && std::isnan(r.probe_rates[p][k]));
      else
        EXPECT_NEAR(rows[k][3 + p], factor * r.probe_rates[p][k],
                    1e-12 * std::abs(factor * r.probe_rates[p][k]));
    }
  const std::string summary = read_file(out / "summary.yaml");
  EXPECT_NE(summary.find("temperature_unit: " + unit + "\n"), std::string::npos);
  EXPECT_NE(summary.find("rate_unit: " + rate_unit + "\n"), std::string::npos);
  EXPECT_NEAR(summary_value(summary, "final_temperature_" + unit),
              factor * r.probe_temperatures[0].back() - offset, 1e-9);
  EXPECT_NEAR(summary_value(summary, "- temperature_" + unit), factor * 673.15 - offset,
              1e-9);
  const std::string rate_key = rate_unit == "K/s" ? "rate_K_per_s" : "rate_degF_per_s";
  EXPECT_NEAR(summary_value(summary, rate_key), factor * r.crossings[0].rate,
              1e-12 * std::abs(factor * r.crossings[0].rate));
}

TEST(ResultUnits, DefaultIsTheUnitOfTheInitialTemperature) {
  TempDir dir;
  const fs::path out = dir.path() / "out";
  const qs::RunResult r = run_in(dir.write("case.yaml", tiny_case(out.string(), "")));
  ASSERT_TRUE(r.completed);
  expect_files_in(out, r, "degC", 1.0, 273.15, "K/s");
  // the plots name the unit on their axes
  EXPECT_NE(read_file(out / "cooling_curves.gp").find("set ylabel 'temperature (degC)'"),
            std::string::npos);
  EXPECT_NE(read_file(out / "cooling_rates.gp").find("cooling rate -dT/dt (K/s)"),
            std::string::npos);
}

TEST(ResultUnits, KelvinAndFahrenheitOnRequest) {
  TempDir dir;
  const fs::path k = dir.path() / "k", f = dir.path() / "f";
  const qs::RunResult rk =
      run_in(dir.write("k.yaml", tiny_case(k.string(), "  temperature_unit: K\n")));
  expect_files_in(k, rk, "K", 1.0, 0.0, "K/s");
  const qs::RunResult rf =
      run_in(dir.write("f.yaml", tiny_case(f.string(), "  temperature_unit: degF\n")));
  expect_files_in(f, rf, "degF", 1.8, 459.67, "degF/s");
}

TEST(ResultUnits, BadEntriesAreLocatedErrors) {
  TempDir dir;
  const struct {
    const char* extra;
    const char* message;
  } cases[] = {
      {"  temperature_unit: degc\n",
       ":18:21: output.temperature_unit = \"degc\": expected K, degC or degF (did you "
       "mean 'degC'?)"},
      {"  windows: [[\"400 degC\", \"400 degC\"]]\n",
       ":18:13: output.windows[0] = \"[...]\": expected a pair of two different "
       "temperatures"},
      {"  windows: [[\"400 degC\"]]\n",
       ":18:13: output.windows[0] = \"[...]\": expected a pair of two different "
       "temperatures"},
      {"  windows: [[\"400 degC\", \"2 s\"]]\n",
       ":18:26: output.windows[0][1] = \"2 s\": expected a temperature"},
      {"  windows: \"400 degC\"\n",
       ":18:12: output.windows = \"400 degC\": expected a list of temperature pairs"},
      {"  report: maybe\n", ":18:11: output.report = \"maybe\": expected true or false"},
  };
  for (const auto& c : cases) {
    const std::string file = dir.write("bad.yaml", tiny_case("out", c.extra));
    try {
      qs::load_case(file);
      ADD_FAILURE() << "accepted: " << c.extra;
    } catch (const quantacal::InputError& e) {
      EXPECT_NE(std::string(e.what()).find(file + c.message), std::string::npos)
          << e.what();
    }
  }
  EXPECT_FALSE(fs::exists(dir.path() / "out"));
}

int run_cli(const std::string& case_file, bool resume, const std::string& kill_at) {
  std::string command;
  if (!kill_at.empty())
    command += "QUANTACAL_TEST_KILL_AT=" + shell_quote(kill_at) + " ";
  command += "exec " + shell_quote(QUANTACAL_EXECUTABLE) + " run " +
             shell_quote(case_file) + " --quiet" + (resume ? " --resume" : "") +
             " >/dev/null 2>&1 </dev/null";
  return std::system(command.c_str());
}

TEST(ResultUnits, ResumedRunRewritesEveryRowInTheUnitOfTheResumedCase) {
  // killed after 25 steps in degC (the default of the case), resumed with
  // temperature_unit K: probes.csv is then in K from its first row, and equals the
  // uninterrupted degC run shifted by 273.15 K
  TempDir dir;
  const fs::path reference = dir.path() / "reference", out = dir.path() / "out";
  const std::string ref_case = dir.write("ref.yaml", checkpoint_case(reference.string()));
  ASSERT_EQ(run_cli(ref_case, false, ""), 0);
  const std::string degc = dir.write("c.yaml", checkpoint_case(out.string()));
  const int killed = run_cli(degc, false, "step:25");
  ASSERT_TRUE(WIFSIGNALED(killed) || WEXITSTATUS(killed) == 128 + SIGKILL) << killed;
  EXPECT_NE(read_file(out / "probes.csv").find("centre [degC]"), std::string::npos);
  const std::string kelvin =
      dir.write("k.yaml", checkpoint_case(out.string()) + "  temperature_unit: K\n");
  ASSERT_EQ(run_cli(kelvin, true, ""), 0);
  const std::string csv = read_file(out / "probes.csv");
  EXPECT_EQ(lines_of(csv).front(),
            "time [s],centre [K],surface [K],centre dT/dt [K/s],surface dT/dt [K/s]");
  const auto rows = csv_rows(csv),
             expected = csv_rows(read_file(reference / "probes.csv"));
  ASSERT_EQ(rows.size(), expected.size());
  double worst = 0.0;
  for (std::size_t k = 0; k < rows.size(); ++k)
    for (std::size_t c = 0; c < rows[k].size(); ++c) {
      const double want = expected[k][c] + (c == 1 || c == 2 ? 273.15 : 0.0);
      worst =
          std::max(worst, std::abs(rows[k][c] - want) / std::max(std::abs(want), 1.0));
    }
  EXPECT_LT(worst, 1e-12);
}

} // namespace
