// SPDX-License-Identifier: Apache-2.0
// The AISI 304 stainless steel card (materials/stainless_304.yaml) against published
// data.
//
// Sources, and which checks are FIT CHECKS (the card was built from the source):
// - NIST cryogenic correlations for 304 stainless (Marquardt, Le and Radebaugh,
//   "Cryogenic Material Properties Database", 11th Int. Cryocooler Conf., 2000; NIST
//   Cryogenics web page "304 Stainless (UNS S30400)"), computed here: log10 y =
//   sum_{n=0..8} a_n (log10 T)^n, data 4-300 K; stated curve-fit error 5 % (c_p) and
//   2 % (k). The card's c_p points below 300 K and its conductivity table to 300 K
//   are computed from them: every check against NIST is a FIT CHECK.
// - Incropera and DeWitt, Fundamentals of Heat and Mass Transfer, Table A.1, AISI 304
//   (from memory): c_p 272, 402, 477, 515, 557, 582, 611, 640, 682 J/kg/K and k 9.2,
//   12.6, 14.9, 16.6, 19.8, 22.6, 25.4, 28.0, 31.7 W/m/K at 100, 200, 300, 400, 600,
//   800, 1000, 1200, 1500 K. The card's c_p above 280 K and k from 400 K to 1500 K
//   are these values (no check against them there); at 100 K and 200 K the card
//   uses NIST, so the handbook is an independent check there.
// - C. S. Kim, Thermophysical Properties of Stainless Steels, ANL-75-55 (Argonne,
//   1975), 304L: c_p = 0.1122 + 3.222e-5 T cal/g/K, k = 8.116 + 0.01618 T W/m/K
//   (T in K). Independent of the card's build, except that the card's conductivity
//   at 1700 K uses Kim's slope above 1500 K. Kim's stated uncertainties were not
//   found here; the tolerances below are the project's 5 % (c_p) and 2 % (H).
// - Cezairliyan and Miiller, Int. J. Thermophys. 1 (1980) 83 (304L, subsecond pulse
//   heating): c_p = 1127 - 0.7265 T + 2.884e-4 T^2 J/kg/K, 1400-1700 K, stated
//   inaccuracy 3 %. The card's c_p points at 1600 K and 1700 K are computed from it
//   (FIT CHECK above 1500 K); at 1400-1500 K the card is the handbook table, so
//   there the check is independent.
// - No second independent source was found for c_p or k below 100 K (the NIST
//   correlation is the only one used), nor for k above 1500 K (the card's 1700 K
//   point is computed from the handbook and Kim's slope).
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
using quantacal::test::nist_log_polynomial;

// NIST 304 correlations: coefficients a..i of log10 y in powers of log10 T.
constexpr double kNistCp[9] = {22.0061,   -127.5528, 303.647,   -381.0098, 274.0328,
                               -112.9212, 24.7593,   -2.239153, 0.0}; // J/kg/K
constexpr double kNistK[9] = {-1.4087, 1.3982,  0.2543, -0.6260, 0.2334,
                              0.4256,  -0.4658, 0.1650, -0.0199}; // W/m/K

// H(t1) - H(t0) of the NIST c_p correlation, J/kg.
double nist_enthalpy(double t0, double t1) {
  return quantacal::test::nist_log_polynomial_integral(kNistCp, t0, t1);
}

// Kim (ANL-75-55, 1975), 304L, converted with 1 cal = 4.184 J.
constexpr double kKimA = 0.1122 * 4184.0, kKimB = 3.222e-5 * 4184.0; // J/kg/K, J/kg/K^2
double kim_capacity(double t) {
  return kKimA + kKimB * t;
}
double kim_enthalpy(double t0, double t1) { // J/kg
  return kKimA * (t1 - t0) + 0.5 * kKimB * (t1 * t1 - t0 * t0);
}
double kim_conductivity(double t) {
  return 8.116 + 0.01618 * t;
}

