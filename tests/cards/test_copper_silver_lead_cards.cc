// SPDX-License-Identifier: Apache-2.0
// The copper, silver and lead cards through melting. Each carries a lattice model
// at low temperature, joined near 340 K (lead: 330 K over 50 K) to the SGTE
// assessed series of the solid (Dinsdale, CALPHAD 15 (1991) 317) and melting into
// the SGTE liquid with the latent heat that assessment gives.
//
// Validation (an assessment the cards were not built on):
// - copper: NIST-JANAF Thermochemical Tables (Chase, J. Phys. Chem. Ref. Data
//   Monograph 9, 1998) as the Shomate fits of the NIST Chemistry WebBook (SRD 69),
//   computed here: C_p = A + B t + C t^2 + D t^3 + E/t^2 and H - H(298.15 K) =
//   A t + B t^2/2 + C t^3/3 + D t^4/4 - E/t + F (kJ/mol; t = T/1000 K), relative to
//   the solid at 298.15 K; below 298 K the NIST OFHC correlation
//   (tests/data/copper_ofhc_cp_nist.txt), to which the lattice model was fitted,
//   so those points are fit checks;
// - heats of fusion: CRC Handbook of Chemistry and Physics;
// - silver and lead: no NIST-JANAF Shomate fit of the condensed phases was found
//   (the WebBook lists none that could be confirmed); their c_p above the join is
//   checked against the SGTE series the cards carry, a FIT CHECK, labelled so;
//   liquid lead is validated against the OECD/NEA handbook correlation.
//
// Tolerances: c_p 3 %; H(T) - H(298.15 K) 2 %. Wider, said at each place: the
// liquid copper c_p 5 % (the SGTE liquid, 31.38 J/mol/K, and the JANAF liquid,
// 32.84 J/mol/K, differ by 4.4 %); the solid copper c_p at 1200 K 5 %, and within
// 5 % of a melting point c_p 8 % and H 3 %: the JANAF solid copper curve rises
// ahead of the melt (30.6 J/mol/K at 1200 K, 32.2 at 1300 K) and the SGTE series
// the card carries does not (29.3, 29.6), a difference of the two assessments the
// card inherits (measured -4.4 % and -7.9 %, printed).
#include "published_forms.h"
#include "support.h"

#include <quantacal/cards/card.h>
#include <quantacal/models/phases.h>

#include <gtest/gtest.h>

#include <cmath>
#include <cstdio>
#include <fstream>
#include <sstream>
#include <string>
#include <vector>

