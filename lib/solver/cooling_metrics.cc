// SPDX-License-Identifier: Apache-2.0
// Crossings and window passages of the probe histories (cooling_metrics.h).
#include "cooling_metrics.h"

#include "result_files.h"

#include <algorithm>
#include <cmath>
#include <limits>
#include <sstream>

namespace quantacal::solver::detail {
namespace {

/** The solver's dT/dt of probe @p p at sample @p k, K/s (NaN if not known). */
double rate_at(const RunResult& result, std::size_t p, std::size_t k) {
  if (p < result.probe_rates.size() && k < result.probe_rates[p].size())
    return result.probe_rates[p][k];
  return std::numeric_limits<double>::quiet_NaN();
}

/**
 * dT/dt at the fraction @p s of the interval from sample @p k to k + 1: the
 * solver's rates interpolated linearly in time; the slope of the interval where a
 * rate is unknown (a result made without the solver's rates).
 */
double rate_between(const RunResult& result, std::size_t p, std::size_t k, double s) {
  const double a = rate_at(result, p, k), b = rate_at(result, p, k + 1);
  if (std::isfinite(a) && std::isfinite(b))
    return a + s * (b - a);
  const auto& history = result.probe_temperatures[p];
  return (history[k + 1] - history[k]) / (result.times[k + 1] - result.times[k]);
}

/** The part [s0, s1] of the interval k -> k + 1 where lower <= T <= upper; s0 > s1 if
 * none. */
std::pair<double, double> inside_part(double t_a, double t_b, double lower,
                                      double upper) {
  if (t_a == t_b)
    return t_a >= lower && t_a <= upper ? std::make_pair(0.0, 1.0)
                                        : std::make_pair(1.0, 0.0);
  const double s_upper = (upper - t_a) / (t_b - t_a);
  const double s_lower = (lower - t_a) / (t_b - t_a);
  return {std::max(0.0, std::min(s_upper, s_lower)),
          std::min(1.0, std::max(s_upper, s_lower))};
}

WindowPassage passage(const RunResult& result, std::size_t p,
                      const TemperatureWindow& window) {
  WindowPassage out;
  out.probe = result.probe_names[p];
  out.upper = window.upper;
  out.lower = window.lower;
  const auto& history = result.probe_temperatures[p];
  double fallen = 0.0;
  double fastest = -std::numeric_limits<double>::infinity();
  for (std::size_t k = 0; k + 1 < history.size(); ++k) {
    const auto [s0, s1] =
        inside_part(history[k], history[k + 1], window.lower, window.upper);
    if (s0 > s1)
      continue;
    const double t0 = result.times[k], dt = result.times[k + 1] - t0;
    if (!out.entered)
      out.first_in = t0 + s0 * dt;
    out.entered = true;
    out.last_in = t0 + s1 * dt;
    out.time_inside += (s1 - s0) * dt;
    fallen -= (s1 - s0) * (history[k + 1] - history[k]);
    // the largest -dT/dt inside: the rates are linear in time between samples, so
    // it is at an end of a part inside (a sample or a window edge)
    for (const double s : {s0, s1})
      fastest = std::max(fastest, -rate_between(result, p, k, s));
  }
  if (out.entered)
    out.max_cooling_rate = fastest;
  if (out.time_inside > 0.0)
    out.mean_cooling_rate = fallen / out.time_inside;
  out.passed = out.entered && !history.empty() && history.back() < window.lower;
  return out;
}

} // namespace

std::vector<Crossing> find_crossings(const RunResult& result,
                                     const std::vector<double>& temperatures) {
  std::vector<Crossing> out;
  for (std::size_t p = 0; p < result.probe_names.size(); ++p) {
    const auto& history = result.probe_temperatures[p];
    for (const double temperature : temperatures) {
      Crossing crossing;
      crossing.probe = result.probe_names[p];
      crossing.temperature = temperature;
      for (std::size_t k = 0; k + 1 < history.size(); ++k) {
        const double before = history[k] - temperature;
        const double after = history[k + 1] - temperature;
        if (before == 0.0 && after == 0.0)
          continue;
        if ((before > 0.0 && after <= 0.0) || (before < 0.0 && after >= 0.0)) {
          const double fraction = before / (before - after);
          const double interval = result.times[k + 1] - result.times[k];
          crossing.crossed = true;
          crossing.time = result.times[k] + fraction * interval;
          crossing.rate = rate_between(result, p, k, fraction);
          break;
        }
      }
      out.push_back(crossing);
    }
  }
  return out;
}

std::vector<WindowPassage>
find_window_passages(const RunResult& result,
                     const std::vector<TemperatureWindow>& windows) {
  std::vector<WindowPassage> out;
  for (std::size_t p = 0; p < result.probe_names.size(); ++p)
    for (const TemperatureWindow& window : windows)
      out.push_back(passage(result, p, window));
  return out;
}

namespace {

void crossings_yaml(std::ostream& out, const RunResult& result, const std::string& probe,
                    const TemperatureScale& scale) {
  out << "    crossings:";
  bool any = false;
  for (const auto& c : result.crossings) {
    if (c.probe != probe)
      continue;
    out << (any ? "" : "\n");
    any = true;
    out << "      - temperature_" << scale.symbol() << ": "
        << number(scale.value(c.temperature)) << '\n';
    if (c.crossed)
      out << "        time_s: " << number(c.time) << "\n        rate_" << scale.rate_key()
          << ": " << number(scale.interval(c.rate)) << '\n';
    else
      out << "        time_s: null  # not crossed during the run\n";
  }
  if (!any)
    out << " []\n";
}

void windows_yaml(std::ostream& out, const RunResult& result, const std::string& probe,
                  const TemperatureScale& scale) {
  out << "    windows:";
  bool any = false;
  const std::string rate = "_" + scale.rate_key() + ": ";
  for (const auto& w : result.windows) {
    if (w.probe != probe)
      continue;
    out << (any ? "" : "\n");
    any = true;
    out << "      - upper_" << scale.symbol() << ": " << number(scale.value(w.upper))
        << "\n        lower_" << scale.symbol() << ": " << number(scale.value(w.lower))
        << '\n';
    if (!w.entered) {
      out << "        time_inside_s: 0  # never inside during the run\n";
      continue;
    }
    out << "        first_in_s: " << number(w.first_in)
        << "\n        last_in_s: " << number(w.last_in)
        << "\n        passed: " << (w.passed ? "true" : "false")
        << "\n        time_inside_s: " << number(w.time_inside)
        << "\n        mean_cooling_rate" << rate
        << number(scale.interval(w.mean_cooling_rate)) << "\n        max_cooling_rate"
        << rate << number(scale.interval(w.max_cooling_rate)) << '\n';
  }
  if (!any)
    out << " []\n";
}

} // namespace

std::string probe_summary_yaml(const RunResult& result, const TemperatureScale& scale) {
  std::ostringstream out;
  out << "probes:\n";
  if (result.probe_names.empty())
    out << "  {}\n";
  for (std::size_t p = 0; p < result.probe_names.size(); ++p) {
    const std::string& name = result.probe_names[p];
    const auto& history = result.probe_temperatures[p];
    out << "  " << name << ":\n";
    out << "    final_temperature_" << scale.symbol() << ": "
        << number(history.empty() ? 0.0 : scale.value(history.back())) << '\n';
    crossings_yaml(out, result, name, scale);
    windows_yaml(out, result, name, scale);
  }
  return out.str();
}

} // namespace quantacal::solver::detail
