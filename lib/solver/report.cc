// SPDX-License-Identifier: Apache-2.0
// Output files of a run: CSV histories, the summary and the cooling-curve plot.
#include "report.h"

#include <quantacal/common/exceptions.h>

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <ios>
#include <sstream>
#include <system_error>

namespace quantacal::fe::detail {

namespace fs = std::filesystem;

std::string number(double value) {
  return format_double(value);
}

void write_file_atomically(const std::string& path, const std::string& content) {
  const std::string tmp = path + ".tmp";
  {
    std::ofstream out(tmp, std::ios::binary | std::ios::trunc);
    if (!out)
      throw std::ios_base::failure("cannot write " + tmp);
    out << content;
    out.flush();
    if (!out)
      throw std::ios_base::failure("writing " + tmp + " failed (disk full?)");
  }
  std::error_code ec;
  fs::rename(tmp, path, ec);
  if (ec) {
    fs::remove(tmp, ec);
    throw std::ios_base::failure("cannot rename " + tmp + " to " + path);
  }
}

void prepare_output_folder(const std::string& folder, const std::string& case_file,
                           const CaseLocation& where) {
  std::error_code ec;
  fs::create_directories(folder, ec);
  if (ec || !fs::is_directory(folder))
    throw CardError(case_file, where.line, where.column,
                    where.field.empty() ? "output.folder" : where.field, where.value,
                    "expected a folder that can be created and written (" + folder +
                        ": " + (ec ? ec.message() : std::string("not a folder")) + ")");
  const std::string probe = (fs::path(folder) / ".quantacal-write-check").string();
  {
    std::ofstream out(probe, std::ios::trunc);
    if (!(out << "x") || !(out.flush())) {
      throw CardError(case_file, where.line, where.column,
                      where.field.empty() ? "output.folder" : where.field, where.value,
                      "expected a writable folder (" + folder + " cannot be written)");
    }
  }
  fs::remove(probe, ec);
}

std::string probes_csv(const RunResult& r) {
  std::ostringstream out;
  out << "time_s";
  for (const auto& n : r.probe_names)
    out << ',' << n;
  out << '\n';
  for (std::size_t k = 0; k < r.times.size(); ++k) {
    out << number(r.times[k]);
    for (std::size_t p = 0; p < r.probe_names.size(); ++p)
      out << ',' << number(r.probe_temperatures[p][k]);
    out << '\n';
  }
  return out.str();
}

std::string energy_csv(const RunResult& r) {
  std::ostringstream out;
  out << "time_s,stored_energy_J,boundary_heat_J,source_heat_J,relative_imbalance\n";
  for (const auto& e : r.energy)
    out << number(e.time) << ',' << number(e.stored_energy) << ','
        << number(e.boundary_heat) << ',' << number(e.source_heat) << ','
        << number(e.relative_imbalance) << '\n';
  return out.str();
}

std::vector<Crossing> find_crossings(const RunResult& r,
                                     const std::vector<double>& temps) {
  std::vector<Crossing> out;
  for (std::size_t p = 0; p < r.probe_names.size(); ++p) {
    const auto& T = r.probe_temperatures[p];
    for (const double tc : temps) {
      Crossing c;
      c.probe = r.probe_names[p];
      c.temperature = tc;
      for (std::size_t k = 0; k + 1 < T.size(); ++k) {
        const double a = T[k] - tc, b = T[k + 1] - tc;
        if (a == 0.0 && b == 0.0)
          continue;
        if ((a > 0.0 && b <= 0.0) || (a < 0.0 && b >= 0.0)) {
          const double s = a / (a - b);
          const double dt = r.times[k + 1] - r.times[k];
          c.crossed = true;
          c.time = r.times[k] + s * dt;
          c.rate = (T[k + 1] - T[k]) / dt;
          break;
        }
      }
      out.push_back(c);
    }
  }
  return out;
}

namespace {
std::string quoted(const std::string& s) {
  std::string o = "\"";
  for (const char ch : s) {
    if (ch == '"' || ch == '\\')
      o += '\\';
    o += ch;
  }
  return o + "\"";
}
const char* geometry_name(Geometry g) {
  switch (g) {
  case Geometry::planar:
    return "planar";
  case Geometry::axisymmetric:
    return "axisymmetric";
  default:
    return "solid";
  }
}
} // namespace

std::string summary_yaml(const CaseDescription& d, const RunResult& r) {
  std::ostringstream o;
  o << "# quantacal run summary. SI units: s, K, J (planar 2D: J per metre of depth).\n";
  o << "caution: " << quoted(run_caution()) << '\n';
  o << "case: " << quoted(d.name) << '\n';
  o << "case_file: " << quoted(d.file) << '\n';
  o << "geometry: " << geometry_name(d.geometry) << '\n';
  o << "formulation: "
    << (d.solver.formulation == Formulation::energy ? "energy" : "capacity") << '\n';
  o << "time_integration: TR-BDF2\n";
  o << "status: " << (r.completed ? "completed" : "stopped") << '\n';
  if (!r.completed)
    o << "stop_reason: " << quoted(r.stop_reason) << '\n';
  o << "end_time_s: " << number(r.times.empty() ? 0.0 : r.times.back()) << '\n';
  o << "mesh:\n  cells: " << r.n_cells << "\n  dofs: " << r.n_dofs
    << "\n  degree: " << d.solver.degree << '\n';
  o << "ranks: " << r.n_ranks << '\n';
  o << "steps:\n  accepted: " << r.steps.n_steps << "\n  rejected: " << r.steps.n_rejected
    << "\n  newton_iterations: " << r.steps.n_newton_iterations
    << "\n  linear_iterations: " << r.steps.n_linear_iterations
    << "\n  smallest_step_s: " << number(r.steps.smallest_step)
    << "\n  largest_step_s: " << number(r.steps.largest_step) << '\n';
  o << "wall_time_s:\n  setup: " << number(r.timings.setup)
    << "\n  assembly: " << number(r.timings.assembly)
    << "\n  material_evaluation: " << number(r.timings.material_evaluation)
    << "\n  linear_solve: " << number(r.timings.linear_solve)
    << "\n  output: " << number(r.timings.output)
    << "\n  total: " << number(r.timings.total) << '\n';
  o << "worst_relative_imbalance: " << number(r.worst_relative_imbalance) << '\n';
  if (!r.energy.empty()) {
    const auto& e = r.energy.back();
    o << "energy:\n  stored_change_J: "
      << number(e.stored_energy - r.energy.front().stored_energy)
      << "\n  boundary_heat_J: " << number(e.boundary_heat)
      << "\n  source_heat_J: " << number(e.source_heat) << '\n';
  }
  o << "final_temperature_K:\n  minimum: " << number(r.minimum_temperature)
    << "\n  maximum: " << number(r.maximum_temperature) << '\n';
  o << "probes:\n";
  if (r.probe_names.empty())
    o << "  {}\n";
  for (std::size_t p = 0; p < r.probe_names.size(); ++p) {
    o << "  " << r.probe_names[p] << ":\n";
    o << "    final_temperature_K: "
      << number(r.probe_temperatures[p].empty() ? 0.0 : r.probe_temperatures[p].back())
      << '\n';
    o << "    crossings:";
    bool any = false;
    for (const auto& c : r.crossings) {
      if (c.probe != r.probe_names[p])
        continue;
      if (!any)
        o << '\n';
      any = true;
      o << "      - temperature_K: " << number(c.temperature) << '\n';
      if (c.crossed)
        o << "        time_s: " << number(c.time)
          << "\n        rate_K_per_s: " << number(c.rate) << '\n';
      else
        o << "        time_s: null  # not crossed during the run\n";
    }
    if (!any)
      o << " []\n";
  }
  return o.str();
}

std::string plot_cooling_curves(const std::string& folder, const RunResult& r,
                                const std::string& title,
                                std::vector<std::string>& written) {
  if (r.probe_names.empty())
    return "";
  std::ostringstream gp;
  std::string safe_title = title;
  std::replace(safe_title.begin(), safe_title.end(), '"', '\'');
  gp << "# gnuplot script written by quantacal run; rerun with: gnuplot "
        "cooling_curves.gp\n"
     << "set terminal svg size 900,600 dynamic noenhanced font 'sans,12'\n"
     << "set output 'cooling_curves.svg.tmp'\n"
     << "set datafile separator ','\n"
     << "set key autotitle columnhead\n"
     << "set title \"" << safe_title << " (estimates: check against measurements)\"\n"
     << "set xlabel 'time (s)'\nset ylabel 'temperature (K)'\nset grid\n"
     << "plot for [i=2:" << (r.probe_names.size() + 1)
     << "] 'probes.csv' using 1:i with lines linewidth 2\n";
  const std::string script = (fs::path(folder) / "cooling_curves.gp").string();
  write_file_atomically(script, gp.str());
  written.push_back(script);
  const std::string cmd =
      "cd '" + folder + "' && gnuplot cooling_curves.gp > /dev/null 2>&1";
  if (std::system("command -v gnuplot > /dev/null 2>&1") != 0)
    return "gnuplot not found: cooling_curves.svg not made (the script cooling_curves.gp "
           "is written)";
  if (std::system(cmd.c_str()) != 0)
    return "gnuplot failed: cooling_curves.svg not made";
  std::error_code ec;
  const fs::path tmp = fs::path(folder) / "cooling_curves.svg.tmp";
  const fs::path svg = fs::path(folder) / "cooling_curves.svg";
  fs::rename(tmp, svg, ec);
  if (ec)
    return "cannot rename cooling_curves.svg.tmp";
  written.push_back(svg.string());
  return "";
}

} // namespace quantacal::fe::detail
