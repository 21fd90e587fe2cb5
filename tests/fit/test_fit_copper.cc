// SPDX-License-Identifier: Apache-2.0
// `quantacal fit` on published copper specific-heat data, 10 K to 300 K.
#include "fit/fit_support.h"

#include "fit_engine.h"

#include <quantacal/cards/card.h>
#include <quantacal/exceptions.h>

#include <gtest/gtest.h>

#include <cmath>
#include <string>

using namespace quantacal;

namespace {
const std::string start_card =
    std::string(QUANTACAL_SOURCE_DIR) + "/tests/fit/data/copper_start.yaml";
}

TEST(FitCopper, CorrelationReproducesVerifiedValues) {
  // NIST OFHC copper cryogenic correlation, REFERENCE-DATA.md (computed, stated fit error
  // 5-10 %)
  EXPECT_NEAR(test::nist_copper_specific_heat(4.0), 0.0994, 0.0005);
  EXPECT_NEAR(test::nist_copper_specific_heat(20.0), 7.51, 0.01);
  EXPECT_NEAR(test::nist_copper_specific_heat(77.0), 196.0, 0.5);
  EXPECT_NEAR(test::nist_copper_specific_heat(300.0), 389.0, 0.5);
}

TEST(FitCopper, FitsNistCorrelationBetween10And300K) {
  // 31 points of the NIST OFHC copper correlation (Marquardt, Le and Radebaugh 2000;
  // coefficients from memory, checked against REFERENCE-DATA.md above), 10 K .. 300 K.
  std::string csv =
      "# NIST OFHC copper specific heat correlation, computed\nT_K,cp_J_per_kg_K\n";
  std::vector<double> temperatures;
  for (int i = 0; i <= 30; ++i) {
    const double t = 10.0 * std::pow(30.0, i / 30.0);
    temperatures.push_back(t);
    csv +=
        format_double(t) + "," + format_double(test::nist_copper_specific_heat(t)) + "\n";
  }
  const fit::DataSet data = fit::read_data_from_string(csv, "nist_copper_cp.csv");
  const MaterialPtr start = load_card(start_card);
  const auto free = fit::resolve_free_parameters(*start, {"theta_D", "gamma", "theta_E",
                                                          "heat_capacity[0].modes",
                                                          "heat_capacity[1].modes"});
  const fit::FitResult r = fit::fit(*start, data, free, {});
  for (std::size_t j = 0; j < r.values.size(); ++j)
    std::printf("%-26s %12.6g +- %.3g\n", r.parameters[j].path.c_str(), r.values[j],
                r.standard_errors[j]);
  std::printf("rms %.2f %%, max %.2f %%\n", 100 * r.rms_relative, 100 * r.max_relative);

  // The fitted card reproduces the published data within 2 % (through its cached table).
  double worst = 0.0;
  for (double t : temperatures) {
    const double c = r.material->thermal(t, Basis::mass).capacity;
    worst = std::max(worst, std::abs(c / test::nist_copper_specific_heat(t) - 1.0));
  }
  std::printf("worst deviation of the fitted card from the data: %.2f %%\n", 100 * worst);
  EXPECT_LT(worst, 0.02); // NIST OFHC copper correlation, REFERENCE-DATA.md

  // The low-temperature Debye temperature of the fitted lattice, theta_0 =
  // theta_D (3/modes)^(1/3) (the T^3 limit of the Debye term with `modes` modes),
  // lies within 5 % of the calorimetric values 343 K (Kittel, verified) and
  // 344.5 K (Martin, Phys. Rev. B 8, 5357, 1973, verified).
  const double theta0 = r.values[0] * std::cbrt(3.0 / r.values[3]);
  std::printf("theta_0 = %.1f K\n", theta0);
  EXPECT_NEAR(theta0 / 343.0, 1.0, 0.05); // Kittel, Introduction to Solid State Physics
  EXPECT_NEAR(theta0 / 344.5, 1.0, 0.05); // Martin 1973
  // Total lattice modes stay near Dulong-Petit's 3 per atom (common practice).
  EXPECT_NEAR(r.values[3] + r.values[4], 3.0, 0.2);
}
