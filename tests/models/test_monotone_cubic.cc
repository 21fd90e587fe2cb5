// SPDX-License-Identifier: Apache-2.0
// MonotoneCubic against the outside reference Boost.Math pchip
// (boost/math/interpolators/pchip.hpp: Fritsch and Carlson, SIAM J. Numer. Anal. 17
// (1980) 238, slopes in the Fritsch-Butland weighted harmonic mean, secant end
// slopes), and the properties Fritsch and Carlson prove: the curve passes through
// its points and is monotone on every interval where the data are.
#include <quantacal/common/exceptions.h>
#include <quantacal/models/monotone_cubic.h>

#include <math.h> // ::isnan, which Boost 1.74's pchip.hpp calls unqualified

#include <boost/math/interpolators/pchip.hpp>

#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <limits>
#include <vector>

namespace {

using quantacal::MonotoneCubic;

struct Points {
  const char* name;
  std::vector<double> x;
  std::vector<double> y;
};

// Three kinds of data: a curve with a sharp maximum and a minimum (a water boiling
// curve h(T_surface) in W/m^2/K against K, round figures), a non-monotone table on
// uneven spacing (OFHC copper conductivity, W/m/K against K, NIST cryogenic
// correlation values as in test_conductivity.cc) and a monotone rise with flat parts
// (zero secants make zero slopes).
std::vector<Points> data_sets() {
  return {
      {"boiling curve",
       {313.15, 373.15, 403.15, 443.15, 493.15, 803.15},
       {1000.0, 3000.0, 12600.0, 3000.0, 250.0, 350.0}},
      {"copper conductivity", {4.0, 20.0, 77.0, 300.0}, {642.0, 2423.0, 547.0, 396.0}},
      {"monotone with flats",
       {0.0, 0.5, 2.0, 2.25, 7.0, 9.0, 12.5},
       {1.0, 1.0, 4.0, 4.5, 4.5, 30.0, 31.0}}};
}

double scale_of(const std::vector<double>& y) {
  double s = 0.0;
  for (const double v : y)
    s = std::max(s, std::abs(v));
  return s;
}

// Value and slope inside the points agree with pchip to rounding: the two evaluate
// the same cubic in different algebraic forms.
TEST(MonotoneCubic, MatchesBoostPchipInsideThePoints) {
  for (const Points& p : data_sets()) {
    SCOPED_TRACE(p.name);
    const MonotoneCubic curve(p.x, p.y);
    const boost::math::interpolators::pchip<std::vector<double>> reference(
        std::vector<double>(p.x), std::vector<double>(p.y));
    const double y_scale = scale_of(p.y);
    const double span = p.x.back() - p.x.front();
    double slope_scale = 0.0;
    for (std::size_t i = 0; i + 1 < p.x.size(); ++i)
      slope_scale =
          std::max(slope_scale, std::abs((p.y[i + 1] - p.y[i]) / (p.x[i + 1] - p.x[i])));
    for (std::size_t i = 0; i < p.x.size(); ++i)
      EXPECT_NEAR(curve.slopes()[i], reference.prime(p.x[i]), 1e-13 * slope_scale)
          << "slope at x = " << p.x[i];
    const int n = 4000;
    for (int k = 1; k < n; ++k) {
      const double x = p.x.front() + span * k / n;
      EXPECT_NEAR(curve.value(x), reference(x), 1e-13 * y_scale) << "x = " << x;
      EXPECT_NEAR(curve.derivative(x), reference.prime(x), 1e-12 * slope_scale)
          << "x = " << x;
    }
  }
}

// Fritsch and Carlson (1980): the interpolant passes through the points and, where
// the data are monotone, stays between the neighbouring values (no overshoot).
TEST(MonotoneCubic, PassesThroughThePointsWithoutOvershoot) {
  for (const Points& p : data_sets()) {
    SCOPED_TRACE(p.name);
    const MonotoneCubic curve(p.x, p.y);
    for (std::size_t i = 0; i < p.x.size(); ++i)
      EXPECT_DOUBLE_EQ(curve.value(p.x[i]), p.y[i]);
    for (std::size_t i = 0; i + 1 < p.x.size(); ++i) {
      const double lo = std::min(p.y[i], p.y[i + 1]);
      const double hi = std::max(p.y[i], p.y[i + 1]);
      const double tolerance = 1e-12 * scale_of(p.y);
      for (int k = 0; k <= 200; ++k) {
        const double x = p.x[i] + (p.x[i + 1] - p.x[i]) * k / 200.0;
        EXPECT_GE(curve.value(x), lo - tolerance) << "x = " << x;
        EXPECT_LE(curve.value(x), hi + tolerance) << "x = " << x;
      }
    }
  }
}

// Beyond the points the curve is constant (the documented continuation); one point
// is a constant; no points is zero.
TEST(MonotoneCubic, ConstantContinuationAndDegenerateCurves) {
  const MonotoneCubic curve({1.0, 2.0, 4.0}, {10.0, 20.0, 25.0});
  EXPECT_EQ(curve.value(0.5), 10.0);
  EXPECT_EQ(curve.value(9.0), 25.0);
  EXPECT_EQ(curve.derivative(0.5), 0.0);
  EXPECT_EQ(curve.derivative(9.0), 0.0);
  EXPECT_TRUE(std::isnan(curve.value(std::numeric_limits<double>::quiet_NaN())));
  const MonotoneCubic single({300.0}, {750.0});
  EXPECT_EQ(single.value(-1e9), 750.0);
  EXPECT_EQ(single.value(1e9), 750.0);
  EXPECT_EQ(single.derivative(300.0), 0.0);
  EXPECT_EQ(single.slopes().size(), 1u);
  const MonotoneCubic none;
  EXPECT_TRUE(none.empty());
  EXPECT_EQ(none.value(3.0), 0.0);
  EXPECT_EQ(none.derivative(3.0), 0.0);
}

TEST(MonotoneCubic, BadPointsAreRejectedByName) {
  const auto message = [](const std::vector<double>& x, const std::vector<double>& y) {
    try {
      MonotoneCubic curve(x, y);
    } catch (const quantacal::InputError& e) {
      return std::string(e.what());
    }
    return std::string("no error");
  };
  EXPECT_EQ(message({1.0, 2.0}, {1.0}),
            "MonotoneCubic: y = 1 values: expected as many values as x (2)");
  EXPECT_EQ(message({}, {}), "MonotoneCubic: at least one point");
  EXPECT_EQ(message({1.0, 3.0, 3.0}, {1.0, 2.0, 3.0}),
            "MonotoneCubic: x[2] = 3: expected values strictly increasing (x[1] = 3)");
  EXPECT_EQ(message({1.0, std::nan(""), 3.0}, {1.0, 2.0, 3.0}),
            "MonotoneCubic: x[1] = nan: expected a finite value");
  EXPECT_EQ(message({1.0, 2.0}, {1.0, std::numeric_limits<double>::infinity()}),
            "MonotoneCubic: y[1] = inf: expected a finite value");
}

} // namespace
