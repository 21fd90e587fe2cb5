// SPDX-License-Identifier: Apache-2.0
// The published functional forms the card tests compute their references from:
// the Shomate fits of the NIST Chemistry WebBook (NIST-JANAF, Chase 1998), the
// NIST cryogenic log-polynomial correlations (Marquardt, Le and Radebaugh 2000)
// and the SGTE magnetic capacity (Hillert and Jarl 1978; Dinsdale 1991). Each
// test names the source of the coefficients it passes in.
#ifndef QUANTACAL_TESTS_CARDS_PUBLISHED_FORMS_H
#define QUANTACAL_TESTS_CARDS_PUBLISHED_FORMS_H

#include <quantacal/common/constants.h>

#include <cmath>

namespace quantacal::test {

/** Relative deviation of a model value from a reference, model / reference - 1. */
inline double deviation(double model, double reference) {
  return model / reference - 1;
}

/**
 * One Shomate fit over [from, to] K: C_p = A + B t + C t^2 + D t^3 + E/t^2
 * (J/mol/K) and H - H(298.15 K) = A t + B t^2/2 + C t^3/3 + D t^4/4 - E/t + F
 * (kJ/mol, relative to the solid at 298.15 K), t = T/1000 K.
 */
struct Shomate {
  double from, to; // K
  double a, b, c, d, e, f;
  double capacity(double t) const { // J/mol/K
    const double x = t / 1000.0;
    return a + b * x + c * x * x + d * x * x * x + e / (x * x);
  }
  double enthalpy(double t) const { // J/mol
    const double x = t / 1000.0;
    return 1000.0 * (a * x + b * x * x / 2 + c * x * x * x / 3 + d * x * x * x * x / 4 -
                     e / x + f);
  }
};

/** A NIST cryogenic correlation: log10 y = sum_{n=0..8} a_n (log10 T)^n. */
inline double nist_log_polynomial(const double (&a)[9], double t) {
  const double x = std::log10(t);
  double sum = 0.0;
  for (int n = 8; n >= 0; --n)
    sum = sum * x + a[n];
  return std::pow(10.0, sum);
}

/**
 * int_{t0}^{t1} y dT of a NIST cryogenic correlation y(T) (for c_p: H(t1) - H(t0)),
 * by composite Simpson in ln T with 4000 intervals (dH = c T d(ln T)).
 */
inline double nist_log_polynomial_integral(const double (&a)[9], double t0, double t1) {
  const int n = 4000; // even
  const double u0 = std::log(t0), h = (std::log(t1) - u0) / n;
  double sum = 0.0;
  for (int i = 0; i <= n; ++i) {
    const double t = std::exp(u0 + i * h);
    const double w = (i == 0 || i == n) ? 1.0 : (i % 2 ? 4.0 : 2.0);
    sum += w * nist_log_polynomial(a, t) * t;
  }
  return sum * h / 3.0;
}

/**
 * The magnetic capacity of the SGTE form G_mag = R T ln(beta + 1) g(tau) (Hillert
 * and Jarl 1978; Dinsdale 1991), J/mol/K, written out independently of lib/models.
 */
inline double sgte_magnetic_capacity(double t, double tc, double beta, double p) {
  const double k = quantacal::gas_constant * std::log(1 + beta);
  const double q = 1 / p - 1;
  const double d = 518.0 / 1125.0 + 11692.0 / 15975.0 * q;
  const double tau = t / tc;
  if (tau < 1)
    return k * (474.0 / 497.0) * q / d *
           (2 * std::pow(tau, 3) + 2 * std::pow(tau, 9) / 3 + 2 * std::pow(tau, 15) / 5);
  return k / d *
         (2 * std::pow(tau, -5) + 2 * std::pow(tau, -15) / 3 +
          2 * std::pow(tau, -25) / 5);
}

} // namespace quantacal::test

#endif
