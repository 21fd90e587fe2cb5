// SPDX-License-Identifier: Apache-2.0
// Internal: the step-size control of the time integration. Steps land exactly
// on the stop times (field output times, source switches, the end); a step with
// a local error estimate above time.tolerance is redone with
// h max(0.2, 0.9 (tol/err)^(1/3)); an accepted step proposes at most twice its
// size; a failed step (Newton, range) is retried with half the step, up to
// time.max_rejections times in a row. No deal.II here.
#ifndef QUANTACAL_LIB_SOLVER_STEP_CONTROL_H
#define QUANTACAL_LIB_SOLVER_STEP_CONTROL_H

#include <quantacal/solver/case.h>

#include <set>

namespace quantacal::solver::detail {

/** One attempted step from time t. */
struct StepPlan {
  double step = 0.0;       ///< h, s
  double stage_time = 0.0; ///< t + gamma h
  double end_time = 0.0;   ///< t + h (exactly the stop time when it lands on one)
  bool clamped = false;    ///< shortened for a stop time (the next may grow back)
};

class StepControl {
public:
  explicit StepControl(const CaseDescription& description);

  /** True once @p time has reached the end time. */
  bool finished(double time) const;

  /** The next attempt from @p time. */
  StepPlan plan(double time) const;

  /** True if an error estimate @p error rejects the step @p step (adaptive only). */
  bool rejects(double error, double step) const;

  /** After a rejection for its error: the smaller step to retry with. */
  void retry_after_error(double step, double error);

  /**
   * After a failed attempt (Newton, material range, non-finite estimate): counts it;
   * false if the run must stop (too many in a row, or half the step below
   * min_step), else the step is halved.
   */
  bool retry_after_failure(double step);

  /** After an accepted step: the next proposal. */
  void accept(const StepPlan& plan, double error);

  /** True if @p time is a field output time other than the end. */
  bool is_output_time(double time) const;

  double min_step() const { return min_step_; }
  unsigned int consecutive_rejections() const { return consecutive_rejections_; }
  /** The last accepted step (0 before the first). */
  double previous_step() const { return previous_step_; }
  bool has_previous_step() const { return has_previous_step_; }

  /** What the control carries from one step to the next (saved by a checkpoint). */
  struct State {
    double step = 0.0;          ///< the next proposal, s
    double previous_step = 0.0; ///< s
    bool has_previous_step = false;
    unsigned int consecutive_rejections = 0;
  };
  State state() const {
    return {step_, previous_step_, has_previous_step_, consecutive_rejections_};
  }
  void restore(const State& state) {
    step_ = state.step;
    previous_step_ = state.previous_step;
    has_previous_step_ = state.has_previous_step;
    consecutive_rejections_ = state.consecutive_rejections;
  }

private:
  const TimeSpec& spec_;
  std::set<double> stops_;        ///< output times, source switches, the end
  std::set<double> output_times_; ///< field output times before the end
  double min_step_ = 0.0;
  double max_step_ = 0.0;
  double step_ = 0.0; ///< the next proposal
  double previous_step_ = 0.0;
  bool has_previous_step_ = false;
  unsigned int consecutive_rejections_ = 0;
};

} // namespace quantacal::solver::detail

#endif
