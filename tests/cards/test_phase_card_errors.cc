// SPDX-License-Identifier: Apache-2.0
// Cards with `phases`: what they read, and each bad phase list as a located error
// (file, 1-based line and column, field path, value, what was expected). The
// cards here are illustrative (values only need to be physical or deliberately
// not).
#include "support.h"

#include <quantacal/cards/card.h>
#include <quantacal/common/exceptions.h>

#include <gtest/gtest.h>

using namespace quantacal;
using quantacal::test::card_error;
using quantacal::test::replace;

namespace {

// Illustrative card of a solid, a second solid and a liquid; line numbers below
// refer to this text.
const std::string kPhases = R"(name: test metal
description: illustrative card with phases
molar_mass: "50 g/mol"
reference_density: "5000 kg/m^3"
valid_range: {from: "10 K", to: "900 K"}
phases:
  - name: low
    heat_capacity:
      - {kind: debye, theta_D: "300 K"}
    conductivity: {kind: constant, value: "50 W/m/K"}
  - name: high
    from: {temperature: "400 K", latent_heat: "1 kJ/mol", width: "10 K"}
    heat_capacity:
      - {kind: einstein, theta_E: "250 K"}
    density: "4900 kg/m^3"
  - name: melt
    liquid: true
    from: {temperature: "700 K", latent_heat: "10 kJ/mol", width: "8 K"}
    heat_capacity:
      - {kind: electronic, gamma: "40 mJ/mol/K^2"}
    conductivity: {kind: constant, value: "20 W/m/K"}
    density: "4500 kg/m^3"
sources:
  - {for: [molar_mass, reference_density, phases], cite: "illustrative"}
)";

} // namespace

TEST(PhaseCardErrors, GoodCardReadsItsPhases) {
  const MaterialPtr m = load_card_from_string(kPhases, "phases.yaml");
  ASSERT_EQ(m->data().phases.size(), 3u);
  EXPECT_EQ(m->data().phases[1].name, "high");
  EXPECT_FALSE(m->data().phases[1].liquid);
  EXPECT_TRUE(m->data().phases[2].liquid);
  // density: the first phase takes the reference density, a phase states its own
  EXPECT_EQ(m->density(100.0), 5000.0);
  EXPECT_EQ(m->density(500.0), 4900.0);
  EXPECT_EQ(m->density(800.0), 4500.0);
  // conductivity: "high" states none and keeps the one before
  EXPECT_EQ(m->conductivity(500.0).value, 50.0);
  EXPECT_EQ(m->conductivity(800.0).value, 20.0);
  // The melting heat, per mole: 10 kJ/mol over the 8 K join, on top of the
  // phases' own capacities (electronic: gamma T; Einstein below 3R), so the energy
  // step across 690-710 K is 10 kJ/mol plus at most 20 K x (3R + gamma T).
  const double step =
      m->thermal(710.0, Basis::mole).energy - m->thermal(690.0, Basis::mole).energy;
  EXPECT_GT(step, 10000.0);
  EXPECT_LT(step, 10000.0 + 20.0 * (3 * 8.3145 + 0.04 * 710.0));
}

TEST(PhaseCardErrors, UnorderedPhases) {
  const CardError e =
      card_error(replace(kPhases, "temperature: \"700 K\"", "temperature: \"350 K\""));
  EXPECT_EQ(e.field(), "phases[2].from.temperature") << e.what();
  EXPECT_EQ(e.line(), 18);
  EXPECT_EQ(e.value(), "350 K");
  EXPECT_EQ(e.expected(), "expected a temperature above the previous transition (400 K): "
                          "phases are listed from cold to hot");
}

TEST(PhaseCardErrors, OverlappingJoins) {
  const CardError e =
      card_error(replace(kPhases, "temperature: \"700 K\"", "temperature: \"408 K\""));
  EXPECT_EQ(e.field(), "phases[2].from.width") << e.what();
  EXPECT_EQ(e.line(), 18);
  EXPECT_EQ(e.value(), "8 K");
  EXPECT_EQ(e.expected(), "expected joins that do not overlap: this one starts at 404 K, "
                          "before the previous one ends at 405 K");
}

TEST(PhaseCardErrors, TransitionOutsideTheValidRange) {
  const CardError e =
      card_error(replace(kPhases, "temperature: \"700 K\"", "temperature: \"898 K\""));
  EXPECT_EQ(e.field(), "phases[2].from.temperature") << e.what();
  EXPECT_EQ(e.line(), 18);
  EXPECT_EQ(e.value(), "898 K");
  EXPECT_EQ(e.expected(), "expected a transition whose join (894 K to 902 K) lies inside "
                          "the valid range (10 K to 900 K)");
}

