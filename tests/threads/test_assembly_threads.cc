// SPDX-License-Identifier: Apache-2.0
// Material evaluation from many threads the way a finite-element assembly uses
// it (deal.II's WorkStream, which fe::MaterialField serves): the materials and
// their tables are shared and read-only, each thread owns one scratch (its
// quadrature temperatures and output arrays, reused cell after cell), cells are
// handed out in chunks to whichever thread is free, and a copier writes each
// cell's result under a lock. Every cell must come out bit for bit as on one
// thread, whether the tables were built before the threads start (as
// MaterialField does) or lazily by whichever thread asks first. Runs in the
// ordinary suite and under ThreadSanitizer (docs/reliability.md), without
// deal.II.
#include <quantacal/cards/card.h>
#include <quantacal/common/exceptions.h>
#include <quantacal/common/format.h>
#include <quantacal/material/material.h>

#include <gtest/gtest.h>

#include <algorithm>
#include <atomic>
#include <cmath>
#include <map>
#include <mutex>
#include <string>
#include <thread>
#include <vector>

using namespace quantacal;

namespace {

constexpr std::size_t n_cells = 3000;
constexpr std::size_t n_points = 9; // a Q2 cell's quadrature in 2D
constexpr std::size_t chunk = 16;   // cells handed out at once
constexpr int n_threads = 8;

MaterialPtr card(const std::string& file) {
  return load_card(std::string(QUANTACAL_SOURCE_DIR) + "/materials/" + file);
}

/** Three cards: a plain metal, one with phases (melting), one with a magnetic peak. */
std::map<int, MaterialPtr> fresh_materials() {
  return {{1, card("copper.yaml")}, {2, card("aluminium.yaml")}, {3, card("iron.yaml")}};
}

/** The scratch of one thread: reused for every cell it assembles. */
struct Scratch {
  std::vector<double> temperatures, energy, capacity, slope, conductivity, k_slope;
  Scratch()
      : temperatures(n_points), energy(n_points), capacity(n_points), slope(n_points),
        conductivity(n_points), k_slope(n_points) {}
};

/** What one cell hands to the copier: its five property arrays, volume basis. */
using CellData = std::vector<double>;

int material_of(std::size_t cell) {
  return 1 + static_cast<int>(cell % 3);
}

/** Quadrature temperatures of @p cell, spread over the material's range. */
void cell_temperatures(const Material& m, std::size_t cell, double* t) {
  const double lo = m.lower_temperature(), hi = m.upper_temperature();
  for (std::size_t q = 0; q < n_points; ++q) {
    const double s = std::fmod(0.618034 * double(cell * n_points + q), 1.0);
    t[q] = lo + s * (hi - lo);
  }
}

/** The worker: evaluates one cell as MaterialField::evaluate does (volume basis). */
CellData assemble_cell(const std::map<int, MaterialPtr>& materials, std::size_t cell,
                       Scratch& s) {
  const Material& m = *materials.at(material_of(cell));
  cell_temperatures(m, cell, s.temperatures.data());
  m.shared_table()->evaluate(s.temperatures.data(), n_points, s.energy.data(),
                             s.capacity.data(), s.slope.data());
  m.shared_conductivity_table()->evaluate(s.temperatures.data(), n_points,
                                          s.conductivity.data(), s.k_slope.data());
  const double f = m.basis_factor(Basis::volume);
  CellData out;
  for (std::size_t q = 0; q < n_points; ++q)
    out.insert(out.end(), {f * (s.energy[q] - m.energy_offset()), f * s.capacity[q],
                           f * s.slope[q], s.conductivity[q], s.k_slope[q]});
  return out;
}

/** All cells on @p threads threads (1: the serial reference). */
std::vector<CellData> assemble(const std::map<int, MaterialPtr>& materials, int threads) {
  std::vector<CellData> result(n_cells);
  std::atomic<std::size_t> next{0};
  std::mutex copier;
  const auto work = [&] {
    Scratch scratch; // one per thread
    for (std::size_t begin; (begin = next.fetch_add(chunk)) < n_cells;)
      for (std::size_t c = begin; c < std::min(begin + chunk, n_cells); ++c) {
        CellData data = assemble_cell(materials, c, scratch);
        const std::lock_guard<std::mutex> lock(copier);
        result[c] = std::move(data);
      }
  };
  std::vector<std::thread> pool;
  for (int k = 0; k < threads; ++k)
    pool.emplace_back(work);
  for (auto& t : pool)
    t.join();
  return result;
}

} // namespace

TEST(AssemblyThreads, PrebuiltTablesGiveTheSerialResultBitForBit) {
  const std::map<int, MaterialPtr> materials = fresh_materials();
  for (const auto& [id, m] : materials) { // as MaterialField's constructor
    (void)m->shared_table();
    (void)m->shared_conductivity_table();
  }
  const std::vector<CellData> serial = assemble(materials, 1);
  const std::vector<CellData> parallel = assemble(materials, n_threads);
  for (std::size_t c = 0; c < n_cells; ++c)
    ASSERT_EQ(parallel[c], serial[c]) << "cell " << c;
  // common practice: a stored capacity and a conductivity are positive
  for (const CellData& d : serial)
    for (std::size_t q = 0; q < n_points; ++q) {
      EXPECT_GT(d[5 * q + 1], 0.0);
      EXPECT_GT(d[5 * q + 3], 0.0);
    }
}

TEST(AssemblyThreads, LazyTablesBuiltByTheFirstThreadGiveTheSerialResult) {
  // Fresh materials: the first cells of every thread race to build both tables.
  const std::vector<CellData> parallel = assemble(fresh_materials(), n_threads);
  const std::vector<CellData> serial = assemble(fresh_materials(), 1);
  for (std::size_t c = 0; c < n_cells; ++c)
    ASSERT_EQ(parallel[c], serial[c]) << "cell " << c;
}

TEST(AssemblyThreads, AnOutOfRangeCellFailsInItsOwnThreadOnly) {
  const std::map<int, MaterialPtr> materials = fresh_materials();
  const Material& copper = *materials.at(1);
  const double bad = copper.upper_temperature() + 100.0;
  std::atomic<int> failures{0}, done{0};
  std::vector<std::string> messages(n_threads);
  std::vector<std::thread> pool;
  for (int k = 0; k < n_threads; ++k)
    pool.emplace_back([&, k] {
      Scratch s;
      try {
        for (std::size_t c = k; c < 300; c += n_threads) {
          (void)assemble_cell(materials, c, s);
          if (k == 3 && c >= 150) { // one thread meets a cell out of range
            std::fill(s.temperatures.begin(), s.temperatures.end(), bad);
            copper.shared_table()->evaluate(s.temperatures.data(), n_points,
                                            s.energy.data(), nullptr, nullptr);
          }
        }
        ++done;
      } catch (const RangeError& e) {
        ++failures;
        messages[k] = e.what();
      }
    });
  for (auto& t : pool)
    t.join();
  EXPECT_EQ(failures.load(), 1);
  EXPECT_EQ(done.load(), n_threads - 1);
  EXPECT_NE(messages[3].find(format_double(bad)), std::string::npos) << messages[3];
}
