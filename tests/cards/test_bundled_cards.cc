// SPDX-License-Identifier: Apache-2.0
// The bundled cards in materials/ against published data. The source of each
// reference value is named beside it; tolerances are the ones the project set
// for the model (model limits), numerical ones are said to be numerical.
#include "support.h"

#include <quantacal/cards/card.h>
#include <quantacal/common/exceptions.h>

#include <gtest/gtest.h>

#include <algorithm>
#include <array>
#include <cmath>
#include <fstream>
#include <random>
#include <sstream>
#include <thread>
#include <vector>

using namespace quantacal;
using quantacal::test::data_path;
using quantacal::test::material_path;

namespace {

const std::vector<std::string> kBundled = {
    "copper.yaml", "aluminium.yaml", "iron.yaml",         "nickel.yaml",
    "silver.yaml", "tungsten.yaml",  "titanium.yaml",     "silicon.yaml",
    "lead.yaml",   "chromium.yaml",  "stainless_304.yaml"};

double relative(double value, double reference) {
  return value / reference - 1.0;
}

/** NIST OFHC copper c_p correlation, J/kg/K (tests/data/copper_ofhc_cp_nist.txt). */
class CopperCorrelation {
public:
  CopperCorrelation() {
    std::ifstream in(data_path("copper_ofhc_cp_nist.txt"));
    std::string line;
    while (std::getline(in, line)) {
      if (line.empty() || line[0] == '#')
        continue;
      std::istringstream row(line);
      double a;
      while (row >> a)
        a_.push_back(a);
    }
  }
  std::size_t size() const { return a_.size(); }
  double operator()(double t) const {
    const double x = std::log10(t);
    double s = 0.0, p = 1.0;
    for (double a : a_) {
      s += a * p;
      p *= x;
    }
    return std::pow(10.0, s);
  }

private:
  std::vector<double> a_;
};

} // namespace

TEST(BundledCards, AllLoadWithSources) {
  for (const auto& file : kBundled) {
    SCOPED_TRACE(file);
    const MaterialPtr m = load_card(material_path(file));
    EXPECT_FALSE(m->data().sources.empty());
    EXPECT_GT(m->upper_temperature(), m->lower_temperature());
  }
}

TEST(BundledCards, SpecificHeatAt298VsCrc) {
  struct Row {
    const char* file;
    double cp;   // J/mol/K at 298.15 K
    bool fitted; // the card's excess term was fitted to this very value
  };
  // Within 3 % (the project's requirement; a model limit). Rows marked `true` are
  // FIT CHECKS, not validation: the card's Einstein excess term was fitted to the
  // same CRC value, so they check only the chain card -> model -> table. The
  // others are validation (the cards were built from low-temperature data).
  const std::vector<Row> rows = {
      {"aluminium.yaml", 24.200,
       false},                         // CRC Handbook of Chemistry and Physics (verified)
      {"silicon.yaml", 19.789, false}, // CRC Handbook of Chemistry and Physics (verified)
      {"iron.yaml", 25.10, true},      // CRC Handbook (verified); fit check
      {"nickel.yaml", 26.07, false},   // CRC Handbook (verified); validation since the
                                       // room-temperature excess term was dropped
      {"titanium.yaml", 25.060, true}, // CRC Handbook (verified); fit check
      {"tungsten.yaml", 24.27, true},  // CRC Handbook (verified); fit check
      {"lead.yaml", 26.650, false},    // CRC Handbook of Chemistry and Physics (verified)
      // copper: fitted to the NIST cryogenic correlation up to 300 K, not to this value
      {"copper.yaml", 24.440, false}, // CRC Handbook (from memory)
      {"silver.yaml", 25.350, false}, // CRC Handbook (from memory)
      {"chromium.yaml", 23.35, true}, // CRC Handbook (from memory); fit check
  };
  for (const auto& r : rows) {
    SCOPED_TRACE(r.file);
    const MaterialPtr m = load_card(material_path(r.file));
    const double table = m->thermal(298.15, Basis::mole).capacity;
    const double exact = m->thermal_exact(298.15, Basis::mole).capacity;
    EXPECT_NEAR(relative(table, r.cp), 0.0, 0.03);
    EXPECT_NEAR(relative(exact, r.cp), 0.0, 0.03);
    std::printf(
        "  c_p(298.15 K) %-16s model %8.4f  CRC %8.4f  deviation %+6.2f %%  (%s)\n",
        r.file, exact, r.cp, 100 * relative(exact, r.cp),
        r.fitted ? "fit check" : "validation");
  }
}

