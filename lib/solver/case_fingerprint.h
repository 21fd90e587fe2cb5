// SPDX-License-Identifier: Apache-2.0
// Internal: the fingerprint of a case, section by section, that a checkpoint
// records so that resuming with a changed case is a located error. Each section
// (the mesh, a material, a boundary condition, the time block, ...) is written
// into a canonical text (doubles as hexadecimal floating point, so equal means
// bit-equal) and hashed (64-bit FNV-1a). A material is fingerprinted by what it
// computes, not by its card's path: its name, molar mass, densities, range and
// the exact stored energy, capacity and conductivity at 33 temperatures across
// its range, so an edited card is caught wherever it lives. No deal.II here.
#ifndef QUANTACAL_LIB_SOLVER_CASE_FINGERPRINT_H
#define QUANTACAL_LIB_SOLVER_CASE_FINGERPRINT_H

#include <quantacal/solver/case.h>

#include <cstdint>
#include <map>
#include <string>
#include <vector>

namespace quantacal::solver::detail {

/** One section of a case and its hash. */
struct FingerprintSection {
  std::string key;    ///< e.g. "mesh", "materials[0]", "time", "solver"
  std::string hash;   ///< 16 hexadecimal digits
  CaseLocation where; ///< where the section is written in the case file
  std::string what;   ///< in words, for messages: "geometry and mesh"
};

/** 64-bit FNV-1a of @p bytes, continuing from @p hash. */
std::uint64_t fnv1a(const char* bytes, std::size_t n,
                    std::uint64_t hash = 14695981039346656037ull);

/** @p value as 16 hexadecimal digits. */
std::string hex64(std::uint64_t value);

/**
 * The sections of @p description, with the materials bound to the mesh's
 * material ids @p materials (a material id of the case that is not in the mesh
 * is fingerprinted by its card entry alone). Checkpoint settings
 * (output.checkpoint_*) and the output folder are left out: changing them does
 * not change what the run computes.
 * @throws InputError at mesh.file if a Gmsh file cannot be read
 */
std::vector<FingerprintSection>
case_fingerprint(const CaseDescription& description,
                 const std::map<unsigned int, MaterialPtr>& materials);

} // namespace quantacal::solver::detail

#endif
