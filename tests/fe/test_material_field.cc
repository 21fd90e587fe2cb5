// SPDX-License-Identifier: Apache-2.0
// MaterialField: the evaluation of some properties (PropertyFlags) against the full
// evaluation and against the Material's own scalar calls, for every bundled card, and the
// VectorizedArray overload against the scalar one lane by lane. These are consistency
// checks between paths of the library: no outside data, and the expected agreement is
// exact (the same operations in the same order), so every comparison is bit for bit.
#include "reference/validation_support.h"

#include <quantacal/cards/card.h>
#include <quantacal/common/exceptions.h>
#include <quantacal/fe/material_field.h>

#include <deal.II/grid/grid_generator.h>
#include <deal.II/grid/tria.h>

#include <gtest/gtest.h>

#include <algorithm>
#include <array>
#include <cmath>
#include <filesystem>
#include <limits>
#include <map>
#include <random>
#include <string>
#include <utility>
#include <vector>

using namespace quantacal;
using quantacal::fe::MaterialField;
using quantacal::fe::PointProperties;
using quantacal::fe::PropertyFlags;

namespace {

/** Every card in materials/, sorted by file name. */
std::vector<std::string> bundled_cards() {
  std::vector<std::string> files;
  for (const auto& f :
       std::filesystem::directory_iterator(reference::source_root() + "/materials"))
    if (f.path().extension() == ".yaml")
      files.push_back(f.path().string());
  std::sort(files.begin(), files.end());
  return files;
}

/**
 * Temperatures inside [lower, upper]: both ends, every multiple of 25 K (conductivity
 * tables of the cards have their points there, so the exact-node branch is taken),
 * and 200 uniform pseudo-random points.
 */
std::vector<double> sample(const Material& m) {
  const double lo = m.lower_temperature(), hi = m.upper_temperature();
  std::vector<double> t{lo, hi};
  for (double x = 25.0 * std::ceil(lo / 25.0); x <= hi; x += 25.0)
    t.push_back(x);
  std::mt19937_64 rng(4096);
  std::uniform_real_distribution<double> u(lo, hi);
  for (int i = 0; i < 200; ++i)
    t.push_back(u(rng));
  return t;
}

/** The points split into batches of @p size (the last one shorter). */
std::vector<std::vector<double>> batches(const std::vector<double>& t, std::size_t size) {
  std::vector<std::vector<double>> out;
  for (std::size_t i = 0; i < t.size(); i += size)
    out.emplace_back(t.begin() + i, t.begin() + std::min(t.size(), i + size));
  return out;
}

/** The bit pattern is what is compared (EXPECT_EQ on doubles, NaN never expected). */
void expect_same(const std::vector<double>& a, const std::vector<double>& b,
                 const std::vector<double>& t, const char* what) {
  ASSERT_EQ(a.size(), b.size()) << what;
  for (std::size_t q = 0; q < a.size(); ++q)
    EXPECT_EQ(a[q], b[q]) << what << " at T = " << t[q] << " K";
}

} // namespace

TEST(MaterialFieldSelection, SelectionsCombine) {
  EXPECT_EQ(fe::property_thermal | fe::property_conduction, fe::property_all);
  EXPECT_TRUE(fe::contains(fe::property_all, fe::property_thermal));
  EXPECT_TRUE(fe::contains(fe::property_all, fe::property_conduction));
  EXPECT_FALSE(fe::contains(fe::property_thermal, fe::property_conduction));
  EXPECT_FALSE(fe::contains(fe::property_conduction, fe::property_thermal));
  EXPECT_FALSE(fe::contains(fe::property_thermal, fe::property_all));
  EXPECT_EQ(fe::property_energy | fe::property_capacity |
                fe::property_capacity_derivative,
            fe::property_thermal);
  EXPECT_EQ(fe::property_conductivity | fe::property_conductivity_derivative,
            fe::property_conduction);
  PropertyFlags flags = fe::property_none;
  flags |= fe::property_capacity;
  EXPECT_TRUE(fe::contains(flags, fe::property_capacity));
  EXPECT_FALSE(fe::contains(flags, fe::property_energy));
}

