// SPDX-License-Identifier: Apache-2.0
// `quantacal fit` engine on synthetic data generated here from known parameters
// with seeded Gaussian noise: recovery within two standard errors, and standard
// errors that agree with the scatter of the estimates over repeated seeds.
#include "fit/fit_support.h"

#include <quantacal/fit/fit.h>

#include <quantacal/common/exceptions.h>

#include <gtest/gtest.h>

#include <cmath>
#include <random>
#include <string>

using namespace quantacal;

namespace {

constexpr double true_theta = 330.0;   // K, the known parameters of the synthetic data
constexpr double true_gamma = 0.70e-3; // J/mol/K^2
constexpr double noise = 0.01;         // relative standard deviation of each point

MaterialPtr truth() {
  return test::make_material({make_debye(true_theta), make_electronic(true_gamma)},
                             make_constant_conductivity(400.0));
}

MaterialPtr start() {
  return test::make_material({make_debye(343.0), make_electronic(0.695e-3)},
                             make_constant_conductivity(400.0));
}

// c_p per kg on a log grid 5 K .. 300 K, plus energy increments, with sigma.
std::string synthetic_csv(unsigned seed, bool with_energy) {
  std::mt19937 random(seed);
  std::normal_distribution<double> gauss(0.0, 1.0);
  const MaterialPtr m = truth();
  const double mm = m->molar_mass();
  std::string csv = "T_K,T_from_K,cp_J_per_kg_K,e_J_per_kg,sigma\n";
  const int n = 40;
  for (int i = 0; i < n; ++i) {
    const double t = 5.0 * std::pow(300.0 / 5.0, double(i) / (n - 1));
    const double c = m->model().evaluate(t).capacity / mm;
    const double s = noise * c;
    csv += format_double(t) + ",," + format_double(c + s * gauss(random)) + ",," +
           format_double(s) + "\n";
  }
  if (with_energy)
    for (double t : {50.0, 100.0, 200.0, 298.15}) {
      const double e =
          (m->model().evaluate(t).energy - m->model().evaluate(t / 2).energy) / mm;
      const double s = noise * e;
      csv += format_double(t) + "," + format_double(t / 2) + ",," +
             format_double(e + s * gauss(random)) + "," + format_double(s) + "\n";
    }
  return csv;
}

fit::FitResult run(unsigned seed, bool with_energy) {
  const fit::DataSet data =
      fit::read_data_from_string(synthetic_csv(seed, with_energy), "synthetic.csv");
  const MaterialPtr s = start();
  const auto free = fit::resolve_free_parameters(*s, {"theta_D", "gamma"});
  fit::FitOptions o;
  o.weighting = fit::Weighting::absolute; // sigma column in J/kg/K
  return fit::fit(*s, data, free, o);
}

} // namespace

TEST(FitSynthetic, RecoversParametersWithinTwoStandardErrors) {
  for (bool with_energy : {false, true}) {
    const fit::FitResult r = run(20261202u, with_energy);
    ASSERT_EQ(r.values.size(), 2u);
    std::printf("theta_D = %.3f +- %.3f K (true %.1f), gamma = %.5f +- %.5f mJ/mol/K^2 "
                "(true %.3f), reduced chi-square %.3f%s\n",
                r.values[0], r.standard_errors[0], true_theta, 1e3 * r.values[1],
                1e3 * r.standard_errors[1], 1e3 * true_gamma, r.reduced_chi_square,
                with_energy ? " (with energy rows)" : "");
    // synthetic data from known parameters, seeded noise
    EXPECT_LT(std::abs(r.values[0] - true_theta), 2.0 * r.standard_errors[0]);
    EXPECT_LT(std::abs(r.values[1] - true_gamma), 2.0 * r.standard_errors[1]);
    EXPECT_FALSE(r.covariance_scaled);
    EXPECT_GT(r.reduced_chi_square, 0.5); // sigma is the true noise: chi2/dof near 1
    EXPECT_LT(r.reduced_chi_square, 1.6);
    EXPECT_NEAR(r.correlation[0][1], r.correlation[1][0], 1e-12);
    EXPECT_LT(std::abs(r.correlation[0][1]), 1.0);
  }
}

TEST(FitSynthetic, StandardErrorsMatchScatterOverSeeds) {
  const int n_seeds = 60;
  double sum[2] = {0, 0}, sum2[2] = {0, 0}, se[2] = {0, 0};
  for (int k = 0; k < n_seeds; ++k) {
    const fit::FitResult r = run(1000u + static_cast<unsigned>(k), false);
    for (int j = 0; j < 2; ++j) {
      sum[j] += r.values[j];
      sum2[j] += r.values[j] * r.values[j];
      se[j] += r.standard_errors[j];
    }
  }
  for (int j = 0; j < 2; ++j) {
    const double mean = sum[j] / n_seeds;
    const double scatter = std::sqrt((sum2[j] - n_seeds * mean * mean) / (n_seeds - 1));
    const double reported = se[j] / n_seeds;
    std::printf("%s: scatter over %d seeds %.4g, mean reported standard error %.4g "
                "(ratio %.3f)\n",
                j == 0 ? "theta_D" : "gamma", n_seeds, scatter, reported,
                reported / scatter);
    // synthetic data, seeded noise: reported errors agree with the scatter within 30 %
    EXPECT_NEAR(reported / scatter, 1.0, 0.30);
  }
}

