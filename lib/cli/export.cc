// SPDX-License-Identifier: Apache-2.0
// `quantacal export`: c_p, H, k and density of one card on adaptively chosen nodes,
// as CSV, JSON or MatML XML, for programs that interpolate tables linearly
// (docs/export.md).
#include "command_registry.h"
#include "export_nodes.h"
#include "options.h"
#include "output_units.h"

#include <quantacal/cards/card.h>
#include <quantacal/common/exceptions.h>
#include <quantacal/common/files.h>
#include <quantacal/common/format.h>
#include <quantacal/common/text.h>
#include <quantacal/version.h>

#include <algorithm>
#include <cctype>
#include <cmath>
#include <cstdio>
#include <iostream>
#include <map>
#include <string>
#include <vector>

namespace quantacal::cli {
namespace {

/// Tolerances accepted by --tolerance, as fractions (0.001 % to 10 %): below, the
/// node count grows as 1/sqrt(tolerance) into the hundreds of thousands; above, a
/// linear table is not worth calling accurate.
constexpr double smallest_tolerance = 1e-5;
constexpr double largest_tolerance = 0.1;

enum class Format { csv, json, xml };

OptionParser export_parser() {
  OptionParser parser(
      "export",
      "CARD --to FILE.csv|FILE.json|FILE.xml [--tolerance PERCENT] "
      "[--basis mass|mole|volume] [--unit Q=UNIT,...] [--from K] [--until K]",
      "Writes the specific heat c_p(T), the enthalpy H(T), the thermal conductivity\n"
      "k(T) and the density of the material described by CARD to FILE, for programs\n"
      "that read property tables and interpolate linearly between rows.\n"
      "\n"
      "Nodes are chosen adaptively: interpolating c_p, k and the density linearly in T\n"
      "between consecutive rows reproduces the card's exact model within the relative\n"
      "--tolerance everywhere in the range (checked densely against the model by\n"
      "bisection, then verified on other points). Nodes fall on every phase join and\n"
      "transition width, so a latent heat appears as a c_p peak over the card's\n"
      "transition width and H rises steeply there. Where the model itself steps (the\n"
      "magnetic c_p at a Curie temperature), a node 1e-6 T below the step leaves a\n"
      "tiny interval that the file lists and the tolerance does not cover.\n"
      "\n"
      "H is the exact integral of the piecewise-linear c_p of the file (trapezoid sums\n"
      "from the first row, which holds the model's stored energy relative to the\n"
      "card's reference temperature), so a solver using the table conserves energy\n"
      "with it. The file states how far H is from the model's own stored energy.\n"
      "\n"
      "The format follows the extension of FILE:\n"
      "  .csv   comment lines starting with '#' (card, sources, tolerance, measured\n"
      "         errors), then one header line with units, then one row per node:\n"
      "         T_K,cp_J_per_kg_K,H_J_per_kg,k_W_per_m_K,rho_kg_per_m3 (mass basis)\n"
      "  .json  one object: card, sources, tolerance, measured errors, units, columns\n"
      "  .xml   MatML (materials markup language, OASIS): Material/BulkDetails with\n"
      "         one PropertyData per quantity, temperatures in ParameterValue, and\n"
      "         Metadata with ParameterDetails, PropertyDetails and Units\n"
      "The file is written atomically (a temporary file renamed over FILE) and only\n"
      "when every node could be computed.\n"
      "\n"
      "With --unit, the named columns (T, cp, H, k, rho; e is accepted for H and\n"
      "density for rho) are written in the units given, and the CSV header, the JSON\n"
      "units and the MatML Units name them, e.g. --unit T=degC,cp=J/g/K,H=J/g gives\n"
      "  T_degC,cp_J_per_g_K,H_J_per_g,k_W_per_m_K,rho_kg_per_m3\n"
      "Each unit must fit its quantity on the chosen basis. degC and degF alone are\n"
      "absolute temperatures; inside a unit they are degree intervals (J/g/degC is\n"
      "J/g/K). The tolerance is relative and linear interpolation survives a change\n"
      "of unit, so the guarantees hold unchanged; H and its stated bound are\n"
      "converted with the H unit (when the units of c_p, T and H do not cancel, as\n"
      "for cp=J/g/K with H=kJ/kg, the file states the factor between H and the\n"
      "trapezoid sum of c_p).\n"
      "\n"
      "Temperatures of --from and --until are in K whatever --unit says;\n"
      "\"300 K\" and \"26.85 degC\" are accepted too.");
  parser
      .add_value("to", "FILE",
                 "output file; its extension (.csv, .json, .xml) sets the "
                 "format (required)")
      .add_value("tolerance", "PERCENT",
                 "relative interpolation tolerance as a percentage, 0.001% to 10%\n"
                 "(default: 0.5%)")
      .add_value("basis", "BASIS", "basis of c_p and H: mass (default), mole or volume",
                 {"mass", "mole", "volume"})
      .add_value("unit", "Q=UNIT,...", unit_option_help())
      .add_value("from", "K", "first temperature (default: lower end of the valid range)")
      .add_value("until", "K", "last temperature (default: upper end of the valid range)")
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

const char* basis_name(Basis basis) {
  return basis == Basis::mole ? "mole" : basis == Basis::volume ? "volume" : "mass";
}

/// The units the columns are written in, by quantity name (T, cp, H, k, rho).
using Units = std::map<std::string, OutputUnit>;

/// @p values (SI) in @p unit.
std::vector<double> in_unit(const std::vector<double>& values, const OutputUnit& unit) {
  std::vector<double> out(values.size());
  for (std::size_t i = 0; i < values.size(); ++i)
    out[i] = unit.value(values[i]);
  return out;
}

/// The output format from the extension of @p path.
Format format_from_path(const std::string& path) {
  const auto slash = path.find_last_of('/');
  const auto dot = path.find_last_of('.');
  std::string extension;
  if (dot != std::string::npos && (slash == std::string::npos || dot > slash))
    extension = path.substr(dot + 1);
  std::string lower = extension;
  std::transform(lower.begin(), lower.end(), lower.begin(),
                 [](unsigned char c) { return static_cast<char>(std::tolower(c)); });
  if (lower == "csv")
    return Format::csv;
  if (lower == "json")
    return Format::json;
  if (lower == "xml")
    return Format::xml;
  std::string message = "option --to = \"" + path + "\": ";
  message += extension.empty() ? std::string("the file name has no extension")
                               : "unknown extension '." + extension + "'";
  message += ": expected .csv, .json or .xml";
  if (!extension.empty())
    message += did_you_mean(lower, {"csv", "json", "xml"}, ".");
  if (parse_number(path))
    message += " (--to names the output file; the last temperature is --until)";
  throw UsageError(message);
}

/// --tolerance: a percentage ("0.5%", "0.5 %"); returns the fraction.
double tolerance_from_text(const std::string& raw) {
  const auto expected = [&](const std::string& what) {
    return UsageError("option --tolerance = \"" + raw + "\": expected " + what);
  };
  std::string text = raw;
  while (!text.empty() && std::isspace(static_cast<unsigned char>(text.back())))
    text.pop_back();
  if (text.empty() || text.back() != '%')
    throw expected("a percentage such as 0.5% (a number followed by %)");
  text.pop_back();
  const auto value = parse_number(text);
  if (!value)
    throw expected("a percentage such as 0.5% (a number followed by %)");
  if (!(*value > 0.0))
    throw expected("a tolerance > 0%");
  const double fraction = *value / 100.0;
  if (fraction < smallest_tolerance || fraction > largest_tolerance)
    throw expected("a tolerance from 0.001% to 10%");
  return fraction;
}

/// printf into a std::string.
template <typename... Args>
std::string format(const char* pattern, Args... args) {
  char buffer[512];
  std::snprintf(buffer, sizeof buffer, pattern, args...);
  return buffer;
}

/// @p x rounded up to two significant digits, so that a stated bound is not below
/// what was measured.
double round_up_2(double x) {
  if (!(x > 0.0))
    return 0.0;
  const double scale = std::pow(10.0, std::floor(std::log10(x)) - 1.0);
  const double r = std::ceil(x / scale * (1.0 - 1e-15)) * scale;
  return r >= x ? r : x;
}

/// One line of text: newlines of a citation become spaces.
std::string one_line(std::string s) {
  std::replace(s.begin(), s.end(), '\n', ' ');
  std::replace(s.begin(), s.end(), '\r', ' ');
  return s;
}

/// What every format says, as sentences (also used in the XML notes).
struct Statements {
  std::string card;
  std::string tolerance;
  std::string worst_found;
  std::string enthalpy;
  std::string enthalpy_bound;
  std::string latent_heat;
  std::vector<std::string> jumps;
  double enthalpy_bound_value = 0.0; ///< on the basis, rounded up
};

Statements statements(const Material& material, const std::string& card_path,
                      const ExportTable& table, Basis basis, const Units& units) {
  const OutputUnit& h_unit = units.at("H");
  Statements s;
  const double lo = table.temperature.front(), hi = table.temperature.back();
  s.card = "quantacal export of card " + material.name() + " (" + card_path +
           "), quantacal " + QUANTACAL_VERSION_STRING + ", " +
           std::to_string(table.temperature.size()) + " nodes from " + format_double(lo) +
           " K to " + format_double(hi) + " K, " + basis_name(basis) + " basis";
  s.tolerance =
      format("%g", 100.0 * table.tolerance) +
      " % relative: interpolating c_p, k and the density linearly in T between "
      "consecutive nodes reproduces the card's exact model within it everywhere in " +
      format_double(lo) + " K to " + format_double(hi) + " K" +
      (table.jumps.empty() ? std::string(".")
                           : std::string(", except inside the jump intervals listed."));
  s.worst_found =
      format("worst relative error found on %zu verification points "
             "between the nodes (not used to choose them): c_p %.3g %% at "
             "%.6g K, k %.3g %% at %.6g K, density %.3g %%.",
             table.n_checked, 100.0 * table.worst_capacity_error,
             table.worst_capacity_temperature, 100.0 * table.worst_conductivity_error,
             table.worst_conductivity_temperature, 100.0 * table.worst_density_error);
  s.enthalpy =
      "H is the exact integral of the piecewise-linear c_p of this file: trapezoid "
      "sums from the first node, whose H is the model's stored energy at " +
      format_double(lo) + " K relative to the reference temperature " +
      format_double(material.data().reference_temperature) +
      " K. A solver that uses this c_p and this H conserves energy with them.";
  // In the printed units, H steps by `factor` times the trapezoid sum of c_p over T.
  const double factor = units.at("cp").scale * units.at("T").scale / units.at("H").scale;
  if (std::fabs(factor - 1.0) > 1e-12)
    s.enthalpy += " In the units of this file (c_p in " + units.at("cp").text +
                  ", T in " + units.at("T").text + ", H in " + h_unit.text +
                  ") H steps by " + format_double(factor) +
                  " times the trapezoid sum of c_p over T.";
  s.enthalpy_bound_value = round_up_2(h_unit.difference(table.worst_enthalpy_difference));
  const double range = h_unit.difference(table.enthalpy_range);
  const double relative = range > 0.0 ? s.enthalpy_bound_value / range : 0.0;
  s.enthalpy_bound = format(
      "|H - e_model| <= %s %s = %.2g %% of the model's range e(%s K) - e(%s K) = "
      "%.6g %s (H read as the integral of the linear c_p; measured at the nodes and "
      "the verification points, plus the most H can drift between two check "
      "points; worst at %.6g K; rounded up).",
      format_double(s.enthalpy_bound_value).c_str(), h_unit.text.c_str(),
      100.0 * relative, format_double(hi).c_str(), format_double(lo).c_str(), range,
      h_unit.text.c_str(), table.worst_enthalpy_temperature);
  s.latent_heat = "Latent heat appears in c_p as a peak over the card's transition "
                  "width (nodes on both ends of every join), so H keeps it as a steep "
                  "rise over that width.";
  for (const ExportJump& j : table.jumps)
    s.jumps.push_back(format("%s K to %s K: the model's %s steps by %.3g %% at %s K; "
                             "linear interpolation is not within the tolerance inside "
                             "this interval.",
                             format_double(j.lower).c_str(),
                             format_double(j.upper).c_str(), j.quantity,
                             100.0 * j.relative_jump, format_double(j.upper).c_str()));
  return s;
}

std::string csv_text(const Material& material, const std::string& card_path,
                     const ExportTable& table, Basis basis, const Units& units) {
  const Statements s = statements(material, card_path, table, basis, units);
  std::string out;
  out += "# " + s.card + "\n";
  out += "# card: " + one_line(material.name()) + "\n";
  out += "# card_file: " + one_line(card_path) + "\n";
  for (const Source& source : material.data().sources)
    out += "# source: " + one_line(source.parameter) + ": " + one_line(source.citation) +
           "\n";
  out += "# tolerance: " + s.tolerance + "\n";
  out += "# worst_found: " + s.worst_found + "\n";
  for (const std::string& j : s.jumps)
    out += "# jump: " + j + "\n";
  out += "# H_definition: " + s.enthalpy + "\n";
  out += "# H_difference_bound: " + s.enthalpy_bound + "\n";
  out += "# latent_heat: " + s.latent_heat + "\n";
  const OutputUnit &t = units.at("T"), &cp = units.at("cp"), &h = units.at("H"),
                   &k = units.at("k"), &rho = units.at("rho");
  out += "T_" + t.token + ",cp_" + cp.token + ",H_" + h.token + ",k_" + k.token +
         ",rho_" + rho.token + "\n";
  for (std::size_t i = 0; i < table.temperature.size(); ++i)
    out += format_double(t.value(table.temperature[i])) + "," +
           format_double(cp.value(table.capacity[i])) + "," +
           format_double(h.value(table.enthalpy[i])) + "," +
           format_double(k.value(table.conductivity[i])) + "," +
           format_double(rho.value(table.density[i])) + "\n";
  return out;
}

std::string json_string(const std::string& s) {
  std::string out = "\"";
  for (const char c : s) {
    switch (c) {
    case '"':
      out += "\\\"";
      break;
    case '\\':
      out += "\\\\";
      break;
    case '\n':
      out += "\\n";
      break;
    case '\t':
      out += "\\t";
      break;
    case '\r':
      out += "\\r";
      break;
    default:
      if (static_cast<unsigned char>(c) < 0x20)
        out += format("\\u%04x", static_cast<unsigned>(static_cast<unsigned char>(c)));
      else
        out += c;
    }
  }
  return out + "\"";
}

std::string json_array(const std::vector<double>& values) {
  std::string out = "[";
  for (std::size_t i = 0; i < values.size(); ++i)
    out += (i ? "," : "") + format_double(values[i]);
  return out + "]";
}

std::string json_text(const Material& material, const std::string& card_path,
                      const ExportTable& table, Basis basis, const Units& units) {
  const Statements s = statements(material, card_path, table, basis, units);
  const auto number = [](double v) { return format_double(v); };
  std::string out = "{\n";
  out += "  \"format\": \"quantacal export\",\n";
  out += "  \"format_version\": 1,\n";
  out += "  \"summary\": " + json_string(s.card) + ",\n";
  out += "  \"card\": {\"name\": " + json_string(material.name()) +
         ", \"file\": " + json_string(card_path) +
         ", \"description\": " + json_string(one_line(material.data().description)) +
         "},\n";
  out += "  \"sources\": [";
  const auto& sources = material.data().sources;
  for (std::size_t i = 0; i < sources.size(); ++i)
    out += std::string(i ? ",\n    " : "\n    ") +
           "{\"for\": " + json_string(sources[i].parameter) +
           ", \"cite\": " + json_string(sources[i].citation) + "}";
  out += "\n  ],\n";
  out += "  \"basis\": \"" + std::string(basis_name(basis)) + "\",\n";
  out += "  \"interpolation\": \"piecewise linear in T between consecutive nodes\",\n";
  out += "  \"tolerance\": {\"relative\": " + number(table.tolerance) +
         ", \"applies_to\": [\"cp\", \"k\", \"density\"], \"statement\": " +
         json_string(s.tolerance) + "},\n";
  out += "  \"worst_found\": {\"cp\": " + number(table.worst_capacity_error) +
         ", \"cp_at_K\": " + number(table.worst_capacity_temperature) +
         ", \"k\": " + number(table.worst_conductivity_error) +
         ", \"k_at_K\": " + number(table.worst_conductivity_temperature) +
         ", \"density\": " + number(table.worst_density_error) +
         ", \"n_checked\": " + std::to_string(table.n_checked) + "},\n";
  out += "  \"jumps\": [";
  for (std::size_t i = 0; i < table.jumps.size(); ++i) {
    const ExportJump& j = table.jumps[i];
    out += std::string(i ? ", " : "") + "{\"from_K\": " + number(j.lower) +
           ", \"to_K\": " + number(j.upper) + ", \"quantity\": \"" + j.quantity +
           "\", \"relative_step\": " + number(j.relative_jump) + "}";
  }
  out += "],\n";
  out +=
      "  \"enthalpy\": {\"definition\": " + json_string(s.enthalpy) +
      ", \"reference_temperature_K\": " + number(material.data().reference_temperature) +
      ", \"difference_from_model_bound\": " + number(s.enthalpy_bound_value) +
      ", \"model_range\": " + number(units.at("H").difference(table.enthalpy_range)) +
      ", \"statement\": " + json_string(s.enthalpy_bound) +
      ", \"latent_heat\": " + json_string(s.latent_heat) + "},\n";
  out += "  \"units\": {\"T\": " + json_string(units.at("T").text) +
         ", \"cp\": " + json_string(units.at("cp").text) +
         ", \"H\": " + json_string(units.at("H").text) +
         ", \"k\": " + json_string(units.at("k").text) +
         ", \"density\": " + json_string(units.at("rho").text) + "},\n";
  out += "  \"columns\": {\n";
  out += "    \"T\": " + json_array(in_unit(table.temperature, units.at("T"))) + ",\n";
  out += "    \"cp\": " + json_array(in_unit(table.capacity, units.at("cp"))) + ",\n";
  out += "    \"H\": " + json_array(in_unit(table.enthalpy, units.at("H"))) + ",\n";
  out += "    \"k\": " + json_array(in_unit(table.conductivity, units.at("k"))) + ",\n";
  out += "    \"density\": " + json_array(in_unit(table.density, units.at("rho"))) + "\n";
  out += "  }\n}\n";
  return out;
}

std::string delimited(const std::vector<double>& values) {
  std::string out;
  for (std::size_t i = 0; i < values.size(); ++i)
    out += (i ? "," : "") + format_double(values[i]);
  return out;
}

/// MatML <Units>: one <Unit> per factor, with its power when not 1.
std::string xml_units(const std::string& name,
                      const std::vector<std::pair<std::string, int>>& factors) {
  std::string out = "      <Units name=\"" + markup_escape(name) + "\">\n";
  for (const auto& [unit, power] : factors)
    out += std::string("        <Unit") +
           (power == 1 ? "" : " power=\"" + std::to_string(power) + "\"") + "><Name>" +
           unit + "</Name></Unit>\n";
  return out + "      </Units>\n";
}

std::string xml_text(const Material& material, const std::string& card_path,
                     const ExportTable& table, Basis basis, const Units& units) {
  const Statements s = statements(material, card_path, table, basis, units);
  struct Property {
    const char* id;
    const char* name;
    std::vector<double> values; ///< in the unit below
    const OutputUnit& unit;
  };
  const std::vector<Property> properties = {
      {"pr1", "Specific Heat Capacity", in_unit(table.capacity, units.at("cp")),
       units.at("cp")},
      {"pr2", "Enthalpy", in_unit(table.enthalpy, units.at("H")), units.at("H")},
      {"pr3", "Thermal Conductivity", in_unit(table.conductivity, units.at("k")),
       units.at("k")},
      {"pr4", "Density", in_unit(table.density, units.at("rho")), units.at("rho")}};

  std::string notes = s.card + "\n" + s.tolerance + "\n" + s.worst_found + "\n";
  for (const std::string& j : s.jumps)
    notes += "Jump: " + j + "\n";
  notes += s.enthalpy + "\n" + s.enthalpy_bound + "\n" + s.latent_heat;

  std::string out = "<?xml version=\"1.0\" encoding=\"UTF-8\"?>\n";
  out += "<!-- quantacal export in a subset of MatML 3.1 (docs/export.md) -->\n";
  out += "<MatML_Doc>\n  <Material>\n    <BulkDetails>\n";
  out += "      <Name>" + markup_escape(material.name()) + "</Name>\n";
  const std::string temperatures = delimited(in_unit(table.temperature, units.at("T")));
  for (const Property& p : properties) {
    out += std::string("      <PropertyData property=\"") + p.id + "\" source=\"ds0\">\n";
    out += "        <Data format=\"float\">" + delimited(p.values) + "</Data>\n";
    out += "        <ParameterValue parameter=\"pa1\" format=\"float\">\n";
    out += "          <Data>" + temperatures + "</Data>\n";
    out += "        </ParameterValue>\n";
    out += "      </PropertyData>\n";
  }
  out += "      <Notes>" + markup_escape(notes) + "</Notes>\n";
  out += "    </BulkDetails>\n  </Material>\n  <Metadata>\n";
  out += "    <DataSourceDetails id=\"ds0\">\n      <Name>" +
         markup_escape("quantacal export of card " + material.name() + " (" + card_path +
                       ")") +
         "</Name>\n      <Notes>" +
         markup_escape("Computed from the card's model; the card's own sources are "
                       "ds1 onwards. " +
                       s.tolerance) +
         "</Notes>\n    </DataSourceDetails>\n";
  const auto& sources = material.data().sources;
  for (std::size_t i = 0; i < sources.size(); ++i)
    out += "    <DataSourceDetails id=\"ds" + std::to_string(i + 1) +
           "\">\n      <Name>" + markup_escape(one_line(sources[i].citation)) +
           "</Name>\n      <Notes>" +
           markup_escape("for: " + one_line(sources[i].parameter)) +
           "</Notes>\n    </DataSourceDetails>\n";
  out += "    <ParameterDetails id=\"pa1\">\n      <Name>Temperature</Name>\n" +
         xml_units(units.at("T").text, units.at("T").factors) +
         "    </ParameterDetails>\n";
  for (const Property& p : properties)
    out += std::string("    <PropertyDetails id=\"") + p.id + "\">\n      <Name>" +
           p.name + "</Name>\n" + xml_units(p.unit.text, p.unit.factors) +
           "    </PropertyDetails>\n";
  out += "  </Metadata>\n</MatML_Doc>\n";
  return out;
}

int run_export(const std::vector<std::string>& args) {
  const OptionParser parser = export_parser();
  const ParsedOptions options = parser.parse(args);
  if (options.help) {
    std::cout << parser.help();
    return ok;
  }
  if (options.positional.size() != 1)
    throw UsageError("expected exactly one CARD but got " +
                     std::to_string(options.positional.size()) + " (" + parser.usage() +
                     ")");
  const auto target = options.text("to");
  if (!target)
    throw UsageError("option --to FILE is required (the output file: .csv, .json or "
                     ".xml)");

  // Everything that does not need the card is checked before it is loaded.
  const Format file_format = format_from_path(*target);
  const double tolerance =
      tolerance_from_text(options.text("tolerance").value_or("0.5%"));
  const std::string basis_text = options.text("basis").value_or("mass");
  const Basis basis = basis_from_text(basis_text);
  const Units units = parse_output_units("export", options.text("unit"),
                                         thermal_quantities(basis_text, "H", true));

  const std::string& card_path = options.positional[0];
  const MaterialPtr material = load_card(card_path);
  const double from = options.temperature("from", material->lower_temperature());
  const double until = options.temperature("until", material->upper_temperature());
  const std::string range = format_double(material->lower_temperature()) +
                            " K <= T <= " + format_double(material->upper_temperature()) +
                            " K (the valid range of card " + card_path + ")";
  for (const auto& [name, t] : {std::pair<const char*, double>{"from", from},
                                std::pair<const char*, double>{"until", until}})
    if (!(t >= material->lower_temperature() && t <= material->upper_temperature()))
      throw RangeError(std::string("quantacal export --") + name, material->name(), range,
                       t);
  if (!(from < until))
    throw UsageError("option --from (" + format_double(from) +
                     " K) must be below --until (" + format_double(until) + " K)");

  const ExportTable table = build_export_table(*material, from, until, tolerance, basis);
  const std::string text =
      file_format == Format::csv    ? csv_text(*material, card_path, table, basis, units)
      : file_format == Format::json ? json_text(*material, card_path, table, basis, units)
                                    : xml_text(*material, card_path, table, basis, units);
  write_file_atomically(*target, text);
  std::cout << "quantacal export: wrote " << *target << ": " << table.temperature.size()
            << " nodes, "
            << format("worst c_p %.3g %%, k %.3g %% (tolerance %g %%)",
                      100.0 * table.worst_capacity_error,
                      100.0 * table.worst_conductivity_error, 100.0 * tolerance)
            << '\n';
  return ok;
}

const CommandRegistrar
    registrar("export",
              "write c_p, H, k and density on adaptive nodes as CSV, JSON or MatML XML",
              [](const std::vector<std::string>& args) {
                return guarded("export", [&] { return run_export(args); });
              });

} // namespace
} // namespace quantacal::cli
