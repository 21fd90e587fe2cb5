// SPDX-License-Identifier: Apache-2.0
/**
 * @file material_field.h
 * @brief Material properties at the quadrature points of a deal.II cell.
 *
 * Why it exists: a finite-element heat-conduction solver needs, at every
 * quadrature point of every cell and every Newton iteration, some of the
 * stored energy per reference volume E(T) = rho e(T), the volumetric heat
 * capacity dE/dT, its derivative d^2E/dT^2, the conductivity k(T) and dk/dT.
 * The material of a cell is chosen by its deal.II material id. MaterialField
 * keeps the id -> Material map and fills the arrays an assembly asks for with
 * one call per cell (the table's batch path), so an assembly loop never
 * touches a card, a model or a unit.
 *
 * Energies are on the reference-volume basis: `Material::basis_factor(Basis::volume)`
 * = rho/M times the molar table, relative to the material's reference temperature
 * (0 K unless its card says otherwise). Because the capacity is the exact
 * derivative of the interpolated energy, a residual written with E(T) and a
 * Jacobian written with dE/dT are consistent, and an energy-form solver
 * conserves energy to its Newton tolerance.
 *
 * **Asking only for what is used.** Like deal.II's UpdateFlags, a PropertyFlags
 * argument names the properties to compute: a residual without its Jacobian
 * needs the energy alone, a stiffness term the conductivity and, for the
 * Jacobian, its derivative. A property is the same, bit for bit, whichever
 * flags computed it.
 * @code
 *   using namespace quantacal::fe;
 *   field.evaluate(*cell, temperatures, properties, property_energy | property_capacity);
 *   // properties.energy[q], properties.capacity[q]; the other arrays are empty
 * @endcode
 *
 * **Threads (deal.II's WorkStream).** A MaterialField is immutable after
 * construction and its evaluate() is const, so one field is shared by all
 * threads; what each thread needs of its own is the output: keep the
 * PointProperties (and the temperature buffer) in the per-thread scratch
 * object, as deal.II keeps FEValues there. The constructor builds the cached
 * table and the conductivity table of every material before the first
 * assembly, so no thread waits for (or races) a build; Material::table() and
 * Material::conductivity_table() are themselves built once under
 * std::call_once, so a Material used outside a field is thread-safe too.
 * @code
 *   using namespace quantacal::fe;
 *   struct Scratch {
 *     Scratch(const Mapping<dim>& m, const FiniteElement<dim>& fe,
 *             const Quadrature<dim>& q)
 *         : fe_values(m, fe, q, update_values | update_JxW_values),
 *           temperatures(q.size()) {}
 *     Scratch(const Scratch& s)
 *         : fe_values(s.fe_values.get_mapping(), s.fe_values.get_fe(),
 *                     s.fe_values.get_quadrature(), s.fe_values.get_update_flags()),
 *           temperatures(s.temperatures.size()) {}
 *     FEValues<dim> fe_values;
 *     std::vector<double> temperatures;
 *     PointProperties properties; // this thread's output arrays
 *   };
 *   const MaterialField<dim> field({{1, steel}, {2, copper}}); // shared
 *   WorkStream::run(
 *       dof_handler.begin_active(), dof_handler.end(),
 *       [&](const auto& cell, Scratch& s, CopyData& c) {
 *         s.fe_values.reinit(cell);
 *         s.fe_values.get_function_values(solution, s.temperatures);
 *         field.evaluate(*cell, s.temperatures, s.properties,
 *                        property_energy | property_conductivity);
 *         // ... c from s.properties.energy and s.properties.conductivity
 *       },
 *       copier, Scratch(mapping, fe, quadrature), CopyData(fe.n_dofs_per_cell()));
 * @endcode
 */
#ifndef QUANTACAL_FE_MATERIAL_FIELD_H
#define QUANTACAL_FE_MATERIAL_FIELD_H

#include <quantacal/material/material.h>

