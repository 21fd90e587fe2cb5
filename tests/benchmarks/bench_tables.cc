// SPDX-License-Identifier: Apache-2.0
// bench_tables: per-point cost of (U, C, dC/dT) on 4096 random temperatures for
//   (a) the PropertyTable, scalar and batch,
//   (b) the exact model (HeatCapacityModel debye + electronic; the bundled copper card),
//   (c) GSL's gsl_sf_debye_3 computing the same three values,
//   (d) Boost.Math cubic_hermite on the table's own nodes,
// and the table's memory per material; and per point k and dk/dT of two bundled
// cards through the conductivity model (the path before the conductivity table)
// and through the cached ConductivityTable. Every benchmark reports ns_per_point;
// tests/benchmarks/ratios.py turns a JSON run into the ratios of docs/performance.md.
// Not a test: nothing is asserted here.
#include "reference_models.h"

#include <quantacal/models/contribution.h>
#include <quantacal/models/heat_capacity_model.h>
#include <quantacal/tables/property_table.h>
#ifdef QUANTACAL_BENCH_WITH_CARDS
#include <quantacal/cards/card.h>
#include <quantacal/material/material.h>
#endif

#include <benchmark/benchmark.h>
#include <boost/math/interpolators/cubic_hermite.hpp>

#include <algorithm>
#include <map>
#include <memory>
#include <random>
#include <string>
#include <vector>

