// SPDX-License-Identifier: Apache-2.0
// Shared helpers of the fit tests: published correlations and hand-built materials.
#ifndef QUANTACAL_TESTS_FIT_SUPPORT_H
#define QUANTACAL_TESTS_FIT_SUPPORT_H

#include <quantacal/common/format.h>
#include <quantacal/material/material.h>
#include <quantacal/models/contribution.h>
#include <quantacal/models/heat_capacity_model.h>
#include <quantacal/models/metal_conductivity.h>

#include <array>
#include <cmath>
#include <memory>
#include <string>
#include <vector>

namespace quantacal::test {

/**
 * Specific heat of OFHC copper, J/kg/K, 4 K to 300 K: the NIST cryogenic
 * correlation log10(cp) = sum_i a_i (log10 T)^i (Marquardt, Le and Radebaugh,
 * Cryogenic Material Properties Database, 11th Int. Cryocooler Conf., 2000).
 * Coefficients from memory; the tests check that they reproduce the verified
 * published values at 4, 20, 77 and 300 K before using them.
 */
inline double nist_copper_specific_heat(double t) {
  static constexpr std::array<double, 9> a = {
      -1.91844, -0.15973, 8.61013, -18.996, 21.9661, -12.7328, 3.54322, -0.3797, 0.0};
  const double x = std::log10(t);
  double sum = 0.0, p = 1.0;
  for (double c : a) {
    sum += c * p;
    p *= x;
  }
  return std::pow(10.0, sum);
}

/**
 * Molar heat capacity of copper, J/mol/K, 1 K to 25 K: the Copper Reference
 * Equation of the Calorimetry Conference (Osborne, Flotow and Schreiner, Rev.
 * Sci. Instrum. 38, 159, 1967), C = sum_n A_n T^(2n-1), n = 1..6. Coefficients
 * from memory; the tests check them against Martin's gamma and theta_0 below
 * 5 K and against the NIST correlation from 10 K to 30 K before using them.
 */
inline double reference_equation_copper_heat_capacity(double t) {
  static constexpr std::array<double, 6> a = {6.9434e-1, 4.7548e-2,   1.6314e-6,
                                              9.4786e-8, -1.3639e-10, 5.3898e-14};
  double sum = 0.0, p = t; // T^(2n-1)
  for (double c : a) {
    sum += c * p;
    p *= t * t;
  }
  return 1e-3 * sum; // the coefficients are in mJ/mol/K^(2n)
}

/**
 * Thermal conductivity of OFHC copper, W/m/K, 4 K to 300 K, same NIST source:
 * log10(k) = (a + c T^0.5 + e T + g T^1.5 + i T^2) / (1 + b T^0.5 + d T + f T^1.5 + h
 * T^2). Coefficients for RRR = 50 and RRR = 100 from memory; checked against the
 * published values before use.
 */
inline double nist_copper_conductivity(double t, int rrr) {
  static constexpr std::array<double, 9> c50 = {1.8743,    -0.41538,  -0.6018,
                                                0.13294,   0.26426,   -0.0219,
                                                -0.051276, 0.0014871, 0.003723};
  static constexpr std::array<double, 9> c100 = {2.2154,   -0.47461, -0.88068,
                                                 0.13871,  0.29505,  -0.02043,
                                                 -0.04831, 0.001281, 0.003207};
  const auto& c = rrr == 50 ? c50 : c100;
  const double s = std::sqrt(t);
  const double num = c[0] + c[2] * s + c[4] * t + c[6] * t * s + c[8] * t * t;
  const double den = 1.0 + c[1] * s + c[3] * t + c[5] * t * s + c[7] * t * t;
  return std::pow(10.0, num / den);
}

/** Copper molar mass, kg/mol (IUPAC standard atomic weight, from memory). */
inline constexpr double copper_molar_mass = 63.546e-3;

/**
 * The copper conductivity inputs used by the tests and materials/copper.yaml:
 * theta_R = 343 K (Kittel's calorimetric theta_D, verified, used for theta_R as
 * is common practice), rho(293 K) = 1.68e-8 Ohm m (CRC Handbook, from memory),
 * the Sommerfeld L0 for both scattering terms (the Wilson factor alone carries the
 * inelastic phonon scattering; a measured total Lorenz ratio for the phonon term
 * on top of it would count that scattering twice).
 */
inline MetalConductivityParameters copper_conductivity_inputs(double rrr, double wilson) {
  MetalConductivityParameters p;
  p.resistive_debye_temperature = 343.0;
  p.reference_resistivity = 1.68e-8;
  p.reference_temperature = 293.0;
  p.rrr = rrr;
  p.wilson_ratio = wilson;
  return p;
}

/**
 * Published copper c_p from t_low to 300 K as a data file: the Copper Reference
 * Equation up to 25 K (21 rows, sigma 0.5 %, a typical adiabatic-calorimetry
 * uncertainty: common practice) and the NIST correlation above (20 rows, sigma 5 %,
 * its stated fit error), both in J/kg/K.
 */
struct CopperData {
  std::string csv;
  std::vector<double> temperatures, values;
};

inline CopperData published_copper_data(double t_low) {
  CopperData d;
  d.csv = "# copper c_p: Copper Reference Equation to 25 K, NIST correlation above\n"
          "T_K,cp_J_per_kg_K,sigma\n";
  auto add = [&](double t, double cp, double sigma) {
    d.temperatures.push_back(t);
    d.values.push_back(cp);
    d.csv +=
        format_double(t) + "," + format_double(cp) + "," + format_double(sigma) + "\n";
  };
  for (int i = 0; i <= 20; ++i) {
    const double t = t_low * std::pow(25.0 / t_low, i / 20.0);
    add(t, test::reference_equation_copper_heat_capacity(t) / test::copper_molar_mass,
        0.005);
  }
  for (int i = 1; i <= 20; ++i) {
    const double t = 25.0 * std::pow(12.0, i / 20.0);
    add(t, test::nist_copper_specific_heat(t), 0.05);
  }
  return d;
}

/** A hand-built material (no card): given contributions and conductivity. */
inline MaterialPtr make_material(std::vector<ContributionPtr> terms, ConductivityPtr k,
                                 double molar_mass = copper_molar_mass,
                                 double lower = 1.0, double upper = 1300.0) {
  MaterialData d;
  d.name = "test material";
  d.description = "hand-built for a test";
  d.molar_mass = molar_mass;
  d.reference_density = 8935.0;
  d.lower_temperature = lower;
  d.upper_temperature = upper;
  d.model = std::make_shared<const HeatCapacityModel>(d.name, std::move(terms));
  d.conductivity = std::move(k);
  return std::make_shared<const Material>(std::move(d));
}

} // namespace quantacal::test

#endif