// For every bundled card and cell-sized (4, 8) and long batches: thermal-only and
// conduction-only give the full evaluation's arrays bit for bit and leave the others
// empty; the full evaluation gives Material::thermal (volume basis) and
// Material::conductivity bit for bit.
TEST(MaterialFieldSelection, SelectiveEqualsFullForBundledCards) {
  const std::vector<std::string> cards = bundled_cards();
  ASSERT_GE(cards.size(), 11u); // at least the eleven cards the card tests check
  for (const std::string& file : cards) {
    SCOPED_TRACE(file);
    const MaterialPtr m = load_card(file);
    const MaterialField<2> field({{7, m}});
    const std::vector<double> points = sample(*m);
    for (const std::size_t size : {std::size_t{4}, std::size_t{8}, points.size()}) {
      SCOPED_TRACE("batch of " + std::to_string(size));
      PointProperties full, thermal, conduction, both;
      for (const std::vector<double>& t : batches(points, size)) {
        field.evaluate(7, t, full);
        field.evaluate(7, t, thermal, fe::property_thermal);
        field.evaluate(7, t, conduction, fe::property_conduction);
        field.evaluate(7, t, both, fe::property_thermal | fe::property_conduction);

        expect_same(thermal.energy, full.energy, t, "energy");
        expect_same(thermal.capacity, full.capacity, t, "capacity");
        expect_same(thermal.capacity_derivative, full.capacity_derivative, t,
                    "capacity_derivative");
        EXPECT_TRUE(thermal.conductivity.empty());
        EXPECT_TRUE(thermal.conductivity_derivative.empty());

        expect_same(conduction.conductivity, full.conductivity, t, "conductivity");
        expect_same(conduction.conductivity_derivative, full.conductivity_derivative, t,
                    "conductivity_derivative");
        EXPECT_TRUE(conduction.energy.empty());
        EXPECT_TRUE(conduction.capacity.empty());
        EXPECT_TRUE(conduction.capacity_derivative.empty());

        expect_same(both.energy, full.energy, t, "energy (all)");
        expect_same(both.conductivity_derivative, full.conductivity_derivative, t,
                    "conductivity_derivative (all)");

        for (std::size_t q = 0; q < t.size(); ++q) {
          const ThermalState s = m->thermal(t[q], Basis::volume);
          const ConductivityValue k = m->conductivity(t[q]);
          EXPECT_EQ(full.energy[q], s.energy) << "T = " << t[q] << " K";
          EXPECT_EQ(full.capacity[q], s.capacity) << "T = " << t[q] << " K";
          EXPECT_EQ(full.capacity_derivative[q], s.capacity_derivative)
              << "T = " << t[q] << " K";
          EXPECT_EQ(full.conductivity[q], k.value) << "T = " << t[q] << " K";
          EXPECT_EQ(full.conductivity_derivative[q], k.derivative)
              << "T = " << t[q] << " K";
        }
      }
    }
  }
}

// Each flag alone, for every bundled card: exactly its own array, equal bit for bit to
// the same array of the full evaluation (the table's batch with one output, or with
// two, gives the numbers of its batch with all three).
TEST(MaterialFieldSelection, EachFlagAloneEqualsTheFullEvaluation) {
  const std::vector<std::pair<PropertyFlags, const char*>> single{
      {fe::property_energy, "energy"},
      {fe::property_capacity, "capacity"},
      {fe::property_capacity_derivative, "capacity_derivative"},
      {fe::property_conductivity, "conductivity"},
      {fe::property_conductivity_derivative, "conductivity_derivative"}};
  const auto array = [](const PointProperties& p, PropertyFlags f) {
    switch (f) {
    case fe::property_energy:
      return p.energy;
    case fe::property_capacity:
      return p.capacity;
    case fe::property_capacity_derivative:
      return p.capacity_derivative;
    case fe::property_conductivity:
      return p.conductivity;
    default:
      return p.conductivity_derivative;
    }
  };
  for (const std::string& file : bundled_cards()) {
    SCOPED_TRACE(file);
    const MaterialPtr m = load_card(file);
    const MaterialField<3> field({{3, m}});
    const std::vector<double> points = sample(*m);
    for (const std::vector<double>& t : batches(points, 8)) {
      PointProperties full, one, two;
      field.evaluate(3, t, full);
      for (const auto& [flag, name] : single) {
        field.evaluate(3, t, one, flag);
        expect_same(array(one, flag), array(full, flag), t, name);
        for (const auto& [other, other_name] : single) {
          if (other != flag) {
            EXPECT_TRUE(array(one, other).empty()) << name << " left " << other_name;
          }
        }
      }
      // the pair an energy-form Jacobian uses
      field.evaluate(3, t, two, fe::property_energy | fe::property_capacity);
      expect_same(two.energy, full.energy, t, "energy (with capacity)");
      expect_same(two.capacity, full.capacity, t, "capacity (with energy)");
      EXPECT_TRUE(two.capacity_derivative.empty());
    }
  }
}

