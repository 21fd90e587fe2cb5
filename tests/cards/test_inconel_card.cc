// SPDX-License-Identifier: Apache-2.0
// The Inconel 600 card (materials/inconel_600.yaml) against published data.
//
// Sources, and which checks are FIT CHECKS (the card was built from the source):
// - Special Metals Corporation, INCONEL alloy 600 data sheet (specialmetals.com),
//   table of thermal properties, 20-1000 degC: c_p 444, 465, 486, 502, 519, 536, 578,
//   595, 611, 628, 645 J/kg/K and k 14.9, 15.9, 17.3, 19.0, 20.5, 22.1, 23.9, 25.7,
//   27.5, 29.3, 31.1 W/m/K (from memory; the data sheet says the specific heats were
//   calculated from composition and the conductivities from electrical
//   resistivity; no uncertainty stated). The card's tables ARE these values (plus a
//   1100 degC point extrapolated here): every check against them is a FIT CHECK.
// - Web page of an alloy supplier (mualloy.com, "Inconel 600 thermal conductivity",
//   stored copy): k 14.8, 16.1, 18.1, 21.5, 24.7, 28.1 W/m/K at 25, 100, 200, 400,
//   600, 800 degC and c_p 427 J/kg/K at 25 degC; its own sources are not stated.
//   Independent of the card's build, but of unknown provenance (it may descend from
//   the same data sheet): a weak second source.
// - No published c_p or k of Inconel 600 below room temperature was found (the NIST
//   cryogenic pages give Inconel 718, a different alloy), and no second source for
//   c_p above room temperature or for k above 1073 K.
// Tolerances: c_p 5 %, H(T) - H(298.15 K) 2 %; conductivity fit checks 1 %, the
// independent conductivity check 5 % (a judgement: no stated uncertainty).
#include "published_forms.h"
#include "support.h"

#include <quantacal/cards/card.h>
#include <quantacal/common/exceptions.h>

#include <gtest/gtest.h>

#include <cmath>
#include <cstdio>

