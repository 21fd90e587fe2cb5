// SPDX-License-Identifier: Apache-2.0
// Reference thermal models for the table tests, written here so that the
// tables are tested independently of lib/models: the Debye lattice from GSL's
// gsl_sf_debye_3, and the analytic Einstein, Sommerfeld, normal-distribution
// latent heat and a capacity with jumps of d2C/dT2 at breakpoints.
#ifndef QUANTACAL_TESTS_TABLES_REFERENCE_MODELS_H
#define QUANTACAL_TESTS_TABLES_REFERENCE_MODELS_H

#include <quantacal/common/exceptions.h>
#include <quantacal/models/thermal_model.h>

#include <gsl/gsl_sf_debye.h>

#include <algorithm>
#include <cmath>
#include <memory>
#include <string>
#include <utility>
#include <vector>

namespace quantacal_test {

using quantacal::gas_constant;
using quantacal::ThermalState;

/** One additive term of a reference model. */
struct Term {
  virtual ~Term() = default;
  virtual ThermalState at(double temperature) const = 0;
  virtual std::vector<double> breakpoints() const { return {}; }
};

/**
 * Debye lattice through GSL: U = n R T D3(x), C = n R [4 D3(x) - 3x/(e^x - 1)],
 * x = theta/T, with dD3/dx = 3/(e^x - 1) - 3 D3/x (differentiating the integral
 * definition of D3).
 */
struct DebyeTerm : Term {
  DebyeTerm(double theta, double modes) : theta(theta), modes(modes) {}
  ThermalState at(double t) const override {
    const double x = theta / t;
    const double d3 = gsl_sf_debye_3(x);
    const double em1 = std::expm1(x); // e^x - 1
    const double ex_em1_sq =
        std::exp(-x) / (std::expm1(-x) * std::expm1(-x)); // e^x/(e^x-1)^2
    const double nr = modes * gas_constant;
    ThermalState s;
    s.energy = nr * t * d3;
    s.capacity = nr * (4.0 * d3 - 3.0 * x / em1);
    const double dcdx = 9.0 / em1 - 12.0 * d3 / x + 3.0 * x * ex_em1_sq;
    s.capacity_derivative = nr * dcdx * (-x / t);
    return s;
  }
  double theta, modes;
};

/** Einstein oscillators: U = n R theta/(e^x - 1), C = n R x^2 e^x/(e^x - 1)^2. */
struct EinsteinTerm : Term {
  EinsteinTerm(double theta, double modes) : theta(theta), modes(modes) {}
  ThermalState at(double t) const override {
    const double x = theta / t;
    const double nr = modes * gas_constant;
    const double f = x * x * std::exp(-x) / (std::expm1(-x) * std::expm1(-x));
    ThermalState s;
    s.energy = nr * theta / std::expm1(x);
    s.capacity = nr * f;
    // df/dx = f (2/x - coth(x/2)), dx/dT = -x/T
    s.capacity_derivative = nr * f * (2.0 / x - 1.0 / std::tanh(0.5 * x)) * (-x / t);
    return s;
  }
  double theta, modes;
};

/** Sommerfeld electrons: C = gamma T. */
struct ElectronicTerm : Term {
  explicit ElectronicTerm(double gamma) : gamma(gamma) {}
  ThermalState at(double t) const override {
    return {0.5 * gamma * t * t, gamma * t, gamma};
  }
  double gamma;
};

/** Latent heat L over a normal distribution: C = L phi(z)/w, U = L Phi(z), z = (T -
 * Tt)/w. */
struct TransitionTerm : Term {
  TransitionTerm(double centre, double latent, double width)
      : centre(centre), latent(latent), width(width) {}
  ThermalState at(double t) const override {
    const double z = (t - centre) / width;
    const double phi = std::exp(-0.5 * z * z) / std::sqrt(2.0 * M_PI);
    return {latent * 0.5 * std::erfc(-z / std::sqrt(2.0)), latent * phi / width,
            -latent * z * phi / (width * width)};
  }
  std::vector<double> breakpoints() const override { return {centre}; }
  double centre, latent, width;
};

/**
 * C += k (T - Tb)^2 above Tb: C and dC/dT continuous, d2C/dT2 jumps by 2k at
 * Tb (the kind of point where tabulated data have knots).
 */
struct KinkTerm : Term {
  KinkTerm(double at_temperature, double k) : tb(at_temperature), k(k) {}
  ThermalState at(double t) const override {
    if (t <= tb)
      return {};
    const double d = t - tb;
    return {k * d * d * d / 3.0, k * d * d, 2.0 * k * d};
  }
  std::vector<double> breakpoints() const override { return {tb}; }
  double tb, k;
};

/** A ThermalModel that is the sum of reference terms on [lower, upper]. */
class ReferenceModel : public quantacal::ThermalModel {
public:
  ReferenceModel(std::string name, double lower, double upper,
                 std::vector<std::shared_ptr<const Term>> terms)
      : name_(std::move(name)), lower_(lower), upper_(upper), terms_(std::move(terms)) {}

