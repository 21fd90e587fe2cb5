// SPDX-License-Identifier: Apache-2.0
// Regression tests for what the fuzz targets of tests/fuzz found in the card
// reader and the material layer (docs/reliability.md), and the 16-thread lazy
// build of the tables of several materials at once (run under TSan with
// -DQUANTACAL_SANITIZE=thread).
#include "support.h"

#include <quantacal/cards/card.h>
#include <quantacal/cards/units.h>
#include <quantacal/common/exceptions.h>
#include <quantacal/material/material.h>

#include <gtest/gtest.h>

#include <algorithm>
#include <atomic>
#include <cmath>
#include <filesystem>
#include <fstream>
#include <sstream>
#include <string>
#include <thread>
#include <vector>

using namespace quantacal;

namespace {

std::vector<std::string> bundled_cards() {
  std::vector<std::string> files;
  for (const auto& entry : std::filesystem::directory_iterator(
           std::string(QUANTACAL_SOURCE_DIR) + "/materials"))
    if (entry.path().extension() == ".yaml")
      files.push_back(entry.path().string());
  std::sort(files.begin(), files.end());
  return files;
}

} // namespace

// fuzz_card: on stainless_304.yaml (a reference temperature of 298.15 K), the
// energy thermal() returns at the lower end of the range was rejected by
// temperature_from_energy ("requires 2.066 J/kg <= e ... but got 2.066 J/kg"):
// the range check undid the basis factor and the offset, which rounds. Every
// bundled card, every basis, both ends of the range: T(e(T)) is accepted and
// gives T back (to the inverse's own accuracy, 1e-9 relative: a numerical limit).
TEST(ReaderHardening, InverseAcceptsTheEnergiesOfBothRangeEnds) {
  const auto files = bundled_cards();
  ASSERT_GE(files.size(), 17u);
  for (const auto& file : files) {
    const MaterialPtr m = load_card(file);
    for (const Basis basis : {Basis::mass, Basis::mole, Basis::volume}) {
      for (const double t : {m->lower_temperature(), m->upper_temperature()}) {
        const double e = m->thermal(t, basis).energy;
        double back = 0.0;
        ASSERT_NO_THROW(back = m->temperature_from_energy(e, basis))
            << file << " basis " << static_cast<int>(basis) << " T = " << t;
        EXPECT_NEAR(back, t, 1e-9 * t) << file;
      }
    }
    // Outside the range by a few units in the last place is still refused.
    const double low = m->thermal(m->lower_temperature(), Basis::mole).energy;
    const double below = low - 1e-6 * std::max(1.0, std::abs(low));
    EXPECT_THROW(m->temperature_from_energy(below, Basis::mole), RangeError) << file;
  }
}

// fuzz_case (the same YAML parse as cards): yaml-cpp marked the syntax error of
// "\xd4C%\0" at column 6 of a 4-byte line. The location is now clamped into the
// text: line 1, at most one past the line's last byte.
TEST(ReaderHardening, YamlSyntaxErrorIsLocatedInsideTheText) {
  const std::string text("\xd4"
                         "C%\0",
                         4);
  const CardError e = quantacal::test::card_error(text, "fuzz.yaml");
  EXPECT_EQ(e.file(), "fuzz.yaml");
  EXPECT_EQ(e.line(), 1);
  EXPECT_GE(e.column(), 1);
  EXPECT_LE(e.column(), 5);
  EXPECT_NE(std::string(e.what()).find("YAML syntax error"), std::string::npos)
      << e.what();
}

// An error at the end of a text without a final newline stays on its last line.
TEST(ReaderHardening, YamlErrorAtTheEndStaysOnTheLastLine) {
  const std::string text = "name: x\ndescription: [unclosed";
  const CardError e = quantacal::test::card_error(text, "end.yaml");
  EXPECT_GE(e.line(), 1);
  EXPECT_LE(e.line(), 2);
  EXPECT_GE(e.column(), 1);
  EXPECT_LE(e.column(), 23);
}