TEST(BundledCards, MassSpecificHeatAt298VsCrc) {
  // Mass-specific values, within 3 % (model limit). The same CRC data as the molar
  // test: for iron, nickel, titanium and tungsten a fit check (see there).
  const std::vector<std::pair<const char*, double>> rows = {
      {"aluminium.yaml",
       897}, // CRC 97th ed. mass-specific c_p (CRC Handbook of Chemistry and Physics)
      {"copper.yaml",
       385}, // CRC 97th ed. mass-specific c_p (CRC Handbook of Chemistry and Physics)
      {"iron.yaml",
       449}, // CRC 97th ed. mass-specific c_p (CRC Handbook of Chemistry and Physics)
      {"nickel.yaml",
       444}, // CRC 97th ed. mass-specific c_p (CRC Handbook of Chemistry and Physics)
      {"silver.yaml",
       235}, // CRC 97th ed. mass-specific c_p (CRC Handbook of Chemistry and Physics)
      {"tungsten.yaml",
       132}, // CRC 97th ed. mass-specific c_p (CRC Handbook of Chemistry and Physics)
      {"titanium.yaml",
       524}, // CRC 97th ed. mass-specific c_p (CRC Handbook of Chemistry and Physics)
      {"lead.yaml",
       130}, // CRC 97th ed. mass-specific c_p (CRC Handbook of Chemistry and Physics)
  };
  for (const auto& [file, cp] : rows) {
    SCOPED_TRACE(file);
    const MaterialPtr m = load_card(material_path(file));
    EXPECT_NEAR(relative(m->thermal(298.15, Basis::mass).capacity, cp), 0.0, 0.03);
  }
}

TEST(BundledCards, EnthalpyIncrementVsCodata) {
  // H(298.15 K) - H(0), within 5 % (model limit). For aluminium and silicon a fit
  // check: their low-temperature Einstein modes are fitted to the SGTE values
  // (4577.3 and 3217.5 J/mol, within 0.9 % of these).
  const std::vector<std::pair<const char*, double>> rows = {
      {"copper.yaml", 5004.0},    // CODATA Key Values for Thermodynamics, Cox, Wagman and
                                  // Medvedev 1989 (from memory)
      {"aluminium.yaml", 4540.0}, // CODATA Key Values for Thermodynamics, Cox, Wagman and
                                  // Medvedev 1989 (verified)
      {"silicon.yaml", 3217.0},   // CODATA Key Values for Thermodynamics, Cox, Wagman and
                                  // Medvedev 1989 (from memory); fit check, see above
  };
  for (const auto& [file, h] : rows) {
    SCOPED_TRACE(file);
    const MaterialPtr m = load_card(material_path(file));
    const double table = m->thermal(298.15, Basis::mole).energy;
    const double exact = m->thermal_exact(298.15, Basis::mole).energy;
    EXPECT_NEAR(relative(exact, h), 0.0, 0.05);
    EXPECT_NEAR(relative(table, exact), 0.0, 1e-9); // numerical: table vs model
    std::printf("  H(298.15)-H(0) %-16s model %8.1f  CODATA %8.1f  deviation %+6.2f %%\n",
                file, exact, h, 100 * relative(exact, h));
  }
}

