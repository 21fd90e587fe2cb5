// SPDX-License-Identifier: Apache-2.0
// `quantacal fit` says when a fit cannot be trusted: the Wald-Wolfowitz runs test on
// the residual signs against hand-computed cases, the systematic-residual warning on
// a model with a wrong fixed term (and none on data the model can describe), and the
// chi-square check against the sigma column.
#include <quantacal/fit/fit.h>

#include <quantacal/cards/card.h>

#include <gsl/gsl_sf_debye.h>

#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <cstdint>
#include <cstdio>
#include <functional>
#include <random>
#include <string>
#include <vector>

using namespace quantacal;

namespace {

/** Residuals with the signs of @p signs ('+' or '-'), each of size 1. */
std::vector<double> signs_of(const std::string& signs) {
  std::vector<double> r;
  for (char c : signs)
    r.push_back(c == '+' ? 1.0 : -1.0);
  return r;
}

std::string repeated(const std::string& block, int times) {
  std::string s;
  for (int i = 0; i < times; ++i)
    s += block;
  return s;
}

} // namespace

// Every figure below is computed by hand from the formula (Wald and Wolfowitz 1940):
// mu = 2 n+ n- / n + 1, sigma^2 = (mu - 1)(mu - 2)/(n - 1), z = (R - mu)/sigma; the
// exact tails from P(R = 2k) = 2 C(n+-1, k-1) C(n--1, k-1) / C(n, n+) and
// P(R = 2k+1) = [C(n+-1, k) C(n--1, k-1) + C(n+-1, k-1) C(n--1, k)] / C(n, n+).

TEST(RunsTest, TwoRunsOfSixIsSystematic) {
  const fit::RunsTest t = fit::runs_test(signs_of("++++++------"));
  EXPECT_EQ(t.n, 12u);
  EXPECT_EQ(t.n_positive, 6u);
  EXPECT_EQ(t.n_negative, 6u);
  EXPECT_EQ(t.runs, 2u);
  EXPECT_NEAR(t.expected, 7.0, 1e-12);  // 2*6*6/12 + 1, by hand
  EXPECT_NEAR(t.z, -3.027650, 1e-6);    // (2 - 7)/sqrt(6*5/11), by hand
  EXPECT_TRUE(t.exact);                 // n+, n- <= 20
  EXPECT_NEAR(t.p, 2.0 / 924.0, 1e-12); // P(R = 2) = 2/C(12,6), by hand
  EXPECT_TRUE(t.tested);
  EXPECT_FALSE(t.one_sign);
  EXPECT_TRUE(t.systematic); // 0.0022 < 0.01
}

TEST(RunsTest, AlternatingSignsAreNotSystematic) {
  const fit::RunsTest t = fit::runs_test(signs_of("+-+-+-+-+-"));
  EXPECT_EQ(t.runs, 10u);
  EXPECT_NEAR(t.expected, 6.0, 1e-12); // 2*5*5/10 + 1, by hand
  EXPECT_NEAR(t.z, 2.683282, 1e-6);    // (10 - 6)/sqrt(5*4/9), by hand
  EXPECT_NEAR(t.p, 1.0, 1e-12);        // R = 10 is the largest possible, by hand
  EXPECT_TRUE(t.tested);
  EXPECT_FALSE(t.systematic);
}

