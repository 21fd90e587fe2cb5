// SPDX-License-Identifier: Apache-2.0
// Newton's method for one implicit stage, with a kept Jacobian (see newton.h).
#include "newton.h"

#include "wall_clock.h"

#include <deal.II/lac/solver_control.h>
#include <deal.II/lac/solver_gmres.h>

#include <algorithm>
#include <cmath>
#include <sstream>

namespace quantacal::solver::detail {

using namespace dealii;

namespace {

/// A kept Jacobian is rebuilt when an iteration reduces the residual by less than
/// this factor (a fresh Newton step near the solution reduces it far more; 0.05
/// was the fastest of 0.2, 0.05, 0.01 and 0 on the cases of docs/performance.md).
constexpr double slow_contraction = 0.05;
/// ... or when the stage's beta h differs from the one it was built with by more
/// than this fraction (a new step size)
constexpr double beta_h_change = 0.25;
/// ... or when GMRES needs more than this many times the iterations of the first
/// solve with it, plus linear_slack (its AMG no longer fits the matrix)
constexpr double linear_growth = 2.0;
constexpr unsigned int linear_slack = 10;
/// each linear solve reduces the residual by this factor (inexact Newton, Eisenstat
/// and Walker, SIAM J. Sci. Comput. 17 (1996) 16), or to a tenth of Newton's target
constexpr double forcing = 1e-3;

} // namespace

template <int dim>
StageSolver<dim>::StageSolver(const CaseDescription& description,
                              const Discretization<dim>& discretization,
                              Assembler<dim>& assembler, RunResult& counters)
    : description_(description), discretization_(discretization), assembler_(assembler),
      counters_(counters), ghosted_(discretization.ghosted_vector()),
      reference_ghosted_(discretization.ghosted_vector()),
      residual_(discretization.owned_vector()),
      free_residual_(discretization.owned_vector()),
      update_(discretization.owned_vector()), trial_(discretization.owned_vector()),
      scale_vector_(discretization.owned_vector()) {}

// The residual R = M(T) - known - beta h F(T) at @p temperature (with the Jacobian if
// asked), its norm over the free rows, the scale of the stage (its change of stored
// energy) and the round-off floor of both.
template <int dim>
typename StageSolver<dim>::Evaluation
StageSolver<dim>::evaluate(const Vector& temperature, const Stage& stage,
                           const Vector& start_energy, bool with_jacobian) {
  const auto start = Clock::now();
  ghosted_ = temperature;
  Evaluation evaluation;
  if (with_jacobian)
    have_jacobian_ = false; // overwritten from here on, valid once built
  evaluation.sums = assembler_.assemble(
      ghosted_, stage.time, stage.beta_h,
      stage.capacity_reference ? &reference_ghosted_ : nullptr, with_jacobian);
  ++(with_jacobian ? counters_.steps.n_jacobian_assemblies
                   : counters_.steps.n_residual_assemblies);
  const Vector& stored = assembler_.stored_energy();
  const Vector& flow = assembler_.heat_flow();
  residual_ = stored;
  residual_ -= *stage.known;
  residual_.add(-stage.beta_h, flow);
  free_residual_ = residual_;
  for (const auto& [i, b] : discretization_.fixed_dofs)
    free_residual_[i] = 0.0;
  free_residual_.compress(VectorOperation::insert);
  evaluation.norm = free_residual_.l2_norm();
  // scale: the energy change of this stage, plus a round-off floor
  scale_vector_ = stored;
  if (description_.solver.formulation == Formulation::energy)
    scale_vector_ -= start_energy;
  evaluation.scale = scale_vector_.l2_norm();
  evaluation.floor = 1e-14 * (stored.l2_norm() + assembler_.absolute_energy().l2_norm() +
                              stage.beta_h * flow.l2_norm());
  counters_.timings.assembly += seconds_since(start);
  if (with_jacobian)
    build_preconditioner(stage.beta_h);
  return evaluation;
}

template <int dim>
void StageSolver<dim>::build_preconditioner(double beta_h) {
  const auto start = Clock::now();
  TrilinosWrappers::PreconditionAMG::AdditionalData amg_data;
  amg_data.elliptic = true;
  amg_data.higher_order_elements = discretization_.fe.degree > 1;
  amg_data.smoother_sweeps = 2;
  amg_data.aggregation_threshold = 0.02;
  amg_.initialize(discretization_.jacobian, amg_data);
  have_jacobian_ = true;
  jacobian_beta_h_ = beta_h;
  first_solve_since_build_ = true;
  counters_.timings.preconditioner += seconds_since(start);
}

template <int dim>
bool StageSolver<dim>::jacobian_unfit_for(double beta_h) const {
  return !have_jacobian_ ||
         std::abs(beta_h - jacobian_beta_h_) > beta_h_change * jacobian_beta_h_;
}

// J update = -R on the free rows, by GMRES with the kept AMG, to the forcing factor
// times the residual (not below what Newton's target needs, nor below the case's
// linear tolerance).
template <int dim>
unsigned int StageSolver<dim>::solve_linear(double residual_norm, double target) {
  const auto start = Clock::now();
  Vector rhs(free_residual_);
  rhs *= -1.0;
  update_ = 0;
  const double tolerance = std::max(description_.solver.linear_tolerance * residual_norm,
                                    std::min(forcing * residual_norm, 0.1 * target));
  SolverControl control(2000, std::max(tolerance, 1e-300));
  // right preconditioning: the tolerance bounds the true residual, not the
  // preconditioned one
  SolverGMRES<Vector>::AdditionalData gmres_data(60, true);
  SolverGMRES<Vector> gmres(control, gmres_data);
  try {
    gmres.solve(discretization_.jacobian, update_, rhs, amg_);
  } catch (const std::exception&) {
    counters_.steps.n_linear_iterations += control.last_step();
    counters_.timings.linear_solve += seconds_since(start);
    throw StageFailure{
        std::string("the linear solver failed: ") +
        (control.last_value() == control.last_value() ? "no convergence" : "NaN")};
  }
  const unsigned int iterations = control.last_step();
  counters_.steps.n_linear_iterations += iterations;
  counters_.timings.linear_solve += seconds_since(start);
  for (const auto& [i, b] : discretization_.fixed_dofs)
    update_[i] = 0.0;
  update_.compress(VectorOperation::insert);
  // hanging nodes of an adapted mesh follow their parents (the fixed-temperature
  // lines are homogeneous here: a fixed node's update stays 0)
  if (discretization_.has_hanging_nodes)
    discretization_.constraints.distribute(update_);
  return iterations;
}

// Backtracking: the first of the step lengths 1/2, ..., 1/16 that does not raise
// the residual (the last one is taken whatever it gives, as is any step once the
// update is at round-off level or the residual meets the target).
template <int dim>
typename StageSolver<dim>::Evaluation
StageSolver<dim>::line_search(Vector& temperature, const Stage& stage,
                              const Vector& start_energy, double norm,
                              bool roundoff_update) {
  const double tolerance = description_.solver.newton_tolerance;
  double alpha = 0.5;
  std::string last_problem;
  for (int attempt = 1; attempt < 5; ++attempt) {
    trial_ = temperature;
    trial_.add(alpha, update_);
    try {
      const Evaluation evaluation = evaluate(trial_, stage, start_energy, false);
      if (std::isfinite(evaluation.norm) &&
          (evaluation.norm < norm || attempt == 4 || roundoff_update ||
           evaluation.norm <= tolerance * evaluation.scale + evaluation.floor)) {
        temperature = trial_;
        return evaluation;
      }
    } catch (const StageFailure& failure) {
      last_problem = failure.reason;
    }
    alpha *= 0.5;
  }
  throw StageFailure{last_problem.empty() ? "Newton line search failed" : last_problem};
}

template <int dim>
StageResult StageSolver<dim>::solve(Vector& temperature, const Stage& stage,
                                    Vector& stored_energy, Vector& heat_flow) {
  try {
    return iterate(temperature, stage, stored_energy, heat_flow);
  } catch (const StageFailure&) {
    have_jacobian_ = false; // it may have been built at a failing state
    throw;
  }
}

template <int dim>
StageResult StageSolver<dim>::iterate(Vector& temperature, const Stage& stage,
                                      Vector& stored_energy, Vector& heat_flow) {
  if (stage.capacity_reference)
    reference_ghosted_ = *stage.capacity_reference;
  discretization_.apply_fixed_temperatures(temperature, description_, stage.time);
  bool fresh = jacobian_unfit_for(stage.beta_h);
  Evaluation current = evaluate(temperature, stage, stored_energy, fresh);
  const unsigned int max_iterations = description_.solver.max_newton_iterations;
  for (unsigned int it = 0;; ++it) {
    if (!std::isfinite(current.norm))
      throw StageFailure{"the residual is not finite (NaN or inf)"};
    const double target =
        description_.solver.newton_tolerance * current.scale + current.floor;
    if (current.norm <= target || current.norm <= 1e-300)
      break;
    if (it >= max_iterations) {
      std::ostringstream message;
      message << "Newton did not converge in " << max_iterations
              << " iterations (residual " << current.norm << ", target " << target << ")";
      throw StageFailure{message.str()};
    }
    if (!fresh && jacobian_unfit_for(stage.beta_h)) { // marked stale below
      current = evaluate(temperature, stage, stored_energy, true);
      fresh = true;
      continue; // the same point: its residual again, now with a new Jacobian
    }
    const unsigned int linear = solve_linear(current.norm, target);
    ++counters_.steps.n_newton_iterations;
    if (first_solve_since_build_) {
      fresh_linear_iterations_ = linear;
      first_solve_since_build_ = false;
    } else if (linear > linear_growth * fresh_linear_iterations_ + linear_slack) {
      have_jacobian_ = false; // its AMG no longer fits: rebuild at the next iteration
    }
    // an update at the round-off level of the temperatures: nothing more to gain
    const bool roundoff_update =
        update_.linfty_norm() <= 1e-13 * temperature.linfty_norm();
    // the full step first, residual only
    trial_ = temperature;
    trial_.add(1.0, update_);
    Evaluation full;
    bool full_ok = true;
    try {
      full = evaluate(trial_, stage, stored_energy, false);
    } catch (const StageFailure&) {
      full_ok = false;
    }
    const bool reduced =
        full_ok && std::isfinite(full.norm) &&
        (full.norm < current.norm || roundoff_update ||
         full.norm <= description_.solver.newton_tolerance * full.scale + full.floor);
    if (reduced) {
      temperature = trial_;
      if (!fresh && full.norm > slow_contraction * current.norm)
        have_jacobian_ = false; // a kept Jacobian that contracts slowly: rebuild
      current = full;
    } else if (!fresh) {
      // a kept Jacobian that does not reduce the residual: rebuild it here and retry
      current = evaluate(temperature, stage, stored_energy, true);
      fresh = true;
      continue;
    } else {
      current =
          line_search(temperature, stage, stored_energy, current.norm, roundoff_update);
    }
    fresh = false; // the Jacobian is now older than the iterate
    if (roundoff_update && std::isfinite(current.norm))
      break;
  }
  StageResult result;
  result.sums = current.sums;
  result.reaction = discretization_.reaction_sum(residual_);
  stored_energy = assembler_.stored_energy();
  heat_flow = assembler_.heat_flow();
  return result;
}

template class StageSolver<2>;
template class StageSolver<3>;

} // namespace quantacal::solver::detail
