// SPDX-License-Identifier: Apache-2.0
// The plain-carbon steel card materials/steel_c45.yaml (0.45 % C, ferrite +
// pearlite, the eutectoid and ferrite-austenite heats, austenite) against
// published steel data it was not built on:
//  - EN 1993-1-2:2005 (Eurocode 3: Design of steel structures, Part 1-2,
//    Structural fire design), 3.4.1.2, the specific heat of carbon steel,
//    c = 425 + 0.773 t - 1.69e-3 t^2 + 2.22e-6 t^3 (20-600 degC),
//    666 + 13002/(738 - t) (600-735 degC), 545 + 17820/(t - 731) (735-900 degC),
//    650 J/kg/K (900-1200 degC), t in degC, and 3.4.1.3, its conductivity
//    54 - 3.33e-2 t W/m/K (20-800 degC), 27.3 W/m/K (800-1200 degC); computed here,
//    the enthalpy by integrating the specific heat in closed form;
//  - Incropera and DeWitt, Fundamentals of Heat and Mass Transfer, Table A.1,
//    carbon-silicon steel (Mn <= 1 %, 0.1 % < Si <= 0.6 %), c_p (from memory);
//  - the eutectoid heat of Umino, Sci. Rep. Tohoku Imp. Univ. 23 (1935) 665;
//  - the conductivity of a 0.435 % C steel at 0 and 100 degC ("1040 carbon steel
//    thermal properties", steel-tube-pipes.com, a handbook table quoted there).
// The card's capacity is the SGTE series of iron per atom (Dinsdale 1991) and its
// eutectoid heat comes from Hagel, Pound and Mehl (1956): those are fit checks,
// labelled so. The conductivity table is Incropera's carbon-silicon steel to
// 1000 K (validated here against EN 1993-1-2) and EN 1993-1-2 from 1073 K (fit
// check). EN 1993-1-2 describes structural carbon steels in general, not C45
// alone, and spreads their transformation heat over 600-900 degC; it is compared
// pointwise only away from the transformations, and through the enthalpy across
// them.
#include "published_forms.h"
#include "support.h"

#include <quantacal/cards/card.h>
#include <quantacal/models/phases.h>

#include <gtest/gtest.h>

#include <cmath>
#include <cstdio>