TEST(RunsTest, ExactTailsOfSmallSamples) {
  // n+ = n- = 5, R = 3: P(R <= 3) = (2 + 8)/252 = 0.0397, by hand; the normal
  // approximation Phi(-2.012) = 0.022 would understate it.
  fit::RunsTest t = fit::runs_test(signs_of("++++-----+"));
  EXPECT_EQ(t.runs, 3u);
  EXPECT_NEAR(t.z, -2.012461, 1e-6); // (3 - 6)/sqrt(20/9), by hand
  EXPECT_NEAR(t.p, 10.0 / 252.0, 1e-12);
  EXPECT_FALSE(t.systematic); // 0.040 >= 0.01
  // n+ = n- = 6, R = 4: P(R <= 4) = (2 + 10 + 50)/924 = 0.0671, by hand.
  t = fit::runs_test(signs_of("+++---+++---"));
  EXPECT_EQ(t.runs, 4u);
  EXPECT_NEAR(t.p, 62.0 / 924.0, 1e-12);
  EXPECT_FALSE(t.systematic);
  // n+ = 7, n- = 3, R = 2: mu = 5.2, z = -2.618615 (normal tail 0.0044), but the
  // exact P(R = 2) = 2/C(10,3) = 1/60 = 0.0167, by hand: not systematic.
  t = fit::runs_test(signs_of("+++++++---"));
  EXPECT_NEAR(t.expected, 5.2, 1e-12);
  EXPECT_NEAR(t.z, -2.618615, 1e-6);
  EXPECT_NEAR(t.p, 1.0 / 60.0, 1e-12);
  EXPECT_FALSE(t.systematic);
}

TEST(RunsTest, NormalApproximationAboveTwentyOfASign) {
  // n+ = n- = 21 in 14 runs of 3: mu = 22, sigma^2 = 21*20/41, z = -2.499524, by
  // hand; p = Phi(z) = 0.00622 (standard normal table: Phi(-2.50) = 0.0062).
  fit::RunsTest t = fit::runs_test(signs_of(repeated("+++---", 7)));
  EXPECT_EQ(t.n, 42u);
  EXPECT_EQ(t.runs, 14u);
  EXPECT_FALSE(t.exact);
  EXPECT_NEAR(t.expected, 22.0, 1e-12);
  EXPECT_NEAR(t.z, -2.499524, 1e-6);
  EXPECT_NEAR(t.p, 0.00622, 0.00005); // normal table
  EXPECT_TRUE(t.systematic);
  // n+ = n- = 25 in 2 runs: mu = 26, z = -24/sqrt(25*24/49) = -6.858571, by hand.
  t = fit::runs_test(signs_of(repeated("+", 25) + repeated("-", 25)));
  EXPECT_NEAR(t.z, -6.858571, 1e-6);
  EXPECT_LT(t.p, 1e-10); // Phi(-6.86) = 3.5e-12 (normal tail)
  EXPECT_TRUE(t.systematic);
}

TEST(RunsTest, OneSignAndTooFewRows) {
  // One sign in 6 rows or more is systematic outright; z and p are not defined.
  fit::RunsTest t = fit::runs_test({0.1, 0.3, 0.2, 0.5, 0.4, 0.1});
  EXPECT_TRUE(t.one_sign);
  EXPECT_EQ(t.runs, 1u);
  EXPECT_TRUE(t.tested);
  EXPECT_TRUE(t.systematic);
  EXPECT_TRUE(std::isnan(t.z));
  EXPECT_TRUE(std::isnan(t.p));
  // Five rows of one sign: too few.
  t = fit::runs_test(signs_of("-----"));
  EXPECT_TRUE(t.one_sign);
  EXPECT_FALSE(t.tested);
  EXPECT_FALSE(t.systematic);
  // Both signs in 9 rows in two runs: below the 10 rows the test needs.
  t = fit::runs_test(signs_of("+++++----"));
  EXPECT_EQ(t.runs, 2u);
  EXPECT_FALSE(t.tested);
  EXPECT_FALSE(t.systematic);
  // Zeros carry no sign and are left out: "++0++0--" is "++++--".
  t = fit::runs_test({1, 1, 0, 1, 1, 0, -1, -1});
  EXPECT_EQ(t.n, 6u);
  EXPECT_EQ(t.runs, 2u);
}