// Cezairliyan and Miiller (1980), 304L, 1400-1700 K, J/kg/K.
double pulse_capacity(double t) {
  return 1127.0 - 0.7265 * t + 2.884e-4 * t * t;
}
double pulse_enthalpy(double t0, double t1) { // J/kg
  auto f = [](double t) {
    return 1127.0 * t - 0.5 * 0.7265 * t * t + 2.884e-4 * t * t * t / 3.0;
  };
  return f(t1) - f(t0);
}

MaterialPtr card() {
  return load_card(material_path("stainless_304.yaml"));
}

TEST(Stainless304Card, ValidFrom4KTo1700K) {
  const MaterialPtr ss = card();
  EXPECT_DOUBLE_EQ(ss->lower_temperature(), 4.0);
  EXPECT_DOUBLE_EQ(ss->upper_temperature(), 1700.0);
  EXPECT_THROW(ss->thermal(3.9), RangeError);
  EXPECT_THROW(ss->thermal(1700.5), RangeError);
}

// FIT CHECK: c_p against the NIST correlation, 4 K to 250 K, at temperatures that
// are not points of the card's c_p table, within the correlation's stated 5 %.
TEST(Stainless304Card, SpecificHeatAgainstNistCorrelationFitCheck) {
  const MaterialPtr ss = card();
  for (double t : {4.25, 6.5, 13.0, 26.5, 47.0, 77.0, 130.0, 190.0, 240.0}) {
    const double model = ss->thermal(t, Basis::mass).capacity;
    const double reference =
        nist_log_polynomial(kNistCp, t); // NIST 304 correlation (2000)
    std::printf(
        "  304 c_p(%6.2f K) card %9.4f  NIST %9.4f J/kg/K  %+6.2f %%  (fit check)\n", t,
        model, reference, 100 * deviation(model, reference));
    EXPECT_NEAR(deviation(model, reference), 0.0, 0.05) << t;
  }
}

// Independent: below the 260-300 K join the card is the NIST correlation; the
// handbook values of 304 at 100 K and 200 K come from other compilations. The
// handbook states no uncertainty; 5 % is the project's c_p tolerance.
TEST(Stainless304Card, SpecificHeatAgainstHandbookBelowRoomTemperature) {
  const MaterialPtr ss = card();
  const double temperature[] = {100.0, 200.0};
  const double reference[] = {272.0, 402.0}; // Incropera and DeWitt, Table A.1 (memory)
  for (int i = 0; i < 2; ++i) {
    const double model = ss->thermal(temperature[i], Basis::mass).capacity;
    std::printf("  304 c_p(%5.1f K) card %7.2f  Incropera %7.2f J/kg/K  %+5.2f %%\n",
                temperature[i], model, reference[i],
                100 * deviation(model, reference[i]));
    EXPECT_NEAR(deviation(model, reference[i]), 0.0, 0.05) << temperature[i];
  }
}

// Independent: Kim's 304L correlation (ANL-75-55, 1975), 400 K to 1600 K, within
// 5 % (the project's c_p tolerance; Kim's own uncertainty was not found). At 300 K
// Kim's straight line gives 509.9 J/kg/K, 7 % above both the handbook (477) and the
// NIST correlation (469): printed, not asserted (the line does not follow the
// curvature of c_p below about 400 K).
TEST(Stainless304Card, SpecificHeatAgainstKim) {
  const MaterialPtr ss = card();
  for (double t : {400.0, 500.0, 700.0, 900.0, 1100.0, 1300.0, 1500.0, 1600.0}) {
    const double model = ss->thermal(t, Basis::mass).capacity;
    const double reference = kim_capacity(t); // Kim, ANL-75-55 (1975), 304L
    std::printf("  304 c_p(%6.1f K) card %7.2f  Kim %7.2f J/kg/K  %+5.2f %%\n", t, model,
                reference, 100 * deviation(model, reference));
    EXPECT_NEAR(deviation(model, reference), 0.0, 0.05) << t;
  }
  const double model = ss->thermal(300.0, Basis::mass).capacity;
  std::printf(
      "  304 c_p( 300.0 K) card %7.2f  Kim %7.2f J/kg/K  %+5.2f %%  (not asserted, "
      "see above)\n",
      model, kim_capacity(300.0), 100 * deviation(model, kim_capacity(300.0)));
}