namespace {

using namespace quantacal;
using quantacal::test::deviation;
using quantacal::test::material_path;

constexpr double kCelsius = 273.15;

// EN 1993-1-2:2005, 3.4.1.2: specific heat of carbon steel, J/kg/K.
double en_capacity(double t_kelvin) {
  const double t = t_kelvin - kCelsius;
  if (t < 600.0)
    return 425.0 + 0.773 * t - 1.69e-3 * t * t + 2.22e-6 * t * t * t;
  if (t < 735.0)
    return 666.0 + 13002.0 / (738.0 - t);
  if (t < 900.0)
    return 545.0 + 17820.0 / (t - 731.0);
  return 650.0;
}

// Its integral from 20 degC, J/kg, in closed form piece by piece.
double en_enthalpy(double t_kelvin) {
  const double t = t_kelvin - kCelsius;
  const auto f1 = [](double x) {
    return 425.0 * x + 0.773 * x * x / 2 - 1.69e-3 * x * x * x / 3 +
           2.22e-6 * x * x * x * x / 4;
  };
  const auto f2 = [](double x) { return 666.0 * x - 13002.0 * std::log(738.0 - x); };
  const auto f3 = [](double x) { return 545.0 * x + 17820.0 * std::log(x - 731.0); };
  const auto f4 = [](double x) { return 650.0 * x; };
  if (t < 600.0)
    return f1(t) - f1(20.0);
  double h = f1(600.0) - f1(20.0);
  if (t < 735.0)
    return h + f2(t) - f2(600.0);
  h += f2(735.0) - f2(600.0);
  if (t < 900.0)
    return h + f3(t) - f3(735.0);
  h += f3(900.0) - f3(735.0);
  return h + f4(t) - f4(900.0);
}

// EN 1993-1-2:2005, 3.4.1.3: conductivity of carbon steel, W/m/K.
double en_conductivity(double t_kelvin) {
  const double t = t_kelvin - kCelsius;
  return t < 800.0 ? 54.0 - 3.33e-2 * t : 27.3;
}

// The card's transitions: Ac1 = 996.5 K, the ferrite-austenite join centred on
// 1030 K, Ac3 = 1058 K, and the ferrite's Curie point 1043 K.
bool near_transition(double t) {
  for (double tt : {996.5, 1030.0, 1043.0, 1058.0})
    if (std::fabs(t - tt) <= 0.05 * tt)
      return true;
  return false;
}

// c_p within 5 % (the project's 3-5 % away from peaks) of EN 1993-1-2, from room
// temperature to below Ac1 and in the austenite. Within 5 % of Ac1 (950 K) the
// tolerance is 10 %, said here: EN puts a structural steel's transformation
// heat into a broad peak there. From 1008 K to 1173 K (735-900 degC) EN's
// capacity is the tail of that smeared peak, not a capacity of C45 (whose
// ferrite is austenite from 1058 K on): not compared pointwise; the enthalpy
// test covers it. The worst deviation is printed.
TEST(SteelCard, SpecificHeatAgainstEurocode3) {
  const MaterialPtr steel = load_card(material_path("steel_c45.yaml"));
  double worst = 0.0;
  for (double t : {293.15, 350.0, 400.0, 500.0, 600.0, 700.0, 800.0, 900.0,
                   /* within 5 % of Ac1: */ 950.0, 1200.0, 1300.0, 1400.0, 1473.15}) {
    const double model = steel->thermal(t, Basis::mass).capacity;
    const double reference = en_capacity(t); // EN 1993-1-2:2005, 3.4.1.2
    const double d = deviation(model, reference);
    std::printf("  C45 c_p(%7.2f K) card %7.1f  EN 1993-1-2 %7.1f J/kg/K  %+5.2f %%\n", t,
                model, reference, 100 * d);
    const bool near = near_transition(t);
    EXPECT_NEAR(d, 0.0, near ? 0.10 : 0.05) << t;
    if (!near && std::fabs(d) > std::fabs(worst))
      worst = d;
  }
  std::printf("  C45 c_p worst away from the transitions %+5.2f %%\n", 100 * worst);
}

// c_p within 5 % of Incropera and DeWitt's carbon-silicon steel (a second,
// independent source; its 1000 K value, 971 J/kg/K, lies within 5 % of Ac1 and
// the Curie point, on the side of a peak the two describe differently: not used).
TEST(SteelCard, SpecificHeatAgainstIncroperaCarbonSiliconSteel) {
  const MaterialPtr steel = load_card(material_path("steel_c45.yaml"));
  const double t_ref[] = {300.0, 400.0, 600.0, 800.0};
  const double c_ref[] = {446.0, 501.0, 582.0, 699.0}; // Incropera, Table A.1 (memory)
  for (int i = 0; i < 4; ++i) {
    const double model = steel->thermal(t_ref[i], Basis::mass).capacity;
    const double d = deviation(model, c_ref[i]);
    std::printf("  C45 c_p(%6.1f K) card %7.1f  Incropera %7.1f J/kg/K  %+5.2f %%\n",
                t_ref[i], model, c_ref[i], 100 * d);
    EXPECT_NEAR(d, 0.0, 0.05) << t_ref[i];
  }
}

// H(T) - H(298.15 K) within 2 % (the project's requirement) of EN 1993-1-2
// integrated, below Ac1 (500, 700, 900 K) and above Ac3 with both transformation
// heats included (1100, 1200, 1300, 1473.15 K). The heat taken from 900 K to
// 1100 K, across both transformations and the Curie point, within 3 % (a
// difference of two enthalpies, each within 2 %; said here).
TEST(SteelCard, EnthalpyAgainstEurocode3) {
  const MaterialPtr steel = load_card(material_path("steel_c45.yaml"));
  const double h0 = steel->thermal(298.15, Basis::mass).energy;
  const double e0 = en_enthalpy(298.15);
  for (double t : {500.0, 700.0, 900.0, 1100.0, 1200.0, 1300.0, 1473.15}) {
    const double model = steel->thermal(t, Basis::mass).energy - h0;
    const double reference = en_enthalpy(t) - e0; // EN 1993-1-2:2005, 3.4.1.2
    const double d = deviation(model, reference);
    std::printf("  C45 H(%7.2f K) - H(298.15 K) card %7.1f  EN 1993-1-2 %7.1f kJ/kg  "
                "%+5.2f %%\n",
                t, model / 1000, reference / 1000, 100 * d);
    EXPECT_NEAR(d, 0.0, 0.02) << t;
  }
  const double model = steel->thermal(1100.0, Basis::mass).energy -
                       steel->thermal(900.0, Basis::mass).energy;
  const double reference = en_enthalpy(1100.0) - en_enthalpy(900.0); // EN 1993-1-2
  std::printf(
      "  C45 H(1100 K) - H(900 K) card %6.1f  EN 1993-1-2 %6.1f kJ/kg  %+5.2f %%\n",
      model / 1000, reference / 1000, 100 * deviation(model, reference));
  EXPECT_NEAR(deviation(model, reference), 0.0, 0.03);
}

// Conductivity away from the card's table points against EN 1993-1-2 (the table
// is Incropera's below 1000 K, so these are validation), within 5 %: handbook
// conductivities of one steel grade scatter by about that much. At 1200 K and
// 1400 K the table is EN's own value: fit checks.
TEST(SteelCard, ConductivityAgainstEurocode3) {
  const MaterialPtr steel = load_card(material_path("steel_c45.yaml"));
  for (double t : {293.15, 350.0, 500.0, 700.0, 900.0, /* fit check: */ 1200.0, 1400.0}) {
    const double model = steel->conductivity(t).value;
    const double reference = en_conductivity(t); // EN 1993-1-2:2005, 3.4.1.3
    const double d = deviation(model, reference);
    std::printf("  C45 k(%7.2f K) card %6.2f  EN 1993-1-2 %6.2f W/m/K  %+5.2f %%%s\n", t,
                model, reference, 100 * d, t > 1100.0 ? "  (fit check)" : "");
    EXPECT_NEAR(d, 0.0, t > 1100.0 ? 1e-6 : 0.05) << t;
  }
  // A 0.4 % C steel itself (0.435 % C, 0.69 % Mn, 0.20 % Si, annealed at 860
  // degC): 51.9 W/m/K at 0 degC and 50.7 W/m/K at 100 degC, "1040 carbon steel
  // thermal properties", steel-tube-pipes.com (a handbook table quoted there).
  // 273.15 K is a table point of the card, but extrapolated from Incropera's
  // 300-400 K, not taken from this source.
  const double t_ref[] = {273.15, 373.15};
  const double k_ref[] = {51.9, 50.7};
  for (int i = 0; i < 2; ++i) {
    const double model = steel->conductivity(t_ref[i]).value;
    const double d = deviation(model, k_ref[i]);
    std::printf("  C45 k(%7.2f K) card %6.2f  0.435 %% C steel %6.2f W/m/K  %+5.2f %%\n",
                t_ref[i], model, k_ref[i], 100 * d);
    EXPECT_NEAR(d, 0.0, 0.05) << t_ref[i];
  }
}

// The transformation heats. The eutectoid heat is the pearlite fraction 0.573 of
// 82.0 J/g (Hagel, Pound and Mehl, Acta Metall. 4 (1956) 37): a fit check, to
// 0.5 %. Umino (1935) measured 16.60 cal/g = 69.45 J/g for the eutectoid
// instead, 15 % less: the card lies within 20 % of it (the two sources differ
// by that much; said here). The energy taken over the eutectoid join, less the
// sensible heat either side (the card's own c_p), is that heat to 1 %.
TEST(SteelCard, TransformationHeats) {
  const MaterialPtr steel = load_card(material_path("steel_c45.yaml"));
  const double molar_mass = 0.05480; // kg/mol, the card's
  const auto& b = steel->data().phase_layout->boundaries();
  ASSERT_EQ(b.size(), 3u);
  EXPECT_NEAR(b[1].temperature, 996.5, 1e-9);
  const double eutectoid = b[1].latent_heat / molar_mass; // J/kg
  const double hagel = 0.573 * 82.0e3;                    // Hagel et al. 1956
  const double umino = 0.573 * 16.60 * 4.184e3;           // Umino 1935
  std::printf("  C45 eutectoid heat card %.1f kJ/kg; Hagel et al. %.1f (fit check, "
              "%+5.2f %%), Umino %.1f (%+5.2f %%)\n",
              eutectoid / 1000, hagel / 1000, 100 * deviation(eutectoid, hagel),
              umino / 1000, 100 * deviation(eutectoid, umino));
  EXPECT_NEAR(deviation(eutectoid, hagel), 0.0, 0.005);
  EXPECT_NEAR(deviation(eutectoid, umino), 0.0, 0.20);

  // The jump over the 10 K eutectoid join (991.5-1001.5 K), less the sensible
  // heat from 986.5 K to Ac1 and from Ac1 to 1002 K (the start of the next join
  // is 1002.5 K).
  const double below = 986.5, above = 1002.0, tt = 996.5;
  const double jump = steel->thermal(above, Basis::mass).energy -
                      steel->thermal(below, Basis::mass).energy;
  const double c_below = steel->thermal(below, Basis::mass).capacity;
  const double c_above = steel->thermal(above, Basis::mass).capacity;
  const double latent = jump - c_below * (tt - below) - c_above * (above - tt);
  std::printf("  C45 eutectoid heat from the card's energy %.1f kJ/kg\n", latent / 1000);
  EXPECT_NEAR(deviation(latent, eutectoid), 0.0, 0.01);

  // The ferrite-austenite heat: 0.419 of H(fcc) - H(bcc) of iron at 1030 K from
  // the SGTE unary data (Dinsdale 1991), 3059 J/mol: a fit check.
  std::printf("  C45 ferrite-austenite heat card %.0f J/mol (fit check: 0.419 x 3059 = "
              "%.0f)\n",
              b[2].latent_heat, 0.419 * 3059.0);
  EXPECT_NEAR(b[2].latent_heat / (0.419 * 3059.0) - 1, 0.0, 0.005);
}

} // namespace
