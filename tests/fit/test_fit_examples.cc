// SPDX-License-Identifier: Apache-2.0
// The fitting examples of docs/api.md, compiled and run: fitting a card to a data
// file and writing the fitted card, and one-sigma bands from a fitted card. Each
// example is checked against the published values the other fit tests use.
#include "cli/cli_support.h"
#include "fit/fit_support.h"

#include <quantacal/cards/card.h>
#include <quantacal/cards/card_writer.h>
#include <quantacal/fit/fit.h>

#include <gtest/gtest.h>

#include <cmath>
#include <iostream>
#include <string>
#include <vector>

namespace {

// ---- Example: fitting a card to a data file and writing the fitted card ----------

/** Fits a start card's lattice and electrons to a data file; writes the fitted card. */
quantacal::fit::FitResult fit_card(const std::string& data_file,
                                   const std::string& start_card,
                                   const std::string& fitted_card) {
  namespace fit = quantacal::fit;
  const std::string start_text = quantacal::read_card_text(start_card);
  const quantacal::MaterialPtr start =
      quantacal::load_card_from_string(start_text, start_card);
  const fit::DataSet data = fit::read_data(data_file); // T_K,cp_J_per_kg_K,sigma
  const std::vector<fit::FreeParameter> free = fit::resolve_free_parameters(
      *start, {"theta_D", "gamma", "theta_E", "heat_capacity[1].modes",
               "heat_capacity[0].modes"});
  fit::FitOptions options; // relative weights, every row
  const fit::FitResult result = fit::fit(*start, data, free, options);
  std::cout << fit::report(result, data);
  // The start card's text with the fitted values, a source for each and the `fit`
  // record; save_card writes it only if it loads.
  quantacal::save_card(fitted_card, fit::fitted_card(start_text, start_card, result, data,
                                                     options.weighting, fitted_card));
  return result;
}

// ---- Example: a one-sigma band from a fitted card ---------------------------------

/** c_p and its one sigma (J/kg/K) at @p temperatures, from a card written by a fit. */
std::vector<quantacal::fit::BandRow>
capacity_band(const std::string& fitted_card, const std::vector<double>& temperatures) {
  // The loader reads the card's `fit` record into card->data().fit.
  const quantacal::MaterialPtr card = quantacal::load_card(fitted_card);
  std::vector<quantacal::fit::BandRow> rows;
  for (const double t : temperatures) {
    rows.push_back(quantacal::fit::band(*card, t, quantacal::Basis::mass));
    std::cout << t << " K: c_p = " << rows.back().capacity << " +- "
              << rows.back().capacity_sigma << " J/kg/K\n";
  }
  return rows;
}

const std::string start_card =
    std::string(QUANTACAL_SOURCE_DIR) + "/tests/fit/data/copper_start.yaml";

} // namespace

using namespace quantacal;

TEST(FitExamples, FitACardToADataFileAndWriteIt) {
  test::TempDir dir;
  // Copper Reference Equation from 2 K to 25 K, NIST correlation to 300 K.
  const test::CopperData published = test::published_copper_data(2.0);
  const std::string data_file = dir.write("copper_cp.csv", published.csv);
  const std::string fitted_file = (dir.path() / "copper_fitted.yaml").string();
  const fit::FitResult result = fit_card(data_file, start_card, fitted_file);

  const MaterialPtr fitted = load_card(fitted_file);
  ASSERT_TRUE(fitted->data().fit);
  EXPECT_EQ(fitted->data().fit->parameters.size(), 5u);
  // The written card reproduces the published data within 2 %, as the fit does.
  double worst = 0.0;
  for (std::size_t i = 0; i < published.temperatures.size(); ++i)
    worst = std::max(
        worst, std::abs(fitted->thermal(published.temperatures[i], Basis::mass).capacity /
                            published.values[i] -
                        1.0));
  EXPECT_LT(worst, 0.02); // Copper Reference Equation and NIST correlation
  // Sommerfeld gamma of the written card against Martin's 0.691 mJ/mol/K^2 (Phys. Rev.
  // B 8, 5357, 1973, verified); theta_0 = theta_D (3/modes)^(1/3) against Kittel's
  // calorimetric 343 K (Introduction to Solid State Physics, verified).
  const auto& terms = fitted->model().contributions();
  const double gamma = terms[2]->parameters()[0].value;
  EXPECT_NEAR(1e3 * gamma / 0.691, 1.0, 0.015);
  const auto debye = terms[0]->parameters();
  double theta_d = 0.0, modes = 0.0;
  for (const Parameter& p : debye) {
    if (p.name == "theta_D")
      theta_d = p.value;
    if (p.name == "modes")
      modes = p.value;
  }
  EXPECT_NEAR(theta_d * std::cbrt(3.0 / modes) / 343.0, 1.0, 0.01);
  // written with 7 significant digits
  EXPECT_NEAR(gamma / result.values[1], 1.0, 1e-6);
}

TEST(FitExamples, OneSigmaBandFromAFittedCard) {
  test::TempDir dir;
  // A card with gamma fitted to the Copper Reference Equation between 2 K and 10 K.
  const std::string data_file =
      dir.write("copper_cp.csv", test::published_copper_data(2.0).csv);
  const std::string fitted_file = (dir.path() / "gamma_fitted.yaml").string();
  {
    const std::string text = read_card_text(start_card);
    const MaterialPtr start = load_card_from_string(text, start_card);
    const fit::DataSet data = fit::read_data(data_file);
    fit::FitOptions options;
    options.to = 10.0;
    const fit::FitResult r =
        fit::fit(*start, data, fit::resolve_free_parameters(*start, {"gamma"}), options);
    save_card(fitted_file, fit::fitted_card(text, start_card, r, data, options.weighting,
                                            fitted_file));
  }
  const std::vector<double> temperatures = {4.0, 10.0, 20.0};
  const std::vector<fit::BandRow> rows = capacity_band(fitted_file, temperatures);

  const MaterialPtr fitted = load_card(fitted_file);
  const double sigma_gamma = std::sqrt(fitted->data().fit->covariance[0][0]);
  ASSERT_GT(sigma_gamma, 0.0);
  for (std::size_t i = 0; i < rows.size(); ++i) {
    const double t = temperatures[i];
    // C = ... + gamma T (Sommerfeld term, Kittel): sigma_C = T sigma_gamma per mole,
    // divided by the molar mass per kg.
    EXPECT_NEAR(rows[i].capacity_sigma / (t * sigma_gamma / fitted->molar_mass()), 1.0,
                1e-4)
        << t;
    EXPECT_NEAR(rows[i].capacity / fitted->thermal_exact(t, Basis::mass).capacity, 1.0,
                1e-12);
  }
}
