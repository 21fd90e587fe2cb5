// SPDX-License-Identifier: Apache-2.0
// Bundled cards against the SGTE unary Gibbs energies of the elements (Dinsdale,
// CALPHAD 15 (1991) 317), from which C_p = -T d2G/dT2 is computed here. Fit
// checks: the aluminium, iron, silicon, titanium, copper and silver cards carry
// these very series above a join near 340 K (materials/*.yaml), so the checks
// test the transcription of the coefficients and the join, not the physics.
// Their validation against an independent assessment (NIST-JANAF) is in
// test_phase_cards.cc, test_nickel_titanium_cards.cc and
// test_copper_silver_lead_cards.cc.
#include "published_forms.h"
#include "support.h"

#include <quantacal/cards/card.h>
#include <quantacal/common/constants.h>

#include <boost/math/quadrature/gauss_kronrod.hpp>

#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <vector>

namespace {

using namespace quantacal;
using quantacal::test::material_path;

// C_p of G = a + b T + c T ln T + d T^2 + e T^3 + f/T: -c - 2 d T - 6 e T^2 - 2 f/T^2.
struct GibbsPolynomial {
  double c, d, e, f; // J/mol/K, J/mol/K^2, J/mol/K^3, J K/mol
  double capacity(double t) const {
    return -c - 2 * d * t - 6 * e * t * t - 2 * f / (t * t);
  }
  /// H(t) - H(t0) = integral of the capacity from t0 to t
  double enthalpy_increment(double t0, double t) const {
    return -c * (t - t0) - d * (t * t - t0 * t0) - 2 * e * (t * t * t - t0 * t0 * t0) +
           2 * f * (1 / t - 1 / t0);
  }
};

// Dinsdale (1991), GHSERAL, fcc aluminium, 298.15 K to 700 K and 700 K to 933.47 K.
const GibbsPolynomial kAluminiumLow{-24.3671976, -1.884662e-3, -0.877664e-6, 74092.0};
const GibbsPolynomial kAluminiumHigh{-38.5844296, 18.531982e-3, -5.764227e-6, 74092.0};

double sgte_aluminium(double t) {
  return t <= 700.0 ? kAluminiumLow.capacity(t) : kAluminiumHigh.capacity(t);
}

// Dinsdale (1991), GHSERFE, bcc iron, 298.15 K to 1811 K, without its magnetic part.
const GibbsPolynomial kIronLattice{-23.5143, -4.39752e-3, -5.8927e-8, 77359.0};

// The magnetic capacity of the same assessment, C = -T d2G/dT2 of Dinsdale's
// G_mag = R T ln(beta + 1) g(tau) (Hillert and Jarl 1978 form), written out here
// on its own: T_C = 1043 K, beta = 2.22, p = 0.40 for bcc iron (Dinsdale 1991).
double sgte_iron_magnetic(double t) {
  return quantacal::test::sgte_magnetic_capacity(t, 1043.0, 2.22, 0.40);
}

double sgte_iron(double t) {
  return kIronLattice.capacity(t) + sgte_iron_magnetic(t);
}

// Fit check: c_p within 3 % at 298.15 K (the lattice model below the join) and to
// rounding (0.01 %) from 400 K to 1175 K (the alpha-gamma join starts at 1179.8 K),
// where the card carries GHSERFE and the
// same magnetic function; points within 5 % of T_C (991-1095 K) are listed apart.
TEST(AssessedData, IronSpecificHeatAcrossTheCuriePointFitCheck) {
  const MaterialPtr fe = load_card(material_path("iron.yaml"));
  for (double t : {298.15, 400.0, 500.0, 600.0, 700.0, 800.0, 900.0, 1150.0, 1175.0,
                   /* within 5 % of T_C: */ 1000.0, 1040.0, 1050.0, 1090.0}) {
    const double model = fe->thermal(t, Basis::mole).capacity;
    const double reference = sgte_iron(t); // Dinsdale 1991, GHSERFE + magnetic, computed
    std::printf("  iron c_p(%6.1f K) card %7.3f  SGTE %7.3f J/mol/K  %+5.2f %%\n", t,
                model, reference, 100 * (model / reference - 1));
    EXPECT_NEAR(model / reference - 1, 0.0, t < 370.0 ? 0.03 : 1e-4) << t;
  }
}

// Fit check: H(T) - H(298.15 K) within 2 %, below and above T_C; the assessed enthalpy by
// Boost.Math Gauss-Kronrod quadrature of its c_p, split at T_C.
TEST(AssessedData, IronEnthalpyIncrementAcrossTheCuriePointFitCheck) {
  const MaterialPtr fe = load_card(material_path("iron.yaml"));
  using boost::math::quadrature::gauss_kronrod;
  for (double t : {500.0, 800.0, 1000.0, 1150.0}) {
    double reference = gauss_kronrod<double, 61>::integrate(
        sgte_iron, 298.15, std::min(t, 1043.0), 15, 1e-12);
    if (t > 1043.0)
      reference += gauss_kronrod<double, 61>::integrate(sgte_iron, 1043.0, t, 15, 1e-12);
    const double model =
        fe->thermal(t, Basis::mole).energy - fe->thermal(298.15, Basis::mole).energy;
    std::printf(
        "  iron H(%6.1f K) - H(298.15 K) card %8.1f  SGTE %8.1f J/mol  %+5.2f %%\n", t,
        model, reference, 100 * (model / reference - 1));
    EXPECT_NEAR(model / reference - 1, 0.0, 0.02) << t;
  }
}

// Fit check: below the join (310-370 K) the card is its lattice model (Debye +
// Sommerfeld + dilation, within 3 %, the project's c_p requirement); from 370 K it
// is GHSERAL itself, so it must agree to rounding of the table (0.01 %).
TEST(AssessedData, AluminiumSpecificHeatFitCheckAgainstTheSeriesItCarries) {
  const MaterialPtr al = load_card(material_path("aluminium.yaml"));
  for (double t :
       {298.15, 350.0, 400.0, 500.0, 600.0, 650.0, 720.0, 790.0, 860.0, 925.0}) {
    const double model = al->thermal(t, Basis::mole).capacity;
    const double reference = sgte_aluminium(t); // Dinsdale 1991, GHSERAL, computed
    std::printf("  aluminium c_p(%6.1f K) card %7.3f  SGTE %7.3f J/mol/K  %+5.2f %%\n", t,
                model, reference, 100 * (model / reference - 1));
    EXPECT_NEAR(model / reference - 1, 0.0, t < 370.0 ? 0.03 : 1e-4) << t;
  }
}

// Fit check: H(T) - H(298.15 K) within 2 % (the project's enthalpy requirement);
// the energy below the join is the lattice model's.
TEST(AssessedData, AluminiumEnthalpyIncrementFitCheck) {
  const MaterialPtr al = load_card(material_path("aluminium.yaml"));
  for (double t : {400.0, 500.0, 650.0}) {
    const double model =
        al->thermal(t, Basis::mole).energy - al->thermal(298.15, Basis::mole).energy;
    const double reference = kAluminiumLow.enthalpy_increment(298.15, t); // Dinsdale 1991
    std::printf(
        "  aluminium H(%5.1f K) - H(298.15 K) card %8.1f  SGTE %8.1f J/mol  %+5.2f %%\n",
        t, model, reference, 100 * (model / reference - 1));
    EXPECT_NEAR(model / reference - 1, 0.0, 0.02) << t;
  }
}

// Dinsdale (1991), GHSERTI, hcp (alpha) titanium, 298.15 K to 900 K.
const GibbsPolynomial kTitaniumLow{-23.9933, -4.777975e-3, 0.106716e-6, 72636.0};

// Fit check: the titanium card carries GHSERTI above its 340 K join: within 3 % at
// 298.15 K and 350 K (the lattice model and the join) and to rounding (0.01 %)
// from 400 K to 890 K (GHSERTI changes piece at 900 K). Its validation against NIST-JANAF
// is in test_nickel_titanium_cards.cc.
TEST(AssessedData, TitaniumSpecificHeatFitCheck) {
  const MaterialPtr ti = load_card(material_path("titanium.yaml"));
  for (double t :
       {298.15, 350.0, 400.0, 450.0, 500.0, 550.0, 600.0, 700.0, 800.0, 890.0}) {
    const double model = ti->thermal(t, Basis::mole).capacity;
    const double reference = kTitaniumLow.capacity(t); // Dinsdale 1991, GHSERTI, computed
    const double deviation = model / reference - 1;
    std::printf("  titanium c_p(%6.1f K) card %7.3f  SGTE %7.3f J/mol/K  %+5.2f %%\n", t,
                model, reference, 100 * deviation);
    EXPECT_NEAR(deviation, 0.0, t < 370.0 ? 0.03 : 1e-4) << t;
  }
  // H(T) - H(298.15 K) to 600 K within 2 %
  for (double t : {400.0, 600.0}) {
    const double model =
        ti->thermal(t, Basis::mole).energy - ti->thermal(298.15, Basis::mole).energy;
    const double reference = kTitaniumLow.enthalpy_increment(298.15, t); // Dinsdale 1991
    std::printf(
        "  titanium H(%5.1f K) - H(298.15 K) card %8.1f  SGTE %8.1f J/mol  %+5.2f %%\n",
        t, model, reference, 100 * (model / reference - 1));
    EXPECT_NEAR(model / reference - 1, 0.0, 0.02) << t;
  }
}

// Dinsdale (1991), GHSERCU, fcc copper, 298.15 K to 1357.77 K.
const GibbsPolynomial kCopper{-24.112392, -2.65684e-3, 1.29223e-7, 52478.0};

void fit_check(const char* card, const GibbsPolynomial& sgte,
               const std::vector<double>& temperatures);

// Fit check: the copper card carries GHSERCU above its 340 K join (its validation
// against NIST-JANAF is in test_copper_silver_lead_cards.cc); H(T) - H(298.15 K)
// within 2 % (the energy below the join is the lattice model's).
TEST(AssessedData, CopperSpecificHeatFitCheck) {
  fit_check("copper.yaml", kCopper,
            {298.15, 400.0, 500.0, 600.0, 700.0, 800.0, 900.0, 1000.0, 1100.0, 1300.0});
  const MaterialPtr cu = load_card(material_path("copper.yaml"));
  for (double t : {500.0, 800.0, 1200.0}) {
    const double model =
        cu->thermal(t, Basis::mole).energy - cu->thermal(298.15, Basis::mole).energy;
    const double reference = kCopper.enthalpy_increment(298.15, t); // Dinsdale 1991
    std::printf(
        "  copper H(%6.1f K) - H(298.15 K) card %8.1f  SGTE %8.1f J/mol  %+5.2f %%\n", t,
        model, reference, 100 * (model / reference - 1));
    EXPECT_NEAR(model / reference - 1, 0.0, 0.02) << t;
  }
}

// Dinsdale (1991): GHSERAG, fcc silver, 298.15 K to 1235.08 K; GHSERSI, diamond
// silicon, 298.15 K to 1687 K.
const GibbsPolynomial kSilver{-23.8463314, -1.790585e-3, -3.98587e-7, -12011.0};
const GibbsPolynomial kSilicon{-22.8317533, -1.912904e-3, -0.003552e-6, 176667.0};

// Fit check: a card that carries the series @p sgte above its 340 K join is within
// 3 % of it below 370 K (its lattice model and the join) and to rounding (0.01 %)
// above.
void fit_check(const char* card, const GibbsPolynomial& sgte,
               const std::vector<double>& temperatures) {
  SCOPED_TRACE(card);
  const MaterialPtr m = load_card(material_path(card));
  for (double t : temperatures) {
    const double deviation = m->thermal(t, Basis::mole).capacity / sgte.capacity(t) - 1;
    std::printf(
        "  %-14s c_p(%6.1f K) %+5.2f %% against SGTE (Dinsdale 1991), fit check\n", card,
        t, 100 * deviation);
    EXPECT_NEAR(deviation, 0.0, t < 370.0 ? 0.03 : 1e-4) << t;
  }
}

TEST(AssessedData, SilverSpecificHeatFitCheck) {
  fit_check("silver.yaml", kSilver,
            {298.15, 400.0, 500.0, 600.0, 700.0, 800.0, 900.0, 1000.0, 1200.0});
}

// Fit check: the silicon card carries GHSERSI above its 340 K join: within 3 % at
// 298.15 K (the lattice model) and to rounding (0.01 %) from 400 K to 1680 K.
TEST(AssessedData, SiliconSpecificHeatFitCheck) {
  const MaterialPtr si = load_card(material_path("silicon.yaml"));
  for (double t : {298.15, 400.0, 600.0, 800.0, 1000.0, 1200.0, 1500.0, 1680.0}) {
    const double deviation =
        si->thermal(t, Basis::mole).capacity / kSilicon.capacity(t) - 1;
    std::printf("  silicon c_p(%6.1f K) %+5.2f %% against SGTE (Dinsdale 1991)\n", t,
                100 * deviation);
    EXPECT_NEAR(deviation, 0.0, t < 370.0 ? 0.03 : 1e-4) << t;
  }
}

// The assessed function itself, against the CRC value at 298.15 K (24.200
// J/mol/K, CRC Handbook of Chemistry and Physics, verified): a check that the
// coefficients above were transcribed right, independent of the card.
TEST(AssessedData, TranscribedPolynomialMatchesCrcAt298K) {
  // copper: 24.440 J/mol/K (CRC Handbook, from memory)
  EXPECT_NEAR(kCopper.capacity(298.15) / 24.440 - 1, 0.0, 0.01);
  // silver 25.350 (from memory), silicon 19.789 (verified): CRC Handbook
  EXPECT_NEAR(kSilver.capacity(298.15) / 25.350 - 1, 0.0, 0.01);
  EXPECT_NEAR(kSilicon.capacity(298.15) / 19.789 - 1, 0.0, 0.015);
  // titanium: 25.060 J/mol/K (CRC Handbook of Chemistry and Physics, verified)
  EXPECT_NEAR(kTitaniumLow.capacity(298.15) / 25.060 - 1, 0.0, 0.01);
  EXPECT_NEAR(sgte_aluminium(298.15) / 24.200 - 1, 0.0, 0.01);
  // continuity of the two intervals at 700 K (the assessment joins them there)
  EXPECT_NEAR(kAluminiumLow.capacity(700.0) / kAluminiumHigh.capacity(700.0) - 1, 0.0,
              1e-4);
}

} // namespace
