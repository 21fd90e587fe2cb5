// SPDX-License-Identifier: Apache-2.0
// The energy ledger: heat accumulated with the TR-BDF2 weights, and the balance.
#include "energy_ledger.h"

#include "trbdf2.h"

#include <algorithm>
#include <cmath>

namespace quantacal::solver::detail {

void EnergyLedger::start(double stored, double shift) {
  initial_stored_ = stored;
  shift_ = shift;
  boundary_heat_ = 0.0;
  source_heat_ = 0.0;
}

void EnergyLedger::add_step(const StepHeat& heat) {
  using namespace trbdf2;
  boundary_heat_ +=
      heat.step * (trapezoid_weight * (heat.start.boundary + heat.stage.boundary) +
                   end_weight * heat.end.boundary) +
      stage_weight * heat.stage_reaction + heat.end_reaction;
  source_heat_ +=
      heat.step * (trapezoid_weight * (heat.start.source + heat.stage.source) +
                   end_weight * heat.end.source);
}

void EnergyLedger::record(double time, double stored, RunResult& result) const {
  EnergyRecord row;
  row.time = time;
  row.stored_energy = stored + shift_;
  row.boundary_heat = boundary_heat_;
  row.source_heat = source_heat_;
  row.remesh_change = remesh_change_;
  const double change = stored - initial_stored_;
  const double tiny = std::max(1e-300, 1e-30 * std::abs(initial_stored_));
  row.relative_imbalance =
      std::abs(change - boundary_heat_ - source_heat_ - remesh_change_) /
      std::max(std::abs(change), tiny);
  if (result.energy.size() > 0)
    result.worst_relative_imbalance =
        std::max(result.worst_relative_imbalance, row.relative_imbalance);
  result.energy.push_back(row);
}

} // namespace quantacal::solver::detail