namespace {

using namespace quantacal;
using quantacal::test::data_path;
using quantacal::test::deviation;
using quantacal::test::material_path;
using quantacal::test::Shomate;

// NIST Chemistry WebBook, copper (Chase 1998): solid 298-1358 K, liquid
// 1358-2843 K.
const Shomate kCuSolid{298,       1358,     17.72891, 28.09870,
                       -31.25289, 13.97243, 0.068611, -6.056591};
const Shomate kCuLiquid{1358,     2843,      32.84450,  -0.000084,
                        0.000032, -0.000004, -0.000028, -1.804901};

const Shomate& copper_janaf(double t) {
  return t < 1358.0 ? kCuSolid : kCuLiquid;
}

// One SGTE piece of G = a + b T + c T ln T + d T^2 + e T^3 + f/T + g T^7 + h T^-9
// (Dinsdale 1991), written out here independently of the card.
struct Gibbs {
  double c, d, e, f, g, h;
  double capacity(double t) const {
    return -c - 2 * d * t - 6 * e * t * t - 2 * f / (t * t) - 42 * g * std::pow(t, 6) -
           90 * h * std::pow(t, -10);
  }
  double enthalpy(double t) const { // without the constant a
    return -c * t - d * t * t - 2 * e * t * t * t + 2 * f / t - 6 * g * std::pow(t, 7) +
           10 * h * std::pow(t, -9);
  }
};

// GHSERAG, fcc silver (298.15-1234.93 K); liquid above 1234.93 K.
const Gibbs kAgSolid{-23.8463314, -1.790585e-3, -3.98587e-7, -12011.0, 0, 0};
const Gibbs kAgLiquid{-33.472, 0, 0, 0, 0, 0};
// GHSERPB, fcc lead (298.15-600.61 K); liquid from 600.61 K to 1200 K.
const Gibbs kPbSolid{-24.5242231, -3.65895e-3, -2.4395e-7, 0, 0, 0};
const Gibbs kPbLiquid{-32.4913959, 1.54613e-3, 0, 0, 0, 0};

// Copper, solid and liquid, against JANAF: 3 % in the solid to 1000 K; 1200 K 5 %;
// at 1300 K and 1400 K (within 5 % of 1357.77 K) 8 %; the liquid 5 % (see the
// top for why).
TEST(CopperSilverLead, CopperSpecificHeatAgainstNistJanaf) {
  const MaterialPtr cu = load_card(material_path("copper.yaml"));
  for (double t :
       {298.15, 400.0, 500.0, 600.0, 800.0, 1000.0, 1200.0,
        /* within 5 % of T_m: */ 1300.0, 1400.0, /* liquid: */ 1450.0, 1500.0}) {
    const double model = cu->thermal(t, Basis::mole).capacity;
    const double reference = copper_janaf(t).capacity(t); // Chase 1998 (NIST-JANAF)
    const double d = deviation(model, reference);
    std::printf("  copper c_p(%6.1f K) card %7.3f  JANAF %7.3f J/mol/K  %+5.2f %%\n", t,
                model, reference, 100 * d);
    const bool near_melt = std::abs(t / 1357.77 - 1) <= 0.05;
    EXPECT_NEAR(d, 0.0, near_melt ? 0.08 : t > 1100.0 ? 0.05 : 0.03) << t;
  }
}

// Copper below 298 K: FIT CHECK against the NIST OFHC correlation the lattice model
// was fitted to (Marquardt, Le and Radebaugh 2000; coefficients in
// tests/data/copper_ofhc_cp_nist.txt, checked in test_bundled_cards.cc): 10 % at
// 4 K, 5 % above (the correlation's own stated error).
TEST(CopperSilverLead, CopperCryogenicFitCheck) {
  std::ifstream in(data_path("copper_ofhc_cp_nist.txt"));
  std::vector<double> a;
  std::string line;
  while (std::getline(in, line)) {
    if (line.empty() || line[0] == '#')
      continue;
    std::istringstream row(line);
    for (double v; row >> v;)
      a.push_back(v);
  }
  ASSERT_EQ(a.size(), 8u);
  const auto nist = [&](double t) { // J/kg/K
    double s = 0.0, p = 1.0;
    for (double ak : a) {
      s += ak * p;
      p *= std::log10(t);
    }
    return std::pow(10.0, s);
  };
  const MaterialPtr cu = load_card(material_path("copper.yaml"));
  for (double t : {4.0, 20.0, 77.0, 150.0, 250.0}) {
    const double model = cu->thermal(t, Basis::mass).capacity;
    const double d = deviation(model, nist(t));
    std::printf("  copper c_p(%6.1f K) card %9.4g  NIST OFHC %9.4g J/kg/K  %+5.2f %% "
                "(fit check)\n",
                t, model, nist(t), 100 * d);
    EXPECT_NEAR(d, 0.0, t < 10.0 ? 0.10 : 0.05) << t;
  }
}

// Copper H(T) - H(298.15 K) against JANAF, through melting, latent heat included:
// 2 % (measured worst printed); 1340 K lies within 5 % of the melt: 3 %.
TEST(CopperSilverLead, CopperEnthalpyAgainstNistJanafThroughMelting) {
  const MaterialPtr cu = load_card(material_path("copper.yaml"));
  const double h0 = cu->thermal(298.15, Basis::mole).energy;
  for (double t : {500.0, 800.0, 1200.0, /* within 5 % of T_m: */ 1340.0, 1400.0,
                   /* liquid: */ 1450.0, 1500.0}) {
    const double model = cu->thermal(t, Basis::mole).energy - h0;
    const double reference = copper_janaf(t).enthalpy(t); // Chase 1998 (NIST-JANAF)
    const double d = deviation(model, reference);
    std::printf("  copper H(%6.1f K) - H(298.15 K) card %8.1f  JANAF %8.1f J/mol  "
                "%+5.2f %%\n",
                t, model, reference, 100 * d);
    EXPECT_NEAR(d, 0.0, std::abs(t / 1357.77 - 1) <= 0.05 ? 0.03 : 0.02) << t;
  }
}

// The latent heats the cards state, computed from SGTE, against the CRC Handbook
// of Chemistry and Physics heats of fusion, to 0.5 %: copper 13.26 kJ/mol (from
// memory; Chekhovskoi et al. 2002 measured 13.59, printed, within 3 %), silver
// 11.28 kJ/mol (from memory), lead 4.77 kJ/mol (verified). Then the same heat
// recovered from the card's energy across the melting join, less the sensible heat
// of each phase either side (the card's own c_p), to 1 %.
TEST(CopperSilverLead, MeltingHeatsAgainstTheHandbook) {
  struct Case {
    const char* card;
    double tm, crc, below, above;
  };
  for (const Case& k : {Case{"copper.yaml", 1357.77, 13260.0, 1350.0, 1366.0},
                        Case{"silver.yaml", 1234.93, 11280.0, 1228.0, 1242.0},
                        Case{"lead.yaml", 600.61, 4770.0, 597.0, 604.5}}) {
    SCOPED_TRACE(k.card);
    const MaterialPtr m = load_card(material_path(k.card));
    const auto& boundaries = m->data().phase_layout->boundaries();
    ASSERT_EQ(boundaries.size(), 2u);
    EXPECT_EQ(boundaries[0].latent_heat, 0.0); // the join of two solid descriptions
    EXPECT_EQ(boundaries[1].temperature, k.tm);
    const double stated = boundaries[1].latent_heat;
    const double jump =
        m->thermal(k.above, Basis::mole).energy - m->thermal(k.below, Basis::mole).energy;
    const double c_solid = m->thermal(k.below, Basis::mole).capacity;
    const double c_liquid = m->thermal(k.above, Basis::mole).capacity;
    const double recovered =
        jump - c_solid * (k.tm - k.below) - c_liquid * (k.above - k.tm);
    std::printf("  %-12s latent heat stated %.1f, from the energy %.1f J/mol; CRC %.0f "
                "(%+5.2f %%)\n",
                k.card, stated, recovered, k.crc, 100 * deviation(stated, k.crc));
    EXPECT_NEAR(deviation(stated, k.crc), 0.0, 0.005);
    EXPECT_NEAR(deviation(recovered, k.crc), 0.0, 0.01);
    ASSERT_EQ(m->data().phases.size(), 3u);
    EXPECT_TRUE(m->data().phases[2].liquid);
    EXPECT_FALSE(m->data().phases[1].liquid);
  }
  const MaterialPtr cu = load_card(material_path("copper.yaml"));
  const double stated = cu->data().phase_layout->boundaries()[1].latent_heat;
  std::printf("  copper latent heat against Chekhovskoi et al. 2002 (13590 J/mol): "
              "%+5.2f %%\n",
              100 * deviation(stated, 13590.0));
  EXPECT_NEAR(deviation(stated, 13590.0), 0.0, 0.03);
}

// Silver and lead c_p above the join: FIT CHECK against the SGTE series the cards
// carry (Dinsdale 1991, written out above), to rounding (0.01 %) away from the
// joins; at 298.15 K the lattice model against the CRC Handbook of Chemistry and
// Physics (validation, 3 %): silver 25.35 J/mol/K (from memory), lead 26.65
// (verified).
TEST(CopperSilverLead, SilverAndLeadSpecificHeatFitCheckAgainstSgte) {
  struct Case {
    const char* card;
    double crc298, tm;
    Gibbs solid, liquid;
    std::vector<double> temperatures;
  };
  const std::vector<Case> cases{
      {"silver.yaml",
       25.35,
       1234.93,
       kAgSolid,
       kAgLiquid,
       {400.0, 500.0, 600.0, 800.0, 1000.0, 1200.0, 1260.0, 1300.0, 1350.0}},
      {"lead.yaml",
       26.65,
       600.61,
       kPbSolid,
       kPbLiquid,
       {360.0, 400.0, 450.0, 500.0, 550.0, 590.0, 620.0, 700.0, 750.0}}};
  for (const Case& k : cases) {
    SCOPED_TRACE(k.card);
    const MaterialPtr m = load_card(material_path(k.card));
    const double c298 = m->thermal(298.15, Basis::mole).capacity;
    std::printf("  %-12s c_p(298.15 K) card %7.3f  CRC %7.3f J/mol/K  %+5.2f %%\n",
                k.card, c298, k.crc298, 100 * deviation(c298, k.crc298));
    EXPECT_NEAR(deviation(c298, k.crc298), 0.0, 0.03);
    for (double t : k.temperatures) {
      const double model = m->thermal(t, Basis::mole).capacity;
      const double reference =
          t < k.tm ? k.solid.capacity(t) : k.liquid.capacity(t); // Dinsdale 1991
      const double d = deviation(model, reference);
      std::printf("  %-12s c_p(%6.1f K) card %7.3f  SGTE %7.3f J/mol/K  %+6.3f %% "
                  "(fit check)\n",
                  k.card, t, model, reference, 100 * d);
      EXPECT_NEAR(d, 0.0, 1e-4) << t;
    }
  }
}

// Silver and lead H(T) - H(298.15 K) below and above the melt: FIT CHECK against
// SGTE (Dinsdale 1991), within 2 %, latent heat included. The card's lattice model
// (not SGTE) runs up to the join, so the card differs from SGTE by the small
// energy gap the join spreads; the difference is printed.
TEST(CopperSilverLead, SilverAndLeadEnthalpyFitCheckAgainstSgte) {
  struct Case {
    const char* card;
    double tm, latent;
    Gibbs solid, liquid;
    std::vector<double> temperatures;
  };
  // SGTE enthalpies relative to the solid at 298.15 K: solid piece up to T_m, then
  // the latent heat, then the liquid piece, each with its own constant removed.
  const auto sgte = [](const Gibbs& s, const Gibbs& l, double tm, double latent,
                       double t) {
    if (t < tm)
      return s.enthalpy(t) - s.enthalpy(298.15);
    return s.enthalpy(tm) - s.enthalpy(298.15) + latent + l.enthalpy(t) - l.enthalpy(tm);
  };
  // The SGTE heats of fusion, H of liquid minus fcc at T_m: a - 6 g T_m^7 of the
  // difference terms (Dinsdale 1991), computed here.
  const double ag_latent = 11025.076 + 6 * 1.034e-20 * std::pow(1234.93, 7);
  const double pb_latent = 4672.124 + 6 * 6.019e-19 * std::pow(600.61, 7);
  const std::vector<Case> cases{{"silver.yaml",
                                 1234.93,
                                 ag_latent,
                                 kAgSolid,
                                 kAgLiquid,
                                 {500.0, 900.0, 1200.0, 1300.0, 1350.0}},
                                {"lead.yaml",
                                 600.61,
                                 pb_latent,
                                 kPbSolid,
                                 kPbLiquid,
                                 {400.0, 500.0, 580.0, 650.0, 750.0}}};
  for (const Case& k : cases) {
    SCOPED_TRACE(k.card);
    const MaterialPtr m = load_card(material_path(k.card));
    const double h0 = m->thermal(298.15, Basis::mole).energy;
    for (double t : k.temperatures) {
      const double model = m->thermal(t, Basis::mole).energy - h0;
      const double reference = sgte(k.solid, k.liquid, k.tm, k.latent, t);
      const double d = deviation(model, reference);
      std::printf("  %-12s H(%6.1f K) - H(298.15 K) card %8.1f  SGTE %8.1f J/mol  "
                  "%+5.2f %% (fit check)\n",
                  k.card, t, model, reference, 100 * d);
      EXPECT_NEAR(d, 0.0, 0.02) << t;
    }
  }
}

// Liquid lead against the OECD/NEA Handbook on Lead-bismuth Eutectic Alloy and Lead
// Properties (2015), c_p = 175.1 - 4.961e-2 T + 1.985e-5 T^2 - 2.099e-9 T^3 -
// 1.524e6 T^-2 J/kg/K (Sobolev; from memory): validation, 3 %.
TEST(CopperSilverLead, LiquidLeadAgainstTheOecdNeaHandbook) {
  const MaterialPtr pb = load_card(material_path("lead.yaml"));
  for (double t : {620.0, 650.0, 700.0, 750.0}) {
    const double reference = 175.1 - 4.961e-2 * t + 1.985e-5 * t * t -
                             2.099e-9 * t * t * t - 1.524e6 / (t * t);
    const double model = pb->thermal(t, Basis::mass).capacity;
    const double d = deviation(model, reference);
    std::printf("  lead c_p(%6.1f K) card %7.2f  OECD/NEA %7.2f J/kg/K  %+5.2f %%\n", t,
                model, reference, 100 * d);
    EXPECT_NEAR(d, 0.0, 0.03) << t;
  }
}

// Each melt conducts far less than its solid; across the melting join the blended
// conductivity falls monotonically from one to the other, and the density takes
// the liquid's value. Values: the cards' tables (their sources there).
TEST(CopperSilverLead, LiquidConductivityAndDensity) {
  struct Case {
    const char* card;
    double tm, width, rho_liquid, k_liquid_max;
  };
  for (const Case& k : {Case{"copper.yaml", 1357.77, 8.0, 7990.0, 175.0},
                        Case{"silver.yaml", 1234.93, 8.0, 9320.0, 185.0},
                        Case{"lead.yaml", 600.61, 4.0, 10670.0, 18.0}}) {
    SCOPED_TRACE(k.card);
    const MaterialPtr m = load_card(material_path(k.card));
    double previous = m->conductivity(k.tm - k.width).value;
    for (double t = k.tm - k.width / 2; t <= k.tm + k.width / 2; t += k.width / 16) {
      const double value = m->conductivity(t).value;
      EXPECT_LE(value, previous + 1e-12) << t;
      previous = value;
    }
    EXPECT_LT(m->conductivity(k.tm + k.width).value, k.k_liquid_max);
    EXPECT_GT(m->conductivity(k.tm - k.width).value, 1.7 * k.k_liquid_max);
    EXPECT_NEAR(m->density(k.tm + k.width), k.rho_liquid, 1e-9);
    EXPECT_EQ(m->density(0.5 * k.tm), m->reference_density());
  }
  // copper keeps its cryogenic table: 642 W/m/K at 4 K (NIST OFHC RRR 100,
  // Marquardt, Le and Radebaugh 2000, computed; a fit check, the table's own row).
  const MaterialPtr cu = load_card(material_path("copper.yaml"));
  EXPECT_NEAR(cu->conductivity(4.0).value, 642.0, 1e-9);
}

} // namespace
