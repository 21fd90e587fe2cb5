// SPDX-License-Identifier: Apache-2.0
// The run of a case, from the case description to the result files: the
// driver that the other parts of lib/solver serve, in the order of a deal.II
// step program:
//
//   set up   the mesh (mesh.h), the case bound to it (mesh_binding.h), the
//            materials (MaterialField), the discretization (discretization.h)
//            and the probes (probes.h);
//   start    the initial field, its assembly (assembly.h), the first ledger row
//            (energy_ledger.h) and outputs; or, resuming, the state of the last
//            checkpoint (checkpoint.h);
//   advance  TR-BDF2 steps (time_stepper.h, each stage a Newton solve, newton.h)
//            under the step-size control (step_control.h) until the end time,
//            with a new adapted mesh (remesh.h) and a checkpoint where due;
//   finish   the final files (result_files.h, field_output.h) and the closing
//            lines of the log (run_log.h).
#include "assembly.h"
#include "case_errors.h"
#include "case_fingerprint.h"
#include "checkpoint.h"
#include "cooling_rates.h"
#include "discretization.h"
#include "energy_ledger.h"
#include "field_output.h"
#include "mesh.h"
#include "mesh_binding.h"
#include "newton.h"
#include "probes.h"
#include "remesh.h"
#include "result_files.h"
#include "run_log.h"
#include "step_control.h"
#include "time_stepper.h"
#include "transformation_watch.h"
#include "wall_clock.h"

#include <quantacal/common/exceptions.h>
#include <quantacal/fe/material_field.h>
#include <quantacal/solver/solver.h>

#include <deal.II/base/mpi.h>

#include <algorithm>
#include <cmath>
#include <filesystem>
#include <limits>
#include <memory>
#include <sstream>

namespace quantacal::solver {
namespace detail {
namespace {

using namespace dealii;

template <int dim>
class CaseRun {
public:
  CaseRun(const CaseDescription& description, const RunOptions& options);
  RunResult run();

private:
  void prepare_output_folder() const;
  void set_up();
  void build_solvers();
  void start();
  double restore();
  bool advance(double& time);
  bool retry_or_stop(double time, double step);
  void accept(const StepPlan& plan, const StepHeat& heat, double error, double& time);
  void adapt_mesh(double time);
  void count_dofs();
  void finish(double time);
  void record(double time, double stored);
  void write_tables(bool final_write);
  bool checkpoints_enabled() const;
  bool checkpoint_due(double time) const;
  void write_checkpoint_now(double time);
  /** Wall time of this run so far, with the sessions before a resume, s. */
  double wall_seconds() const { return previous_wall_ + seconds_since(start_); }