TEST(BundledCards, CopperCorrelationReproducesReferenceValues) {
  const CopperCorrelation nist;
  ASSERT_EQ(nist.size(), 8u);
  // The recalled coefficients against the values computed from the published
  // correlation (NIST cryogenic correlation for OFHC copper, Marquardt, Le and
  // Radebaugh 2000, computed): within 0.2 %, the rounding of the listed values.
  EXPECT_NEAR(relative(nist(4.0), 0.0994), 0.0,
              0.002); // Marquardt, Le and Radebaugh 2000, computed
  EXPECT_NEAR(relative(nist(20.0), 7.51), 0.0,
              0.002); // Marquardt, Le and Radebaugh 2000, computed
  EXPECT_NEAR(relative(nist(77.0), 196.0), 0.0,
              0.002); // Marquardt, Le and Radebaugh 2000, computed
  EXPECT_NEAR(relative(nist(300.0), 389.0), 0.0,
              0.002); // Marquardt, Le and Radebaugh 2000, computed
}

TEST(BundledCards, CopperCryogenic) {
  const MaterialPtr cu = load_card(material_path("copper.yaml"));
  // Published points (NIST cryogenic correlation for OFHC copper, Marquardt, Le
  // and Radebaugh 2000, computed): 10 % at 4 K, 5 % above (the project's
  // requirement, equal to the correlation's stated fit error; a model limit).
  EXPECT_NEAR(relative(cu->thermal(4.0).capacity, 0.0994), 0.0,
              0.10); // Marquardt, Le and Radebaugh 2000, computed
  EXPECT_NEAR(relative(cu->thermal(20.0).capacity, 7.51), 0.0,
              0.05); // Marquardt, Le and Radebaugh 2000, computed
  EXPECT_NEAR(relative(cu->thermal(77.0).capacity, 196.0), 0.0,
              0.05); // Marquardt, Le and Radebaugh 2000, computed
  EXPECT_NEAR(relative(cu->thermal(300.0).capacity, 389.0), 0.0,
              0.05); // Marquardt, Le and Radebaugh 2000, computed

  for (const auto& [t, ref] : std::vector<std::pair<double, double>>{
           {4.0, 0.0994}, {20.0, 7.51}, {77.0, 196.0}, {300.0, 389.0}})
    std::printf("  copper c_p(%g K) = %.4g J/kg/K vs %g (%+.2f %%)\n", t,
                cu->thermal(t).capacity, ref,
                100 * relative(cu->thermal(t).capacity, ref));

  // Dense check from 20 K to 300 K against the correlation (coefficients from
  // memory, verified above): within 5 %; the measured worst is about 1.7 %.
  const CopperCorrelation nist;
  double worst = 0.0, worst_t = 0.0;
  for (int i = 0; i <= 400; ++i) {
    const double t = 20.0 * std::pow(300.0 / 20.0, i / 400.0);
    const double d = std::abs(relative(cu->thermal(t).capacity, nist(t)));
    if (d > worst) {
      worst = d;
      worst_t = t;
    }
  }
  std::printf("  copper vs NIST correlation, 20-300 K: worst %.2f %% at %.1f K\n",
              100 * worst, worst_t);
  EXPECT_LT(worst, 0.05);
  // And the 4 K end against the correlation itself (10 %).
  EXPECT_NEAR(relative(cu->thermal(4.0).capacity, nist(4.0)), 0.0, 0.10);
}

TEST(BundledCards, CopperConductivity) {
  const MaterialPtr cu = load_card(material_path("copper.yaml"));
  // FIT CHECK, not validation: the card's table holds these very points, and must
  // pass through them (numerical, 1e-12).
  EXPECT_NEAR(relative(cu->conductivity(4.0).value, 642.0), 0.0,
              1e-12); // NIST OFHC RRR 100, Marquardt, Le and Radebaugh 2000, computed
  EXPECT_NEAR(relative(cu->conductivity(77.0).value, 547.0), 0.0,
              1e-12); // NIST OFHC RRR 100, Marquardt, Le and Radebaugh 2000, computed
  // Commercial copper at 20 degC: 394 W/m/K (Copper Development Association,
  // verified); OFHC RRR 100 is within 1 % of it (a material difference).
  EXPECT_NEAR(relative(cu->conductivity(293.15).value, 394.0), 0.0,
              0.01); // Copper Development Association, verified
  EXPECT_THROW(cu->conductivity(2.0), RangeError);
}