namespace {

constexpr std::size_t n_points = 4096;
constexpr double t_low = 1.0;     // K
constexpr double t_high = 1357.0; // K

// Copper: theta_D = 343 K, gamma = 0.695 mJ/mol/K^2 (Kittel; gamma from memory).
std::shared_ptr<const quantacal::HeatCapacityModel> copper_model() {
  static const auto model = std::make_shared<const quantacal::HeatCapacityModel>(
      "copper (debye + electronic)",
      std::vector<quantacal::ContributionPtr>{quantacal::make_debye(343.0, 3.0),
                                              quantacal::make_electronic(0.695e-3)});
  return model;
}

quantacal::TablePtr copper_table() {
  quantacal::TableOptions o;
  o.lower_temperature = t_low;
  o.upper_temperature = t_high;
  static const auto table = quantacal::PropertyTable::build(*copper_model(), o);
  return table;
}

std::vector<double> temperatures(double lo, double hi) {
  std::mt19937_64 rng(4096);
  std::uniform_real_distribution<double> u(lo, hi);
  std::vector<double> t(n_points);
  for (double& x : t)
    x = u(rng);
  return t;
}

void per_point(benchmark::State& state) {
  state.SetItemsProcessed(std::int64_t(state.iterations() * n_points));
  state.counters["ns_per_point"] =
      benchmark::Counter(double(state.iterations() * n_points),
                         benchmark::Counter::kIsRate | benchmark::Counter::kInvert);
}

void table_scalar(benchmark::State& state, const quantacal::PropertyTable& table,
                  const std::vector<double>& t) {
  for (auto _ : state) {
    for (double x : t) {
      const quantacal::ThermalState s = table.evaluate(x);
      benchmark::DoNotOptimize(s);
    }
  }
  per_point(state);
  state.counters["bytes"] = double(table.statistics().bytes);
  state.counters["segments"] = double(table.statistics().n_segments);
}

void table_batch(benchmark::State& state, const quantacal::PropertyTable& table,
                 const std::vector<double>& t) {
  std::vector<double> u(t.size()), c(t.size()), d(t.size());
  for (auto _ : state) {
    table.evaluate(t.data(), t.size(), u.data(), c.data(), d.data());
    benchmark::DoNotOptimize(u.data());
    benchmark::DoNotOptimize(c.data());
    benchmark::DoNotOptimize(d.data());
    benchmark::ClobberMemory();
  }
  per_point(state);
  state.counters["bytes"] = double(table.statistics().bytes);
  state.counters["segments"] = double(table.statistics().n_segments);
}

void exact(benchmark::State& state, const quantacal::ThermalModel& model,
           const std::vector<double>& t) {
  for (auto _ : state) {
    for (double x : t) {
      const quantacal::ThermalState s = model.evaluate(x);
      benchmark::DoNotOptimize(s);
    }
  }
  per_point(state);
}

// (a) table, debye + electronic copper model
void BM_TableScalar(benchmark::State& state) {
  table_scalar(state, *copper_table(), temperatures(t_low, t_high));
}
void BM_TableBatch(benchmark::State& state) {
  table_batch(state, *copper_table(), temperatures(t_low, t_high));
}

// (b) the exact model
void BM_ExactModel(benchmark::State& state) {
  exact(state, *copper_model(), temperatures(t_low, t_high));
}

// (c) GSL's Debye function, U, C and dC/dT (formulas in tests/tables/reference_models.h)
void BM_GslDebye(benchmark::State& state) {
  const quantacal_test::DebyeTerm debye(343.0, 3.0);
  const quantacal_test::ElectronicTerm electronic(0.695e-3);
  const auto t = temperatures(t_low, t_high);
  for (auto _ : state) {
    for (double x : t) {
      quantacal::ThermalState s = debye.at(x);
      s += electronic.at(x);
      benchmark::DoNotOptimize(s);
    }
  }
  per_point(state);
}

// (d) Boost.Math cubic_hermite on the table's nodes: U and C from one
// interpolant (value, prime), dC/dT as the prime of a second one on (C, dC/dT).
void BM_BoostCubicHermite(benchmark::State& state) {
  const auto table = copper_table();
  std::vector<double> x = table->node_temperatures();
  std::vector<double> u, c, d;
  for (double xi : x) {
    const quantacal::ThermalState s = copper_model()->evaluate(xi);
    u.push_back(s.energy);
    c.push_back(s.capacity);
    d.push_back(s.capacity_derivative);
  }
  std::vector<double> x2 = x, c2 = c;
  boost::math::interpolators::cubic_hermite<std::vector<double>> energy(
      std::move(x), std::move(u), std::move(c));
  boost::math::interpolators::cubic_hermite<std::vector<double>> capacity(
      std::move(x2), std::move(c2), std::move(d));
  const auto t = temperatures(t_low, t_high);
  for (auto _ : state) {
    for (double xi : t) {
      const double e = energy(xi);
      const double ci = energy.prime(xi);
      const double di = capacity.prime(xi);
      benchmark::DoNotOptimize(e);
      benchmark::DoNotOptimize(ci);
      benchmark::DoNotOptimize(di);
    }
  }
  per_point(state);
}

BENCHMARK(BM_TableBatch);
BENCHMARK(BM_TableScalar);
BENCHMARK(BM_ExactModel);
BENCHMARK(BM_GslDebye);
BENCHMARK(BM_BoostCubicHermite);

// The table of the aluminium reference model with its 1 K wide melting peak
// (illustrative width): more segments, same lookup.
void BM_TableBatchMeltingPeak(benchmark::State& state) {
  static const auto model = quantacal_test::aluminium_melting();
  static const auto table = quantacal::PropertyTable::build(*model);
  table_batch(state, *table, temperatures(4.0, 1200.0));
}
BENCHMARK(BM_TableBatchMeltingPeak);

#ifdef QUANTACAL_BENCH_WITH_CARDS
// The bundled copper card: its exact model and its table, over the card's range.
const quantacal::Material* copper_card() {
  static const quantacal::MaterialPtr m =
      quantacal::load_card(QUANTACAL_SOURCE_DIR "/materials/copper.yaml");
  return m.get();
}
quantacal::TablePtr copper_card_table() {
  quantacal::TableOptions o = copper_card()->data().table_options;
  o.lower_temperature = copper_card()->lower_temperature();
  o.upper_temperature = copper_card()->upper_temperature();
  static const auto table = quantacal::PropertyTable::build(copper_card()->model(), o);
  return table;
}
void BM_CardTableBatch(benchmark::State& state) {
  const auto* m = copper_card();
  table_batch(state, *copper_card_table(),
              temperatures(m->lower_temperature(), m->upper_temperature()));
}
void BM_CardExactModel(benchmark::State& state) {
  const auto* m = copper_card();
  exact(state, m->model(), temperatures(m->lower_temperature(), m->upper_temperature()));
}
BENCHMARK(BM_CardTableBatch);
BENCHMARK(BM_CardExactModel);

// k and dk/dT, 4096 random temperatures over the card's valid range: aluminium
// (phases: solid and liquid log-log tables joined over the melt) and copper_rrr
// (metal model: Bloch-Grueneisen series). "Model" is the conductivity model called
// per point, what MaterialField did before the table; "TableCell8" is the table's
// batch called on 8 points at a time, as MaterialField calls it for a 3D Q1 cell.
const quantacal::Material* card(const char* file) {
  static std::map<std::string, quantacal::MaterialPtr> cards;
  auto& m = cards[file];
  if (!m)
    m = quantacal::load_card(std::string(QUANTACAL_SOURCE_DIR "/materials/") + file);
  return m.get();
}
std::vector<double> card_temperatures(const quantacal::Material& m) {
  return temperatures(m.lower_temperature(), m.upper_temperature());
}
void conductivity_model(benchmark::State& state, const char* file) {
  const quantacal::Material& m = *card(file);
  const quantacal::ConductivityModel& model = m.conductivity_model();
  const auto t = card_temperatures(m);
  std::vector<double> k(t.size()), dk(t.size());
  for (auto _ : state) {
    for (std::size_t i = 0; i < t.size(); ++i) {
      const quantacal::ConductivityValue v = model.evaluate(t[i]);
      k[i] = v.value;
      dk[i] = v.derivative;
    }
    benchmark::DoNotOptimize(k.data());
    benchmark::DoNotOptimize(dk.data());
    benchmark::ClobberMemory();
  }
  per_point(state);
}
void conductivity_table_scalar(benchmark::State& state, const char* file) {
  const quantacal::Material& m = *card(file);
  const quantacal::ConductivityTable& table = m.conductivity_table();
  const auto t = card_temperatures(m);
  std::vector<double> k(t.size()), dk(t.size());
  for (auto _ : state) {
    for (std::size_t i = 0; i < t.size(); ++i) {
      const quantacal::ConductivityValue v = table.evaluate(t[i]);
      k[i] = v.value;
      dk[i] = v.derivative;
    }
    benchmark::DoNotOptimize(k.data());
    benchmark::DoNotOptimize(dk.data());
    benchmark::ClobberMemory();
  }
  per_point(state);
  state.counters["bytes"] = double(table.statistics().bytes);
  state.counters["segments"] = double(table.statistics().n_segments);
}
void conductivity_table_batch(benchmark::State& state, const char* file,
                              std::size_t batch) {
  const quantacal::Material& m = *card(file);
  const quantacal::ConductivityTable& table = m.conductivity_table();
  const auto t = card_temperatures(m);
  std::vector<double> k(t.size()), dk(t.size());
  for (auto _ : state) {
    for (std::size_t i = 0; i < t.size(); i += batch)
      table.evaluate(t.data() + i, std::min(batch, t.size() - i), k.data() + i,
                     dk.data() + i);
    benchmark::DoNotOptimize(k.data());
    benchmark::DoNotOptimize(dk.data());
    benchmark::ClobberMemory();
  }
  per_point(state);
  state.counters["bytes"] = double(table.statistics().bytes);
  state.counters["segments"] = double(table.statistics().n_segments);
}
void BM_CardConductivityModel(benchmark::State& state) {
  conductivity_model(state, "aluminium.yaml");
}
void BM_CardConductivityTableScalar(benchmark::State& state) {
  conductivity_table_scalar(state, "aluminium.yaml");
}
void BM_CardConductivityTableCell8(benchmark::State& state) {
  conductivity_table_batch(state, "aluminium.yaml", 8);
}
void BM_CardConductivityTableBatch(benchmark::State& state) {
  conductivity_table_batch(state, "aluminium.yaml", n_points);
}
void BM_MetalConductivityModel(benchmark::State& state) {
  conductivity_model(state, "copper_rrr.yaml");
}
void BM_MetalConductivityTableCell8(benchmark::State& state) {
  conductivity_table_batch(state, "copper_rrr.yaml", 8);
}
BENCHMARK(BM_CardConductivityModel);
BENCHMARK(BM_CardConductivityTableScalar);
BENCHMARK(BM_CardConductivityTableCell8);
BENCHMARK(BM_CardConductivityTableBatch);
BENCHMARK(BM_MetalConductivityModel);
BENCHMARK(BM_MetalConductivityTableCell8);
#endif

} // namespace

BENCHMARK_MAIN();
