// SPDX-License-Identifier: Apache-2.0
/**
 * @file debye.h
 * @brief The Debye energy function D3(x) and the Debye capacity, as plain functions.
 *
 * Internal to the model layer (exposed for the tests and the benchmarks).
 * See docs/theory.md, "Debye", for the branches and their accuracy.
 */
#ifndef QUANTACAL_MODELS_DETAIL_DEBYE_H
#define QUANTACAL_MODELS_DETAIL_DEBYE_H

namespace quantacal {
namespace detail {

/** The three dimensionless Debye quantities at one x = theta/T. */
struct DebyeValues {
  double energy = 0.0;   ///< D3(x) = U / (n R T), dimensionless
  double capacity = 0.0; ///< 4 D3(x) - 3x/(e^x - 1) = C / (n R), dimensionless
  double slope = 0.0;    ///< T dC/dT / (n R) = -x d(C/nR)/dx, dimensionless
};

/**
 * Debye energy function
 * \f$ D_3(x) = \frac{3}{x^3} \int_0^x \frac{t^3}{e^t - 1}\,dt \f$.
 * @param x theta/T, dimensionless, >= 0 (D3(0) = 1; +inf gives 0)
 * @return D3(x), relative error about 1e-15 (docs/theory.md)
 */
double debye_function_3(double x) noexcept;

/**
 * D3(x), the reduced Debye capacity and its reduced temperature slope at once
 * (shares the exponential between them).
 * @param x theta/T, dimensionless, >= 0
 */
DebyeValues debye_values(double x) noexcept;

/** Crossover from the Bernoulli series to the exponential sum, in x = theta/T. */
inline constexpr double debye_series_limit = 3.0;
/** Above this x every e^-x term is below half an ulp: pure pi^4/(5 x^3) asymptote. */
inline constexpr double debye_asymptote_limit = 60.0;

} // namespace detail
} // namespace quantacal

#endif
