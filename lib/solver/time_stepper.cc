// SPDX-License-Identifier: Apache-2.0
// One TR-BDF2 step: two stage solves and the error estimate (see time_stepper.h).
#include "time_stepper.h"

#include "trbdf2.h"

#include <deal.II/base/mpi.h>

#include <algorithm>
#include <cmath>
#include <limits>

namespace quantacal::solver::detail {

using namespace dealii;

template <int dim>
TimeStepper<dim>::TimeStepper(const CaseDescription& description,
                              const Discretization<dim>& discretization,
                              StageSolver<dim>& stages)
    : description_(description), discretization_(discretization), stages_(stages),
      capacity_form_(description.solver.formulation == Formulation::capacity),
      current_(discretization.owned_vector()), previous_(discretization.owned_vector()),
      stage_(discretization.owned_vector()), end_(discretization.owned_vector()),
      current_energy_(discretization.owned_vector()),
      current_flow_(discretization.owned_vector()),
      stage_energy_(discretization.owned_vector()),
      stage_flow_(discretization.owned_vector()),
      end_energy_(discretization.owned_vector()),
      end_flow_(discretization.owned_vector()), known_(discretization.owned_vector()),
      capacity_reference_(discretization.owned_vector()) {}

template <int dim>
void TimeStepper<dim>::start(const Vector& temperature, const Vector& stored_energy,
                             const Vector& heat_flow, const AssembledSums& sums) {
  current_ = temperature;
  current_energy_ = stored_energy;
  current_flow_ = heat_flow;
  if (capacity_form_)
    current_energy_ = 0; // the capacity residual has no stored-energy vector
  current_sums_ = sums;
}

template <int dim>
StepHeat TimeStepper<dim>::attempt(const StepPlan& plan) {
  using namespace trbdf2;
  const double h = plan.step;
  attempted_step_ = h;
  // stage 1: trapezoid to t + gamma h; guess by linear extrapolation of the last
  // step (the current level on the first step)
  stage_ = current_;
  if (has_previous_) {
    const double ratio = gamma * h / previous_step_;
    stage_ *= 1.0 + ratio;
    stage_.add(-ratio, previous_);
  }
  known_ = current_energy_;
  known_.add(0.5 * gamma * h, current_flow_);
  if (capacity_form_)
    capacity_reference_ = current_;
  stage_energy_ = current_energy_;
  const Stage trapezoid{plan.stage_time, 0.5 * gamma * h, &known_,
                        capacity_form_ ? &capacity_reference_ : nullptr};
  StageResult first;
  try {
    first = stages_.solve(stage_, trapezoid, stage_energy_, stage_flow_);
  } catch (const StageFailure&) {
    if (!has_previous_)
      throw;
    // the extrapolated guess may leave a material's range: once more from the
    // current level
    stage_ = current_;
    stage_energy_ = current_energy_;
    first = stages_.solve(stage_, trapezoid, stage_energy_, stage_flow_);
  }
  // stage 2: BDF2 to t + h; guess by the quadratic through the previous, current
  // and stage levels (linear through the last two on the first step)
  extrapolate_to_end(plan, end_);
  if (!capacity_form_) {
    known_ = stage_energy_;
    known_ *= stage_weight;
    known_.add(-start_weight, current_energy_);
    end_energy_ = current_energy_;
  } else {
    known_ = 0;
    capacity_reference_ = stage_;
    capacity_reference_ *= stage_weight;
    capacity_reference_.add(-start_weight, current_);
    end_energy_ = 0;
  }
  const Stage bdf2{plan.end_time, end_weight * h, &known_,
                   capacity_form_ ? &capacity_reference_ : nullptr};
  const StageResult second = stages_.solve(end_, bdf2, end_energy_, end_flow_);
  // a non-physical temperature rejects the step
  double t_min = std::numeric_limits<double>::infinity();
  for (const auto i : discretization_.owned_dofs)
    t_min = std::min(t_min, static_cast<double>(end_[i]));
  t_min = Utilities::MPI::min(t_min, discretization_.communicator);
  if (!(t_min > 0.0))
    throw StageFailure{"non-physical temperature " + format_double(t_min) + " K"};
  end_sums_ = second.sums;
  return StepHeat{h,           current_sums_,  first.sums,
                  second.sums, first.reaction, second.reaction};
}

// The samples at times s0 = -h_prev (previous), s1 = 0 (current), s2 = gamma h
// (stage), extrapolated to s = h with the Lagrange weights l0, l1, l2 (linear
// through the current and stage levels when there is no previous step).
template <int dim>
void TimeStepper<dim>::extrapolate_to_end(const StepPlan& plan, Vector& out) const {
  if (!has_previous_) {
    out = stage_;
    out *= 1.0 / trbdf2::gamma;
    out.add(1.0 - 1.0 / trbdf2::gamma, current_);
    return;
  }
  const double s0 = -previous_step_, s1 = 0.0, s2 = trbdf2::gamma * plan.step,
               s = plan.step;
  const double l0 = (s - s1) * (s - s2) / ((s0 - s1) * (s0 - s2));
  const double l1 = (s - s0) * (s - s2) / ((s1 - s0) * (s1 - s2));
  const double l2 = (s - s0) * (s - s1) / ((s2 - s0) * (s2 - s1));
  out = previous_;
  out *= l0;
  out.add(l1, current_, l2, stage_);
}

template <int dim>
double TimeStepper<dim>::error_estimate(const StepPlan& plan) const {
  Vector extrapolated(end_);
  extrapolate_to_end(plan, extrapolated);
  double local = 0.0;
  for (const auto i : discretization_.owned_dofs)
    local = std::max(local, std::abs(end_[i] - extrapolated[i]));
  return Utilities::MPI::max(local, discretization_.communicator);
}

template <int dim>
void TimeStepper<dim>::accept() {
  previous_ = current_;
  previous_step_ = attempted_step_;
  has_previous_ = true;
  current_ = end_;
  if (!capacity_form_)
    current_energy_ = end_energy_;
  current_flow_ = end_flow_;
  current_sums_ = end_sums_;
}

template class TimeStepper<2>;
template class TimeStepper<3>;

} // namespace quantacal::solver::detail
