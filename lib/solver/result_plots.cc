// SPDX-License-Identifier: Apache-2.0
// The gnuplot scripts of a run (result_plots.h).
#include "result_plots.h"

#include "result_files.h"
#include "temperature_scale.h"

#include <algorithm>
#include <cmath>
#include <filesystem>
#include <limits>
#include <sstream>

namespace quantacal::solver::detail {
namespace {

namespace fs = std::filesystem;

const char* const band_colours[] = {"#e9a23b", "#5b8fd6", "#9b6fc3", "#4caf7d"};

/** The lines every script starts with. */
std::string preamble(const std::string& stem, const std::string& title) {
  std::ostringstream gp;
  gp << "# gnuplot script written by quantacal run; rerun in this folder with: gnuplot "
     << stem << ".gp\n"
     << "set datafile separator ','\n"
     << "set key autotitle columnhead\n"
     << "set title " << gnuplot_string(title + " (estimates: check against measurements)")
     << "\nset grid\nset key top right\n";
  return gp.str();
}

/** Plots @p plot into STEM.svg.tmp and again into STEM.png.tmp. */
std::string outputs(const std::string& stem, const std::string& plot) {
  std::ostringstream gp;
  gp << "set terminal svg size 900,540 dynamic noenhanced font 'sans,12' background "
        "rgb 'white'\n"
     << "set output '" << stem << ".svg.tmp'\n"
     << plot << "set terminal pngcairo size 900,540 noenhanced font 'sans,11' "
     << "background rgb 'white'\n"
     << "set output '" << stem << ".png.tmp'\nreplot\nunset output\n";
  return gp.str();
}

/** The windows as bands: horizontal (temperature on y) or vertical (on x). */
std::string window_bands(const CaseDescription& description,
                         const TemperatureScale& scale, bool temperature_on_x) {
  std::ostringstream gp;
  int n = 0;
  for (const TemperatureWindow& w : description.output.windows) {
    const std::string up = number(scale.value(w.upper)),
                      lo = number(scale.value(w.lower));
    const char* colour = band_colours[n % 4];
    ++n;
    const std::string from =
        temperature_on_x ? "first " + up + ", graph 0" : "graph 0, first " + lo;
    const std::string to =
        temperature_on_x ? "first " + lo + ", graph 1" : "graph 1, first " + up;
    gp << "set object " << n << " rect from " << from << " to " << to
       << " behind fillcolor rgb '" << colour
       << "' fillstyle transparent solid 0.18 noborder\n";
    const std::string text = "window " + up + " to " + lo + " " + scale.symbol();
    gp << "set label " << n << ' ' << gnuplot_string(text) << " at "
       << (temperature_on_x ? "first " + up + ", graph 0.97 left offset 0.5,0"
                            : "graph 0.99, first " + up + " right offset 0,-0.8")
       << " textcolor rgb '#555555'\n";
  }
  return gp.str();
}

/** The probe names as one blank-separated gnuplot word list. */
std::string name_words(const RunResult& result) {
  std::string words;
  for (std::string name : result.probe_names) {
    std::replace_if(
        name.begin(), name.end(), [](char c) { return c == ' ' || c == '\''; }, '_');
    words += (words.empty() ? "" : " ") + name;
  }
  return words;
}

std::string cooling_curves(const CaseDescription& description, const RunResult& result,
                           const TemperatureScale& scale) {
  std::ostringstream gp;
  gp << preamble("cooling_curves", description.name) << "set xlabel 'time (s)'\n"
     << "set ylabel 'temperature (" << scale.symbol() << ")'\n"
     << window_bands(description, scale, false);
  std::ostringstream plot;
  plot << "plot for [i=2:" << (result.probe_names.size() + 1)
       << "] 'probes.csv' using 1:i with lines linewidth 2\n";
  return gp.str() + outputs("cooling_curves", plot.str());
}

std::string cooling_rates(const CaseDescription& description, const RunResult& result,
                          const TemperatureScale& scale) {
  double hottest = -std::numeric_limits<double>::infinity(), coldest = -hottest;
  for (const auto& history : result.probe_temperatures)
    for (const double t : history) {
      hottest = std::max(hottest, scale.value(t));
      coldest = std::min(coldest, scale.value(t));
    }
  const std::size_t n = result.probe_names.size();
  std::ostringstream gp;
  gp << preamble("cooling_rates", description.name) << "set xlabel 'temperature ("
     << scale.symbol() << "), falling to the right'\n"
     << "set ylabel 'cooling rate -dT/dt (" << scale.rate_symbol() << ")'\n";
  if (hottest > coldest) // reversed: the hottest on the left
    gp << "set xrange [" << number(hottest) << ':' << number(coldest) << "]\n";
  gp << window_bands(description, scale, true)
     << "names = " << gnuplot_string(name_words(result)) << '\n';
  std::ostringstream plot;
  plot << "plot for [i=1:" << n << "] 'probes.csv' using (column(i+1)):(-column(i+"
       << (n + 1) << ")) with lines linewidth 2 title word(names, i)\n";
  return gp.str() + outputs("cooling_rates", plot.str());
}

/** The 1-based column of @p name in the header of energy.csv. */
int energy_column(const std::string& name) {
  std::istringstream header(energy_csv(RunResult{}));
  std::string cell;
  for (int column = 1; std::getline(header, cell, ',');) {
    if (!cell.empty() && cell.back() == '\n')
      cell.pop_back();
    if (cell == name)
      return column;
    ++column;
  }
  return 0;
}

std::string energy_ledger(const CaseDescription& description, const RunResult& result) {
  const double initial =
      result.energy.empty() ? 0.0 : result.energy.front().stored_energy;
  const bool planar = description.geometry == Geometry::planar;
  const int stored = energy_column("stored_energy_J"),
            boundary = energy_column("boundary_heat_J"),
            source = energy_column("source_heat_J"),
            remesh = energy_column("remesh_change_J"),
            imbalance = energy_column("relative_imbalance");
  std::ostringstream heat;
  heat << "($" << boundary << " + $" << source;
  if (remesh > 0)
    heat << " + $" << remesh;
  heat << ')';
  std::ostringstream gp;
  gp << preamble("energy_ledger", description.name) << "set xlabel 'time (s)'\n"
     << "set ylabel 'energy (" << (planar ? "J/m" : "J") << ")'\n"
     << "set y2label 'relative imbalance'\nset logscale y2\nset format y2 '%.0e'\n"
     << "set ytics nomirror\nset y2tics\nE0 = " << number(initial) << '\n';
  std::ostringstream plot;
  plot << "plot 'energy.csv' using 1:($" << stored
       << " - E0) with lines linewidth 2 title 'stored-energy change', \\\n"
       << "     '' using 1:" << heat.str()
       << " with lines linewidth 2 dashtype 2 title 'heat entered (boundary + sources"
       << (description.adaptivity.enabled ? " + remesh change" : "") << ")', \\\n"
       << "     '' using 1:($" << imbalance << " > 0 ? $" << imbalance
       << " : NaN) axes x1y2 with lines linewidth 1 title 'relative imbalance (right "
          "axis)'\n";
  return gp.str() + outputs("energy_ledger", plot.str());
}

} // namespace

std::string gnuplot_string(const std::string& text) {
  std::string out = "'";
  for (const char c : text) {
    if (c == '\'')
      out += '\'';
    if (c != '\n')
      out += c;
  }
  return out + "'";
}

void write_plot_scripts(const CaseDescription& description, RunResult& result) {
  const TemperatureScale scale(description.output.temperature_unit);
  const fs::path folder(description.output.folder);
  std::vector<std::pair<std::string, std::string>> scripts;
  if (!result.probe_names.empty()) {
    scripts.emplace_back("cooling_curves", cooling_curves(description, result, scale));
    scripts.emplace_back("cooling_rates", cooling_rates(description, result, scale));
  }
  scripts.emplace_back("energy_ledger", energy_ledger(description, result));
  result.plot_script.clear();
  result.plot_scripts.clear();
  for (const auto& [stem, text] : scripts) {
    const std::string path = (folder / (stem + ".gp")).string();
    write_file_atomically(path, text);
    result.written_files.push_back(path);
    result.plot_scripts.push_back(path);
    if (stem == "cooling_curves")
      result.plot_script = path;
  }
}

} // namespace quantacal::solver::detail
