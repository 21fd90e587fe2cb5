// SPDX-License-Identifier: Apache-2.0
/**
 * @file material.h
 * @brief A material: its exact model, conductivity, metadata and cached table.
 */
#ifndef QUANTACAL_MATERIAL_MATERIAL_H
#define QUANTACAL_MATERIAL_MATERIAL_H

#include <quantacal/material/fit_record.h>
#include <quantacal/models/conductivity.h>
#include <quantacal/models/heat_capacity_model.h>
#include <quantacal/models/phases.h>
#include <quantacal/tables/conductivity_table.h>
#include <quantacal/tables/property_table.h>

#include <cstddef>
#include <memory>
#include <mutex>
#include <optional>
#include <string>
#include <vector>

namespace quantacal {

/** Per what quantity energies and capacities are expressed. */
enum class Basis {
  mass,  ///< J/kg, J/kg/K
  mole,  ///< J/mol, J/mol/K
  volume ///< J/m^3, J/m^3/K of the reference configuration (reference density)
};

/** A published source of one or more parameters of a card. */
struct Source {
  std::string parameter; ///< field path(s) it supports, e.g. "heat_capacity[0].theta"
  std::string
      citation; ///< "Kittel, Introduction to Solid State Physics", "from memory", ...
};

/** A published measured point a card is checked against (quantacal check). */
struct Measurement {
  enum class Quantity { specific_heat, stored_energy, conductivity };
  Quantity quantity = Quantity::specific_heat;
  double temperature = 0.0; ///< K
  double value = 0.0;       ///< SI, molar basis for specific heat and energy, W/m/K for k
  double tolerance = 0.0;   ///< relative tolerance, e.g. 0.03
  std::string source;       ///< citation
  int line = 0;             ///< line in the card, for messages
};

/** One phase of a card with a `phases` list (docs/cards.md, "Phases"). */
struct PhaseInfo {
  std::string name;     ///< as written in the card, e.g. "alpha (bcc)"
  bool liquid = false;  ///< the melt
  double density = 0.0; ///< kg/m^3 (> 0)
};

/** Everything a Material is made of; filled by the card loader or by hand. */
struct MaterialData {
  std::string name;
  std::string description;
  std::string file;                   ///< card path ("" if built in code)
  double molar_mass = 0.0;            ///< kg/mol (> 0)
  double reference_density = 0.0;     ///< kg/m^3 (> 0)
  double lower_temperature = 0.0;     ///< K, valid range (> 0)
  double upper_temperature = 0.0;     ///< K, valid range
  double reference_temperature = 0.0; ///< K; stored energy is zero here (0 = at 0 K)
  std::shared_ptr<const HeatCapacityModel> model;
  ConductivityPtr conductivity;
  std::vector<Source> sources;
  std::vector<Measurement> measurements;
  /// The `fit` record of a fitted card (covariance of its fitted parameters), if any.
  std::optional<FitRecord> fit;
  /// Phases in order of temperature and their joins; empty for a one-phase card.
  std::vector<PhaseInfo> phases;
  std::shared_ptr<const PhaseLayout> phase_layout;
  TableOptions table_options; ///< tolerance etc.; range is the valid range
  /// Where the card gives its valid range (1-based line and column; 0 if built in
  /// code): a card whose terms cannot be tabulated is reported there.
  int range_line = 0, range_column = 0;
};

/**
 * A material as a solver sees it.
 *
 * Energies are relative to the reference temperature (0 K by default).
 * The table (and the conductivity table) is built on first use under
 * std::call_once, so a Material may be shared between threads from the moment
 * it is made. All temperatures are
 * checked against the valid range; outside it a RangeError names the material.
 */
class Material {
public:
  /** @throws InputError (a std::invalid_argument) if a field is missing or non-physical
   */
  explicit Material(MaterialData data);

  const std::string& name() const noexcept { return data_.name; }
  const MaterialData& data() const noexcept { return data_; }
  double molar_mass() const noexcept { return data_.molar_mass; } ///< kg/mol
  double reference_density() const noexcept {
    return data_.reference_density;
  } ///< kg/m^3
  double lower_temperature() const noexcept { return data_.lower_temperature; } ///< K
  double upper_temperature() const noexcept { return data_.upper_temperature; } ///< K
  const HeatCapacityModel& model() const noexcept { return *data_.model; }
  const ConductivityModel& conductivity_model() const noexcept {
    return *data_.conductivity;
  }

