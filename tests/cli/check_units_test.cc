// SPDX-License-Identifier: Apache-2.0
// `quantacal check --unit T=UNIT`: the temperatures of the deviation table and of
// the summary line in K, degC or degF (T/degC = T/K - 273.15, T/degF = 1.8 T/K -
// 459.67; NIST SP 811, sec. 4.2.1.1 and B.8); the other columns keep their units;
// a unit of another quantity or dimension is refused before anything is printed.
#include "cli/cli_support.h"
#include "cli/test_cards.h"

#include <gtest/gtest.h>

namespace quantacal::test {
namespace {

bool contains(const std::string& text, const std::string& fragment) {
  return text.find(fragment) != std::string::npos;
}

/// The constant card (c = 500 J/kg/K, M = 50 g/mol: c_p = 25 J/mol/K, analytic) with
/// one measurement at 300 K that it meets and one at 500 K that it misses.
std::string card(const TempDir& dir) {
  const std::string points =
      "measurements:\n"
      "  - {quantity: specific_heat, T: \"300 K\", value: \"25 J/mol/K\", tolerance: "
      "0.01, source: \"illustrative demo data\"}\n"
      "  - {quantity: specific_heat, T: \"500 K\", value: \"30 J/mol/K\", tolerance: "
      "0.01, source: \"illustrative demo data\"}\n";
  return dir.write("c.yaml",
                   constant_capacity_card("c", 500.0, 10.0, 1000.0, "", points));
}

TEST(CheckUnits, TemperaturesInTheUnitAsked) {
  TempDir dir;
  const std::string path = card(dir);
  const RunResult kelvin = run_quantacal({"check", path});
  EXPECT_EQ(kelvin.exit_code, 1) << kelvin.out << kelvin.err;
  EXPECT_TRUE(contains(kelvin.out, "T_K ")) << kelvin.out;
  EXPECT_TRUE(contains(kelvin.out, "\n300  ")) << kelvin.out;
  EXPECT_TRUE(contains(kelvin.out, "(specific heat at 500 K)")) << kelvin.out;

  const RunResult celsius = run_quantacal({"check", path, "--unit", "T=degC"});
  EXPECT_EQ(celsius.exit_code, 1) << celsius.out << celsius.err;
  EXPECT_TRUE(contains(celsius.out, "T_degC ")) << celsius.out;
  EXPECT_TRUE(contains(celsius.out, "\n26.85  ")) << celsius.out;  // 300 - 273.15
  EXPECT_TRUE(contains(celsius.out, "\n226.85  ")) << celsius.out; // 500 - 273.15
  EXPECT_TRUE(contains(celsius.out, "(specific heat at 226.85 degC)")) << celsius.out;
  EXPECT_TRUE(contains(celsius.out, "J/mol/K")) << celsius.out; // other units unchanged

  const RunResult fahrenheit = run_quantacal({"check", path, "--unit", "T=degF"});
  EXPECT_TRUE(contains(fahrenheit.out, "T_degF ")) << fahrenheit.out;
  EXPECT_TRUE(contains(fahrenheit.out, "\n80.33  ")) << fahrenheit.out; // 1.8*300-459.67
}

TEST(CheckUnits, OtherQuantitiesAndDimensionsAreRefused) {
  TempDir dir;
  const std::string path = card(dir);
  const RunResult cp = run_quantacal({"check", path, "--unit", "cp=J/g/K"});
  EXPECT_EQ(cp.exit_code, 2);
  EXPECT_TRUE(cp.out.empty()) << cp.out;
  EXPECT_TRUE(contains(cp.err, "unknown quantity 'cp'; check prints T")) << cp.err;
  const RunResult joule = run_quantacal({"check", path, "--unit", "T=J"});
  EXPECT_EQ(joule.exit_code, 2);
  EXPECT_TRUE(joule.out.empty()) << joule.out;
  EXPECT_TRUE(contains(joule.err, "option --unit = \"T=J\": item 1 (column 1) \"T=J\": "
                                  "unit \"J\" is"))
      << joule.err;
  const RunResult help = run_quantacal({"check", "--help"});
  EXPECT_TRUE(contains(help.out, "--unit T=UNIT")) << help.out;
}

} // namespace
} // namespace quantacal::test
