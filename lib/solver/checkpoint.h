// SPDX-License-Identifier: Apache-2.0
// Internal: checkpoints of a run, and resuming from them (docs/cases.md,
// "Checkpoints and --resume").
//
// A checkpoint is a folder checkpoint-NNNNNN in the output folder with
//   mesh, mesh_fixed.data, mesh.info   the refined mesh and, attached to its cells,
//                                      the level vectors of the time stepper
//                                      (parallel::distributed::Triangulation::save
//                                      with SolutionTransfer::prepare_for_serialization),
//   state.bin                          everything else, the same on every rank
//                                      (boost binary archive, doubles bit-exact),
// and the record checkpoint.yaml that names it, with the size and the FNV-1a hash
// of each of its files and the fingerprint of the case (case_fingerprint.h).
//
// Writing is atomic: every rank writes into checkpoint-NNNNNN.tmp; when all are
// done, rank 0 renames the folder, then replaces checkpoint.yaml (written to a
// temporary name and renamed), and only then removes the previous checkpoint. A
// kill at any moment leaves checkpoint.yaml naming a complete checkpoint.
#ifndef QUANTACAL_LIB_SOLVER_CHECKPOINT_H
#define QUANTACAL_LIB_SOLVER_CHECKPOINT_H

#include "case_fingerprint.h"
#include "discretization.h"
#include "energy_ledger.h"
#include "field_output.h"
#include "step_control.h"
#include "time_stepper.h"

#include <quantacal/solver/solver.h>

#include <functional>
#include <string>
#include <utility>
#include <vector>

namespace quantacal::solver::detail {

/** The state of a run at an accepted step that is the same on every rank. */
struct RunState {
  double time = 0.0;                 ///< s
  unsigned int index = 0;            ///< of the checkpoint (1, 2, ...)
  double next_checkpoint_time = 0.0; ///< s, of the simulated-time schedule
  double wall_seconds = 0.0;         ///< wall time of the sessions so far, s
  StepControl::State control;
  EnergyLedger::State ledger;
  StepperState stepper;
  /// per watched transformation: fastest rate K/s, first fast crossing s
  std::vector<std::pair<double, double>> transformations;
  FieldSeries fields;
  /// the histories and counters so far (times, probes, energy, steps, timings,
  /// written files)
  RunResult result;
};

/** <output folder>/checkpoint.yaml. */
std::string checkpoint_record_path(const CaseDescription& description);

/** A checkpoint read back and checked. */
struct LoadedCheckpoint {
  std::string record; ///< path of checkpoint.yaml
  std::string folder; ///< path of checkpoint-NNNNNN
  std::string forest; ///< path of its saved mesh, for build_mesh
  unsigned int ranks = 0;
  std::vector<std::pair<std::string, std::string>> sections; ///< fingerprint: key, hash
  RunState state;
};

/**
 * Reads the checkpoint of @p description's output folder and checks every file
 * against the sizes and hashes of its record (rank 0 checks; collective).
 * @throws InputError naming the file and what is wrong: no checkpoint.yaml, a
 *         record that cannot be read, a listed file missing, shorter or longer
 *         than recorded, or with other content, a state that cannot be read
 */
LoadedCheckpoint read_checkpoint(const CaseDescription& description,
                                 MPI_Comm communicator);

/**
 * Compares the fingerprint @p current of the case with the one @p loaded was
 * written with.
 * @param with_materials false: leave out the materials (before they are bound to
 *        the mesh, so that the mesh can be checked before it is loaded)
 * @throws InputError located at the first section of the case file that differs,
 *         or naming an entry the case no longer has
 */
void check_fingerprint(const CaseDescription& description, const LoadedCheckpoint& loaded,
                       const std::vector<FingerprintSection>& current,
                       bool with_materials);

/**
 * Writes a checkpoint (collective): @p vectors (owned entries, as
 * TimeStepper::level_vectors) on the mesh of @p discretization, @p state and the
 * record with @p fingerprint. @p hook (if set) is called on every rank at
 * "written", "renamed" and "committed".
 * @throws std::ios_base::failure if a file cannot be written (the previous
 *         checkpoint stays)
 */
template <int dim>
void write_checkpoint(const CaseDescription& description,
                      Discretization<dim>& discretization,
                      const std::vector<Vector*>& vectors, const RunState& state,
                      const std::vector<FingerprintSection>& fingerprint,
                      const std::function<void(const std::string&)>& hook);

/**
 * Reads the level vectors saved with the mesh back into @p vectors (owned entries,
 * in the order they were written); the mesh of @p discretization must have been
 * loaded from the checkpoint (build_mesh with LoadedCheckpoint::forest) and its
 * degrees of freedom distributed.
 */
template <int dim>
void read_checkpoint_vectors(const Discretization<dim>& discretization,
                             const std::vector<Vector*>& vectors);

} // namespace quantacal::solver::detail

#endif
