// SPDX-License-Identifier: Apache-2.0
// The element cards below 100 K (aluminium, iron, nickel, titanium, tungsten,
// chromium, silver and lead, which start at 4 K, lead at 7.2 K, its
// superconducting transition; silicon, which still starts at 100 K, is checked
// through a test copy of its lattice model). Their lattice model keeps the
// T^3 limit of the calorimetric Debye temperature theta_0 (Kittel, Introduction
// to Solid State Physics) and the Sommerfeld term; an Einstein term at
// theta_0/2 (a convention) carries the excess over Debye at intermediate
// temperatures, its modes fitted to the SGTE H(298.15 K) - H(0).
//
// References: the SGTE element reference data, H(298.15 K) - H(0) and
// S(298.15 K) (Dinsdale, CALPHAD 15 (1991) 317; the ELEMENT lines of SGTE-based
// databases: Al, Fe, Cr, Ni as given there; Ti, W, Si, Ag, Pb from the ELEMENT
// lines of SGTE Unary 5.0, verified in a public copy).
//
// What is what:
// - H(298.15 K) - H(0): a FIT CHECK for the cards with the low-temperature
//   Einstein term (its modes were fitted to it); validation for silver (no term
//   fitted) and silicon (no term). Computed as the card's H(298.15 K) - H(T_low)
//   plus gamma T_low^2/2 + beta T_low^4/4 below T_low, beta = 12 pi^4 R/(5 theta_0^3).
// - S(298.15 K) = int_0^298.15 c_p/T dT: VALIDATION (no card was fitted to
//   it), Boost.Math Gauss-Kronrod over the card's c_p from T_low, and gamma T_low
//   + beta T_low^3/3 below. The entropy weights the 4-100 K range heavily.
// - c_p at 4-10 K against gamma T + beta T^3 with the card's own theta_0 and
//   gamma: a FIT CHECK (the card is built on those numbers).
// - conductivity below 100 K: the table rows are values of the metal model for a
//   stated RRR 100 (model estimates, not measurements); compared here with that
//   model, a FIT CHECK of the transcription only. No published value below 100 K
//   was checked.
//
// Tolerances: H 2 %, S 3 % (the project's targets); c_p fit check 1 %. Known
// misses are pinned at their measured figure, said at each place.
#include "support.h"

#include <quantacal/cards/card.h>
#include <quantacal/common/exceptions.h>
#include <quantacal/models/metal_conductivity.h>

#include <boost/math/quadrature/gauss_kronrod.hpp>

#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <fstream>
#include <functional>
#include <sstream>
#include <string>
#include <vector>

