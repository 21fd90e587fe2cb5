// SPDX-License-Identifier: Apache-2.0
/**
 * @file units.h
 * @brief Quantities with units as strings ("343 K", "0.695 mJ/mol/K^2") to SI.
 *
 * A closed, documented list of units (docs/cards.md) with dimension checks.
 * Temperatures accept degC and degF (an offset scale for a temperature written
 * alone; a degree interval inside a per-degree unit such as J/kg/degC).
 */
#ifndef QUANTACAL_CARDS_UNITS_H
#define QUANTACAL_CARDS_UNITS_H

#include <array>
#include <string>
#include <utility>
#include <vector>

namespace quantacal {

/** Exponents of (kg, m, s, K, mol, A) of a physical dimension. */
struct Dimension {
  std::array<int, 6> exponents{};
  bool operator==(const Dimension& o) const noexcept { return exponents == o.exponents; }
  bool operator!=(const Dimension& o) const noexcept { return !(*this == o); }
  /** Human-readable SI form, e.g. "kg m^2 s^-2 mol^-1". */
  std::string to_string() const;
};

namespace dimension {
Dimension dimensionless();
Dimension temperature();               ///< K
Dimension molar_capacity();            ///< J/mol/K
Dimension specific_capacity();         ///< J/kg/K
Dimension molar_energy();              ///< J/mol
Dimension specific_energy();           ///< J/kg
Dimension sommerfeld();                ///< J/mol/K^2
Dimension molar_mass();                ///< kg/mol
Dimension density();                   ///< kg/m^3
Dimension conductivity();              ///< W/m/K
Dimension pressure();                  ///< Pa
Dimension molar_volume();              ///< m^3/mol
Dimension inverse_molar_energy();      ///< mol/J
Dimension heat_transfer_coefficient(); ///< W/m^2/K
Dimension heat_flux();                 ///< W/m^2
Dimension power_density();             ///< W/m^3
Dimension time();                      ///< s
Dimension length();                    ///< m
} // namespace dimension

/**
 * Human-readable name of a dimension with an example unit, e.g. "a specific heat
 * capacity (e.g. J/kg/K)"; "a quantity of dimension ..." for one without a name.
 */
std::string describe_dimension(const Dimension& d);

/**
 * A unit expression on its own, e.g. "J/g/K", "W/cm/K" or "degC": a value @f$x@f$
 * written in it is @f$(x + \mathrm{offset}) \cdot \mathrm{scale}@f$ in SI.
 *
 * Why it exists: the command line prints values in a unit the user names
 * (`quantacal table --unit cp=J/g/K`), which needs the unit's factor, offset and
 * written factors without a number in front.
 */
struct Unit {
  double scale = 1.0; ///< SI units per unit (per degree for a temperature interval)
  double offset =
      0.0; ///< 273.15 (degC) or 459.67 (degF) for an absolute temperature, else 0
  Dimension dimension;
  bool is_temperature_offset = false; ///< degC or degF alone: an absolute temperature
  /// Symbols with their net integer powers in written order, e.g. J/(g K) gives
  /// {J, 1}, {g, -1}, {K, -1}; a symbol written twice appears once.
  std::vector<std::pair<std::string, int>> factors;
};

/**
 * Parses a unit expression without a number (the syntax of the card units).
 * @param text e.g. "J/g/K", "kJ/kg", "degF", "W m^-1 K^-1"
 * @return the unit; degC or degF alone is an absolute temperature (offset set),
 *         inside a product a degree interval (offset 0)
 * @throws InputError "unit \"...\": ..." naming the unknown symbol (with "did you
 *         mean") or the syntax error
 */
Unit parse_unit(const std::string& text);

/** A parsed quantity: SI value and its dimension. */
struct Quantity {
  double value = 0.0;
  Dimension dimension;
  bool is_temperature_offset = false; ///< written in degC or degF (value already in K)
};

/**
 * Parses "<number> <unit>" (the number locale-free; NaN and inf rejected).
 * @throws InputError with a message saying what is wrong
 */
Quantity parse_quantity(const std::string& text);

/**
 * Parses and checks the dimension, returning the SI value.
 * @param text e.g. "343 K", "25 degC", "0.695 mJ/mol/K^2"
 * @param expected the required dimension
 * @throws InputError naming the expected and found dimensions
 */
double parse_quantity(const std::string& text, const Dimension& expected);

} // namespace quantacal

#endif
