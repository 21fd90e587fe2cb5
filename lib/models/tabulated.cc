// SPDX-License-Identifier: Apache-2.0
// Measured capacity points (monotone cubic, exact energy) and the Shomate polynomial.
#include "monotone_cubic.h"
#include "validation.h"

#include <quantacal/common/exceptions.h>
#include <quantacal/models/contribution.h>

#include <algorithm>
#include <cmath>
#include <string>
#include <utility>

namespace quantacal {
namespace {

// ---- tabulated --------------------------------------------------------------------

class Tabulated final : public Contribution {
public:
  Tabulated(std::vector<double> t, std::vector<double> c, LowerExtension below,
            double scale)
      : t_(std::move(t)), raw_(std::move(c)), below_(below), scale_(scale) {
    c_.resize(raw_.size());
    for (std::size_t i = 0; i < raw_.size(); ++i)
      c_[i] = scale_ * raw_[i];
    d_ = detail::monotone_slopes(t_, c_);
    prefix_.resize(t_.size());
    prefix_[0] = below_.kind == LowerExtension::Kind::debye_t3 ? 0.25 * c_[0] * t_[0]
                                                               : scale_ * below_.energy;
    for (std::size_t i = 0; i + 1 < t_.size(); ++i) {
      const double h = t_[i + 1] - t_[i];
      // the whole segment: h (y0 + y1)/2 + h^2 (d0 - d1)/12
      prefix_[i + 1] =
          prefix_[i] + 0.5 * h * (c_[i] + c_[i + 1]) + h * h * (d_[i] - d_[i + 1]) / 12.0;
    }
  }

  std::string kind() const override { return "tabulated"; }
  double lower_temperature() const override {
    return below_.kind == LowerExtension::Kind::debye_t3 ? 0.0 : t_.front();
  }
  double upper_temperature() const override { return t_.back(); }
  std::vector<double> breakpoints() const override { return t_; }

  ThermalState evaluate(double t) const override {
    ThermalState s;
    if (t < t_.front() && below_.kind == LowerExtension::Kind::debye_t3) {
      // C = C1 (T/T1)^3, U = C1 T^4/(4 T1^3)
      const double r = t / t_.front();
      s.capacity = c_.front() * r * r * r;
      s.energy = 0.25 * s.capacity * t;
      s.capacity_derivative = 3.0 * s.capacity / t;
      return s;
    }
    const std::size_t n = t_.size();
    std::size_t i =
        static_cast<std::size_t>(std::upper_bound(t_.begin(), t_.end(), t) - t_.begin());
    i = i == 0 ? 0 : std::min(i - 1, n - 2);
    const double h = t_[i + 1] - t_[i];
    const detail::HermitePoint p =
        detail::hermite_point(t_[i], h, c_[i], c_[i + 1], d_[i], d_[i + 1], t);
    s.capacity = p.value;
    s.capacity_derivative = p.first;
    s.energy = prefix_[i] +
               detail::hermite_integral(t_[i], h, c_[i], c_[i + 1], d_[i], d_[i + 1], t);
    return s;
  }

  std::vector<Parameter> parameters() const override { return {{"scale", scale_, "1"}}; }
  ContributionPtr with_parameter(const std::string& name, double value) const override {
    if (name != "scale")
      detail::unknown_parameter("tabulated", name, "scale");
    detail::require_positive("tabulated", "scale", value, "1");
    return std::make_shared<Tabulated>(t_, raw_, below_, value);
  }

private:
  std::vector<double> t_;   // knots, K
  std::vector<double> raw_; // capacities as given, J/mol/K
  LowerExtension below_;
  double scale_;
  std::vector<double> c_;      // scale * raw_
  std::vector<double> d_;      // Fritsch-Carlson slopes, J/mol/K^2
  std::vector<double> prefix_; // U at the knots, J/mol
};

// ---- shomate ----------------------------------------------------------------------

class Shomate final : public Contribution {
public:
  Shomate(std::vector<double> k, double t_low, double t_high, LowerExtension below)
      : k_(std::move(k)), t_low_(t_low), t_high_(t_high), below_(below) {
    c_low_ = polynomial(t_low_).capacity;
    u_low_ = below_.kind == LowerExtension::Kind::debye_t3 ? 0.25 * c_low_ * t_low_
                                                           : below_.energy;
  }

  std::string kind() const override { return "shomate"; }
  double lower_temperature() const override {
    return below_.kind == LowerExtension::Kind::debye_t3 ? 0.0 : t_low_;
  }
  double upper_temperature() const override { return t_high_; }
  std::vector<double> breakpoints() const override { return {t_low_}; }

