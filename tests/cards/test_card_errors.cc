// SPDX-License-Identifier: Apache-2.0
// Bad cards: each error names file, 1-based line and column, field path, value
// and what was expected. The cards here are illustrative (values only need to
// be physical or deliberately not).
#include "support.h"

#include <quantacal/cards/card.h>
#include <quantacal/common/exceptions.h>

#include <gtest/gtest.h>

#include <cstdio>
#include <filesystem>
#include <fstream>

using namespace quantacal;
using quantacal::test::card_error;
using quantacal::test::replace;

namespace {

// Illustrative card; line numbers below refer to this text.
const std::string kGood = R"(name: test metal
description: illustrative card for error tests
molar_mass: "63.546 g/mol"
reference_density: "8960 kg/m^3"
valid_range: {from: "4 K", to: "300 K"}
heat_capacity:
  - kind: debye
    theta_D: "343 K"
  - kind: electronic
    gamma: "0.695 mJ/mol/K^2"
conductivity:
  kind: table
  columns: ["K", "W/m/K"]
  rows: [[4, 642], [20, 2423], [77, 547], [300, 396]]
sources:
  - {for: [molar_mass, reference_density, heat_capacity, conductivity], cite: "illustrative"}
)";

void write(const std::filesystem::path& p, const std::string& text) {
  std::ofstream out(p);
  out << text;
}

} // namespace

TEST(CardErrors, GoodCardLoads) {
  const MaterialPtr m = load_card_from_string(kGood, "good.yaml");
  EXPECT_EQ(m->name(), "test metal");
  EXPECT_EQ(m->model().contributions().size(), 2u);
  EXPECT_EQ(m->data().sources.size(), 1u);
  EXPECT_EQ(m->data().sources[0].citation, "illustrative");
}

TEST(CardErrors, YamlSyntaxError) {
  const CardError e = card_error(replace(kGood, "[[4, 642]", "[[4, 642"));
  EXPECT_EQ(e.file(), "bad.yaml");
  EXPECT_EQ(e.line(), 15);
  EXPECT_GT(e.column(), 0);
  EXPECT_NE(std::string(e.what()).find("bad.yaml:15:"), std::string::npos) << e.what();
  EXPECT_NE(e.expected().find("YAML syntax error"), std::string::npos);
}

// A latent heat outside the valid range is never reached (above) or already in
// every energy (below): most often a temperature in the wrong unit. Located at
// the transition's temperature (common practice).
TEST(CardErrors, TransitionOutsideTheValidRange) {
  const std::string transition = "  - kind: transition\n"
                                 "    temperature: \"%T\"\n"
                                 "    latent_heat: \"13 kJ/mol\"\n"
                                 "    width: \"0.1 K\"\n";
  for (const std::string t : {"1357 K", "2 K"}) {
    std::string block = transition;
    block.replace(block.find("%T"), 2, t);
    const CardError e = card_error(replace(kGood, "conductivity:\n  kind: table",
                                           block + "conductivity:\n  kind: table"));
    EXPECT_EQ(e.field(), "heat_capacity[2].temperature") << e.what();
    EXPECT_EQ(e.line(), 12);
    EXPECT_EQ(e.column(), 18);
    EXPECT_EQ(e.value(), t);
    EXPECT_EQ(
        e.expected(),
        "expected a transition inside the valid range (4 K to 300 K): outside it the "
        "latent heat is never reached, or already spent below it");
  }
}

TEST(CardErrors, UnknownKeyDidYouMean) {
  const CardError e = card_error(replace(kGood, "theta_D:", "theta_d:"));
  EXPECT_EQ(e.line(), 8);
  EXPECT_EQ(e.column(), 5);
  EXPECT_EQ(e.field(), "heat_capacity[0].theta_d");
  EXPECT_EQ(
      std::string(e.what()),
      "bad.yaml:8:5: heat_capacity[0].theta_d: unknown key (did you mean 'theta_D'?); "
      "expected one of: kind, theta_D, modes");
  const CardError top = card_error(replace(kGood, "conductivity:\n", "condutivity:\n"));
  EXPECT_EQ(top.field(), "condutivity");
  EXPECT_NE(top.expected().find("did you mean 'conductivity'?"), std::string::npos);
}

TEST(CardErrors, MissingField) {
  const CardError e =
      card_error(replace(kGood, "reference_density: \"8960 kg/m^3\"\n", ""));
  EXPECT_EQ(e.field(), "reference_density");
  EXPECT_EQ(e.expected(), "missing field");
  EXPECT_EQ(e.line(), 1);
  const CardError k = card_error(replace(kGood, "    theta_D: \"343 K\"\n", ""));
  EXPECT_EQ(k.field(), "heat_capacity[0].theta_D");
  EXPECT_EQ(k.line(), 7);
  EXPECT_EQ(k.expected(), "missing field");
}