// The VectorizedArray overload against the scalar one, lane by lane, for every pair of
// bundled cards (lanes of one batch alternate between the two materials when the batch
// is wider than one lane) at points inside both ranges.
TEST(MaterialFieldSelection, VectorizedOverloadEqualsScalarLaneByLane) {
  constexpr std::size_t width = dealii::VectorizedArray<double>::size();
  const std::vector<std::string> cards = bundled_cards();
  for (std::size_t a = 0; a < cards.size(); ++a) {
    const std::size_t b = (a + 1) % cards.size();
    SCOPED_TRACE(cards[a] + " with " + cards[b]);
    const MaterialPtr first = load_card(cards[a]), second = load_card(cards[b]);
    const MaterialField<2> field({{1, first}, {2, second}});
    const double lo = std::max(first->lower_temperature(), second->lower_temperature());
    const double hi = std::min(first->upper_temperature(), second->upper_temperature());
    if (!(hi > lo))
      continue;
    for (int k = 0; k <= 40; ++k) {
      std::array<dealii::types::material_id, width> ids;
      dealii::VectorizedArray<double> t;
      for (std::size_t l = 0; l < width; ++l) {
        ids[l] = ((k + l) % 2) ? 2 : 1;
        t[l] = lo + (hi - lo) * (k + 0.37 * l) / (40.0 + width);
      }
      const fe::VectorizedProperties<double> v = field.evaluate(ids, t);
      for (std::size_t l = 0; l < width; ++l) {
        PointProperties scalar;
        const std::vector<double> one{t[l]};
        field.evaluate(ids[l], one, scalar);
        EXPECT_EQ(v.energy[l], scalar.energy[0]) << "T = " << t[l] << " K, lane " << l;
        EXPECT_EQ(v.capacity[l], scalar.capacity[0]) << "T = " << t[l] << " K";
        EXPECT_EQ(v.capacity_derivative[l], scalar.capacity_derivative[0])
            << "T = " << t[l] << " K";
        EXPECT_EQ(v.conductivity[l], scalar.conductivity[0]) << "T = " << t[l] << " K";
        EXPECT_EQ(v.conductivity_derivative[l], scalar.conductivity_derivative[0])
            << "T = " << t[l] << " K";
      }
    }
    // a lane outside its material's range: the material's RangeError
    std::array<dealii::types::material_id, width> ids;
    ids.fill(1);
    EXPECT_THROW(field.evaluate(ids, dealii::VectorizedArray<double>(
                                         first->upper_temperature() + 1.0)),
                 RangeError);
  }
}

// One output object reused with changing selections (as an assembly loop reuses its
// buffers): each call leaves exactly its own arrays, at the new length.
TEST(MaterialFieldSelection, ReusedOutputFollowsSelection) {
  const MaterialPtr m = load_card(reference::source_root() + "/materials/copper.yaml");
  const MaterialField<3> field({{0, m}});
  PointProperties out, reference;
  const std::vector<double> eight{4.0, 10.0, 77.0, 150.0, 293.0, 500.0, 900.0, 1200.0};
  const std::vector<double> three{20.0, 300.0, 1000.0};
  field.evaluate(0, eight, out, fe::property_conduction);
  field.evaluate(0, three, out, fe::property_thermal);
  field.evaluate(0, three, reference);
  EXPECT_TRUE(out.conductivity.empty());
  expect_same(out.energy, reference.energy, three, "energy");
  expect_same(out.capacity_derivative, reference.capacity_derivative, three,
              "capacity_derivative");
  field.evaluate(0, eight, out, fe::property_conduction);
  field.evaluate(0, eight, reference);
  EXPECT_TRUE(out.energy.empty());
  expect_same(out.conductivity, reference.conductivity, eight, "conductivity");
}

