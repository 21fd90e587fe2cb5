// SPDX-License-Identifier: Apache-2.0
// MonotoneCubic: the public curve built on the layer's Fritsch-Carlson slopes
// (monotone_cubic.h in this folder, shared with the tabulated capacity and the
// conductivity table).
#include "monotone_cubic.h"

#include <quantacal/common/exceptions.h>
#include <quantacal/models/monotone_cubic.h>

#include <algorithm>
#include <cmath>
#include <string>
#include <utility>

namespace quantacal {
namespace {

std::string entry(const char* name, std::size_t i) {
  return std::string(name) + "[" + std::to_string(i) + "]";
}

void check_points(const std::vector<double>& x, const std::vector<double>& y) {
  const char* const kind = "MonotoneCubic";
  if (x.size() != y.size())
    throw InputError::argument(kind, "y", std::to_string(y.size()) + " values",
                               "as many values as x (" + std::to_string(x.size()) + ")");
  if (x.empty())
    throw InputError::argument(kind, "", "", "at least one point");
  for (std::size_t i = 0; i < x.size(); ++i) {
    if (!std::isfinite(x[i]))
      throw InputError::argument(kind, entry("x", i), format_double(x[i]),
                                 "a finite value");
    if (!std::isfinite(y[i]))
      throw InputError::argument(kind, entry("y", i), format_double(y[i]),
                                 "a finite value");
    if (i > 0 && !(x[i] > x[i - 1]))
      throw InputError::argument(kind, entry("x", i), format_double(x[i]),
                                 "values strictly increasing (x[" +
                                     std::to_string(i - 1) +
                                     "] = " + format_double(x[i - 1]) + ")");
  }
}

} // namespace

MonotoneCubic::MonotoneCubic(std::vector<double> x, std::vector<double> y) {
  check_points(x, y);
  x_ = std::move(x);
  y_ = std::move(y);
  slopes_ = x_.size() < 2 ? std::vector<double>(x_.size(), 0.0)
                          : detail::monotone_slopes(x_, y_);
}

std::size_t MonotoneCubic::interval(double x) const {
  const auto it = std::upper_bound(x_.begin(), x_.end(), x);
  return static_cast<std::size_t>(it - x_.begin()) - 1;
}

// The Hermite basis written out, h00 y_i + h10 h d_i + h01 y_{i+1} + h11 h d_{i+1},
// in this order (the boundary curves of the solver have always been evaluated so).
double MonotoneCubic::value(double x) const {
  if (y_.empty())
    return 0.0;
  if (y_.size() == 1 || x <= x_.front())
    return y_.front();
  if (x >= x_.back())
    return y_.back();
  if (std::isnan(x))
    return x;
  const std::size_t i = interval(x);
  const double h = x_[i + 1] - x_[i], s = (x - x_[i]) / h;
  const double h00 = (1 + 2 * s) * (1 - s) * (1 - s), h10 = s * (1 - s) * (1 - s);
  const double h01 = s * s * (3 - 2 * s), h11 = s * s * (s - 1);
  return h00 * y_[i] + h10 * h * slopes_[i] + h01 * y_[i + 1] + h11 * h * slopes_[i + 1];
}

double MonotoneCubic::derivative(double x) const {
  if (y_.size() < 2 || x <= x_.front() || x >= x_.back())
    return 0.0;
  if (std::isnan(x))
    return x;
  const std::size_t i = interval(x);
  const double h = x_[i + 1] - x_[i], s = (x - x_[i]) / h;
  const double dh00 = 6 * s * s - 6 * s, dh10 = 3 * s * s - 4 * s + 1;
  const double dh01 = -6 * s * s + 6 * s, dh11 = 3 * s * s - 2 * s;
  return (dh00 * y_[i] + dh01 * y_[i + 1]) / h + dh10 * slopes_[i] +
         dh11 * slopes_[i + 1];
}

} // namespace quantacal
