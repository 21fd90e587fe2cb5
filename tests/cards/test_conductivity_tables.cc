// SPDX-License-Identifier: Apache-2.0
// The cached conductivity table of every bundled card (materials/*.yaml) against
// the card's own conductivity model: k and dk/dT at many temperatures over the
// valid range, dk/dT against a finite difference of the tabulated k, and the lazy
// build under 8 threads. The reference is the model itself, so the tolerances are
// numerical: they rest on the worst errors measured on these cards (printed by the
// test; docs/performance.md, "Conductivity table").
#include "support.h"

#include <quantacal/cards/card.h>
#include <quantacal/common/exceptions.h>
#include <quantacal/material/material.h>

#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <filesystem>
#include <random>
#include <string>
#include <thread>
#include <vector>

using namespace quantacal;

namespace {

/** Every card in materials/, sorted by file name. */
std::vector<std::string> bundled_cards() {
  std::vector<std::string> files;
  for (const auto& entry : std::filesystem::directory_iterator(
           std::string(QUANTACAL_SOURCE_DIR) + "/materials"))
    if (entry.path().extension() == ".yaml")
      files.push_back(entry.path().string());
  std::sort(files.begin(), files.end());
  return files;
}

/**
 * Temperatures inside the valid range: 20000 uniform in T, 20000 uniform in ln T
 * (both pseudo-random), both ends, every node of the table and the two doubles
 * beside each one, and the midpoint of every segment.
 */
std::vector<double> sample(const Material& m) {
  const double lo = m.lower_temperature(), hi = m.upper_temperature();
  std::mt19937_64 rng(20261204);
  std::uniform_real_distribution<double> u(0.0, 1.0);
  std::vector<double> t{lo, hi};
  for (int i = 0; i < 20000; ++i) {
    t.push_back(std::clamp(lo + u(rng) * (hi - lo), lo, hi));
    t.push_back(std::clamp(lo * std::pow(hi / lo, u(rng)), lo, hi));
  }
  const std::vector<double> nodes = m.conductivity_table().node_temperatures();
  for (std::size_t i = 0; i < nodes.size(); ++i) {
    t.push_back(nodes[i]);
    t.push_back(std::max(lo, std::nextafter(nodes[i], 0.0)));
    t.push_back(std::min(hi, std::nextafter(nodes[i], 2.0 * hi)));
    if (i + 1 < nodes.size())
      t.push_back(0.5 * (nodes[i] + nodes[i + 1]));
  }
  return t;
}

/** True if @p t lies inside a phase join [Tt - w/2, Tt + w/2] of @p m. */
bool in_join(const Material& m, double t) {
  if (!m.data().phase_layout)
    return false;
  for (const PhaseBoundary& b : m.data().phase_layout->boundaries())
    if (t >= b.temperature - 0.5 * b.width && t <= b.temperature + 0.5 * b.width)
      return true;
  return false;
}

// Tolerances of dk/dT, from the worst errors measured on the bundled cards with
// their table tolerance 1e-9 (4 December 2026, printed by the test): 2.0e-7 away
// from the phase joins, 1.3e-5 inside them (narrow joins, such as the 4 K wide
// melting of lead, take short segments, and the error of a derivative grows as the
// tolerance times T/h). k itself is held to the card's own table tolerance (worst
// measured 2.5e-10 against 1e-9).
constexpr double dk_tolerance = 5e-7;      // away from the joins
constexpr double dk_join_tolerance = 3e-5; // inside the joins
constexpr double fd_tolerance = 1e-10; // dk/dT against the difference of k, same scale

} // namespace

