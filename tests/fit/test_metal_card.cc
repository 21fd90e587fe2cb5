// SPDX-License-Identifier: Apache-2.0
// `conductivity: kind: metal` in cards, and the bundled companion cards that use it.
#include "fit/fit_support.h"

#include <quantacal/cards/card.h>
#include <quantacal/common/exceptions.h>
#include <quantacal/models/metal_conductivity.h>

#include <gtest/gtest.h>

#include <string>

using namespace quantacal;

namespace {

std::string card_with(const std::string& conductivity) {
  return "name: metal test\n"
         "description: a card for the metal conductivity kind\n"
         "molar_mass: \"63.546 g/mol\"\n"
         "reference_density: \"8935 kg/m^3\"\n"
         "valid_range: {from: \"4 K\", to: \"300 K\"}\n"
         "heat_capacity:\n"
         "  - kind: debye\n"
         "    theta_D: \"343 K\"\n"
         "conductivity:\n" +
         conductivity +
         "sources:\n"
         "  - for: [molar_mass, reference_density, heat_capacity, conductivity]\n"
         "    cite: \"illustrative\"\n";
}

const std::string copper_block = "  kind: metal\n"
                                 "  rrr: 100\n"
                                 "  theta_R: \"343 K\"\n"
                                 "  reference_resistivity: \"1.68e-8 Ohm m\"\n"
                                 "  reference_temperature: \"293 K\"\n"
                                 "  wilson_ratio: 0.1882\n";

} // namespace

TEST(MetalCard, LoadsTheSameModelAsTheLibrary) {
  const MaterialPtr m = load_card_from_string(card_with(copper_block), "metal.yaml");
  EXPECT_EQ(m->conductivity_model().kind(), "metal");
  const MetalConductivity direct(test::copper_conductivity_inputs(100, 0.1882));
  for (double t : {4.0, 20.0, 77.0, 300.0}) {
    // the card's model; conductivity() reads the cached table, to its tolerance
    EXPECT_NEAR(m->conductivity_exact(t).value / direct.evaluate(t).value, 1.0, 1e-12)
        << t;
    EXPECT_NEAR(m->conductivity(t).value / direct.evaluate(t).value, 1.0,
                m->data().table_options.tolerance)
        << t;
  }
}

TEST(MetalCard, ErrorsAreLocated) {
  const auto expect_error = [](const std::string& block, const std::string& text) {
    try {
      load_card_from_string(card_with(block), "metal.yaml");
      ADD_FAILURE() << "accepted:\n" << block;
    } catch (const CardError& e) {
      EXPECT_NE(std::string(e.what()).find(text), std::string::npos) << e.what();
    }
  };
  expect_error("  kind: metal\n  rrr: 100\n  reference_resistivity: \"1.68e-8 Ohm m\"\n",
               "metal.yaml:10:3: conductivity.theta_R: missing field");
  expect_error(
      "  kind: metal\n  rrr: 100\n  rho_0: \"1e-10 Ohm m\"\n  theta_R: \"343 K\"\n"
      "  reference_resistivity: \"1.68e-8 Ohm m\"\n",
      "give exactly one of `rrr` and `rho_0`");
  expect_error("  kind: metal\n  rrr: 100\n  theta_R: \"343 K\"\n"
               "  reference_resistivity: \"1.68e-8 K\"\n",
               "metal.yaml:13:26: conductivity.reference_resistivity = \"1.68e-8 K\"");
  expect_error("  kind: metal\n  rrr: 0.5\n  theta_R: \"343 K\"\n"
               "  reference_resistivity: \"1.68e-8 Ohm m\"\n",
               "metal.yaml:11:8: conductivity.rrr = \"0.5\": expected a ratio > 1");
  expect_error("  kind: metall\n", "did you mean 'metal'");
}

TEST(MetalCard, BundledCopperCompanionCard) {
  const MaterialPtr m =
      load_card(std::string(QUANTACAL_SOURCE_DIR) + "/materials/copper_rrr.yaml");
  EXPECT_EQ(m->conductivity_model().kind(), "metal");
  const struct {
    double t, published, tolerance;
  } rows[] = {
      {4, 642, 0.30},   // NIST OFHC copper RRR 100 (Marquardt, Le, Radebaugh 2000),
                        // published values
      {20, 2423, 0.30}, // same
      {77, 547, 0.30},  // same
      {300, 396, 0.30}, // same
      {273, test::nist_copper_conductivity(273, 100), 0.05}, // same correlation, computed
  };
  for (const auto& r : rows)
    EXPECT_NEAR(m->conductivity(r.t).value / r.published, 1.0, r.tolerance) << r.t;
  // The heat capacity is copper.yaml's (the companion card composes it).
  const MaterialPtr cu =
      load_card(std::string(QUANTACAL_SOURCE_DIR) + "/materials/copper.yaml");
  EXPECT_NEAR(m->thermal_exact(77.0).capacity / cu->thermal_exact(77.0).capacity, 1.0,
              1e-12);
}
