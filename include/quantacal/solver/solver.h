// SPDX-License-Identifier: Apache-2.0
/**
 * @file solver.h
 * @brief The transient heat-conduction engine behind `quantacal run`: runs a
 *        CaseDescription (quantacal/solver/case.h) and returns what it found.
 *
 * The engine solves rho de(T)/dt = div(k(T) grad T) + q in energy form on a
 * parallel::distributed::Triangulation with continuous FE_Q elements of
 * degree 1-3, in 2D planar (per metre of depth), 2D axisymmetric (x = r,
 * y = z, integrals weighted by 2 pi r, so energies are those of the whole
 * body of revolution) and 3D. Time stepping is TR-BDF2 (gamma = 2 - sqrt 2)
 * with an embedded error estimate, step-size control and step rejection;
 * each stage is solved by Newton's method with the consistent Jacobian and
 * GMRES preconditioned by Trilinos ML AMG. The method is documented in
 * docs/cases.md.
 *
 * Everything a test needs is reachable in-process: build or load a
 * CaseDescription, call run_case, inspect the RunResult (probe histories,
 * energy ledger, step statistics, crossing times):
 * @code
 *   #include <quantacal/solver/solver.h>
 *   namespace qs = quantacal::solver;
 *   // MPI initialised, e.g. by dealii::Utilities::MPI::MPI_InitFinalize
 *   const qs::CaseDescription c = qs::load_case("case.yaml");
 *   qs::RunOptions options;
 *   options.write_output = false; // in memory only
 *   const qs::RunResult r = qs::run_case(c, options);
 *   // r.times, r.probe_temperatures, r.energy, r.crossings, r.steps
 * @endcode
 *
 * The header does not include deal.II; only MPI.
 */
#ifndef QUANTACAL_SOLVER_SOLVER_H
#define QUANTACAL_SOLVER_SOLVER_H

#include <quantacal/common/exceptions.h>
#include <quantacal/solver/case.h>

#include <mpi.h>

#include <functional>
#include <iosfwd>
#include <string>
#include <vector>

