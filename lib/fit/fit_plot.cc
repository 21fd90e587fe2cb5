// SPDX-License-Identifier: Apache-2.0
// `quantacal fit`: the gnuplot script and data files of the plot of data, model and
// relative residuals (the command runs gnuplot on them).
#include <quantacal/fit/fit.h>

#include <quantacal/common/format.h>

#include <cmath>
#include <filesystem>
#include <fstream>
#include <ios>

namespace quantacal::fit {
namespace {

namespace fs = std::filesystem;

/** What the upper panel shows: the most common observable (residuals show every row). */
struct Panel {
  Observable shown = Observable::capacity;
  bool per_mass = false;
};

Panel choose_panel(const FitResult& result) {
  std::size_t counts[3] = {0, 0, 0};
  for (const auto& r : result.residuals)
    ++counts[static_cast<int>(r.point.kind)];
  Panel panel;
  panel.shown = counts[2] > counts[0] && counts[2] > counts[1] ? Observable::conductivity
                : counts[0] >= counts[1]                       ? Observable::capacity
                                         : Observable::energy_increment;
  for (const auto& r : result.residuals)
    if (r.point.kind == panel.shown)
      panel.per_mass = r.point.per_mass;
  return panel;
}

void check_written(std::ofstream& out, const fs::path& path) {
  out.close();
  if (!out)
    throw std::ios_base::failure("cannot write " + path.string());
}

/** Rows T, data, relative residual (%), 1 if the row is of the shown observable. */
void write_data(const FitResult& result, const Panel& panel, const fs::path& path) {
  std::ofstream d(path);
  for (const auto& r : result.residuals)
    d << format_double(r.point.temperature) << ' ' << format_double(r.point.value) << ' '
      << format_double(100 * r.relative) << ' ' << (r.point.kind == panel.shown ? 1 : 0)
      << '\n';
  check_written(d, path);
}

/** The model curve, 200 log-spaced points (energy increments: at the data rows). */
void write_model(const FitResult& result, const Panel& panel, const fs::path& path) {
  std::ofstream m(path);
  const double lo = result.from > 0 ? result.from : 1.0, hi = result.to;
  const int n = 200;
  for (int i = 0; i <= n && panel.shown != Observable::energy_increment; ++i) {
    const double t = lo * std::pow(hi / lo, double(i) / n);
    try {
      double v = 0;
      if (panel.shown == Observable::capacity) {
        v = result.material->model().evaluate(t).capacity;
        if (panel.per_mass)
          v /= result.material->molar_mass();
      } else {
        v = result.material->data().conductivity->evaluate(t).value;
      }
      m << format_double(t) << ' ' << format_double(v) << '\n';
    } catch (const std::exception&) {
      // a point the model cannot evaluate is left out of the curve
    }
  }
  if (panel.shown == Observable::energy_increment)
    for (const auto& r : result.residuals)
      if (r.point.kind == panel.shown)
        m << format_double(r.point.temperature) << ' ' << format_double(r.model) << '\n';
  check_written(m, path);
}

/** @p text as a gnuplot single-quoted string (a quote is doubled). */
std::string gnuplot_string(const std::string& text) {
  std::string out = "'";
  for (char c : text) {
    out.push_back(c);
    if (c == '\'')
      out.push_back('\'');
  }
  return out + "'";
}

void write_script(const FitResult& result, const Panel& panel, const fs::path& path,
                  const std::string& svg_path) {
  const Observable shown = panel.shown;
  const std::string ylabel =
      shown == Observable::capacity ? (panel.per_mass ? "c_p (J/kg/K)" : "c_p (J/mol/K)")
      : shown == Observable::conductivity
          ? "k (W/m/K)"
          : (panel.per_mass ? "e increment (J/kg)" : "e increment (J/mol)");
  std::ofstream g(path);
  g << "set terminal svg size 800,720 dynamic font 'sans,12'\n"
    << "set output " << gnuplot_string(fs::absolute(svg_path).string()) << "\n"
    << "set termoption noenhanced\nset lmargin 12\n"
    << "set multiplot layout 2,1\n"
    << "set logscale xy\nset grid\nset key top left\n"
    << "set xrange [" << format_double(result.from / 1.15) << ":"
    << format_double(result.to * 1.15) << "]\n"
    << "set ylabel '" << ylabel << "'\nset xlabel 'T (K)'\n"
    << "set title 'quantacal fit: data and fitted model'\n"
    << "plot 'model.txt' using 1:2 with lines lw 2 lc rgb '#1f5fa8' title 'model', "
       "'data.txt' using 1:($4 > 0 ? $2 : 1/0) with points pt 7 ps 0.6 lc rgb "
       "'#c0392b' title 'data'\n"
    << "unset logscale y\nset ylabel 'model/data - 1 (%)'\n"
    << "set title 'relative residuals'\nset key off\n"
    << "plot 'data.txt' using 1:3 with impulses lw 1 lc rgb '#c0392b' title "
       "'residual', '' using 1:3 with points pt 7 ps 0.5 lc rgb '#c0392b' title "
       "'residual', 0 lw 1 lc 'black' title 'zero'\n"
    << "unset multiplot\n";
  check_written(g, path);
}

} // namespace

std::string write_plot_script(const FitResult& result, const std::string& folder,
                              const std::string& svg_path) {
  const Panel panel = choose_panel(result);
  const fs::path dir(folder);
  write_data(result, panel, dir / "data.txt");
  write_model(result, panel, dir / "model.txt");
  const fs::path script = dir / "plot.gp";
  write_script(result, panel, script, svg_path);
  return script.string();
}

} // namespace quantacal::fit
