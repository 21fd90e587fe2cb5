// SPDX-License-Identifier: Apache-2.0
// Internal: the solve of one implicit stage, M(T) - known - beta h F(T) = 0, by
// Newton's method with the consistent Jacobian (assembly.h), kept between
// iterations, stages and steps while it still contracts the residual fast (a chord
// method, docs/cases.md "Newton with a kept Jacobian"). Each linear system is
// solved by GMRES preconditioned with Trilinos ML AMG (the Jacobian is not
// symmetric), the AMG hierarchy built with the Jacobian. A step that raises the
// residual makes a kept Jacobian be rebuilt; with a fresh one it is halved up to
// four times (backtracking). Convergence is measured against the stage's change of
// stored energy plus a round-off floor.
#ifndef QUANTACAL_LIB_SOLVER_NEWTON_H
#define QUANTACAL_LIB_SOLVER_NEWTON_H

#include "assembly.h"

#include <deal.II/lac/trilinos_precondition.h>

namespace quantacal::solver::detail {

/** What one stage asks of the solver. */
struct Stage {
  double time = 0.0;                          ///< s, where the stage ends
  double beta_h = 0.0;                        ///< factor of F(T) in the stage equation, s
  const Vector* known = nullptr;              ///< the known part of the stage equation
  const Vector* capacity_reference = nullptr; ///< capacity form: T_ref (else null)
};

/** What a stage solve returns besides the temperature. */
struct StageResult {
  AssembledSums sums;    ///< at the solution
  double reaction = 0.0; ///< sum of the fixed-temperature rows of the residual, J
};

template <int dim>
class StageSolver {
public:
  StageSolver(const CaseDescription& description,
              const Discretization<dim>& discretization, Assembler<dim>& assembler,
              RunResult& counters);

  /**
   * Solves @p stage for @p temperature (in: the guess, out: the solution; its fixed
   * nodes are set to their values at stage.time first).
   * @param stored_energy in: the stored energy the stage starts from (the scale of
   *        its change); out: M(T) at the solution
   * @param heat_flow out: F(T) at the solution
   * @throws StageFailure if Newton or the linear solver fails, or a material cannot be
   *         evaluated
   */
  StageResult solve(Vector& temperature, const Stage& stage, Vector& stored_energy,
                    Vector& heat_flow);

  /**
   * Forgets the kept Jacobian (the next stage assembles a new one). A checkpoint
   * calls it: a resumed run starts without a Jacobian, so the uninterrupted run
   * drops its own there too, and both take the same path (docs/cases.md,
   * "Checkpoints and --resume").
   */
  void forget_jacobian() { have_jacobian_ = false; }

private:
  /** A residual evaluation: its norm, its scale and the round-off floor. */
  struct Evaluation {
    double norm = 0.0;
    double scale = 0.0;
    double floor = 0.0;
    AssembledSums sums;
  };

  Evaluation evaluate(const Vector& temperature, const Stage& stage,
                      const Vector& start_energy, bool with_jacobian);
  /** Builds the AMG hierarchy of the Jacobian just assembled for @p beta_h. */
  void build_preconditioner(double beta_h);
  /** True if the kept Jacobian should be rebuilt before a stage with @p beta_h. */
  bool jacobian_unfit_for(double beta_h) const;
  /** @return the GMRES iterations taken */
  unsigned int solve_linear(double residual_norm, double target);
  Evaluation line_search(Vector& temperature, const Stage& stage,
                         const Vector& start_energy, double norm, bool roundoff_update);
  StageResult iterate(Vector& temperature, const Stage& stage, Vector& stored_energy,
                      Vector& heat_flow);

  const CaseDescription& description_;
  const Discretization<dim>& discretization_;
  Assembler<dim>& assembler_;
  RunResult& counters_; ///< steps.n_newton_iterations, n_linear_iterations, timings
  Vector ghosted_, reference_ghosted_;
  Vector residual_, free_residual_, update_, trial_, scale_vector_;

  // the kept Jacobian (in discretization_.jacobian) and its preconditioner
  dealii::TrilinosWrappers::PreconditionAMG amg_;
  bool have_jacobian_ = false;
  double jacobian_beta_h_ = 0.0; ///< beta h it was assembled with, s
  /// GMRES iterations of the first solve with it: a rise says it has gone stale
  unsigned int fresh_linear_iterations_ = 0;
  bool first_solve_since_build_ = false;
};

} // namespace quantacal::solver::detail

#endif