// Pulse-heating c_p of 304L (Cezairliyan and Miiller 1980), within its stated 3 %.
// At 1400 K and 1450 K the card is the handbook table (independent); at 1550 K and
// 1650 K it interpolates points computed from this source (FIT CHECK).
TEST(Stainless304Card, SpecificHeatAgainstPulseHeating) {
  const MaterialPtr ss = card();
  for (double t : {1400.0, 1450.0, 1550.0, 1650.0}) {
    const double model = ss->thermal(t, Basis::mass).capacity;
    const double reference = pulse_capacity(t); // Cezairliyan and Miiller (1980)
    std::printf(
        "  304 c_p(%6.1f K) card %7.2f  pulse heating %7.2f J/kg/K  %+5.2f %%%s\n", t,
        model, reference, 100 * deviation(model, reference),
        t > 1500.0 ? "  (fit check)" : "");
    EXPECT_NEAR(deviation(model, reference), 0.0, 0.03) << t;
  }
}

// Independent: H(T) - H(298.15 K) against Kim's 304L c_p integrated, 800 K to
// 1600 K, within 2 % (the project's enthalpy tolerance). At 400 K and 500 K the
// energy is dominated by 300-400 K, where Kim's line is 7 % above the handbook and
// NIST (see SpecificHeatAgainstKim): printed, not asserted.
TEST(Stainless304Card, EnthalpyAboveRoomTemperatureAgainstKim) {
  const MaterialPtr ss = card();
  const double h0 = ss->thermal(298.15, Basis::mass).energy;
  for (double t : {800.0, 1000.0, 1200.0, 1500.0, 1600.0}) {
    const double model = ss->thermal(t, Basis::mass).energy - h0;
    const double reference = kim_enthalpy(298.15, t); // Kim, ANL-75-55 (1975), 304L
    std::printf("  304 H(%6.1f K) - H(298.15 K) card %9.0f  Kim %9.0f J/kg  %+5.2f %%\n",
                t, model, reference, 100 * deviation(model, reference));
    EXPECT_NEAR(deviation(model, reference), 0.0, 0.02) << t;
  }
  for (double t : {400.0, 500.0}) {
    const double model = ss->thermal(t, Basis::mass).energy - h0;
    const double reference = kim_enthalpy(298.15, t);
    std::printf("  304 H(%6.1f K) - H(298.15 K) card %9.0f  Kim %9.0f J/kg  %+5.2f %%  "
                "(not asserted, see above)\n",
                t, model, reference, 100 * deviation(model, reference));
  }
}

// H(T) - H(1400 K) against the pulse-heating c_p integrated, within 2 %; to 1500 K
// independent, above partly a FIT CHECK (the card's 1600 K and 1700 K points).
TEST(Stainless304Card, EnthalpyNearTheSolidusAgainstPulseHeating) {
  const MaterialPtr ss = card();
  const double h0 = ss->thermal(1400.0, Basis::mass).energy;
  for (double t : {1500.0, 1600.0, 1700.0}) {
    const double model = ss->thermal(t, Basis::mass).energy - h0;
    const double reference = pulse_enthalpy(1400.0, t); // Cezairliyan and Miiller 1980
    std::printf("  304 H(%6.1f K) - H(1400 K) card %8.0f  pulse heating %8.0f J/kg  "
                "%+5.2f %%%s\n",
                t, model, reference, 100 * deviation(model, reference),
                t > 1500.0 ? "  (partly fit check)" : "");
    EXPECT_NEAR(deviation(model, reference), 0.0, 0.02) << t;
  }
}

