// SPDX-License-Identifier: Apache-2.0
// Metal conductivity: residual + Bloch-Grueneisen resistivity, Wiedemann-Franz with an
// optional Wilson inelastic factor, optional lattice term (docs/theory.md,
// "Conductivity of metals").
//
// The Bloch-Grueneisen integral J_n(x) = int_0^x t^n e^t/(e^t-1)^2 dt has two branches:
//  - x < bg_series_limit (3): t^2 e^t/(e^t-1)^2 = sum_k (1-k) B_k t^k / k! (the
//    derivative of the Bernoulli series of t/(e^t-1)), integrated term by term:
//      J_n(x) = x^(n-1)/(n-1) + sum_j (1-2j) B_2j x^(2j+n-1) / ((2j)! (2j+n-1)),
//    convergent for x < 2 pi; at x = 3 the terms fall as (3/2pi)^2j = 0.23^j, so
//    40 terms reach 1e-25 and no cancellation occurs (all terms after the first
//    are smaller than it and alternate).
//  - x >= 3: integration by parts, J_n(x) = n I_{n-1}(x) - x^n/(e^x-1), with
//      I_m(x) = int_0^x t^m/(e^t-1) dt = m! zeta(m+1)
//               - sum_k e^-kx sum_{j=0..m} m!/(m-j)! x^(m-j)/k^(j+1)
//    (the same exponential sum as the Debye function, Abramowitz and Stegun 27.1.2),
//    stopped once a term is below 2^-60 of m! zeta(m+1). At x = 3 the sum removes
//    about 90 % of the constant, so less than one digit is lost.
//  - x > 700: e^-x underflows; J_n = n! zeta(n) exactly in double precision.
#include <quantacal/common/exceptions.h>
#include <quantacal/models/metal_conductivity.h>

#include <boost/math/constants/constants.hpp>
#include <boost/math/special_functions/bernoulli.hpp>
#include <boost/math/special_functions/factorials.hpp>
#include <boost/math/special_functions/zeta.hpp>

#include <array>
#include <cmath>
#include <limits>
#include <stdexcept>