  ThermalState evaluate(double t) const override {
    if (!(t >= lower_ && t <= upper_))
      throw quantacal::RangeError("ReferenceModel::evaluate", name_, "inside the range",
                                  t);
    ThermalState s;
    for (const auto& term : terms_)
      s += term->at(t);
    return s;
  }
  double lower_temperature() const override { return lower_; }
  double upper_temperature() const override { return upper_; }
  std::vector<double> breakpoints() const override {
    std::vector<double> b;
    for (const auto& term : terms_)
      for (double p : term->breakpoints())
        b.push_back(p);
    std::sort(b.begin(), b.end());
    return b;
  }
  std::string name() const override { return name_; }

private:
  std::string name_;
  double lower_, upper_;
  std::vector<std::shared_ptr<const Term>> terms_;
};

/** Copper: theta_D = 343 K, gamma = 0.695 mJ/mol/K^2 (Kittel; gamma from memory), 1-1357
 * K. */
inline std::shared_ptr<const ReferenceModel> copper_like() {
  return std::make_shared<ReferenceModel>(
      "copper (Debye + electronic)", 1.0, 1357.0,
      std::vector<std::shared_ptr<const Term>>{
          std::make_shared<DebyeTerm>(343.0, 3.0),
          std::make_shared<ElectronicTerm>(0.695e-3)});
}

/**
 * Aluminium with its melting peak: theta_D = 428 K, gamma = 1.35 mJ/mol/K^2
 * (Kittel; gamma from memory), T_m = 933.47 K, L = 10.71 kJ/mol (CRC);
 * the 1 K width of the peak is illustrative. 4-1200 K.
 */
inline std::shared_ptr<const ReferenceModel> aluminium_melting(double width = 1.0) {
  return std::make_shared<ReferenceModel>(
      "aluminium with melting peak", 4.0, 1200.0,
      std::vector<std::shared_ptr<const Term>>{
          std::make_shared<DebyeTerm>(428.0, 3.0),
          std::make_shared<ElectronicTerm>(1.35e-3),
          std::make_shared<TransitionTerm>(933.47, 10710.0, width)});
}

/** Einstein solid, theta_E = 240 K, plus gamma = 1 mJ/mol/K^2 (illustrative), 2-1000 K.
 */
inline std::shared_ptr<const ReferenceModel> einstein_like() {
  return std::make_shared<ReferenceModel>(
      "Einstein solid (illustrative)", 2.0, 1000.0,
      std::vector<std::shared_ptr<const Term>>{std::make_shared<EinsteinTerm>(240.0, 3.0),
                                               std::make_shared<ElectronicTerm>(1e-3)});
}

/**
 * Debye (theta 300 K) with jumps of d2C/dT2 at 150, 150.3 and 700 K
 * (illustrative; two breakpoints 0.3 K apart force a fine cell grid), 5-1000 K.
 */
inline std::shared_ptr<const ReferenceModel> kinked() {
  return std::make_shared<ReferenceModel>(
      "Debye with kinks (illustrative)", 5.0, 1000.0,
      std::vector<std::shared_ptr<const Term>>{std::make_shared<DebyeTerm>(300.0, 3.0),
                                               std::make_shared<KinkTerm>(150.0, 2e-3),
                                               std::make_shared<KinkTerm>(150.3, -1e-3),
                                               std::make_shared<KinkTerm>(700.0, 1e-4)});
}

} // namespace quantacal_test

#endif
