// SPDX-License-Identifier: Apache-2.0
// Result files of a run: CSV histories, the summary and the cooling-curve script.
#include "result_files.h"

#include <quantacal/common/exceptions.h>

#include <algorithm>
#include <cmath>
#include <filesystem>
#include <fstream>
#include <ios>
#include <sstream>
#include <system_error>

namespace quantacal::solver::detail {

namespace fs = std::filesystem;

std::string number(double value) {
  return format_double(value);
}

void prepare_output_folder(const std::string& folder, const std::string& case_file,
                           const CaseLocation& where) {
  std::error_code ec;
  fs::create_directories(folder, ec);
  if (ec || !fs::is_directory(folder))
    throw InputError(case_file, where.line, where.column,
                     where.field.empty() ? "output.folder" : where.field, where.value,
                     "expected a folder that can be created and written (" + folder +
                         ": " + (ec ? ec.message() : std::string("not a folder")) + ")");
  const std::string probe = (fs::path(folder) / ".quantacal-write-check").string();
  {
    std::ofstream out(probe, std::ios::trunc);
    if (!(out << "x") || !(out.flush())) {
      throw InputError(case_file, where.line, where.column,
                       where.field.empty() ? "output.folder" : where.field, where.value,
                       "expected a writable folder (" + folder + " cannot be written)");
    }
  }
  fs::remove(probe, ec);
}

std::string probes_csv(const RunResult& result) {
  std::ostringstream out;
  out << "time_s";
  for (const auto& name : result.probe_names)
    out << ',' << name;
  out << '\n';
  for (std::size_t k = 0; k < result.times.size(); ++k) {
    out << number(result.times[k]);
    for (std::size_t p = 0; p < result.probe_names.size(); ++p)
      out << ',' << number(result.probe_temperatures[p][k]);
    out << '\n';
  }
  return out.str();
}

std::string energy_csv(const RunResult& result) {
  std::ostringstream out;
  out << "time_s,stored_energy_J,boundary_heat_J,source_heat_J,relative_imbalance\n";
  for (const auto& row : result.energy)
    out << number(row.time) << ',' << number(row.stored_energy) << ','
        << number(row.boundary_heat) << ',' << number(row.source_heat) << ','
        << number(row.relative_imbalance) << '\n';
  return out.str();
}

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
          crossing.rate = (history[k + 1] - history[k]) / interval;
          break;
        }
      }
      out.push_back(crossing);
    }
  }
  return out;
}

std::string quoted(const std::string& text) {
  std::string out = "\"";
  for (const char ch : text) {
    if (ch == '"' || ch == '\\')
      out += '\\';
    out += ch;
  }
  return out + "\"";
}

namespace {
const char* geometry_name(Geometry geometry) {
  switch (geometry) {
  case Geometry::planar:
    return "planar";
  case Geometry::axisymmetric:
    return "axisymmetric";
  default:
    return "solid";
  }
}
} // namespace

std::string summary_yaml(const CaseDescription& description, const RunResult& result) {
  std::ostringstream out;
  out << "# quantacal run summary. SI units: s, K, J (planar 2D: J per metre of "
         "depth).\n";
  out << "caution: " << quoted(run_caution()) << '\n';
  out << "case: " << quoted(description.name) << '\n';
  out << "case_file: " << quoted(description.file) << '\n';
  out << "geometry: " << geometry_name(description.geometry) << '\n';
  out << "formulation: "
      << (description.solver.formulation == Formulation::energy ? "energy" : "capacity")
      << '\n';
  out << "time_integration: TR-BDF2\n";
  out << "status: " << (result.completed ? "completed" : "stopped") << '\n';
  if (!result.completed)
    out << "stop_reason: " << quoted(result.stop_reason) << '\n';
  out << "end_time_s: " << number(result.times.empty() ? 0.0 : result.times.back())
      << '\n';
  out << "mesh:\n  cells: " << result.n_cells << "\n  dofs: " << result.n_dofs
      << "\n  degree: " << description.solver.degree << '\n';
  out << "ranks: " << result.n_ranks << '\n';
  out << "steps:\n  accepted: " << result.steps.n_steps
      << "\n  rejected: " << result.steps.n_rejected
      << "\n  newton_iterations: " << result.steps.n_newton_iterations
      << "\n  linear_iterations: " << result.steps.n_linear_iterations
      << "\n  jacobian_assemblies: " << result.steps.n_jacobian_assemblies
      << "\n  residual_assemblies: " << result.steps.n_residual_assemblies
      << "\n  smallest_step_s: " << number(result.steps.smallest_step)
      << "\n  largest_step_s: " << number(result.steps.largest_step) << '\n';
  out << "wall_time_s:\n  setup: " << number(result.timings.setup)
      << "\n  assembly: " << number(result.timings.assembly)
      << "\n  material_evaluation: " << number(result.timings.material_evaluation)
      << "\n  linear_solve: " << number(result.timings.linear_solve)
      << "\n  preconditioner: " << number(result.timings.preconditioner)
      << "\n  output: " << number(result.timings.output)
      << "\n  total: " << number(result.timings.total) << '\n';
  out << "worst_relative_imbalance: " << number(result.worst_relative_imbalance) << '\n';
  if (!result.energy.empty()) {
    const auto& e = result.energy.back();
    out << "energy:\n  stored_change_J: "
        << number(e.stored_energy - result.energy.front().stored_energy)
        << "\n  boundary_heat_J: " << number(e.boundary_heat)
        << "\n  source_heat_J: " << number(e.source_heat) << '\n';
  }
  out << "warnings:";
  if (result.warnings.empty())
    out << " []\n";
  else
    out << '\n';
  for (const std::string& w : result.warnings)
    out << "  - " << quoted(w) << '\n';
  out << "final_temperature_K:\n  minimum: " << number(result.minimum_temperature)
      << "\n  maximum: " << number(result.maximum_temperature) << '\n';
  out << "probes:\n";
  if (result.probe_names.empty())
    out << "  {}\n";
  for (std::size_t p = 0; p < result.probe_names.size(); ++p) {
    out << "  " << result.probe_names[p] << ":\n";
    out << "    final_temperature_K: "
        << number(result.probe_temperatures[p].empty()
                      ? 0.0
                      : result.probe_temperatures[p].back())
        << '\n';
    out << "    crossings:";
    bool any = false;
    for (const auto& c : result.crossings) {
      if (c.probe != result.probe_names[p])
        continue;
      if (!any)
        out << '\n';
      any = true;
      out << "      - temperature_K: " << number(c.temperature) << '\n';
      if (c.crossed)
        out << "        time_s: " << number(c.time)
            << "\n        rate_K_per_s: " << number(c.rate) << '\n';
      else
        out << "        time_s: null  # not crossed during the run\n";
    }
    if (!any)
      out << " []\n";
  }
  return out.str();
}

std::string write_plot_script(const std::string& folder, const RunResult& result,
                              const std::string& title,
                              std::vector<std::string>& written) {
  if (result.probe_names.empty())
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
     << "plot for [i=2:" << (result.probe_names.size() + 1)
     << "] 'probes.csv' using 1:i with lines linewidth 2\n";
  const std::string script = (fs::path(folder) / "cooling_curves.gp").string();
  write_file_atomically(script, gp.str());
  written.push_back(script);
  return script;
}

} // namespace quantacal::solver::detail
