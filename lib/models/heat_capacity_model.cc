// SPDX-License-Identifier: Apache-2.0
// HeatCapacityModel (sum of terms + dilation) and the Neumann-Kopp scaled term.
#include "validation.h"

#include <quantacal/common/exceptions.h>
#include <quantacal/models/heat_capacity_model.h>

#include <boost/math/quadrature/gauss_kronrod.hpp>

#include <algorithm>
#include <cmath>
#include <limits>
#include <stdexcept>
#include <utility>

namespace quantacal {
namespace {

constexpr const char* evaluate_function = "quantacal::HeatCapacityModel::evaluate";

// Relative accuracy asked of the dilation-energy quadrature, and its depth.
constexpr double dilation_tolerance = 1e-12;
constexpr unsigned dilation_max_depth = 12;

std::string domain_condition(double lo, double hi) {
  const std::string left = lo > 0.0 ? format_double(lo) + " K <= T" : "0 < T";
  const std::string right = std::isinf(hi) ? " < inf" : " <= " + format_double(hi) + " K";
  return left + right;
}

class Scaled final : public Contribution {
public:
  Scaled(std::shared_ptr<const HeatCapacityModel> component, double x)
      : component_(std::move(component)), x_(x) {}
  std::string kind() const override { return "scaled"; }
  // The component checks its own range (its evaluate raises the RangeError).
  ThermalState evaluate(double t) const override { return x_ * component_->evaluate(t); }
  double lower_temperature() const override { return component_->lower_temperature(); }
  double upper_temperature() const override { return component_->upper_temperature(); }
  std::vector<double> breakpoints() const override { return component_->breakpoints(); }
  std::vector<Parameter> parameters() const override {
    return {{"mole_fraction", x_, "1"}};
  }
  ContributionPtr with_parameter(const std::string& name, double value) const override {
    if (name != "mole_fraction")
      detail::unknown_parameter("scaled", name, "mole_fraction");
    return make_scaled(component_, value);
  }

private:
  std::shared_ptr<const HeatCapacityModel> component_;
  double x_;
};

void check_dilation(const Dilation& d) {
  if (d.kind == Dilation::Kind::nernst_lindemann) {
    detail::require_non_negative("dilation", "coefficient", d.coefficient, "mol/J");
  } else {
    detail::require_non_negative("dilation", "grueneisen", d.grueneisen, "1");
    detail::require_positive("dilation", "bulk_modulus", d.bulk_modulus, "Pa");
    detail::require_positive("dilation", "molar_volume", d.molar_volume, "m^3/mol");
  }
}

} // namespace

ContributionPtr make_scaled(std::shared_ptr<const HeatCapacityModel> component,
                            double mole_fraction) {
  if (!component)
    throw InputError::argument("", "", "",
                               "scaled: component: expected a model, got none");
  if (!std::isfinite(mole_fraction) || !(mole_fraction > 0.0) || !(mole_fraction <= 1.0))
    detail::invalid_parameter("scaled", "mole_fraction", mole_fraction, "1",
                              "0 < x <= 1");
  return std::make_shared<Scaled>(std::move(component), mole_fraction);
}

HeatCapacityModel::HeatCapacityModel(std::string name,
                                     std::vector<ContributionPtr> contributions,
                                     std::optional<Dilation> dilation)
    : name_(std::move(name)), contributions_(std::move(contributions)),
      dilation_(std::move(dilation)) {
  if (contributions_.empty())
    throw InputError::argument(
        "", "", "", name_ + ": heat capacity: expected at least one contribution");
  for (std::size_t i = 0; i < contributions_.size(); ++i)
    if (!contributions_[i])
      throw InputError::argument("", "", "",
                                 name_ + ": heat capacity contribution " +
                                     std::to_string(i) +
                                     ": expected a contribution, got none");
  if (dilation_)
    check_dilation(*dilation_);
  if (!(lower_temperature() < upper_temperature()))
    throw InputError::argument(
        "", "", "",
        name_ + ": the contributions' temperature ranges do not overlap (" +
            domain_condition(lower_temperature(), upper_temperature()) + ")");
}

double HeatCapacityModel::lower_temperature() const {
  double lo = 0.0;
  for (const auto& c : contributions_)
    lo = std::max(lo, c->lower_temperature());
  return lo;
}

double HeatCapacityModel::upper_temperature() const {
  double hi = std::numeric_limits<double>::infinity();
  for (const auto& c : contributions_)
    hi = std::min(hi, c->upper_temperature());
  return hi;
}

std::vector<double> HeatCapacityModel::breakpoints() const {
  std::vector<double> all;
  for (const auto& c : contributions_) {
    const std::vector<double> b = c->breakpoints();
    all.insert(all.end(), b.begin(), b.end());
  }
  std::sort(all.begin(), all.end());
  all.erase(std::unique(all.begin(), all.end()), all.end());
  return all;
}

HeatCapacityModel
HeatCapacityModel::with_contribution(std::size_t index,
                                     ContributionPtr replacement) const {
  if (index >= contributions_.size())
    throw InputError::argument("", "", "",
                               name_ + ": contribution index " + std::to_string(index) +
                                   ": expected < " +
                                   std::to_string(contributions_.size()));
  std::vector<ContributionPtr> terms = contributions_;
  terms[index] = std::move(replacement);
  return HeatCapacityModel(name_, std::move(terms), dilation_);
}

ThermalState HeatCapacityModel::evaluate(double temperature) const {
  const double lo = lower_temperature();
  const double hi = upper_temperature();
  if (!std::isfinite(temperature) || !(temperature > 0.0) || temperature < lo ||
      temperature > hi)
    throw RangeError(evaluate_function, name_, domain_condition(lo, hi), temperature);

  ThermalState total;
  if (!dilation_) {
    for (const auto& c : contributions_)
      total += c->evaluate(temperature);
    return total;
  }

  ThermalState cv; // the constant-volume part the dilation acts on
  for (const auto& c : contributions_) {
    if (c->dilated())
      cv += c->evaluate(temperature);
    else
      total += c->evaluate(temperature);
  }
  const double a = dilation_->a();
  const bool nernst = dilation_->kind == Dilation::Kind::nernst_lindemann;

  // C_p - C_v: Nernst-Lindemann C_p = 2 C_v/(1 + s), s = sqrt(1 - 4 A T C_v), so that
  // C_p - C_v = A T C_p^2 with no cancellation; Grueneisen C_p - C_v = A T C_v^2.
  if (nernst && !(4.0 * a * temperature * cv.capacity < 1.0))
    throw NumericalError(evaluate_function,
                         name_ + ": Nernst-Lindemann dilation has no solution at T = " +
                             format_double(temperature) + " K (4 A T C_v = " +
                             format_double(4.0 * a * temperature * cv.capacity) +
                             ", must be < 1)");
  ThermalState extra;
  if (nernst) {
    const double s = std::sqrt(1.0 - 4.0 * a * temperature * cv.capacity);
    const double cp = 2.0 * cv.capacity / (1.0 + s);
    extra.capacity = a * temperature * cp * cp;
    // implicit differentiation of C_p - C_v = A C_p^2 T: C_p' (1 - 2 A C_p T) = C_v' + A
    // C_p^2, and 1 - 2 A C_p T = s
    extra.capacity_derivative =
        (cv.capacity_derivative + a * cp * cp) / s - cv.capacity_derivative;
  } else {
    extra.capacity = a * temperature * cv.capacity * cv.capacity;
    extra.capacity_derivative =
        a * cv.capacity * (2.0 * temperature * cv.capacity_derivative + cv.capacity);
  }

  // Energy of the correction: Gauss-Kronrod on [0, T]. C_v T grows with T for
  // every dilated term, so 4 A T' C_v(T') < 1 holds on all of [0, T].
  const auto delta_c = [&](double t) {
    if (!(t > 0.0))
      return 0.0;
    double c = 0.0;
    for (const auto& term : contributions_)
      if (term->dilated())
        c += term->evaluate(t).capacity;
    if (nernst) {
      const double cp = 2.0 * c / (1.0 + std::sqrt(1.0 - 4.0 * a * t * c));
      return a * t * cp * cp;
    }
    return a * t * c * c;
  };
  double error = 0.0;
  extra.energy = boost::math::quadrature::gauss_kronrod<double, 61>::integrate(
      delta_c, 0.0, temperature, dilation_max_depth, dilation_tolerance, &error);

  total += cv;
  total += extra;
  return total;
}

} // namespace quantacal