// k and dk/dT of the table against the card's own model at about 41000
// temperatures per card (nodes, both sides of every node, segment midpoints and
// random points); dk/dT is measured on the scale max(|dk/dT|, k/T), so that a
// derivative crossing zero is not divided by zero.
TEST(ConductivityTable, EveryBundledCardAgainstItsModel) {
  const std::vector<std::string> cards = bundled_cards();
  ASSERT_GE(cards.size(), 17u); // the cards of docs/materials.md
  for (const std::string& file : cards) {
    SCOPED_TRACE(file);
    const MaterialPtr m = load_card(file);
    const ConductivityTable& table = m->conductivity_table();
    EXPECT_EQ(table.lower_temperature(), m->lower_temperature());
    EXPECT_EQ(table.upper_temperature(), m->upper_temperature());
    double worst_k = 0.0, at_k = 0.0;
    double worst_dk[2] = {0.0, 0.0}, at_dk[2] = {0.0, 0.0}; // away, inside joins
    for (const double t : sample(*m)) {
      const ConductivityValue tab = m->conductivity(t);
      const ConductivityValue exact = m->conductivity_exact(t);
      const double ek = std::abs(tab.value - exact.value) / exact.value;
      const double scale = std::max(std::abs(exact.derivative), exact.value / t);
      const double edk = std::abs(tab.derivative - exact.derivative) / scale;
      if (ek > worst_k) {
        worst_k = ek;
        at_k = t;
      }
      const int j = in_join(*m, t) ? 1 : 0;
      if (edk > worst_dk[j]) {
        worst_dk[j] = edk;
        at_dk[j] = t;
      }
    }
    std::printf("[ conductivity table ] %-20s %-8s %4zu segments %6zu bytes; worst k "
                "%.2e at %.6g K; worst dk/dT %.2e at %.6g K, in joins %.2e at %.6g K\n",
                std::filesystem::path(file).filename().c_str(),
                m->conductivity_model().kind().c_str(), table.statistics().n_segments,
                table.statistics().bytes, worst_k, at_k, worst_dk[0], at_dk[0],
                worst_dk[1], at_dk[1]);
    EXPECT_LE(worst_k, m->data().table_options.tolerance) << "at " << at_k << " K";
    EXPECT_LE(worst_dk[0], dk_tolerance) << "at " << at_dk[0] << " K";
    EXPECT_LE(worst_dk[1], dk_join_tolerance) << "at " << at_dk[1] << " K";
    if (table.is_constant()) {
      EXPECT_EQ(worst_k + worst_dk[0] + worst_dk[1], 0.0);
    }
  }
}

// dk/dT is the derivative of the tabulated k itself (what Newton needs), not the
// model's: inside each segment, away from its ends, the five-point central
// difference of the tabulated k with step h/10 (exact for the quartic of a segment,
// so only rounding is left) against the tabulated dk/dT. The model's own dk/dT
// differs from this by up to dk_tolerance, far above fd_tolerance.
TEST(ConductivityTable, DerivativeIsTheDerivativeOfTheTabulatedConductivity) {
  std::mt19937_64 rng(7);
  std::uniform_real_distribution<double> u(0.25, 0.75);
  for (const std::string& file : bundled_cards()) {
    SCOPED_TRACE(file);
    const MaterialPtr m = load_card(file);
    const std::vector<double> nodes = m->conductivity_table().node_temperatures();
    double worst = 0.0, at = 0.0;
    for (std::size_t i = 0; i + 1 < nodes.size(); ++i) {
      const double h = nodes[i + 1] - nodes[i];
      const double d = 0.1 * h;
      for (int j = 0; j < 3; ++j) {
        const double t = nodes[i] + u(rng) * h;
        const auto k = [&](double x) { return m->conductivity(x).value; };
        const double difference =
            (8.0 * (k(t + d) - k(t - d)) - (k(t + 2 * d) - k(t - 2 * d))) / (12.0 * d);
        const ConductivityValue v = m->conductivity(t);
        const double error = std::abs(difference - v.derivative) /
                             std::max(std::abs(v.derivative), v.value / t);
        if (error > worst) {
          worst = error;
          at = t;
        }
      }
    }
    std::printf("[ conductivity table ] %-20s dk/dT against the difference of k: %.2e "
                "at %.6g K\n",
                std::filesystem::path(file).filename().c_str(), worst, at);
    EXPECT_LE(worst, fd_tolerance) << "at " << at << " K";
  }
}

