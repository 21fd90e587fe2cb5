// SPDX-License-Identifier: Apache-2.0
// The energy balance of bodies in contact, latent heats included.
#include <quantacal/material/equilibrium.h>

#include <quantacal/common/exceptions.h>
#include <quantacal/common/format.h>

#include <boost/math/tools/toms748_solve.hpp>

#include <algorithm>
#include <cmath>
#include <cstdint>
#include <limits>

namespace quantacal {
namespace {

/// Largest relative imbalance of the heats accepted before the result is refused.
constexpr double balance_tolerance = 1e-8;
/// Root-finder iterations allowed.
constexpr std::uintmax_t max_root_iterations = 200;

std::string label_of(const Body& body, std::size_t index) {
  return body.label.empty() ? std::to_string(index + 1) : "\"" + body.label + "\"";
}

/// "card <path>" or "material <name>", for messages.
std::string origin_of(const Material& material) {
  return material.data().file.empty() ? "material " + material.name()
                                      : "card " + material.data().file;
}

void check_bodies(const std::vector<Body>& bodies) {
  if (bodies.size() < 2)
    throw InputError::argument("quantacal::solve_equilibrium", "bodies",
                               std::to_string(bodies.size()) + " bodies",
                               "two or more bodies");
  for (std::size_t i = 0; i < bodies.size(); ++i) {
    const Body& b = bodies[i];
    const std::string field = "bodies[" + std::to_string(i) + "]";
    if (!b.material)
      throw InputError::argument("quantacal::solve_equilibrium", field + ".material",
                                 "null", "a material");
    if (!(std::isfinite(b.mass) && b.mass > 0.0))
      throw InputError::argument("quantacal::solve_equilibrium", field + ".mass",
                                 format_double(b.mass) + " kg", "a mass > 0 kg");
    const Material& m = *b.material;
    if (!(b.initial_temperature >= m.lower_temperature() &&
          b.initial_temperature <= m.upper_temperature()))
      throw RangeError("quantacal::solve_equilibrium: body " + label_of(b, i), m.name(),
                       format_double(m.lower_temperature()) +
                           " K <= T0 <= " + format_double(m.upper_temperature()) +
                           " K (the valid range of " + origin_of(m) + ")",
                       b.initial_temperature);
  }
}

/// The stored energy of a body at T, J.
double energy_of(const Body& body, double temperature, EnergySource source) {
  const Material& m = *body.material;
  const ThermalState s = source == EnergySource::exact
                             ? m.thermal_exact(temperature, Basis::mass)
                             : m.thermal(temperature, Basis::mass);
  return body.mass * s.energy;
}

/// The interval where T_f may lie: between the starts and inside every valid range.
struct Bracket {
  double lowest_start = 0.0;
  double highest_start = 0.0;
  double common_lower = 0.0;
  double common_upper = std::numeric_limits<double>::infinity();
  const Body* lower_limiter = nullptr; ///< the body whose range sets common_lower
  const Body* upper_limiter = nullptr; ///< the body whose range sets common_upper
};

Bracket bracket_of(const std::vector<Body>& bodies) {
  Bracket r;
  r.lowest_start = r.highest_start = bodies[0].initial_temperature;
  r.lower_limiter = r.upper_limiter = &bodies[0];
  for (const Body& b : bodies) {
    r.lowest_start = std::min(r.lowest_start, b.initial_temperature);
    r.highest_start = std::max(r.highest_start, b.initial_temperature);
    if (b.material->lower_temperature() > r.common_lower) {
      r.common_lower = b.material->lower_temperature();
      r.lower_limiter = &b;
    }
    if (b.material->upper_temperature() < r.common_upper) {
      r.common_upper = b.material->upper_temperature();
      r.upper_limiter = &b;
    }
  }
  return r;
}

[[noreturn]] void outside_common_range(const Bracket& r, bool below) {
  const Material& m = *(below ? r.lower_limiter : r.upper_limiter)->material;
  throw RangeError("quantacal::solve_equilibrium", m.name(),
                   "the final temperature to lie inside the valid range of " +
                       origin_of(m) +
                       (below ? " (from " + format_double(r.common_lower)
                              : " (up to " + format_double(r.common_upper)) +
                       " K); the bodies cover " + format_double(r.lowest_start) +
                       " K to " + format_double(r.highest_start) + " K, " +
                       (below ? "lowest" : "highest") + " start",
                   below ? r.lowest_start : r.highest_start);
}

/// T_f from the residual sum_i m_i e_i(T) - E0 on the bracket; counts iterations.
template <typename Residual>
double find_root(const Residual& residual, const Bracket& r, unsigned int& iterations) {
  iterations = 0;
  if (!(r.highest_start > r.lowest_start))
    return r.lowest_start;
  const double lo = std::max(r.lowest_start, r.common_lower);
  const double hi = std::min(r.highest_start, r.common_upper);
  if (lo > hi || residual(lo) > 0.0)
    outside_common_range(r, true);
  if (residual(hi) < 0.0)
    outside_common_range(r, false);
  const double f_lo = residual(lo);
  const double f_hi = residual(hi);
  if (f_lo == 0.0)
    return lo;
  if (f_hi == 0.0)
    return hi;
  std::uintmax_t count = max_root_iterations;
  const auto bracket = boost::math::tools::toms748_solve(
      residual, lo, hi, f_lo, f_hi,
      boost::math::tools::eps_tolerance<double>(std::numeric_limits<double>::digits - 2),
      count);
  iterations = static_cast<unsigned int>(count);
  if (count >= max_root_iterations)
    throw NumericalError("quantacal::solve_equilibrium",
                         "the root finder did not converge in 200 iterations (bracket " +
                             format_double(bracket.first) + " K to " +
                             format_double(bracket.second) + " K)");
  return std::abs(residual(bracket.first)) <= std::abs(residual(bracket.second))
             ? bracket.first
             : bracket.second;
}

/// The latent-heat transitions of a body's material that it crosses or ends inside.
std::vector<TransitionPassage> passages_of(const Body& body, double final_temperature) {
  std::vector<TransitionPassage> out;
  const double lo = std::min(body.initial_temperature, final_temperature);
  const double hi = std::max(body.initial_temperature, final_temperature);
  // Keeps a transition the body crosses or ends inside (J/mol latent heat).
  const auto add = [&](double temperature, double latent, double fraction) {
    TransitionPassage t;
    t.temperature = temperature;
    t.latent_heat = latent / body.material->molar_mass();
    t.fraction = fraction;
    t.ends_inside = fraction > 1e-3 && fraction < 1.0 - 1e-3;
    t.crossed = lo < temperature && temperature < hi;
    if (t.ends_inside || t.crossed)
      out.push_back(t);
  };
  for (const auto& term : body.material->model().contributions()) {
    if (term->kind() != "transition")
      continue;
    double temperature = 0.0, latent = 0.0;
    for (const auto& p : term->parameters()) {
      if (p.name == "temperature")
        temperature = p.value;
      else if (p.name == "latent_heat")
        latent = p.value;
    }
    if (temperature > 0.0 && latent > 0.0) // share: the term's energy over its heat
      add(temperature, latent,
          std::clamp(term->evaluate(final_temperature).energy / latent, 0.0, 1.0));
  }
  // Phase changes of a card with phases: the share is the weight of the phase
  // above the boundary.
  const auto& layout = body.material->data().phase_layout;
  if (!layout)
    return out;
  const PhaseLayout::Weight w = layout->weight(final_temperature);
  const auto& boundaries = layout->boundaries();
  for (std::size_t i = 0; i < boundaries.size(); ++i)
    if (boundaries[i].latent_heat > 0.0)
      add(boundaries[i].temperature, boundaries[i].latent_heat,
          w.phase > i    ? 1.0
          : w.phase == i ? w.s
                         : 0.0);
  return out;
}

} // namespace

EquilibriumResult solve_equilibrium(const std::vector<Body>& bodies,
                                    EnergySource source) {
  check_bodies(bodies);
  double initial_energy = 0.0; // J
  double energy_scale = 0.0;   // J, for the balance check
  for (const Body& b : bodies) {
    const double e = energy_of(b, b.initial_temperature, source);
    initial_energy += e;
    energy_scale += std::abs(e);
  }
  const auto residual = [&](double t) {
    double sum = 0.0;
    for (const Body& b : bodies)
      sum += energy_of(b, t, source);
    return sum - initial_energy;
  };
  EquilibriumResult result;
  result.temperature = find_root(residual, bracket_of(bodies), result.iterations);

  double heat_scale = 0.0;
  for (const Body& b : bodies) {
    const double heat = energy_of(b, result.temperature, source) -
                        energy_of(b, b.initial_temperature, source);
    result.heat.push_back(heat);
    result.heat_sum += heat;
    heat_scale = std::max(heat_scale, std::abs(heat));
    result.transitions.push_back(passages_of(b, result.temperature));
  }
  const double scale = std::max(heat_scale, 1e-12 * energy_scale);
  result.relative_imbalance = scale > 0.0 ? std::abs(result.heat_sum) / scale : 0.0;
  if (result.relative_imbalance > balance_tolerance)
    throw NumericalError(
        "quantacal::solve_equilibrium",
        "the heats do not balance: sum " + format_double(result.heat_sum) +
            " J against a largest heat of " + format_double(heat_scale) +
            " J (relative " + format_double(result.relative_imbalance) + ")");
  return result;
}

} // namespace quantacal