// The cell overload (material chosen by the cell's id) and the VectorizedArray overload
// give the same numbers as the id overload, on a constant material (constant k).
TEST(MaterialFieldSelection, CellAndVectorizedOverloadsAgree) {
  const MaterialPtr m =
      fe::make_constant_material("constant", 2700.0, 900.0, 200.0, 250.0, 900.0, 0.027);
  const MaterialPtr al =
      load_card(reference::source_root() + "/materials/aluminium.yaml");
  const MaterialField<2> field({{1, m}, {2, al}});
  dealii::Triangulation<2> tria;
  dealii::GridGenerator::subdivided_hyper_cube(tria, 2);
  unsigned int i = 0;
  for (const auto& cell : tria.active_cell_iterators())
    cell->set_material_id((i++ % 2) ? 2 : 1);
  const std::vector<double> t{300.0, 412.5, 600.0, 875.0};
  for (const auto& cell : tria.active_cell_iterators()) {
    PointProperties by_cell, by_id;
    field.evaluate(*cell, t, by_cell, fe::property_conduction);
    field.evaluate(cell->material_id(), t, by_id);
    expect_same(by_cell.conductivity, by_id.conductivity, t, "conductivity");
    EXPECT_TRUE(by_cell.energy.empty());
    field.evaluate(*cell, t, by_cell, fe::property_thermal);
    expect_same(by_cell.capacity, by_id.capacity, t, "capacity");
    for (std::size_t q = 0; q < t.size(); ++q) {
      std::array<dealii::types::material_id, dealii::VectorizedArray<double>::size()> ids;
      ids.fill(cell->material_id());
      const fe::VectorizedProperties<double> v =
          field.evaluate(ids, dealii::VectorizedArray<double>(t[q]));
      EXPECT_EQ(v.energy[0], by_id.energy[q]);
      EXPECT_EQ(v.capacity_derivative[0], by_id.capacity_derivative[q]);
      EXPECT_EQ(v.conductivity[0], by_id.conductivity[q]);
      EXPECT_EQ(v.conductivity_derivative[0], by_id.conductivity_derivative[q]);
    }
  }
  // constant material: c_p rho and k exactly as given (the interpolant of a constant)
  PointProperties c;
  field.evaluate(1, t, c);
  for (std::size_t q = 0; q < t.size(); ++q) {
    EXPECT_NEAR(c.capacity[q], 2700.0 * 900.0, 1e-9 * 2700.0 * 900.0);
    EXPECT_EQ(c.conductivity[q], 200.0);
    EXPECT_EQ(c.conductivity_derivative[q], 0.0);
  }
}

// Out of range, with each selection: the same RangeError as the full evaluation (the
// material's, naming it), for the first offending point, whichever set it is in.
TEST(MaterialFieldSelection, OutOfRangeThrowsTheMaterialsErrorForEverySelection) {
  const MaterialPtr m = load_card(reference::source_root() + "/materials/aluminium.yaml");
  const MaterialField<2> field({{0, m}});
  const double nan = std::numeric_limits<double>::quiet_NaN();
  // The card's range is read from it: the test is about the field's error, not the
  // card's range.
  const double below = 0.5 * m->lower_temperature();
  const double above = m->upper_temperature() + 1.0;
  const std::string range = format_double(m->lower_temperature()) +
                            " K <= T <= " + format_double(m->upper_temperature()) + " K";
  const std::vector<std::vector<double>> bad{{300.0, below, 400.0, 1000.0},
                                             {300.0, above, 0.5 * below, 500.0},
                                             {nan, 300.0, 400.0, 500.0},
                                             {300.0, 400.0, 500.0, -1.0}};
  const std::vector<double> first_bad{below, above, nan, -1.0};
  for (std::size_t b = 0; b < bad.size(); ++b)
    for (const PropertyFlags s :
         {fe::property_all, fe::property_thermal, fe::property_conduction,
          fe::property_energy, fe::property_conductivity_derivative, fe::property_none}) {
      SCOPED_TRACE("case " + std::to_string(b) + ", selection " +
                   std::to_string(static_cast<unsigned>(s)));
      PointProperties out;
      try {
        field.evaluate(0, bad[b], out, s);
        ADD_FAILURE() << "no exception";
      } catch (const RangeError& e) {
        EXPECT_EQ(e.function(), "quantacal::fe::MaterialField::evaluate");
        EXPECT_EQ(e.subject(), m->name());
        EXPECT_EQ(e.condition(), range);
        if (std::isnan(first_bad[b]))
          EXPECT_TRUE(std::isnan(e.value()));
        else
          EXPECT_EQ(e.value(), first_bad[b]);
        EXPECT_EQ(std::string(e.what()),
                  "quantacal::fe::MaterialField::evaluate: " + m->name() + ": requires " +
                      range + " but got " + format_double(first_bad[b]) + " K");
      }
    }
}
