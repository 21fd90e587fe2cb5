// SPDX-License-Identifier: Apache-2.0
// One-sigma bands propagated from the covariance of a fitted card's `fit` record.
#include "fit/fit_support.h"

#include <quantacal/fit/fit.h>

#include <quantacal/cards/card.h>
#include <quantacal/common/exceptions.h>

#include <gtest/gtest.h>

#include <cmath>
#include <fstream>
#include <random>
#include <sstream>

using namespace quantacal;

namespace {

const std::string start_file =
    std::string(QUANTACAL_SOURCE_DIR) + "/tests/fit/data/copper_start.yaml";

std::string read(const std::string& path) {
  std::ifstream in(path);
  std::ostringstream s;
  s << in.rdbuf();
  return s.str();
}

// Synthetic c_p (per mole) of the start card with theta_D = 330 K, 1 % seeded noise.
fit::DataSet synthetic() {
  const MaterialPtr s = load_card(start_file);
  const HeatCapacityModel truth = s->model().with_contribution(
      0, s->model().contributions()[0]->with_parameter("theta_D", 330.0));
  std::mt19937 random(11u);
  std::normal_distribution<double> gauss(0.0, 1.0);
  std::string csv = "T_K,cp_J_per_mol_K,sigma\n";
  for (int i = 0; i < 25; ++i) {
    const double t = 4.0 * std::pow(75.0, i / 24.0);
    const double c = truth.evaluate(t).capacity;
    csv += format_double(t) + "," + format_double(c * (1 + 0.01 * gauss(random))) + "," +
           format_double(0.01 * c) + "\n";
  }
  return fit::read_data_from_string(csv, "synthetic.csv");
}

} // namespace

TEST(FitBand, LinearInGammaGivesTSigmaGamma) {
  const std::string text = read(start_file);
  const MaterialPtr start = load_card_from_string(text, start_file);
  const fit::DataSet data = synthetic();
  const auto free = fit::resolve_free_parameters(*start, {"gamma"});
  const fit::FitResult r = fit::fit(*start, data, free, {fit::Weighting::absolute});
  const std::string card =
      fit::fitted_card(text, start_file, r, data, fit::Weighting::absolute);
  const MaterialPtr fitted = load_card_from_string(card, "fitted.yaml");
  ASSERT_TRUE(fitted->data().fit) << "the loader reads the fit record";
  const FitRecord& record = *fitted->data().fit;
  ASSERT_EQ(record.parameters.size(), 1u);
  for (double t : {4.0, 10.0, 100.0}) {
    const fit::BandRow b = fit::band(*fitted, t, Basis::mole);
    // C = ... + gamma T exactly (the dilation term bends this slightly at high T), so
    // sigma_C = T sigma_gamma (common practice: linear propagation)
    EXPECT_NEAR(b.capacity_sigma / (t * r.standard_errors[0]), 1.0, t < 50 ? 1e-4 : 2e-2)
        << t;
    // e = ... + gamma T^2 / 2
    EXPECT_NEAR(b.energy_sigma / (0.5 * t * t * r.standard_errors[0]), 1.0,
                t < 50 ? 1e-4 : 2e-2)
        << t;
  }
}

