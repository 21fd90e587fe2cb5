// SPDX-License-Identifier: Apache-2.0
// Internal: the energy ledger of a run. The stored energy comes from the
// assembly; the heat through the boundary and from sources is accumulated with
// the TR-BDF2 weights (trbdf2.h), so that the ledger balances to the Newton
// tolerance. Heat through fixed-temperature boundaries is the reaction: the
// residual rows of their constrained degrees of freedom. No deal.II here.
#ifndef QUANTACAL_LIB_SOLVER_ENERGY_LEDGER_H
#define QUANTACAL_LIB_SOLVER_ENERGY_LEDGER_H

#include <quantacal/solver/solver.h>

namespace quantacal::solver::detail {

/** Sums returned by one assembly (global, over all ranks). */
struct AssembledSums {
  double stored = 0.0;   ///< int w E(T), J (without the shift)
  double boundary = 0.0; ///< int_Gamma w q_b(T), W (natural boundaries only)
  double source = 0.0;   ///< int w q, W
  double shift = 0.0;    ///< int w E_shift, J (constant: the subtracted reference)
};

/** What one accepted step adds to the ledger. */
struct StepHeat {
  double step = 0.0;           ///< h, s
  AssembledSums start;         ///< at t_n
  AssembledSums stage;         ///< at t_n + gamma h
  AssembledSums end;           ///< at t_n + h
  double stage_reaction = 0.0; ///< reaction sum of the trapezoidal stage, J
  double end_reaction = 0.0;   ///< reaction sum of the BDF2 stage, J
};

/** Cumulative heat and the balance of every row. */
class EnergyLedger {
public:
  /**
   * The state at the start.
   * @param stored int w (E - E_shift) at the start, J
   * @param shift int w E_shift, J (added back to every stored energy reported)
   */
  void start(double stored, double shift);

  /** Adds the boundary and source heat of one accepted step. */
  void add_step(const StepHeat& heat);

  /**
   * Adds the change of stored energy, J, of a move onto a new mesh (the stored
   * energy assembled on the new mesh minus that on the old one): interpolation is
   * not heat, so it is kept apart from the physical balance.
   */
  void add_remesh(double change) { remesh_change_ += change; }

  /**
   * The ledger row at @p time with the stored energy @p stored (without the shift),
   * appended to @p result (energy, worst_relative_imbalance).
   */
  void record(double time, double stored, RunResult& result) const;

  /** The accumulated ledger (saved by a checkpoint). */
  struct State {
    double initial_stored = 0.0; ///< J
    double shift = 0.0;          ///< J
    double boundary_heat = 0.0;  ///< J
    double source_heat = 0.0;    ///< J
    double remesh_change = 0.0;  ///< J
  };
  State state() const {
    return {initial_stored_, shift_, boundary_heat_, source_heat_, remesh_change_};
  }
  void restore(const State& state) {
    initial_stored_ = state.initial_stored;
    shift_ = state.shift;
    boundary_heat_ = state.boundary_heat;
    source_heat_ = state.source_heat;
    remesh_change_ = state.remesh_change;
  }

private:
  double initial_stored_ = 0.0;
  double shift_ = 0.0;
  double boundary_heat_ = 0.0;
  double source_heat_ = 0.0;
  double remesh_change_ = 0.0;
};

} // namespace quantacal::solver::detail

#endif
