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

/// Boltzmann constant k_B, J/K (SI 2019 definition, exact).
inline constexpr double boltzmann_constant = 1.380649e-23;

/// Elementary charge e, C (SI 2019 definition, exact).
inline constexpr double elementary_charge = 1.602176634e-19;

/// Sommerfeld value of the Lorenz number L0 = (pi^2/3)(k_B/e)^2 =
/// 2.44300e-8 W Ohm/K^2, from the exact k_B and e (Ashcroft and Mermin, Solid
/// State Physics, ch. 2; the rounded 2.44e-8 of handbooks is 0.12 % low).
inline constexpr double sommerfeld_lorenz_number =
    3.14159265358979323846 * 3.14159265358979323846 / 3.0 *
    (boltzmann_constant / elementary_charge) * (boltzmann_constant / elementary_charge);

} // namespace quantacal

#endif
