// SPDX-License-Identifier: Apache-2.0
// Step-size control: stop times, rejection and the next proposal (see step_control.h).
#include "step_control.h"

#include "trbdf2.h"

#include <algorithm>
#include <cmath>

namespace quantacal::solver::detail {

StepControl::StepControl(const CaseDescription& description) : spec_(description.time) {
  const double end = description.time.end;
  stops_.insert(end);
  if (description.output.interval > 0)
    for (double at = description.output.interval; at < end * (1 - 1e-12);
         at += description.output.interval)
      stops_.insert(at);
  for (const HeatSource& source : description.sources) {
    if (source.start > 0 && source.start < end)
      stops_.insert(source.start);
    if (std::isfinite(source.end) && source.end < end)
      stops_.insert(source.end);
  }
  if (description.output.interval > 0)
    for (double at = description.output.interval; at < end * (1 - 1e-12);
         at += description.output.interval)
      output_times_.insert(at);
  max_step_ = description.time.max_step > 0 ? description.time.max_step
                                            : description.time.end / 20.0;
  min_step_ = description.time.min_step > 0 ? description.time.min_step
                                            : description.time.first_step * 1e-6;
  step_ = std::min(description.time.first_step, max_step_);
}

bool StepControl::finished(double time) const {
  return !(time < spec_.end * (1 - 1e-14));
}

StepPlan StepControl::plan(double time) const {
  // land exactly on the next stop time
  const double next_stop = *stops_.upper_bound(time * (1 + 1e-14) + 1e-300);
  StepPlan plan;
  plan.step = step_;
  bool lands = false; // this step ends exactly on the stop time
  if (time + plan.step >= next_stop * (1 - 1e-12)) {
    plan.step = next_stop - time;
    plan.clamped = true;
    lands = true;
  } else if (spec_.adaptive && time + 1.5 * plan.step > next_stop) {
    // split the remaining interval in two rather than leave a sliver
    plan.step = 0.5 * (next_stop - time);
    plan.clamped = true;
  }
  plan.stage_time = time + trbdf2::gamma * plan.step;
  plan.end_time = lands ? next_stop : time + plan.step;
  return plan;
}

bool StepControl::rejects(double error, double step) const {
  return spec_.adaptive && error > spec_.tolerance && step > min_step_ * 1.0001;
}

void StepControl::retry_after_error(double step, double error) {
  step_ =
      std::max(min_step_, step * std::max(0.2, 0.9 * std::cbrt(spec_.tolerance / error)));
}

bool StepControl::retry_after_failure(double step) {
  ++consecutive_rejections_;
  if (consecutive_rejections_ >= spec_.max_rejections || step * 0.5 < min_step_)
    return false;
  step_ = 0.5 * step;
  return true;
}

void StepControl::accept(const StepPlan& plan, double error) {
  consecutive_rejections_ = 0;
  previous_step_ = plan.step;
  has_previous_step_ = true;
  double factor = 2.0;
  if (spec_.adaptive && error > 0)
    factor = std::min(2.0, std::max(0.2, 0.9 * std::cbrt(spec_.tolerance / error)));
  if (spec_.adaptive) {
    const double proposal = plan.step * factor;
    step_ = plan.clamped ? std::max(step_, proposal) : proposal;
    step_ = std::min(std::max(step_, min_step_), max_step_);
  } else {
    step_ = spec_.first_step;
  }
}

bool StepControl::is_output_time(double time) const {
  const bool at_field_time =
      output_times_.count(time) || std::abs(time - spec_.end) <= 1e-12 * spec_.end;
  return at_field_time && std::abs(time - spec_.end) > 1e-12 * spec_.end;
}

} // namespace quantacal::solver::detail
