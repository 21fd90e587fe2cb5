// SPDX-License-Identifier: Apache-2.0
// Writing cards (card_writer.h): edits keep everything but what they change, the
// written card loads with the new values, and a card is saved only if it loads.
// The cards here are illustrative.
#include "cli/cli_support.h"
#include "support.h"

#include <quantacal/cards/card.h>
#include <quantacal/cards/card_parameters.h>
#include <quantacal/cards/card_writer.h>
#include <quantacal/common/exceptions.h>

#include <gtest/gtest.h>

#include <filesystem>
#include <ios>

using namespace quantacal;
using quantacal::test::replace;

namespace {

const std::string kCard =
    R"(# Illustrative card for the writer tests: comments and layout survive.
name: writer test   # a comment after a value
description: illustrative card for the card writer tests
molar_mass: "63.546 g/mol"
reference_density: "8960 kg/m^3"
valid_range: {from: "4 K", to: "300 K"}
heat_capacity:
  - kind: debye
    theta_D: "343 K"   # a comment after a parameter
  - {kind: electronic, gamma: "0.695 mJ/mol/K^2"}
conductivity:
  kind: constant
  value: "400 W/m/K"
sources:
  - {for: [molar_mass, reference_density, heat_capacity, conductivity], cite: "illustrative"}
)";

/** The parameter @p name of @p material (resolved as `quantacal fit --free` does). */
CardParameter parameter(const MaterialPtr& material, const std::string& name) {
  return resolve_card_parameters(*material, {name}, "").front();
}

double value_of(const MaterialPtr& material, const std::string& name) {
  return parameter(material, name).value;
}

} // namespace

TEST(CardWriter, ReplacesValuesInPlaceAndKeepsEverythingElse) {
  const MaterialPtr start = load_card_from_string(kCard, "start.yaml");
  CardChanges changes;
  changes.values = {{parameter(start, "theta_D"), 330.0},
                    {parameter(start, "gamma"), 0.7e-3}};
  const std::string text = edit_card(kCard, "start.yaml", changes);
  // Only the two values differ, written as quoted quantities in SI units (gamma in
  // mJ/mol/K^2, as cards write it).
  EXPECT_EQ(text, replace(replace(kCard, "\"343 K\"", "\"330 K\""),
                          "\"0.695 mJ/mol/K^2\"", "\"0.7 mJ/mol/K^2\""));
  const MaterialPtr edited = load_card_from_string(text, "edited.yaml");
  EXPECT_DOUBLE_EQ(value_of(edited, "theta_D"), 330.0);
  EXPECT_DOUBLE_EQ(value_of(edited, "gamma"), 0.7e-3);
}

TEST(CardWriter, ADefaultedParameterBecomesAKeyOfItsBlock) {
  const MaterialPtr start = load_card_from_string(kCard, "start.yaml");
  EXPECT_DOUBLE_EQ(value_of(start, "modes"), 3.0); // the Debye term's default
  CardChanges changes;
  changes.values = {{parameter(start, "modes"), 2.9}};
  const std::string text = edit_card(kCard, "start.yaml", changes);
  EXPECT_EQ(text,
            replace(kCard, "  - kind: debye\n", "  - kind: debye\n    modes: 2.9\n"));
  EXPECT_DOUBLE_EQ(value_of(load_card_from_string(text, "edited.yaml"), "modes"), 2.9);

  // A flow-style block has no line to add the key on: a located error.
  const std::string flow = replace(kCard, "  - kind: debye\n    theta_D: \"343 K\"",
                                   "  - {kind: debye, theta_D: \"343 K\"}");
  const MaterialPtr flow_start = load_card_from_string(flow, "flow.yaml");
  changes.values = {{parameter(flow_start, "modes"), 2.9}};
  try {
    (void)edit_card(flow, "flow.yaml", changes);
    FAIL() << "a defaulted parameter of a flow-style block was written";
  } catch (const InputError& e) {
    EXPECT_EQ(std::string(e.what()),
              "flow.yaml:8:5: heat_capacity[0].modes: the parameter is not written in "
              "this flow-style block; write it out in the start card");
  }
}

