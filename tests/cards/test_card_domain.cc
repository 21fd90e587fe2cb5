// SPDX-License-Identifier: Apache-2.0
// The physical domain of every parameter a card gives: a value that is legal
// YAML but not physics (a temperature at or below 0 K, a density, conductivity,
// latent heat or molar mass <= 0, a mole fraction outside (0, 1], NaN or an
// infinity) is a CardError at its own line and column, naming the field, the
// value as written and what was expected. One row per kind of parameter
// (docs/cards.md, "Domains"). The cards here are illustrative.
#include "support.h"

#include <quantacal/cards/card.h>
#include <quantacal/common/exceptions.h>

#include <gtest/gtest.h>

#include <algorithm>
#include <filesystem>
#include <fstream>
#include <string>
#include <unistd.h>

using namespace quantacal;

namespace {

// Many kinds of term in one card (their sum is positive over the range).
const std::string kTerms = R"(name: domain test
description: illustrative card for the domain checks
molar_mass: "63.546 g/mol"
reference_density: "8960 kg/m^3"
valid_range: {from: "20 K", to: "300 K"}
reference_temperature: "298.15 K"
table_tolerance: 1e-6
heat_capacity:
  - {kind: debye, theta_D: "343 K", modes: 3}
  - {kind: einstein, theta_E: "200 K", modes: 0.1}
  - {kind: electronic, gamma: "0.695 mJ/mol/K^2"}
  - {kind: schottky, gap: "50 K", degeneracy_ratio: 2, centres: 0.01}
  - {kind: transition, temperature: "150 K", latent_heat: "10 J/mol", width: "2 K"}
  - {kind: magnetic, critical_temperature: "250 K", moment: 0.1, structure_factor: 0.28}
  - kind: tabulated
    columns: ["K", "J/mol/K"]
    rows: [[10, 0.25], [400, 0.5]]
dilation: {grueneisen: 2.0, bulk_modulus: "140 GPa", molar_volume: "7.1 cm^3/mol"}
conductivity:
  kind: metal
  theta_R: "320 K"
  reference_resistivity: "1.68e-8 Ohm m"
  rrr: 100
measurements:
  - {quantity: specific_heat, T: "100 K", value: "16 J/mol/K", tolerance: 0.2, source: s}
  - {quantity: conductivity, T: "200 K", value: "400 W/m/K", tolerance: 0.5, source: s}
sources:
  - {for: [molar_mass, reference_density, heat_capacity, dilation, conductivity], cite: "illustrative"}
)";

// A Shomate polynomial and a Gibbs-energy series, a conductivity table.
const std::string kSeries = R"(name: series test
description: illustrative card for the domain checks
molar_mass: "26.98 g/mol"
reference_density: "2700 kg/m^3"
valid_range: {from: "300 K", to: "900 K"}
heat_capacity:
  - kind: shomate
    A: 20
    B: 1
    C: 0
    D: 0
    E: 0
    range: {from: "250 K", to: "950 K"}
  - kind: gibbs_series
    pieces:
      - {from: "200 K", to: "600 K", c: -5, d: -1e-3}
      - {to: "1000 K", c: -5.2, d: -0.8e-3}
conductivity:
  kind: table
  columns: ["K", "W/m/K"]
  rows: [[250, 240], [600, 230], [1000, 220]]
sources:
  - {for: [molar_mass, reference_density, heat_capacity, conductivity], cite: "illustrative"}
)";

// A solid and its melt.
const std::string kPhases = R"(name: phase test
description: illustrative card for the domain checks
molar_mass: "26.98 g/mol"
reference_density: "2700 kg/m^3"
valid_range: {from: "300 K", to: "1200 K"}
phases:
  - name: solid
    heat_capacity:
      - {kind: debye, theta_D: "428 K"}
    dilation: {nernst_lindemann: "2e-6 mol/J"}
    conductivity: {kind: constant, value: "200 W/m/K"}
  - name: liquid
    liquid: true
    from: {temperature: "933 K", latent_heat: "10.7 kJ/mol", width: "2 K"}
    density: "2375 kg/m^3"
    heat_capacity:
      - {kind: debye, theta_D: "428 K"}