TEST(CardErrors, WrongDimension) {
  const CardError e = card_error(replace(kGood, "\"343 K\"", "\"343 J/mol\""));
  EXPECT_EQ(
      std::string(e.what()),
      "bad.yaml:8:14: heat_capacity[0].theta_D = \"343 J/mol\": expected a temperature "
      "(K, mK or degC), found a molar energy (e.g. J/mol, kJ/mol)");
  EXPECT_EQ(e.value(), "343 J/mol");
  const CardError col = card_error(replace(kGood, "\"W/m/K\"", "\"W/m^2/K\""));
  EXPECT_EQ(col.field(), "conductivity.columns[1]");
  EXPECT_EQ(col.line(), 13);
}

TEST(CardErrors, NonPositiveTheta) {
  const CardError e = card_error(replace(kGood, "\"343 K\"", "\"-343 K\""));
  EXPECT_EQ(std::string(e.what()), "bad.yaml:8:14: heat_capacity[0].theta_D = \"-343 "
                                   "K\": expected a temperature > 0 K");
  EXPECT_EQ(e.line(), 8);
  EXPECT_EQ(e.column(), 14);
  EXPECT_EQ(e.field(), "heat_capacity[0].theta_D");
  EXPECT_EQ(e.value(), "-343 K");
  EXPECT_EQ(e.expected(), "expected a temperature > 0 K");
  EXPECT_EQ(card_error(replace(kGood, "\"343 K\"", "\"0 K\"")).value(), "0 K");
}

TEST(CardErrors, NegativeGamma) {
  const CardError e = card_error(replace(kGood, "\"0.695 mJ", "\"-0.695 mJ"));
  EXPECT_EQ(e.field(), "heat_capacity[1].gamma");
  EXPECT_EQ(e.line(), 10);
  EXPECT_EQ(e.column(), 12);
  EXPECT_EQ(e.expected(), "expected a Sommerfeld coefficient >= 0 J/mol/K^2");
}

TEST(CardErrors, NonMonotoneTable) {
  const CardError e = card_error(replace(kGood, "[77, 547]", "[17, 547]"));
  EXPECT_EQ(e.field(), "conductivity.rows[2][0]");
  EXPECT_EQ(e.value(), "17");
  EXPECT_EQ(e.line(), 14);
  EXPECT_EQ(e.column(), 33);
  EXPECT_EQ(e.expected(),
            "expected temperatures strictly increasing (previous row has 20 K)");
  const CardError neg = card_error(replace(kGood, "[20, 2423]", "[20, -2423]"));
  EXPECT_EQ(neg.field(), "conductivity.rows[1][1]");
  const CardError cover = card_error(replace(kGood, "to: \"300 K\"", "to: \"400 K\""));
  EXPECT_EQ(cover.field(), "conductivity.rows");
  EXPECT_NE(cover.expected().find("cover the valid range"), std::string::npos);
}

TEST(CardErrors, NanAndUnknownUnit) {
  EXPECT_NE(
      card_error(replace(kGood, "\"343 K\"", ".nan")).expected().find("does not start"),
      std::string::npos);
  EXPECT_NE(card_error(replace(kGood, "\"343 K\"", "\"nan K\"")).expected().find("NaN"),
            std::string::npos);
  const CardError u = card_error(replace(kGood, "\"343 K\"", "\"343 Kelvin\""));
  EXPECT_NE(u.expected().find("unknown unit 'Kelvin'"), std::string::npos);
}

TEST(CardErrors, UnknownKind) {
  const CardError e = card_error(replace(kGood, "kind: debye", "kind: debey"));
  EXPECT_EQ(e.field(), "heat_capacity[0].kind");
  EXPECT_EQ(e.value(), "debey");
  EXPECT_NE(e.expected().find("did you mean 'debye'?"), std::string::npos);
}

TEST(CardErrors, Sources) {
  // A parameter without a source.
  const CardError e = card_error(replace(kGood, ", conductivity]", "]"));
  EXPECT_EQ(e.field(), "conductivity.rows");
  EXPECT_EQ(e.line(), 14);
  EXPECT_NE(e.expected().find("no `sources` entry"), std::string::npos);
  // A source for a parameter the card does not have.
  const CardError f =
      card_error(replace(kGood, "[molar_mass,", "[molar_mas, molar_mass,"));
  EXPECT_EQ(f.field(), "sources[0].for");
  EXPECT_EQ(f.value(), "molar_mas");
  EXPECT_NE(f.expected().find("did you mean 'molar_mass'?"), std::string::npos);
}

