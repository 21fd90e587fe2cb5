// SPDX-License-Identifier: Apache-2.0
// `quantacal fit` as a command: a successful run on synthetic data, and every kind of
// bad input (exit code, message text, no output card written).
#include "cli/cli_support.h"
#include "fit/fit_support.h"

#include <quantacal/cards/card.h>
#include <quantacal/common/exceptions.h>
#include <quantacal/models/metal_conductivity.h>

#include <gtest/gtest.h>

#include <cmath>
#include <filesystem>
#include <random>

using namespace quantacal;
using test::run_quantacal;
using test::TempDir;

namespace {

const std::string start_card =
    std::string(QUANTACAL_SOURCE_DIR) + "/tests/fit/data/copper_start.yaml";

// Synthetic c_p of a Debye (330 K) + electronic (0.70 mJ/mol/K^2) solid with the
// start card's Einstein branch and dilation, 1 % seeded noise.
std::string synthetic_csv() {
  const MaterialPtr s = load_card(start_card);
  const auto& terms = s->model().contributions();
  const HeatCapacityModel truth =
      s->model()
          .with_contribution(0, terms[0]->with_parameter("theta_D", 330.0))
          .with_contribution(2, terms[2]->with_parameter("gamma", 0.70e-3));
  std::mt19937 random(42u);
  std::normal_distribution<double> gauss(0.0, 1.0);
  std::string csv = "T_K,cp_J_per_mol_K,sigma\n";
  for (int i = 0; i < 30; ++i) {
    const double t = 5.0 * std::pow(60.0, i / 29.0);
    const double c = truth.evaluate(t).capacity;
    csv += format_double(t) + "," + format_double(c * (1 + 0.01 * gauss(random))) + "," +
           format_double(0.01 * c) + "\n";
  }
  return csv;
}

struct Failure {
  int exit_code;
  std::string message;
};

void expect_failure(const TempDir& dir, const std::string& csv,
                    std::vector<std::string> extra, const Failure& expected) {
  const std::string data = dir.write("data.csv", csv);
  const std::string out = (dir.path() / "fitted.yaml").string();
  std::vector<std::string> args = {"fit", data, "--card", start_card, "-o", out};
  if (extra.empty())
    extra = {"--free", "theta_D,gamma"};
  args.insert(args.end(), extra.begin(), extra.end());
  const auto r = run_quantacal(args);
  EXPECT_EQ(r.exit_code, expected.exit_code) << r.err;
  EXPECT_NE(r.err.find(expected.message), std::string::npos)
      << "stderr: " << r.err << "\nexpected: " << expected.message;
  EXPECT_FALSE(std::filesystem::exists(out)) << "an output card was written";
  EXPECT_FALSE(std::filesystem::exists(out + ".tmp"));
}

} // namespace

TEST(FitCommand, WritesFittedCardReportAndPlot) {
  TempDir dir;
  const std::string data = dir.write("synthetic.csv", synthetic_csv());
  const std::string out = (dir.path() / "fitted.yaml").string();
  const auto r = run_quantacal({"fit", data, "--card", start_card, "--free",
                                "theta_D,gamma", "--weights", "absolute", "-o", out});
  ASSERT_EQ(r.exit_code, 0) << r.err;
  EXPECT_NE(r.out.find("correlation matrix"), std::string::npos) << r.out;
  EXPECT_NE(r.out.find("reduced chi-square"), std::string::npos);
  EXPECT_NE(r.out.find("residuals"), std::string::npos);
  ASSERT_TRUE(std::filesystem::exists(out));
  const std::string card = test::read_file(out);
  EXPECT_NE(card.find("\nfit:\n"), std::string::npos);
  EXPECT_NE(card.find("data_sha256: "), std::string::npos);
  EXPECT_NE(card.find("covariance:"), std::string::npos);
  EXPECT_NE(card.find("cite: \"Kittel, Introduction to Solid State Physics (verified)\""),
            std::string::npos)
      << "the start card's sources are kept";
  // The fitted card loads, and carries the fitted values (synthetic truth 330 K, 0.70
  // mJ).
  const MaterialPtr fitted = load_card(out);
  const auto p0 = fitted->model().contributions()[0]->parameters();
  const auto p2 = fitted->model().contributions()[2]->parameters();
  EXPECT_NEAR(p0[0].value, 330.0, 2.0);
  EXPECT_NEAR(p2[0].value, 0.70e-3, 0.05e-3);
  EXPECT_TRUE(std::filesystem::exists(dir.path() / "fitted.svg"));
  const std::string svg = test::read_file(dir.path() / "fitted.svg");
  EXPECT_NE(svg.find("<svg"), std::string::npos);
  // A second fit from the fitted card replaces the fit record instead of adding one.
  const std::string out2 = (dir.path() / "fitted2.yaml").string();
  const auto r2 = run_quantacal({"fit", data, "--card", out, "--free", "theta_D", "-o",
                                 out2, "--weights", "absolute"});
  ASSERT_EQ(r2.exit_code, 0) << r2.err;
  const std::string card2 = test::read_file(out2);
  EXPECT_EQ(card2.find("\nfit:\n"), card2.rfind("\nfit:\n"));
  (void)load_card(out2);
}

