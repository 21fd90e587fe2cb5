// SPDX-License-Identifier: Apache-2.0
// `quantacal fit` on published copper specific-heat data, 10 K to 300 K.
#include "fit/fit_support.h"

#include <quantacal/fit/fit.h>

#include <quantacal/cards/card.h>
#include <quantacal/common/exceptions.h>

#include <gtest/gtest.h>

#include <cmath>
#include <string>

using namespace quantacal;

namespace {
const std::string start_card =
    std::string(QUANTACAL_SOURCE_DIR) + "/tests/fit/data/copper_start.yaml";
}

TEST(FitCopper, CorrelationReproducesVerifiedValues) {
  // NIST OFHC copper cryogenic correlation (Marquardt, Le and Radebaugh 2000; computed,
  // stated fit error 5-10 %)
  EXPECT_NEAR(test::nist_copper_specific_heat(4.0), 0.0994, 0.0005);
  EXPECT_NEAR(test::nist_copper_specific_heat(20.0), 7.51, 0.01);
  EXPECT_NEAR(test::nist_copper_specific_heat(77.0), 196.0, 0.5);
  EXPECT_NEAR(test::nist_copper_specific_heat(300.0), 389.0, 0.5);
}

TEST(FitCopper, ReferenceEquationAgreesWithPublishedValues) {
  // Below 5 K the Copper Reference Equation reduces to gamma T + beta T^3 with
  // Martin's gamma = 0.691 mJ/mol/K^2 and theta_0 = 344.3 K (Phys. Rev. B 8, 5357,
  // 1973, verified); beta = (12 pi^4 R / 5) / theta_0^3.
  const double beta = 12.0 * std::pow(M_PI, 4) * 8.314462618 / 5.0 / std::pow(344.3, 3);
  for (double t : {2.0, 3.0, 5.0}) {
    const double martin = 0.691e-3 * t + beta * t * t * t;
    EXPECT_NEAR(test::reference_equation_copper_heat_capacity(t) / martin, 1.0, 0.005)
        << t << " K"; // Martin 1973
  }
  // From 10 K to 30 K it agrees with the NIST correlation within that correlation's
  // stated fit error (5 % above 15 K, 10 % below; Marquardt, Le and Radebaugh 2000).
  for (double t : {10.0, 12.0, 15.0, 20.0, 25.0, 30.0}) {
    const double nist = test::nist_copper_specific_heat(t) * test::copper_molar_mass;
    EXPECT_NEAR(test::reference_equation_copper_heat_capacity(t) / nist, 1.0, 0.05)
        << t << " K"; // NIST OFHC copper correlation
  }
}

namespace {
using test::CopperData;
using test::published_copper_data;

struct CopperFit {
  fit::FitResult result;
  double worst = 0.0;  ///< largest |card/data - 1| over the rows
  double theta0 = 0.0; ///< low-temperature Debye temperature of the fitted lattice
  double gamma = 0.0, gamma_error = 0.0; ///< mJ/mol/K^2
};

CopperFit fit_copper(double t_low) {
  const CopperData d = published_copper_data(t_low);
  const fit::DataSet data = fit::read_data_from_string(d.csv, "copper_cp.csv");
  const MaterialPtr start = load_card(start_card);
  const auto free = fit::resolve_free_parameters(*start, {"theta_D", "gamma", "theta_E",
                                                          "heat_capacity[1].modes",
                                                          "heat_capacity[0].modes"});
  CopperFit c{fit::fit(*start, data, free, {}), 0.0, 0.0, 0.0, 0.0};
  const fit::FitResult& r = c.result;
  for (std::size_t j = 0; j < r.values.size(); ++j)
    std::printf("%-26s %12.6g +- %.3g\n", r.parameters[j].path.c_str(), r.values[j],
                r.standard_errors[j]);
  // The fitted card, through its cached table, against every row.
  for (std::size_t i = 0; i < d.temperatures.size(); ++i) {
    const double cp = r.material->thermal(d.temperatures[i], Basis::mass).capacity;
    c.worst = std::max(c.worst, std::abs(cp / d.values[i] - 1.0));
  }
  // theta_0 = theta_D (3/modes)^(1/3): the T^3 limit of a Debye term with `modes`.
  c.theta0 = r.values[0] * std::cbrt(3.0 / r.values[4]);
  c.gamma = 1e3 * r.values[1];
  c.gamma_error = 1e3 * r.standard_errors[1];
  std::printf("from %g K: worst %.2f %%, theta_0 %.1f K, gamma %.4f +- %.4f mJ/mol/K^2\n",
              t_low, 100 * c.worst, c.theta0, c.gamma, c.gamma_error);
  for (const fit::ObservableDiagnostics& o : r.diagnostics.observables)
    std::printf("runs test: %zu runs in %zu rows, %.1f expected, z = %.2f, p = %.2g; "
                "chi-square upper tail %.2g\n",
                o.runs.runs, o.runs.n, o.runs.expected, o.runs.z, o.runs.p,
                r.diagnostics.chi_square_p);
  return c;
}

/**
 * Published copper c_p has a lattice shape no Debye plus Einstein term reproduces
 * (docs/fitting.md, "How low the data must go for gamma"): the residual signs come
 * in long runs, and with all lattice parameters free there is nothing left to free.
 */
void expect_lattice_shape_warning(const fit::FitResult& r) {
  ASSERT_EQ(r.diagnostics.observables.size(), 1u);
  EXPECT_TRUE(r.diagnostics.observables[0].runs.systematic);
  EXPECT_TRUE(r.diagnostics.suggestions.empty());
  const std::string& w = r.warnings.back();
  EXPECT_NE(w.find("the residuals are systematic"), std::string::npos) << w;
  EXPECT_NE(w.find("the model needs a term the card does not have"), std::string::npos)
      << w;
}
} // namespace