namespace {

constexpr double molar_gas_constant_R = 8.31446261815324; // J/mol/K (CODATA 2018, exact)

/**
 * Debye + Sommerfeld molar heat capacity, computed independently of quantacal with
 * GSL's Debye function D_3: C = 3 R [4 D_3(x) - 3 x/(e^x - 1)] + gamma T, x = theta/T
 * (Kittel, Introduction to Solid State Physics, ch. 5, from memory).
 */
double debye_sommerfeld(double t, double theta, double gamma) {
  const double x = theta / t;
  return 3.0 * molar_gas_constant_R *
             (4.0 * gsl_sf_debye_3(x) - 3.0 * x / std::expm1(x)) +
         gamma * t;
}

/**
 * Illustrative demo data (not measurements): @p cp (J/mol/K) at 30 temperatures
 * from 5 K to 90 K (geometric), times 1 + 0.003 g with g standard normal
 * pseudo-noise from std::mt19937_64 (seed 20240607) through Box-Muller (not
 * std::normal_distribution, whose algorithm differs between standard libraries).
 * @p sigma_column > 0 adds a relative `sigma` column with that value.
 */
std::string illustrative_cp_csv(const std::function<double(double)>& cp,
                                double sigma_column = 0.0, bool reversed = false) {
  std::mt19937_64 random(20240607u);
  const auto uniform = [&] {
    return (static_cast<double>(random() >> 11) + 0.5) * 0x1p-53;
  };
  std::vector<std::string> rows;
  const int n = 30;
  for (int i = 0; i < n; ++i) {
    const double t = 5.0 * std::pow(90.0 / 5.0, double(i) / (n - 1));
    const double u1 = uniform(), u2 = uniform(); // in this order
    const double g = std::sqrt(-2.0 * std::log(u1)) * std::cos(2.0 * M_PI * u2);
    char row[96];
    std::snprintf(row, sizeof row, "%.6g,%.9g", t, cp(t) * (1.0 + 0.003 * g));
    char sigma[32];
    std::snprintf(sigma, sizeof sigma, ",%.6g", sigma_column);
    rows.push_back(std::string(row) + (sigma_column > 0.0 ? sigma : "") + "\n");
  }
  if (reversed)
    std::reverse(rows.begin(), rows.end());
  std::string csv = "# illustrative demo data\nT_K,cp_J_per_mol_K";
  csv += sigma_column > 0.0 ? ",sigma\n" : "\n";
  for (const std::string& r : rows)
    csv += r;
  return csv;
}

const std::string copper_card =
    std::string(QUANTACAL_SOURCE_DIR) + "/materials/copper.yaml";

/** Fits theta_D and gamma of materials/copper.yaml to @p csv (relative weights). */
fit::FitResult fit_copper_card(const std::string& csv) {
  const MaterialPtr start = load_card(copper_card);
  const fit::DataSet data = fit::read_data_from_string(csv, "illustrative_cp.csv");
  return fit::fit(*start, data,
                  fit::resolve_free_parameters(*start, {"theta_D", "gamma"}), {});
}

bool has_systematic_warning(const fit::FitResult& r) {
  for (const std::string& w : r.warnings)
    if (w.find("the residuals are systematic") != std::string::npos ||
        w.find("larger than the sigma column allows") != std::string::npos)
      return true;
  return false;
}

bool suggests(const fit::FitResult& r, const std::string& path) {
  for (const fit::SuggestedParameter& s : r.diagnostics.suggestions)
    if (s.path == path)
      return true;
  return false;
}

// The Debye + Sommerfeld data of the issue: theta_D 318 K, gamma 0.81 mJ/mol/K^2.
double issue_cp(double t) {
  return debye_sommerfeld(t, 318.0, 0.81e-3);
}

} // namespace

TEST(FitDiagnostics, GeneratorMeetsTheDebyeLimits) {
  // Debye T^3 law C = (12 pi^4/5) R (T/theta)^3 well below theta, Dulong-Petit 3R
  // well above (Kittel, ch. 5, from memory): the generator is right before use.
  const double low =
      12.0 * std::pow(M_PI, 4) / 5.0 * molar_gas_constant_R * std::pow(2.0 / 318.0, 3);
  EXPECT_NEAR(debye_sommerfeld(2.0, 318.0, 0.0) / low, 1.0, 1e-9);
  EXPECT_NEAR(debye_sommerfeld(30000.0, 318.0, 0.0) / (3.0 * molar_gas_constant_R), 1.0,
              1e-4);
}