namespace {

using namespace quantacal;
using quantacal::test::deviation;
using quantacal::test::material_path;

// Special Metals data sheet, INCONEL alloy 600 (from memory), 20-1000 degC.
constexpr double kSheetT[] = {293.15, 373.15, 473.15,  573.15,  673.15, 773.15,
                              873.15, 973.15, 1073.15, 1173.15, 1273.15};
constexpr double kSheetCp[] = {444, 465, 486, 502, 519, 536, 578, 595, 611, 628, 645};
constexpr double kSheetK[] = {14.9, 15.9, 17.3, 19.0, 20.5, 22.1,
                              23.9, 25.7, 27.5, 29.3, 31.1};
constexpr int kSheetN = 11;

double interpolate(const double* y, double t) {
  int i = 0;
  while (i + 2 < kSheetN && kSheetT[i + 1] < t)
    ++i;
  return y[i] + (y[i + 1] - y[i]) * (t - kSheetT[i]) / (kSheetT[i + 1] - kSheetT[i]);
}

// H(t) - H(298.15 K) of the data sheet's c_p, J/kg: trapezoids (piecewise-linear
// c_p) from 298.15 K.
double sheet_enthalpy(double t) {
  const int n = 20000;
  const double h = (t - 298.15) / n;
  double sum = 0.0;
  for (int i = 0; i <= n; ++i) {
    const double w = (i == 0 || i == n) ? 0.5 : 1.0;
    sum += w * interpolate(kSheetCp, 298.15 + i * h);
  }
  return sum * h;
}

MaterialPtr card() {
  return load_card(material_path("inconel_600.yaml"));
}

TEST(Inconel600Card, ValidFrom293KTo1373K) {
  const MaterialPtr in = card();
  EXPECT_DOUBLE_EQ(in->lower_temperature(), 293.0);
  EXPECT_DOUBLE_EQ(in->upper_temperature(), 1373.0);
  EXPECT_THROW(in->thermal(292.0), RangeError);
  EXPECT_THROW(in->thermal(1374.0), RangeError);
}

// FIT CHECK: c_p against the data sheet at its temperatures, 20 degC to 1000 degC,
// within 5 % (the project's c_p tolerance; the card is these values, so the measured
// deviations show only the card's table and its 0.15 K offsets).
TEST(Inconel600Card, SpecificHeatAgainstDataSheetFitCheck) {
  const MaterialPtr in = card();
  for (int i = 0; i < kSheetN; ++i) {
    const double t = kSheetT[i];
    const double model = in->thermal(t, Basis::mass).capacity;
    const double reference = kSheetCp[i]; // Special Metals, INCONEL alloy 600 (memory)
    std::printf("  IN600 c_p(%7.2f K) card %7.2f  data sheet %5.0f J/kg/K  %+5.2f %%  "
                "(fit check)\n",
                t, model, reference, 100 * deviation(model, reference));
    EXPECT_NEAR(deviation(model, reference), 0.0, 0.05) << t;
  }
  const double hot = in->thermal(1373.0, Basis::mass).capacity;
  std::printf(
      "  IN600 c_p(1373.00 K) card %7.2f J/kg/K  (extrapolated point; no published "
      "value found)\n",
      hot);
}

// Independent (weak): the supplier page's 427 J/kg/K at 25 degC, within 5 %.
TEST(Inconel600Card, SpecificHeatAgainstSupplierPageAtRoomTemperature) {
  const MaterialPtr in = card();
  const double model = in->thermal(298.15, Basis::mass).capacity;
  std::printf("  IN600 c_p(298.15 K) card %7.2f  supplier page 427 J/kg/K  %+5.2f %%\n",
              model, 100 * deviation(model, 427.0));
  EXPECT_NEAR(deviation(model, 427.0), 0.0, 0.05); // mualloy.com page (stored copy)
}

// FIT CHECK: H(T) - H(298.15 K) against the data sheet's c_p integrated here
// (piecewise linear), within 2 %.
TEST(Inconel600Card, EnthalpyAgainstDataSheetFitCheck) {
  const MaterialPtr in = card();
  const double h0 = in->thermal(298.15, Basis::mass).energy;
  for (double t : {500.0, 800.0, 1000.0, 1273.0}) {
    const double model = in->thermal(t, Basis::mass).energy - h0;
    const double reference = sheet_enthalpy(t); // Special Metals data sheet (memory)
    std::printf("  IN600 H(%6.1f K) - H(298.15 K) card %8.0f  data sheet %8.0f J/kg  "
                "%+5.2f %%  (fit check)\n",
                t, model, reference, 100 * deviation(model, reference));
    EXPECT_NEAR(deviation(model, reference), 0.0, 0.02) << t;
  }
}

// FIT CHECK: conductivity between the data sheet's points (none at a table point),
// against straight-line interpolation of them, within 1 %.
TEST(Inconel600Card, ConductivityBetweenDataSheetPointsFitCheck) {
  const MaterialPtr in = card();
  for (double t : {333.0, 423.0, 623.0, 823.0, 923.0, 1123.0, 1223.0}) {
    const double model = in->conductivity(t).value;
    const double reference = interpolate(kSheetK, t); // Special Metals data sheet
    std::printf("  IN600 k(%6.1f K) card %6.3f  data sheet (interp.) %6.3f W/m/K  %+5.2f "
                "%%  (fit "
                "check)\n",
                t, model, reference, 100 * deviation(model, reference));
    EXPECT_NEAR(deviation(model, reference), 0.0, 0.01) << t;
  }
}

// Independent (weak): the supplier page's conductivities, 25 degC to 800 degC, within
// 5 % (a judgement; neither source states an uncertainty). 298.15 K is not a table
// point of the card; the others coincide with data-sheet temperatures.
TEST(Inconel600Card, ConductivityAgainstSupplierPage) {
  const MaterialPtr in = card();
  const double temperature[] = {298.15, 373.15, 473.15, 673.15, 873.15, 1073.15};
  const double reference[] = {14.8, 16.1, 18.1, 21.5, 24.7, 28.1}; // mualloy.com page
  for (int i = 0; i < 6; ++i) {
    const double model = in->conductivity(temperature[i]).value;
    std::printf("  IN600 k(%7.2f K) card %6.3f  supplier page %5.1f W/m/K  %+5.2f %%\n",
                temperature[i], model, reference[i],
                100 * deviation(model, reference[i]));
    EXPECT_NEAR(deviation(model, reference[i]), 0.0, 0.05) << temperature[i];
  }
}

} // namespace