TEST(FitBand, AgreesWithMonteCarloOverTheCovariance) {
  const std::string text = read(start_file);
  const MaterialPtr start = load_card_from_string(text, start_file);
  const fit::DataSet data = synthetic();
  const auto free = fit::resolve_free_parameters(*start, {"theta_D", "gamma"});
  const fit::FitResult r = fit::fit(*start, data, free, {fit::Weighting::absolute});
  const std::string card =
      fit::fitted_card(text, start_file, r, data, fit::Weighting::absolute);
  const MaterialPtr fitted = load_card_from_string(card, "fitted.yaml");
  ASSERT_TRUE(fitted->data().fit);
  const FitRecord& record = *fitted->data().fit;
  const double t = 20.0;
  const fit::BandRow b = fit::band(*fitted, t, Basis::mass);
  // Monte Carlo: parameters drawn from N(p, C) (Cholesky), exact model evaluated.
  const auto& c = record.covariance;
  const double l00 = std::sqrt(c[0][0]), l10 = c[1][0] / l00,
               l11 = std::sqrt(c[1][1] - l10 * l10);
  std::mt19937 random(5u);
  std::normal_distribution<double> gauss(0.0, 1.0);
  const int n = 400;
  double sum = 0, sum2 = 0;
  for (int i = 0; i < n; ++i) {
    const double z0 = gauss(random), z1 = gauss(random);
    const double theta = r.values[0] + l00 * z0,
                 gamma = r.values[1] + l10 * z0 + l11 * z1;
    const HeatCapacityModel m =
        fitted->model()
            .with_contribution(
                0, fitted->model().contributions()[0]->with_parameter("theta_D", theta))
            .with_contribution(
                2, fitted->model().contributions()[2]->with_parameter("gamma", gamma));
    const double cp = m.evaluate(t).capacity / fitted->molar_mass();
    sum += cp;
    sum2 += cp * cp;
  }
  const double mc = std::sqrt((sum2 - sum * sum / n) / (n - 1));
  std::printf("c_p(20 K) = %.5g J/kg/K, band %.4g, Monte Carlo %.4g\n", b.capacity,
              b.capacity_sigma, mc);
  // 400 samples: the Monte Carlo sigma itself scatters by about 1/sqrt(2n) = 3.5 %
  EXPECT_NEAR(b.capacity_sigma / mc, 1.0, 0.12);
}

TEST(FitBand, MissingRecordIsAnError) {
  const MaterialPtr start = load_card(start_file);
  EXPECT_FALSE(start->data().fit);
  try {
    (void)fit::band(*start, 20.0, Basis::mole);
    FAIL() << "a card without a fit record was accepted";
  } catch (const CardError& e) {
    EXPECT_NE(std::string(e.what()).find("no `fit` record"), std::string::npos);
    EXPECT_EQ(e.file(), start_file) << "the error names the card";
  }
}

TEST(FitBand, TheFitResultCarriesTheRecordOfTheWrittenCard) {
  // The fitted material of a FitResult has the record its card will have: the band
  // of the result equals the band of the written and reloaded card up to the 7
  // significant digits the card writes values with.
  const std::string text = read(start_file);
  const MaterialPtr start = load_card_from_string(text, start_file);
  const fit::DataSet data = synthetic();
  const auto free = fit::resolve_free_parameters(*start, {"theta_D", "gamma"});
  const fit::FitResult r = fit::fit(*start, data, free, {fit::Weighting::absolute});
  ASSERT_TRUE(r.material->data().fit);
  EXPECT_EQ(
      r.material->data().fit->parameters,
      (std::vector<std::string>{"heat_capacity[0].theta_D", "heat_capacity[2].gamma"}));
  const MaterialPtr fitted = load_card_from_string(
      fit::fitted_card(text, start_file, r, data, fit::Weighting::absolute),
      "fitted.yaml");
  // the covariance is written with round-trip precision
  EXPECT_EQ(fitted->data().fit->covariance, r.covariance);
  for (double t : {5.0, 20.0, 80.0}) {
    const fit::BandRow a = fit::band(*r.material, t, Basis::mass);
    const fit::BandRow b = fit::band(*fitted, t, Basis::mass);
    EXPECT_NEAR(a.capacity_sigma / b.capacity_sigma, 1.0, 1e-5) << t;
    EXPECT_NEAR(a.energy_sigma / b.energy_sigma, 1.0, 1e-5) << t;
  }
}

TEST(FitBand, ARecordBuiltInCodeIsChecked) {
  const MaterialPtr start = load_card(start_file);
  MaterialData d = start->data();
  d.fit = FitRecord{{"heat_capacity[0].theta_X"}, {{1.0}}};
  EXPECT_THROW((void)fit::band(Material(d), 20.0, Basis::mole), InputError);
  d.fit = FitRecord{{"heat_capacity[0].theta_D"}, {{1.0, 0.0}}};
  try {
    (void)fit::band(Material(d), 20.0, Basis::mole);
    FAIL() << "a covariance of the wrong shape was accepted";
  } catch (const InputError& e) {
    EXPECT_EQ(std::string(e.what()),
              "quantacal::fit::band: expected the fit record's covariance to be a 1 x 1 "
              "matrix, one row and column per parameter");
  }
}
