// SPDX-License-Identifier: Apache-2.0
// Internal: the coefficients of TR-BDF2 (Bank et al., IEEE Trans. Electron Devices
// 32 (1985) 1992; Hosea and Shampine, Appl. Numer. Math. 20 (1996) 21), gamma =
// 2 - sqrt 2, which makes both stages share one Jacobian shape:
//
//   stage 1 (trapezoid to t_n + gamma h):
//     M(T_g) - M(T_n) = (gamma h / 2) (F(T_g) + F(T_n))
//   stage 2 (BDF2 to t_n + h):
//     M(T_1) - a M(T_g) + b M(T_n) = c h F(T_1)
//   a = 1 / (gamma (2 - gamma)), b = (1 - gamma)^2 / (gamma (2 - gamma)),
//   c = (1 - gamma) / (2 - gamma)
//
// Because a - b = 1 and sum_i phi_i = 1, summing the rows gives the exact ledger
//   E_1 - E_n = h [w1 (Q_n + Q_g) + c Q_1] + (residuals),  w1 = a gamma / 2.
#ifndef QUANTACAL_LIB_SOLVER_TRBDF2_H
#define QUANTACAL_LIB_SOLVER_TRBDF2_H

#include <cmath>

namespace quantacal::solver::detail::trbdf2 {

/// fraction of the step covered by the trapezoidal stage
inline const double gamma = 2.0 - std::sqrt(2.0);
/// a: weight of the stored energy at the stage point in the BDF2 stage
inline const double stage_weight = 1.0 / (gamma * (2.0 - gamma));
/// b: weight of the stored energy at the start of the step in the BDF2 stage
inline const double start_weight =
    (1.0 - gamma) * (1.0 - gamma) / (gamma * (2.0 - gamma));
/// c: weight of h F(T_1) in the BDF2 stage, and of the end heat flow in the ledger
inline const double end_weight = (1.0 - gamma) / (2.0 - gamma);
/// w1: weight of the start and stage heat flows in the ledger
inline const double trapezoid_weight = stage_weight * gamma / 2.0;

} // namespace quantacal::solver::detail::trbdf2

#endif