TEST(BundledCards, AluminiumMelting) {
  const MaterialPtr al = load_card(material_path("aluminium.yaml"));
  // FIT CHECK: the card states the latent heat 10.71 kJ/mol (CRC Handbook of
  // Chemistry and Physics, verified); the energy gained from 900 K to 960 K, less
  // the non-latent part, must give it back (a check of the energy bookkeeping, not
  // a validation of the card).
  const double du =
      al->thermal(960.0, Basis::mole).energy - al->thermal(900.0, Basis::mole).energy;
  // Sensible part: trapezoid of C at the ends (no peak there), error well below 1 %.
  const double sensible = 0.5 *
                          (al->thermal(900.0, Basis::mole).capacity +
                           al->thermal(960.0, Basis::mole).capacity) *
                          60.0;
  EXPECT_NEAR(relative(du - sensible, 10710.0), 0.0,
              0.01); // CRC Handbook of Chemistry and Physics (verified)
  // Table vs model across the peak (numerical: the table tolerance 1e-9).
  double worst = 0.0;
  for (int i = 0; i <= 20000; ++i) {
    const double t = 910.0 + 50.0 * i / 20000.0;
    worst = std::max(worst, std::abs(relative(al->thermal(t).capacity,
                                              al->thermal_exact(t).capacity)));
  }
  std::printf("  aluminium table across the melting peak: worst %.2e\n", worst);
  EXPECT_LT(worst, al->data().table_options.tolerance);
}

class TableAccuracy : public ::testing::TestWithParam<std::string> {};

TEST_P(TableAccuracy, RandomPoints) {
  // 10^5 random points, log-uniform over the valid range: worst relative error
  // of c_p (table vs exact model) below the card's table tolerance (numerical).
  const std::string file = GetParam();
  std::mt19937_64 rng(20261202);
  const MaterialPtr m = load_card(material_path(file));
  std::uniform_real_distribution<double> u(std::log(m->lower_temperature()),
                                           std::log(m->upper_temperature()));
  double worst = 0.0, worst_t = 0.0;
  for (int i = 0; i < 100000; ++i) {
    const double t =
        std::clamp(std::exp(u(rng)), m->lower_temperature(), m->upper_temperature());
    const double d =
        std::abs(relative(m->thermal(t).capacity, m->thermal_exact(t).capacity));
    if (d > worst) {
      worst = d;
      worst_t = t;
    }
  }
  std::printf("  table %-20s worst %.2e at %.3f K (%zu segments)\n", file.c_str(), worst,
              worst_t, m->table().statistics().n_segments);
  EXPECT_LT(worst, m->data().table_options.tolerance);
}

INSTANTIATE_TEST_SUITE_P(BundledCards, TableAccuracy, ::testing::ValuesIn(kBundled),
                         [](const ::testing::TestParamInfo<std::string>& info) {
                           return info.param.substr(0, info.param.find('.'));
                         });

TEST(BundledCards, MeasurementsWithinStatedTolerance) {
  for (const auto& file : kBundled) {
    const MaterialPtr m = load_card(material_path(file));
    for (const auto& meas : m->data().measurements) {
      SCOPED_TRACE(file + ": " + meas.source);
      double value = 0.0;
      switch (meas.quantity) {
      case Measurement::Quantity::specific_heat:
        value = m->thermal_exact(meas.temperature, Basis::mole).capacity;
        break;
      case Measurement::Quantity::stored_energy:
        value = m->thermal_exact(meas.temperature, Basis::mole).energy;
        break;
      case Measurement::Quantity::conductivity:
        value = m->conductivity(meas.temperature).value;
        break;
      }
      EXPECT_NEAR(relative(value, meas.value), 0.0, meas.tolerance);
    }
  }
}

