// SPDX-License-Identifier: Apache-2.0
// PropertyTable against reference models written in reference_models.h (GSL
// Debye function, analytic Einstein, Sommerfeld, normal-distribution latent
// heat, d2C/dT2 jumps): accuracy on random samples, energy consistency,
// inverse, batch, out-of-range rule, options, failure paths and threads.
#include "reference_models.h"

#include "table_layout.h" // detail::force_portable_batch

#include <quantacal/common/exceptions.h>
#include <quantacal/tables/property_table.h>

#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <functional>
#include <limits>
#include <random>
#include <thread>
#include <vector>

namespace {

using quantacal::NumericalError;
using quantacal::PropertyTable;
using quantacal::RangeError;
using quantacal::TableOptions;
using quantacal::TablePtr;
using quantacal::ThermalModel;
using quantacal::ThermalState;

double relative(double a, double b) {
  return std::abs(a - b) / std::abs(b);
}

/** n temperatures in [lo, hi], half uniform in T and half uniform in log T. */
std::vector<double> random_temperatures(double lo, double hi, std::size_t n,
                                        unsigned seed) {
  std::mt19937_64 rng(seed);
  std::uniform_real_distribution<double> u(0.0, 1.0);
  std::vector<double> t(n);
  for (std::size_t i = 0; i < n; ++i) {
    const double s = u(rng);
    t[i] = i % 2 ? lo + s * (hi - lo) : lo * std::pow(hi / lo, s);
    t[i] = std::clamp(t[i], lo, hi);
  }
  return t;
}

struct Case {
  const char* label;
  std::function<std::shared_ptr<const ThermalModel>()> make;
};

const Case cases[] = {
    {"copper", [] { return quantacal_test::copper_like(); }},
    {"aluminium_melting", [] { return quantacal_test::aluminium_melting(); }},
    {"einstein", [] { return quantacal_test::einstein_like(); }},
    {"kinked", [] { return quantacal_test::kinked(); }},
};

class TableOnReference : public ::testing::TestWithParam<Case> {
protected:
  void SetUp() override {
    model_ = GetParam().make();
    table_ = PropertyTable::build(*model_);
  }
  std::shared_ptr<const ThermalModel> model_;
  TablePtr table_;
};

// The reference itself: Debye Cv/(3R) from GSL against Passler, Adv. Cond.
// Matter Phys. 2017, art. 9321439, Table 7.
TEST(ReferenceModel, DebyeMatchesPublishedTable) {
  const quantacal_test::DebyeTerm debye(1.0, 3.0); // theta = 1 K, so x = 1/T
  const double r3 = 3.0 * quantacal::gas_constant;
  EXPECT_NEAR(debye.at(1.0 / 1.0).capacity / r3, 0.9517321357, 1e-10); // Passler Table 7
  EXPECT_NEAR(debye.at(1.0 / 5.0).capacity / r3, 0.3686348236, 1e-10); // Passler Table 7
  EXPECT_NEAR(debye.at(1.0 / 10.0).capacity / r3, 0.07582100303,
              1e-11); // Passler Table 7
  EXPECT_NEAR(debye.at(1.0 / 15.0).capacity / r3, 0.02307128730,
              1e-11); // Passler Table 7
}

// The worst relative error of C (and U) on 10^5 random points, against the
// exact model; the limit is the default tolerance 1e-9 (the table's contract).
TEST_P(TableOnReference, RandomSampleWithinTolerance) {
  const auto t = random_temperatures(table_->lower_temperature(),
                                     table_->upper_temperature(), 100000, 20261202);
  double worst_c = 0.0, worst_u = 0.0, at = 0.0;
  for (double x : t) {
    const ThermalState a = table_->evaluate(x);
    const ThermalState e = model_->evaluate(x);
    const double ec = relative(a.capacity, e.capacity);
    if (ec > worst_c) {
      worst_c = ec;
      at = x;
    }
    worst_u = std::max(worst_u, relative(a.energy, e.energy));
  }
  const auto& st = table_->statistics();
  std::printf(
      "[ %s ] worst C error %.3g at %.6g K, worst U error %.3g; build: %zu segments, "
      "%zu cells, %zu bytes, check %.3g on %zu points, %zu evaluations\n",
      GetParam().label, worst_c, at, worst_u, st.n_segments, st.n_cells, st.bytes,
      st.worst_error, st.n_checked, st.n_evaluations);
  EXPECT_LE(worst_c, 1e-9); // tolerance of the table (contract)
  EXPECT_LE(worst_u, 1e-9); // |U error| <= integral of |C error| <= tol U
  EXPECT_LE(st.worst_error, 1e-9);
  EXPECT_GE(st.n_checked, 2 * st.n_segments);
  EXPECT_LE(st.bytes,
            256u * 1024u); // memory target per material at the default tolerance
}

// Near the melting peak, where C changes by two orders of magnitude over a few kelvin.
TEST(TableOnPeak, DenseSampleAcrossMeltingPeak) {
  const auto model = quantacal_test::aluminium_melting();
  const auto table = PropertyTable::build(*model);
  const auto t = random_temperatures(923.47, 943.47, 100000, 7);
  double worst = 0.0;
  for (double x : t)
    worst = std::max(worst,
                     relative(table->evaluate(x).capacity, model->evaluate(x).capacity));
  std::printf("[ peak ] worst C error within +-10 K of 933.47 K: %.3g\n", worst);
  EXPECT_LE(worst, 1e-9); // tolerance of the table (contract)
}

// T(e(T)) == T: the inverse is solved on the same polynomial.
TEST_P(TableOnReference, InverseRoundTrip) {
  auto t = random_temperatures(table_->lower_temperature(), table_->upper_temperature(),
                               20000, 99);
  const auto nodes = table_->node_temperatures();
  t.insert(t.end(), nodes.begin(), nodes.end());
  double worst = 0.0;
  for (double x : t)
    worst = std::max(
        worst, relative(table_->temperature_from_energy(table_->evaluate(x).energy), x));
  std::printf("[ %s ] worst T(e(T)) relative error %.3g\n", GetParam().label, worst);
  EXPECT_LE(worst, 1e-12); // issue requirement; rounding of U limits it to ~eps U/(C T)
}

// The returned C is the derivative of the returned U, and dC/dT that of C:
// Richardson-extrapolated central differences (step 2e-5 T, error O(h^4) plus
// rounding ~ eps U / h) against the returned values.
TEST_P(TableOnReference, CapacityIsDerivativeOfEnergy) {
  const double lo = table_->lower_temperature(), hi = table_->upper_temperature();
  const auto t = random_temperatures(lo * 1.01, hi * 0.99, 5000, 3);
  double worst_c = 0.0, worst_d = 0.0;
  for (double x : t) {
    const double h = 2e-5 * x; // 0.02 K at the 1 K wide melting peak
    auto u = [&](double s) { return table_->evaluate(s).energy; };
    auto c = [&](double s) { return table_->evaluate(s).capacity; };
    auto d1 = [&](const std::function<double(double)>& f, double s) {
      return (f(x + s) - f(x - s)) / (2.0 * s);
    };
    const double du = (4.0 * d1(u, 0.5 * h) - d1(u, h)) / 3.0;
    const double dc = (4.0 * d1(c, 0.5 * h) - d1(c, h)) / 3.0;
    const ThermalState s = table_->evaluate(x);
    worst_c = std::max(worst_c, std::abs(du - s.capacity) / s.capacity);
    // dC/dT crosses zero: scale by C/T, the natural size of dC/dT
    worst_d = std::max(worst_d, std::abs(dc - s.capacity_derivative) / (s.capacity / x));
  }
  std::printf("[ %s ] numerical dU/dT vs C: %.3g; dC/dT vs C': %.3g (relative to C/T)\n",
              GetParam().label, worst_c, worst_d);
  EXPECT_LE(worst_c, 5e-8); // measured 5.6e-9 (truncation at the peak), 2e-11 elsewhere
  EXPECT_LE(worst_d, 2e-4); // measured 2e-5 at the peak, 8e-11 elsewhere; scaled by C/T
}

// Continuity of U, C and dC/dT at every node: the left and right limits agree.
TEST_P(TableOnReference, ContinuousAtNodes) {
  const auto nodes = table_->node_temperatures();
  double worst_u = 0.0, worst_c = 0.0, worst_d = 0.0;
  for (std::size_t i = 1; i + 1 < nodes.size(); ++i) {
    const double x = nodes[i];
    const ThermalState l = table_->evaluate(std::nextafter(x, 0.0));
    const ThermalState r = table_->evaluate(x);
    const double step =
        x - std::nextafter(x, 0.0); // one ulp: remove the true change over it
    worst_u = std::max(worst_u, relative(l.energy + l.capacity * step, r.energy));
    worst_c = std::max(worst_c,
                       relative(l.capacity + l.capacity_derivative * step, r.capacity));
    worst_d = std::max(worst_d, std::abs(l.capacity_derivative - r.capacity_derivative) /
                                    (r.capacity / x));
  }
  std::printf("[ %s ] jumps at nodes: U %.3g, C %.3g, C' %.3g (relative to C/T)\n",
              GetParam().label, worst_u, worst_c, worst_d);
  EXPECT_LE(worst_u, 2e-15); // measured <= 3.8e-16; rounding only
  EXPECT_LE(worst_c, 5e-15); // measured <= 8.6e-16; rounding only
  EXPECT_LE(worst_d, 5e-8);  // measured <= 6.9e-9; C' loses digits to the 1/h^2 scaling
}

// Scalar and batch paths give the same numbers; null outputs are skipped.
TEST_P(TableOnReference, BatchMatchesScalar) {
  const auto t = random_temperatures(table_->lower_temperature(),
                                     table_->upper_temperature(), 1001, 5);
  for (bool portable :
       {false, true}) { // the AVX2 kernel (where available), then the portable loop
    quantacal::detail::force_portable_batch(portable);
    std::vector<double> u(t.size()), c(t.size()), d(t.size());
    table_->evaluate(t.data(), t.size(), u.data(), c.data(), d.data());
    std::vector<double> c_only(t.size());
    table_->evaluate(t.data(), t.size(), nullptr, c_only.data(), nullptr);
    for (std::size_t i = 0; i < t.size(); ++i) {
      const ThermalState s = table_->evaluate(t[i]);
      EXPECT_EQ(u[i], s.energy); // same operations in the same order: bit-identical
      EXPECT_EQ(c[i], s.capacity);
      EXPECT_EQ(d[i], s.capacity_derivative);
      EXPECT_EQ(c_only[i], s.capacity);
    }
  }
  quantacal::detail::force_portable_batch(false);
}

// The range ends are nodes: C and dC/dT equal the model's there (up to rounding).
TEST_P(TableOnReference, ExactAtRangeEnds) {
  for (double x : {table_->lower_temperature(), table_->upper_temperature()}) {
    const ThermalState a = table_->evaluate(x);
    const ThermalState e = model_->evaluate(x);
    EXPECT_LE(relative(a.capacity, e.capacity), 1e-13) << x;
    EXPECT_LE(std::abs(a.capacity_derivative - e.capacity_derivative),
              1e-10 * e.capacity / x)
        << x;
  }
  EXPECT_EQ(table_->evaluate(table_->lower_temperature()).energy,
            model_->evaluate(table_->lower_temperature()).energy);
}

INSTANTIATE_TEST_SUITE_P(References, TableOnReference, ::testing::ValuesIn(cases),
                         [](const auto& info) { return std::string(info.param.label); });

// Every breakpoint of the model is a node of the table.
TEST(TableBreakpoints, NodesOnBreakpoints) {
  const auto model = quantacal_test::kinked();
  const auto table = PropertyTable::build(*model);
  const auto nodes = table->node_temperatures();
  for (double p : model->breakpoints())
    EXPECT_TRUE(std::binary_search(nodes.begin(), nodes.end(), p)) << p;
  EXPECT_EQ(nodes.front(), 5.0);
  EXPECT_EQ(nodes.back(), 1000.0);
  EXPECT_TRUE(std::is_sorted(nodes.begin(), nodes.end()));
}

// Out-of-range rule: RangeError outside [lower, upper], for NaN and inf; never
// extrapolate.
TEST(TableRange, ThrowsOutsideRange) {
  const auto model = quantacal_test::copper_like();
  const auto table = PropertyTable::build(*model);
  for (double x : {0.999, 1357.0001, -1.0, 0.0, std::numeric_limits<double>::quiet_NaN(),
                   std::numeric_limits<double>::infinity()}) {
    try {
      table->evaluate(x);
      ADD_FAILURE() << "no RangeError for " << x;
    } catch (const RangeError& e) {
      EXPECT_EQ(e.function(), "quantacal::PropertyTable::evaluate");
      EXPECT_EQ(e.subject(), "copper (Debye + electronic)");
      EXPECT_EQ(e.condition(), "1 K <= T <= 1357 K");
      EXPECT_TRUE(std::isnan(x) ? std::isnan(e.value()) : e.value() == x);
    }
  }
  try {
    table->evaluate(2000.0);
    ADD_FAILURE();
  } catch (const RangeError& e) {
    EXPECT_STREQ(e.what(),
                 "quantacal::PropertyTable::evaluate: copper (Debye + electronic): "
                 "requires 1 K <= T <= 1357 K but got 2000 K");
  }
  EXPECT_NO_THROW(table->evaluate(1.0));
  EXPECT_NO_THROW(table->evaluate(1357.0));
}

TEST(TableRange, BatchNamesFirstOffendingTemperature) {
  const auto model = quantacal_test::copper_like();
  const auto table = PropertyTable::build(*model);
  std::vector<double> t(300, 300.0);
  t[200] = 5000.0;
  t[250] = 0.5;
  std::vector<double> c(t.size());
  try {
    table->evaluate(t.data(), t.size(), nullptr, c.data(), nullptr);
    ADD_FAILURE();
  } catch (const RangeError& e) {
    EXPECT_EQ(e.value(), 5000.0);
  }
}

// Same with all three outputs (the AVX2 path where available) and a length
// that is not a multiple of 4; NaN counts as out of range.
TEST(TableRange, BatchAllOutputsNamesFirstOffendingTemperature) {
  const auto model = quantacal_test::copper_like();
  const auto table = PropertyTable::build(*model);
  for (std::size_t bad : {0u, 5u, 1001u}) {
    std::vector<double> t(1002, 300.0), u(t.size()), c(t.size()), d(t.size());
    t[bad] = std::numeric_limits<double>::quiet_NaN();
    if (bad + 1 < t.size())
      t[bad + 1] = 0.5;
    try {
      table->evaluate(t.data(), t.size(), u.data(), c.data(), d.data());
      ADD_FAILURE() << bad;
    } catch (const RangeError& e) {
      EXPECT_TRUE(std::isnan(e.value())) << bad;
    }
  }
  std::vector<double> t{1.0, 1357.0, 2.5, 700.0, 1000.5}, u(5), c(5), d(5);
  table->evaluate(t.data(), t.size(), u.data(), c.data(), d.data());
  for (std::size_t i = 0; i < t.size(); ++i)
    EXPECT_EQ(c[i], table->evaluate(t[i]).capacity);
}

TEST(TableRange, InverseThrowsOutsideEnergyRange) {
  const auto model = quantacal_test::copper_like();
  const auto table = PropertyTable::build(*model);
  const double top = table->evaluate(1357.0).energy;
  EXPECT_THROW(table->temperature_from_energy(top * 1.0001), RangeError);
  EXPECT_THROW(table->temperature_from_energy(0.0), RangeError);
  EXPECT_THROW(table->temperature_from_energy(std::nan("")), RangeError);
  EXPECT_EQ(table->temperature_from_energy(top), 1357.0);
}

// Options: a sub-range, a looser tolerance (fewer segments, still met).
TEST(TableOptionsTest, SubRangeAndLooserTolerance) {
  const auto model = quantacal_test::copper_like();
  TableOptions o;
  o.lower_temperature = 20.0;
  o.upper_temperature = 300.0;
  o.tolerance = 1e-6;
  const auto table = PropertyTable::build(*model, o);
  EXPECT_EQ(table->lower_temperature(), 20.0);
  EXPECT_EQ(table->upper_temperature(), 300.0);
  const auto full = PropertyTable::build(*model);
  EXPECT_LT(table->statistics().n_segments, full->statistics().n_segments / 4);
  double worst = 0.0;
  for (double x : random_temperatures(20.0, 300.0, 20000, 11))
    worst = std::max(worst,
                     relative(table->evaluate(x).capacity, model->evaluate(x).capacity));
  EXPECT_LE(worst, 1e-6); // the requested tolerance
  EXPECT_THROW(table->evaluate(19.9), RangeError);
}

TEST(TableOptionsTest, InvalidRangeThrowsRangeError) {
  const auto model = quantacal_test::copper_like();
  TableOptions below;
  below.lower_temperature = 0.5; // model starts at 1 K
  EXPECT_THROW(PropertyTable::build(*model, below), RangeError);
  TableOptions above;
  above.upper_temperature = 2000.0; // model ends at 1357 K
  EXPECT_THROW(PropertyTable::build(*model, above), RangeError);
  TableOptions empty;
  empty.lower_temperature = 300.0;
  empty.upper_temperature = 300.0;
  EXPECT_THROW(PropertyTable::build(*model, empty), RangeError);
}

TEST(TableFailures, UnreachableToleranceOrMemoryThrowsNumericalError) {
  const auto model = quantacal_test::aluminium_melting();
  TableOptions tight;
  tight.tolerance = 1e-17; // below double rounding: cannot be met
  EXPECT_THROW(PropertyTable::build(*model, tight), NumericalError);
  TableOptions small;
  small.max_bytes = 4096;
  try {
    PropertyTable::build(*model, small);
    ADD_FAILURE();
  } catch (const NumericalError& e) {
    EXPECT_EQ(e.function(), "quantacal::PropertyTable::build");
    EXPECT_NE(std::string(e.what()).find("max_bytes = 4096"), std::string::npos)
        << e.what();
  }
}

/** A model with C <= 0 somewhere (non-physical). */
class NegativeCapacity : public ThermalModel {
public:
  ThermalState evaluate(double t) const override {
    return {t * (200.0 - t), 200.0 - 2.0 * t, -2.0};
  }
  double lower_temperature() const override { return 1.0; }
  double upper_temperature() const override { return 300.0; }
  std::string name() const override { return "negative"; }
};

TEST(TableFailures, NonPositiveCapacityThrowsNumericalError) {
  NegativeCapacity model;
  EXPECT_THROW(PropertyTable::build(model), NumericalError);
}

// 8 threads on one shared table give bit-identical results to one thread, and
// 8 concurrent builds from one model give identical tables (the build is deterministic).
TEST(TableThreads, SharedTableAndConcurrentBuilds) {
  const auto model = quantacal_test::aluminium_melting();
  const auto table = PropertyTable::build(*model);
  const auto t = random_temperatures(4.0, 1200.0, 20000, 42);
  std::vector<double> reference(t.size());
  for (std::size_t i = 0; i < t.size(); ++i)
    reference[i] = table->evaluate(t[i]).capacity;
  std::vector<std::vector<double>> results(8, std::vector<double>(t.size()));
  std::vector<TablePtr> built(8);
  std::vector<std::thread> threads;
  for (int k = 0; k < 8; ++k)
    threads.emplace_back([&, k] {
      for (std::size_t i = 0; i < t.size(); ++i)
        results[k][i] = k % 2 ? table->evaluate(t[i]).capacity : 0.0;
      if (k % 2 == 0)
        table->evaluate(t.data(), t.size(), nullptr, results[k].data(), nullptr);
      built[k] = PropertyTable::build(*model);
    });
  for (auto& th : threads)
    th.join();
  for (int k = 0; k < 8; ++k) {
    EXPECT_EQ(results[k], reference) << "thread " << k;
    EXPECT_EQ(built[k]->statistics().n_segments, table->statistics().n_segments);
    EXPECT_EQ(built[k]->node_temperatures(), table->node_temperatures());
  }
}

} // namespace
