// SPDX-License-Identifier: Apache-2.0
/**
 * @file validation_support.h
 * @brief Small helpers shared by the validation tests that run the solver
 *        in-process: paths, quiet run options, reading probe histories.
 *
 * MPI is initialised by test_main.cc (dealii::Utilities::MPI::MPI_InitFinalize).
 *
 * Header-only; it sees the engine only through quantacal/solver/solver.h.
 */
#ifndef QUANTACAL_TESTS_REFERENCE_VALIDATION_SUPPORT_H
#define QUANTACAL_TESTS_REFERENCE_VALIDATION_SUPPORT_H

#include <quantacal/solver/solver.h>

#include <algorithm>
#include <cmath>
#include <cstddef>
#include <stdexcept>
#include <string>
#include <vector>

namespace quantacal::reference {

/** The repository's root folder (QUANTACAL_SOURCE_DIR, else from this header's path). */
inline std::string source_root() {
#ifdef QUANTACAL_SOURCE_DIR
  return QUANTACAL_SOURCE_DIR;
#endif
  std::string here = __FILE__;
  for (int i = 0; i < 4; ++i) {
    const auto slash = here.find_last_of('/');
    if (slash == std::string::npos)
      return ".";
    here.erase(slash);
  }
  return here.empty() ? "/" : here;
}

/**
 * Linear interpolation of a probe history at @p time (exact when @p time is a sample).
 * @param result the run's result
 * @param probe probe index
 * @param time s, inside the run's time range
 * @return K
 */
inline double probe_at(const solver::RunResult& result, std::size_t probe, double time) {
  const auto& t = result.times;
  const auto& v = result.probe_temperatures.at(probe);
  if (t.empty() || time < t.front() || time > t.back() * (1 + 1e-12))
    throw std::out_of_range("probe_at: time outside the run");
  const auto it = std::lower_bound(t.begin(), t.end(), time * (1 - 1e-12));
  const std::size_t i = static_cast<std::size_t>(it - t.begin());
  if (i < t.size() && std::abs(t[i] - time) <= 1e-12 * std::max(1.0, std::abs(time)))
    return v[i];
  if (i == 0 || i >= t.size())
    return v[std::min(i, t.size() - 1)];
  const double w = (time - t[i - 1]) / (t[i] - t[i - 1]);
  return (1 - w) * v[i - 1] + w * v[i];
}

/** Options for a quiet in-process run: no files, no log. */
inline solver::RunOptions quiet_run() {
  solver::RunOptions o;
  o.write_output = false;
  o.log = nullptr;
  o.progress = false;
  return o;
}

} // namespace quantacal::reference

#endif