TEST(Material, ThreadsShareOneTable) {
  // A fresh material, table built on first use by one of 8 threads.
  const MaterialPtr cu = load_card(material_path("copper.yaml"));
  constexpr int n_threads = 8, n_points = 20000;
  std::vector<std::vector<double>> results(n_threads, std::vector<double>(2 * n_points));
  std::vector<const PropertyTable*> tables(n_threads);
  std::vector<std::thread> pool;
  for (int k = 0; k < n_threads; ++k)
    pool.emplace_back([&, k] {
      tables[k] = &cu->table();
      for (int i = 0; i < n_points; ++i) {
        const double t = 4.0 + (1200.0 - 4.0) * i / (n_points - 1);
        const ThermalState s = cu->thermal(t);
        results[k][2 * i] = s.energy;
        results[k][2 * i + 1] = s.capacity;
      }
    });
  for (auto& t : pool)
    t.join();
  for (int k = 1; k < n_threads; ++k) {
    EXPECT_EQ(tables[k], tables[0]);
    EXPECT_EQ(results[k], results[0]); // bitwise identical
  }
}

TEST(Material, RangeBasisAndReference) {
  const MaterialPtr cu = load_card(material_path("copper.yaml"));
  try {
    cu->thermal(3.0);
    FAIL();
  } catch (const RangeError& e) {
    EXPECT_EQ(e.subject(), "copper (OFHC)");
    EXPECT_EQ(e.condition(),
              "4 K <= T <= " + format_double(cu->upper_temperature()) + " K");
    EXPECT_EQ(e.value(), 3.0);
  }
  EXPECT_THROW(cu->thermal(std::nan("")), RangeError);
  EXPECT_THROW(cu->thermal_exact(cu->upper_temperature() + 1.0), RangeError);
  // Basis factors: 1/M, 1, rho/M (definitions).
  const ThermalState mole = cu->thermal(77.0, Basis::mole);
  EXPECT_DOUBLE_EQ(cu->thermal(77.0, Basis::mass).capacity, mole.capacity / 0.063546);
  EXPECT_DOUBLE_EQ(cu->thermal(77.0, Basis::volume).capacity,
                   mole.capacity * 8935.0 / 0.063546);

  // A reference temperature moves the zero of the stored energy, not c_p.
  std::ifstream in(material_path("copper.yaml"));
  std::stringstream text;
  text << in.rdbuf();
  std::string card = text.str();
  card.replace(card.find("valid_range:"), 0, "reference_temperature: \"25 degC\"\n");
  const MaterialPtr shifted = load_card_from_string(card, material_path("copper.yaml"));
  EXPECT_NEAR(shifted->thermal(298.15).energy, 0.0,
              1e-3); // J/kg; numerical (table vs model)
  EXPECT_NEAR(shifted->energy_offset(), cu->thermal_exact(298.15, Basis::mole).energy,
              1e-9);
  EXPECT_EQ(shifted->thermal(77.0).capacity, cu->thermal(77.0).capacity);
}

TEST(BundledCards, SingleDebyeMissesCopper) {
  // Why the copper card splits its lattice: Debye 343 K (Kittel, Introduction to
  // Solid State Physics) with gamma 0.695 mJ/mol/K^2 (Kittel) misses the NIST
  // OFHC correlation (Marquardt, Le and Radebaugh 2000) by more than 15 % near
  // 30-50 K, while the card stays within 2 %.
  // The single-Debye model is built here from those two published values (no
  // dilation: under 1e-4 of C below 50 K).
  const HeatCapacityModel plain("copper, single Debye",
                                {make_debye(343.0), make_electronic(0.695e-3)});
  const MaterialPtr cu = load_card(material_path("copper.yaml"));
  const CopperCorrelation nist;
  double worst_plain = 0.0, worst_card = 0.0;
  for (double t = 30.0; t <= 50.0; t += 1.0) {
    const double c_plain = plain.evaluate(t).capacity / cu->molar_mass(); // J/kg/K
    worst_plain = std::max(worst_plain, std::abs(relative(c_plain, nist(t))));
    worst_card =
        std::max(worst_card, std::abs(relative(cu->thermal_exact(t).capacity, nist(t))));
  }
  std::printf("  30-50 K: single Debye %.1f %%, card %.1f %%\n", 100 * worst_plain,
              100 * worst_card);
  EXPECT_GT(worst_plain, 0.15);
  EXPECT_LT(worst_card, 0.02);
}