TEST(FitSynthetic, RecoversConductivityParameters) {
  // Known metal parameters; k data with 2 % seeded noise between 4 K and 300 K.
  auto inputs = test::copper_conductivity_inputs(80.0, 0.0);
  inputs.resistive_debye_temperature = 320.0;
  const auto true_k = make_metal_conductivity(inputs);
  std::mt19937 random(7u);
  std::normal_distribution<double> gauss(0.0, 1.0);
  std::string csv = "T_K,k_W_per_m_K,sigma\n";
  for (int i = 0; i < 30; ++i) {
    const double t = 4.0 * std::pow(300.0 / 4.0, i / 29.0);
    const double k = true_k->evaluate(t).value;
    csv += format_double(t) + "," + format_double(k * (1 + 0.02 * gauss(random))) +
           ",0.02\n";
  }
  const fit::DataSet data = fit::read_data_from_string(csv, "k.csv");
  const MaterialPtr s = test::make_material(
      {make_debye(343.0)},
      make_metal_conductivity(test::copper_conductivity_inputs(100, 0.0)));
  const auto free =
      fit::resolve_free_parameters(*s, {"conductivity.theta_R", "conductivity.rrr"});
  const fit::FitResult r = fit::fit(*s, data, free, {}); // relative weights, sigma = 2 %
  std::printf("theta_R = %.2f +- %.2f K (true 320), RRR = %.2f +- %.2f (true 80)\n",
              r.values[0], r.standard_errors[0], r.values[1], r.standard_errors[1]);
  EXPECT_LT(std::abs(r.values[0] - 320.0), 2.0 * r.standard_errors[0]);
  EXPECT_LT(std::abs(r.values[1] - 80.0), 2.0 * r.standard_errors[1]);
}

TEST(FitNames, BareAndFullPathsAndDidYouMean) {
  const MaterialPtr m = test::make_material(
      {make_debye(343.0), make_einstein(150.0, 0.2), make_electronic(0.7e-3)},
      make_metal_conductivity(test::copper_conductivity_inputs(100, 0.0)));
  auto f = fit::resolve_free_parameters(
      *m, {"theta_D", "gamma", "heat_capacity[1].modes", "conductivity.rrr"});
  EXPECT_EQ(f[0].path, "heat_capacity[0].theta_D");
  EXPECT_EQ(f[1].path, "heat_capacity[2].gamma");
  EXPECT_EQ(f[2].path, "heat_capacity[1].modes");
  EXPECT_TRUE(f[3].conductivity);
  try {
    fit::resolve_free_parameters(*m, {"modes"});
    FAIL() << "an ambiguous name was accepted";
  } catch (const std::invalid_argument& e) {
    EXPECT_NE(std::string(e.what()).find("ambiguous"), std::string::npos);
    EXPECT_NE(
        std::string(e.what()).find("heat_capacity[0].modes, heat_capacity[1].modes"),
        std::string::npos)
        << e.what();
  }
  try {
    fit::resolve_free_parameters(*m, {"theta_d"});
    FAIL() << "an unknown name was accepted";
  } catch (const std::invalid_argument& e) {
    EXPECT_NE(std::string(e.what()).find("did you mean 'theta_D'?"), std::string::npos)
        << e.what();
  }
  EXPECT_THROW(fit::resolve_free_parameters(*m, {"theta_D", "heat_capacity[0].theta_D"}),
               std::invalid_argument);
}

TEST(FitData, Sha256OfKnownMessages) {
  // FIPS 180-4 examples (from memory: the well-known digests of "abc" and "")
  EXPECT_EQ(fit::sha256_hex("abc"),
            "ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad");
  EXPECT_EQ(fit::sha256_hex(""),
            "e3b0c44298fc1c149afbf4c8996fb92427ae41e4649b934ca495991b7852b855");
}

TEST(FitData, ErrorsNameLineColumnAndCell) {
  const auto expect_error = [](const std::string& csv, int line, int column,
                               const std::string& text) {
    try {
      fit::read_data_from_string(csv, "d.csv");
      ADD_FAILURE() << "accepted: " << csv;
    } catch (const CardError& e) {
      EXPECT_EQ(e.line(), line) << e.what();
      EXPECT_EQ(e.column(), column) << e.what();
      EXPECT_NE(std::string(e.what()).find(text), std::string::npos) << e.what();
    }
  };
  expect_error("T_K,cp_J_per_kg_K\n10,0.8\n20,abc\n", 3, 4,
               "d.csv:3:4: cp_J_per_kg_K = \"abc\": expected a number");
  expect_error("T_K,cp_J_per_kg_K\n-5,0.8\n", 2, 1, "expected a temperature > 0 K");
  expect_error("T_K,cp_J_per_kg_k\n10,0.8\n", 1, 5, "did you mean 'cp_J_per_kg_K'?");
  expect_error("Temp_K,cp_J_per_kg_K\n10,0.8\n", 1, 1, "unknown column");
  expect_error("T_K,sigma\n10,0.8\n", 1, 1, "missing a value column");
  expect_error("# comment\nT_K,cp_J_per_mol_K\n10,0.8,3\n", 3, 8, "expected 2 cells");
  expect_error("T_K,e_J_per_kg\n10,0.8\n", 1, 1, "missing column 'T_from_K'");
  // a byte-order mark before the header is ignored
  EXPECT_EQ(fit::read_data_from_string("\xEF\xBB\xBFT_K,cp_J_per_kg_K\n10,0.8\n", "d.csv")
                .points.size(),
            1u);
}