// A card with phases (materials/copper.yaml: lattice model, assessed series,
// liquid): the Debye temperature of its first phase is fitted by its bare name,
// reported and written back at its phase path, and the written card loads with it.
// Synthetic data: the card itself with theta_D 330 K, 5-90 K, exact.
TEST(FitCommand, APhaseParameterIsFittedAndWrittenBackAtItsPath) {
  const std::string copper = std::string(QUANTACAL_SOURCE_DIR) + "/materials/copper.yaml";
  const MaterialPtr start = load_card(copper);
  const auto truth = start->model().contributions()[0]->with_parameter(
      "phases[0].heat_capacity[0].theta_D", 330.0);
  std::string csv = "T_K,cp_J_per_mol_K\n";
  for (double t = 5.0; t <= 90.0; t += 5.0)
    csv += format_double(t) + "," + format_double(truth->evaluate(t).capacity) + "\n";
  TempDir dir;
  const std::string data = dir.write("phase.csv", csv);
  const std::string out = (dir.path() / "fitted.yaml").string();
  const auto r =
      run_quantacal({"fit", data, "--card", copper, "--free", "theta_D", "-o", out});
  ASSERT_EQ(r.exit_code, 0) << r.err;
  EXPECT_NE(r.out.find("phases[0].heat_capacity[0].theta_D"), std::string::npos) << r.out;
  const MaterialPtr fitted = load_card(out);
  double theta = 0.0;
  for (const Parameter& q : fitted->model().contributions()[0]->parameters())
    if (q.name == "phases[0].heat_capacity[0].theta_D")
      theta = q.value;
  EXPECT_NEAR(theta, 330.0, 1e-3);
  EXPECT_NE(test::read_file(out).find("theta_D: \"330"), std::string::npos);
}

TEST(FitCommand, ConductivityOfACompositionCardWrittenElsewhere) {
  // k points of the NIST OFHC RRR 50 correlation (computed, coefficients from memory,
  // checked in test_metal_conductivity.cc); the start card composes copper.yaml.
  TempDir dir;
  std::string csv = "T_K,k_W_per_m_K\n";
  for (double t : {4.0, 8.0, 15.0, 20.0, 30.0, 50.0, 77.0, 100.0, 200.0, 300.0})
    csv += format_double(t) + "," + format_double(test::nist_copper_conductivity(t, 50)) +
           "\n";
  const std::string data = dir.write("k.csv", csv);
  const std::string out = (dir.path() / "copper_rrr50.yaml").string();
  const auto r =
      run_quantacal({"fit", data, "--card",
                     std::string(QUANTACAL_SOURCE_DIR) + "/materials/copper_rrr.yaml",
                     "--free", "conductivity.rrr", "-o", out});
  ASSERT_EQ(r.exit_code, 0) << r.err;
  const MaterialPtr fitted = load_card(out); // the component card is still found
  const auto k =
      std::dynamic_pointer_cast<const MetalConductivity>(fitted->data().conductivity);
  ASSERT_TRUE(k);
  // NIST RRR 50 curve: the fitted RRR comes out near 50 (model limit: about 10 %)
  EXPECT_NEAR(k->inputs().rrr, 50.0, 5.0);
}

