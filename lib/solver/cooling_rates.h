// SPDX-License-Identifier: Apache-2.0
// Internal: the cooling rate dT/dt at the probes, from the solver's own stage
// values of each accepted TR-BDF2 step, not from differences of written rows.
//
// A TR-BDF2 step (trbdf2.h; Bank et al., IEEE Trans. Electron Devices 32 (1985)
// 1992; Hosea and Shampine, Appl. Numer. Math. 20 (1996) 21) has the nodal fields
// T_n, T_g and T_1 at t_n, t_n + gamma h and t_n + h. Its BDF2 stage is the
// three-point backward difference over these times,
//
//   D[y] = (y_1 - a y_g + b y_n) / (c h),
//
// with a, b, c of trbdf2.h, and the stage equation reads D[M(T)] = F(T_1): in
// energy form the solver's derivative of the stored energy at t_n + h is the heat
// flow of the new level. D is the derivative at s = 1 of the quadratic through the
// samples at s = 0, gamma, 1 (s = (t - t_n)/h; Lagrange weights
// (1 - gamma)/gamma, -1/(gamma (1 - gamma)), (2 - gamma)/(1 - gamma), which are
// b/c, -a/c and 1/c). The rate written is D applied to the nodal temperatures,
//
//   dT/dt(t_n + h) = [(1 - gamma)/gamma T_n - T_g/(gamma (1 - gamma))
//                     + (2 - gamma)/(1 - gamma) T_1] / h,
//
// interpolated to the probe by the finite-element basis (the combination is
// linear, so rate and interpolation commute). With a constant capacity M = C T
// and D[T] = C^-1 F(T_1) exactly: the rate of the discrete equations themselves.
// With c_p(T) the two differ by O(h^2) (both are second-order approximations of
// dT/dt), and D[T] needs no capacity, no mass matrix and no solve.
//
// At t = 0 no rate is written (NaN, "nan" in probes.csv): a quench starts there,
// dT/dt jumps from 0 to its first value, and an extrapolation of the first step's
// quadratic back to t = 0 is no derivative of the solution (at the centre of a
// quenched bar it even gives a small heating rate).
#ifndef QUANTACAL_LIB_SOLVER_COOLING_RATES_H
#define QUANTACAL_LIB_SOLVER_COOLING_RATES_H

#include "discretization.h"
#include "probes.h"
#include "trbdf2.h"

#include <quantacal/solver/solver.h>

#include <vector>

namespace quantacal::solver::detail {

/** Weights of (T_n, T_g, T_1) in h dT/dt of one TR-BDF2 step (derivation above). */
struct RateWeights {
  double start, stage, end;
};

/** At t_n + h: the BDF2 stage's difference. */
inline RateWeights end_rate_weights() {
  const double g = trbdf2::gamma;
  return {(1.0 - g) / g, -1.0 / (g * (1.0 - g)), (2.0 - g) / (1.0 - g)};
}

/**
 * dT/dt at every probe (all ranks), K/s, from the owned nodal fields of one step.
 * @param start T_n, @param stage T_g, @param end T_1 (owned entries)
 * @param step h, s
 * @param weights end_rate_weights()
 */
template <int dim>
std::vector<double> probe_rates(const Discretization<dim>& discretization,
                                const ProbeSet<dim>& probes, const Vector& start,
                                const Vector& stage, const Vector& end, double step,
                                const RateWeights& weights);

/**
 * Appends the rates of an accepted step to @p result.probe_rates, after a NaN for
 * t = 0 on the first step.
 */
void append_rates(RunResult& result, const std::vector<double>& end_rates);

/**
 * The rates of an accepted step (collective), appended to @p result: call it
 * before the stepper makes the step its current level.
 */
template <int dim>
void record_step_rates(RunResult& result, const Discretization<dim>& discretization,
                       const ProbeSet<dim>& probes, const Vector& start,
                       const Vector& stage, const Vector& end, double step);

} // namespace quantacal::solver::detail

#endif
