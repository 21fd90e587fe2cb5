// SPDX-License-Identifier: Apache-2.0
// The closed-form contributions: einstein, debye, electronic, schottky, transition.
// Formulas, branches and measured accuracy: docs/theory.md.
#include "validation.h"

#include <quantacal/models/contribution.h>
#include <quantacal/models/detail/debye.h>

#include <boost/math/constants/constants.hpp>
#include <boost/math/special_functions/bernoulli.hpp>
#include <boost/math/special_functions/erf.hpp>
#include <boost/math/special_functions/factorials.hpp>

#include <array>
#include <cmath>

namespace quantacal {
namespace {

// ---- einstein ---------------------------------------------------------------------

// x coth(x/2) - 2 = 2 sum_k B_2k x^2k / (2k)!  (Abramowitz and Stegun 4.5.67).
// The closed form x (1 + e^-x)/(1 - e^-x) - 2 ~ x^2/6 loses a factor 12/x^2 to
// cancellation, so below x = 2 the series (terms fall as (x/2 pi)^2k; 20 terms reach
// 1e-20 at x = 2) is used there; above, the closed form loses less than one digit.
constexpr double einstein_series_limit = 2.0;
constexpr int n_einstein_terms = 20;

struct CothSeries {
  std::array<double, n_einstein_terms> c{};
  CothSeries() {
    for (int k = 1; k <= n_einstein_terms; ++k)
      c[k - 1] = 2.0 * boost::math::bernoulli_b2n<double>(k) /
                 boost::math::factorial<double>(static_cast<unsigned>(2 * k));
  }
};

double x_coth_half_minus_2(double x, double em, double one_minus) {
  if (x < einstein_series_limit) {
    static const CothSeries s;
    const double y = x * x;
    double r = s.c[n_einstein_terms - 1];
    for (int k = n_einstein_terms - 2; k >= 0; --k)
      r = r * y + s.c[k];
    return r * y;
  }
  return x * (1.0 + em) / one_minus - 2.0;
}

class Einstein final : public Contribution {
public:
  Einstein(double theta, double modes) : theta_(theta), modes_(modes) {}
  std::string kind() const override { return "einstein"; }
  bool dilated() const override { return true; }

  // With em = e^-x and 1 - e^-x from expm1, nothing overflows for any x > 0:
  // U = n R theta em/(1-em), C = n R x^2 em/(1-em)^2, dC/dT = C (x coth(x/2) - 2)/T.
  ThermalState evaluate(double t) const override {
    const double x = theta_ / t;
    const double em = std::exp(-x);
    const double one_minus = -std::expm1(-x);
    const double nr = modes_ * gas_constant;
    ThermalState s;
    s.energy = nr * theta_ * em / one_minus;
    s.capacity = nr * x * x * em / (one_minus * one_minus);
    s.capacity_derivative = s.capacity * x_coth_half_minus_2(x, em, one_minus) / t;
    return s;
  }

  std::vector<Parameter> parameters() const override {
    return {{"theta_E", theta_, "K"}, {"modes", modes_, "1"}};
  }
  ContributionPtr with_parameter(const std::string& name, double value) const override {
    if (name == "theta_E")
      return make_einstein(value, modes_);
    if (name == "modes")
      return make_einstein(theta_, value);
    detail::unknown_parameter("einstein", name, "theta_E, modes");
  }

private:
  double theta_;
  double modes_;
};

// ---- debye ------------------------------------------------------------------------

class Debye final : public Contribution {
public:
  Debye(double theta, double modes) : theta_(theta), modes_(modes) {}
  std::string kind() const override { return "debye"; }
  bool dilated() const override { return true; }

  ThermalState evaluate(double t) const override {
    const detail::DebyeValues v = detail::debye_values(theta_ / t);
    const double nr = modes_ * gas_constant;
    ThermalState s;
    s.energy = nr * t * v.energy;
    s.capacity = nr * v.capacity;
    s.capacity_derivative = nr * v.slope / t;
    return s;
  }

  std::vector<Parameter> parameters() const override {
    return {{"theta_D", theta_, "K"}, {"modes", modes_, "1"}};
  }
  ContributionPtr with_parameter(const std::string& name, double value) const override {
    if (name == "theta_D")
      return make_debye(value, modes_);
    if (name == "modes")
      return make_debye(theta_, value);
    detail::unknown_parameter("debye", name, "theta_D, modes");
  }

private:
  double theta_;
  double modes_;
};

// ---- electronic -------------------------------------------------------------------

class Electronic final : public Contribution {
public:
  explicit Electronic(double gamma) : gamma_(gamma) {}
  std::string kind() const override { return "electronic"; }
  bool dilated() const override { return true; }
  ThermalState evaluate(double t) const override {
    return ThermalState{0.5 * gamma_ * t * t, gamma_ * t, gamma_};
  }
  std::vector<Parameter> parameters() const override {
    return {{"gamma", gamma_, "J/mol/K^2"}};
  }
  ContributionPtr with_parameter(const std::string& name, double value) const override {
    if (name == "gamma")
      return make_electronic(value);
    detail::unknown_parameter("electronic", name, "gamma");
  }

private:
  double gamma_;
};

// ---- schottky ---------------------------------------------------------------------

class Schottky final : public Contribution {
public:
  Schottky(double gap, double g, double centres) : gap_(gap), g_(g), centres_(centres) {}
  std::string kind() const override { return "schottky"; }

