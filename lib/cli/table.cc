// SPDX-License-Identifier: Apache-2.0
// `quantacal table`: specific heat, stored energy and conductivity of one card as CSV.
#include "command_registry.h"
#include "options.h"
#include "output_units.h"
#include <quantacal/fit/fit.h>

#include <quantacal/cards/card.h>
#include <quantacal/common/exceptions.h>

#include <cmath>
#include <iostream>
#include <map>
#include <string>
#include <vector>

namespace quantacal::cli {
namespace {

/// The most rows one call prints; beyond this a larger --step is needed.
constexpr std::size_t max_rows = 1000000;

OptionParser table_parser() {
  OptionParser parser(
      "table",
      "CARD [--from K] [--to K] [--step K] [--basis mass|mole|volume] [--unit "
      "Q=UNIT,...] "
      "[--exact] [--band]",
      "Prints, as CSV on stdout, the specific heat, the stored energy and the thermal\n"
      "conductivity of the material described by CARD, one row per temperature.\n"
      "Rows run from --from to --to in steps of --step; the last row is exactly at\n"
      "--to even when the step does not divide the range (the last interval is then\n"
      "shorter). Numbers are printed with round-trip precision: reading a printed\n"
      "value back gives the same double. The stored energy is relative to the card's\n"
      "reference temperature (0 K unless the card names another).\n"
      "\n"
      "Header by basis:\n"
      "  mass    T_K,cp_J_per_kg_K,e_J_per_kg,k_W_per_m_K\n"
      "  mole    T_K,cp_J_per_mol_K,e_J_per_mol,k_W_per_m_K\n"
      "  volume  T_K,cp_J_per_m3_K,e_J_per_m3,k_W_per_m_K  (per m^3 of the reference\n"
      "          configuration: reference density / molar mass times the molar value)\n"
      "\n"
      "With --band (a card written by `quantacal fit`), each value is followed by its\n"
      "one-sigma uncertainty propagated linearly from the card's recorded covariance,\n"
      "in columns named like the value with _sigma after the quantity, e.g.\n"
      "  T_K,cp_J_per_kg_K,cp_sigma_J_per_kg_K,e_J_per_kg,e_sigma_J_per_kg,\n"
      "  k_W_per_m_K,k_sigma_W_per_m_K\n"
      "The band is evaluated on the exact model.\n"
      "\n"
      "With --unit, the named quantities (T, cp, e, k; H is accepted for e) are\n"
      "printed in the units given, and the header names them, e.g.\n"
      "  --unit cp=J/g/K,T=degC,k=W/cm/K,e=kJ/kg gives\n"
      "  T_degC,cp_J_per_g_K,e_kJ_per_kg,k_W_per_cm_K\n"
      "Each unit must fit its quantity on the chosen basis (cp=J/mol/K needs\n"
      "--basis mole). degC and degF alone are absolute temperatures (T); inside a\n"
      "unit they are degree intervals, so J/g/degC is J/g/K. The sigma columns of\n"
      "--band are in the unit of their quantity.\n"
      "\n"
      "Temperatures of --from, --to and --step are in K whatever --unit says;\n"
      "\"300 K\" and \"26.85 degC\" are accepted too.\n"
      "Nothing is printed unless every row can be computed.");
  parser
      .add_value("from", "K", "first temperature (default: lower end of the valid range)")
      .add_value("to", "K", "last temperature (default: upper end of the valid range)")
      .add_value("step", "K", "temperature step, > 0 (default: 1 K)")
      .add_value("basis", "BASIS", "mass (default), mole or volume",
                 {"mass", "mole", "volume"})
      .add_value("unit", "Q=UNIT,...", unit_option_help())
      .add_flag("exact", "evaluate the exact model instead of the cached table (slower)")
      .add_flag("band",
                "add one-sigma columns from the card's fit record (quantacal fit)")
      .add_epilogue(exit_code_help());
  return parser;
}

Basis basis_from_text(const std::string& text) {
  if (text == "mole")
    return Basis::mole;
  if (text == "volume")
    return Basis::volume;
  return Basis::mass;
}

/// The CSV header, e.g. "T_K,cp_J_per_kg_K,e_J_per_kg,k_W_per_m_K"; with --band each
/// quantity is followed by its one-sigma column (cp_sigma_J_per_kg_K, ...).
std::string header_for(const std::map<std::string, OutputUnit>& units, bool band) {
  const auto column = [&](const std::string& name, const char* suffix = "") {
    return name + suffix + "_" + units.at(name).token;
  };
  if (band)
    return column("T") + "," + column("cp") + "," + column("cp", "_sigma") + "," +
           column("e") + "," + column("e", "_sigma") + "," + column("k") + "," +
           column("k", "_sigma") + "\n";
  return column("T") + "," + column("cp") + "," + column("e") + "," + column("k") + "\n";
}

std::string range_text(const Material& material) {
  return format_double(material.lower_temperature()) +
         " K <= T <= " + format_double(material.upper_temperature()) + " K";
}

/// Temperatures from @p from to @p to inclusive by @p step; the last one is exactly @p
/// to.
std::vector<double> row_temperatures(double from, double to, double step) {
  std::vector<double> rows;
  // A row closer to `to` than this fraction of a step is dropped in favour of `to`
  // itself, so that rounding in from + i step never adds a near-duplicate last row.
  const double merge = 1e-9 * step;
  for (std::size_t i = 0;; ++i) {
    const double t = from + static_cast<double>(i) * step;
    if (t >= to - merge)
      break;
    rows.push_back(t);
    if (rows.size() >= max_rows)
      throw UsageError("the table would have more than " + std::to_string(max_rows) +
                       " rows; use a larger --step");
  }
  rows.push_back(to);
  return rows;
}

int run_table(const std::vector<std::string>& args) {
  const OptionParser parser = table_parser();
  const ParsedOptions options = parser.parse(args);
  if (options.help) {
    std::cout << parser.help();
    return ok;
  }
  if (options.positional.size() != 1)
    throw UsageError("expected exactly one CARD but got " +
                     std::to_string(options.positional.size()) + " (" + parser.usage() +
                     ")");

  // Options that do not need the card are checked before it is loaded.
  const double step = options.temperature_difference("step", 1.0);
  if (!(step > 0.0))
    throw UsageError("option --step = \"" + *options.text("step") +
                     "\": expected a temperature step > 0 K");
  const std::string basis_text = options.text("basis").value_or("mass");
  const Basis basis = basis_from_text(basis_text);
  const bool exact = options.has("exact");
  const std::map<std::string, OutputUnit> units = parse_output_units(
      "table", options.text("unit"), thermal_quantities(basis_text, "e", false));
  const OutputUnit& t_unit = units.at("T");
  const OutputUnit& cp_unit = units.at("cp");
  const OutputUnit& e_unit = units.at("e");
  const OutputUnit& k_unit = units.at("k");

  const MaterialPtr material = load_card(options.positional[0]);
  const double from = options.temperature("from", material->lower_temperature());
  const double to = options.temperature("to", material->upper_temperature());
  const auto check_inside = [&](const char* name, double t) {
    if (t < material->lower_temperature() || t > material->upper_temperature())
      throw RangeError("quantacal table --" + std::string(name), material->name(),
                       range_text(*material) + " (the valid range of card " +
                           options.positional[0] + ")",
                       t);
  };
  check_inside("from", from);
  check_inside("to", to);
  if (from > to)
    throw UsageError("option --from (" + format_double(from) + " K) is above --to (" +
                     format_double(to) + " K)");

  // The whole output is built in memory and written only when every row succeeded.
  if (options.has("band")) {
    std::string out = header_for(units, true);
    for (const double t : row_temperatures(from, to, step)) {
      const fit::BandRow row = fit::band(*material, t, basis);
      for (const double v :
           {t_unit.value(t), cp_unit.value(row.capacity),
            cp_unit.difference(row.capacity_sigma), e_unit.value(row.energy),
            e_unit.difference(row.energy_sigma), k_unit.value(row.conductivity)}) {
        out += format_double(v);
        out += ',';
      }
      out += format_double(k_unit.difference(row.conductivity_sigma));
      out += '\n';
    }
    std::cout << out << std::flush;
    if (!std::cout)
      throw std::ios_base::failure("could not write the table to stdout");
    return ok;
  }
  std::string out = header_for(units, false);
  for (const double t : row_temperatures(from, to, step)) {
    const ThermalState state =
        exact ? material->thermal_exact(t, basis) : material->thermal(t, basis);
    const ConductivityValue k =
        exact ? material->conductivity_exact(t) : material->conductivity(t);
    out += format_double(t_unit.value(t));
    out += ',';
    out += format_double(cp_unit.value(state.capacity));
    out += ',';
    out += format_double(e_unit.value(state.energy));
    out += ',';
    out += format_double(k_unit.value(k.value));
    out += '\n';
  }
  std::cout << out << std::flush;
  if (!std::cout)
    throw std::ios_base::failure("could not write the table to stdout");
  return ok;
}

const CommandRegistrar
    registrar("table", "print c_p, e and k of a card as CSV over a temperature range",
              [](const std::vector<std::string>& args) {
                return guarded("table", [&] { return run_table(args); });
              });

} // namespace
} // namespace quantacal::cli
