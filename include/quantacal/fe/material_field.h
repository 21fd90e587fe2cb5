// SPDX-License-Identifier: Apache-2.0
/**
 * @file material_field.h
 * @brief Material properties at the quadrature points of a deal.II cell.
 *
 * Why it exists: a finite-element heat-conduction solver needs, at every
 * quadrature point of every cell and every Newton iteration, the stored
 * energy per reference volume E(T) = rho e(T), the volumetric heat capacity
 * dE/dT, its derivative d^2E/dT^2, the conductivity k(T) and dk/dT. The
 * material of a cell is chosen by its deal.II material id. MaterialField
 * keeps the id -> Material map and fills all five arrays with one call per
 * cell (the table's batch path), so an assembly loop never touches a card,
 * a model or a unit.
 *
 * Energies are on the reference-volume basis: `Material::basis_factor(Basis::volume)`
 * = rho/M times the molar table, relative to the material's reference temperature
 * (0 K unless its card says otherwise). Because the capacity is the exact
 * derivative of the interpolated energy, a residual written with E(T) and a
 * Jacobian written with dE/dT are consistent, and an energy-form solver
 * conserves energy to its Newton tolerance.
 */
#ifndef QUANTACAL_FE_MATERIAL_FIELD_H
#define QUANTACAL_FE_MATERIAL_FIELD_H

#include <quantacal/material/material.h>

#include <deal.II/base/types.h>
#include <deal.II/base/vectorization.h>
#include <deal.II/grid/tria_accessor.h>
#include <deal.II/grid/tria_iterator.h>

#include <array>
#include <cstddef>
#include <map>
#include <string>
#include <vector>

namespace quantacal::fe {

/**
 * Which properties MaterialField::evaluate computes.
 *
 * Why it exists: an assembly loop rarely needs all five properties at the
 * same points. A lumped or mass quadrature needs the stored energy and the
 * capacity at its points, the stiffness term needs the conductivity at the
 * Gauss points. The two groups come from different sources (the cached
 * table's batch for the first, the conductivity model for the second), so
 * asking for one group skips the other's work entirely. Values of a group
 * are the same, bit for bit, whichever selection computed them.
 */
enum class PropertySet : unsigned {
  /// energy, capacity and capacity_derivative (one batch call of the cached table)
  thermal = 1u,
  /// conductivity and conductivity_derivative (the material's conductivity model)
  conductivity = 2u,
  /// all five properties, what the overloads without a selection compute
  all = 3u
};

/** Union of two selections. */
constexpr PropertySet operator|(PropertySet a, PropertySet b) {
  return static_cast<PropertySet>(static_cast<unsigned>(a) | static_cast<unsigned>(b));
}

/** True if @p selection contains every property of @p part. */
constexpr bool contains(PropertySet selection, PropertySet part) {
  return (static_cast<unsigned>(selection) & static_cast<unsigned>(part)) ==
         static_cast<unsigned>(part);
}

/**
 * Properties at a set of points (one cell's quadrature points), SI units,
 * per unit reference volume. The arrays a MaterialField::evaluate call
 * selected have the length of its temperature list; the others are empty.
 */
struct PointProperties {
  std::vector<double> energy;                  ///< E = rho e(T), J/m^3
  std::vector<double> capacity;                ///< dE/dT = rho c_p(T), J/m^3/K
  std::vector<double> capacity_derivative;     ///< d^2E/dT^2, J/m^3/K^2
  std::vector<double> conductivity;            ///< k(T), W/m/K
  std::vector<double> conductivity_derivative; ///< dk/dT, W/m/K^2

  /** Resizes every array to @p n points. */
  void resize(std::size_t n);
};

/** The same five quantities for one SIMD batch of points (matrix-free operators). */
template <typename Number = double>
struct VectorizedProperties {
  dealii::VectorizedArray<Number> energy;                  ///< J/m^3
  dealii::VectorizedArray<Number> capacity;                ///< J/m^3/K
  dealii::VectorizedArray<Number> capacity_derivative;     ///< J/m^3/K^2
  dealii::VectorizedArray<Number> conductivity;            ///< W/m/K
  dealii::VectorizedArray<Number> conductivity_derivative; ///< W/m/K^2
};

/**
 * Maps deal.II material ids to quantacal Materials and evaluates them at the
 * temperatures of a cell's quadrature points.
 *
 * Immutable after construction and safe to share between threads. A
 * temperature outside a material's valid range (or NaN, or <= 0 K) raises a
 * quantacal::RangeError naming the material; the solver treats that as a
 * rejected step.
 *
 * @tparam dim space dimension of the triangulation (2 or 3)
 */
template <int dim>
class MaterialField {
public:
  /** An empty field (every lookup throws until materials are added by assignment). */
  MaterialField() = default;

  /**
   * Builds the cached table of every material that has not built it yet, so
   * that evaluation never waits for a build.
   * @param materials material id -> material (each non-null)
   * @throws std::invalid_argument for a null material
   * @throws NumericalError if a material's table cannot be built (see
   * PropertyTable::build)
   */
  explicit MaterialField(std::map<dealii::types::material_id, MaterialPtr> materials);

