// SPDX-License-Identifier: Apache-2.0
// The material layer: batch calls on every basis, the inverse T(e), and the
// equilibrium of bodies in contact, against analytic results.
#include <quantacal/common/exceptions.h>
#include <quantacal/material/equilibrium.h>
#include <quantacal/material/material.h>
#include <quantacal/models/conductivity.h>
#include <quantacal/models/contribution.h>

#include <gtest/gtest.h>

#include <cmath>
#include <memory>
#include <vector>

namespace {

using quantacal::Basis;
using quantacal::Material;
using quantacal::MaterialData;
using quantacal::MaterialPtr;

constexpr Basis all_bases[] = {Basis::mass, Basis::mole, Basis::volume};

MaterialData base_data(const char* name, double lower, double upper) {
  MaterialData d;
  d.name = name;
  d.molar_mass = 0.063546;      // kg/mol, copper (IUPAC standard atomic weight)
  d.reference_density = 8960.0; // kg/m^3, copper (CRC Handbook, 97th ed.)
  d.lower_temperature = lower;
  d.upper_temperature = upper;
  d.conductivity = quantacal::make_constant_conductivity(400.0); // illustrative
  return d;
}

/// Debye plus conduction electrons with copper's parameters: theta_D = 343 K,
/// gamma = 0.695 mJ/mol/K^2 (Kittel, Introduction to Solid State Physics, 8th ed.,
/// tables 5.1 and 6.3), energies relative to 298.15 K.
MaterialPtr copper_like() {
  MaterialData d = base_data("copper-like", 4.0, 1300.0);
  d.model = std::make_shared<const quantacal::HeatCapacityModel>(
      "copper-like",
      std::vector<quantacal::ContributionPtr>{quantacal::make_debye(343.0),
                                              quantacal::make_electronic(0.695e-3)});
  d.reference_temperature = 298.15;
  return std::make_shared<const Material>(std::move(d));
}

/// Constant molar capacity c on [lower, upper] (a two-point table with equal values)
/// plus, optionally, a latent heat L (J/mol) at Tt smeared over width w: analytic
/// e(T) = c (T - lower) + L Phi((T - Tt)/w) per mole (illustrative material).
MaterialPtr constant_capacity(const char* name, double c, double lower, double upper,
                              double latent = 0.0, double transition = 0.0,
                              double width = 1.0) {
  MaterialData d = base_data(name, lower, upper);
  std::vector<quantacal::ContributionPtr> terms{quantacal::make_tabulated(
      {lower, upper}, {c, c},
      quantacal::LowerExtension{quantacal::LowerExtension::Kind::energy, 0.0})};
  if (latent > 0.0)
    terms.push_back(quantacal::make_transition(transition, latent, width));
  d.model = std::make_shared<const quantacal::HeatCapacityModel>(name, terms);
  return std::make_shared<const Material>(std::move(d));
}

TEST(MaterialBatch, SameNumbersAsTheScalarCallOnEveryBasis) {
  const MaterialPtr m = copper_like();
  std::vector<double> t;
  for (double x = 4.0; x <= 1300.0; x *= 1.07)
    t.push_back(x);
  t.push_back(1300.0);
  const std::size_t n = t.size();
  for (Basis basis : all_bases) {
    std::vector<double> e(n), c(n), dc(n), k(n), dk(n);
    m->thermal(t.data(), n, basis, e.data(), c.data(), dc.data());
    m->conductivity(t.data(), n, k.data(), dk.data());
    for (std::size_t i = 0; i < n; ++i) {
      const quantacal::ThermalState s = m->thermal(t[i], basis);
      EXPECT_EQ(e[i], s.energy) << t[i]; // bit for bit (documented contract)
      EXPECT_EQ(c[i], s.capacity) << t[i];
      EXPECT_EQ(dc[i], s.capacity_derivative) << t[i];
      EXPECT_EQ(k[i], m->conductivity(t[i]).value);
      EXPECT_EQ(dk[i], m->conductivity(t[i]).derivative);
    }
    // Null outputs are skipped, the others still filled.
    std::vector<double> only_c(n);
    m->thermal(t.data(), n, basis, nullptr, only_c.data(), nullptr);
    EXPECT_EQ(only_c, c);
  }
  // The reference temperature is the zero of energy on every basis (to the table's
  // energy tolerance: the offset comes from the exact model).
  const double reference = 298.15;
  for (Basis basis : all_bases) {
    double e = 1.0;
    m->thermal(&reference, 1, basis, &e, nullptr, nullptr);
    EXPECT_NEAR(e, 0.0, 1e-9 * m->thermal(1300.0, basis).energy);
  }
}

TEST(MaterialBatch, OutsideTheValidRangeNamesTheFirstOffender) {
  const MaterialPtr m = copper_like();
  const double t[] = {300.0, 2.0, 5000.0};
  double e[3];
  try {
    m->thermal(t, 3, Basis::mass, e, nullptr, nullptr);
    FAIL() << "no RangeError";
  } catch (const quantacal::RangeError& error) {
    EXPECT_EQ(error.value(), 2.0);
    EXPECT_EQ(error.subject(), "copper-like");
  }
  const double nan[] = {std::nan("")};
  double k = 0.0;
  EXPECT_THROW(m->conductivity(nan, 1, &k, nullptr), quantacal::RangeError);
}

TEST(MaterialInverse, ConstantCapacityIsLinearOnEveryBasis) {
  // e(T) = c (T - T1) per mole, so T(e) = T1 + e / (c f) on a basis with factor f
  // (analytic).
  const double c = 24.0, lower = 50.0, upper = 900.0;
  const MaterialPtr m = constant_capacity("constant", c, lower, upper);
  for (Basis basis : all_bases) {
    const double f = m->basis_factor(basis);
    for (double t : {50.0, 77.0, 293.15, 611.3, 900.0}) {
      const double e = c * f * (t - lower);
      EXPECT_NEAR(m->temperature_from_energy(e, basis), t, 1e-10 * t);
    }
  }
}

TEST(MaterialInverse, RoundTripsTheTableOnEveryBasis) {
  const MaterialPtr m = copper_like();
  for (Basis basis : all_bases)
    for (double t = 4.0; t <= 1300.0; t *= 1.31) {
      const double e = m->thermal(t, basis).energy;
      // Near 4 K the energy is tiny next to the offset, so compare in energy too.
      const double back = m->temperature_from_energy(e, basis);
      EXPECT_NEAR(m->thermal(back, basis).energy, e,
                  1e-12 * std::abs(m->thermal(1300.0, basis).energy))
          << t;
      if (t > 20.0) {
        EXPECT_NEAR(back, t, 1e-9 * t);
      }
    }
}

TEST(MaterialInverse, EnergyOutsideTheRangeIsARangeError) {
  const MaterialPtr m = copper_like();
  const double top = m->thermal(1300.0, Basis::volume).energy;
  EXPECT_THROW(m->temperature_from_energy(1.01 * top, Basis::volume),
               quantacal::RangeError);
  EXPECT_THROW(m->temperature_from_energy(std::nan(""), Basis::mass),
               quantacal::RangeError);
}

TEST(Equilibrium, TwoBodiesMeetAtTheCapacityWeightedMean) {
  // Calorimetry with constant capacities (analytic):
  // T_f = (m1 c1 T1 + m2 c2 T2) / (m1 c1 + m2 c2).
  const MaterialPtr a = constant_capacity("a", 25.0, 20.0, 1000.0);
  const MaterialPtr b = constant_capacity("b", 75.0, 20.0, 1000.0);
  const double ca = 25.0 / a->molar_mass(), cb = 75.0 / b->molar_mass(); // J/kg/K
  const double m1 = 2.0, t1 = 800.0, m2 = 0.5, t2 = 290.0;
  const quantacal::EquilibriumResult r =
      quantacal::solve_equilibrium({{a, m1, t1, "hot"}, {b, m2, t2, "cold"}});
  const double expected = (m1 * ca * t1 + m2 * cb * t2) / (m1 * ca + m2 * cb);
  EXPECT_NEAR(r.temperature, expected, 1e-10 * expected);
  EXPECT_NEAR(r.heat[0], m1 * ca * (expected - t1), 1e-8 * m1 * ca * (t1 - expected));
  EXPECT_NEAR(r.heat[0] + r.heat[1], 0.0, 1e-8 * std::abs(r.heat[0]));
  EXPECT_LT(r.relative_imbalance, 1e-8);
  EXPECT_TRUE(r.transitions[0].empty());
  // The exact model gives the same temperature (both are exact for this material).
  const quantacal::EquilibriumResult exact = quantacal::solve_equilibrium(
      {{a, m1, t1, ""}, {b, m2, t2, ""}}, quantacal::EnergySource::exact);
  EXPECT_NEAR(exact.temperature, expected, 1e-10 * expected);
}

TEST(Equilibrium, LatentHeatIsGivenUpOnCrossingTheTransition) {
  // A hot body that freezes while warming a cold one (analytic, far from the
  // smeared transition so its share is 0 or 1 to 1e-12):
  // m1 (c1 (T1 - Tf) + L1) = m2 c2 (Tf - T2).
  const double c = 30.0, latent = 10000.0, tt = 600.0; // J/mol/K, J/mol, K
  const MaterialPtr a = constant_capacity("freezing", c, 20.0, 1000.0, latent, tt, 2.0);
  const MaterialPtr b = constant_capacity("bath", 80.0, 20.0, 1000.0);
  const double ca = c / a->molar_mass(), la = latent / a->molar_mass();
  const double cb = 80.0 / b->molar_mass();
  const double m1 = 1.0, t1 = 700.0, m2 = 3.0, t2 = 300.0;
  const quantacal::EquilibriumResult r =
      quantacal::solve_equilibrium({{a, m1, t1, ""}, {b, m2, t2, ""}});
  const double expected = (m1 * (ca * t1 + la) + m2 * cb * t2) / (m1 * ca + m2 * cb);
  ASSERT_LT(expected, tt - 20.0);
  EXPECT_NEAR(r.temperature, expected, 1e-9 * expected);
  ASSERT_EQ(r.transitions[0].size(), 1u);
  EXPECT_TRUE(r.transitions[0][0].crossed);
  EXPECT_FALSE(r.transitions[0][0].ends_inside);
  EXPECT_NEAR(r.transitions[0][0].latent_heat, la, 1e-12 * la);
  EXPECT_TRUE(r.transitions[1].empty());
}

TEST(Equilibrium, BadBodiesAreInputErrors) {
  const MaterialPtr a = constant_capacity("a", 25.0, 20.0, 1000.0);
  EXPECT_THROW(quantacal::solve_equilibrium({{a, 1.0, 300.0, ""}}),
               quantacal::InputError);
  EXPECT_THROW(quantacal::solve_equilibrium({{a, 1.0, 300.0, ""}, {a, 0.0, 400.0, ""}}),
               quantacal::InputError);
  EXPECT_THROW(
      quantacal::solve_equilibrium({{a, 1.0, 300.0, ""}, {nullptr, 1.0, 400.0, ""}}),
      quantacal::InputError);
  try {
    quantacal::solve_equilibrium({{a, 1.0, 300.0, ""}, {a, 1.0, 1200.0, "body-b"}});
    FAIL() << "no RangeError";
  } catch (const quantacal::RangeError& e) {
    EXPECT_NE(std::string(e.what()).find("body \"body-b\""), std::string::npos)
        << e.what();
    EXPECT_NE(std::string(e.what()).find("valid range of material a"), std::string::npos)
        << e.what();
  }
}

TEST(Equilibrium, FinalTemperatureOutsideACommonRangeIsARangeError) {
  // A large cold body pulls T_f below the warm body's range (from 300 K).
  const MaterialPtr cold = constant_capacity("cold", 25.0, 20.0, 1000.0);
  const MaterialPtr warm = constant_capacity("warm", 25.0, 300.0, 1000.0);
  try {
    quantacal::solve_equilibrium({{cold, 100.0, 20.0, ""}, {warm, 1.0, 400.0, ""}});
    FAIL() << "no RangeError";
  } catch (const quantacal::RangeError& e) {
    EXPECT_NE(std::string(e.what()).find("valid range of material warm"),
              std::string::npos)
        << e.what();
  }
}

} // namespace