// The batch gives the scalar call's numbers bit for bit, and null outputs are
// skipped; outside the valid range the material's RangeError names the point.
TEST(ConductivityTable, BatchEqualsScalarAndRangeRule) {
  for (const char* card : {"aluminium.yaml", "copper_rrr.yaml", "inconel_600.yaml"}) {
    SCOPED_TRACE(card);
    const MaterialPtr m = load_card(test::material_path(card));
    std::vector<double> t;
    for (double x = m->lower_temperature(); x < m->upper_temperature(); x *= 1.013)
      t.push_back(x);
    t.push_back(m->upper_temperature());
    std::vector<double> k(t.size()), dk(t.size()), only_dk(t.size());
    m->conductivity(t.data(), t.size(), k.data(), dk.data());
    m->conductivity(t.data(), t.size(), nullptr, only_dk.data());
    EXPECT_EQ(only_dk, dk);
    for (std::size_t i = 0; i < t.size(); ++i) {
      const ConductivityValue v = m->conductivity(t[i]);
      EXPECT_EQ(k[i], v.value) << t[i];
      EXPECT_EQ(dk[i], v.derivative) << t[i];
    }
    const double below = std::nextafter(m->lower_temperature(), 0.0);
    try {
      m->conductivity(below);
      ADD_FAILURE() << "no RangeError below the range";
    } catch (const RangeError& e) {
      EXPECT_EQ(e.subject(), m->name());
      EXPECT_EQ(e.value(), below);
    }
    const double points[] = {m->lower_temperature(), std::nan(""), 1e9};
    EXPECT_THROW(m->conductivity_table().evaluate(points, 3, k.data(), dk.data()),
                 RangeError);
    EXPECT_THROW(m->conductivity_table().evaluate(1e9), RangeError);
  }
}

// A fresh material whose conductivity table is built on first use by one of 8
// threads (as Material::table()): every thread gets the same table and the same
// numbers, bit for bit, as a single thread on a second fresh material.
TEST(ConductivityTable, EightThreadsOnFirstUse) {
  for (const char* card : {"iron.yaml", "copper_rrr.yaml"}) { // phases; metal model
    SCOPED_TRACE(card);
    const MaterialPtr shared = load_card(test::material_path(card));
    const MaterialPtr alone = load_card(test::material_path(card));
    constexpr int n_threads = 8, n_points = 5000;
    const double lo = shared->lower_temperature(), hi = shared->upper_temperature();
    const auto temperature = [&](int i) { return lo + (hi - lo) * i / (n_points - 1); };
    std::vector<std::vector<double>> results(n_threads,
                                             std::vector<double>(2 * n_points));
    std::vector<const ConductivityTable*> tables(n_threads);
    std::vector<std::thread> pool;
    for (int j = 0; j < n_threads; ++j)
      pool.emplace_back([&, j] {
        for (int i = 0; i < n_points; ++i) {
          const ConductivityValue v = shared->conductivity(temperature(i));
          results[j][2 * i] = v.value;
          results[j][2 * i + 1] = v.derivative;
        }
        tables[j] = &shared->conductivity_table();
      });
    for (auto& t : pool)
      t.join();
    std::vector<double> reference(2 * n_points);
    for (int i = 0; i < n_points; ++i) {
      const ConductivityValue v = alone->conductivity(temperature(i));
      reference[2 * i] = v.value;
      reference[2 * i + 1] = v.derivative;
    }
    for (int j = 0; j < n_threads; ++j) {
      EXPECT_EQ(tables[j], &shared->conductivity_table()) << "thread " << j;
      EXPECT_EQ(results[j], reference) << "thread " << j; // bitwise identical
    }
  }
}