  /** True if @p id has a material. */
  bool has_material(dealii::types::material_id id) const;

  /**
   * The material of @p id.
   * @throws std::out_of_range naming the id if it has none
   */
  const Material& material(dealii::types::material_id id) const;

  /** Material ids present, ascending. */
  std::vector<dealii::types::material_id> material_ids() const;

  /**
   * Fills @p out at the temperatures @p temperatures of the points of
   * @p cell (the cell's material id selects the material).
   * @param cell any cell iterator of a Triangulation<dim> (or a DoF iterator)
   * @param temperatures temperatures at the points, K
   * @param out resized to temperatures.size() and filled (SI, per reference volume)
   * @throws RangeError if a temperature is outside the material's valid range
   * @throws std::out_of_range if the cell's material id has no material
   */
  void evaluate(const dealii::CellAccessor<dim, dim>& cell,
                const std::vector<double>& temperatures, PointProperties& out) const;

  /**
   * Same as the cell overload, selecting the material by id.
   * @param id material id
   * @param temperatures K
   * @param out filled, SI per reference volume
   */
  void evaluate(dealii::types::material_id id, const std::vector<double>& temperatures,
                PointProperties& out) const;

  /**
   * Fills only the properties of @p selection at the temperatures of the
   * points of @p cell (the cell's material id selects the material).
   *
   * An assembly that needs E and dE/dT at its mass points and k, dk/dT at its
   * Gauss points calls this twice with PropertySet::thermal and
   * PropertySet::conductivity and so does half the work of two full calls.
   * Each temperature is checked against the material's valid range once per
   * call. The selected arrays equal, bit for bit, those of the overloads
   * without a selection.
   * @param cell any cell iterator of a Triangulation<dim> (or a DoF iterator)
   * @param temperatures temperatures at the points, K
   * @param out the arrays of @p selection are resized to temperatures.size()
   *        and filled (SI, per reference volume); the other arrays are emptied
   * @param selection which properties to compute
   * @throws RangeError if a temperature is outside the material's valid range
   *         (the same exception, message included, as the full evaluation)
   * @throws std::out_of_range if the cell's material id has no material
   */
  void evaluate(const dealii::CellAccessor<dim, dim>& cell,
                const std::vector<double>& temperatures, PointProperties& out,
                PropertySet selection) const;

  /**
   * Same as the cell overload with a selection, selecting the material by id.
   * @param id material id
   * @param temperatures K
   * @param out the arrays of @p selection filled (SI per reference volume), the
   *        others emptied
   * @param selection which properties to compute
   * @throws RangeError if a temperature is outside the material's valid range
   * @throws std::out_of_range if @p id has no material
   */
  void evaluate(dealii::types::material_id id, const std::vector<double>& temperatures,
                PointProperties& out, PropertySet selection) const;

  /**
   * SIMD overload for matrix-free operators: lane l of @p temperature belongs
   * to a cell with material id @p ids[l] (lanes of a cell batch may come from
   * cells of different materials). With Debian's deal.II the batch width is 1.
   * @param ids material id per lane
   * @param temperature temperatures per lane, K
   * @return the five properties per lane, SI per reference volume
   */
  VectorizedProperties<double>
  evaluate(const std::array<dealii::types::material_id,
                            dealii::VectorizedArray<double>::size()>& ids,
           const dealii::VectorizedArray<double>& temperature) const;

  /**
   * Stored energy only, E = rho e(T), J/m^3, at one point (for ledgers and output).
   * @param id material id
   * @param temperature K
   */
  double energy(dealii::types::material_id id, double temperature) const;

  /**
   * Conductivity k(T), W/m/K, at one point (for heat-flux output).
   * @param id material id
   * @param temperature K
   */
  double conductivity(dealii::types::material_id id, double temperature) const;

private:
  struct Entry {
    MaterialPtr material;
    double volume_factor = 0.0;     ///< rho/M, mol/m^3
    double lower_temperature = 0.0; ///< the material's valid range, K
    double upper_temperature = 0.0; ///< K
    TablePtr table; ///< the material's cached table (built at construction)
    /// the table's range is the valid range, so the table's own check is the range check
    bool table_checks_range = false;
  };
  const Entry& entry(dealii::types::material_id id) const;
  /** Throws the material's RangeError for the first temperature outside its range. */
  static void check_range(const Entry& e, const double* temperatures, std::size_t n);
  std::map<dealii::types::material_id, Entry> entries_;
};

/**
 * A material with constant specific heat and conductivity over
 * [lower, upper], for analytic checks (Carslaw and Jaeger solutions assume
 * constant properties). The energy is c (T - lower) per kilogram, exact.
 * @param name name used in messages
 * @param density kg/m^3
 * @param specific_heat J/kg/K
 * @param conductivity W/m/K
 * @param lower_temperature K (> 0)
 * @param upper_temperature K (> lower)
 * @param molar_mass kg/mol (any positive value; the volume basis does not depend on it)
 */
MaterialPtr make_constant_material(const std::string& name, double density,
                                   double specific_heat, double conductivity,
                                   double lower_temperature, double upper_temperature,
                                   double molar_mass = 0.1);

} // namespace quantacal::fe

#endif
