// SPDX-License-Identifier: Apache-2.0
// `quantacal check`: validates cards and compares them with their published measurements.
#include "command_registry.h"
#include "options.h"
#include "output_units.h"

#include <quantacal/cards/card.h>
#include <quantacal/common/exceptions.h>
#include <quantacal/models/metal_conductivity.h>

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <filesystem>
#include <iostream>
#include <string>
#include <vector>

namespace quantacal::cli {
namespace {

OptionParser check_parser() {
  OptionParser parser(
      "check", "CARD... [--quiet] [--unit T=UNIT]",
      "Loads each CARD, builds its property table, and compares the model with every\n"
      "point of the card's `measurements` list. For each card a deviation table is\n"
      "printed:\n"
      "  T_K         temperature of the measurement (T_degC, T_degF with --unit)\n"
      "  quantity    specific heat (J/mol/K), stored energy (J/mol, relative to the\n"
      "              card's reference temperature) or conductivity (W/m/K)\n"
      "  measured    the published value\n"
      "  model       the value the library returns (cached table)\n"
      "  dev_%       100 (model - measured) / measured\n"
      "  tol_%       the tolerance the card states for the point\n"
      "  status      ok, or OUTSIDE when |dev_%| > tol_%\n"
      "followed by one summary line per card (with the size of its table and the\n"
      "worst c_p error the table build found). A card that cannot be loaded, or\n"
      "whose table cannot be built, is invalid: it is reported on stderr (file,\n"
      "line, column, field and what was expected) and the remaining cards are still\n"
      "checked.\n"
      "\n"
      "exit status of check: 0 all cards valid and every point within tolerance,\n"
      "1 all cards valid but some point outside tolerance, 2 some card invalid.");
  parser.add_flag("quiet", "print only the summary lines")
      .add_value("unit", "T=UNIT",
                 "print temperatures in UNIT: T=K (default), T=degC, T=degF or T=mK\n"
                 "(the other columns keep their units)")
      .add_epilogue(exit_code_help());
  return parser;
}

const char* quantity_name(Measurement::Quantity q) {
  switch (q) {
  case Measurement::Quantity::specific_heat:
    return "specific heat";
  case Measurement::Quantity::stored_energy:
    return "stored energy";
  case Measurement::Quantity::conductivity:
    return "conductivity";
  }
  return "?";
}

const char* quantity_unit(Measurement::Quantity q) {
  switch (q) {
  case Measurement::Quantity::specific_heat:
    return "J/mol/K";
  case Measurement::Quantity::stored_energy:
    return "J/mol";
  case Measurement::Quantity::conductivity:
    return "W/m/K";
  }
  return "?";
}

/// printf into a std::string.
template <typename... Args>
std::string format(const char* pattern, Args... args) {
  char buffer[256];
  std::snprintf(buffer, sizeof buffer, pattern, args...);
  return buffer;
}

/// Six significant digits: enough to read, not a round-trip format.
std::string short_number(double v) {
  return format("%.6g", v);
}

struct CardOutcome {
  bool valid = false;
  std::size_t n_points = 0;
  std::size_t n_outside = 0;
};

/// Model value of one measurement, on the basis the measurement is stored in.
double model_value(const Material& material, const Measurement& m) {
  switch (m.quantity) {
  case Measurement::Quantity::specific_heat:
    return material.thermal(m.temperature, Basis::mole).capacity;
  case Measurement::Quantity::stored_energy:
    return material.thermal(m.temperature, Basis::mole).energy;
  case Measurement::Quantity::conductivity:
    return material.conductivity(m.temperature).value;
  }
  return std::nan("");
}

/// Warns (on stderr, exit code unchanged) when a card's metal conductivity model
/// is used inside the band where the Wiedemann-Franz law is known to be off
/// (inelastic electron-phonon scattering, about theta_R/20 to theta_R/2; see
/// docs/theory.md) and the card has no conductivity measurements there.
void warn_about_wiedemann_franz(const std::string& path, const Material& material,
                                const OutputUnit& t_unit, std::string& err) {
  const auto* metal =
      dynamic_cast<const MetalConductivity*>(&material.conductivity_model());
  if (!metal)
    return;
  const double lo =
      std::max(material.lower_temperature(), metal->intermediate_lower_temperature());
  const double hi =
      std::min(material.upper_temperature(), metal->intermediate_upper_temperature());
  if (lo > hi)
    return;
  for (const auto& m : material.data().measurements)
    if (m.quantity == Measurement::Quantity::conductivity && m.temperature >= lo &&
        m.temperature <= hi)
      return;
  err += "quantacal check: warning: " + path +
         ": conductivity: the Wiedemann-Franz law is "
         "known to be off between " +
         short_number(t_unit.value(lo)) + " " + t_unit.text + " and " +
         short_number(t_unit.value(hi)) + " " + t_unit.text +
         " (intermediate temperatures) and the card has no conductivity measurements "
         "there" +
         (metal->has_inelastic_correction()
              ? " (the Wilson inelastic factor is used, but is itself fitted)"
              : "") +
         "; treat k(T) in that range as an estimate\n";
}

/// Checks one card, appending its report to @p out and its errors to @p err.
CardOutcome check_card(const std::string& path, bool quiet, const OutputUnit& t_unit,
                       std::string& out, std::string& err) {
  CardOutcome outcome;
  MaterialPtr material;
  try {
    material = load_card(path);
    material->table(); // building the table is part of validation (tolerance reached)
  } catch (const std::exception& e) {
    err += "quantacal check: error: " + std::string(e.what()) + '\n';
    out += path + ": INVALID (see the error on stderr)\n";
    return outcome;
  }

  struct Row {
    const Measurement* m;
    double model;
    double deviation; // relative
  };
  std::vector<Row> rows;
  for (const auto& m : material->data().measurements) {
    try {
      const double model = model_value(*material, m);
      const double deviation = m.value != 0.0 ? (model - m.value) / std::abs(m.value)
                               : model == 0.0 ? 0.0
                                              : std::numeric_limits<double>::infinity();
      rows.push_back(Row{&m, model, deviation});
    } catch (const std::exception& e) {
      // A measurement the model cannot be evaluated at makes the card invalid.
      err += "quantacal check: error: " + path + ":" + std::to_string(m.line) +
             ": measurements: " + quantity_name(m.quantity) + " at " +
             format_double(m.temperature) + " K: " + e.what() + '\n';
      out += path + ": INVALID (see the error on stderr)\n";
      return outcome;
    }
  }
  outcome.valid = true;
  outcome.n_points = rows.size();
  warn_about_wiedemann_franz(path, *material, t_unit, err);

  const Row* worst = nullptr;
  std::string table;
  table += format("%-10s  %-13s  %-7s  %14s  %14s  %9s  %7s  %s\n",
                  ("T_" + t_unit.token).c_str(), "quantity", "unit", "measured", "model",
                  "dev_%", "tol_%", "status");
  for (const auto& row : rows) {
    const bool inside = std::abs(row.deviation) <= row.m->tolerance;
    if (!inside)
      ++outcome.n_outside;
    if (!worst || std::abs(row.deviation) > std::abs(worst->deviation))
      worst = &row;
    table += format("%-10s  %-13s  %-7s  %14s  %14s  %+9.3f  %7.3f  %s\n",
                    short_number(t_unit.value(row.m->temperature)).c_str(),
                    quantity_name(row.m->quantity), quantity_unit(row.m->quantity),
                    short_number(row.m->value).c_str(), short_number(row.model).c_str(),
                    100.0 * row.deviation, 100.0 * row.m->tolerance,
                    inside ? "ok" : "OUTSIDE");
  }

  const std::string title = path + " (" + material->name() + ")";
  if (!quiet) {
    out += "== " + title + " ==\n";
    if (rows.empty())
      out += "no measurements in this card\n";
    else
      out += table;
  }
  const TableStatistics& stats = material->table().statistics();
  std::string summary = title + ": valid; table " + std::to_string(stats.n_segments) +
                        " segments, worst c_p error " +
                        format("%.2g", stats.worst_error) + "; ";
  if (rows.empty())
    summary += "no measurements to compare";
  else {
    summary += std::to_string(rows.size() - outcome.n_outside) + " of " +
               std::to_string(rows.size()) + " points within tolerance";
    summary += format("; worst %+.3f %% (%s at %s %s)", 100.0 * worst->deviation,
                      quantity_name(worst->m->quantity),
                      short_number(t_unit.value(worst->m->temperature)).c_str(),
                      t_unit.text.c_str());
  }
  out += summary + (outcome.n_outside ? "  -> OUTSIDE TOLERANCE\n" : "\n");
  if (!quiet)
    out += '\n';
  return outcome;
}

int run_check(const std::vector<std::string>& args) {
  const OptionParser parser = check_parser();
  const ParsedOptions options = parser.parse(args);
  if (options.help) {
    std::cout << parser.help();
    return ok;
  }
  if (options.positional.empty())
    throw UsageError("expected at least one CARD (" + parser.usage() + ")");

  const OutputUnit t_unit = parse_output_units("check", options.text("unit"),
                                               {{"T", dimension::temperature(), "K",
                                                 "the temperature", "K, degC, degF, mK"}})
                                .at("T");
  std::string out;
  std::string err;
  bool any_invalid = false;
  bool any_outside = false;
  for (const auto& path : options.positional) {
    const CardOutcome outcome = check_card(path, options.has("quiet"), t_unit, out, err);
    any_invalid = any_invalid || !outcome.valid;
    any_outside = any_outside || outcome.n_outside > 0;
  }
  out +=
      "caution: model values are estimates; verify against measurements, local codes and "
      "licensed practice\n";
  std::cout << out << std::flush;
  std::cerr << err << std::flush;
  if (!std::cout)
    throw std::ios_base::failure("could not write the report to stdout");
  return any_invalid ? invalid_input : any_outside ? check_failed : ok;
}

const CommandRegistrar
    registrar("check",
              "validate cards and compare them with their published measurements",
              [](const std::vector<std::string>& args) {
                return guarded("check", [&] { return run_check(args); });
              });

} // namespace
} // namespace quantacal::cli
