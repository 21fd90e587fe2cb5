// SPDX-License-Identifier: Apache-2.0
/**
 * @file quenchant.h
 * @brief Quench heat-transfer-coefficient curves h(T_surface) from published
 *        sources, one YAML file per quenchant (folder quenchants/), found by
 *        name or read from a path; a case file names one with
 *        `convection: {quenchant: water_30C}` (docs/quenchants.md).
 *
 * Why it exists: the boiling curve of a quench bath is the input a quench
 * simulation is most sensitive to and the one users most often guess. A
 * quenchant file keeps one curve with its bath temperature, agitation, the
 * probe it came from and its published source in one place, so that cases
 * share it by name and a reader can check where each number came from.
 *
 * @code
 *   namespace qs = quantacal::solver;
 *   const qs::Quenchant water = qs::load_quenchant(qs::find_quenchant("water_30C"));
 *   const double h = water.coefficient.value(473.15); // W/m^2/K at a 200 degC surface
 * @endcode
 *
 * A name is looked up, in this order, in the folders of the environment
 * variable QUANTACAL_QUENCHANT_PATH (separated by ':'), in the installed
 * `share/quantacal/quenchants` (where `cmake --install` puts the bundled files,
 * next to `share/quantacal/materials`) and in the `quenchants/` folder of the
 * source tree the library was configured from. No deal.II here.
 */
#ifndef QUANTACAL_SOLVER_QUENCHANT_H
#define QUANTACAL_SOLVER_QUENCHANT_H

#include <quantacal/solver/case.h>

#include <string>
#include <vector>

namespace quantacal::solver {

/** One quenchant curve and what is known of it (temperatures in K, h in W/m^2/K). */
struct Quenchant {
  std::string name;              ///< the file's stem, e.g. "water_30C"
  std::string file;              ///< the path it was read from
  std::string description;       ///< one paragraph: what the bath is
  std::string status;            ///< "illustrative", "digitised" or "tabulated"
  double bath_temperature = 0.0; ///< K; the default ambient of a case that names it
  std::string agitation;         ///< the agitation of the source data, in words
  std::string probe;             ///< the probe or part the data came from, in words
  std::vector<std::string> cite; ///< the published sources
  std::string obtained;          ///< how the numbers were obtained from them
  Curve coefficient;             ///< h against the surface temperature
};

/**
 * Reads one quenchant file (format: docs/quenchants.md).
 * @param path the file
 * @return the quenchant, its curve checked: at least two rows, surface
 *         temperatures strictly increasing and starting at or below the bath
 *         temperature, every h finite and >= 0, some h > 0
 * @throws InputError located in the quenchant file (file:line:column, field,
 *         value, what was expected) for a missing, misspelt or bad entry, a
 *         name that is not the file's stem, or a file that cannot be read
 */
Quenchant load_quenchant(const std::string& path);

/**
 * The folders a quenchant name is looked up in, in order (see the file
 * comment); folders that do not exist are included (they hold no names).
 */
std::vector<std::string> quenchant_folders();

/** The names (file stems) of every `*.yaml` in quenchant_folders(), sorted, once each. */
std::vector<std::string> quenchant_names();

/**
 * The file of the quenchant @p name: `<folder>/<name>.yaml` in the first of
 * quenchant_folders() that has it.
 * @return its path, or "" if no folder has it (or @p name is not a plain name)
 */
std::string find_quenchant(const std::string& name);

} // namespace quantacal::solver

#endif