TEST(FitDiagnostics, WrongFixedTermGivesSystematicResidualWarning) {
  // Fitted from the bundled copper card, whose fixed Einstein term (and Debye modes
  // 2.792) the data do not have: gamma comes out far from 0.81 with a small standard
  // error, and the residual signs say why it cannot be trusted.
  const fit::FitResult r = fit_copper_card(illustrative_cp_csv(issue_cp));
  std::printf("gamma = %.4f +- %.4f mJ/mol/K^2 (data made with 0.81)\n",
              1e3 * r.values[1], 1e3 * r.standard_errors[1]);
  EXPECT_GT(std::abs(1e3 * r.values[1] - 0.81), 3.0 * 1e3 * r.standard_errors[1]);
  ASSERT_EQ(r.diagnostics.observables.size(), 1u);
  const fit::RunsTest& t = r.diagnostics.observables[0].runs;
  std::printf("runs %zu of %zu rows, expected %.2f, z = %.3f, p = %.3g\n", t.runs, t.n,
              t.expected, t.z, t.p);
  EXPECT_EQ(r.diagnostics.observables[0].kind, fit::Observable::capacity);
  EXPECT_EQ(t.n, 30u);
  EXPECT_TRUE(t.systematic);
  EXPECT_LT(t.p, fit::runs_test_level);
  EXPECT_FALSE(r.diagnostics.chi_square_tested); // no sigma column
  ASSERT_TRUE(has_systematic_warning(r));
  const std::string& w = r.warnings.back();
  EXPECT_NE(w.find("the residuals are systematic: the c_p residuals"), std::string::npos)
      << w;
  EXPECT_NE(w.find("Wald-Wolfowitz runs test: z = "), std::string::npos) << w;
  EXPECT_NE(w.find("lacks a term or has a wrong fixed term"), std::string::npos) << w;
  EXPECT_NE(w.find("do not then measure the parameters' uncertainty"), std::string::npos)
      << w;
  // The card's Einstein term is the wrong fixed term: freeing it is suggested; the
  // freed parameters are not.
  EXPECT_TRUE(suggests(r, "phases[0].heat_capacity[1].theta_E")) << w;
  EXPECT_TRUE(suggests(r, "phases[0].heat_capacity[1].modes")) << w;
  EXPECT_FALSE(suggests(r, "heat_capacity[0].theta_D")) << w;
  EXPECT_FALSE(suggests(r, "heat_capacity[2].gamma")) << w;
  EXPECT_LE(r.diagnostics.suggestions.size(), fit::max_suggested_parameters);
  EXPECT_NE(w.find("heat_capacity[1].theta_E ("), std::string::npos) << w;
  // The report prints the test and the warning.
  const fit::DataSet data =
      fit::read_data_from_string(illustrative_cp_csv(issue_cp), "illustrative_cp.csv");
  const std::string text = fit::report(r, data);
  EXPECT_NE(text.find("residual signs, rows ordered by T"), std::string::npos) << text;
  EXPECT_NE(text.find("warning: the residuals are systematic"), std::string::npos)
      << text;
}

TEST(FitDiagnostics, RowsAreOrderedByTemperatureBeforeCounting) {
  // The same rows written from 90 K down to 5 K give the same runs.
  const fit::FitResult a = fit_copper_card(illustrative_cp_csv(issue_cp));
  const fit::FitResult b = fit_copper_card(illustrative_cp_csv(issue_cp, 0.0, true));
  ASSERT_EQ(b.diagnostics.observables.size(), 1u);
  EXPECT_EQ(a.diagnostics.observables[0].runs.runs,
            b.diagnostics.observables[0].runs.runs);
  EXPECT_TRUE(b.diagnostics.observables[0].runs.systematic);
}

namespace {
/** The card's own c_p (J/mol/K): data the fitted model can describe. */
std::function<double(double)> card_cp() {
  const MaterialPtr card = load_card(copper_card);
  return [card](double t) { return card->model().evaluate(t).capacity; };
}
} // namespace