TEST(CardErrors, MeasurementOutsideRange) {
  const std::string text =
      kGood +
      "measurements:\n  - {quantity: specific_heat, T: \"400 K\", value: \"24 J/mol/K\", "
      "tolerance: 0.03, source: \"illustrative\"}\n";
  const CardError e = card_error(text);
  EXPECT_EQ(e.field(), "measurements[0].T");
  EXPECT_EQ(e.line(), 18);
}

class CompositionErrors : public ::testing::Test {
protected:
  void SetUp() override {
    dir_ = std::filesystem::temp_directory_path() /
           ("quantacal_cards_" +
            std::to_string(::testing::UnitTest::GetInstance()->random_seed()) + "_" +
            ::testing::UnitTest::GetInstance()->current_test_info()->name());
    std::filesystem::create_directories(dir_);
    write(dir_ / "a.yaml", kGood);
    write(dir_ / "b.yaml", replace(kGood, "name: test metal", "name: other metal"));
  }
  void TearDown() override { std::filesystem::remove_all(dir_); }

  static std::string alloy(const std::string& components) {
    return "name: alloy\ndescription: illustrative\nreference_density: \"8000 kg/m^3\"\n"
           "valid_range: {from: \"4 K\", to: \"300 K\"}\ncomposition:\n" +
           components +
           "conductivity: {kind: constant, value: \"15 W/m/K\"}\n"
           "sources:\n  - {for: [composition, reference_density, conductivity], cite: "
           "\"illustrative\"}\n";
  }

  std::filesystem::path dir_;
};

TEST_F(CompositionErrors, NeumannKopp) {
  write(dir_ / "alloy.yaml", alloy("  - {card: a.yaml, mole_fraction: 0.25}\n"
                                   "  - {card: b.yaml, mole_fraction: 0.75}\n"));
  const MaterialPtr m = load_card((dir_ / "alloy.yaml").string());
  const MaterialPtr a = load_card((dir_ / "a.yaml").string());
  // Neumann-Kopp with identical components reproduces the component (analytic).
  EXPECT_NEAR(m->thermal_exact(77.0, Basis::mole).capacity,
              a->thermal_exact(77.0, Basis::mole).capacity, 1e-12);
  EXPECT_NEAR(m->molar_mass(), 0.063546, 1e-15);
}

TEST_F(CompositionErrors, FractionsNotSummingToOne) {
  write(dir_ / "alloy.yaml", alloy("  - {card: a.yaml, mole_fraction: 0.25}\n"
                                   "  - {card: b.yaml, mole_fraction: 0.70}\n"));
  try {
    load_card((dir_ / "alloy.yaml").string());
    FAIL();
  } catch (const CardError& e) {
    EXPECT_EQ(e.field(), "composition");
    EXPECT_EQ(e.line(), 6);
    EXPECT_EQ(e.column(), 3);
    EXPECT_EQ(e.value(), "0.95");
    EXPECT_EQ(e.expected(),
              "expected mole fractions summing to 1 (within 1e-6), but they sum to 0.95");
  }
}

TEST_F(CompositionErrors, Cycle) {
  write(dir_ / "x.yaml", alloy("  - {card: y.yaml, mole_fraction: 1}\n"));
  write(dir_ / "y.yaml", alloy("  - {card: x.yaml, mole_fraction: 1}\n"));
  const std::string x = (dir_ / "x.yaml").string();
  const std::string y = (dir_ / "y.yaml").string();
  try {
    load_card(x);
    FAIL();
  } catch (const CardError& e) {
    EXPECT_EQ(e.file(), y);
    EXPECT_EQ(e.field(), "composition[0].card");
    EXPECT_EQ(e.value(), "x.yaml");
    EXPECT_EQ(e.line(), 6);
    EXPECT_EQ(e.expected(), "composition cycle: " + x + " -> " + y + " -> " + x);
  }
}

// Neumann-Kopp sums capacities that are each valid only over their own card's
// range: a composed card claiming more is a located error (common practice).
TEST_F(CompositionErrors, RangeBeyondAComponent) {
  write(dir_ / "c.yaml", replace(kGood, "valid_range: {from: \"4 K\", to: \"300 K\"}",
                                 "valid_range: {from: \"100 K\", to: \"300 K\"}"));
  write(dir_ / "alloy.yaml", alloy("  - {card: a.yaml, mole_fraction: 0.5}\n"
                                   "  - {card: c.yaml, mole_fraction: 0.5}\n"));
  try {
    load_card((dir_ / "alloy.yaml").string());
    FAIL() << "a range beyond a component was accepted";
  } catch (const CardError& e) {
    EXPECT_EQ(e.field(), "valid_range");
    EXPECT_EQ(e.line(), 4);
    EXPECT_EQ(e.column(), 14);
    EXPECT_EQ(e.value(), "4 K to 300 K");
    EXPECT_EQ(e.expected(),
              "expected a range inside the valid ranges of the composed cards, 100 K to "
              "300 K (a.yaml: 4 K to 300 K, c.yaml: 100 K to 300 K)");
  }
}

