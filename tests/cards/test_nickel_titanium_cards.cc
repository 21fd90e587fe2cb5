// SPDX-License-Identifier: Apache-2.0
// The nickel card (fcc with its Curie peak, and the liquid) and the titanium card
// (alpha, beta and the liquid) against an assessment they were not built on: the
// NIST-JANAF Thermochemical Tables (Chase, J. Phys. Chem. Ref. Data Monograph 9,
// 1998), as the Shomate fits of the NIST Chemistry WebBook (SRD 69), computed
// here: C_p = A + B t + C t^2 + D t^3 + E/t^2 and H - H(298.15 K) = A t + B t^2/2 +
// C t^3/3 + D t^4/4 - E/t + F (kJ/mol; t = T/1000 K), relative to the solid at
// 298.15 K. The cards carry the SGTE series (Dinsdale, CALPHAD 15 (1991) 317)
// above a join near 340 K, so the JANAF checks are validation; the checks
// against SGTE below are FIT CHECKS (the cards carry those very series) and are
// labelled so. Tolerances: c_p 5 %, H(T) - H(298.15 K) 2 %, wider only within
// 5 % of a transition or Curie point, where each test says so. Where the two
// assessments disagree by more than that away from a transition (alpha titanium
// near 800 K, liquid nickel), the card follows SGTE and the test pins the
// measured disagreement, labelled as such: it is not validation.
#include "published_forms.h"
#include "support.h"

#include <quantacal/cards/card.h>
#include <quantacal/common/constants.h>

#include <gtest/gtest.h>

#include <array>
#include <cmath>
#include <cstdio>
#include <initializer_list>
#include <vector>