sources:
  - {for: [molar_mass, reference_density, phases], cite: "illustrative"}
)";

// One bad value: in the card `base`, `from` (unique there) becomes `to`; the error
// must point at the first occurrence of `at` in the edited card (line and column
// found here, independently of the reader).
struct Row {
  const char* kind;
  const std::string* base;
  const char* from;
  const char* to;
  const char* at;
  const char* field;
  const char* value;
  const char* expected; // a part of CardError::expected()
};

const Row kRows[] = {
    // the card as a whole
    {"molar mass", &kTerms, "\"63.546 g/mol\"", "\"-63.5 g/mol\"", "\"-63.5",
     "molar_mass", "-63.5 g/mol", "expected a molar mass > 0 g/mol"},
    {"reference density", &kTerms, "\"8960 kg/m^3\"", "\"0 kg/m^3\"", "\"0 kg/m^3",
     "reference_density", "0 kg/m^3", "expected a density > 0 kg/m^3"},
    {"valid range start", &kTerms, "from: \"20 K\"", "from: \"-20 K\"", "\"-20 K",
     "valid_range.from", "-20 K", "expected a temperature > 0 K"},
    {"valid range end below its start", &kTerms, "to: \"300 K\"}", "to: \"10 K\"}",
     "\"10 K\"}", "valid_range.to", "10 K", "above its start"},
    {"reference temperature", &kTerms, "\"298.15 K\"", "\"-1 K\"", "\"-1 K",
     "reference_temperature", "-1 K", "expected a temperature >= 0 K"},
    {"table tolerance", &kTerms, "table_tolerance: 1e-6", "table_tolerance: 0", "0\n",
     "table_tolerance", "0", "between 1e-13 and 1e-2"},
    // heat-capacity terms
    {"Debye temperature", &kTerms, "\"343 K\"", "\"-343 K\"", "\"-343",
     "heat_capacity[0].theta_D", "-343 K", "expected a temperature > 0 K"},
    {"Debye modes", &kTerms, "modes: 3}", "modes: -3}", "-3}", "heat_capacity[0].modes",
     "-3", "expected a number of modes > 0"},
    {"Einstein temperature", &kTerms, "theta_E: \"200 K\"", "theta_E: \"0 K\"", "\"0 K\"",
     "heat_capacity[1].theta_E", "0 K", "expected a temperature > 0 K"},
    {"Einstein modes", &kTerms, "modes: 0.1", "modes: 0", "0}", "heat_capacity[1].modes",
     "0", "expected a number of modes > 0"},
    {"Sommerfeld gamma", &kTerms, "\"0.695 mJ", "\"-0.695 mJ", "\"-0.695",
     "heat_capacity[2].gamma", "-0.695 mJ/mol/K^2",
     "expected a Sommerfeld coefficient >= 0"},
    {"Schottky gap", &kTerms, "gap: \"50 K\"", "gap: \"-50 K\"", "\"-50 K",
     "heat_capacity[3].gap", "-50 K", "expected a temperature > 0 K"},
    {"Schottky degeneracy ratio", &kTerms, "degeneracy_ratio: 2", "degeneracy_ratio: 0",
     "0, centres", "heat_capacity[3].degeneracy_ratio", "0",
     "expected a degeneracy ratio > 0"},
    {"Schottky centres", &kTerms, "centres: 0.01", "centres: -0.01", "-0.01",
     "heat_capacity[3].centres", "-0.01", "expected a number of centres"},
    {"transition temperature", &kTerms, "\"150 K\"", "\"-150 K\"", "\"-150",
     "heat_capacity[4].temperature", "-150 K", "expected a temperature > 0 K"},
    {"transition outside the range", &kTerms, "\"150 K\"", "\"1500 K\"", "\"1500",
     "heat_capacity[4].temperature", "1500 K", "inside the valid range"},
    {"latent heat", &kTerms, "\"10 J/mol\"", "\"0 J/mol\"", "\"0 J/mol",
     "heat_capacity[4].latent_heat", "0 J/mol", "expected a latent heat > 0"},
    {"transition width", &kTerms, "width: \"2 K\"", "width: \"0 K\"", "\"0 K\"}",
     "heat_capacity[4].width", "0 K", "expected a temperature difference > 0 K"},
    {"Curie temperature", &kTerms, "\"250 K\"", "\"0 K\"", "\"0 K\"",
     "heat_capacity[5].critical_temperature", "0 K",
     "expected a Curie or Neel temperature > 0 K"},
    {"magnetic moment", &kTerms, "moment: 0.1", "moment: -0.1", "-0.1",
     "heat_capacity[5].moment", "-0.1", "expected a magnetic moment > 0"},
    {"structure factor", &kTerms, "structure_factor: 0.28", "structure_factor: 1.28",
     "1.28", "heat_capacity[5].structure_factor", "1.28", "between 0 and 1"},
    {"measured capacity point", &kTerms, "[400, 0.5]", "[400, -0.5]", "-0.5",
     "heat_capacity[6].rows[1][1]", "-0.5", "expected a heat capacity"},
    {"measured point temperature", &kTerms, "[[10, 0.25]", "[[-10, 0.25]", "-10",
     "heat_capacity[6].rows[0][0]", "-10", "expected a temperature > 0 K"},
    {"Grueneisen parameter", &kTerms, "grueneisen: 2.0", "grueneisen: -2.0", "-2.0",
     "dilation.grueneisen", "-2.0", "expected a Grueneisen parameter > 0"},
    {"bulk modulus", &kTerms, "\"140 GPa\"", "\"-140 GPa\"", "\"-140",
     "dilation.bulk_modulus", "-140 GPa", "expected a bulk modulus > 0 Pa"},
    {"molar volume", &kTerms, "\"7.1 cm^3/mol\"", "\"0 cm^3/mol\"", "\"0 cm^3",
     "dilation.molar_volume", "0 cm^3/mol", "expected a molar volume > 0"},
    {"Nernst-Lindemann coefficient", &kPhases, "\"2e-6 mol/J\"", "\"-2e-6 mol/J\"",
     "\"-2e-6", "phases[0].dilation.nernst_lindemann", "-2e-6 mol/J",
     "expected a Nernst-Lindemann coefficient > 0"},
    {"Shomate coefficient NaN", &kSeries, "B: 1", "B: .nan", ".nan", "heat_capacity[0].B",
     ".nan", "expected a finite number"},
    {"Shomate range", &kSeries, "from: \"250 K\"", "from: \"-250 K\"", "\"-250",
     "heat_capacity[0].range.from", "-250 K", "expected a temperature > 0 K"},
    {"Gibbs series coefficient infinite", &kSeries, "c: -5,", "c: -.inf,", "-.inf",
     "heat_capacity[1].pieces[0].c", "-.inf", "expected a finite number"},
    {"Gibbs series coefficient overflow", &kSeries, "d: -1e-3", "d: -1e999", "-1e999",
     "heat_capacity[1].pieces[0].d", "-1e999", "expected a finite number"},
    {"Gibbs series start", &kSeries, "from: \"200 K\"", "from: \"0 K\"", "\"0 K",
     "heat_capacity[1].pieces[0].from", "0 K", "expected a temperature > 0 K"},
    // conductivities
    {"conductivity table value", &kSeries, "[600, 230]", "[600, 0]", "0]",
     "conductivity.rows[1][1]", "0", "expected a conductivity (W/m/K) > 0"},
    {"conductivity table temperature", &kSeries, "[[250, 240]", "[[0, 240]", "0, 240",
     "conductivity.rows[0][0]", "0", "expected a temperature > 0 K"},
    {"constant conductivity", &kPhases, "\"200 W/m/K\"", "\"-200 W/m/K\"", "\"-200",
     "phases[0].conductivity.value", "-200 W/m/K", "expected a conductivity > 0 W/m/K"},
    {"resistive Debye temperature", &kTerms, "\"320 K\"", "\"-320 K\"", "\"-320",
     "conductivity.theta_R", "-320 K", "expected a temperature > 0 K"},
    {"reference resistivity", &kTerms, "\"1.68e-8 Ohm m\"", "\"-1.68e-8 Ohm m\"",
     "\"-1.68e-8", "conductivity.reference_resistivity", "-1.68e-8 Ohm m",
     "expected a resistivity > 0 Ohm m"},
    {"residual resistance ratio", &kTerms, "rrr: 100", "rrr: 1", "1\n",
     "conductivity.rrr", "1", "expected a ratio > 1"},
    // phases
    {"phase transition temperature", &kPhases, "\"933 K\"", "\"-933 K\"", "\"-933",
     "phases[1].from.temperature", "-933 K", "expected a temperature > 0 K"},
    {"latent heat of melting", &kPhases, "\"10.7 kJ/mol\"", "\"0 kJ/mol\"", "\"0 kJ",
     "phases[1].from.latent_heat", "0 kJ/mol",
     "expected the latent heat of melting (> 0)"},
    {"negative latent heat", &kPhases, "\"10.7 kJ/mol\"", "\"-10.7 kJ/mol\"", "\"-10.7",
     "phases[1].from.latent_heat", "-10.7 kJ/mol", "expected a latent heat >= 0"},
    {"phase density", &kPhases, "\"2375 kg/m^3\"", "\"-2375 kg/m^3\"", "\"-2375",
     "phases[1].density", "-2375 kg/m^3", "expected a density > 0 kg/m^3"},
    // measurements
    {"measured temperature", &kTerms, "T: \"100 K\"", "T: \"-100 K\"", "\"-100",
     "measurements[0].T", "-100 K", "expected a temperature > 0 K"},
    {"measured specific heat", &kTerms, "\"16 J/mol/K\"", "\"-16 J/mol/K\"", "\"-16",
     "measurements[0].value", "-16 J/mol/K", "expected a measured specific heat > 0"},
    {"measured conductivity", &kTerms, "\"400 W/m/K\"", "\"0 W/m/K\"", "\"0 W",
     "measurements[1].value", "0 W/m/K", "expected a measured conductivity > 0 W/m/K"},
    // NaN and infinities in quantities
    {"NaN temperature", &kTerms, "\"343 K\"", "\"nan K\"", "\"nan",
     "heat_capacity[0].theta_D", "nan K", "NaN and infinity are not allowed"},
    {"infinite density", &kTerms, "\"8960 kg/m^3\"", "\"inf kg/m^3\"", "\"inf",
     "reference_density", "inf kg/m^3", "NaN and infinity are not allowed"},
};

