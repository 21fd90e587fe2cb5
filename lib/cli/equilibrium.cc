// SPDX-License-Identifier: Apache-2.0
// `quantacal equilibrium`: the common final temperature of bodies that exchange heat
// without loss, latent heats included.
#include "command_registry.h"
#include "options.h"

#include <quantacal/cards/card.h>
#include <quantacal/common/exceptions.h>
#include <quantacal/material/equilibrium.h>

#include <algorithm>
#include <cstdio>
#include <iostream>
#include <map>
#include <string>
#include <vector>

namespace quantacal::cli {
namespace {

OptionParser equilibrium_parser() {
  OptionParser parser(
      "equilibrium", "CARD:MASS_KG:T0_K CARD:MASS_KG:T0_K... [--exact]",
      "Final common temperature of two or more bodies that exchange heat with each\n"
      "other and with nothing else (an insulated vessel), latent heats included: the\n"
      "temperature T_f at which  sum_i m_i e_i(T_f) = sum_i m_i e_i(T0_i),  with e_i\n"
      "the stored energy per kilogram of body i. It is found with a bracketing root\n"
      "finder (TOMS 748) between the lowest and the highest starting temperature.\n"
      "\n"
      "Each body is CARD:MASS_KG:T0_K: the material card, the mass in kg and the\n"
      "starting temperature in K (\"2.5kg\", \"500g\", \"300K\" and \"26.85degC\" are\n"
      "accepted too). The body is split at its last two ':' so a card path may\n"
      "contain ':'. Every card must be valid over the whole temperature span.\n"
      "\n"
      "The report lists each body with the heat it takes (+) or gives (-) in J, notes\n"
      "any phase transition of its card that it passes or ends inside, checks that\n"
      "the heats sum to zero, and ends with the line\n"
      "  final temperature: <value> K\n"
      "with the value in round-trip precision.");
  parser
      .add_flag("exact", "evaluate the exact model instead of the cached table (slower)")
      .add_epilogue(exit_code_help());
  return parser;
}

/// A body as written on the command line, CARD:MASS_KG:T0_K.
struct BodyArgument {
  std::string card;
  double mass = 0.0;                ///< kg
  double initial_temperature = 0.0; ///< K
};

double parse_mass(const std::string& text, const std::string& spec) {
  const std::string what = "body \"" + spec + "\": mass \"" + text + "\"";
  double value = 0.0;
  if (const auto plain = parse_number(text))
    value = *plain;
  else {
    // Allow an explicit unit of mass written right after the number.
    const auto unit_start = text.find_first_not_of("0123456789.eE+- ");
    const std::string unit =
        unit_start == std::string::npos ? "" : text.substr(unit_start);
    const auto number = parse_number(text.substr(0, unit_start));
    if (!number || (unit != "kg" && unit != "g"))
      throw UsageError(what + ": expected a mass in kg (a number, or with unit kg or g)");
    value = unit == "g" ? *number * 1e-3 : *number;
  }
  if (!(value > 0.0))
    throw UsageError(what + ": expected a mass > 0 kg");
  return value;
}

BodyArgument parse_body(const std::string& spec) {
  const auto last = spec.rfind(':');
  const auto middle = last == std::string::npos || last == 0 ? std::string::npos
                                                             : spec.rfind(':', last - 1);
  if (middle == std::string::npos || middle == 0)
    throw UsageError("body \"" + spec +
                     "\": expected CARD:MASS_KG:T0_K, e.g. copper.yaml:2.5:300");
  BodyArgument body;
  body.card = spec.substr(0, middle);
  body.mass = parse_mass(spec.substr(middle + 1, last - middle - 1), spec);
  body.initial_temperature = parse_temperature_argument(
      spec.substr(last + 1), "body \"" + spec + "\": starting temperature");
  return body;
}

template <typename... Args>
std::string format(const char* pattern, Args... args) {
  char buffer[512];
  std::snprintf(buffer, sizeof buffer, pattern, args...);
  return buffer;
}

/// What a body does at its card's transitions between its start and T_f.
std::string transition_note(const std::vector<TransitionPassage>& passages) {
  std::string note;
  for (const auto& t : passages) {
    if (t.ends_inside)
      note += format(
          "%sends inside the transition at %.6g K (high-temperature phase %.1f %%)",
          note.empty() ? "" : "; ", t.temperature, 100.0 * t.fraction);
    else if (t.crossed)
      note += format("%scrosses the transition at %.6g K (latent heat %.6g J/kg)",
                     note.empty() ? "" : "; ", t.temperature, t.latent_heat);
  }
  return note;
}

/// The bodies of the command line, each card loaded once.
std::vector<Body> load_bodies(const std::vector<std::string>& specs) {
  std::vector<BodyArgument> arguments; // all parsed before any card is read
  for (const auto& spec : specs)
    arguments.push_back(parse_body(spec));
  std::vector<Body> bodies;
  std::map<std::string, MaterialPtr> loaded; // one load per distinct card
  for (std::size_t i = 0; i < specs.size(); ++i) {
    auto& material = loaded[arguments[i].card];
    if (!material)
      material = load_card(arguments[i].card);
    bodies.push_back(
        Body{material, arguments[i].mass, arguments[i].initial_temperature, specs[i]});
  }
  return bodies;
}

/// The report: one row per body, columns sized to their contents.
std::string body_table(const std::vector<std::string>& specs,
                       const std::vector<Body>& bodies, const EquilibriumResult& result) {
  std::vector<std::vector<std::string>> table = {
      {"body", "card", "material", "mass_kg", "T0_K", "heat_J", "note"}};
  for (std::size_t i = 0; i < bodies.size(); ++i) {
    const Body& b = bodies[i];
    table.push_back({std::to_string(i + 1), parse_body(specs[i]).card, b.material->name(),
                     format("%.6g", b.mass), format("%.6g", b.initial_temperature),
                     format("%+.7e", result.heat[i]),
                     transition_note(result.transitions[i])});
  }
  std::vector<std::size_t> width(table[0].size(), 0);
  for (const auto& row : table)
    for (std::size_t c = 0; c < row.size(); ++c)
      width[c] = std::max(width[c], row[c].size());
  std::string out;
  for (const auto& row : table) {
    std::string line;
    for (std::size_t c = 0; c < row.size(); ++c) {
      const bool numeric = c >= 3 && c <= 5; // right-aligned columns
      const std::string pad(width[c] - row[c].size(), ' ');
      line += (c ? "  " : "") +
              (numeric ? pad + row[c] : row[c] + (c + 1 < row.size() ? pad : ""));
    }
    out += line.substr(0, line.find_last_not_of(' ') + 1) + '\n';
  }
  return out;
}

int run_equilibrium(const std::vector<std::string>& args) {
  const OptionParser parser = equilibrium_parser();
  const ParsedOptions options = parser.parse(args);
  if (options.help) {
    std::cout << parser.help();
    return ok;
  }
  if (options.positional.size() < 2)
    throw UsageError("expected two or more bodies CARD:MASS_KG:T0_K but got " +
                     std::to_string(options.positional.size()) + " (" + parser.usage() +
                     ")");
  const bool exact = options.has("exact");
  const std::vector<Body> bodies = load_bodies(options.positional);
  const EquilibriumResult result =
      solve_equilibrium(bodies, exact ? EnergySource::exact : EnergySource::table);

  // Built in memory and written at the end.
  std::string out = body_table(options.positional, bodies, result);
  out += "heat: + taken, - given; energies from the " +
         std::string(exact ? "exact model" : "cached table") + "\n";
  out += format("energy balance: sum of heats %+.3e J (%.1e of the largest heat); "
                "root-finder iterations %u\n",
                result.heat_sum, result.relative_imbalance, result.iterations);
  out += "caution: estimates from models; verify against measurements, local codes and "
         "licensed practice before sizing a bath or vessel\n";
  out += "final temperature: " + format_double(result.temperature) + " K\n";
  std::cout << out << std::flush;
  if (!std::cout)
    throw std::ios_base::failure("could not write the report to stdout");
  return ok;
}

const CommandRegistrar
    registrar("equilibrium", "final temperature of bodies exchanging heat without loss",
              [](const std::vector<std::string>& args) {
                return guarded("equilibrium", [&] { return run_equilibrium(args); });
              });

} // namespace
} // namespace quantacal::cli
