// SPDX-License-Identifier: Apache-2.0
// Conductivity models: constant, and the monotone log-log table.
#include "support.h"

#include <quantacal/common/exceptions.h>
#include <quantacal/models/conductivity.h>

#include <boost/math/interpolators/pchip.hpp>

#include <gtest/gtest.h>

#include <cmath>
#include <cstdio>
#include <limits>
#include <stdexcept>

namespace {

using quantacal_test::relative_difference;

// OFHC copper, RRR 100: computed from the NIST cryogenic correlation (Marquardt, Le and
// Radebaugh, 11th Int. Cryocooler Conf., 2000; computed, coefficients from memory).
const std::vector<double> ofhc_t{4.0, 20.0, 77.0, 300.0};
const std::vector<double> ofhc_k{642.0, 2423.0, 547.0, 396.0};

TEST(Conductivity, Constant) {
  const auto k = quantacal::make_constant_conductivity(394.0); // Cu at 20 degC (CDA)
  EXPECT_EQ(k->kind(), "constant");
  EXPECT_EQ(k->evaluate(293.15).value, 394.0);
  EXPECT_EQ(k->evaluate(293.15).derivative, 0.0);
  EXPECT_THROW(k->evaluate(0.0), quantacal::RangeError);
  EXPECT_THROW(quantacal::make_constant_conductivity(0.0), std::invalid_argument);
  EXPECT_THROW(quantacal::make_constant_conductivity(std::nan("")),
               std::invalid_argument);
}

TEST(Conductivity, TableMatchesItsPointsAndBoostPchipInLogLog) {
  const auto k = quantacal::make_table_conductivity(ofhc_t, ofhc_k);
  EXPECT_EQ(k->kind(), "table");
  for (std::size_t i = 0; i < ofhc_t.size(); ++i)
    EXPECT_EQ(k->evaluate(ofhc_t[i]).value,
              ofhc_k[i]); // passes through the points exactly
  // outside reference: Boost.Math pchip through (ln T, ln k)
  std::vector<double> x, y;
  for (std::size_t i = 0; i < ofhc_t.size(); ++i) {
    x.push_back(std::log(ofhc_t[i]));
    y.push_back(std::log(ofhc_k[i]));
  }
  const boost::math::interpolators::pchip<std::vector<double>> ref(std::move(x),
                                                                   std::move(y));
  double worst_k = 0.0, worst_d = 0.0;
  for (int i = 0; i <= 2000; ++i) {
    const double t = 4.0 * std::pow(75.0, i / 2000.0);
    const quantacal::ConductivityValue v = k->evaluate(t);
    const double lk = ref(std::log(t));
    const double k_ref = std::exp(lk);
    const double dk_ref = k_ref * ref.prime(std::log(t)) / t;
    worst_k = std::max(worst_k, relative_difference(v.value, k_ref));
    worst_d = std::max(worst_d, std::fabs(v.derivative - dk_ref) / (k_ref / t));
  }
  std::printf(
      "[ worst ] conductivity table vs boost pchip (log-log): k %.3g, dk/dT %.3g\n",
      worst_k, worst_d);
  EXPECT_LE(worst_k, 4e-15); // numerical: exp of the same cubic, measured 1.9e-15
  EXPECT_LE(worst_d, 6e-15); // numerical, relative to k/T, measured 3.2e-15
}

TEST(Conductivity, TableIsMonotoneBetweenPointsAndDerivativeMatchesDifferences) {
  const auto k = quantacal::make_table_conductivity(ofhc_t, ofhc_k);
  // the data peak at 20 K: rises on [4, 20], falls on [20, 300], no overshoot
  // (Fritsch-Carlson)
  double prev = k->evaluate(4.0).value;
  double worst = 0.0;
  for (int i = 1; i <= 3000; ++i) {
    const double t = 4.0 * std::pow(75.0, i / 3000.0);
    const quantacal::ConductivityValue v = k->evaluate(t);
    if (t <= 20.0) {
      EXPECT_GE(v.value, prev) << t;
    } else {
      EXPECT_LE(v.value, prev) << t;
    }
    EXPECT_LE(v.value, 2423.0 * (1.0 + 1e-15)) << t;
    prev = v.value;
    bool near_point = false;
    for (double p : ofhc_t)
      near_point = near_point || std::fabs(t - p) < 2e-3 * t;
    if (!near_point) {
      const double fd = quantacal_test::richardson_derivative(
          [&](double s) { return k->evaluate(s).value; }, t, 1e-3 * t);
      worst = std::max(worst, std::fabs(fd - v.derivative) / (v.value / t));
    }
  }
  std::printf("[ worst ] conductivity dk/dT vs Richardson: %.3g (of k/T)\n", worst);
  EXPECT_LE(worst, 1e-10); // numerical (finite difference), measured 3.4e-12
  EXPECT_EQ(k->evaluate(20.0).derivative, 0.0); // extremum of the data: zero slope
}

TEST(Conductivity, TableContinuesTheEndPowerLaws) {
  const auto k = quantacal::make_table_conductivity(ofhc_t, ofhc_k);
  // end slopes are the one-sided log-log secants, so k = k_end (T/T_end)^n outside
  const double n_low = std::log(2423.0 / 642.0) / std::log(20.0 / 4.0);
  const double n_high = std::log(396.0 / 547.0) / std::log(300.0 / 77.0);
  EXPECT_LE(relative_difference(k->evaluate(2.0).value, 642.0 * std::pow(0.5, n_low)),
            1e-14);
  EXPECT_LE(relative_difference(k->evaluate(2.0).derivative,
                                642.0 * std::pow(0.5, n_low) * n_low / 2.0),
            1e-14);
  EXPECT_LE(relative_difference(k->evaluate(600.0).value, 396.0 * std::pow(2.0, n_high)),
            1e-14);
  // continuous value and slope across the last point
  const auto below = k->evaluate(300.0 * (1.0 - 1e-12));
  const auto above = k->evaluate(300.0 * (1.0 + 1e-12));
  EXPECT_LE(relative_difference(below.value, above.value), 1e-11);
  EXPECT_LE(relative_difference(below.derivative, above.derivative), 1e-9);
}

TEST(Conductivity, TableRejectsBadInput) {
  EXPECT_THROW(quantacal::make_table_conductivity({4.0}, {1.0}), std::invalid_argument);
  EXPECT_THROW(quantacal::make_table_conductivity({4.0, 20.0}, {1.0}),
               std::invalid_argument);
  EXPECT_THROW(quantacal::make_table_conductivity({4.0, 20.0}, {1.0, 0.0}),
               std::invalid_argument);
  try {
    quantacal::make_table_conductivity({4.0, 20.0, 20.0}, {1.0, 2.0, 3.0});
    ADD_FAILURE();
  } catch (const std::invalid_argument& e) {
    EXPECT_STREQ(e.what(), "conductivity table: temperatures[2] = 20 K: expected > "
                           "temperatures[1] = 20 K (strictly increasing)");
  }
  const auto k = quantacal::make_table_conductivity(ofhc_t, ofhc_k);
  EXPECT_THROW(k->evaluate(-1.0), quantacal::RangeError);
  EXPECT_THROW(k->evaluate(std::numeric_limits<double>::quiet_NaN()),
               quantacal::RangeError);
}

} // namespace