#include <deal.II/base/array_view.h>
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
 * Which properties MaterialField::evaluate computes, as bit flags combined
 * with `|` (the way deal.II's UpdateFlags are).
 *
 * The three thermal properties come from one batch call of the material's
 * cached table, the two conduction properties from one batch call of its
 * cached conductivity table (Material::conductivity_table());
 * a call that names no flag of a group skips that group's work entirely.
 */
enum PropertyFlags : unsigned int {
  property_none = 0,                       ///< nothing (the range is still checked)
  property_energy = 0x01,                  ///< E = rho e(T), J/m^3
  property_capacity = 0x02,                ///< dE/dT = rho c_p(T), J/m^3/K
  property_capacity_derivative = 0x04,     ///< d^2E/dT^2, J/m^3/K^2
  property_conductivity = 0x08,            ///< k(T), W/m/K
  property_conductivity_derivative = 0x10, ///< dk/dT, W/m/K^2
  /// the three of the cached table
  property_thermal = property_energy | property_capacity | property_capacity_derivative,
  /// the two of the conductivity model
  property_conduction = property_conductivity | property_conductivity_derivative,
  /// all five, what evaluate() computes without flags
  property_all = property_thermal | property_conduction
};

/** Union of two sets of flags. */
constexpr PropertyFlags operator|(PropertyFlags a, PropertyFlags b) {
  return static_cast<PropertyFlags>(static_cast<unsigned int>(a) |
                                    static_cast<unsigned int>(b));
}

/** Intersection of two sets of flags. */
constexpr PropertyFlags operator&(PropertyFlags a, PropertyFlags b) {
  return static_cast<PropertyFlags>(static_cast<unsigned int>(a) &
                                    static_cast<unsigned int>(b));
}

/** Adds the flags of @p b to @p a. */
inline PropertyFlags& operator|=(PropertyFlags& a, PropertyFlags b) {
  return a = a | b;
}

/** True if @p flags contains every flag of @p part. */
constexpr bool contains(PropertyFlags flags, PropertyFlags part) {
  return (flags & part) == part;
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
   * Builds the cached table and the conductivity table of every material that
   * has not built them yet, so that evaluation never waits for a build.
   * @param materials material id -> material (each non-null)
   * @throws std::invalid_argument for a null material
   * @throws NumericalError if a material's table or conductivity table cannot be
   * built (see PropertyTable::build, ConductivityTable::build)
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
   * Fills the properties of @p flags at the temperatures of the points of
   * @p cell (the cell's material id selects the material).
   *
   * Each temperature is checked against the material's valid range once per
   * call, whatever the flags. A property equals, bit for bit, the same
   * property computed with other flags.
   * @param cell any cell iterator of a Triangulation<dim> (or a DoF iterator)
   * @param temperatures temperatures at the points, K (a std::vector converts)
   * @param out the arrays of @p flags are resized to temperatures.size() and
   *        filled (SI, per reference volume); the other arrays are emptied
   * @param flags which properties to compute (default: all five)
   * @throws RangeError if a temperature is outside the material's valid range
   *         (the material's own message, naming it and the first such point)
   * @throws std::out_of_range if the cell's material id has no material
   */
  void evaluate(const dealii::CellAccessor<dim, dim>& cell,
                dealii::ArrayView<const double> temperatures, PointProperties& out,
                PropertyFlags flags = property_all) const;

  /**
   * Same as the cell overload, selecting the material by id.
   * @param id material id
   * @param temperatures K
   * @param out the arrays of @p flags filled (SI per reference volume), the others
   *        emptied
   * @param flags which properties to compute (default: all five)
   * @throws RangeError if a temperature is outside the material's valid range
   * @throws std::out_of_range if @p id has no material
   */
  void evaluate(dealii::types::material_id id,
                dealii::ArrayView<const double> temperatures, PointProperties& out,
                PropertyFlags flags = property_all) const;

  /**
   * SIMD overload for matrix-free operators: lane l of @p temperature belongs
   * to a cell with material id @p ids[l] (lanes of a cell batch may come from
   * cells of different materials). Lane by lane the values equal those of the
   * scalar overloads. With Debian's deal.II the batch width is 1.
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
    /// the material's cached conductivity table (built at construction)
    ConductivityTablePtr conductivity_table;
    /// the table's range is the valid range, so the table's own check is the range check
    bool table_checks_range = false;
  };
  const Entry& entry(dealii::types::material_id id) const;
  /** Throws the material's RangeError for the first temperature outside its range. */
  static void check_range(const Entry& e, const double* temperatures, std::size_t n);
  /** The thermal properties of @p flags, from one batch call of the table. */
  static void evaluate_thermal(const Entry& material, const double* temperatures,
                               std::size_t count, PointProperties& out,
                               PropertyFlags flags);
  /** The conduction properties of @p flags, from the conductivity table. */
  static void evaluate_conduction(const Entry& material, const double* temperatures,
                                  std::size_t count, PointProperties& out,
                                  PropertyFlags flags);
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