TEST(CardDomain, TheBaseCardsLoad) {
  for (const std::string* card : {&kTerms, &kSeries, &kPhases})
    EXPECT_NO_THROW(load_card_from_string(*card, "good.yaml")) << *card;
}

TEST(CardDomain, EveryKindOfBadParameterIsALocatedError) {
  for (const Row& row : kRows) {
    SCOPED_TRACE(row.kind);
    const std::string& base = *row.base;
    const std::size_t at_from = base.find(row.from);
    if (at_from == std::string::npos ||
        base.find(row.from, at_from + 1) != std::string::npos) {
      ADD_FAILURE() << "not once in the card: " << row.from;
      continue;
    }
    std::string text = base;
    text.replace(at_from, std::string(row.from).size(), row.to);
    const std::size_t at = text.find(row.at, at_from);
    if (at == std::string::npos) {
      ADD_FAILURE() << "not in the edited card: " << row.at;
      continue;
    }
    const std::size_t line_start = text.rfind('\n', at) + 1;
    const int line =
        1 + static_cast<int>(std::count(text.begin(), text.begin() + at, '\n'));
    const int column = 1 + static_cast<int>(at - line_start);
    const CardError e = test::card_error(text);
    EXPECT_EQ(e.file(), "bad.yaml");
    EXPECT_EQ(e.line(), line) << e.what();
    EXPECT_EQ(e.column(), column) << e.what();
    EXPECT_EQ(e.field(), row.field) << e.what();
    EXPECT_EQ(e.value(), row.value) << e.what();
    EXPECT_NE(e.expected().find(row.expected), std::string::npos) << e.what();
  }
}

