// SPDX-License-Identifier: Apache-2.0
// `quantacal equilibrium`: analytic calorimetry cases, latent heat, shipped cards,
// errors.
#include "cli/cli_support.h"
#include "cli/test_cards.h"

#include <quantacal/cards/card.h>

#include <gtest/gtest.h>

#include <cmath>
#include <filesystem>
#include <regex>
#include <sstream>

namespace quantacal::test {
namespace {

/// The value of the mandatory last line `final temperature: <value> K`.
double final_temperature(const RunResult& r) {
  const auto lines = lines_of(r.out);
  if (lines.empty())
    throw std::runtime_error("no output");
  const std::string& last = lines.back();
  const std::string prefix = "final temperature: ";
  if (last.compare(0, prefix.size(), prefix) != 0 || last.size() < prefix.size() + 3 ||
      last.compare(last.size() - 2, 2, " K") != 0)
    throw std::runtime_error("last line is not 'final temperature: <value> K': " + last);
  return to_double(last.substr(prefix.size(), last.size() - prefix.size() - 2));
}

/// The heat (J) of body @p index (1-based) from the report table: the first token of
/// its row printed as a signed exponent number ("+1.2345678e+03"), so material names
/// with blanks do not matter.
double heat_of(const RunResult& r, int index) {
  const std::regex heat_token(R"([+-][0-9]\.[0-9]+e[+-][0-9]+)");
  for (const auto& line : lines_of(r.out)) {
    std::istringstream in(line);
    std::string first;
    if (!(in >> first) || first != std::to_string(index))
      continue;
    for (std::string token; in >> token;)
      if (std::regex_match(token, heat_token))
        return to_double(token[0] == '+' ? token.substr(1) : token);
  }
  throw std::runtime_error("no row for body " + std::to_string(index));
}

std::string body(const std::string& card, double mass, double t0) {
  return card + ":" + format_double(mass) + ":" + format_double(t0);
}

bool contains(const std::string& text, const std::string& fragment) {
  return text.find(fragment) != std::string::npos;
}

TEST(Equilibrium, TwoConstantCapacityBodiesMatchCalorimetry) {
  // Illustrative cards; T_f = (m1 c1 T1 + m2 c2 T2) / (m1 c1 + m2 c2), the textbook
  // calorimetry result (Halliday and Resnick, Fundamentals of Physics).
  TempDir dir;
  const std::string a = dir.write("a.yaml", constant_capacity_card("body-a", 500.0));
  const std::string b = dir.write("b.yaml", constant_capacity_card("body-b", 4000.0));
  const double m1 = 2.0, c1 = 500.0, t1 = 350.0, m2 = 3.0, c2 = 4000.0, t2 = 280.0;
  const RunResult r = run_quantacal({"equilibrium", body(a, m1, t1), body(b, m2, t2)});
  ASSERT_EQ(r.exit_code, 0) << r.err;
  EXPECT_TRUE(r.err.empty()) << r.err;
  const double expected = (m1 * c1 * t1 + m2 * c2 * t2) / (m1 * c1 + m2 * c2);
  const double tf = final_temperature(r);
  EXPECT_NEAR(tf, expected, 1e-9 * expected);
  // Heat taken (+) or given (-): Q_i = m_i c_i (T_f - T0_i); printed with 8 digits.
  EXPECT_NEAR(heat_of(r, 1), m1 * c1 * (expected - t1), 1e-6 * m1 * c1 * (t1 - expected));
  EXPECT_NEAR(heat_of(r, 2), m2 * c2 * (expected - t2), 1e-6 * m1 * c1 * (t1 - expected));
  EXPECT_LT(heat_of(r, 1), 0.0);
  EXPECT_GT(heat_of(r, 2), 0.0);
  EXPECT_TRUE(contains(r.out, "energy balance: sum of heats")) << r.out;
  EXPECT_TRUE(contains(r.out, "caution: ")) << r.out;
}

TEST(Equilibrium, ThreeBodiesAndMassUnits) {
  // Same calorimetry result for three bodies; "500g" is 0.5 kg and "26.85degC" is 300 K.
  TempDir dir;
  const std::string a = dir.write("a.yaml", constant_capacity_card("body-a", 900.0));
  const std::string b = dir.write("b.yaml", constant_capacity_card("body-b", 450.0));
  const RunResult r = run_quantacal(
      {"equilibrium", a + ":500g:26.85degC", b + ":1.5kg:400K", body(a, 0.25, 200.0)});
  ASSERT_EQ(r.exit_code, 0) << r.err;
  const double num = 0.5 * 900 * 300 + 1.5 * 450 * 400 + 0.25 * 900 * 200;
  const double den = 0.5 * 900 + 1.5 * 450 + 0.25 * 900;
  EXPECT_NEAR(final_temperature(r), num / den, 1e-9 * num / den);
}

TEST(Equilibrium, LatentHeatOfATransitionIsReleased) {
  // Illustrative: body 1 has c = 500 J/kg/K and a transition at 500 K with L = 5 kJ/mol
  // (M = 50 g/mol, so 100 kJ/kg); it starts above and ends far below the transition, so
  // m1 c1 (T1 - T_f) + m1 L = m2 c2 (T_f - T2) (calorimetry with a phase change,
  // Halliday and Resnick, Fundamentals of Physics).
  TempDir dir;
  const std::string transition = "  - kind: transition\n"
                                 "    temperature: \"500 K\"\n"
                                 "    latent_heat: \"5 kJ/mol\"\n"
                                 "    width: \"1 K\"\n";
  const std::string a = dir.write(
      "a.yaml", constant_capacity_card("melting", 500.0, 10.0, 1000.0, transition));
  const std::string b = dir.write("b.yaml", constant_capacity_card("bath", 4000.0));
  const double m1 = 1.0, c1 = 500.0, t1 = 800.0, latent = 1e5, m2 = 2.0, c2 = 4000.0,
               t2 = 300.0;
  const RunResult r = run_quantacal({"equilibrium", body(a, m1, t1), body(b, m2, t2)});
  ASSERT_EQ(r.exit_code, 0) << r.err;
  const double expected =
      (m1 * c1 * t1 + m1 * latent + m2 * c2 * t2) / (m1 * c1 + m2 * c2);
  EXPECT_NEAR(final_temperature(r), expected, 1e-8 * expected);
  EXPECT_NEAR(heat_of(r, 1), -(m1 * c1 * (t1 - expected) + m1 * latent),
              1e-6 * m1 * latent);
  EXPECT_TRUE(contains(r.out, "crosses the transition at 500 K")) << r.out;
}

TEST(Equilibrium, EndingInsideATransitionIsReported) {
  // Illustrative: a cold bath too small to solidify the hot body fully; T_f stays
  // within a few widths of the transition and the report says how far it got.
  TempDir dir;
  const std::string transition = "  - kind: transition\n"
                                 "    temperature: \"500 K\"\n"
                                 "    latent_heat: \"5 kJ/mol\"\n"
                                 "    width: \"2 K\"\n";
  const std::string a = dir.write(
      "a.yaml", constant_capacity_card("melting", 500.0, 10.0, 1000.0, transition));
  const std::string b = dir.write("b.yaml", constant_capacity_card("bath", 500.0));
  // Sensible heat alone would give 468 K: 1 kg from 510 K, 0.2 kg from 260 K; about a
  // fifth of the latent heat is enough, so T_f stays about 2 K above 500 K.
  const RunResult r =
      run_quantacal({"equilibrium", body(a, 1.0, 510.0), body(b, 0.2, 260.0)});
  ASSERT_EQ(r.exit_code, 0) << r.err;
  const double tf = final_temperature(r);
  EXPECT_GT(tf, 500.0);
  EXPECT_LT(tf, 506.0);
  EXPECT_TRUE(contains(r.out, "ends inside the transition at 500 K")) << r.out;
  // Energy: the heat given by body 1 is taken by body 2, c = 500 J/kg/K.
  EXPECT_NEAR(heat_of(r, 2), 0.2 * 500.0 * (tf - 260.0),
              1e-6 * 0.2 * 500.0 * (tf - 260.0));
}

TEST(Equilibrium, EqualStartingTemperaturesStayPut) {
  TempDir dir;
  const std::string a = dir.write("a.yaml", constant_capacity_card("body-a", 500.0));
  const RunResult r =
      run_quantacal({"equilibrium", body(a, 1.0, 321.5), body(a, 7.0, 321.5)});
  ASSERT_EQ(r.exit_code, 0) << r.err;
  EXPECT_EQ(final_temperature(r), 321.5);
}

TEST(Equilibrium, CardPathMayContainColons) {
  TempDir dir;
  std::filesystem::create_directory(dir.path() / "a:b");
  const std::string a = dir.write("a:b/c.yaml", constant_capacity_card("body-a", 500.0));
  const RunResult r =
      run_quantacal({"equilibrium", body(a, 1.0, 300.0), body(a, 1.0, 400.0)});
  ASSERT_EQ(r.exit_code, 0) << r.err;
  EXPECT_NEAR(final_temperature(r), 350.0, 1e-9 * 350.0); // equal bodies meet halfway
}

/// The shipped card for @p name, or "" when it is not in materials/.
std::string shipped(const std::string& name) {
  const std::string path = source_path("materials/" + name + ".yaml");
  return std::filesystem::exists(path) ? path : "";
}

TEST(Equilibrium, ShippedMetalsNearRoomTemperature) {
  // A metal at 310 K into aluminium at 290 K; estimate from the CRC mass-specific
  // c_p at 298.15 K (CRC 97th ed.: Cu 385, Ag 235, Al 897 J/kg/K), which vary by
  // about 1 % over 290-310 K; that moves T_f by well under 0.3 K.
  const std::string aluminium = shipped("aluminium");
  std::string metal = shipped("copper");
  double c_metal = 385.0; // CRC 97th ed., Cu
  if (metal.empty()) {
    metal = shipped("silver");
    c_metal = 235.0; // CRC 97th ed., Ag
  }
  if (aluminium.empty() || metal.empty())
    GTEST_SKIP() << "shipped aluminium and copper (or silver) cards are needed";
  const MaterialPtr al = load_card(aluminium);
  const MaterialPtr me = load_card(metal);
  const RunResult r = run_quantacal(
      {"equilibrium", body(metal, 1.0, 310.0), body(aluminium, 1.0, 290.0)});
  ASSERT_EQ(r.exit_code, 0) << r.err;
  const double tf = final_temperature(r);
  const double estimate = (c_metal * 310.0 + 897.0 * 290.0) / (c_metal + 897.0);
  EXPECT_NEAR(tf, estimate, 0.3);
  // Energy closes on the library's own energies.
  const double before = me->thermal(310.0).energy + al->thermal(290.0).energy;
  const double after = me->thermal(tf).energy + al->thermal(tf).energy;
  EXPECT_NEAR(after, before, 1e-9 * std::abs(before));
}

TEST(Equilibrium, ShippedAluminiumSolidifiesReleasingItsLatentHeat) {
  // Liquid aluminium at 955 K into solid aluminium at 300 K, both 1 kg. Latent heat of
  // fusion 10.71 kJ/mol at 933.47 K and M = 26.98 g/mol (CRC Handbook): 396.9 kJ/kg.
  // Solid c_p is at least about the CRC 298 K value, 897 J/kg/K, above 300 K (from
  // memory: it rises with T), so the hot body gives at least L + 0.99 x 897 (955 - T_f).
  const std::string aluminium = shipped("aluminium");
  if (aluminium.empty())
    GTEST_SKIP() << "no shipped aluminium card";
  const MaterialPtr al = load_card(aluminium);
  if (al->upper_temperature() < 955.0 || al->lower_temperature() > 300.0)
    GTEST_SKIP() << "the aluminium card does not cover 300 K to 955 K";
  const RunResult r = run_quantacal(
      {"equilibrium", body(aluminium, 1.0, 955.0), body(aluminium, 1.0, 300.0)});
  ASSERT_EQ(r.exit_code, 0) << r.err;
  const double tf = final_temperature(r);
  const double latent = 10.71e3 / 26.9815385e-3; // J/kg, CRC Handbook
  EXPECT_TRUE(contains(r.out, "crosses the transition at 933.47 K")) << r.out;
  EXPECT_TRUE(contains(r.out, "latent heat 396")) << r.out; // 396.9 kJ/kg (CRC)
  const double given = -heat_of(r, 1);
  const double taken = heat_of(r, 2);
  EXPECT_GT(given, latent + 0.99 * 897.0 * (955.0 - tf));
  EXPECT_NEAR(given, taken, 1e-6 * given);
  // Sensible heat alone would meet at 627.5 K; the latent heat lifts T_f well above.
  EXPECT_GT(tf, 627.5 + 0.5 * latent / 1300.0);
  EXPECT_LT(tf, 933.47);
}

// ---- error paths ----

void expect_error(const RunResult& r, const std::string& fragment) {
  EXPECT_EQ(r.exit_code, 2) << r.err;
  EXPECT_TRUE(r.out.empty()) << r.out;
  EXPECT_TRUE(contains(r.err, "quantacal equilibrium: error: ")) << r.err;
  EXPECT_TRUE(contains(r.err, fragment)) << r.err;
}

TEST(EquilibriumErrors, FewerThanTwoBodies) {
  TempDir dir;
  const std::string a = dir.write("a.yaml", constant_capacity_card("body-a", 500.0));
  expect_error(run_quantacal({"equilibrium", body(a, 1.0, 300.0)}),
               "expected two or more bodies CARD:MASS_KG:T0_K but got 1");
  expect_error(run_quantacal({"equilibrium"}), "but got 0");
}

TEST(EquilibriumErrors, WrongBodySyntax) {
  TempDir dir;
  const std::string a = dir.write("a.yaml", constant_capacity_card("body-a", 500.0));
  const std::string good = body(a, 1.0, 300.0);
  expect_error(run_quantacal({"equilibrium", good, a + ":2"}),
               "expected CARD:MASS_KG:T0_K");
  expect_error(run_quantacal({"equilibrium", good, a + ":two:300"}),
               "mass \"two\": expected a mass in kg");
  expect_error(run_quantacal({"equilibrium", good, a + ":-1:300"}),
               "expected a mass > 0 kg");
  expect_error(run_quantacal({"equilibrium", good, a + ":2 lb:300"}),
               "expected a mass in kg");
  expect_error(run_quantacal({"equilibrium", good, a + ":1:hot"}),
               "starting temperature = \"hot\": expected a temperature");
  expect_error(run_quantacal({"equilibrium", good, ":1:300"}),
               "expected CARD:MASS_KG:T0_K");
}

TEST(EquilibriumErrors, StartOutsideTheValidRange) {
  TempDir dir;
  const std::string a = dir.write("a.yaml", constant_capacity_card("body-a", 500.0));
  expect_error(run_quantacal({"equilibrium", body(a, 1.0, 300.0), body(a, 1.0, 1200.0)}),
               "valid range of card " + a);
}

TEST(EquilibriumErrors, FinalTemperatureOutsideACardsRange) {
  // Body 2's card starts at 300 K, but the large cold body 1 pulls T_f far below it.
  TempDir dir;
  const std::string a = dir.write("a.yaml", constant_capacity_card("cold", 500.0));
  const std::string b =
      dir.write("b.yaml", constant_capacity_card("warm", 500.0, 300.0, 1000.0));
  expect_error(run_quantacal({"equilibrium", body(a, 100.0, 20.0), body(b, 1.0, 400.0)}),
               "final temperature to lie inside the valid range of card " + b);
}

TEST(EquilibriumErrors, MissingCardAndBadOption) {
  TempDir dir;
  const std::string a = dir.write("a.yaml", constant_capacity_card("body-a", 500.0));
  const std::string missing = (dir.path() / "missing.yaml").string();
  expect_error(
      run_quantacal({"equilibrium", body(a, 1.0, 300.0), body(missing, 1.0, 300.0)}),
      "missing.yaml");
  expect_error(
      run_quantacal({"equilibrium", "--exakt", body(a, 1.0, 300.0), body(a, 1.0, 400.0)}),
      "unknown option '--exakt' (did you mean '--exact'?)");
}

TEST(Equilibrium, ExactAgreesWithTable) {
  TempDir dir;
  const std::string b = dir.write("b.yaml", constant_capacity_card("bath", 4000.0));
  const std::vector<std::string> bodies = {body(debye_card_path(), 2.0, 600.0),
                                           body(b, 0.5, 20.0)};
  std::vector<std::string> table = {"equilibrium"}, exact = {"equilibrium", "--exact"};
  table.insert(table.end(), bodies.begin(), bodies.end());
  exact.insert(exact.end(), bodies.begin(), bodies.end());
  const RunResult t = run_quantacal(table), e = run_quantacal(exact);
  ASSERT_EQ(t.exit_code, 0) << t.err;
  ASSERT_EQ(e.exit_code, 0) << e.err;
  // The table's energies follow the model to about 1e-9 relative (the default
  // table_tolerance, docs/cards.md).
  EXPECT_NEAR(final_temperature(t), final_temperature(e), 1e-7 * final_temperature(e));
}

TEST(Equilibrium, Help) {
  const RunResult r = run_quantacal({"equilibrium", "--help"});
  EXPECT_EQ(r.exit_code, 0);
  EXPECT_TRUE(contains(r.out, "usage: quantacal equilibrium CARD:MASS_KG:T0_K")) << r.out;
  EXPECT_TRUE(contains(r.out, "final temperature: <value> K"));
}

} // namespace
} // namespace quantacal::test
