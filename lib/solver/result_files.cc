// SPDX-License-Identifier: Apache-2.0
// Result files of a run: CSV histories and the summary.
#include "result_files.h"

#include <quantacal/common/exceptions.h>

#include <algorithm>
#include <cmath>
#include <filesystem>
#include <fstream>
#include <ios>
#include <limits>
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

std::string probes_csv(const CaseDescription& description, const RunResult& result) {
  const TemperatureScale scale(description.output.temperature_unit);
  std::ostringstream out;
  out << "time [s]";
  for (const auto& name : result.probe_names)
    out << ',' << name << " [" << scale.symbol() << ']';
  for (const auto& name : result.probe_names)
    out << ',' << name << " dT/dt [" << scale.rate_symbol() << ']';
  out << '\n';
  const double unknown = std::numeric_limits<double>::quiet_NaN();
  for (std::size_t k = 0; k < result.times.size(); ++k) {
    out << number(result.times[k]);
    for (std::size_t p = 0; p < result.probe_names.size(); ++p)
      out << ',' << number(scale.value(result.probe_temperatures[p][k]));
    for (std::size_t p = 0; p < result.probe_names.size(); ++p) {
      const bool known =
          p < result.probe_rates.size() && k < result.probe_rates[p].size();
      out << ',' << number(scale.interval(known ? result.probe_rates[p][k] : unknown));
    }
    out << '\n';
  }
  return out.str();
}

std::string energy_csv(const RunResult& result) {
  std::ostringstream out;
  out << "time_s,stored_energy_J,boundary_heat_J,source_heat_J,remesh_change_J,"
         "relative_imbalance\n";
  for (const auto& row : result.energy)
    out << number(row.time) << ',' << number(row.stored_energy) << ','
        << number(row.boundary_heat) << ',' << number(row.source_heat) << ','
        << number(row.remesh_change) << ',' << number(row.relative_imbalance) << '\n';
  return out.str();
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
  const TemperatureScale scale(description.output.temperature_unit);
  std::ostringstream out;
  out << "# quantacal run summary. Units: s, J (planar 2D: J per metre of depth);\n"
         "# temperatures in temperature_unit (the keys name it too), rates in "
      << scale.rate_symbol() << (scale.rate_symbol() == "K/s" ? " (= degC/s)" : "")
      << ":\n# rate = dT/dt (negative when cooling), cooling rate = -dT/dt "
         "(docs/results.md).\n";
  out << "caution: " << quoted(run_caution()) << '\n';
  out << "temperature_unit: " << scale.symbol() << '\n';
  out << "rate_unit: " << scale.rate_symbol() << '\n';
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
  if (description.adaptivity.enabled)
    out << "  remeshes: " << result.steps.n_remeshes
        << "\n  fewest_dofs: " << result.steps.fewest_dofs
        << "\n  most_dofs: " << result.steps.most_dofs << '\n';
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
        << "\n  source_heat_J: " << number(e.source_heat)
        << "\n  remesh_change_J: " << number(e.remesh_change) << '\n';
  }
  out << "warnings:";
  if (result.warnings.empty())
    out << " []\n";
  else
    out << '\n';
  for (const std::string& w : result.warnings)
    out << "  - " << quoted(w) << '\n';
  out << "final_temperature_" << scale.symbol()
      << ":\n  minimum: " << number(scale.value(result.minimum_temperature))
      << "\n  maximum: " << number(scale.value(result.maximum_temperature)) << '\n';
  out << probe_summary_yaml(result, scale);
  return out.str();
}

} // namespace quantacal::solver::detail