// Mole fractions of a composed card: each in (0, 1], together 1 (Neumann-Kopp).
class CompositionDomain : public ::testing::Test {
protected:
  void SetUp() override {
    dir_ = std::filesystem::temp_directory_path() /
           ("quantacal_card_domain_" + std::to_string(::getpid()));
    std::filesystem::create_directories(dir_);
    std::ofstream(dir_ / "part.yaml") << kPhases;
  }
  void TearDown() override { std::filesystem::remove_all(dir_); }

  CardError error(const std::string& fractions) const {
    const std::string text = "name: composed\n"
                             "description: illustrative\n"
                             "reference_density: \"2700 kg/m^3\"\n"
                             "valid_range: {from: \"300 K\", to: \"900 K\"}\n"
                             "composition:\n" +
                             fractions +
                             "conductivity: {kind: constant, value: \"200 W/m/K\"}\n"
                             "sources:\n  - {for: [reference_density, "
                             "composition, conductivity], cite: \"illustrative\"}\n";
    return test::card_error(text, (dir_ / "composed.yaml").string());
  }

  std::filesystem::path dir_;
};

TEST_F(CompositionDomain, MoleFractionsInZeroToOneSummingToOne) {
  for (const std::string x : {"0", "-0.5", "1.5", ".nan"}) {
    SCOPED_TRACE(x);
    const CardError e = error("  - {card: part.yaml, mole_fraction: " + x + "}\n");
    EXPECT_EQ(e.line(), 6);
    EXPECT_EQ(e.column(), 38);
    EXPECT_EQ(e.field(), "composition[0].mole_fraction");
    EXPECT_EQ(e.value(), x);
  }
  const CardError sum = error("  - {card: part.yaml, mole_fraction: 0.5}\n"
                              "  - {card: part.yaml, mole_fraction: 0.4}\n");
  EXPECT_EQ(sum.line(), 6);
  EXPECT_EQ(sum.column(), 3);
  EXPECT_EQ(sum.field(), "composition");
  EXPECT_NE(sum.expected().find("summing to 1"), std::string::npos) << sum.what();
}

} // namespace

// Found by fuzz_card (docs/reliability.md, finding 8): terms that are finite and
// positive wherever the loader looks but cannot be tabulated within max_bytes.
TEST(CardDomain, ACardBeyondTabulationIsLocatedAtItsValidRange) {
  const std::string path = std::string(QUANTACAL_SOURCE_DIR) +
                           "/tests/fuzz/corpus/card/fuzz_card-table-exceeds-max-bytes";
  std::ifstream in(path);
  ASSERT_TRUE(in) << path;
  const std::string text((std::istreambuf_iterator<char>(in)),
                         std::istreambuf_iterator<char>());
  const MaterialPtr m = load_card_from_string(text, "card.yaml");
  try {
    (void)m->table();
    FAIL() << "expected the table build to fail";
  } catch (const InputError& e) {
    const std::string what = e.what();
    EXPECT_EQ(e.file(), "card.yaml");
    EXPECT_EQ(e.line(), 19) << what; // `valid_range: {from: ..., to: ...}`
    EXPECT_NE(what.find("valid_range"), std::string::npos) << what;
    EXPECT_NE(what.find("max_bytes"), std::string::npos) << what;
  }
}
