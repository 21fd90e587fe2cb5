// SPDX-License-Identifier: Apache-2.0
// Internal: the field files of a run: fields-NNNN.RRRR.vtu (one piece per rank)
// with fields-NNNN.pvtu and the time series fields.pvd, holding the
// temperature, the heat flux -k grad T, the material id and the MPI rank.
#ifndef QUANTACAL_LIB_SOLVER_FIELD_OUTPUT_H
#define QUANTACAL_LIB_SOLVER_FIELD_OUTPUT_H

#include "discretization.h"

#include <quantacal/fe/material_field.h>
#include <quantacal/solver/solver.h>

#include <string>
#include <utility>
#include <vector>

namespace quantacal::solver::detail {

/** The field files written so far (saved by a checkpoint; the entries are rank 0's). */
struct FieldSeries {
  unsigned int counter = 0; ///< the number NNNN of the next fields-NNNN.pvtu
  std::vector<std::pair<double, std::string>> series; ///< fields.pvd entries
};

template <int dim>
class FieldWriter {
public:
  /**
   * @param enabled false: write() does nothing (no output, or output.fields false)
   */
  FieldWriter(const CaseDescription& description,
              const Discretization<dim>& discretization,
              const fe::MaterialField<dim>& field, bool enabled);

  /**
   * Writes the fields of the ghosted @p temperature at @p time (collective); adds the
   * files to result.written_files and the time to result.timings.output.
   */
  void write(const Vector& temperature, double time, RunResult& result);

  using State = FieldSeries;
  State state() const { return {counter_, series_}; }
  void restore(const State& state) {
    counter_ = state.counter;
    series_ = state.series;
  }

private:
  const std::string folder_;
  const Discretization<dim>& discretization_;
  const fe::MaterialField<dim>& field_;
  const bool enabled_;
  std::vector<std::pair<double, std::string>> series_; ///< fields.pvd entries
  unsigned int counter_ = 0;
};

} // namespace quantacal::solver::detail

#endif
