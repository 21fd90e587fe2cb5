// SPDX-License-Identifier: Apache-2.0
// The `fit` record of a card (docs/fitting.md) as the loader reads it into
// MaterialData::fit, its located errors, and the parameter names it uses
// (card_parameters.h). The cards here are illustrative.
#include "support.h"

#include <quantacal/cards/card.h>
#include <quantacal/cards/card_parameters.h>
#include <quantacal/common/exceptions.h>

#include <gtest/gtest.h>

using namespace quantacal;
using quantacal::test::card_error;
using quantacal::test::replace;

namespace {

// Illustrative card with a fit record; line numbers below refer to this text.
const std::string kFitted = R"(name: fitted test metal
description: illustrative card for fit-record tests
molar_mass: "63.546 g/mol"
reference_density: "8960 kg/m^3"
valid_range: {from: "4 K", to: "300 K"}
heat_capacity:
  - kind: debye
    theta_D: "330 K"
  - {kind: electronic, gamma: "0.7 mJ/mol/K^2"}
conductivity: {kind: constant, value: "400 W/m/K"}
sources:
  - {for: [molar_mass, reference_density, heat_capacity, conductivity], cite: "illustrative"}
fit:
  data: "data.csv"
  n_points: 12
  parameters:
    - {path: "heat_capacity[0].theta_D", value: "330 K", standard_error: "1.5 K", start: "343 K"}
    - {path: "heat_capacity[1].gamma", value: "0.7 mJ/mol/K^2"}
  covariance:   # SI units
    - [2.25, 1.0e-5]
    - [1.0e-5, 4.0e-10]
  tool: "quantacal 0.1.0"
)";

std::string message(const std::string& text) {
  return card_error(text, "fitted.yaml").what();
}

} // namespace

TEST(FitRecord, TheLoaderReadsPathsAndCovariance) {
  const MaterialPtr m = load_card_from_string(kFitted, "fitted.yaml");
  ASSERT_TRUE(m->data().fit);
  EXPECT_EQ(
      m->data().fit->parameters,
      (std::vector<std::string>{"heat_capacity[0].theta_D", "heat_capacity[1].gamma"}));
  EXPECT_EQ(m->data().fit->covariance,
            (std::vector<std::vector<double>>{{2.25, 1.0e-5}, {1.0e-5, 4.0e-10}}));
  // A card without a record has none.
  const std::string plain = kFitted.substr(0, kFitted.find("fit:\n"));
  EXPECT_FALSE(load_card_from_string(plain, "plain.yaml")->data().fit);
}

TEST(FitRecord, MalformedRecordsGiveLocatedErrors) {
  EXPECT_EQ(message(replace(kFitted, "heat_capacity[1].gamma", "heat_capacity[1].gama")),
            "fitted.yaml:17:5: fit.parameters: unknown parameter "
            "'heat_capacity[1].gama' (did you mean 'heat_capacity[1].gamma'?); this "
            "card has: heat_capacity[0].theta_D, heat_capacity[0].modes, "
            "heat_capacity[1].gamma, gamma, modes, theta_D");
  EXPECT_EQ(message(replace(kFitted, "  n_points: 12\n", "  n_point: 12\n"))
                .rfind("fitted.yaml:15:3: fit.n_point: unknown key (did you mean "
                       "'n_points'?); expected one of: data, data_sha256, ",
                       0),
            0u);
  EXPECT_EQ(message(replace(kFitted, "{path: \"heat_capacity[1].gamma\", ",
                            "{paht: \"heat_capacity[1].gamma\", ")),
            "fitted.yaml:18:8: fit.parameters[1].paht: unknown key (did you mean "
            "'path'?); expected one of: path, value, standard_error, start");
  const std::string parameter_lines =
      kFitted.substr(kFitted.find("    - {path"),
                     kFitted.find("  covariance") - kFitted.find("    - {path"));
  EXPECT_EQ(message(replace(replace(kFitted, parameter_lines, ""), "  parameters:\n",
                            "  parameters: []\n")),
            "fitted.yaml:14:3: fit.parameters: expected a list of fitted parameters");
  EXPECT_EQ(message(replace(kFitted, "    - [1.0e-5, 4.0e-10]\n", "")),
            "fitted.yaml:14:3: fit.covariance: expected a 2 x 2 matrix");
  EXPECT_EQ(message(replace(kFitted, "[1.0e-5, 4.0e-10]", "[1.0e-5]")),
            "fitted.yaml:21:7: fit.covariance[1]: expected a row of 2 numbers");
  EXPECT_EQ(message(replace(kFitted, "[2.25, 1.0e-5]", "[2.25, abc]")),
            "fitted.yaml:20:14: fit.covariance[0][1] = \"abc\": expected a number");
  EXPECT_EQ(message(replace(kFitted, "[2.25, 1.0e-5]", "[-2.25, 1.0e-5]")),
            "fitted.yaml:20:8: fit.covariance[0][0] = \"-2.25\": expected a finite "
            "number (>= 0 on the diagonal)");
  EXPECT_EQ(message(replace(kFitted, "[2.25, 1.0e-5]", "[2.25, 2.0e-5]")),
            "fitted.yaml:20:5: fit.covariance: expected a symmetric matrix");
  EXPECT_EQ(message(kFitted.substr(0, kFitted.find("fit:\n")) + "fit: 3\n"),
            "fitted.yaml:13:6: fit = \"3\": expected a map of keys and values");
}