// 16 threads ask at once for the tables of several fresh materials (built
// lazily, under std::call_once): each material builds one table, shared by all
// threads, identical to a build on one thread. TSan checks the build for races
// (docs/reliability.md); without it the test checks the sharing and the values.
TEST(ReaderHardening, SixteenThreadsBuildTheTablesOfSeveralMaterialsOnce) {
  const std::vector<std::string> names = {"copper.yaml", "iron.yaml", "aluminium.yaml",
                                          "titanium.yaml"};
  std::vector<MaterialPtr> fresh, reference;
  for (const auto& n : names) {
    fresh.push_back(load_card(quantacal::test::material_path(n)));
    reference.push_back(load_card(quantacal::test::material_path(n)));
  }
  constexpr int n_threads = 16;
  const std::size_t n_materials = names.size();
  std::vector<std::vector<const PropertyTable*>> tables(
      n_threads, std::vector<const PropertyTable*>(n_materials));
  std::vector<std::vector<const ConductivityTable*>> conductivity(
      n_threads, std::vector<const ConductivityTable*>(n_materials));
  std::vector<std::vector<double>> values(n_threads);
  std::atomic<int> ready{0};
  std::vector<std::thread> pool;
  for (int k = 0; k < n_threads; ++k)
    pool.emplace_back([&, k] {
      ++ready;
      while (ready.load() < n_threads) // start together
        std::this_thread::yield();
      for (std::size_t j = 0; j < n_materials; ++j) {
        // Each thread starts at another material, so builds overlap.
        const std::size_t i = (j + static_cast<std::size_t>(k)) % n_materials;
        const Material& m = *fresh[i];
        tables[k][i] = &m.table();
        conductivity[k][i] = &m.conductivity_table();
        const double t =
            m.lower_temperature() +
            (m.upper_temperature() - m.lower_temperature()) * (k + 0.5) / n_threads;
        values[k].push_back(m.thermal(t).capacity);
        values[k].push_back(m.conductivity(t).value);
      }
    });
  for (auto& th : pool)
    th.join();
  for (std::size_t i = 0; i < n_materials; ++i) {
    const PropertyTable& one = reference[i]->table();
    for (int k = 0; k < n_threads; ++k) {
      EXPECT_EQ(tables[k][i], tables[0][i]) << names[i] << ": one table for all threads";
      EXPECT_EQ(conductivity[k][i], conductivity[0][i]) << names[i];
    }
    EXPECT_EQ(tables[0][i]->node_temperatures(), one.node_temperatures()) << names[i];
    EXPECT_EQ(tables[0][i]->statistics().n_segments, one.statistics().n_segments);
  }
  for (int k = 0; k < n_threads; ++k) {
    ASSERT_EQ(values[k].size(), 2 * n_materials);
    for (std::size_t j = 0; j < n_materials; ++j) {
      const std::size_t i = (j + static_cast<std::size_t>(k)) % n_materials;
      const Material& r = *reference[i];
      const double t =
          r.lower_temperature() +
          (r.upper_temperature() - r.lower_temperature()) * (k + 0.5) / n_threads;
      EXPECT_EQ(values[k][2 * j], r.thermal(t).capacity) << names[i] << " thread " << k;
      EXPECT_EQ(values[k][2 * j + 1], r.conductivity(t).value) << names[i];
    }
  }
}

// fuzz_units: "2 (1  m^ 001937919210m^ 001937919210" overflowed the int
// exponents of the dimension (undefined behaviour, caught by UBSan). A power
// beyond 1000 of a base unit is now an InputError.
TEST(ReaderHardening, UnitExponentOverflowIsAnInputError) {
  for (const std::string text :
       {"2 (1  m^ 001937919210m^ 001937919210", "1 m^2147483647", "1 (m^1000)^1000",
        "1 m^600 m^600", "1 K^-1001", "2 (1^ 097103)^ 097103"}) {
    try {
      parse_quantity(text);
      ADD_FAILURE() << "accepted " << text;
    } catch (const InputError& e) {
      EXPECT_NE(std::string(e.what()).find("a power beyond 1000 of a base unit"),
                std::string::npos)
          << e.what();
      EXPECT_EQ(e.line(), 0);
    }
  }
  // Large but representable powers still parse (and cancel).
  EXPECT_EQ(parse_quantity("3 m^1000/m^1000").value, 3.0);
  EXPECT_EQ(parse_quantity("3 m^1000/m^1000").dimension, dimension::dimensionless());
}

// A unit nested in thousands of parentheses overflowed the stack of the
// recursive-descent parser (ASan: stack-overflow at 16000 levels). Nesting is
// now bounded at 16 levels, far beyond any written unit.
TEST(ReaderHardening, DeeplyNestedUnitIsAnInputError) {
  const std::string deep = "1 " + std::string(16000, '(') + "K" + std::string(16000, ')');
  try {
    parse_quantity(deep);
    ADD_FAILURE() << "accepted a unit nested 16000 deep";
  } catch (const InputError& e) {
    EXPECT_NE(std::string(e.what()).find("parentheses nested deeper than 16"),
              std::string::npos);
  }
  const std::string sixteen = "1 " + std::string(16, '(') + "K" + std::string(16, ')');
  EXPECT_EQ(parse_quantity(sixteen, dimension::temperature()), 1.0);
  EXPECT_EQ(parse_quantity("2 J/(mol (K))", dimension::molar_capacity()), 2.0);
}

// fuzz_card: steel_c45.yaml with one Gibbs-series coefficient 100 times too
// large (d = -4.39752e-1) gives C < 0 just below the ferrite join at 1043 K. The
// loader's 65-point spread missed it, the card loaded, and the table build
// failed later with a NumericalError naming no line. The loader now also
// checks both sides of every breakpoint of the model: a located InputError.
TEST(ReaderHardening, NegativeCapacityAtAPhaseJoinIsAnInputError) {
  std::ifstream in(quantacal::test::material_path("steel_c45.yaml"));
  std::stringstream text;
  text << in.rdbuf();
  // The second occurrence: the austenite phase (line 61).
  std::string bad = text.str();
  const std::string from = "d: -4.39752e-3";
  const auto second = bad.find(from, bad.find(from) + 1);
  ASSERT_NE(second, std::string::npos);
  bad.replace(second, from.size(), "d: -4.39752e-1");
  const CardError e = quantacal::test::card_error(bad, "steel.yaml");
  EXPECT_EQ(e.field(), "valid_range");
  EXPECT_GE(e.line(), 1);
  EXPECT_NE(std::string(e.what()).find("not physical inside the valid range"),
            std::string::npos)
      << e.what();
}