TEST(PhaseCardErrors, LiquidWithoutLatentHeat) {
  const CardError e = card_error(replace(kPhases, "latent_heat: \"10 kJ/mol\", ", ""));
  EXPECT_EQ(e.field(), "phases[2].from.latent_heat") << e.what();
  EXPECT_EQ(e.line(), 18);
  EXPECT_EQ(e.expected(),
            "expected the latent heat of melting (> 0): a liquid follows a solid");
  const CardError zero = card_error(
      replace(kPhases, "latent_heat: \"10 kJ/mol\"", "latent_heat: \"0 J/mol\""));
  EXPECT_EQ(zero.field(), "phases[2].from.latent_heat") << zero.what();
  EXPECT_EQ(zero.value(), "0 J/mol");
}

TEST(PhaseCardErrors, FirstPhaseWithFromAndLaterPhaseWithout) {
  const CardError first = card_error(
      replace(kPhases, "  - name: low\n",
              "  - name: low\n    from: {temperature: \"5 K\", width: \"1 K\"}\n"));
  EXPECT_EQ(first.field(), "phases[0].from") << first.what();
  EXPECT_EQ(first.line(), 8);
  const CardError later = card_error(replace(
      kPhases,
      "    from: {temperature: \"400 K\", latent_heat: \"1 kJ/mol\", width: \"10 K\"}\n",
      ""));
  EXPECT_EQ(later.field(), "phases[1].from") << later.what();
  EXPECT_EQ(later.expected(), "missing field");
}

TEST(PhaseCardErrors, ASolidAboveTheMelt) {
  const std::string text = replace(kPhases, "sources:",
                                   "  - name: solid again\n"
                                   "    from: {temperature: \"800 K\", width: \"8 K\"}\n"
                                   "    heat_capacity:\n"
                                   "      - {kind: debye, theta_D: \"300 K\"}\n"
                                   "sources:");
  const CardError e = card_error(text);
  EXPECT_EQ(e.field(), "phases[3]") << e.what();
  EXPECT_EQ(e.expected(),
            "expected a liquid after a liquid (a solid phase above the melt)");
}

TEST(PhaseCardErrors, PhasesWithHeatCapacityOrDilationAtTheTop) {
  const CardError both = card_error(
      replace(kPhases, "phases:\n",
              "heat_capacity:\n  - {kind: debye, theta_D: \"300 K\"}\nphases:\n"));
  EXPECT_EQ(both.field(), "phases") << both.what();
  EXPECT_EQ(both.expected(),
            "give one of `heat_capacity`, `phases` or `composition`, not several");
  const CardError dil = card_error(replace(
      kPhases, "phases:\n", "dilation: {nernst_lindemann: \"1e-6 mol/J\"}\nphases:\n"));
  EXPECT_EQ(dil.field(), "dilation") << dil.what();
}

TEST(PhaseCardErrors, ConductivityBothAtTheTopAndInAPhaseOrNowhere) {
  const CardError both =
      card_error(replace(kPhases, "sources:",
                         "conductivity: {kind: constant, value: \"1 W/m/K\"}\nsources:"));
  EXPECT_EQ(both.field(), "phases[0].conductivity") << both.what();
  const CardError none = card_error(
      replace(kPhases, "    conductivity: {kind: constant, value: \"50 W/m/K\"}\n", ""));
  EXPECT_EQ(none.field(), "phases[0].conductivity") << none.what();
  EXPECT_EQ(none.line(), 7);
}

TEST(PhaseCardErrors, APhaseModelUndefinedOverItsJoin) {
  // A Gibbs series starting at 398 K cannot serve a phase whose join starts at 395 K.
  const CardError e = card_error(
      replace(kPhases, "      - {kind: einstein, theta_E: \"250 K\"}\n",
              "      - kind: gibbs_series\n"
              "        pieces: [{from: \"398 K\", to: \"2000 K\", c: -25}]\n"));
  EXPECT_EQ(e.field(), "phases[1].heat_capacity") << e.what();
  EXPECT_EQ(
      e.expected(),
      "expected terms defined from 395 K to 704 K (the phase with its joins, inside "
      "the valid range), but they are defined from 398 K to 2000 K");
}

TEST(PhaseCardErrors, GibbsSeriesPieces) {
  const std::string series = "      - kind: gibbs_series\n"
                             "        pieces:\n"
                             "          - {from: \"300 K\", to: \"600 K\", c: -25}\n"
                             "          - {to: \"%TO\", c: -30}\n";
  std::string bad = series;
  bad.replace(bad.find("%TO"), 3, "500 K");
  const CardError e =
      card_error(replace(kPhases, "      - {kind: einstein, theta_E: \"250 K\"}\n", bad));
  EXPECT_EQ(e.field(), "phases[1].heat_capacity[0].pieces[1].to") << e.what();
  EXPECT_EQ(e.value(), "500 K");
  EXPECT_EQ(e.expected(), "expected the end of the piece above its start (600 K)");
  const CardError key =
      card_error(replace(kPhases, "      - {kind: einstein, theta_E: \"250 K\"}\n",
                         "      - kind: gibbs_series\n        pieces: [{from: \"300 K\", "
                         "to: \"2000 K\", k: 1}]\n"));
  EXPECT_EQ(key.field(), "phases[1].heat_capacity[0].pieces[0].k") << key.what();
}
