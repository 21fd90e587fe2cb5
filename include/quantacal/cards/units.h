// SPDX-License-Identifier: Apache-2.0
/**
 * @file units.h
 * @brief Quantities with units as strings ("343 K", "0.695 mJ/mol/K^2") to SI.
 *
 * A closed, documented list of units (docs/cards.md) with dimension checks.
 * Temperatures accept degC (an offset for a temperature; the same as K inside
 * a per-degree unit such as J/kg/degC).
 */
#ifndef QUANTACAL_CARDS_UNITS_H
#define QUANTACAL_CARDS_UNITS_H

#include <array>
#include <string>

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

/** A parsed quantity: SI value and its dimension. */
struct Quantity {
  double value = 0.0;
  Dimension dimension;
  bool is_temperature_offset = false; ///< written in degC (value already in K)
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