TEST_F(CompositionErrors, MissingComponentAndBadFraction) {
  write(dir_ / "alloy.yaml", alloy("  - {card: none.yaml, mole_fraction: 1}\n"));
  try {
    load_card((dir_ / "alloy.yaml").string());
    FAIL();
  } catch (const CardError& e) {
    EXPECT_EQ(e.field(), "composition[0].card");
    EXPECT_NE(e.expected().find("expected an existing card file"), std::string::npos);
  }
  write(dir_ / "alloy.yaml", alloy("  - {card: a.yaml, mole_fraction: 1.5}\n"));
  try {
    load_card((dir_ / "alloy.yaml").string());
    FAIL();
  } catch (const CardError& e) {
    EXPECT_EQ(e.field(), "composition[0].mole_fraction");
    EXPECT_EQ(e.value(), "1.5");
    EXPECT_EQ(e.expected(), "expected a mole fraction in (0, 1]");
  }
}

TEST(CardErrors, MissingFile) {
  try {
    load_card("/nonexistent/quantacal.yaml");
    FAIL();
  } catch (const CardError& e) {
    EXPECT_EQ(e.file(), "/nonexistent/quantacal.yaml");
    EXPECT_EQ(e.expected(), "cannot open the card file");
  }
}

TEST(CardErrors, TransitionAndDilation) {
  const std::string with =
      replace(kGood, "conductivity:\n",
              "  - {kind: transition, temperature: \"250 K\", latent_heat: "
              "\"-1 kJ/mol\", width: \"3 K\"}\nconductivity:\n");
  const CardError e = card_error(with);
  EXPECT_EQ(e.field(), "heat_capacity[2].latent_heat");
  EXPECT_EQ(e.expected(), "expected a latent heat > 0");
  const std::string dil =
      replace(kGood, "conductivity:\n", "dilation: {grueneisen: 2.02}\nconductivity:\n");
  const CardError d = card_error(dil);
  EXPECT_EQ(d.field(), "dilation.bulk_modulus");
  EXPECT_EQ(d.expected(), "missing field");
}

TEST(CardKinds, EveryKindReads) {
  // Illustrative card using every contribution kind and the per-kg forms; the
  // expected SI values follow from the unit definitions (common practice).
  const std::string text = R"(name: every kind
description: illustrative
molar_mass: "50 g/mol"
reference_density: "5 g/cm^3"
valid_range: {from: "20 K", to: "60 K"}
heat_capacity:
  - {kind: einstein, theta_E: "200 K", modes: 1}
  - {kind: schottky, gap: "10 K", degeneracy_ratio: 3, centres: 0.01}
  - {kind: transition, temperature: "-233.15 degC", latent_heat: "20 J/kg", width: "2 degC"}
  - kind: tabulated
    points: [["10 K", "2 J/kg/K"], ["80 K", "40 J/kg/K"]]
    below: debye-t3
  - {kind: shomate, A: 1, B: 0, C: 0, D: 0, E: 0, range: {from: "15 K", to: "70 K"}, below: "1 J/mol"}
dilation: {nernst_lindemann: "1e-6 mol/J"}
conductivity: {kind: constant, value: "1 W/cm/K"}
sources:
  - {for: [molar_mass, reference_density, heat_capacity, dilation, conductivity], cite: "illustrative"}
)";
  const MaterialPtr m = load_card_from_string(text, "kinds.yaml");
  const auto& c = m->model().contributions();
  ASSERT_EQ(c.size(), 5u);
  EXPECT_EQ(c[0]->kind(), "einstein");
  EXPECT_EQ(c[3]->kind(), "tabulated");
  const auto param = [](const ContributionPtr& p, const std::string& name) {
    for (const auto& q : p->parameters())
      if (q.name == name)
        return q.value;
    ADD_FAILURE() << name;
    return 0.0;
  };
  EXPECT_NEAR(param(c[2], "temperature"), 40.0, 1e-12);
  EXPECT_NEAR(param(c[2], "latent_heat"), 1.0, 1e-12); // 20 J/kg * 0.05 kg/mol
  EXPECT_NEAR(param(c[2], "width"), 2.0, 1e-12);
  EXPECT_NEAR(m->conductivity(30.0).value, 100.0, 1e-12);
  EXPECT_NEAR(m->model().dilation()->a(), 1e-6, 1e-21);
  // Tabulated per kg -> per mole: C(10 K) = 2 J/kg/K * 0.05 kg/mol.
  EXPECT_NEAR(c[3]->evaluate(10.0).capacity, 0.1, 1e-12);
}
