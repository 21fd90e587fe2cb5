// SPDX-License-Identifier: Apache-2.0
// Helpers of the checkpoint tests (test_checkpoint.cc, test_checkpoint_mpi.cc): a
// small quench with checkpoints, and comparisons of the result files and of
// in-memory results.
#ifndef QUANTACAL_TESTS_FE_CHECKPOINT_SUPPORT_H
#define QUANTACAL_TESTS_FE_CHECKPOINT_SUPPORT_H

#include "cli/cli_support.h"

#include <quantacal/solver/solver.h>

#include <algorithm>
#include <cmath>
#include <string>
#include <vector>

namespace quantacal::test {

/**
 * An axisymmetric aluminium cylinder (lattice properties from its card) quenched
 * by a boiling-curve h(T) for 3 s: about 40 accepted steps, field output every
 * second, a checkpoint every 0.5 s of simulated time, two probes.
 */
inline std::string checkpoint_case(const std::string& folder,
                                   const std::string& mantle_h = "20 kW/m^2/K") {
  return "name: checkpoint test quench\n"
         "geometry: axisymmetric\n"
         "mesh: {generator: cylinder, radius: \"5 mm\", length: \"10 mm\", cells: [2, "
         "4], refinements: 1}\n"
         "materials:\n"
         "  - {id: 1, card: \"" +
         source_path("materials/aluminium.yaml") +
         "\"}\n"
         "initial_temperature: \"500 degC\"\n"
         "boundaries:\n"
         "  - id: 0\n"
         "    convection: {ambient: \"30 degC\", h: [[\"330 K\", \"1.5 kW/m^2/K\"], "
         "[\"400 K\", \"" +
         mantle_h +
         "\"], [\"500 K\", \"2 kW/m^2/K\"]]}\n"
         "  - id: 1\n"
         "    convection: {ambient: \"30 degC\", h: \"800 W/m^2/K\"}\n"
         "time: {end: \"3 s\", first_step: \"0.01 s\", tolerance: \"0.2 K\"}\n"
         "output:\n"
         "  folder: \"" +
         folder +
         "\"\n"
         "  interval: \"1 s\"\n"
         "  checkpoint_interval: \"0.5 s\"\n"
         "  plot: false\n"
         "  probes:\n"
         "    - {name: centre, point: [\"0 mm\", \"5 mm\"]}\n"
         "    - {name: surface, point: [\"5 mm\", \"5 mm\"]}\n"
         "  crossing_temperatures: [\"400 degC\"]\n";
}

/** Largest relative difference of two histories of the same length (else +inf). */
inline double history_distance(const std::vector<double>& a,
                               const std::vector<double>& b) {
  if (a.size() != b.size())
    return HUGE_VAL;
  double worst = 0.0;
  for (std::size_t k = 0; k < a.size(); ++k)
    worst = std::max(worst, std::abs(a[k] - b[k]) / std::max(std::abs(b[k]), 1e-300));
  return worst;
}

/**
 * Largest relative difference of the numbers of two CSV files with the same header
 * and row count (else +inf).
 */
inline double csv_distance(const std::string& a, const std::string& b) {
  const auto rows_a = lines_of(a), rows_b = lines_of(b);
  if (rows_a.size() != rows_b.size() || rows_a.empty() || rows_a[0] != rows_b[0])
    return HUGE_VAL;
  double worst = 0.0;
  for (std::size_t r = 1; r < rows_a.size(); ++r) {
    std::vector<std::string> fa, fb;
    std::string cell;
    std::istringstream la(rows_a[r]), lb(rows_b[r]);
    while (std::getline(la, cell, ','))
      fa.push_back(cell);
    while (std::getline(lb, cell, ','))
      fb.push_back(cell);
    if (fa.size() != fb.size())
      return HUGE_VAL;
    for (std::size_t c = 0; c < fa.size(); ++c) {
      const double x = to_double(fa[c]), y = to_double(fb[c]);
      const double scale = std::max(std::abs(y), 1e-300);
      worst = std::max(worst, x == y ? 0.0 : std::abs(x - y) / scale);
    }
  }
  return worst;
}

/**
 * summary.yaml without the lines that differ between sessions by nature: the wall
 * times (`wall_time_s` and its entries), the path of the case file (each test has
 * its own folder) and, if @p drop_ranks, the rank count.
 */
inline std::string summary_without_wall_times(const std::string& text,
                                              bool drop_ranks = false) {
  std::string out;
  bool in_wall = false;
  for (const std::string& line : lines_of(text)) {
    if (line.rfind("wall_time_s:", 0) == 0) {
      in_wall = true;
      continue;
    }
    if (in_wall && line.rfind("  ", 0) == 0)
      continue;
    in_wall = false;
    if (line.rfind("case_file:", 0) == 0)
      continue;
    if (drop_ranks && line.rfind("ranks:", 0) == 0)
      continue;
    out += line + '\n';
  }
  return out;
}

/** The numbers of a summary (in order of appearance) and its other text. */
struct SummaryNumbers {
  std::string text;            ///< the lines with every number replaced by '#'
  std::vector<double> numbers; ///< the numbers
};

inline SummaryNumbers summary_numbers(const std::string& summary) {
  SummaryNumbers out;
  for (const std::string& line : lines_of(summary)) {
    const auto colon = line.find(": ");
    if (colon != std::string::npos && line.find('"') == std::string::npos) {
      const std::string value = line.substr(colon + 2);
      try {
        out.numbers.push_back(to_double(value));
        out.text += line.substr(0, colon) + ": #\n";
        continue;
      } catch (const std::exception&) {
      }
    }
    out.text += line + '\n';
  }
  return out;
}

/** Largest relative difference of the numbers of two summaries with the same text. */
inline double summary_distance(const std::string& a, const std::string& b) {
  const SummaryNumbers x = summary_numbers(a), y = summary_numbers(b);
  if (x.text != y.text || x.numbers.size() != y.numbers.size())
    return HUGE_VAL;
  return history_distance(x.numbers, y.numbers);
}

/** Largest relative difference of the probe histories and energy rows of two runs. */
inline double result_distance(const solver::RunResult& a, const solver::RunResult& b) {
  if (a.times.size() != b.times.size() || a.energy.size() != b.energy.size() ||
      a.probe_temperatures.size() != b.probe_temperatures.size())
    return HUGE_VAL;
  double worst = history_distance(a.times, b.times);
  for (std::size_t p = 0; p < a.probe_temperatures.size(); ++p)
    worst = std::max(worst,
                     history_distance(a.probe_temperatures[p], b.probe_temperatures[p]));
  for (std::size_t k = 0; k < a.energy.size(); ++k) {
    worst = std::max(
        worst, history_distance({a.energy[k].stored_energy, a.energy[k].boundary_heat},
                                {b.energy[k].stored_energy, b.energy[k].boundary_heat}));
  }
  return worst;
}

} // namespace quantacal::test

#endif
