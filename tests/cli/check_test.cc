// SPDX-License-Identifier: Apache-2.0
// `quantacal check`: deviation table and the exit codes 0 (within tolerance),
// 1 (outside tolerance) and 2 (invalid card).
#include "cli/cli_support.h"
#include "cli/test_cards.h"

#include <gtest/gtest.h>

#include <algorithm>
#include <filesystem>

namespace quantacal::test {
namespace {

bool contains(const std::string& text, const std::string& fragment) {
  return text.find(fragment) != std::string::npos;
}

/// Measurements of the constant card (c = 500 J/kg/K, M = 50 g/mol, first point 10 K):
/// c_p = 25 J/mol/K, and with the Debye T^3 extension below 10 K (C(T1) T1 / 4 there,
/// contribution.h) U(300 K) = 25 x 10 / 4 + 25 x 290 = 7312.5 J/mol (analytic).
std::string measurements(const std::string& specific_heat) {
  return "measurements:\n"
         "  - {quantity: specific_heat, T: \"300 K\", value: \"" +
         specific_heat +
         "\", tolerance: 0.01, source: \"illustrative demo data\"}\n"
         "  - {quantity: stored_energy, T: \"300 K\", value: \"7.3125 kJ/mol\", "
         "tolerance: 0.001, source: \"illustrative demo data\"}\n"
         "  - {quantity: conductivity, T: \"300 K\", value: \"20 W/m/K\", tolerance: "
         "0.01, "
         "source: \"illustrative demo data\"}\n";
}

std::string good_card(const TempDir& dir) {
  return dir.write("good.yaml", constant_capacity_card("good", 500.0, 10.0, 1000.0, "",
                                                       measurements("25 J/mol/K")));
}

TEST(Check, WithinToleranceExitsZero) {
  TempDir dir;
  const RunResult r = run_quantacal({"check", good_card(dir)});
  EXPECT_EQ(r.exit_code, 0) << r.out << r.err;
  EXPECT_TRUE(r.err.empty()) << r.err;
  EXPECT_TRUE(contains(r.out, "T_K")) << r.out;
  EXPECT_TRUE(contains(r.out, "dev_%")) << r.out;
  EXPECT_TRUE(contains(r.out, "specific heat")) << r.out;
  EXPECT_TRUE(contains(r.out, "stored energy")) << r.out;
  EXPECT_TRUE(contains(r.out, "conductivity")) << r.out;
  EXPECT_FALSE(contains(r.out, "OUTSIDE")) << r.out;
  EXPECT_TRUE(contains(r.out, "3 of 3 points within tolerance")) << r.out;
  EXPECT_TRUE(contains(r.out, "caution: ")) << r.out;
}

TEST(Check, FarOffMeasurementExitsOne) {
  // Measured 50 J/mol/K against a model of 25: deviation -50 %.
  TempDir dir;
  const std::string card =
      dir.write("off.yaml", constant_capacity_card("off", 500.0, 10.0, 1000.0, "",
                                                   measurements("50 J/mol/K")));
  const RunResult r = run_quantacal({"check", card});
  EXPECT_EQ(r.exit_code, 1) << r.out << r.err;
  EXPECT_TRUE(contains(r.out, "OUTSIDE")) << r.out;
  EXPECT_TRUE(contains(r.out, "-50.000")) << r.out;
  EXPECT_TRUE(contains(r.out, "2 of 3 points within tolerance")) << r.out;
}

TEST(Check, BrokenCardExitsTwoNamingFileLineAndField) {
  TempDir dir;
  const std::string card = dir.write("broken.yaml", broken_unit_card());
  const RunResult r = run_quantacal({"check", card});
  EXPECT_EQ(r.exit_code, 2) << r.out << r.err;
  EXPECT_TRUE(contains(r.err, "quantacal check: error: " + card + ":3:")) << r.err;
  EXPECT_TRUE(contains(r.err, "molar_mass")) << r.err;
  EXPECT_TRUE(contains(r.out, card + ": INVALID")) << r.out;
}

TEST(Check, InvalidWinsOverOutsideAndOtherCardsAreStillChecked) {
  TempDir dir;
  const std::string good = good_card(dir);
  const std::string off =
      dir.write("off.yaml", constant_capacity_card("off", 500.0, 10.0, 1000.0, "",
                                                   measurements("50 J/mol/K")));
  const std::string missing = (dir.path() / "missing.yaml").string();
  const RunResult two = run_quantacal({"check", good, missing, off});
  EXPECT_EQ(two.exit_code, 2);
  EXPECT_TRUE(contains(two.err, "missing.yaml")) << two.err;
  EXPECT_TRUE(contains(two.out, "(good): valid")) << two.out;
  EXPECT_TRUE(contains(two.out, "(off): valid")) << two.out;
  const RunResult one = run_quantacal({"check", good, off});
  EXPECT_EQ(one.exit_code, 1);
}

TEST(Check, CardWithoutMeasurementsIsValid) {
  TempDir dir;
  const std::string card =
      dir.write("plain.yaml", constant_capacity_card("plain", 500.0));
  const RunResult r = run_quantacal({"check", "--quiet", card});
  EXPECT_EQ(r.exit_code, 0) << r.err;
  EXPECT_TRUE(contains(r.out, "no measurements to compare")) << r.out;
}

TEST(Check, UsageErrors) {
  const RunResult none = run_quantacal({"check"});
  EXPECT_EQ(none.exit_code, 2);
  EXPECT_TRUE(none.out.empty());
  EXPECT_TRUE(contains(none.err, "expected at least one CARD")) << none.err;
  const RunResult option = run_quantacal({"check", "--quite", debye_card_path()});
  EXPECT_EQ(option.exit_code, 2);
  EXPECT_TRUE(option.out.empty());
  EXPECT_TRUE(contains(option.err, "did you mean '--quiet'")) << option.err;
  const RunResult help = run_quantacal({"check", "--help"});
  EXPECT_EQ(help.exit_code, 0);
  EXPECT_TRUE(contains(help.out, "usage: quantacal check CARD...")) << help.out;
}

TEST(Check, ShippedCardsAreValid) {
  // Every card in materials/ loads and builds its table; their published measurements
  // are compared too, and a point outside tolerance (exit 1) is reported by name.
  std::vector<std::string> cards;
  for (const auto& entry : std::filesystem::directory_iterator(source_path("materials")))
    if (entry.path().extension() == ".yaml")
      cards.push_back(entry.path().string());
  if (cards.empty())
    GTEST_SKIP() << "no shipped cards";
  std::sort(cards.begin(), cards.end());
  std::vector<std::string> args = {"check", "--quiet"};
  args.insert(args.end(), cards.begin(), cards.end());
  const RunResult r = run_quantacal(args);
  EXPECT_NE(r.exit_code, 2) << r.out << r.err;
  EXPECT_EQ(r.exit_code, 0) << r.out;
}

} // namespace
} // namespace quantacal::test
