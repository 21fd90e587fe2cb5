// SPDX-License-Identifier: Apache-2.0
// Internal: the wall clock of a run (PhaseTimes, the progress line).
#ifndef QUANTACAL_LIB_SOLVER_WALL_CLOCK_H
#define QUANTACAL_LIB_SOLVER_WALL_CLOCK_H

#include <chrono>

namespace quantacal::solver::detail {

using Clock = std::chrono::steady_clock;

/** Seconds from @p start to now. */
inline double seconds_since(Clock::time_point start) {
  return std::chrono::duration<double>(Clock::now() - start).count();
}

} // namespace quantacal::solver::detail

#endif