namespace {

using namespace quantacal;
using quantacal::test::material_path;

constexpr double kDebyeT3 = 1943.770; // 12 pi^4 R / 5, J/mol/K

struct Element {
  const char* file;
  double t_low;      // K, the card's lower end
  double theta0;     // K, calorimetric Debye temperature the card keeps
  double gamma;      // J/mol/K^2, the card's Sommerfeld coefficient
  double h_sgte;     // J/mol, SGTE H(298.15 K) - H(0)
  double s_sgte;     // J/mol/K, SGTE S(298.15 K)
  bool h_fitted;     // the card's low-temperature Einstein modes were fitted to h_sgte
  double s_expected; // the measured S deviation when it is a pinned known miss, else 0
};

// theta_0 and gamma as the cards carry them: Kittel, Introduction to Solid State
// Physics (theta verified, gamma from memory), except tungsten's gamma, 1.46
// mJ/mol/K^2 from sub-1 K calorimetry (verified), lead's band value 1.169
// mJ/mol/K^2 (the normal-state 2.98 of Kittel, from memory, divided by 1 +
// lambda, lambda = 1.55, McMillan 1968, from memory) and silicon's 636 K (from
// memory, see silicon.yaml).
const std::vector<Element> kElements = {
    // SGTE values: Dinsdale 1991, Al, Fe, Cr, Ni as given there
    {"aluminium.yaml", 4.0, 428.0, 1.35e-3, 4577.296, 28.3215, true, 0},
    {"iron.yaml", 4.0, 470.0, 4.98e-3, 4489.0, 27.2797, true, 0},
    {"nickel.yaml", 4.0, 450.0, 7.02e-3, 4787.0, 29.7955, true, 0},
    {"chromium.yaml", 4.0, 630.0, 1.4e-3, 4050.0, 23.5429, true, 0},
    // SGTE Unary 5.0 ELEMENT lines (verified in a public copy)
    {"titanium.yaml", 4.0, 420.0, 3.35e-3, 4810.0, 30.648, true, 0},
    {"tungsten.yaml", 4.0, 400.0, 1.46e-3, 4970.0, 32.620, true, 0},
    {"silver.yaml", 4.0, 215.0, 0.646e-3, 5744.6, 42.551, false, 0},
    {"lead.yaml", 7.2, 105.0, 1.169e-3, 6878.5, 64.785, true, 0},
};

double integrate(const std::function<double(double)>& f, double a, double b) {
  return boost::math::quadrature::gauss_kronrod<double, 61>::integrate(f, a, b, 15,
                                                                       1e-12);
}

/** int_{t_low}^{298.15} c_p/T dT over the card's cached c_p, split at 20 and 100 K. */
double entropy_above(const Material& m, double t_low) {
  const auto f = [&](double t) { return m.thermal(t, Basis::mole).capacity / t; };
  double s = 0.0;
  double a = t_low;
  for (double b : {20.0, 100.0, 298.15}) {
    s += integrate(f, a, b);
    a = b;
  }
  return s;
}

struct Figures {
  double h, s;
};

Figures h_and_s(const Material& m, double t_low, double theta0, double gamma) {
  const double beta = kDebyeT3 / (theta0 * theta0 * theta0);
  const double h = m.thermal(298.15, Basis::mole).energy -
                   m.thermal(t_low, Basis::mole).energy + gamma * t_low * t_low / 2 +
                   beta * std::pow(t_low, 4) / 4;
  const double s =
      entropy_above(m, t_low) + gamma * t_low + beta * t_low * t_low * t_low / 3;
  return {h, s};
}

TEST(LowTemperatureCards, EnthalpyAndEntropyAgainstSgte) {
  for (const Element& e : kElements) {
    SCOPED_TRACE(e.file);
    const MaterialPtr m = load_card(material_path(e.file));
    EXPECT_EQ(m->lower_temperature(), e.t_low);
    const Figures f = h_and_s(*m, e.t_low, e.theta0, e.gamma);
    const double dh = f.h / e.h_sgte - 1, ds = f.s / e.s_sgte - 1;
    std::printf("  %-15s H(298.15)-H(0) %8.1f  SGTE %8.1f  %+6.2f %% (%s)   "
                "S(298.15) %7.3f  SGTE %7.3f  %+6.2f %% (validation)\n",
                e.file, f.h, e.h_sgte, 100 * dh, e.h_fitted ? "fit check" : "validation",
                f.s, e.s_sgte, 100 * ds);
    EXPECT_NEAR(dh, 0.0, e.h_fitted ? 0.001 : 0.02);
    EXPECT_NEAR(ds, 0.0, 0.03);
  }
}

// Silicon keeps its published-value lattice model (Debye 636 K, no electrons):
// the Einstein convention of the other cards (theta_E = theta_0/2, modes fitted to
// the SGTE enthalpy) would leave S(298.15 K) at -5.2 % and raise c_p(298.15 K) to
// 3.2 % above the CRC Handbook, so it was not adopted, and with no published
// conductivity below 100 K found the card still starts at 100 K. Its lattice
// model, evaluated here down to 4 K in a test copy whose conductivity table gets
// a placeholder row at 4 K (k is not checked), misses both SGTE figures: KNOWN
// MISSES, pinned at the measured -3.74 % (H) and -9.69 % (S).
TEST(LowTemperatureCards, SiliconLatticeModelKnownMisses) {
  std::ifstream in(material_path("silicon.yaml"));
  std::stringstream text;
  text << in.rdbuf();
  std::string card = text.str();
  card = quantacal::test::replace(card, "valid_range: {from: \"100 K\"",
                                  "valid_range: {from: \"4 K\"");
  card =
      quantacal::test::replace(card, "rows: [[100, 884]", "rows: [[4, 884], [100, 884]");
  const MaterialPtr si = load_card_from_string(card, material_path("silicon.yaml"));
  // SGTE Unary 5.0 ELEMENT line for diamond silicon (verified in a public copy):
  // 3217.5 J/mol, 18.820 J/mol/K.
  const Figures f = h_and_s(*si, 4.0, 636.0, 0.0);
  const double dh = f.h / 3217.5 - 1, ds = f.s / 18.820 - 1;
  std::printf("  silicon (lattice model) H(298.15)-H(0) %+6.2f %%, S(298.15) %+6.2f %% "
              "(validation, known misses)\n",
              100 * dh, 100 * ds);
  EXPECT_NEAR(dh, -0.0374, 0.002);
  EXPECT_NEAR(ds, -0.0969, 0.002);
  EXPECT_EQ(load_card(material_path("silicon.yaml"))->lower_temperature(), 100.0);
}

// FIT CHECK: c_p from T_low to 10 K against gamma T + beta T^3 of the card's own
// theta_0 and gamma (Einstein terms at theta_0/2 >= 100 K add under 1e-6 there).
// Lead's Einstein term sits at 52.5 K and adds to the T^3 law already at 7.2 K:
// measured +21.9 % at 7.2 K, +23.8 % at 7.5 K and +30.6 % at 10 K, pinned (the T^3 law of
// theta_0 = 105 K holds for lead only well below its transition).
TEST(LowTemperatureCards, CryogenicCapacityFitCheck) {
  for (const Element& e : kElements) {
    SCOPED_TRACE(e.file);
    const MaterialPtr m = load_card(material_path(e.file));
    const double beta = kDebyeT3 / (e.theta0 * e.theta0 * e.theta0);
    for (double t : {e.t_low, 7.5, 10.0}) {
      if (t < e.t_low)
        continue;
      const double model = m->thermal(t, Basis::mole).capacity;
      const double reference = e.gamma * t + beta * t * t * t;
      const double d = model / reference - 1;
      std::printf(
          "  %-15s c_p(%4.1f K) %9.5f  gamma T + beta T^3 %9.5f J/mol/K  %+6.2f %% "
          "(fit check)\n",
          e.file, t, model, reference, 100 * d);
      if (std::string(e.file) == "lead.yaml") {
        EXPECT_NEAR(d, t < 7.3 ? 0.219 : t < 8.0 ? 0.238 : 0.306, 0.005) << t;
      } else {
        EXPECT_NEAR(d, 0.0, 0.01) << t;
      }
    }
  }
}

// c_p positive and rising from T_low to 300 K (0.05 K steps), and smooth from
// T_low to 400 K: the local exponent n = d ln c_p / d ln T (3 in the T^3 limit,
// above 3 where the Einstein term sets in, falling towards 0 at room
// temperature) changes by under 0.02 from one 0.05 K step to the next, so there
// is no kink (a kink of 1 % in the slope of c_p would jump n by 0.01 T/dT).
// Above 300 K the lattice model hands over to the SGTE series through the
// 310-370 K join; there c_p falls slightly in some cards (measured: nickel
// -1.98 %, silver -0.38 %, tungsten -0.02 % from the start of the fall to its
// minimum; before this extension nickel fell -1.80 %, silver -0.38 %, tungsten
// -0.88 %, and iron and chromium -0.07 % and -0.10 %, now monotone), printed
// here and bounded at 2.5 %.
TEST(LowTemperatureCards, CapacityMonotoneAndSmooth) {
  for (const Element& e : kElements) {
    SCOPED_TRACE(e.file);
    const MaterialPtr m = load_card(material_path(e.file));
    const double dt = 0.05;
    double previous = m->thermal(e.t_low, Basis::mole).capacity;
    double previous_slope = NAN;
    double peak = 0.0, worst_fall = 0.0, max_slope = 0.0, max_jump = 0.0;
    for (int i = 1; e.t_low + i * dt <= 400.0; ++i) {
      const double t = e.t_low + i * dt;
      const double c = m->thermal(t, Basis::mole).capacity;
      ASSERT_GT(c, 0.0) << t;
      if (t <= 300.0) {
        EXPECT_GE(c, previous) << t;
      }
      peak = std::max(peak, c);
      worst_fall = std::min(worst_fall, c / peak - 1);
      const double slope = std::log(c / previous) / std::log(t / (t - dt));
      max_slope = std::max(max_slope, slope);
      if (!std::isnan(previous_slope))
        max_jump = std::max(max_jump, std::abs(slope - previous_slope));
      previous_slope = slope;
      previous = c;
    }
    std::printf("  %-15s c_p monotone to 300 K; largest exponent %.2f, largest step of "
                "it %.4f; largest fall in the 310-370 K join %+5.2f %%\n",
                e.file, max_slope, max_jump, 100 * worst_fall);
    EXPECT_LT(max_jump, 0.02);
    EXPECT_GT(worst_fall, -0.025);
  }
}

// FIT CHECK of the transcription: the conductivity rows below 100 K against the
// metal model (docs/theory.md, "Conductivity of metals") with the inputs the
// cards state: RRR 100, theta_R = theta_0, the CRC Handbook resistivity at 293 K
// (from memory), Sommerfeld L0; aluminium with the Wilson ratio 0.266 of
// aluminium_rrr.yaml. Rows are rounded to 3 significant figures: 0.5 %.
TEST(LowTemperatureCards, ConductivityRowsAreTheStatedMetalModel) {
  struct Row {
    const char* file;
    double theta_r, rho293, wilson;
    std::vector<double> temperatures;
  };
  const std::vector<Row> rows = {
      {"aluminium.yaml", 428, 2.65e-8, 0.266, {4, 6, 10, 15, 20, 30, 40, 50, 70}},
      {"iron.yaml", 470, 9.61e-8, 0, {4, 6, 10, 15, 20}},
      {"nickel.yaml", 450, 6.93e-8, 0, {4, 6, 10, 15, 20}},
      {"titanium.yaml", 420, 42.0e-8, 0, {4, 6, 10, 15, 20}},
      {"tungsten.yaml", 400, 5.28e-8, 0, {4, 6, 10, 15, 20}},
      {"chromium.yaml", 630, 12.5e-8, 0, {4, 6, 10, 15, 20, 30}},
      {"silver.yaml", 215, 1.59e-8, 0, {4, 6, 10}},
      {"lead.yaml", 105, 20.8e-8, 0, {7.2, 10}},
  };
  for (const Row& r : rows) {
    SCOPED_TRACE(r.file);
    MetalConductivityParameters p;
    p.resistive_debye_temperature = r.theta_r;
    p.reference_resistivity = r.rho293;
    p.reference_temperature = 293.0;
    p.rrr = 100;
    p.wilson_ratio = r.wilson;
    const MetalConductivity model(p);
    const MaterialPtr m = load_card(material_path(r.file));
    for (double t : r.temperatures) {
      const double card = m->conductivity(t).value;
      const double reference = model.evaluate(t).value;
      EXPECT_NEAR(card / reference - 1, 0.0, 0.005) << t;
    }
    // Defined and positive over the whole new range, up to the handbook table.
    for (double t = m->lower_temperature(); t <= 120.0; t += 0.5)
      EXPECT_GT(m->conductivity(t).value, 0.0) << t;
  }
}

} // namespace
