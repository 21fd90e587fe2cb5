// SPDX-License-Identifier: Apache-2.0
// Internal: one TR-BDF2 step (trbdf2.h) from the current time level: the
// trapezoidal stage to t + gamma h, the BDF2 stage to t + h (each a Newton
// solve, newton.h), the check that the new field is physical, and the local
// error estimate of the step-size control.
#ifndef QUANTACAL_LIB_SOLVER_TIME_STEPPER_H
#define QUANTACAL_LIB_SOLVER_TIME_STEPPER_H

#include "energy_ledger.h"
#include "newton.h"
#include "step_control.h"

#include <vector>

namespace quantacal::solver::detail {

/** The scalars the next step needs besides the level vectors (TimeStepper::state). */
struct StepperState {
  AssembledSums sums;         ///< at the current level
  double previous_step = 0.0; ///< h of the last accepted step, s
  bool has_previous = false;  ///< the previous level vector holds the level before
};

template <int dim>
class TimeStepper {
public:
  TimeStepper(const CaseDescription& description,
              const Discretization<dim>& discretization, StageSolver<dim>& stages);

  /**
   * The state at the start: the temperature field and, assembled there, its stored
   * energy, heat flow and sums.
   */
  void start(const Vector& temperature, const Vector& stored_energy,
             const Vector& heat_flow, const AssembledSums& sums);

  /**
   * Solves both stages of @p plan from the current level; the result is kept for
   * error_estimate() and accept().
   * @return what the step adds to the energy ledger
   * @throws StageFailure if a stage fails or the new field has T <= 0 somewhere
   */
  StepHeat attempt(const StepPlan& plan);

  /**
   * Milne-type estimate of the local error, K (max over the nodes): the new field
   * against the quadratic through the previous, current and stage fields
   * extrapolated to the new time (linear through the current and stage fields when
   * there is no previous step, which overestimates and so starts safely).
   */
  double error_estimate(const StepPlan& plan) const;

  /** Makes the attempted step the current level. */
  void accept();

  /** The temperature at the end of the last attempted step (owned entries). */
  const Vector& attempted_temperature() const { return end_; }
  /** The temperature at the stage point of the last attempted step (owned entries). */
  const Vector& stage_temperature() const { return stage_; }
  /** The temperature at the current level (owned entries). */
  const Vector& temperature() const { return current_; }
  /** The sums assembled at the current level. */
  const AssembledSums& sums() const { return current_sums_; }

  using State = StepperState;
  State state() const { return {current_sums_, previous_step_, has_previous_}; }
  void restore(const State& state) {
    current_sums_ = state.sums;
    previous_step_ = state.previous_step;
    has_previous_ = state.has_previous;
  }
  /**
   * The vectors the next step needs (owned entries), in a fixed order: the current
   * level, the previous one (for the extrapolated guesses and the error estimate),
   * and the stored energy and heat flow assembled at the current level. A
   * checkpoint saves them and a resumed run reads them back in place.
   */
  std::vector<Vector*> level_vectors() {
    return {&current_, &previous_, &current_energy_, &current_flow_};
  }

private:
  /** The quadratic (or linear) extrapolation of error_estimate() into @p out. */
  void extrapolate_to_end(const StepPlan& plan, Vector& out) const;

  const CaseDescription& description_;
  const Discretization<dim>& discretization_;
  StageSolver<dim>& stages_;
  const bool capacity_form_;
  Vector current_, previous_, stage_, end_;
  Vector current_energy_, current_flow_, stage_energy_, stage_flow_, end_energy_,
      end_flow_;
  Vector known_, capacity_reference_;
  AssembledSums current_sums_, end_sums_;
  double attempted_step_ = 0.0; ///< h of the last attempt, s
  double previous_step_ = 0.0;  ///< h of the last accepted step, s
  bool has_previous_ = false;   ///< previous_ holds the level before current_
};

} // namespace quantacal::solver::detail

#endif