TEST(FitDiagnostics, DataTheModelDescribesGiveNoSystematicWarning) {
  // Control: the card's own model with the same noise, the same parameters freed.
  const fit::FitResult r = fit_copper_card(illustrative_cp_csv(card_cp()));
  ASSERT_EQ(r.diagnostics.observables.size(), 1u);
  const fit::RunsTest& t = r.diagnostics.observables[0].runs;
  std::printf("control: gamma = %.4f +- %.4f mJ/mol/K^2, runs %zu of %zu rows, expected "
              "%.2f, z = %.3f, p = %.3g\n",
              1e3 * r.values[1], 1e3 * r.standard_errors[1], t.runs, t.n, t.expected, t.z,
              t.p);
  EXPECT_TRUE(t.tested);
  EXPECT_FALSE(t.systematic);
  EXPECT_FALSE(r.diagnostics.flagged());
  EXPECT_TRUE(r.diagnostics.suggestions.empty());
  EXPECT_FALSE(has_systematic_warning(r));
  // gamma recovered: the card's 0.691 mJ/mol/K^2 within two standard errors.
  EXPECT_LT(std::abs(r.values[1] - 0.691e-3), 2.0 * r.standard_errors[1]);
  // The only warning left is the gamma-share one (5 K: electrons below 40 % of c_p).
  for (const std::string& w : r.warnings)
    EXPECT_NE(w.find("heat_capacity[2].gamma is poorly determined"), std::string::npos)
        << w;
}

namespace {
/**
 * Upper tail of the chi-square distribution for an even number of degrees of
 * freedom nu: Q = exp(-x/2) sum_{j < nu/2} (x/2)^j / j! (Abramowitz and Stegun,
 * section 26.4, from memory), independent of GSL.
 */
double chi_square_upper_tail_even(double x, unsigned nu) {
  double term = 1.0, sum = 0.0;
  for (unsigned j = 0; j < nu / 2; ++j) {
    sum += term;
    term *= 0.5 * x / (j + 1);
  }
  return std::exp(-0.5 * x) * sum;
}
} // namespace

TEST(FitDiagnostics, ChiSquareFlagsSigmasThatAreTooSmall) {
  // Control data with a sigma column: 0.003 is the noise the data were made with
  // (illustrative); 0.0006 is five times too small.
  const fit::FitResult right = fit_copper_card(illustrative_cp_csv(card_cp(), 0.003));
  const fit::FitResult small = fit_copper_card(illustrative_cp_csv(card_cp(), 0.0006));
  std::printf(
      "reduced chi-square %.3f (p %.3g) with the right sigmas, %.3f (p %.3g) with "
      "sigmas 5 times too small\n",
      right.reduced_chi_square, right.diagnostics.chi_square_p, small.reduced_chi_square,
      small.diagnostics.chi_square_p);
  ASSERT_EQ(right.degrees_of_freedom, 28u);
  ASSERT_TRUE(right.diagnostics.chi_square_tested);
  EXPECT_NEAR(right.diagnostics.chi_square_p,
              chi_square_upper_tail_even(right.chi_square, 28),
              1e-10); // Abramowitz and Stegun 26.4
  EXPECT_NEAR(small.diagnostics.chi_square_p,
              chi_square_upper_tail_even(small.chi_square, 28), 1e-10);
  EXPECT_FALSE(right.diagnostics.chi_square_flagged);
  EXPECT_FALSE(right.diagnostics.flagged());
  EXPECT_FALSE(has_systematic_warning(right));

  EXPECT_TRUE(small.diagnostics.chi_square_flagged);
  EXPECT_LT(small.diagnostics.chi_square_p, fit::chi_square_level);
  EXPECT_FALSE(small.diagnostics.systematic()); // the signs are those of the control
  ASSERT_TRUE(has_systematic_warning(small));
  const std::string& w = small.warnings.back();
  EXPECT_NE(w.find("the residuals are larger than the sigma column allows: chi-square"),
            std::string::npos)
      << w;
  EXPECT_NE(w.find("the sigmas may be too small"), std::string::npos) << w;
  EXPECT_NE(w.find("do not then measure the parameters' uncertainty"), std::string::npos)
      << w;
}