TEST(CardWriter, SourcesComeFirstAndTheFitRecordIsReplaced) {
  const MaterialPtr start = load_card_from_string(kCard, "start.yaml");
  CardChanges changes;
  changes.values = {{parameter(start, "theta_D"), 330.0}};
  changes.sources = {{"heat_capacity[0].theta_D", "fitted here to illustrative data"}};
  FitRecordEntry record;
  record.data_file = "data.csv";
  record.data_sha256 = std::string(64, '0');
  record.from = 4.0;
  record.to = 300.0;
  record.n_points = 12;
  record.parameters = {{"heat_capacity[0].theta_D", "K", 330.0, 1.5, 343.0}};
  record.covariance = {{2.25}};
  changes.fit = record;
  const std::string once = edit_card(kCard, "start.yaml", changes);
  EXPECT_NE(once.find("sources:\n  - for: heat_capacity[0].theta_D\n    cite: \"fitted "
                      "here to illustrative data\"\n  - {for: [molar_mass"),
            std::string::npos)
      << once;
  const MaterialPtr edited = load_card_from_string(once, "edited.yaml");
  ASSERT_GE(edited->data().sources.size(), 2u);
  EXPECT_EQ(edited->data().sources[0].citation, "fitted here to illustrative data");
  ASSERT_TRUE(edited->data().fit);
  EXPECT_EQ(edited->data().fit->parameters,
            std::vector<std::string>{"heat_capacity[0].theta_D"});
  EXPECT_EQ(edited->data().fit->covariance, (std::vector<std::vector<double>>{{2.25}}));

  // Editing the edited card replaces its record instead of adding a second one.
  changes.values = {{parameter(edited, "theta_D"), 331.0}};
  changes.sources.clear();
  changes.fit->covariance = {{0.1 + 0.2}}; // not a short decimal: written round-trip
  const std::string twice = edit_card(once, "edited.yaml", changes);
  EXPECT_EQ(twice.find("\nfit:\n"), twice.rfind("\nfit:\n"));
  const MaterialPtr again = load_card_from_string(twice, "again.yaml");
  EXPECT_EQ(again->data().fit->covariance[0][0], 0.1 + 0.2);
  EXPECT_DOUBLE_EQ(value_of(again, "theta_D"), 331.0);
}

TEST(CardWriter, CompositionPathsStillFindTheirCards) {
  test::TempDir dir;
  dir.write("part.yaml", kCard);
  const std::string composed_text = R"(name: composed
description: illustrative composed card
composition:
  - {card: part.yaml, mole_fraction: 1}
reference_density: "8960 kg/m^3"
valid_range: {from: "4 K", to: "300 K"}
conductivity: {kind: constant, value: "400 W/m/K"}
sources:
  - {for: [composition, reference_density, conductivity], cite: "illustrative"}
)";
  const std::string composed = dir.write("composed.yaml", composed_text);
  std::filesystem::create_directories(dir.path() / "out" / "sub");
  const std::string output = (dir.path() / "out" / "sub" / "composed.yaml").string();
  const std::string text = edit_card(composed_text, composed, CardChanges{}, output);
  EXPECT_EQ(text, replace(composed_text, "card: part.yaml", "card: \"../../part.yaml\""));
  save_card(output, text);
  EXPECT_EQ(load_card(output)->molar_mass(), load_card(composed)->molar_mass());
  // Written beside the original, the paths do not change.
  EXPECT_EQ(edit_card(composed_text, composed, CardChanges{}, composed), composed_text);
}

TEST(CardWriter, SavesOnlyACardThatLoads) {
  test::TempDir dir;
  const std::string path = (dir.path() / "card.yaml").string();
  const std::string broken = replace(kCard, "\"343 K\"", "\"-343 K\"");
  try {
    save_card(path, broken);
    FAIL() << "a card that does not load was saved";
  } catch (const InputError& e) {
    EXPECT_EQ(e.file(), path);
    EXPECT_EQ(e.line(), 9);
    EXPECT_EQ(e.field(), "heat_capacity[0].theta_D");
  }
  EXPECT_FALSE(std::filesystem::exists(path));
  EXPECT_FALSE(std::filesystem::exists(path + ".tmp"));

  const std::string nowhere = (dir.path() / "missing" / "card.yaml").string();
  EXPECT_THROW(save_card(nowhere, kCard), std::ios_base::failure);
  EXPECT_FALSE(std::filesystem::exists(nowhere + ".tmp"));

  save_card(path, kCard);
  EXPECT_EQ(read_card_text(path), kCard);
  EXPECT_FALSE(std::filesystem::exists(path + ".tmp"));
}

TEST(CardWriter, ErrorsAreLocated) {
  CardChanges changes;
  try {
    (void)edit_card("name: [unclosed\n", "bad.yaml", changes);
    FAIL() << "a YAML syntax error was accepted";
  } catch (const InputError& e) {
    EXPECT_EQ(e.file(), "bad.yaml");
    EXPECT_GT(e.line(), 0);
    EXPECT_NE(std::string(e.what()).find("YAML syntax error"), std::string::npos);
  }
  try {
    (void)read_card_text("/nonexistent/card.yaml");
    FAIL() << "a missing file was read";
  } catch (const InputError& e) {
    EXPECT_EQ(std::string(e.what()), "/nonexistent/card.yaml: cannot open the card file");
  }
  // A parameter of a block the text does not have.
  const MaterialPtr start = load_card_from_string(kCard, "start.yaml");
  CardParameter missing = parameter(start, "theta_D");
  missing.index = 7;
  missing.path = "heat_capacity[7].theta_D";
  changes.values = {{missing, 330.0}};
  EXPECT_THROW((void)edit_card(kCard, "start.yaml", changes), InputError);
}

TEST(CardWriter, QuantityText) {
  EXPECT_EQ(card_quantity_text(343.0, "K"), "343 K");
  EXPECT_EQ(card_quantity_text(0.695e-3, "J/mol/K^2"), "0.695 mJ/mol/K^2");
  EXPECT_EQ(card_quantity_text(2.5, "1"), "2.5");
  EXPECT_EQ(card_quantity_text(1.0 / 3.0, "K", 3), "0.333 K");
}
