// SPDX-License-Identifier: Apache-2.0
/**
 * @file output_units.h
 * @brief The `--unit` option of `table` and `export`: print quantities in units
 *        the user names, e.g. `--unit cp=J/g/K,T=degC,k=W/cm/K,H=kJ/kg`.
 *
 * Why it exists: the commands compute in SI, but their readers often want
 * J/g/K, degC or W/cm/K. The unit strings are read by the card parser
 * (parse_unit, docs/cards.md "Units"), so the command line accepts exactly the
 * units a card accepts, and each unit is checked against the dimension of the
 * quantity it is given for before anything is computed or written.
 */
#ifndef QUANTACAL_CLI_OUTPUT_UNITS_H
#define QUANTACAL_CLI_OUTPUT_UNITS_H

#include <quantacal/cards/units.h>

#include <map>
#include <optional>
#include <string>
#include <utility>
#include <vector>

namespace quantacal::cli {

/** One printed quantity of a command, as `--unit` knows it. */
struct OutputQuantity {
  std::string name;         ///< its name on --unit and in headers, e.g. "cp"
  Dimension dimension;      ///< the dimension of its SI value
  std::string default_unit; ///< the unit printed without --unit, e.g. "J/kg/K"
  std::string what;         ///< for messages, e.g. "the specific heat per mass"
  std::string example;      ///< units that fit, e.g. "J/kg/K, J/g/K, kJ/kg/K"
  std::vector<std::string> aliases = {}; ///< other accepted names, e.g. {"H"} for "e"
  /// Dimensions that fit another setting, with a hint, e.g. J/mol/K -> "--basis mole".
  std::vector<std::pair<Dimension, std::string>> hints = {};
};

/** The unit a quantity is printed in: printed = SI / scale - offset. */
struct OutputUnit {
  std::string text;  ///< normalised, e.g. "J/g/K", "degC", "kg/m^3"
  std::string token; ///< for CSV headers, e.g. "J_per_g_K", "degC", "kg_per_m3"
  double scale = 1.0;
  double offset = 0.0; ///< 273.15 (degC) or 459.67 (degF) for an absolute temperature
  std::vector<std::pair<std::string, int>> factors; ///< symbols with their powers

  /** A value (SI) in this unit; temperatures in degC/degF are shifted. */
  double value(double si) const { return si / scale - offset; }
  /** A difference or an uncertainty (SI) in this unit: never shifted. */
  double difference(double si) const { return si / scale; }
  /** True for the SI unit the command prints by default (scale 1, no offset). */
  bool is_identity() const { return scale == 1.0 && offset == 0.0; }
};

/**
 * Reads the `--unit` option: a comma-separated list of QUANTITY=UNIT items.
 * @param command "table" or "export" (for messages)
 * @param option the raw option value, or nullopt when --unit was not given
 * @param quantities the quantities the command prints
 * @return the unit of every quantity (the default for those not named)
 * @throws UsageError naming the option, the item (number and column), the unit
 *         and the expected dimension; "did you mean" for an unknown quantity
 */
std::map<std::string, OutputUnit>
parse_output_units(const std::string& command, const std::optional<std::string>& option,
                   const std::vector<OutputQuantity>& quantities);

/**
 * The quantities of `table` and `export` for a basis ("mass", "mole", "volume").
 * @param energy_name "e" (table) or "H" (export)
 * @param with_density true for export (rho)
 */
std::vector<OutputQuantity> thermal_quantities(const std::string& basis,
                                               const std::string& energy_name,
                                               bool with_density);

/** The help text of --unit shared by `table` and `export`. */
std::string unit_option_help();

} // namespace quantacal::cli

#endif
