// SPDX-License-Identifier: Apache-2.0
// PropertyTable built from real HeatCapacityModel objects (lib/models): the
// table against its own exact model on 10^5 random points, and the model
// path against the independent GSL reference of reference_models.h.
#include "reference_models.h"

#include <quantacal/common/exceptions.h>
#include <quantacal/models/contribution.h>
#include <quantacal/models/heat_capacity_model.h>
#include <quantacal/tables/property_table.h>

#include <gtest/gtest.h>

#include <chrono>
#include <cmath>
#include <cstdio>
#include <random>
#include <vector>

namespace {

using namespace quantacal;

double relative(double a, double b) {
  return std::abs(a - b) / std::abs(b);
}

struct Worst {
  double capacity = 0.0, energy = 0.0, at = 0.0;
};

Worst sample(const PropertyTable& table, const ThermalModel& model, std::size_t n,
             unsigned seed) {
  std::mt19937_64 rng(seed);
  std::uniform_real_distribution<double> u(0.0, 1.0);
  const double lo = table.lower_temperature(), hi = table.upper_temperature();
  Worst w;
  for (std::size_t i = 0; i < n; ++i) {
    const double s = u(rng);
    const double t =
        std::clamp(i % 2 ? lo + s * (hi - lo) : lo * std::pow(hi / lo, s), lo, hi);
    const ThermalState a = table.evaluate(t), e = model.evaluate(t);
    if (relative(a.capacity, e.capacity) > w.capacity) {
      w.capacity = relative(a.capacity, e.capacity);
      w.at = t;
    }
    w.energy = std::max(w.energy, relative(a.energy, e.energy));
  }
  return w;
}

TablePtr build_timed(const ThermalModel& model, const TableOptions& o,
                     const char* label) {
  const auto start = std::chrono::steady_clock::now();
  TablePtr table = PropertyTable::build(model, o);
  const double seconds =
      std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count();
  const auto& st = table->statistics();
  std::printf(
      "[ %s ] build %.3f s, %zu evaluations, %zu segments, %zu bytes, check %.3g\n",
      label, seconds, st.n_evaluations, st.n_segments, st.bytes, st.worst_error);
  return table;
}

// Copper, theta_D = 343 K, gamma = 0.695 mJ/mol/K^2 (Kittel; gamma from memory).
TEST(TableOnHeatCapacityModel, DebyeElectronicCopper) {
  const HeatCapacityModel model("copper",
                                {make_debye(343.0, 3.0), make_electronic(0.695e-3)});
  TableOptions o;
  o.lower_temperature = 1.0;
  o.upper_temperature = 1357.0; // the GSL reference below ends there
  const auto table = build_timed(model, o, "copper model");
  const Worst w = sample(*table, model, 100000, 1);
  std::printf("[ copper model ] worst C error %.3g at %.6g K, U error %.3g\n", w.capacity,
              w.at, w.energy);
  EXPECT_LE(w.capacity, 1e-9); // tolerance of the table (contract)
  EXPECT_LE(w.energy, 1e-9);   // |U error| <= tol U
  EXPECT_LE(table->statistics().bytes, 256u * 1024u);
  // The same numbers through the independent GSL reference (gsl_sf_debye_3):
  // the table is as close to it as to its own model, up to the model's error.
  const auto reference = quantacal_test::copper_like();
  const Worst r = sample(*table, *reference, 20000, 2);
  EXPECT_LE(r.capacity,
            2e-9); // tolerance + model-vs-GSL difference (measured below 1e-12)
}

// Aluminium with melting: theta_D = 428 K, gamma = 1.35 mJ/mol/K^2 (Kittel;
// gamma from memory), T_m = 933.47 K and L = 10.71 kJ/mol (CRC), width 1 K illustrative.
TEST(TableOnHeatCapacityModel, AluminiumWithMeltingPeak) {
  const HeatCapacityModel model("aluminium",
                                {make_debye(428.0, 3.0), make_electronic(1.35e-3),
                                 make_transition(933.47, 10710.0, 1.0)});
  TableOptions o;
  o.lower_temperature = 4.0;
  o.upper_temperature = 1200.0;
  const auto table = build_timed(model, o, "aluminium model");
  const Worst w = sample(*table, model, 100000, 3);
  std::printf("[ aluminium model ] worst C error %.3g at %.6g K, U error %.3g\n",
              w.capacity, w.at, w.energy);
  EXPECT_LE(w.capacity, 1e-9); // tolerance of the table (contract)
  EXPECT_LE(table->statistics().bytes, 256u * 1024u);
}

// Copper with a Nernst-Lindemann dilation term (energy by quadrature in the
// model): A = (Cp - Cv)/(Cp^2 T) = 0.73/(24.44^2 298.15) mol/J, computed from
// CRC Handbook of Chemistry and Physics expansion, bulk modulus and molar volume
// (Cp - Cv computed here; Cp CRC, from memory).
TEST(TableOnHeatCapacityModel, CopperWithDilation) {
  Dilation dil;
  dil.kind = Dilation::Kind::nernst_lindemann;
  dil.coefficient = 0.73 / (24.44 * 24.44 * 298.15);
  const HeatCapacityModel model("copper dilated",
                                {make_debye(343.0, 3.0), make_electronic(0.695e-3)}, dil);
  TableOptions o;
  o.lower_temperature = 4.0;
  o.upper_temperature = 1357.77;
  const auto table = build_timed(model, o, "copper dilated");
  const Worst w = sample(*table, model, 20000, 4);
  std::printf("[ copper dilated ] worst C error %.3g at %.6g K, U error %.3g\n",
              w.capacity, w.at, w.energy);
  EXPECT_LE(w.capacity, 1e-9); // tolerance of the table (contract)
}

// Iron-like lattice with the magnetic peak: theta_D = 470 K (Kittel), gamma = 4.98
// mJ/mol/K^2 (Kittel, from memory), T_C = 1043 K, beta = 2.22, p = 0.40 (bcc iron,
// Dinsdale, CALPHAD 15 (1991) 317). C jumps down at T_C: the node must sit there, both
// sides must meet the tolerance up to one ulp from it, and at T_C itself table and
// model both take the upper value.
TEST(TableOnHeatCapacityModel, IronWithMagneticPeak) {
  const HeatCapacityModel model("iron", {make_debye(470.0, 3.0), make_electronic(4.98e-3),
                                         make_magnetic(1043.0, 2.22, 0.40)});
  TableOptions o;
  o.lower_temperature = 100.0;
  o.upper_temperature = 1500.0;
  const auto table = build_timed(model, o, "iron magnetic");
  const auto nodes = table->node_temperatures();
  EXPECT_TRUE(std::binary_search(nodes.begin(), nodes.end(), 1043.0));
  const Worst w = sample(*table, model, 100000, 6);
  std::printf("[ iron magnetic ] worst C error %.3g at %.6g K, U error %.3g\n",
              w.capacity, w.at, w.energy);
  EXPECT_LE(w.capacity, 1e-9); // tolerance of the table (contract)
  EXPECT_LE(w.energy, 1e-9);
  // dense sampling within 2 K of the peak, and the one-sided values next to it
  double worst = 0.0;
  for (int i = -20000; i <= 20000; ++i) {
    const double t = 1043.0 + 1e-4 * i;
    worst = std::max(worst,
                     relative(table->evaluate(t).capacity, model.evaluate(t).capacity));
  }
  for (double t : {std::nextafter(1043.0, 0.0), 1043.0, std::nextafter(1043.0, 2000.0)})
    worst = std::max(worst,
                     relative(table->evaluate(t).capacity, model.evaluate(t).capacity));
  std::printf("[ iron magnetic ] worst C error within 2 K of T_C: %.3g\n", worst);
  EXPECT_LE(worst, 1e-9); // tolerance of the table (contract)
}

// Measured-style points joined by the model's monotone cubic: the knots are
// breakpoints and become nodes (illustrative data).
TEST(TableOnHeatCapacityModel, TabulatedKnotsAreNodes) {
  const std::vector<double> t{300.0, 400.0, 500.0, 600.0, 700.0, 800.0};
  const std::vector<double> c{24.4, 25.2, 25.8, 26.4, 27.0, 27.7}; // illustrative
  const HeatCapacityModel model("tabulated", {make_tabulated(t, c, LowerExtension{})});
  TableOptions o;
  o.lower_temperature = 10.0;
  o.upper_temperature = 800.0;
  const auto table = build_timed(model, o, "tabulated");
  const auto nodes = table->node_temperatures();
  for (double k : t)
    EXPECT_TRUE(std::binary_search(nodes.begin(), nodes.end(), k)) << k;
  const Worst w = sample(*table, model, 20000, 5);
  EXPECT_LE(w.capacity, 1e-9); // tolerance of the table (contract)
}

} // namespace