namespace quantacal {
namespace {

constexpr double bg_series_limit = 3.0;
constexpr double bg_underflow_limit = 700.0;
constexpr int n_min_order = 2;
constexpr int n_max_order = 9;
constexpr int n_series_terms = 40;

struct BlochGrueneisenCoefficients {
  std::array<double, n_series_terms> bernoulli{}; // (1-2j) B_2j / (2j)!, j = 1..40
  std::array<double, n_max_order + 1> limit{};    // n! zeta(n)
  std::array<double, n_max_order + 1> factorial{};
  BlochGrueneisenCoefficients() {
    for (int j = 1; j <= n_series_terms; ++j)
      bernoulli[j - 1] = (1.0 - 2.0 * j) * boost::math::bernoulli_b2n<double>(j) /
                         boost::math::factorial<double>(static_cast<unsigned>(2 * j));
    for (int n = 0; n <= n_max_order; ++n)
      factorial[n] = boost::math::factorial<double>(static_cast<unsigned>(n));
    for (int n = n_min_order; n <= n_max_order; ++n)
      limit[n] = factorial[n] * boost::math::zeta(static_cast<double>(n));
  }
};

const BlochGrueneisenCoefficients& coefficients() {
  static const BlochGrueneisenCoefficients c;
  return c;
}

// dJ_n/dx = x^n e^x/(e^x-1)^2, written with e^-x so that it cannot overflow.
double bloch_grueneisen_integrand(int n, double x) noexcept {
  if (x <= 0.0)
    return n == 2 ? 1.0 : 0.0;
  if (x > bg_underflow_limit)
    return 0.0;
  const double em = std::exp(-x);
  const double d = std::expm1(-x);
  return std::pow(x, n) * em / (d * d);
}

constexpr double pi = boost::math::constants::pi<double>();
constexpr double wilson_quadratic = 3.0 / (pi * pi);
constexpr double wilson_ratio_term = 1.0 / (2.0 * pi * pi);

// The Wilson factor B(x) and dB/dx; B = 1 and dB/dx = 0 when s = 0.
struct Wilson {
  double value = 1.0;
  double slope = 0.0;
};

Wilson wilson_factor(double s, double x) noexcept {
  if (s == 0.0)
    return {};
  const double j5 = bloch_grueneisen_integral(5, x);
  const double j7 = bloch_grueneisen_integral(7, x);
  if (j5 == 0.0) // x == 0: J7/J5 -> 0
    return {1.0, 0.0};
  const double d5 = bloch_grueneisen_integrand(5, x);
  const double d7 = bloch_grueneisen_integrand(7, x);
  Wilson w;
  w.value = 1.0 + wilson_quadratic * s * x * x - wilson_ratio_term * j7 / j5;
  w.slope = 2.0 * wilson_quadratic * s * x -
            wilson_ratio_term * (d7 * j5 - j7 * d5) / (j5 * j5);
  return w;
}

// g(T) = (T/theta)^5 J5(theta/T): rho_ph = C g.
double bloch_grueneisen_shape(double temperature, double theta) noexcept {
  const double r = temperature / theta;
  return std::pow(r, 5) * bloch_grueneisen_integral(5, theta / temperature);
}

void require(bool ok, const std::string& name, double value,
             const std::string& expected) {
  // (the field names the parameter, so a card reader can locate it)
  if (!ok)
    throw InputError::argument("quantacal::MetalConductivity", name, format_double(value),
                               expected);
}

void check_temperature(double temperature, const char* function) {
  if (!(temperature > 0.0) || !std::isfinite(temperature))
    throw RangeError(function, "metal conductivity", "0 K < T < inf", temperature);
}

} // namespace

double bloch_grueneisen_integral(int n, double x) noexcept {
  if (n < n_min_order || n > n_max_order || !(x >= 0.0))
    return std::numeric_limits<double>::quiet_NaN();
  const auto& c = coefficients();
  if (x == 0.0)
    return 0.0;
  if (x > bg_underflow_limit)
    return c.limit[n];
  if (x < bg_series_limit) {
    const double x2 = x * x;
    double power = std::pow(x, n - 1); // x^(2j+n-1)
    double sum = power / (n - 1);
    for (int j = 1; j <= n_series_terms; ++j) {
      power *= x2;
      const double term = c.bernoulli[j - 1] * power / (2.0 * j + n - 1);
      sum += term;
      if (std::abs(term) < 1e-18 * std::abs(sum))
        break;
    }
    return sum;
  }
  // n I_{n-1}(x) - x^n/(e^x - 1)
  const int m = n - 1;
  const double constant = c.limit[n] / n; // m! zeta(m+1) = n! zeta(n) / n
  const double em = std::exp(-x);
  std::array<double, n_max_order> a{}; // a_j = m!/(m-j)! x^(m-j)
  for (int j = 0; j <= m; ++j)
    a[j] = c.factorial[m] / c.factorial[m - j] * std::pow(x, m - j);
  double tail = 0.0;
  double ek = 1.0;
  for (int k = 1; k < 200; ++k) {
    ek *= em;
    // sum_{j=0..m} m!/(m-j)! x^(m-j)/k^(j+1), by Horner in 1/k from j = m down.
    const double inv_k = 1.0 / k;
    double poly = 0.0;
    for (int j = m; j >= 0; --j)
      poly = poly * inv_k + a[j];
    // poly now holds sum_j a_j k^-j; one more 1/k for k^-(j+1)
    const double term = ek * poly * inv_k;
    tail += term;
    if (term < 0x1p-60 * constant)
      break;
  }
  const double boundary = std::pow(x, n) * em / (-std::expm1(-x));
  return n * (constant - tail) - boundary;
}

MetalConductivity::MetalConductivity(const MetalConductivityParameters& p) : inputs_(p) {
  const double theta = p.resistive_debye_temperature;
  require(theta > 0.0 && std::isfinite(theta), "theta_R", theta, "a temperature > 0 K");
  require(p.reference_resistivity > 0.0 && std::isfinite(p.reference_resistivity),
          "reference_resistivity", p.reference_resistivity, "a resistivity > 0 Ohm m");
  require(p.reference_temperature > rrr_lower_temperature &&
              std::isfinite(p.reference_temperature),
          "reference_temperature", p.reference_temperature, "a temperature > 4 K");
  require(p.lorenz_number > 0.0 && std::isfinite(p.lorenz_number), "lorenz_number",
          p.lorenz_number, "a Lorenz number > 0 W Ohm/K^2");
  require(p.phonon_lorenz_number >= 0.0 && std::isfinite(p.phonon_lorenz_number),
          "phonon_lorenz_number", p.phonon_lorenz_number,
          "a Lorenz number > 0 W Ohm/K^2 (or 0 for lorenz_number)");
  require(p.wilson_ratio >= 0.0 && std::isfinite(p.wilson_ratio), "wilson_ratio",
          p.wilson_ratio, "a ratio >= 0");
  require(p.lattice_coefficient >= 0.0 && std::isfinite(p.lattice_coefficient),
          "lattice_coefficient", p.lattice_coefficient, "a coefficient >= 0 W/m/K^3");
  require(p.lattice_umklapp >= 0.0 && std::isfinite(p.lattice_umklapp), "lattice_umklapp",
          p.lattice_umklapp, "a resistance coefficient >= 0 m/W");
  require(p.lattice_umklapp == 0.0 || p.lattice_coefficient > 0.0, "lattice_umklapp",
          p.lattice_umklapp, "0 unless lattice_coefficient is given");
  const bool by_rrr = p.rrr != 0.0;
  const bool by_rho = p.residual_resistivity != 0.0;
  if (by_rrr == by_rho)
    throw InputError::argument(
        "", "", "",
        "quantacal::MetalConductivity: exactly one of rrr and rho_0 "
        "must be given (got " +
            std::string(by_rrr ? "both" : "neither") + ")");
  phonon_lorenz_ =
      p.phonon_lorenz_number > 0.0 ? p.phonon_lorenz_number : p.lorenz_number;

  const double g_ref = bloch_grueneisen_shape(p.reference_temperature, theta);
  if (by_rho) {
    require(p.residual_resistivity > 0.0 && std::isfinite(p.residual_resistivity),
            "rho_0", p.residual_resistivity, "a resistivity > 0 Ohm m");
    require(p.residual_resistivity < p.reference_resistivity, "rho_0",
            p.residual_resistivity,
            "a residual resistivity below reference_resistivity = " +
                format_double(p.reference_resistivity) + " Ohm m");
    residual_ = p.residual_resistivity;
    scale_ = (p.reference_resistivity - residual_) / g_ref;
  } else {
    require(p.rrr > 1.0 && std::isfinite(p.rrr), "rrr", p.rrr, "a ratio > 1");
    // rho_0 + C g(273) = RRR (rho_0 + C g(4))  =>  rho_0 = C a
    const double g_hi = bloch_grueneisen_shape(rrr_upper_temperature, theta);
    const double g_lo = bloch_grueneisen_shape(rrr_lower_temperature, theta);
    const double a = (g_hi - p.rrr * g_lo) / (p.rrr - 1.0);
    require(a > 0.0, "rrr", p.rrr,
            "a ratio below the ideal-metal limit rho_ph(273 K)/rho_ph(4 K) = " +
                format_double(g_hi / g_lo));
    scale_ = p.reference_resistivity / (g_ref + a);
    residual_ = scale_ * a;
  }
  if (p.wilson_ratio > 0.0) {
    // B(x) must stay positive: check on a logarithmic grid x = 1e-2 .. 1e3.
    for (int i = 0; i <= 250; ++i) {
      const double x = std::pow(10.0, -2.0 + 5.0 * i / 250.0);
      const double b = wilson_factor(p.wilson_ratio, x).value;
      require(b > 0.0, "wilson_ratio", p.wilson_ratio,
              "a ratio large enough that the Wilson factor stays positive (it is " +
                  format_double(b) + " at theta_R/T = " + format_double(x) + ")");
    }
  }
}

double MetalConductivity::phonon_resistivity(double temperature) const noexcept {
  return scale_ *
         bloch_grueneisen_shape(temperature, inputs_.resistive_debye_temperature);
}

double MetalConductivity::resistivity(double temperature) const {
  check_temperature(temperature, "quantacal::MetalConductivity::resistivity");
  return residual_ + phonon_resistivity(temperature);
}

double MetalConductivity::residual_resistivity_ratio() const {
  return resistivity(rrr_upper_temperature) / resistivity(rrr_lower_temperature);
}

MetalConductivity::Parts MetalConductivity::parts(double t) const {
  const double theta = inputs_.resistive_debye_temperature;
  const double x = theta / t;
  const double rho_ph = phonon_resistivity(t);
  const double j5 = bloch_grueneisen_integral(5, x);
  // d rho_ph/dT = (rho_ph/T) (5 - x J5'(x)/J5(x))
  const double drho_ph =
      j5 > 0.0 ? rho_ph / t * (5.0 - x * bloch_grueneisen_integrand(5, x) / j5) : 0.0;
  const Wilson b = wilson_factor(inputs_.wilson_ratio, x);
  const double db = b.slope * (-x / t);
  const double l0 = inputs_.lorenz_number;
  const double w = residual_ / (l0 * t) + rho_ph * b.value / (phonon_lorenz_ * t);
  const double dw = -residual_ / (l0 * t * t) +
                    (drho_ph * b.value + rho_ph * db) / (phonon_lorenz_ * t) -
                    rho_ph * b.value / (phonon_lorenz_ * t * t);
  Parts p{1.0 / w, -dw / (w * w), 0.0, 0.0};
  if (inputs_.lattice_coefficient > 0.0) {
    const double a = inputs_.lattice_coefficient;
    const double r = 1.0 / (a * t * t) + inputs_.lattice_umklapp * t;
    const double dr = -2.0 / (a * t * t * t) + inputs_.lattice_umklapp;
    p.k_g = 1.0 / r;
    p.dk_g = -dr / (r * r);
  }
  return p;
}

ConductivityValue MetalConductivity::evaluate(double temperature) const {
  check_temperature(temperature, "quantacal::MetalConductivity::evaluate");
  const Parts p = parts(temperature);
  return {p.k_e + p.k_g, p.dk_e + p.dk_g};
}

double MetalConductivity::electronic_conductivity(double temperature) const {
  check_temperature(temperature, "quantacal::MetalConductivity::electronic_conductivity");
  return parts(temperature).k_e;
}

double MetalConductivity::lattice_conductivity(double temperature) const {
  check_temperature(temperature, "quantacal::MetalConductivity::lattice_conductivity");
  return parts(temperature).k_g;
}

std::vector<Parameter> MetalConductivity::parameters() const {
  const auto& p = inputs_;
  std::vector<Parameter> out{{"theta_R", p.resistive_debye_temperature, "K"},
                             {"reference_resistivity", p.reference_resistivity, "Ohm m"},
                             {"reference_temperature", p.reference_temperature, "K"}};
  if (p.rrr != 0.0)
    out.push_back({"rrr", p.rrr, "1"});
  else
    out.push_back({"rho_0", p.residual_resistivity, "Ohm m"});
  out.push_back({"lorenz_number", p.lorenz_number, "W Ohm/K^2"});
  if (p.phonon_lorenz_number > 0.0)
    out.push_back({"phonon_lorenz_number", p.phonon_lorenz_number, "W Ohm/K^2"});
  if (p.wilson_ratio > 0.0)
    out.push_back({"wilson_ratio", p.wilson_ratio, "1"});
  if (p.lattice_coefficient > 0.0)
    out.push_back({"lattice_coefficient", p.lattice_coefficient, "W/m/K^3"});
  if (p.lattice_umklapp > 0.0)
    out.push_back({"lattice_umklapp", p.lattice_umklapp, "m/W"});
  return out;
}

std::shared_ptr<const MetalConductivity>
MetalConductivity::with_parameter(const std::string& name, double value) const {
  MetalConductivityParameters p = inputs_;
  if (name == "theta_R")
    p.resistive_debye_temperature = value;
  else if (name == "reference_resistivity")
    p.reference_resistivity = value;
  else if (name == "reference_temperature")
    p.reference_temperature = value;
  else if (name == "rrr" && inputs_.rrr != 0.0)
    p.rrr = value;
  else if (name == "rho_0" && inputs_.residual_resistivity != 0.0)
    p.residual_resistivity = value;
  else if (name == "lorenz_number")
    p.lorenz_number = value;
  else if (name == "phonon_lorenz_number")
    p.phonon_lorenz_number = value;
  else if (name == "wilson_ratio")
    p.wilson_ratio = value;
  else if (name == "lattice_coefficient")
    p.lattice_coefficient = value;
  else if (name == "lattice_umklapp")
    p.lattice_umklapp = value;
  else
    throw InputError::argument("", "", "",
                               "quantacal::MetalConductivity::with_parameter: unknown "
                               "parameter '" +
                                   name + "'");
  return std::make_shared<const MetalConductivity>(p);
}

std::shared_ptr<const MetalConductivity>
make_metal_conductivity(const MetalConductivityParameters& parameters) {
  return std::make_shared<const MetalConductivity>(parameters);
}

} // namespace quantacal
