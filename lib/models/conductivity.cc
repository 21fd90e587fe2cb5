// SPDX-License-Identifier: Apache-2.0
// Thermal conductivity: constant, or a monotone table in log-log coordinates.
#include "monotone_cubic.h"
#include "validation.h"

#include <quantacal/common/exceptions.h>
#include <quantacal/models/conductivity.h>

#include <algorithm>
#include <cmath>
#include <string>
#include <utility>

namespace quantacal {
namespace {

void check_temperature(const char* function, double t) {
  if (!std::isfinite(t) || !(t > 0.0))
    throw RangeError(function, "", "0 < T < inf", t);
}

class ConstantConductivity final : public ConductivityModel {
public:
  explicit ConstantConductivity(double k) : k_(k) {}
  ConductivityValue evaluate(double t) const override {
    check_temperature("quantacal::ConstantConductivity::evaluate", t);
    return {k_, 0.0};
  }
  std::string kind() const override { return "constant"; }

private:
  double k_;
};

// ln k = p(ln T) with p the Fritsch-Carlson monotone cubic through (ln T_i, ln k_i);
// k = e^p, dk/dT = k p'(ln T)/T. Outside the points p continues linearly with the
// end slope (the end power law k ~ T^p'), so k and dk/dT stay continuous there.
class TableConductivity final : public ConductivityModel {
public:
  TableConductivity(std::vector<double> t, std::vector<double> k) {
    x_.resize(t.size());
    y_.resize(k.size());
    for (std::size_t i = 0; i < t.size(); ++i) {
      x_[i] = std::log(t[i]);
      y_[i] = std::log(k[i]);
    }
    d_ = detail::monotone_slopes(x_, y_);
    t_ = std::move(t);
    k_ = std::move(k);
  }

  ConductivityValue evaluate(double t) const override {
    check_temperature("quantacal::TableConductivity::evaluate", t);
    const std::size_t n = x_.size();
    const double x = std::log(t);
    double p = 0.0;
    double slope = 0.0;
    if (t <= t_.front()) {
      slope = d_.front();
      p = y_.front() + slope * (x - x_.front());
      if (t == t_.front())
        return {k_.front(), k_.front() * slope / t};
    } else if (t >= t_.back()) {
      slope = d_.back();
      p = y_.back() + slope * (x - x_.back());
      if (t == t_.back())
        return {k_.back(), k_.back() * slope / t};
    } else {
      std::size_t i = static_cast<std::size_t>(std::upper_bound(t_.begin(), t_.end(), t) -
                                               t_.begin()) -
                      1;
      i = std::min(i, n - 2);
      if (t == t_[i]) // exactly the measured point
        return {k_[i], k_[i] * d_[i] / t};
      const detail::HermitePoint h = detail::hermite_point(
          x_[i], x_[i + 1] - x_[i], y_[i], y_[i + 1], d_[i], d_[i + 1], x);
      p = h.value;
      slope = h.first;
    }
    const double k = std::exp(p);
    return {k, k * slope / t};
  }
  std::string kind() const override { return "table"; }
  // ln k is a cubic in ln T between knots; its second derivative jumps at them
  std::vector<double> breakpoints() const override { return t_; }

private:
  std::vector<double> t_, k_; // as given
  std::vector<double> x_, y_; // ln T, ln k
  std::vector<double> d_;     // d ln k / d ln T at the points
};

} // namespace

ConductivityPtr make_constant_conductivity(double value) {
  detail::require_positive("conductivity", "value", value, "W/m/K");
  return std::make_shared<ConstantConductivity>(value);
}

ConductivityPtr make_table_conductivity(std::vector<double> temperatures,
                                        std::vector<double> values) {
  if (temperatures.size() != values.size())
    throw InputError::argument(
        "", "", "",
        "conductivity table: " + std::to_string(temperatures.size()) +
            " temperatures but " + std::to_string(values.size()) +
            " values: expected one value per temperature");
  if (temperatures.size() < 2)
    throw InputError::argument(
        "", "", "",
        "conductivity table: " + std::to_string(temperatures.size()) +
            " points: expected at least 2");
  for (std::size_t i = 0; i < temperatures.size(); ++i) {
    const std::string ti = "temperatures[" + std::to_string(i) + "]";
    detail::require_positive("conductivity table", ti, temperatures[i], "K");
    if (i > 0 && !(temperatures[i] > temperatures[i - 1]))
      detail::invalid_parameter("conductivity table", ti, temperatures[i], "K",
                                "> temperatures[" + std::to_string(i - 1) +
                                    "] = " + format_double(temperatures[i - 1]) +
                                    " K (strictly increasing)");
    detail::require_positive("conductivity table", "values[" + std::to_string(i) + "]",
                             values[i], "W/m/K");
  }
  return std::make_shared<TableConductivity>(std::move(temperatures), std::move(values));
}

} // namespace quantacal
