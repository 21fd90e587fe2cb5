// SPDX-License-Identifier: Apache-2.0
// Internal: what a run prints (rank 0 only): the header, log lines, the
// one-line progress display and the closing line. On a terminal the progress
// line is redrawn in place (and cleared before a log line); elsewhere it is a
// log line every few seconds. No deal.II here.
#ifndef QUANTACAL_LIB_SOLVER_RUN_LOG_H
#define QUANTACAL_LIB_SOLVER_RUN_LOG_H

#include "wall_clock.h"

#include <quantacal/solver/solver.h>

#include <string>

namespace quantacal::solver::detail {

class RunLog {
public:
  /**
   * @param options where to print (options.log; null: nothing) and whether to show
   *        progress
   * @param rank this rank (only rank 0 prints)
   * @param start the run's start, for the progress line's estimate of the time left
   */
  RunLog(const RunOptions& options, unsigned int rank, Clock::time_point start);

  /** Prints one line (after clearing a progress line on a terminal). */
  void line(const std::string& text) const;

  /** The run header: case, geometry, mesh size, element, ranks, output, caution. */
  void header(const CaseDescription& description, const RunResult& result,
              unsigned int degree, bool writing) const;

  /**
   * The progress line at time @p time after a step @p step, with the first probe's
   * temperature and dT/dt in the case's output unit; redrawn at most every 0.25 s on
   * a terminal, 5 s elsewhere, unless @p force.
   */
  void progress(double time, double step, const CaseDescription& description,
                const RunResult& result, bool force);

  /** The closing lines: finished or stopped, counts, balance, wall time, results. */
  void closing(const CaseDescription& description, const RunResult& result, double time,
               bool writing) const;

private:
  std::ostream* out_ = nullptr; ///< null on ranks other than 0 or without a log
  Clock::time_point start_;
  bool terminal_ = false;
  double last_progress_ = -1.0; ///< wall time of the last progress line, s
};

} // namespace quantacal::solver::detail

#endif