TEST(CardParameters, NamesAndTheirErrors) {
  const MaterialPtr m = load_card_from_string(kFitted, "fitted.yaml");
  const std::vector<CardParameter> all = card_parameters(*m);
  ASSERT_EQ(all.size(), 3u);
  EXPECT_EQ(all[0].path, "heat_capacity[0].theta_D");
  EXPECT_EQ(all[0].unit, "K");
  EXPECT_DOUBLE_EQ(all[0].value, 330.0);
  EXPECT_EQ(all[1].path, "heat_capacity[0].modes");
  EXPECT_EQ(all[2].path, "heat_capacity[1].gamma");

  const auto resolved =
      resolve_card_parameters(*m, {"gamma", "heat_capacity[0].theta_D"}, "");
  ASSERT_EQ(resolved.size(), 2u);
  EXPECT_EQ(resolved[0].path, "heat_capacity[1].gamma");
  EXPECT_EQ(resolved[0].index, 1u);
  EXPECT_EQ(resolved[1].name, "theta_D");

  const auto error = [&](const std::vector<std::string>& names) -> std::string {
    try {
      (void)resolve_card_parameters(*m, names, "--free");
    } catch (const InputError& e) {
      EXPECT_TRUE(e.file().empty());
      return e.what();
    }
    return "no error";
  };
  EXPECT_EQ(error({"theta_D", "heat_capacity[0].theta_D"}),
            "--free: parameter 'heat_capacity[0].theta_D' given twice (as "
            "heat_capacity[0].theta_D)");
  EXPECT_EQ(error({}), "--free: expected at least one parameter name");
  EXPECT_EQ(error({"conductivity.rrr"})
                .rfind("--free: unknown parameter 'conductivity.rrr' (the card's "
                       "conductivity is of kind 'constant', which has no parameters to "
                       "fit; use kind 'metal'); this card has: ",
                       0),
            0u);
  // Two Debye terms: a bare theta_D is ambiguous.
  const std::string plain = kFitted.substr(0, kFitted.find("fit:\n"));
  const MaterialPtr two = load_card_from_string(
      replace(plain, "  - {kind: electronic",
              "  - {kind: debye, theta_D: \"100 K\", modes: 0.1}\n  - {kind: electronic"),
      "two.yaml");
  try {
    (void)resolve_card_parameters(*two, {"theta_D"}, "--free");
    ADD_FAILURE() << "an ambiguous name was resolved";
  } catch (const InputError& e) {
    EXPECT_EQ(std::string(e.what()),
              "--free: 'theta_D' is ambiguous in this card; name one of: "
              "heat_capacity[0].theta_D, heat_capacity[1].theta_D");
  }
}