TEST(FitCopper, FitsPublishedDataFrom10KTo300K) {
  const CopperFit c = fit_copper(10.0);
  // The fitted card reproduces the published data within 2 % (issue requirement).
  EXPECT_LT(c.worst, 0.02); // Copper Reference Equation and NIST correlation
  // theta_0 within 5 % of the calorimetric 343 K (Kittel, Introduction to Solid
  // State Physics, verified) and 344.3 K (Martin 1973, verified).
  EXPECT_NEAR(c.theta0 / 343.0, 1.0, 0.05); // Kittel
  EXPECT_NEAR(c.theta0 / 344.3, 1.0, 0.05); // Martin 1973
  // Total lattice modes near Dulong-Petit's 3 per atom (common practice).
  EXPECT_NEAR(c.result.values[3] + c.result.values[4], 3.0, 0.2);
  // At 10 K the electrons carry about 12 % of c_p (Martin's gamma against the
  // reference equation), so a few per cent of lattice-shape error in the Debye and
  // Einstein terms moves gamma by tens of per cent (measured: 0.49 against 0.691).
  // The fit must say so rather than hand back a gamma that looks well determined.
  ASSERT_EQ(c.result.warnings.size(), 2u);
  EXPECT_NE(c.result.warnings[0].find("heat_capacity[2].gamma is poorly determined"),
            std::string::npos)
      << c.result.warnings[0];
  // The lattice-shape error shows in the residuals too (measured: 9 runs of one sign
  // in 41 rows where 20.5 are expected); every lattice parameter of the start card is
  // already free.
  expect_lattice_shape_warning(c.result);
}

TEST(FitCopper, FitsPublishedDataFrom2KTo300KAndRecoversGamma) {
  // With rows down to 2 K, where the electrons carry 78 % of c_p, gamma is pinned.
  const CopperFit c = fit_copper(2.0);
  EXPECT_LT(c.worst, 0.02); // Copper Reference Equation and NIST correlation
  EXPECT_NEAR(c.gamma / 0.691, 1.0, 0.015);                  // Martin 1973 (verified)
  EXPECT_NEAR(c.gamma / 0.695, 1.0, 0.015);                  // Kittel (from memory)
  EXPECT_LT(std::abs(c.gamma - 0.691), 2.0 * c.gamma_error); // within 2 sigma of Martin
  EXPECT_NEAR(c.theta0 / 343.0, 1.0, 0.01);                  // Kittel
  EXPECT_NEAR(c.theta0 / 344.3, 1.0, 0.01);                  // Martin 1973
  // No gamma warning; but a Debye and an Einstein term still miss the dispersion of
  // copper's phonons by up to 1.9 % in runs of one sign (measured: 6 runs in 41 rows
  // where 21.4 are expected), so the fit says its standard errors do not measure
  // the uncertainty.
  ASSERT_EQ(c.result.warnings.size(), 1u);
  EXPECT_EQ(c.result.warnings[0].find("heat_capacity[2].gamma is poorly determined"),
            std::string::npos)
      << c.result.warnings[0];
  expect_lattice_shape_warning(c.result);
}