namespace quantacal::solver {

/** One row of the energy ledger (cumulative from the start). */
struct EnergyRecord {
  double time = 0.0;          ///< s
  double stored_energy = 0.0; ///< J (planar: J/m), relative to the materials' references
  double boundary_heat = 0.0; ///< J that entered through the boundary since the start
  double source_heat = 0.0;   ///< J released by sources since the start
  /// J the interpolation onto adapted meshes added to the stored energy since the
  /// start (AdaptivitySpec; 0 on a fixed mesh): not heat, kept out of the balance
  double remesh_change = 0.0;
  double relative_imbalance = 0.0; ///< |dE - Q_b - Q_s - remesh| / max(|dE|, tiny)
};

/** Time at which a probe first crossed a temperature, and its rate there. */
struct Crossing {
  std::string probe;
  double temperature = 0.0; ///< K
  bool crossed = false;
  double time = 0.0; ///< s (linear interpolation between the samples around it)
  /// dT/dt there, K/s (negative when cooling): the solver's derivative at the two
  /// samples around it (RunResult::probe_rates), interpolated linearly in time
  double rate = 0.0;
};

/**
 * The passage of a probe through a temperature window (OutputSpec::windows): how
 * long it stayed inside and how fast it cooled there. The history is linear in time
 * between samples (as for crossings); docs/results.md gives the definitions.
 */
struct WindowPassage {
  std::string probe;
  double upper = 0.0;       ///< K
  double lower = 0.0;       ///< K
  bool entered = false;     ///< the probe was inside the window at some time
  double first_in = 0.0;    ///< s, first time inside (if entered)
  double last_in = 0.0;     ///< s, last time inside (if entered)
  bool passed = false;      ///< entered, and below the window at the end
  double time_inside = 0.0; ///< s, total time inside
  /// K/s, the temperature fallen inside the window over time_inside (a time average
  /// of -dT/dt; (upper - lower) / time_inside for one monotone passage)
  double mean_cooling_rate = 0.0;
  double max_cooling_rate = 0.0; ///< K/s, largest -dT/dt inside (solver's derivative)
};

/** Counts over the run. */
struct StepStatistics {
  unsigned int n_steps = 0;    ///< accepted steps
  unsigned int n_rejected = 0; ///< rejected attempts (error, Newton failure, range)
  unsigned int n_newton_iterations = 0; ///< over all stages of all attempts
  unsigned int n_linear_iterations = 0; ///< GMRES iterations, total
  /// assemblies with the Jacobian (each followed by an AMG build)
  unsigned int n_jacobian_assemblies = 0;
  unsigned int n_residual_assemblies = 0; ///< assemblies of the residual alone
  double smallest_step = 0.0;             ///< s, accepted
  double largest_step = 0.0;              ///< s, accepted
  unsigned int n_remeshes = 0;            ///< adaptive refinements and coarsenings
  unsigned long long most_dofs = 0;       ///< largest number of unknowns of the run
  unsigned long long fewest_dofs = 0;     ///< smallest number of unknowns of the run
};

/** Wall-clock seconds by phase (rank 0's clock). */
struct PhaseTimes {
  double setup = 0.0;
  double assembly = 0.0;
  double material_evaluation = 0.0; ///< part of `assembly`: MaterialField calls
  double linear_solve = 0.0;        ///< GMRES iterations
  double preconditioner = 0.0;      ///< building the AMG hierarchy of each Jacobian
  double output = 0.0;
  double total = 0.0;
};

/** Everything a run produced (on every rank: the figures are global). */
struct RunResult {
  std::vector<std::string> probe_names;
  std::vector<double> times; ///< s, t = start and each accepted step
  std::vector<std::vector<double>> probe_temperatures; ///< [probe][sample], K
  /// [probe][sample], dT/dt in K/s at the end of each accepted TR-BDF2 step, from its
  /// stage values (docs/results.md); NaN at t = 0, where a quench starts
  std::vector<std::vector<double>> probe_rates;
  std::vector<EnergyRecord> energy; ///< one per entry of `times`
  double worst_relative_imbalance = 0.0;
  std::vector<Crossing> crossings;    ///< per probe, per requested temperature
  std::vector<WindowPassage> windows; ///< per probe, per OutputSpec::windows entry
  StepStatistics steps;
  PhaseTimes timings;
  unsigned long long n_cells = 0;
  unsigned long long n_dofs = 0;
  unsigned int n_ranks = 1;
  double minimum_temperature = 0.0; ///< K, over the nodes at the end
  double maximum_temperature = 0.0; ///< K, over the nodes at the end
  bool completed = false;           ///< reached the end time
  std::string stop_reason;          ///< why it stopped early ("" if completed)
  /// cautions about the results, e.g. an equilibrium transformation crossed
  /// faster than 1 K/s (printed in the log and written to summary.yaml)
  std::vector<std::string> warnings;
  std::vector<std::string> written_files; ///< paths written (rank 0's list)
  /// the gnuplot script cooling_curves.gp if one was written (rank 0), else ""; it
  /// plots probes.csv into cooling_curves.svg.tmp when run in its folder
  std::string plot_script;
  /// every gnuplot script written (rank 0): cooling_curves.gp, cooling_rates.gp,
  /// energy_ledger.gp; each, run in its folder, writes STEM.svg.tmp and STEM.png.tmp
  std::vector<std::string> plot_scripts;
};

/** How run_case behaves around the computation. */
struct RunOptions {
  MPI_Comm communicator = MPI_COMM_WORLD;
  bool write_output = true;    ///< false: compute only (no files)
  std::ostream* log = nullptr; ///< run header and log lines (rank 0); null = silent
  bool progress = true;        ///< one-line progress display when `log` is a terminal
  bool throw_on_failure =
      true; ///< a run that stops early throws NumericalError after writing
  /**
   * Called on every rank after each accepted step and after the outputs and the
   * checkpoint due at it: (time s, step s).
   */
  std::function<void(double, double)> on_step;
  /**
   * Continue from the last complete checkpoint in the output folder
   * (checkpoint.yaml) instead of starting at t = 0; the histories up to it are
   * restored and the result files continued without repeated rows.
   */
  bool resume = false;
  /**
   * Called on every rank at the named points of each checkpoint write:
   * "written" (every file is in the temporary folder checkpoint-NNNNNN.tmp),
   * "renamed" (the folder has its final name, checkpoint.yaml still names the
   * previous one) and "committed" (checkpoint.yaml names the new one). For tests
   * that interrupt a run there.
   */
  std::function<void(const std::string&)> on_checkpoint;
};

/**
 * Runs @p description. Collective over options.communicator (MPI must be
 * initialised, e.g. by dealii::Utilities::MPI::MPI_InitFinalize).
 *
 * Output files (if write_output), each written to a temporary name and renamed:
 * probes.csv, energy.csv, summary.yaml, fields-NNNN.pvtu/.vtu with fields.pvd
 * (if output.fields) and the gnuplot script cooling_curves.gp (if output.plot
 * and there are probes). The library starts no other program: making
 * cooling_curves.svg from the script is the caller's step (`quantacal run`
 * does it).
 *
 * @throws InputError for inconsistencies found against the mesh (boundary id or
 *         material id not in the mesh, a material id without a card, a probe
 *         outside the mesh, a missing mesh file), with the case file location
 * With output.checkpoint_interval or output.checkpoint_wall_interval, checkpoints
 * are written into the output folder (checkpoint.yaml and the folder
 * checkpoint-NNNNNN it names); RunOptions::resume continues from the last one.
 *
 * @throws InputError with options.resume: no checkpoint, a damaged one (the file
 *         and what is wrong), or one written for another case (located at the
 *         section of the case file that differs); nothing is written then
 * @throws NumericalError if the run stops early and throw_on_failure (outputs
 *         written so far are complete files): stopped_run_error()
 * @throws std::ios_base::failure if the output folder cannot be written
 */
RunResult run_case(const CaseDescription& description, const RunOptions& options = {});

/**
 * The error run_case throws for a run that stopped early when
 * RunOptions::throw_on_failure is set: the case, the stop reason and where
 * the results so far are. For a caller that runs with throw_on_failure unset,
 * does its own work on the partial results, then throws it.
 */
NumericalError stopped_run_error(const CaseDescription& description,
                                 const RunResult& result, const RunOptions& options);

/** The caution printed in run headers and written to summary.yaml. */
const char* run_caution();

/**
 * Writes report.html into the output folder of @p description: one self-contained
 * page (inline CSS and SVG, no external resources) with the case, its materials
 * (card sources, valid ranges), boundary conditions, mesh, solver statistics, the
 * plots found in the folder (STEM.svg made from RunResult::plot_scripts; a note
 * where one is missing), the window and crossing metrics, the energy ledger and the
 * cautions (docs/results.md). Written to a temporary name and renamed. Call it on
 * one rank after making the plots; `quantacal run` does.
 * @return the report's path
 * @throws std::ios_base::failure if it cannot be written
 */
std::string write_report(const CaseDescription& description, const RunResult& result);

} // namespace quantacal::solver

#endif
