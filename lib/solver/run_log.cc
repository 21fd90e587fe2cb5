// SPDX-License-Identifier: Apache-2.0
// What a run prints: header, log lines, progress line, closing lines.
#include "run_log.h"

#include "temperature_scale.h"

#include <quantacal/common/format.h>

#include <iomanip>
#include <iostream>
#include <sstream>
#include <unistd.h>

namespace quantacal::solver::detail {
namespace {

const char* geometry_text(Geometry geometry) {
  return geometry == Geometry::planar         ? "2D planar"
         : geometry == Geometry::axisymmetric ? "2D axisymmetric"
                                              : "3D";
}

/** "centre 412.3 degC (-8.1 K/s), " for the first probe, or "". */
std::string first_probe(const CaseDescription& description, const RunResult& result) {
  if (result.probe_names.empty() || result.probe_temperatures.front().empty())
    return "";
  const TemperatureScale scale(description.output.temperature_unit);
  std::ostringstream text;
  text << std::fixed << std::setprecision(1) << result.probe_names.front() << ' '
       << scale.value(result.probe_temperatures.front().back()) << ' ' << scale.symbol();
  if (!result.probe_rates.empty() && !result.probe_rates.front().empty())
    text << " (" << std::setprecision(3) << std::defaultfloat
         << scale.interval(result.probe_rates.front().back()) << ' '
         << scale.rate_symbol() << ')';
  text << ", ";
  return text.str();
}

} // namespace

RunLog::RunLog(const RunOptions& options, unsigned int rank, Clock::time_point start)
    : out_(rank == 0 ? options.log : nullptr), start_(start) {
  if (out_ && options.progress) {
    if (out_ == &std::cout)
      terminal_ = isatty(STDOUT_FILENO);
    else if (out_ == &std::cerr)
      terminal_ = isatty(STDERR_FILENO);
  }
}

void RunLog::line(const std::string& text) const {
  if (!out_)
    return;
  if (terminal_ && last_progress_ >= 0)
    *out_ << "\r\033[K";
  *out_ << text << '\n' << std::flush;
}

void RunLog::header(const CaseDescription& description, const RunResult& result,
                    unsigned int degree, bool writing) const {
  if (!out_)
    return;
  std::ostringstream text;
  text << "quantacal run: " << description.name << " ("
       << (description.file.empty() ? "in-code case" : description.file) << ")\n"
       << "  " << geometry_text(description.geometry) << ", " << result.n_cells
       << " cells, " << result.n_dofs << " unknowns (FE_Q" << degree << "), "
       << result.n_ranks << " MPI rank" << (result.n_ranks > 1 ? "s" : "")
       << ", TR-BDF2, "
       << (description.solver.formulation == Formulation::energy ? "energy" : "capacity")
       << " form\n"
       << "  output: "
       << (writing ? description.output.folder + " (temperatures in " +
                         temperature_unit_name(description.output.temperature_unit) + ")"
                   : std::string("(none)"))
       << "\n"
       << "  caution: " << run_caution();
  line(text.str());
}

void RunLog::progress(double time, double step, const CaseDescription& description,
                      const RunResult& result, bool force) {
  if (!out_)
    return;
  const double end_time = description.time.end;
  const StepStatistics& steps = result.steps;
  const double wall = seconds_since(start_);
  if (!force && wall - last_progress_ < (terminal_ ? 0.25 : 5.0))
    return;
  last_progress_ = wall;
  const double fraction = end_time > 0 ? time / end_time : 1.0;
  const double left = fraction > 0 ? wall * (1.0 - fraction) / fraction : 0.0;
  std::ostringstream text;
  text << std::setprecision(4) << "t = " << time << " s of " << end_time << " s, step "
       << step << " s, " << first_probe(description, result) << "steps " << steps.n_steps
       << " (" << steps.n_rejected << " rejected), about " << std::setprecision(2)
       << std::fixed << left << " s left";
  if (terminal_)
    *out_ << "\r\033[K" << text.str() << std::flush;
  else
    *out_ << text.str() << '\n' << std::flush;
}

void RunLog::closing(const CaseDescription& description, const RunResult& result,
                     double time, bool writing) const {
  if (!out_)
    return;
  std::ostringstream text;
  text << (result.completed ? "finished" : "STOPPED") << ": t = " << format_double(time)
       << " s, " << result.steps.n_steps << " steps (" << result.steps.n_rejected
       << " rejected), " << result.steps.n_newton_iterations
       << " Newton iterations, worst relative energy imbalance " << std::scientific
       << std::setprecision(2) << result.worst_relative_imbalance << ", " << std::fixed
       << result.timings.total << " s wall";
  line(text.str());
  for (const std::string& w : result.warnings)
    line("warning: " + w);
  if (writing)
    line("results in " + description.output.folder + " (probes.csv, energy.csv, " +
         "summary.yaml" + (description.output.fields ? ", fields.pvd" : "") +
         (result.plot_scripts.empty() ? "" : ", the gnuplot scripts *.gp") + ")");
}

} // namespace quantacal::solver::detail