  // With y = g e^-x (never overflows, y <= g): U = n R Delta y/(1+y),
  // C = n R x^2 y/(1+y)^2, dC/dT = C [x (1-y)/(1+y) - 2]/T.
  ThermalState evaluate(double t) const override {
    const double x = gap_ / t;
    const double y = g_ * std::exp(-x);
    const double p = 1.0 / (1.0 + y);
    const double nr = centres_ * gas_constant;
    ThermalState s;
    s.energy = nr * gap_ * y * p;
    s.capacity = nr * x * x * y * p * p;
    s.capacity_derivative = s.capacity * (x * (1.0 - y) * p - 2.0) / t;
    return s;
  }

  std::vector<Parameter> parameters() const override {
    return {
        {"gap", gap_, "K"}, {"degeneracy_ratio", g_, "1"}, {"centres", centres_, "1"}};
  }
  ContributionPtr with_parameter(const std::string& name, double value) const override {
    if (name == "gap")
      return make_schottky(value, g_, centres_);
    if (name == "degeneracy_ratio")
      return make_schottky(gap_, value, centres_);
    if (name == "centres")
      return make_schottky(gap_, g_, value);
    detail::unknown_parameter("schottky", name, "gap, degeneracy_ratio, centres");
  }

private:
  double gap_;
  double g_;
  double centres_;
};

// ---- transition -------------------------------------------------------------------

class Transition final : public Contribution {
public:
  Transition(double tt, double latent, double width)
      : tt_(tt), latent_(latent), width_(width),
        lower_tail_at_zero_(lower_tail(-tt / width)) {}
  std::string kind() const override { return "transition"; }
  std::vector<double> breakpoints() const override { return {tt_}; }

  // C = L phi(z)/w, dC/dT = -L z phi(z)/w^2, U = L [Phi(z) - Phi(z0)] with
  // z = (T - Tt)/w, z0 = -Tt/w. Each normal tail comes from erfc, so neither
  // the rise below Tt nor the approach to L above it cancels:
  // z <= 0: Phi(z) = erfc(-z/sqrt2)/2; z > 0: Phi(z) = 1 - erfc(z/sqrt2)/2.
  ThermalState evaluate(double t) const override {
    const double z = (t - tt_) / width_;
    const double phi =
        std::exp(-0.5 * z * z) * boost::math::constants::one_div_root_two_pi<double>();
    ThermalState s;
    s.capacity = latent_ * phi / width_;
    s.capacity_derivative = -s.capacity * z / width_;
    if (z <= 0.0)
      s.energy = latent_ * (lower_tail(z) - lower_tail_at_zero_);
    else
      s.energy = latent_ * ((1.0 - lower_tail_at_zero_) - upper_tail(z));
    return s;
  }

  std::vector<Parameter> parameters() const override {
    return {{"temperature", tt_, "K"},
            {"latent_heat", latent_, "J/mol"},
            {"width", width_, "K"}};
  }
  ContributionPtr with_parameter(const std::string& name, double value) const override {
    if (name == "temperature")
      return make_transition(value, latent_, width_);
    if (name == "latent_heat")
      return make_transition(tt_, value, width_);
    if (name == "width")
      return make_transition(tt_, latent_, value);
    detail::unknown_parameter("transition", name, "temperature, latent_heat, width");
  }

private:
  static double lower_tail(double z) {
    return 0.5 *
           boost::math::erfc(-z * boost::math::constants::one_div_root_two<double>());
  }
  static double upper_tail(double z) {
    return 0.5 *
           boost::math::erfc(z * boost::math::constants::one_div_root_two<double>());
  }

  double tt_;
  double latent_;
  double width_;
  double lower_tail_at_zero_;
};

} // namespace

ContributionPtr make_einstein(double theta, double modes) {
  detail::require_positive("einstein", "theta_E", theta, "K");
  detail::require_positive("einstein", "modes", modes, "1");
  return std::make_shared<Einstein>(theta, modes);
}

ContributionPtr make_debye(double theta, double modes) {
  detail::require_positive("debye", "theta_D", theta, "K");
  detail::require_positive("debye", "modes", modes, "1");
  return std::make_shared<Debye>(theta, modes);
}

ContributionPtr make_electronic(double gamma) {
  detail::require_non_negative("electronic", "gamma", gamma, "J/mol/K^2");
  return std::make_shared<Electronic>(gamma);
}

ContributionPtr make_schottky(double gap, double degeneracy_ratio, double centres) {
  detail::require_positive("schottky", "gap", gap, "K");
  detail::require_positive("schottky", "degeneracy_ratio", degeneracy_ratio, "1");
  detail::require_positive("schottky", "centres", centres, "1");
  return std::make_shared<Schottky>(gap, degeneracy_ratio, centres);
}

ContributionPtr make_transition(double temperature, double latent_heat, double width) {
  detail::require_positive("transition", "temperature", temperature, "K");
  detail::require_positive("transition", "latent_heat", latent_heat, "J/mol");
  detail::require_positive("transition", "width", width, "K");
  return std::make_shared<Transition>(temperature, latent_heat, width);
}

} // namespace quantacal
