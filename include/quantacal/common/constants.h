// SPDX-License-Identifier: Apache-2.0
/**
 * @file constants.h
 * @brief Physical constants and unit offsets used across quantacal, one
 *        definition each (SI units).
 */
#ifndef QUANTACAL_COMMON_CONSTANTS_H
#define QUANTACAL_COMMON_CONSTANTS_H

namespace quantacal {

/// Molar gas constant R, J/mol/K (CODATA 2018, exact: N_A k).
inline constexpr double gas_constant = 8.314462618;

/// Stefan-Boltzmann constant sigma, W/m^2/K^4 (CODATA 2018, exact from h, k and c).
inline constexpr double stefan_boltzmann = 5.670374419e-8;

/// Kelvin value of 0 degC, K (the definition of the Celsius scale, SI Brochure 2019).
inline constexpr double celsius_offset = 273.15;

/// Sommerfeld value of the Lorenz number L0 = (pi^2/3)(k/e)^2, W Ohm/K^2
/// (2.443e-8 from CODATA k and e; the rounded 2.44e-8 is the value of the trade).
inline constexpr double sommerfeld_lorenz_number = 2.44e-8;

} // namespace quantacal

#endif
