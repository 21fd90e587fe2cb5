// SPDX-License-Identifier: Apache-2.0
// Cards written by the command-line tests (schema: docs/cards.md, lib/cards). All of
// them carry illustrative data for the tests only, and say so in their sources.
#ifndef QUANTACAL_TESTS_CLI_TEST_CARDS_H
#define QUANTACAL_TESTS_CLI_TEST_CARDS_H

#include "cli/cli_support.h"

#include <quantacal/common/exceptions.h>

#include <string>

namespace quantacal::test {

/**
 * A card with the constant specific heat @p c (J/kg/K) over [@p lower, @p upper] K:
 * a tabulated term with the same capacity at both ends (a monotone cubic through two
 * equal values is that constant). @p extra_terms is appended to `heat_capacity`,
 * @p measurements is the text of a `measurements:` block (or "").
 */
inline std::string constant_capacity_card(const std::string& name, double c,
                                          double lower = 10.0, double upper = 1000.0,
                                          const std::string& extra_terms = "",
                                          const std::string& measurements = "") {
  const std::string lo = format_double(lower), hi = format_double(upper);
  return "name: " + name +
         "\n"
         "description: constant specific heat, for command-line tests\n"
         "molar_mass: \"50 g/mol\"\n"
         "reference_density: \"5000 kg/m^3\"\n"
         "valid_range: {from: \"" +
         lo + " K\", to: \"" + hi +
         " K\"}\n"
         "heat_capacity:\n"
         "  - kind: tabulated\n"
         "    columns: [\"K\", \"J/kg/K\"]\n"
         "    rows: [[" +
         lo + ", " + format_double(c) + "], [" + hi + ", " + format_double(c) + "]]\n" +
         extra_terms +
         "conductivity: {kind: constant, value: \"20 W/m/K\"}\n"
         "sources:\n"
         "  - for: [molar_mass, reference_density, heat_capacity, conductivity]\n"
         "    cite: \"illustrative demo data\"\n" +
         measurements;
}

/**
 * Debye lattice plus conduction electrons with the parameters of copper
 * (theta_D = 343 K, gamma = 0.695 mJ/mol/K^2, Kittel, Introduction to Solid State
 * Physics), valid 2 K to 1000 K, constant conductivity: illustrative for the tests
 * (no dilation, no melting), written once per test process.
 */
inline std::string debye_card_path() {
  static TempDir dir;
  static const std::string path =
      dir.write("debye.yaml", "name: debye-test\n"
                              "description: Debye and electronic terms, for "
                              "command-line tests\n"
                              "molar_mass: \"63.546 g/mol\"\n"
                              "reference_density: \"8960 kg/m^3\"\n"
                              "valid_range: {from: \"2 K\", to: \"1000 K\"}\n"
                              "heat_capacity:\n"
                              "  - kind: debye\n"
                              "    theta_D: \"343 K\"\n"
                              "  - kind: electronic\n"
                              "    gamma: \"0.695 mJ/mol/K^2\"\n"
                              "conductivity: {kind: constant, value: \"394 "
                              "W/m/K\"}\n"
                              "sources:\n"
                              "  - for: heat_capacity\n"
                              "    cite: \"Kittel, Introduction to Solid State "
                              "Physics (illustrative use)\"\n"
                              "  - for: [molar_mass, reference_density, "
                              "conductivity]\n"
                              "    cite: \"illustrative demo data\"\n");
  return path;
}

/** A card whose molar mass has a unit of the wrong dimension (line 3). */
inline std::string broken_unit_card() {
  return "name: broken\n"
         "description: wrong unit on purpose\n"
         "molar_mass: \"50 K\"\n"
         "reference_density: \"5000 kg/m^3\"\n"
         "valid_range: {from: \"10 K\", to: \"1000 K\"}\n"
         "heat_capacity:\n"
         "  - kind: debye\n"
         "    theta_D: \"300 K\"\n"
         "conductivity: {kind: constant, value: \"20 W/m/K\"}\n"
         "sources:\n"
         "  - for: [molar_mass, reference_density, heat_capacity, conductivity]\n"
         "    cite: \"illustrative demo data\"\n";
}

} // namespace quantacal::test

#endif