// FIT CHECK: the heat given up in a cool-down from 298.15 K, H(T) - H(298.15 K),
// against the NIST c_p correlation integrated here, within its stated 5 %.
TEST(Stainless304Card, CoolDownEnthalpyAgainstNistCorrelationFitCheck) {
  const MaterialPtr ss = card();
  const double h0 = ss->thermal(298.15, Basis::mass).energy;
  for (double t : {4.0, 20.0, 77.0, 150.0, 250.0}) {
    const double model = ss->thermal(t, Basis::mass).energy - h0;
    const double reference = -nist_enthalpy(t, 298.15); // NIST 304 correlation (2000)
    std::printf("  304 H(%5.1f K) - H(298.15 K) card %9.1f  NIST %9.1f J/kg  %+5.2f %%  "
                "(fit check)\n",
                t, model, reference, 100 * deviation(model, reference));
    EXPECT_NEAR(deviation(model, reference), 0.0, 0.05) << t;
  }
}

// FIT CHECK: conductivity against the NIST correlation between the table's points,
// within the correlation's stated fit error, 2 %.
TEST(Stainless304Card, ConductivityAgainstNistCorrelationFitCheck) {
  const MaterialPtr ss = card();
  for (double t :
       {4.5, 6.0, 8.5, 12.0, 17.0, 24.0, 33.0, 47.0, 65.0, 90.0, 130.0, 180.0, 260.0}) {
    const double model = ss->conductivity(t).value;
    const double reference =
        nist_log_polynomial(kNistK, t); // NIST 304 correlation (2000)
    std::printf("  304 k(%5.1f K) card %8.4f  NIST %8.4f W/m/K  %+6.3f %%  (fit check)\n",
                t, model, reference, 100 * deviation(model, reference));
    EXPECT_NEAR(deviation(model, reference), 0.0, 0.02) << t;
  }
}

// Independent: the handbook conductivity of 304 at 100 K and 200 K (not table points
// of the card, which is NIST there) and at 300 K (a NIST point of the card). The
// handbook states no uncertainty; 5 % is a judgement (heat-to-heat spread of 304).
TEST(Stainless304Card, ConductivityAgainstHandbookToRoomTemperature) {
  const MaterialPtr ss = card();
  const double temperature[] = {100.0, 200.0, 300.0};
  const double reference[] = {9.2, 12.6,
                              14.9}; // Incropera and DeWitt, Table A.1 (memory)
  for (int i = 0; i < 3; ++i) {
    const double model = ss->conductivity(temperature[i]).value;
    std::printf("  304 k(%5.1f K) card %7.3f  Incropera %6.2f W/m/K  %+5.2f %%\n",
                temperature[i], model, reference[i],
                100 * deviation(model, reference[i]));
    EXPECT_NEAR(deviation(model, reference[i]), 0.0, 0.05) << temperature[i];
  }
}

// Independent: Kim's 304L conductivity (ANL-75-55, 1975), between the card's table
// points. Above 1000 K the two published recommendations (Kim and the handbook the
// card carries) agree within 5 % (a judgement; Kim's uncertainty was not found).
// From 500 K to 900 K Kim lies 6-12 % below the handbook, and below the NIST
// correlation at 300 K by 15 %: there the bound is 15 %, the spread of the published
// values, which catches gross errors only.
TEST(Stainless304Card, ConductivityAgainstKim) {
  const MaterialPtr ss = card();
  for (double t : {1100.0, 1300.0, 1400.0, 1600.0}) {
    const double model = ss->conductivity(t).value;
    const double reference = kim_conductivity(t); // Kim, ANL-75-55 (1975), 304L
    std::printf("  304 k(%6.1f K) card %7.3f  Kim %7.3f W/m/K  %+5.2f %%\n", t, model,
                reference, 100 * deviation(model, reference));
    EXPECT_NEAR(deviation(model, reference), 0.0, 0.05) << t;
  }
  for (double t : {500.0, 700.0, 900.0}) {
    const double model = ss->conductivity(t).value;
    const double reference = kim_conductivity(t); // Kim, ANL-75-55 (1975), 304L
    std::printf("  304 k(%6.1f K) card %7.3f  Kim %7.3f W/m/K  %+5.2f %%  (sources "
                "disagree; bound 15 %%)\n",
                t, model, reference, 100 * deviation(model, reference));
    EXPECT_NEAR(deviation(model, reference), 0.0, 0.15) << t;
  }
}

} // namespace