TEST(FitCommand, BadInputGivesClearErrorsAndNoCard) {
  TempDir dir;
  const std::string good = synthetic_csv();
  // misnamed column
  expect_failure(
      dir, "Temp_K,cp_J_per_mol_K\n10,0.1\n20,0.5\n30,1.5\n", {},
      {2, "data.csv:1:1: header = \"Temp_K\": unknown column (did you mean 'T_K'?)"});
  expect_failure(
      dir, "T_K,cp_J_per_molK\n10,0.1\n20,0.5\n30,1.5\n", {},
      {2, "data.csv:1:5: header = \"cp_J_per_molK\": unknown column (did you mean "
          "'cp_J_per_mol_K'?)"});
  // missing value column
  expect_failure(dir, "T_K\n10\n20\n30\n", {},
                 {2, "data.csv:1:1: header: missing a value column"});
  // non-numeric cell: line and column
  expect_failure(dir, "T_K,cp_J_per_mol_K\n10,0.1\n20,0.5x\n30,1.5\n", {},
                 {2, "data.csv:3:4: cp_J_per_mol_K = \"0.5x\": expected a number"});
  // temperature <= 0
  expect_failure(dir, "T_K,cp_J_per_mol_K\n10,0.1\n0,0.5\n30,1.5\n", {},
                 {2, "data.csv:3:1: T_K = \"0\": expected a temperature > 0 K"});
  // a row outside the start card's valid_range (1 K to 1300 K)
  expect_failure(dir, "T_K,cp_J_per_mol_K\n10,0.1\n20,0.5\n1500,30\n", {},
                 {2,
                  "data.csv:4:1: T_K = \"1500\": the start card cannot be evaluated "
                  "here: the card's valid_range: copper (fit start): requires 1 K <= T "
                  "<= 1300 K but got 1500 K"});
  // fewer points than free parameters
  expect_failure(dir, "T_K,cp_J_per_mol_K\n10,0.1\n20,0.5\n", {},
                 {2, "2 data rows for 2 free parameters: a fit needs more rows than free "
                     "parameters"});
  // unknown parameter name
  expect_failure(dir, good, {"--free", "theta_DD"},
                 {2, "--free: unknown parameter 'theta_DD' (did you mean 'theta_D'?)"});
  // a fit that does not converge
  expect_failure(dir, good, {"--free", "theta_D,gamma", "--max-iterations", "1"},
                 {3, "the fit did not converge: no convergence after 1 iterations"});
  // missing required option
  expect_failure(dir, good, {"--weights", "relative"}, {2, "missing option --free"});
}

TEST(FitCommand, PlotNeedsNoShellAndAMissingGnuplotIsOnlyAWarning) {
  TempDir dir;
  const std::string data = dir.write("synthetic.csv", synthetic_csv());
  // gnuplot starts without a shell: a folder with a space, a quote and a `$` is fine.
  const auto folder = dir.path() / "it's a $HOME folder";
  std::filesystem::create_directories(folder);
  const std::string out = (folder / "fitted.yaml").string();
  const auto r = run_quantacal({"fit", data, "--card", start_card, "--free", "theta_D",
                                "--weights", "absolute", "-o", out});
  ASSERT_EQ(r.exit_code, 0) << r.err;
  EXPECT_TRUE(r.err.empty()) << r.err;
  EXPECT_NE(r.out.find("\nplot: " + (folder / "fitted.svg").string() + "\n"),
            std::string::npos)
      << r.out;
  EXPECT_NE(test::read_file(folder / "fitted.svg").find("<svg"), std::string::npos);
  EXPECT_FALSE(std::filesystem::exists(folder / "fitted.svg.tmp"));

  // Without gnuplot on the PATH the card is still written, with a warning.
  const auto empty = dir.path() / "empty-path";
  std::filesystem::create_directories(empty);
  const std::string out2 = (dir.path() / "fitted2.yaml").string();
  const std::string command = "PATH=" + test::shell_quote(empty.string()) + " " +
                              test::shell_quote(QUANTACAL_EXECUTABLE) + " fit " +
                              test::shell_quote(data) + " --card " +
                              test::shell_quote(start_card) + " --free theta_D -o " +
                              test::shell_quote(out2) + " >/dev/null 2>" +
                              test::shell_quote((dir.path() / "err.txt").string());
  const int status = std::system(command.c_str());
  ASSERT_TRUE(WIFEXITED(status));
  EXPECT_EQ(WEXITSTATUS(status), 0);
  EXPECT_EQ(test::read_file(dir.path() / "err.txt"),
            "quantacal fit: warning: no plot written: gnuplot not found\n");
  EXPECT_TRUE(std::filesystem::exists(out2));
  EXPECT_FALSE(std::filesystem::exists(dir.path() / "fitted2.svg"));
  EXPECT_FALSE(std::filesystem::exists(dir.path() / "fitted2.svg.tmp"));
}
