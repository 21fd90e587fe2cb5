// SPDX-License-Identifier: Apache-2.0
// `quantacal equilibrium`: the common final temperature of bodies that exchange heat
// without loss, latent heats included.
#include "command_registry.h"
#include "options.h"

#include <quantacal/cards/card.h>
#include <quantacal/common/exceptions.h>

#include <boost/math/tools/toms748_solve.hpp>

#include <algorithm>
#include <cmath>
#include <cstdint>
#include <cstdio>
#include <iostream>
#include <limits>
#include <map>
#include <string>
#include <vector>

namespace quantacal::cli {
namespace {

/// Largest relative imbalance of the heats accepted before the result is refused.
constexpr double balance_tolerance = 1e-8;

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

struct Body {
  std::string spec; ///< as given
  std::string card;
  MaterialPtr material;
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

Body parse_body(const std::string& spec) {
  const auto last = spec.rfind(':');
  const auto middle = last == std::string::npos || last == 0 ? std::string::npos
                                                             : spec.rfind(':', last - 1);
  if (middle == std::string::npos || middle == 0)
    throw UsageError("body \"" + spec +
                     "\": expected CARD:MASS_KG:T0_K, e.g. copper.yaml:2.5:300");
  Body body;
  body.spec = spec;
  body.card = spec.substr(0, middle);
  body.mass = parse_mass(spec.substr(middle + 1, last - middle - 1), spec);
  body.initial_temperature = parse_temperature_argument(
      spec.substr(last + 1), "body \"" + spec + "\": starting temperature");
  return body;
}

/// A latent-heat transition of a card, read from its model's contributions.
struct Transition {
  double temperature = 0.0; ///< K
  double latent_heat = 0.0; ///< J/mol
  double width = 0.0;       ///< K
  ContributionPtr term;
};

std::vector<Transition> transitions_of(const Material& material) {
  std::vector<Transition> out;
  for (const auto& term : material.model().contributions()) {
    if (term->kind() != "transition")
      continue;
    Transition t;
    t.term = term;
    for (const auto& p : term->parameters()) {
      if (p.name == "temperature")
        t.temperature = p.value;
      else if (p.name == "latent_heat")
        t.latent_heat = p.value;
      else if (p.name == "width")
        t.width = p.value;
    }
    if (t.temperature > 0.0 && t.latent_heat > 0.0)
      out.push_back(t);
  }
  return out;
}

template <typename... Args>
std::string format(const char* pattern, Args... args) {
  char buffer[512];
  std::snprintf(buffer, sizeof buffer, pattern, args...);
  return buffer;
}

/// What a body does at its card's transitions between its start and the final
/// temperature.
std::string transition_note(const Body& body, double final_temperature) {
  std::string note;
  const double lo = std::min(body.initial_temperature, final_temperature);
  const double hi = std::max(body.initial_temperature, final_temperature);
  for (const auto& t : transitions_of(*body.material)) {
    // Fraction transformed at T_f: U_transition(T_f) / L, the normal cdf of the term.
    const double fraction =
        std::clamp(t.term->evaluate(final_temperature).energy / t.latent_heat, 0.0, 1.0);
    const bool ends_inside = fraction > 1e-3 && fraction < 1.0 - 1e-3;
    if (ends_inside)
      note += format(
          "%sends inside the transition at %.6g K (high-temperature phase %.1f %%)",
          note.empty() ? "" : "; ", t.temperature, 100.0 * fraction);
    else if (lo < t.temperature && t.temperature < hi)
      note += format("%scrosses the transition at %.6g K (latent heat %.6g J/kg)",
                     note.empty() ? "" : "; ", t.temperature,
                     t.latent_heat / body.material->molar_mass());
  }
  return note;
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

  std::vector<Body> bodies;
  for (const auto& spec : options.positional)
    bodies.push_back(parse_body(spec));
  std::map<std::string, MaterialPtr> loaded; // one load per distinct card
  for (auto& body : bodies) {
    auto& material = loaded[body.card];
    if (!material)
      material = load_card(body.card);
    body.material = material;
    if (body.initial_temperature < material->lower_temperature() ||
        body.initial_temperature > material->upper_temperature())
      throw RangeError("quantacal equilibrium: body \"" + body.spec + "\"",
                       material->name(),
                       format_double(material->lower_temperature()) +
                           " K <= T0 <= " + format_double(material->upper_temperature()) +
                           " K (the valid range of card " + body.card + ")",
                       body.initial_temperature);
  }

  const auto energy_of = [exact](const Body& b, double t) {
    return b.mass * (exact ? b.material->thermal_exact(t, Basis::mass)
                           : b.material->thermal(t, Basis::mass))
                        .energy;
  };

  // The final temperature lies between the lowest and highest start (energy is
  // increasing); it must also lie where every card is valid.
  double t_min = bodies[0].initial_temperature, t_max = t_min;
  double common_lower = 0.0, common_upper = std::numeric_limits<double>::infinity();
  const Body* lower_limiter = &bodies[0];
  const Body* upper_limiter = &bodies[0];
  for (const auto& b : bodies) {
    t_min = std::min(t_min, b.initial_temperature);
    t_max = std::max(t_max, b.initial_temperature);
    if (b.material->lower_temperature() > common_lower) {
      common_lower = b.material->lower_temperature();
      lower_limiter = &b;
    }
    if (b.material->upper_temperature() < common_upper) {
      common_upper = b.material->upper_temperature();
      upper_limiter = &b;
    }
  }
  double initial_energy = 0.0; // J
  double energy_scale = 0.0;   // J, for the balance check
  for (const auto& b : bodies) {
    const double e = energy_of(b, b.initial_temperature);
    initial_energy += e;
    energy_scale += std::abs(e);
  }
  const auto residual = [&](double t) {
    double sum = 0.0;
    for (const auto& b : bodies)
      sum += energy_of(b, t);
    return sum - initial_energy;
  };

  double final_temperature = t_min;
  std::uintmax_t iterations = 0;
  if (t_max > t_min) {
    const double lo = std::max(t_min, common_lower);
    const double hi = std::min(t_max, common_upper);
    if (lo > hi || residual(lo) > 0.0)
      throw RangeError("quantacal equilibrium", lower_limiter->material->name(),
                       "the final temperature to lie inside the valid range of card " +
                           lower_limiter->card + " (from " + format_double(common_lower) +
                           " K); the bodies cover " + format_double(t_min) + " K to " +
                           format_double(t_max) + " K, lowest start",
                       t_min);
    if (residual(hi) < 0.0)
      throw RangeError("quantacal equilibrium", upper_limiter->material->name(),
                       "the final temperature to lie inside the valid range of card " +
                           upper_limiter->card + " (up to " +
                           format_double(common_upper) + " K); the bodies cover " +
                           format_double(t_min) + " K to " + format_double(t_max) +
                           " K, highest start",
                       t_max);
    const double f_lo = residual(lo);
    const double f_hi = residual(hi);
    if (f_lo == 0.0)
      final_temperature = lo;
    else if (f_hi == 0.0)
      final_temperature = hi;
    else {
      std::uintmax_t max_iterations = 200;
      const auto bracket =
          boost::math::tools::toms748_solve(residual, lo, hi, f_lo, f_hi,
                                            boost::math::tools::eps_tolerance<double>(
                                                std::numeric_limits<double>::digits - 2),
                                            max_iterations);
      iterations = max_iterations;
      if (iterations >= 200)
        throw NumericalError(
            "quantacal equilibrium",
            "the root finder did not converge in 200 iterations (bracket " +
                format_double(bracket.first) + " K to " + format_double(bracket.second) +
                " K)");
      final_temperature =
          std::abs(residual(bracket.first)) <= std::abs(residual(bracket.second))
              ? bracket.first
              : bracket.second;
    }
  }

  // Report, built in memory and written at the end; columns sized to their contents.
  std::vector<std::vector<std::string>> table = {
      {"body", "card", "material", "mass_kg", "T0_K", "heat_J", "note"}};
  double heat_sum = 0.0;
  double heat_scale = 0.0;
  for (std::size_t i = 0; i < bodies.size(); ++i) {
    const Body& b = bodies[i];
    const double heat =
        energy_of(b, final_temperature) - energy_of(b, b.initial_temperature);
    heat_sum += heat;
    heat_scale = std::max(heat_scale, std::abs(heat));
    table.push_back({std::to_string(i + 1), b.card, b.material->name(),
                     format("%.6g", b.mass), format("%.6g", b.initial_temperature),
                     format("%+.7e", heat), transition_note(b, final_temperature)});
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
  const double scale = std::max(heat_scale, 1e-12 * energy_scale);
  const double imbalance = scale > 0.0 ? std::abs(heat_sum) / scale : 0.0;
  if (imbalance > balance_tolerance)
    throw NumericalError("quantacal equilibrium",
                         "the heats do not balance: sum " + format_double(heat_sum) +
                             " J against a largest heat of " + format_double(heat_scale) +
                             " J (relative " + format_double(imbalance) + ")");
  out += "heat: + taken, - given; energies from the " +
         std::string(exact ? "exact model" : "cached table") + "\n";
  out += format("energy balance: sum of heats %+.3e J (%.1e of the largest heat); "
                "root-finder iterations %ju\n",
                heat_sum, imbalance, iterations);
  out += "caution: estimates from models; verify against measurements, local codes and "
         "licensed practice before sizing a bath or vessel\n";
  out += "final temperature: " + format_double(final_temperature) + " K\n";
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