  const CaseDescription& description_;
  const RunOptions& options_;
  const bool writing_;
  const Clock::time_point start_;
  Discretization<dim> discretization_;
  RunLog log_;
  RunResult result_;
  std::map<types::material_id, double> initial_temperatures_;
  std::map<types::material_id, MaterialPtr> materials_;
  std::map<types::material_id, double> energy_shift_;
  BoundaryBinding boundaries_;
  fe::MaterialField<dim> field_;
  std::unique_ptr<Assembler<dim>> assembler_;
  std::unique_ptr<StageSolver<dim>> stage_solver_;
  std::unique_ptr<TimeStepper<dim>> stepper_;
  std::unique_ptr<ProbeSet<dim>> probes_;
  std::unique_ptr<FieldWriter<dim>> fields_;
  std::unique_ptr<TransformationWatch<dim>> transformations_;
  StepControl control_;
  EnergyLedger ledger_;
  Vector ghosted_temperature_;
  std::string last_failure_;
  // checkpoints (checkpoint.h)
  std::unique_ptr<LoadedCheckpoint> resume_from_; ///< set when resuming, until restored
  std::vector<FingerprintSection> fingerprint_;   ///< of the case and its materials
  unsigned int checkpoint_index_ = 0;             ///< of the last one written
  double next_checkpoint_time_ = std::numeric_limits<double>::infinity(); ///< s
  Clock::time_point last_checkpoint_wall_;
  double previous_wall_ = 0.0; ///< wall time of the sessions before a resume, s
};

template <int dim>
CaseRun<dim>::CaseRun(const CaseDescription& description, const RunOptions& options)
    : description_(description), options_(options), writing_(options.write_output),
      start_(Clock::now()), discretization_(description, options.communicator),
      log_(options, discretization_.rank, start_), control_(description),
      last_checkpoint_wall_(start_) {
  if (description.output.checkpoint_interval > 0)
    next_checkpoint_time_ = description.output.checkpoint_interval;
}

// Rank 0 checks the folder; if it cannot be written, every rank raises the same error.
template <int dim>
void CaseRun<dim>::prepare_output_folder() const {
  if (!writing_)
    return;
  const OutputSpec& out = description_.output;
  int ok = 1;
  if (discretization_.rank == 0) {
    try {
      detail::prepare_output_folder(out.folder, description_.file, out.where);
    } catch (const InputError&) {
      ok = 0;
    }
  }
  ok = Utilities::MPI::min(ok, discretization_.communicator);
  if (!ok)
    detail::prepare_output_folder(out.folder, description_.file, out.where);
}

template <int dim>
void CaseRun<dim>::set_up() {
  build_mesh(description_, discretization_.triangulation,
             resume_from_ ? resume_from_->forest : std::string());
  const MeshIds ids = find_mesh_ids(discretization_.triangulation);
  const MaterialBinding materials = bind_materials(description_, ids, log_);
  if (checkpoints_enabled() || resume_from_) {
    std::map<unsigned int, MaterialPtr> bound;
    for (const auto& [id, material] : materials.materials)
      bound[id] = material;
    fingerprint_ = case_fingerprint(description_, bound);
    if (resume_from_)
      check_fingerprint(description_, *resume_from_, fingerprint_, true);
  }
  initial_temperatures_ = materials.initial_temperatures;
  materials_ = materials.materials;
  field_ = fe::MaterialField<dim>(materials.materials);
  for (const auto& [id, material] : materials.materials)
    energy_shift_[id] = field_.energy(id, initial_temperatures_[id]);
  boundaries_ = bind_boundaries(description_, ids, log_);
  discretization_.setup(description_, boundaries_.fixed);
  build_solvers();
  fields_ = std::make_unique<FieldWriter<dim>>(description_, discretization_, field_,
                                               writing_ && description_.output.fields);
  count_dofs();
  for (const Probe& probe : description_.output.probes)
    result_.probe_names.push_back(probe.name);
  result_.probe_temperatures.assign(probes_->size(), {});
}

// The state at t = 0: the initial temperature everywhere (fixed boundary values apply
// from the first stage on: their jump is heat through the boundary).
template <int dim>
void CaseRun<dim>::start() {
  const Vector initial =
      discretization_.initial_temperature(description_, initial_temperatures_);
  ghosted_temperature_ = initial;
  AssembledSums sums;
  try {
    sums = assembler_->assemble(ghosted_temperature_, 0.0, 0.0, &ghosted_temperature_,
                                false);
  } catch (const StageFailure& failure) {
    throw case_error(description_, description_.initial_where, "initial_temperature",
                     "an initial temperature field the materials accept (" +
                         failure.reason + ")");
  }
  stepper_->start(initial, assembler_->stored_energy(), assembler_->heat_flow(), sums);
  ledger_.start(sums.stored, sums.shift);
  record(0.0, sums.stored);
  result_.timings.setup = seconds_since(start_);
  fields_->write(ghosted_temperature_, 0.0, result_);
  write_tables(false);
}

// The state of the last checkpoint (instead of start()): the level vectors read back
// onto the loaded mesh, the stepper, control, ledger, watch, field series and the
// histories; the probe and energy files are rewritten as of the checkpoint, so
// rows the interrupted run wrote after it are replaced, not repeated.
template <int dim>
double CaseRun<dim>::restore() {
  const LoadedCheckpoint& loaded = *resume_from_;
  const RunState& state = loaded.state;
  if (state.result.probe_names != result_.probe_names)
    throw std::logic_error("checkpoint probes differ from the case's (" + loaded.record +
                           ")");
  read_checkpoint_vectors(discretization_, stepper_->level_vectors());
  stepper_->restore(state.stepper);
  control_.restore(state.control);
  ledger_.restore(state.ledger);
  transformations_->restore(state.transformations);
  fields_->restore(state.fields);
  result_.times = state.result.times;
  result_.probe_temperatures = state.result.probe_temperatures;
  result_.probe_rates = state.result.probe_rates;
  result_.energy = state.result.energy;
  result_.worst_relative_imbalance = state.result.worst_relative_imbalance;
  result_.steps = state.result.steps;
  result_.written_files = state.result.written_files;
  const double setup = seconds_since(start_);
  result_.timings = state.result.timings;
  result_.timings.setup += setup;
  previous_wall_ = state.wall_seconds;
  checkpoint_index_ = state.index;
  next_checkpoint_time_ = state.next_checkpoint_time;
  ghosted_temperature_ = stepper_->temperature();
  std::ostringstream line;
  line << "resumed from " << loaded.folder << " at t = " << format_double(state.time)
       << " s after " << state.result.steps.n_steps << " accepted steps (written on "
       << loaded.ranks << (loaded.ranks == 1 ? " rank" : " ranks") << ")";
  log_.line(line.str());
  write_tables(false);
  resume_from_.reset();
  return state.time;
}

// The parts that hold vectors of the mesh: built at the start and after each remesh.
template <int dim>
void CaseRun<dim>::build_solvers() {
  assembler_ = std::make_unique<Assembler<dim>>(description_, discretization_, field_,
                                                energy_shift_, boundaries_.natural,
                                                result_.timings);
  stage_solver_ = std::make_unique<StageSolver<dim>>(description_, discretization_,
                                                     *assembler_, result_);
  stepper_ =
      std::make_unique<TimeStepper<dim>>(description_, discretization_, *stage_solver_);
  ghosted_temperature_.reinit(discretization_.owned_dofs, discretization_.relevant_dofs,
                              discretization_.communicator);
  probes_ = std::make_unique<ProbeSet<dim>>(description_, discretization_);
  transformations_ =
      std::make_unique<TransformationWatch<dim>>(discretization_, materials_);
}

template <int dim>
void CaseRun<dim>::count_dofs() {
  result_.n_cells = discretization_.triangulation.n_global_active_cells();
  result_.n_dofs = discretization_.dof_handler.n_dofs();
  StepStatistics& steps = result_.steps;
  steps.most_dofs = std::max(steps.most_dofs, result_.n_dofs);
  steps.fewest_dofs = steps.fewest_dofs == 0
                          ? result_.n_dofs
                          : std::min(steps.fewest_dofs, result_.n_dofs);
}

// Every adaptivity.every accepted steps: refine and coarsen where the temperature
// field asks for it (remesh.h), move the current and previous levels to the new mesh,
// assemble the stored energy and heat flow there and book the change of stored
// energy the interpolation made apart from the heat (energy_ledger.h). The ledger row
// of this time, recorded before, stays that of the old mesh.
template <int dim>
void CaseRun<dim>::adapt_mesh(double time) {
  const AdaptivitySpec& spec = description_.adaptivity;
  if (!spec.enabled || result_.steps.n_steps % spec.every != 0 || control_.finished(time))
    return;
  const auto begin = Clock::now();
  const RemeshMarks marks = mark_cells(discretization_, ghosted_temperature_, spec,
                                       description_.mesh.refinements);
  if (!marks.any())
    return;
  const StepperState state = stepper_->state();
  const auto watched = transformations_->reduced_state();
  Vector current = stepper_->temperature();
  Vector previous = *stepper_->level_vectors()[1];
  refine_and_transfer(discretization_, description_, boundaries_.fixed,
                      {&current, &previous});
  build_solvers();
  transformations_->restore(watched);
  ghosted_temperature_ = current;
  AssembledSums sums;
  try {
    sums = assembler_->assemble(ghosted_temperature_, time, 0.0, &ghosted_temperature_,
                                false);
  } catch (const StageFailure& failure) {
    throw NumericalError(
        "quantacal::solver::run_case",
        "the field moved onto the adapted mesh at t = " + format_double(time) +
            " s is not one the materials accept (" + failure.reason + ")");
  }
  stepper_->start(current, assembler_->stored_energy(), assembler_->heat_flow(), sums);
  *stepper_->level_vectors()[1] = previous;
  StepperState moved = state;
  moved.sums = sums;
  stepper_->restore(moved);
  ledger_.add_remesh(sums.stored - state.sums.stored);
  ++result_.steps.n_remeshes;
  count_dofs();
  result_.timings.setup += seconds_since(begin);
}

template <int dim>
void CaseRun<dim>::record(double time, double stored) {
  result_.times.push_back(time);
  const std::vector<double> values = probes_->values(ghosted_temperature_);
  for (std::size_t p = 0; p < values.size(); ++p)
    result_.probe_temperatures[p].push_back(values[p]);
  ledger_.record(time, stored, result_);
}

// One attempt from @p time: accepted (time advances), rejected for its error or a
// failure (retried smaller), or the run stops (false).
template <int dim>
bool CaseRun<dim>::advance(double& time) {
  const TimeSpec& spec = description_.time;
  if (result_.steps.n_steps >= spec.max_steps) {
    result_.stop_reason = "reached time.max_steps = " + std::to_string(spec.max_steps) +
                          " accepted steps at t = " + format_double(time) + " s";
    return false;
  }
  const StepPlan plan = control_.plan(time);
  bool ok = true;
  StepHeat heat;
  try {
    heat = stepper_->attempt(plan);
  } catch (const StageFailure& failure) {
    ok = false;
    last_failure_ = failure.reason;
  }
  double error = 0.0;
  if (ok && spec.adaptive) {
    error = stepper_->error_estimate(plan);
    if (!std::isfinite(error))
      ok = false, last_failure_ = "non-finite error estimate";
  }
  if (ok && control_.rejects(error, plan.step)) {
    ++result_.steps.n_rejected;
    control_.retry_after_error(plan.step, error);
    return true; // an error rejection is control, not a failure
  }
  if (!ok)
    return retry_or_stop(time, plan.step);
  accept(plan, heat, error, time);
  return true;
}

template <int dim>
bool CaseRun<dim>::retry_or_stop(double time, double step) {
  ++result_.steps.n_rejected;
  if (!control_.retry_after_failure(step)) {
    std::ostringstream message;
    message << "stopped at t = " << format_double(time) << " s after "
            << control_.consecutive_rejections()
            << " consecutive rejected steps (last step " << format_double(step)
            << " s; time.max_rejections = " << description_.time.max_rejections
            << ", time.min_step = " << format_double(control_.min_step())
            << " s): " << last_failure_;
    result_.stop_reason = message.str();
    return false;
  }
  log_.line("step rejected at t = " + format_double(time) + " s, step " +
            format_double(step) + " s: " + last_failure_ +
            "; retrying with half the step");
  return true;
}

// Accepts a step: ledger with the TR-BDF2 weights, the new level, statistics, the
// probe and ledger row, the next proposal and the outputs due.
template <int dim>
void CaseRun<dim>::accept(const StepPlan& plan, const StepHeat& heat, double error,
                          double& time) {
  ledger_.add_step(heat);
  transformations_->step(stepper_->temperature(), stepper_->attempted_temperature(),
                         plan.step, plan.end_time);
  record_step_rates(result_, discretization_, *probes_, stepper_->temperature(),
                    stepper_->stage_temperature(), stepper_->attempted_temperature(),
                    plan.step);
  stepper_->accept();
  control_.accept(plan, error);
  time = plan.end_time;
  ghosted_temperature_ = stepper_->temperature();
  StepStatistics& steps = result_.steps;
  ++steps.n_steps;
  if (steps.n_steps == 1 || plan.step < steps.smallest_step)
    steps.smallest_step = plan.step;
  steps.largest_step = std::max(steps.largest_step, plan.step);
  record(time, stepper_->sums().stored);
  const bool output_due = control_.is_output_time(time);
  if (output_due) {
    fields_->write(ghosted_temperature_, time, result_);
    write_tables(false);
  }
  adapt_mesh(time);
  if (checkpoint_due(time))
    write_checkpoint_now(time);
  if (options_.on_step)
    options_.on_step(time, plan.step);
  log_.progress(time, plan.step, description_, result_, output_due);
}

template <int dim>
bool CaseRun<dim>::checkpoints_enabled() const {
  return description_.output.checkpoint_interval > 0 ||
         description_.output.checkpoint_wall_interval > 0;
}

// Due after the first accepted step at or past the next multiple of
// output.checkpoint_interval, or once output.checkpoint_wall_interval of wall time
// has passed (rank 0's clock decides for all); never at the end time.
template <int dim>
bool CaseRun<dim>::checkpoint_due(double time) const {
  if (!writing_ || !checkpoints_enabled() || control_.finished(time))
    return false;
  bool due = time >= next_checkpoint_time_ * (1 - 1e-12);
  const double wall = description_.output.checkpoint_wall_interval;
  if (wall > 0) {
    int wall_due =
        discretization_.rank == 0 && seconds_since(last_checkpoint_wall_) >= wall;
    wall_due = Utilities::MPI::broadcast(discretization_.communicator, wall_due, 0);
    due = due || wall_due;
  }
  return due;
}

// A resumed run starts without a kept Jacobian (newton.h); dropping it here too makes
// the uninterrupted run take the same path, so both give the same numbers.
template <int dim>
void CaseRun<dim>::write_checkpoint_now(double time) {
  const auto begin = Clock::now();
  stage_solver_->forget_jacobian();
  const double interval = description_.output.checkpoint_interval;
  if (interval > 0)
    next_checkpoint_time_ = interval * (std::floor(time / interval * (1 + 1e-12)) + 1);
  ++checkpoint_index_;
  RunState state;
  state.time = time;
  state.index = checkpoint_index_;
  state.next_checkpoint_time = next_checkpoint_time_;
  state.wall_seconds = wall_seconds();
  state.control = control_.state();
  state.ledger = ledger_.state();
  state.stepper = stepper_->state();
  state.transformations = transformations_->reduced_state();
  state.fields = fields_->state();
  state.result.probe_names = result_.probe_names;
  state.result.times = result_.times;
  state.result.probe_temperatures = result_.probe_temperatures;
  state.result.probe_rates = result_.probe_rates;
  state.result.energy = result_.energy;
  state.result.worst_relative_imbalance = result_.worst_relative_imbalance;
  state.result.steps = result_.steps;
  state.result.timings = result_.timings;
  state.result.written_files = result_.written_files;
  write_checkpoint(description_, discretization_, stepper_->level_vectors(), state,
                   fingerprint_, options_.on_checkpoint);
  last_checkpoint_wall_ = Clock::now();
  result_.timings.output += seconds_since(begin);
}

template <int dim>
void CaseRun<dim>::write_tables(bool final_write) {
  if (!writing_ || discretization_.rank != 0)
    return;
  const auto begin = Clock::now();
  const std::filesystem::path folder(description_.output.folder);
  write_file_atomically((folder / "probes.csv").string(),
                        probes_csv(description_, result_));
  write_file_atomically((folder / "energy.csv").string(), energy_csv(result_));
  if (final_write) {
    result_.written_files.push_back((folder / "probes.csv").string());
    result_.written_files.push_back((folder / "energy.csv").string());
    result_.written_files.push_back((folder / "summary.yaml").string());
    result_.timings.total = wall_seconds();
    write_file_atomically((folder / "summary.yaml").string(),
                          summary_yaml(description_, result_));
  }
  result_.timings.output += seconds_since(begin);
}

template <int dim>
void CaseRun<dim>::finish(double time) {
  result_.completed = result_.stop_reason.empty();
  const Vector& temperature = stepper_->temperature();
  double t_min = std::numeric_limits<double>::infinity(), t_max = -t_min;
  for (const auto i : discretization_.owned_dofs) {
    t_min = std::min(t_min, static_cast<double>(temperature[i]));
    t_max = std::max(t_max, static_cast<double>(temperature[i]));
  }
  result_.minimum_temperature = Utilities::MPI::min(t_min, discretization_.communicator);
  result_.maximum_temperature = Utilities::MPI::max(t_max, discretization_.communicator);
  result_.crossings = find_crossings(result_, description_.output.crossing_temperatures);
  result_.windows = find_window_passages(result_, description_.output.windows);
  result_.warnings = transformations_->warnings();
  fields_->write(ghosted_temperature_, time, result_);
  result_.timings.total = wall_seconds();
  write_tables(true);
  if (writing_ && description_.output.plot && discretization_.rank == 0)
    write_plot_scripts(description_, result_);
  log_.closing(description_, result_, time, writing_);
  if (!result_.completed && options_.throw_on_failure)
    throw stopped_run_error(description_, result_, options_);
}

template <int dim>
RunResult CaseRun<dim>::run() {
  result_.n_ranks = discretization_.n_ranks;
  if (options_.resume) {
    // everything is checked before anything is written: the checkpoint's files,
    // then the case against its fingerprint (the materials once they are bound)
    resume_from_ = std::make_unique<LoadedCheckpoint>(
        read_checkpoint(description_, discretization_.communicator));
    check_fingerprint(description_, *resume_from_, case_fingerprint(description_, {}),
                      false);
  }
  prepare_output_folder();
  set_up();
  log_.header(description_, result_, discretization_.fe.degree, writing_);
  double time = 0.0;
  if (resume_from_)
    time = restore();
  else
    start();
  while (!control_.finished(time))
    if (!advance(time))
      break;
  finish(time);
  return result_;
}

} // namespace
} // namespace detail

RunResult run_case(const CaseDescription& description, const RunOptions& options) {
  if (description.solver.degree < 1 || description.solver.degree > 3)
    throw InputError(description.file, 0, 0, "solver.degree",
                     std::to_string(description.solver.degree),
                     "expected a degree 1, 2 or 3");
  if (!(description.time.end > 0) || !(description.time.first_step > 0))
    throw InputError(description.file, description.time.where.line,
                     description.time.where.column, "time", "",
                     "expected time.end > 0 and time.first_step > 0");
  if (description.dimension() == 2)
    return detail::CaseRun<2>(description, options).run();
  return detail::CaseRun<3>(description, options).run();
}

NumericalError stopped_run_error(const CaseDescription& description,
                                 const RunResult& result, const RunOptions& options) {
  return NumericalError("quantacal::solver::run_case",
                        (description.file.empty() ? description.name : description.file) +
                            ": " + result.stop_reason +
                            (options.write_output ? " (results up to that time are in " +
                                                        description.output.folder + ")"
                                                  : std::string()));
}

const char* run_caution() {
  return "Results are estimates from models and published data: check them against "
         "measurements before relying on them. Quench and cryogen work follows local "
         "codes and licensed practice.";
}

} // namespace quantacal::solver