  ThermalState evaluate(double t) const override {
    if (t < t_low_ && below_.kind == LowerExtension::Kind::debye_t3) {
      ThermalState s;
      const double r = t / t_low_;
      s.capacity = c_low_ * r * r * r;
      s.energy = 0.25 * s.capacity * t;
      s.capacity_derivative = 3.0 * s.capacity / t;
      return s;
    }
    ThermalState s = polynomial(t);
    // U(T) = U(t_low) + 1000 int_{t0}^{t} C dt, each power difference factored by
    // (t - t0) so that nothing cancels near t_low.
    const double x = t / 1000.0;
    const double x0 = t_low_ / 1000.0;
    const double dx = x - x0;
    const double integral =
        dx * (k_[0] + k_[1] * (x + x0) / 2.0 + k_[2] * (x * x + x * x0 + x0 * x0) / 3.0 +
              k_[3] * (x + x0) * (x * x + x0 * x0) / 4.0 + k_[4] / (x * x0));
    s.energy = u_low_ + 1000.0 * integral;
    return s;
  }

  std::vector<Parameter> parameters() const override {
    static const char* names[] = {"A", "B", "C", "D", "E"};
    std::vector<Parameter> p;
    for (int i = 0; i < 5; ++i)
      p.push_back({names[i], k_[i], "J/mol/K"});
    return p;
  }
  ContributionPtr with_parameter(const std::string& name, double value) const override {
    static const std::string names[] = {"A", "B", "C", "D", "E"};
    for (int i = 0; i < 5; ++i) {
      if (name == names[i]) {
        std::vector<double> k = k_;
        k[i] = value;
        return make_shomate(k, t_low_, t_high_, below_);
      }
    }
    detail::unknown_parameter("shomate", name, "A, B, C, D, E");
  }

private:
  // C = A + B t + C t^2 + D t^3 + E/t^2, dC/dT = (B + 2C t + 3D t^2 - 2E/t^3)/1000 K
  ThermalState polynomial(double temperature) const {
    const double x = temperature / 1000.0;
    ThermalState s;
    s.capacity = k_[0] + x * (k_[1] + x * (k_[2] + x * k_[3])) + k_[4] / (x * x);
    s.capacity_derivative =
        (k_[1] + x * (2.0 * k_[2] + x * 3.0 * k_[3]) - 2.0 * k_[4] / (x * x * x)) /
        1000.0;
    return s;
  }

  std::vector<double> k_;
  double t_low_;
  double t_high_;
  LowerExtension below_;
  double c_low_ = 0.0;
  double u_low_ = 0.0;
};

void check_below(const std::string& kind, const LowerExtension& below) {
  if (below.kind == LowerExtension::Kind::energy)
    detail::require_non_negative(kind, "energy below", below.energy, "J/mol");
}

} // namespace

ContributionPtr make_tabulated(std::vector<double> temperatures,
                               std::vector<double> capacities, LowerExtension below) {
  if (temperatures.size() != capacities.size())
    throw InputError::argument("", "", "",
                               "tabulated: " + std::to_string(temperatures.size()) +
                                   " temperatures but " +
                                   std::to_string(capacities.size()) +
                                   " capacities: expected one capacity per temperature");
  if (temperatures.size() < 2)
    throw InputError::argument("", "", "",
                               "tabulated: " + std::to_string(temperatures.size()) +
                                   " points: expected at least 2");
  for (std::size_t i = 0; i < temperatures.size(); ++i) {
    const std::string ti = "temperatures[" + std::to_string(i) + "]";
    detail::require_positive("tabulated", ti, temperatures[i], "K");
    if (i > 0 && !(temperatures[i] > temperatures[i - 1]))
      detail::invalid_parameter("tabulated", ti, temperatures[i], "K",
                                "> temperatures[" + std::to_string(i - 1) +
                                    "] = " + format_double(temperatures[i - 1]) +
                                    " K (strictly increasing)");
    detail::require_non_negative("tabulated", "capacities[" + std::to_string(i) + "]",
                                 capacities[i], "J/mol/K");
  }
  check_below("tabulated", below);
  return std::make_shared<Tabulated>(std::move(temperatures), std::move(capacities),
                                     below, 1.0);
}

ContributionPtr make_shomate(const std::vector<double>& coefficients, double t_low,
                             double t_high, LowerExtension below) {
  if (coefficients.size() != 5)
    throw InputError::argument("", "", "",
                               "shomate: " + std::to_string(coefficients.size()) +
                                   " coefficients: expected 5 (A, B, C, D, E)");
  static const char* names[] = {"A", "B", "C", "D", "E"};
  for (int i = 0; i < 5; ++i)
    detail::require_finite("shomate", names[i], coefficients[i], "J/mol/K");
  detail::require_positive("shomate", "t_low", t_low, "K");
  detail::require_positive("shomate", "t_high", t_high, "K");
  if (!(t_high > t_low))
    detail::invalid_parameter("shomate", "t_high", t_high, "K",
                              "> t_low = " + format_double(t_low) + " K");
  check_below("shomate", below);
  auto term = std::make_shared<Shomate>(coefficients, t_low, t_high, below);
  if (below.kind == LowerExtension::Kind::debye_t3) {
    const double c_low = term->evaluate(t_low).capacity;
    if (!(c_low >= 0.0))
      detail::invalid_parameter("shomate", "C(t_low)", c_low, "J/mol/K",
                                ">= 0 J/mol/K for a debye_t3 extension below t_low");
  }
  return term;
}

} // namespace quantacal
