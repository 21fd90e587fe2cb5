// SPDX-License-Identifier: Apache-2.0
/**
 * @file export_nodes.h
 * @brief The nodes of `quantacal export`: a temperature grid on which
 *        piecewise-linear interpolation of c_p, k and the density reproduces the
 *        exact model within a stated relative tolerance, with an enthalpy column
 *        that is the exact integral of the piecewise-linear c_p.
 *
 * Why it exists: programs that only read tables (commercial FE codes, spreadsheets,
 * in-house solvers) interpolate linearly between rows. A table on a uniform grid is
 * either far too coarse at 4 K and across a latent-heat peak or far too long
 * elsewhere; and an enthalpy column taken from the model is not the integral of the
 * c_p column the reader interpolates, so a solver using both creates or destroys
 * energy. This grid is chosen by error control against the exact model, and its
 * H column is the trapezoid sum of its c_p column (docs/export.md).
 */
#ifndef QUANTACAL_CLI_EXPORT_NODES_H
#define QUANTACAL_CLI_EXPORT_NODES_H

#include <quantacal/material/material.h>

#include <cstddef>
#include <vector>

namespace quantacal::cli {

/** An interval the grid cannot interpolate within tolerance: a jump of the model. */
struct ExportJump {
  double lower = 0.0;         ///< K, node just below the model's discontinuity
  double upper = 0.0;         ///< K, node at the discontinuity (the model's right limit)
  double relative_jump = 0.0; ///< |right - left| / max(|left|, |right|) of the quantity
  const char* quantity = "";  ///< "c_p", "k" or "density"
};

/** The exported columns and what the build measured. */
struct ExportTable {
  std::vector<double> temperature; ///< K, strictly increasing
  std::vector<double> capacity;    ///< c_p of the model at the nodes, on the basis
  std::vector<double> enthalpy;    ///< trapezoid integral of the linear c_p, on the basis
  std::vector<double> conductivity; ///< k of the model at the nodes, W/m/K
  std::vector<double> density;      ///< rho of the model at the nodes, kg/m^3
  std::vector<ExportJump> jumps;    ///< model discontinuities (excluded from the bound)

  double tolerance = 0.0; ///< the relative tolerance asked for
  /// Verification pass (points independent of those used to choose the nodes):
  std::size_t n_checked = 0;                   ///< model evaluations in that pass
  double worst_capacity_error = 0.0;           ///< relative
  double worst_capacity_temperature = 0.0;     ///< K
  double worst_conductivity_error = 0.0;       ///< relative
  double worst_conductivity_temperature = 0.0; ///< K
  double worst_density_error = 0.0;            ///< relative
  /// Worst |H_export(T) - e_model(T)| over the nodes and the verification points,
  /// H_export read as the exact integral of the linear c_p; on the basis.
  double worst_enthalpy_difference = 0.0;
  double worst_enthalpy_temperature = 0.0; ///< K
  /// The model's stored-energy range e(upper) - e(lower), on the basis.
  double enthalpy_range = 0.0;
  std::size_t n_evaluations = 0; ///< model evaluations spent choosing the nodes
};

/**
 * Chooses the nodes over [@p lower, @p upper] and fills the columns.
 *
 * Nodes start on both ends, on every breakpoint of the heat-capacity and
 * conductivity models inside the range (phase-join ends and centres, magnetic
 * critical temperatures, table knots); at a breakpoint where the model itself
 * jumps by more than a quarter of the tolerance, a second node is put 1e-6 T
 * below it (an ExportJump). Every other interval is accepted only when the
 * linear interpolant of c_p, k and rho between its ends is within 0.9
 * @p tolerance of the exact model at 16 evenly spaced interior points and at
 * every node (and segment midpoint) of the material's cached c_p and k tables
 * that falls inside it; otherwise it is bisected (at the geometric mean when
 * upper > 2 lower, else at the midpoint). A final pass checks 48 stratified
 * pseudo-random points per interval, none used before, and splits any interval
 * that fails the full tolerance.
 *
 * @param material the material (its exact model is the reference)
 * @param lower first node, K, inside the valid range
 * @param upper last node, K, above @p lower and inside the valid range
 * @param tolerance relative tolerance, e.g. 0.005
 * @param basis basis of c_p and H
 * @throws NumericalError if an interval narrower than 1e-9 T still fails
 * @throws RangeError if the range lies outside the material's valid range
 */
ExportTable build_export_table(const Material& material, double lower, double upper,
                               double tolerance, Basis basis);

} // namespace quantacal::cli

#endif
