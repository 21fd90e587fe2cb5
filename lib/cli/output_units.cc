// SPDX-License-Identifier: Apache-2.0
// `--unit QUANTITY=UNIT,...` of `table` and `export` (output_units.h).
#include "output_units.h"

#include "options.h"

#include <quantacal/common/text.h>

#include <algorithm>
#include <cstdlib>
#include <stdexcept>
#include <tuple>

namespace quantacal::cli {
namespace {

/// "J", "m^3" in text; "J", "m3" in a header token.
std::string power_text(const std::string& symbol, int power, bool for_header) {
  if (power == 1)
    return symbol;
  return symbol + (for_header ? "" : "^") + std::to_string(power);
}

/// The normalised text ("J/g/K") and header token ("J_per_g_K") of a unit from its
/// factors: the symbols with positive powers, then each one with a negative power.
std::pair<std::string, std::string> names_of(const Unit& unit) {
  std::string text, token_up, token_down;
  for (const auto& [symbol, power] : unit.factors)
    if (power > 0) {
      text += (text.empty() ? "" : "*") + power_text(symbol, power, false);
      token_up += (token_up.empty() ? "" : "_") + power_text(symbol, power, true);
    }
  if (text.empty()) {
    text = "1";
    token_up = "1";
  }
  for (const auto& [symbol, power] : unit.factors)
    if (power < 0) {
      text += "/" + power_text(symbol, -power, false);
      token_down += (token_down.empty() ? "" : "_") + power_text(symbol, -power, true);
    }
  return {text, token_down.empty() ? token_up : token_up + "_per_" + token_down};
}

OutputUnit output_unit(const Unit& unit) {
  OutputUnit out;
  std::tie(out.text, out.token) = names_of(unit);
  out.scale = unit.scale;
  out.offset = unit.offset;
  out.factors = unit.factors;
  return out;
}

} // namespace

std::vector<OutputQuantity> thermal_quantities(const std::string& basis,
                                               const std::string& energy_name,
                                               bool with_density) {
  const std::string other_energy_name = energy_name == "e" ? "H" : "e";
  std::vector<OutputQuantity> q;
  q.push_back(
      {"T", dimension::temperature(), "K", "the temperature", "K, degC, degF, mK"});
  if (basis == "mole") {
    q.push_back({"cp", dimension::molar_capacity(), "J/mol/K",
                 "the molar heat capacity (--basis mole)",
                 "J/mol/K, mJ/mol/K, cal/mol/K"});
    q.push_back({energy_name,
                 dimension::molar_energy(),
                 "J/mol",
                 "the stored energy per mole (--basis mole)",
                 "J/mol, kJ/mol, kcal/mol",
                 {other_energy_name}});
  } else if (basis == "volume") {
    q.push_back({"cp", parse_unit("J/m^3/K").dimension, "J/m^3/K",
                 "the heat capacity per volume (--basis volume)",
                 "J/m^3/K, MJ/m^3/K, J/cm^3/K"});
    q.push_back({energy_name,
                 parse_unit("J/m^3").dimension,
                 "J/m^3",
                 "the stored energy per volume (--basis volume)",
                 "J/m^3, MJ/m^3, J/cm^3",
                 {other_energy_name}});
  } else {
    q.push_back({"cp", dimension::specific_capacity(), "J/kg/K",
                 "the specific heat per mass (--basis mass)",
                 "J/kg/K, J/g/K, kJ/kg/K, J/g/degC, cal/g/K"});
    q.push_back({energy_name,
                 dimension::specific_energy(),
                 "J/kg",
                 "the stored energy per mass (--basis mass)",
                 "J/kg, kJ/kg, J/g, cal/g",
                 {other_energy_name}});
  }
  q.push_back({"k", dimension::conductivity(), "W/m/K", "the thermal conductivity",
               "W/m/K, W/cm/K, mW/m/K, W/m/degC"});
  // A cp or energy unit of another basis is a different dimension: say which
  // --basis it needs.
  const std::vector<std::pair<std::string, std::pair<Dimension, Dimension>>> bases = {
      {"mass", {dimension::specific_capacity(), dimension::specific_energy()}},
      {"mole", {dimension::molar_capacity(), dimension::molar_energy()}},
      {"volume", {parse_unit("J/m^3/K").dimension, parse_unit("J/m^3").dimension}}};
  for (const auto& [name, dims] : bases)
    if (name != basis) {
      q[1].hints.emplace_back(dims.first, "--basis " + name);
      q[2].hints.emplace_back(dims.second, "--basis " + name);
    }
  if (with_density)
    q.push_back({"rho",
                 dimension::density(),
                 "kg/m^3",
                 "the density",
                 "kg/m^3, g/cm^3",
                 {"density"}});
  return q;
}

std::map<std::string, OutputUnit>
parse_output_units(const std::string& command, const std::optional<std::string>& option,
                   const std::vector<OutputQuantity>& quantities) {
  std::map<std::string, OutputUnit> units;
  for (const OutputQuantity& q : quantities)
    units[q.name] = output_unit(parse_unit(q.default_unit));
  if (!option)
    return units;

  const std::string& raw = *option;
  std::vector<std::string> names;
  for (const OutputQuantity& q : quantities) {
    names.push_back(q.name);
    names.insert(names.end(), q.aliases.begin(), q.aliases.end());
  }
  std::string listed;
  for (const OutputQuantity& q : quantities)
    listed += (listed.empty() ? "" : ", ") + q.name;
  const std::string head = "option --unit = \"" + raw + "\": ";
  if (trim_blanks(raw).empty())
    throw UsageError(head + "expected QUANTITY=UNIT items separated by commas, e.g. "
                            "cp=J/g/K,T=degC");

  std::map<std::string, std::size_t> given; // quantity -> item number
  std::size_t start = 0;
  for (std::size_t item = 1;; ++item) {
    const std::size_t comma = std::min(raw.find(',', start), raw.size());
    const std::string text = raw.substr(start, comma - start);
    const std::string where = head + "item " + std::to_string(item) + " (column " +
                              std::to_string(start + 1) + ") \"" + text + "\": ";
    const auto eq = text.find('=');
    if (trim_blanks(text).empty())
      throw UsageError(where + "empty item: expected QUANTITY=UNIT, e.g. cp=J/g/K");
    if (eq == std::string::npos)
      throw UsageError(where + "expected QUANTITY=UNIT, e.g. cp=J/g/K (" + command +
                       " prints " + listed + ")");
    const std::string name = trim_blanks(text.substr(0, eq));
    const std::string unit_text = trim_blanks(text.substr(eq + 1));
    const auto quantity =
        std::find_if(quantities.begin(), quantities.end(), [&](const OutputQuantity& q) {
          return q.name == name ||
                 std::find(q.aliases.begin(), q.aliases.end(), name) != q.aliases.end();
        });
    if (quantity == quantities.end())
      throw UsageError(where + "unknown quantity '" + name + "'" +
                       did_you_mean(name, names) + "; " + command + " prints " + listed);
    if (unit_text.empty())
      throw UsageError(where + "no unit after '=': expected a unit of " + quantity->what +
                       " such as " + quantity->example);
    if (const auto seen = given.find(quantity->name); seen != given.end())
      throw UsageError(where + quantity->name + " was already given in item " +
                       std::to_string(seen->second));
    given[quantity->name] = item;

    Unit unit;
    try {
      unit = parse_unit(unit_text);
    } catch (const std::invalid_argument& e) {
      throw UsageError(where + e.what());
    }
    if (unit.dimension != quantity->dimension) {
      const std::string found = unit.dimension == dimension::dimensionless()
                                    ? std::string("a plain number")
                                    : describe_dimension(unit.dimension);
      std::string hint;
      for (const auto& [d, setting] : quantity->hints)
        if (d == unit.dimension)
          hint = " (this unit fits " + quantity->name + " with " + setting + ")";
      throw UsageError(where + "unit \"" + unit_text + "\" is " + found + ", but " +
                       quantity->name + " is " + quantity->what +
                       ": expected a unit such as " + quantity->example + hint);
    }
    // An absolute temperature is written in K, mK, degC or degF alone; degC inside
    // a product (degC^1, degC*1) would be an interval and print a shifted scale
    // without its shift.
    if (quantity->dimension == dimension::temperature() && !unit.is_temperature_offset)
      for (const auto& [symbol, power] : unit.factors)
        if (symbol == "degC" || symbol == "degF")
          throw UsageError(where + "unit \"" + unit_text + "\": write " + symbol +
                           " alone for a temperature (an absolute " + symbol +
                           " temperature)");
    units[quantity->name] = output_unit(unit);
    if (comma >= raw.size())
      break;
    start = comma + 1;
  }
  return units;
}

std::string unit_option_help() {
  return "print QUANTITY in UNIT, comma-separated, e.g.\n"
         "cp=J/g/K,T=degC,k=W/cm/K,H=kJ/kg (units as in cards,\n"
         "docs/cards.md; degC/degF alone are absolute temperatures,\n"
         "J/g/degC = J/g/K; cal is the thermochemical 4.184 J)";
}

} // namespace quantacal::cli
