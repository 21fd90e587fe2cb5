// SPDX-License-Identifier: Apache-2.0
// Newton's method for one implicit stage (see newton.h).
#include "newton.h"

#include "wall_clock.h"

#include <deal.II/lac/solver_control.h>
#include <deal.II/lac/solver_gmres.h>
#include <deal.II/lac/trilinos_precondition.h>

#include <algorithm>
#include <cmath>
#include <sstream>

namespace quantacal::solver::detail {

using namespace dealii;

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

// The residual R = M(T) - known - beta h F(T) at @p temperature (with the Jacobian),
// its norm over the free rows, the scale of the stage (its change of stored energy)
// and the round-off floor of both.
template <int dim>
typename StageSolver<dim>::Evaluation
StageSolver<dim>::evaluate(const Vector& temperature, const Stage& stage,
                           const Vector& start_energy) {
  const auto start = Clock::now();
  ghosted_ = temperature;
  Evaluation evaluation;
  evaluation.sums =
      assembler_.assemble(ghosted_, stage.time, stage.beta_h,
                          stage.capacity_reference ? &reference_ghosted_ : nullptr, true);
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
  return evaluation;
}

// J update = -R on the free rows, by GMRES with ML AMG, to a tolerance relative to
// the residual (not below what Newton's target needs).
template <int dim>
void StageSolver<dim>::solve_linear(double residual_norm, double target) {
  const auto start = Clock::now();
  Vector rhs(free_residual_);
  rhs *= -1.0;
  update_ = 0;
  const double tolerance = std::min(
      1e-4 * residual_norm,
      std::max(description_.solver.linear_tolerance * residual_norm, 0.1 * target));
  SolverControl control(2000, std::max(tolerance, 1e-300));
  TrilinosWrappers::PreconditionAMG amg;
  TrilinosWrappers::PreconditionAMG::AdditionalData amg_data;
  amg_data.elliptic = true;
  amg_data.higher_order_elements = discretization_.fe.degree > 1;
  amg_data.smoother_sweeps = 2;
  amg_data.aggregation_threshold = 0.02;
  amg.initialize(discretization_.jacobian, amg_data);
  SolverGMRES<Vector> gmres(control, SolverGMRES<Vector>::AdditionalData(60));
  try {
    gmres.solve(discretization_.jacobian, update_, rhs, amg);
  } catch (const std::exception&) {
    counters_.steps.n_linear_iterations += control.last_step();
    counters_.timings.linear_solve += seconds_since(start);
    throw StageFailure{
        std::string("the linear solver failed: ") +
        (control.last_value() == control.last_value() ? "no convergence" : "NaN")};
  }
  counters_.steps.n_linear_iterations += control.last_step();
  counters_.timings.linear_solve += seconds_since(start);
  for (const auto& [i, b] : discretization_.fixed_dofs)
    update_[i] = 0.0;
  update_.compress(VectorOperation::insert);
}

// Backtracking: the first of the step lengths 1, 1/2, ..., 1/16 that does not raise
// the residual (the last one is taken whatever it gives, as is any step once the
// update is at round-off level or the residual meets the target).
template <int dim>
typename StageSolver<dim>::Evaluation
StageSolver<dim>::line_search(Vector& temperature, const Stage& stage,
                              const Vector& start_energy, double norm,
                              bool roundoff_update) {
  const double tolerance = description_.solver.newton_tolerance;
  double alpha = 1.0;
  std::string last_problem;
  for (int attempt = 0; attempt < 5; ++attempt) {
    trial_ = temperature;
    trial_.add(alpha, update_);
    try {
      const Evaluation evaluation = evaluate(trial_, stage, start_energy);
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
  if (stage.capacity_reference)
    reference_ghosted_ = *stage.capacity_reference;
  discretization_.apply_fixed_temperatures(temperature, description_, stage.time);
  Evaluation current = evaluate(temperature, stage, stored_energy);
  const unsigned int max_iterations = description_.solver.max_newton_iterations;
  for (unsigned int it = 0;; ++it) {
    if (!std::isfinite(current.norm))
      throw StageFailure{"the residual is not finite (NaN or inf)"};
    const double target =
        description_.solver.newton_tolerance * current.scale + current.floor;
    if (current.norm <= target && it > 0)
      break;
    if (current.norm <= 1e-300)
      break;
    if (it >= max_iterations) {
      std::ostringstream message;
      message << "Newton did not converge in " << max_iterations
              << " iterations (residual " << current.norm << ", target " << target << ")";
      throw StageFailure{message.str()};
    }
    solve_linear(current.norm, target);
    ++counters_.steps.n_newton_iterations;
    // an update at the round-off level of the temperatures: nothing more to gain
    const bool roundoff_update =
        update_.linfty_norm() <= 1e-13 * temperature.linfty_norm();
    current =
        line_search(temperature, stage, stored_energy, current.norm, roundoff_update);
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