  /** Factor from molar values to @p basis: 1/M, 1 or rho/M. */
  double basis_factor(Basis basis) const noexcept;

  /** The cached table (molar), built on first call; thread-safe. */
  const PropertyTable& table() const;
  /** Shared handle of the same table. */
  TablePtr shared_table() const;

  /**
   * The cached conductivity table (k and dk/dT over the valid range, to the
   * relative tolerance of the table options), built on first call under its own
   * std::call_once; thread-safe. conductivity() reads it.
   */
  const ConductivityTable& conductivity_table() const;
  /** Shared handle of the same conductivity table. */
  ConductivityTablePtr shared_conductivity_table() const;

  /**
   * Thermal state from the table on @p basis, energy relative to the reference
   * temperature.
   * @param temperature K, inside the valid range
   * @throws RangeError outside the valid range, NaN or inf
   */
  ThermalState thermal(double temperature, Basis basis = Basis::mass) const;

  /** Same from the exact model (slow; for checks and `--exact`). */
  ThermalState thermal_exact(double temperature, Basis basis = Basis::mass) const;

  /**
   * Batch thermal state from the table on @p basis: the energy offset and the
   * basis factor are applied here, once per call, giving the same numbers as
   * thermal(T, basis) point by point, bit for bit. Output arrays may be null to
   * skip them.
   * @param temperatures n temperatures, K, inside the valid range
   * @param energy e relative to the reference temperature (J/kg, J/mol or J/m^3)
   * @param capacity c_p = de/dT on the same basis
   * @param capacity_derivative dc_p/dT on the same basis
   * @throws RangeError naming the first temperature outside the valid range, NaN or
   *         inf (outputs are then unspecified)
   */
  void thermal(const double* temperatures, std::size_t n, Basis basis, double* energy,
               double* capacity, double* capacity_derivative) const;

  /**
   * Inverse of thermal(T, basis).energy, solved exactly on the table's piecewise
   * polynomial: the T at which the returned energy equals @p energy.
   * @param energy relative to the reference temperature, on @p basis
   * @return T, K, inside the valid range
   * @throws RangeError if @p energy lies outside [e(lower), e(upper)] of the valid
   *         range (the condition states that interval in the basis' unit)
   */
  double temperature_from_energy(double energy, Basis basis = Basis::mass) const;

  /**
   * k (W/m/K) and dk/dT at @p temperature from the conductivity table (dk/dT is
   * the exact derivative of the tabulated k); RangeError outside the valid range.
   */
  ConductivityValue conductivity(double temperature) const;

  /** Same from the conductivity model (for checks, fits and `--exact`). */
  ConductivityValue conductivity_exact(double temperature) const;

  /**
   * Batch conductivity from the conductivity table: k (W/m/K) and dk/dT (W/m/K^2)
   * at n temperatures, the same numbers as conductivity(T) point by point, bit for
   * bit; output arrays may be null to skip them.
   * @throws RangeError naming the first temperature outside the valid range
   */
  void conductivity(const double* temperatures, std::size_t n, double* conductivity,
                    double* derivative) const;

  /**
   * Density at @p temperature, kg/m^3: the phases' densities blended over each
   * join with the same weights as the energy, or the reference density for a
   * one-phase card. The volume basis keeps the reference density: a fixed mesh
   * conserves mass, so energy per reference volume is what it integrates
   * (docs/theory.md, "Phases").
   * @throws RangeError outside the valid range
   */
  double density(double temperature) const;

  /** Energy offset subtracted so that U(reference temperature) = 0, J/mol. */
  double energy_offset() const noexcept { return energy_offset_; }

  /** Throws RangeError unless lower <= T <= upper and T finite. */
  void check_temperature(double temperature, const char* function) const;

private:
  /** @p build(), its NumericalError turned into an InputError at the card's range. */
  template <typename Build>
  auto build_for_card(Build build) const;

  MaterialData data_;
  double energy_offset_ = 0.0;
  mutable std::once_flag table_once_;
  mutable TablePtr table_;
  mutable std::once_flag conductivity_table_once_;
  mutable ConductivityTablePtr conductivity_table_;
};

using MaterialPtr = std::shared_ptr<const Material>;

} // namespace quantacal

#endif