namespace {

using namespace quantacal;
using quantacal::test::deviation;
using quantacal::test::material_path;
using quantacal::test::Shomate;

// NIST Chemistry WebBook, nickel (Chase 1998; data last reviewed December 1976):
// solid 298-600 K, 600-700 K (the Curie peak) and 700-1728 K, liquid 1728-3000 K.
// The solid coefficients are those of the WebBook's page in calories times 4.184.
const Shomate kNiSolid1{298,       600,      13.69160,  82.49509,
                        -174.9548, 161.6011, -0.092417, -6.833644};
const Shomate kNiSolid2{600, 700, 1248.045, -1257.510, 0, 0, -165.1266, -788.8263};
const Shomate kNiSolid3{700,       1728,     16.49839, 18.74913,
                        -6.639841, 1.717278, 1.872051, -0.467675};
const Shomate kNiLiquid{1728, 3000, 38.91103, 0, 0, 0, 0, -2.722630};

const Shomate& ni_janaf(double t) {
  if (t >= 1728.0)
    return kNiLiquid;
  if (t > 700.0)
    return kNiSolid3;
  return t > 600.0 ? kNiSolid2 : kNiSolid1;
}

// NIST Chemistry WebBook, titanium (Chase 1998; data last reviewed June 1979):
// alpha 298-700 K and 700-1700 K, beta 298-1939 K, liquid 1939-3631 K. JANAF puts
// the alpha-beta transition at 1166 K and melting at 1939 K (SGTE: 1155 K, 1941 K).
const Shomate kTiAlpha1{298,       700,      22.61942,  18.98795,
                        -18.18735, 7.080792, -0.143457, -7.922279};
const Shomate kTiAlpha2{700,      1700,     44.37174, -44.09225,
                        31.70602, 0.052209, 0.036168, -12.72011};
const Shomate kTiBeta{298,       1939,     23.05660,  5.541331,
                      -2.055881, 1.611745, -0.056075, -0.433228};
const Shomate kTiLiquid{1939,         3631,         47.23694,    1.975192e-8,
                        -5.335145e-9, 4.904109e-10, 1.564855e-8, -22.05273};

const Shomate& ti_janaf(double t) {
  if (t >= 1939.0)
    return kTiLiquid;
  if (t >= 1166.0)
    return kTiBeta;
  return t > 700.0 ? kTiAlpha2 : kTiAlpha1;
}

// One piece of an SGTE Gibbs energy, G = a + b T + c T ln T + d T^2 + e T^3 + f/T
// + g T^7 + h T^-9: C_p = -T d2G/dT2, written out here on its own.
struct GibbsPiece {
  double to; // K, upper end
  double c, d, e, f, g, h;
};

double sgte_capacity(const std::vector<GibbsPiece>& pieces, double t) {
  for (const GibbsPiece& p : pieces)
    if (t <= p.to)
      return -p.c - 2 * p.d * t - 6 * p.e * t * t - 2 * p.f / (t * t) -
             42 * p.g * std::pow(t, 6) - 90 * p.h * std::pow(t, -10);
  ADD_FAILURE() << t;
  return 0.0;
}

// Dinsdale (1991): GHSERNI (fcc nickel, without its magnetic part), GHSERTI (hcp
// titanium), GBCCTI (bcc titanium) and the liquid of each.
const std::vector<GibbsPiece> kNiFcc = {{1728, -22.096, -4.8407e-3, 0, 0, 0, 0},
                                        {3000, -43.1, 0, 0, 0, 0, 1.12754e31}};
const std::vector<GibbsPiece> kNiLiquidSgte = {{3000, -43.1, 0, 0, 0, 0, 0}};
const std::vector<GibbsPiece> kTiHcp = {
    {900, -23.9933, -4.777975e-3, 1.06716e-7, 72636, 0, 0},
    {1155, -23.9887, -4.2033e-3, -9.0876e-8, 42680, 0, 0}};
const std::vector<GibbsPiece> kTiBcc = {
    {1941, -22.3771, 1.21707e-3, -8.4534e-7, -2002750, 0, 0}};
const std::vector<GibbsPiece> kTiLiquidSgte = {{4000, -46.29, 0, 0, 0, 0, 0}};

// The magnetic capacity of Dinsdale's G_mag = R T ln(beta + 1) g(tau) (Hillert and
// Jarl 1978 form), written out here: nickel, fcc, T_C = 633 K, beta = 0.52,
// p = 0.28 (Dinsdale 1991).
double sgte_nickel_magnetic(double t) {
  return quantacal::test::sgte_magnetic_capacity(t, 633.0, 0.52, 0.28);
}

double cp(const MaterialPtr& m, double t) {
  return m->thermal(t, Basis::mole).capacity;
}

double enthalpy_increment(const MaterialPtr& m, double t) {
  return m->thermal(t, Basis::mole).energy - m->thermal(298.15, Basis::mole).energy;
}

// ---------------------------------------------------------------------------
// Nickel

// Solid nickel below and above its Curie region: within 5 %. From 600 K to 700 K
// the JANAF Shomate piece is a fit across the peak (its c_p is 39.8 J/mol/K at
// 650 K, after the Hillert-Jarl jump at 633 K), so it validates nothing within
// 5 % of T_C (601-665 K); the Curie region is checked through the enthalpy below
// and its c_p against SGTE (a fit check). 1700 K lies within 5 % of the melting
// point; the solid there is still checked at 5 %.
TEST(NickelTitaniumCards, NickelSpecificHeatAgainstNistJanafSolid) {
  const MaterialPtr ni = load_card(material_path("nickel.yaml"));
  for (double t : {298.15, 350.0, 400.0, 500.0, 550.0, 700.0, 800.0, 1000.0, 1200.0,
                   1400.0, 1600.0, 1700.0}) {
    const double model = cp(ni, t);
    const double reference = ni_janaf(t).capacity(t); // Chase 1998 (NIST-JANAF)
    std::printf("  nickel c_p(%6.1f K) card %7.3f  JANAF %7.3f J/mol/K  %+5.2f %%\n", t,
                model, reference, 100 * deviation(model, reference));
    EXPECT_NEAR(deviation(model, reference), 0.0, 0.05) << t;
  }
}

// Liquid nickel: NOT VALIDATION. The card carries the SGTE liquid, c_p =
// 43.1 J/mol/K; JANAF has 38.911 J/mol/K, 10.8 % lower. The two assessments
// disagree by more than the 5 % rule; the test pins the disagreement (between
// +9 % and +12 %) so that a change of either is seen. The liquid enthalpy, with
// the melting heat, is validated within 2 % below.
TEST(NickelTitaniumCards, NickelLiquidSpecificHeatKnownDisagreementWithJanaf) {
  const MaterialPtr ni = load_card(material_path("nickel.yaml"));
  for (double t : {1750.0, 1800.0, 1900.0}) {
    const double model = cp(ni, t);
    const double reference = kNiLiquid.capacity(t); // Chase 1998 (NIST-JANAF), liquid
    std::printf("  nickel c_p(%6.1f K) card %7.3f  JANAF %7.3f J/mol/K  %+5.2f %% "
                "(known disagreement, not validation)\n",
                t, model, reference, 100 * deviation(model, reference));
    EXPECT_GT(deviation(model, reference), 0.09) << t;
    EXPECT_LT(deviation(model, reference), 0.12) << t;
    // Fit check: the SGTE liquid it carries (Dinsdale 1991), to rounding.
    EXPECT_NEAR(deviation(model, sgte_capacity(kNiLiquidSgte, t)), 0.0, 1e-4) << t;
  }
}

// H(T) - H(298.15 K) within 2 % below the Curie point, after it, below the melt and
// in the liquid (melting heat included). JANAF's pieces do not join in H at their
// ends (600 K: 9.02 against 8.86 kJ/mol; 700 K: 12.61 against 12.33 kJ/mol), so
// the points lie inside pieces.
TEST(NickelTitaniumCards, NickelEnthalpyAgainstNistJanafThroughCurieAndMelting) {
  const MaterialPtr ni = load_card(material_path("nickel.yaml"));
  for (double t : {450.0, 550.0, 750.0, 1000.0, 1500.0, 1700.0, 1750.0, 1800.0, 1900.0}) {
    const double model = enthalpy_increment(ni, t);
    const double reference = ni_janaf(t).enthalpy(t); // Chase 1998 (NIST-JANAF)
    std::printf(
        "  nickel H(%6.1f K) - H(298.15 K) card %8.1f  JANAF %8.1f J/mol  %+5.2f %%\n", t,
        model, reference, 100 * deviation(model, reference));
    EXPECT_NEAR(deviation(model, reference), 0.0, 0.02) << t;
  }
}

// The melting heat: the card's stated value (computed from SGTE with the fcc
// magnetic enthalpy still to be released above 1728 K) and the heat taken through
// the 10 K join, less the sensible heat of each phase, against the CRC Handbook of
// Chemistry and Physics heat of fusion 17.48 kJ/mol (verified): 0.5 % and 1 %.
TEST(NickelTitaniumCards, NickelMeltingHeatAgainstTheHandbook) {
  const MaterialPtr ni = load_card(material_path("nickel.yaml"));
  const auto& boundaries = ni->data().phase_layout->boundaries();
  ASSERT_EQ(boundaries.size(), 2u);
  ASSERT_EQ(ni->data().phases.size(), 3u);
  EXPECT_TRUE(ni->data().phases[2].liquid);
  EXPECT_EQ(boundaries[0].latent_heat, 0.0); // the join of the two fcc descriptions
  EXPECT_NEAR(boundaries[1].latent_heat / 17480.0 - 1, 0.0, 0.005); // CRC, fusion
  const double below = 1718.0, above = 1738.0, tm = 1728.0;
  const double jump =
      ni->thermal(above, Basis::mole).energy - ni->thermal(below, Basis::mole).energy;
  const double latent =
      jump - cp(ni, below) * (tm - below) - cp(ni, above) * (above - tm);
  std::printf("  nickel latent heat of fusion: card %.1f J/mol, from its energy %.1f "
              "J/mol (CRC 17480; JANAF's own, from its Shomate fits, %.1f)\n",
              boundaries[1].latent_heat, latent,
              kNiLiquid.enthalpy(tm) - kNiSolid3.enthalpy(tm));
  EXPECT_NEAR(latent / 17480.0 - 1, 0.0, 0.01);
}

// FIT CHECK, not validation: from 400 K (above the 310-370 K join) to the melting
// join the card is GHSERNI plus the Hillert-Jarl magnetic term, as written out
// here (Dinsdale 1991), to rounding (0.01 %), across the Curie jump.
TEST(NickelTitaniumCards, NickelCuriePeakFitCheckAgainstSgte) {
  const MaterialPtr ni = load_card(material_path("nickel.yaml"));
  for (double t :
       {400.0, 550.0, 600.0, 620.0, 630.0, 640.0, 660.0, 800.0, 1200.0, 1700.0}) {
    const double model = cp(ni, t);
    const double reference = sgte_capacity(kNiFcc, t) + sgte_nickel_magnetic(t);
    std::printf("  nickel c_p(%6.1f K) card %7.3f  SGTE %7.3f J/mol/K  %+7.4f %% "
                "(fit check)\n",
                t, model, reference, 100 * deviation(model, reference));
    EXPECT_NEAR(deviation(model, reference), 0.0, 1e-4) << t;
  }
  // The peak: just below T_C the capacity is higher than just above (the jump of
  // the Hillert-Jarl function, C(T_C-)/C(T_C+) of its magnetic part = 2.45).
  EXPECT_GT(cp(ni, 632.0), cp(ni, 634.0) + 5.0);
}

// Conductivity and density across the melting join: liquid nickel conducts less
// (Wiedemann-Franz estimate, about 49 W/m/K, against about 87 W/m/K extrapolated
// for the solid; both low confidence, see the card's sources), and the blend
// falls monotonically through the 10 K join (1723-1733 K).
TEST(NickelTitaniumCards, NickelLiquidDensityAndConductivity) {
  const MaterialPtr ni = load_card(material_path("nickel.yaml"));
  EXPECT_NEAR(ni->density(1000.0), 8908.0, 1e-9);
  EXPECT_NEAR(ni->density(1800.0), 7810.0, 1e-9);
  // Incropera and DeWitt, Table A.1 (from memory): the card's own points.
  EXPECT_NEAR(ni->conductivity(300.0).value, 90.7, 1e-9);
  EXPECT_NEAR(ni->conductivity(1500.0).value, 82.6, 1e-9);
  double previous = ni->conductivity(1723.0).value;
  for (double t = 1724.0; t <= 1733.0; t += 1.0) {
    const double k = ni->conductivity(t).value;
    EXPECT_LE(k, previous + 1e-12) << t;
    previous = k;
  }
  EXPECT_LT(ni->conductivity(1750.0).value, 55.0);
}

// ---------------------------------------------------------------------------
// Titanium

// Alpha, beta and liquid titanium within 5 %. Points within 5 % of a transition
// (alpha-beta 1097-1213 K, melting 1844-2038 K) are marked; JANAF's transition
// temperatures differ from the card's (1166 K against 1155 K, 1939 K against
// 1941 K), so no point lies between them. From about 750 K to 950 K the two
// assessments differ by more than 5 %: see the next test.
TEST(NickelTitaniumCards, TitaniumSpecificHeatAgainstNistJanaf) {
  const MaterialPtr ti = load_card(material_path("titanium.yaml"));
  for (double t :
       {298.15, 350.0, 400.0, 500.0, 600.0, 700.0, 1000.0, 1300.0, 1500.0, 1700.0, 1800.0,
        /* within 5 % of a transition: */ 1100.0, 1200.0, 1900.0, 2000.0, 2050.0}) {
    const double model = cp(ti, t);
    const double reference = ti_janaf(t).capacity(t); // Chase 1998 (NIST-JANAF)
    std::printf("  titanium c_p(%6.1f K) card %7.3f  JANAF %7.3f J/mol/K  %+5.2f %%\n", t,
                model, reference, 100 * deviation(model, reference));
    EXPECT_NEAR(deviation(model, reference), 0.0, 0.05) << t;
  }
}

// Alpha titanium from 750 K to 950 K: NOT VALIDATION. The SGTE series the card
// carries lies 4-5.2 % above the JANAF alpha curve here (JANAF's 700-1700 K piece
// is flat to 800 K and then steep), beyond the 5 % rule at 800-850 K, and the
// enthalpy, which accumulates it, is 2.5 % above JANAF at 1000 K. The test pins
// the measured disagreement (c_p between +3 % and +6 %, H within 3 %) so that a
// change of either is seen.
TEST(NickelTitaniumCards, TitaniumAlphaKnownDisagreementWithJanaf) {
  const MaterialPtr ti = load_card(material_path("titanium.yaml"));
  for (double t : {750.0, 800.0, 850.0, 900.0, 950.0}) {
    const double model = cp(ti, t);
    const double reference = ti_janaf(t).capacity(t); // Chase 1998 (NIST-JANAF)
    std::printf("  titanium c_p(%6.1f K) card %7.3f  JANAF %7.3f J/mol/K  %+5.2f %% "
                "(known disagreement, not validation)\n",
                t, model, reference, 100 * deviation(model, reference));
    EXPECT_GT(deviation(model, reference), 0.03) << t;
    EXPECT_LT(deviation(model, reference), 0.06) << t;
  }
  const double model = enthalpy_increment(ti, 1000.0);
  const double reference = kTiAlpha2.enthalpy(1000.0);
  std::printf("  titanium H(1000.0 K) - H(298.15 K) card %8.1f  JANAF %8.1f J/mol  "
              "%+5.2f %% (known disagreement, not validation)\n",
              model, reference, 100 * deviation(model, reference));
  EXPECT_NEAR(deviation(model, reference), 0.0, 0.03);
}

// H(T) - H(298.15 K) within 2 % below and above the alpha-beta transformation and
// the melting, heats included. 1150 K and 2000 K lie within 5 % of a transition;
// they are held to the same 2 %.
TEST(NickelTitaniumCards, TitaniumEnthalpyAgainstNistJanafThroughBothTransitions) {
  const MaterialPtr ti = load_card(material_path("titanium.yaml"));
  for (double t : {500.0, 800.0, 1150.0, 1250.0, 1500.0, 1900.0, 2000.0, 2050.0}) {
    const double model = enthalpy_increment(ti, t);
    const double reference = ti_janaf(t).enthalpy(t); // Chase 1998 (NIST-JANAF)
    std::printf(
        "  titanium H(%6.1f K) - H(298.15 K) card %8.1f  JANAF %8.1f J/mol  %+5.2f %%\n",
        t, model, reference, 100 * deviation(model, reference));
    EXPECT_NEAR(deviation(model, reference), 0.0, 0.02) << t;
  }
}

// The heats: melting against the CRC Handbook of Chemistry and Physics heat of
// fusion 14.15 kJ/mol (verified), 0.5 % for the stated value and 1 % for the heat
// taken through the join less the sensible heats. The alpha-beta heat (4170 J/mol,
// computed from SGTE) against JANAF's, computed here from its Shomate fits at its
// own transition temperature (1166 K): within 2 %.
TEST(NickelTitaniumCards, TitaniumTransformationHeats) {
  const MaterialPtr ti = load_card(material_path("titanium.yaml"));
  const auto& boundaries = ti->data().phase_layout->boundaries();
  ASSERT_EQ(boundaries.size(), 3u);
  ASSERT_EQ(ti->data().phases.size(), 4u);
  EXPECT_EQ(ti->data().phases[2].name, "beta (bcc)");
  EXPECT_TRUE(ti->data().phases[3].liquid);
  EXPECT_NEAR(boundaries[2].latent_heat / 14150.0 - 1, 0.0, 0.005); // CRC, fusion
  const double janaf_ab = kTiBeta.enthalpy(1166.0) - kTiAlpha2.enthalpy(1166.0);
  EXPECT_NEAR(boundaries[1].latent_heat / janaf_ab - 1, 0.0, 0.02);
  EXPECT_NEAR(boundaries[1].latent_heat, 4170.0, 1.0); // fit check: SGTE
  for (const auto& [below, tt, above, reference] :
       {std::array<double, 4>{1145.0, 1155.0, 1165.0, janaf_ab},
        std::array<double, 4>{1931.0, 1941.0, 1951.0, 14150.0}}) {
    const double jump =
        ti->thermal(above, Basis::mole).energy - ti->thermal(below, Basis::mole).energy;
    const double latent =
        jump - cp(ti, below) * (tt - below) - cp(ti, above) * (above - tt);
    std::printf("  titanium heat at %.0f K from the card's energy %.1f J/mol (reference "
                "%.1f: %s)\n",
                tt, latent, reference, tt < 1500.0 ? "JANAF, computed" : "CRC");
    EXPECT_NEAR(latent / reference - 1, 0.0, tt < 1500.0 ? 0.02 : 0.01) << tt;
  }
}

// FIT CHECK, not validation: above the 340 K join the card is GHSERTI, GBCCTI and
// the SGTE liquid, written out here (Dinsdale 1991), to rounding (0.01 %).
TEST(NickelTitaniumCards, TitaniumFitCheckAgainstSgte) {
  const MaterialPtr ti = load_card(material_path("titanium.yaml"));
  struct Point {
    double t;
    const std::vector<GibbsPiece>* series;
  };
  for (const Point& p :
       {Point{400.0, &kTiHcp}, Point{800.0, &kTiHcp}, Point{1100.0, &kTiHcp},
        Point{1200.0, &kTiBcc}, Point{1600.0, &kTiBcc}, Point{1930.0, &kTiBcc},
        Point{1960.0, &kTiLiquidSgte}, Point{2050.0, &kTiLiquidSgte}}) {
    const double model = cp(ti, p.t);
    const double reference = sgte_capacity(*p.series, p.t);
    std::printf("  titanium c_p(%6.1f K) card %7.3f  SGTE %7.3f J/mol/K  %+7.4f %% "
                "(fit check)\n",
                p.t, model, reference, 100 * deviation(model, reference));
    EXPECT_NEAR(deviation(model, reference), 0.0, 1e-4) << p.t;
  }
}

// Conductivity and density: the beta table takes over across the alpha-beta join,
// the liquid's across the melting join (Wiedemann-Franz estimate, low confidence).
TEST(NickelTitaniumCards, TitaniumConductivityAndDensity) {
  const MaterialPtr ti = load_card(material_path("titanium.yaml"));
  EXPECT_NEAR(ti->density(1000.0), 4506.0, 1e-9);
  EXPECT_NEAR(ti->density(2000.0), 4110.0, 1e-9);
  // Incropera and DeWitt, Table A.1 (from memory): the cards' own points.
  EXPECT_NEAR(ti->conductivity(300.0).value, 21.9, 1e-9);
  EXPECT_NEAR(ti->conductivity(1500.0).value, 24.5, 1e-9);
  for (double t = 100.0; t <= 2050.0; t += 5.0) {
    const double k = ti->conductivity(t).value;
    EXPECT_GT(k, 15.0) << t;
    EXPECT_LT(k, 35.0) << t;
  }
}

} // namespace
