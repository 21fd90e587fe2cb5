// SPDX-License-Identifier: Apache-2.0
// `quantacal fit`: does the model describe the data? The Wald-Wolfowitz runs test
// on the residual signs of each observable, the chi-square check against the sigma
// column, and the parameters of the start card that could be freed when they flag.
#include "fit_detail.h"
#include <quantacal/fit/fit.h>

#include <gsl/gsl_cdf.h>

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <limits>
#include <optional>
#include <string>
#include <vector>

namespace quantacal::fit {
namespace {

/** ln C(a, b) for 0 <= b <= a. */
double log_choose(double a, double b) {
  return std::lgamma(a + 1.0) - std::lgamma(b + 1.0) - std::lgamma(a - b + 1.0);
}

/** C(a, b) C(c, d) / C(n1 + n2, n1), zero where a binomial is zero. */
double binomial_ratio(long a, long b, long c, long d, double log_total) {
  if (b < 0 || b > a || d < 0 || d > c)
    return 0.0;
  return std::exp(log_choose(a, b) + log_choose(c, d) - log_total);
}

/**
 * P(R = r) for random signs with n1 of one sign and n2 of the other (both >= 1):
 * P(R = 2k) = 2 C(n1-1, k-1) C(n2-1, k-1) / C(n, n1),
 * P(R = 2k+1) = [C(n1-1, k) C(n2-1, k-1) + C(n1-1, k-1) C(n2-1, k)] / C(n, n1)
 * (the distribution of runs, Wald and Wolfowitz 1940; Swed and Eisenhart 1943).
 */
double runs_probability(std::size_t r, std::size_t n1, std::size_t n2) {
  if (r < 2)
    return 0.0;
  const double log_total =
      log_choose(static_cast<double>(n1 + n2), static_cast<double>(n1));
  const long a = static_cast<long>(n1) - 1, c = static_cast<long>(n2) - 1;
  if (r % 2 == 0) {
    const long k = static_cast<long>(r / 2);
    return 2.0 * binomial_ratio(a, k - 1, c, k - 1, log_total);
  }
  const long k = static_cast<long>((r - 1) / 2);
  return binomial_ratio(a, k, c, k - 1, log_total) +
         binomial_ratio(a, k - 1, c, k, log_total);
}

/** Largest n+ and n- for which the exact distribution is used: the range of the
 * tables of Swed and Eisenhart (1943); above it the normal approximation is the
 * usual choice (common practice). */
constexpr std::size_t exact_runs_limit = 20;

std::string figure(double v, int digits = 3) {
  char buffer[64];
  std::snprintf(buffer, sizeof buffer, "%.*g", digits, v);
  return buffer;
}

/** "= 0.012", or "< 1e-300" for a probability that underflows. */
std::string probability(double p) {
  return p < 1e-300 ? "< 1e-300" : "= " + figure(p, 2);
}

/** Indices of the rows of @p kind, ordered by T (then T_from). */
std::vector<std::size_t> rows_by_temperature(const std::vector<ResidualRow>& rows,
                                             Observable kind) {
  std::vector<std::size_t> index;
  for (std::size_t i = 0; i < rows.size(); ++i)
    if (rows[i].point.kind == kind)
      index.push_back(i);
  std::stable_sort(index.begin(), index.end(), [&](std::size_t a, std::size_t b) {
    const DataPoint &p = rows[a].point, &q = rows[b].point;
    return p.temperature != q.temperature ? p.temperature < q.temperature
                                          : p.from_temperature < q.from_temperature;
  });
  return index;
}

/** The runs test of each kind of row present, rows ordered by temperature. */
std::vector<ObservableDiagnostics>
runs_per_observable(const std::vector<ResidualRow>& rows) {
  std::vector<ObservableDiagnostics> out;
  for (Observable kind :
       {Observable::capacity, Observable::energy_increment, Observable::conductivity}) {
    const std::vector<std::size_t> index = rows_by_temperature(rows, kind);
    if (index.empty())
      continue;
    std::vector<double> residuals;
    for (std::size_t i : index)
      residuals.push_back(rows[i].residual);
    out.push_back({kind, runs_test(residuals)});
  }
  return out;
}

/** The residual rows the diagnostics flag: those of a systematic observable, all
 * rows when chi-square is too large. */
std::vector<const ResidualRow*> flagged_rows(const FitResult& r) {
  std::vector<const ResidualRow*> rows;
  for (const ResidualRow& row : r.residuals) {
    bool flagged = r.diagnostics.chi_square_flagged;
    for (const ObservableDiagnostics& o : r.diagnostics.observables)
      flagged = flagged || (o.kind == row.point.kind && o.runs.systematic);
    if (flagged)
      rows.push_back(&row);
  }
  return rows;
}

/** Model values of @p rows with @p parameter of @p material set to @p value;
 * nullopt if the model refuses the value. */
std::optional<std::vector<double>>
values_with(const Material& material, const FreeParameter& parameter, double value,
            const std::vector<const ResidualRow*>& rows) {
  try {
    const detail::ModelState s = detail::apply(material, {parameter}, {value});
    std::vector<double> out;
    for (const ResidualRow* row : rows) {
      out.push_back(detail::model_value(s, row->point, material.molar_mass()));
      if (!std::isfinite(out.back()))
        return std::nullopt;
    }
    return out;
  } catch (const std::exception&) { // a value outside the parameter's domain
    return std::nullopt;
  }
}

/**
 * max over @p rows of |d ln(model) / d ln(parameter)| at the fitted values: a
 * central difference with relative step 1e-4, one-sided where the model refuses
 * one side (a mole fraction of 1 cannot grow); 0 if it refuses both.
 */
double sensitivity(const Material& material, const FreeParameter& parameter,
                   const std::vector<const ResidualRow*>& rows) {
  const double h = 1e-4, v = parameter.start;
  std::optional<std::vector<double>> up =
      values_with(material, parameter, v * (1 + h), rows);
  std::optional<std::vector<double>> down =
      values_with(material, parameter, v * (1 - h), rows);
  if (!up && !down)
    return 0.0;
  std::vector<double> fitted;
  for (const ResidualRow* row : rows)
    fitted.push_back(row->model);
  const double step = up && down ? 2.0 * h : h;
  const std::vector<double>& hi = up ? *up : fitted;
  const std::vector<double>& lo = down ? *down : fitted;
  double s = 0.0;
  for (std::size_t i = 0; i < rows.size(); ++i)
    if (fitted[i] != 0.0)
      s = std::max(s, std::abs(hi[i] - lo[i]) / (step * std::abs(fitted[i])));
  return s;
}

/** A derivative below this (a 1 % change of the parameter moving no flagged row by
 * 0.001 %) is negligible: the parameter cannot shape these rows. */
constexpr double negligible_sensitivity = 1e-3;

/**
 * The parameters of the fitted material not freed, non-zero (a parameter at 0
 * switches a term off and its derivative has no scale), whose derivative on the
 * flagged rows is not negligible; most sensitive first, at most
 * max_suggested_parameters.
 */
std::vector<SuggestedParameter> suggest_parameters(const FitResult& r) {
  const std::vector<const ResidualRow*> rows = flagged_rows(r);
  std::vector<SuggestedParameter> out;
  for (const FreeParameter& candidate :
       detail::free_parameters(card_parameters(*r.material))) {
    const bool freed =
        std::any_of(r.parameters.begin(), r.parameters.end(),
                    [&](const FreeParameter& f) { return f.path == candidate.path; });
    if (freed || candidate.start == 0.0)
      continue;
    const double s = sensitivity(*r.material, candidate, rows);
    if (s >= negligible_sensitivity)
      out.push_back({candidate.path, s});
  }
  std::stable_sort(out.begin(), out.end(),
                   [](const SuggestedParameter& a, const SuggestedParameter& b) {
                     return a.sensitivity > b.sensitivity;
                   });
  if (out.size() > max_suggested_parameters)
    out.resize(max_suggested_parameters);
  return out;
}

/** The figures of one systematic observable, for the warning. */
std::string runs_figures(const ObservableDiagnostics& o) {
  const RunsTest& t = o.runs;
  const std::string label = detail::observable_label(o.kind);
  if (t.one_sign)
    return "all " + std::to_string(t.n) + " " + label +
           " residuals have the same sign (the model is " +
           (t.n_positive > 0 ? "above" : "below") + " the data at every row)";
  return "the " + label + " residuals, ordered by temperature, form " +
         std::to_string(t.runs) + " runs of one sign in " + std::to_string(t.n) +
         " rows where " + figure(t.expected) +
         " are expected for random signs (Wald-Wolfowitz runs test: z = " + figure(t.z) +
         ", one-sided p " + probability(t.p) + " < " + figure(runs_test_level) + ", " +
         (t.exact ? "exact" : "normal approximation") + ")";
}

/** The chi-square figures, for the warning. */
std::string chi_square_figures(const FitResult& r) {
  return "chi-square " + figure(r.chi_square, 4) + " on " +
         std::to_string(r.degrees_of_freedom) + " degrees of freedom (reduced " +
         figure(r.reduced_chi_square) +
         ") is too large for the sigma column: upper-tail probability Q " +
         probability(r.diagnostics.chi_square_p) + " < " + figure(chi_square_level);
}

/** What to free, for the warning. */
std::string suggestion_text(const std::vector<SuggestedParameter>& suggestions) {
  if (suggestions.empty())
    return "Every non-zero numeric parameter of the start card that moves these rows "
           "is already free: the model needs a term the card does not have.";
  std::string list;
  for (const SuggestedParameter& s : suggestions)
    list += (list.empty() ? "" : ", ") + s.path + " (" + figure(s.sensitivity, 2) + ")";
  return "Parameters of the start card that move these rows and could be freed with "
         "--free (in brackets: largest d ln(model)/d ln(parameter) on them): " +
         list + ".";
}

/** The warning of flagged diagnostics. */
std::string warning_text(const FitResult& r) {
  const FitDiagnostics& d = r.diagnostics;
  std::string figures;
  for (const ObservableDiagnostics& o : d.observables)
    if (o.runs.systematic)
      figures += (figures.empty() ? "" : "; ") + runs_figures(o);
  std::string text;
  if (d.systematic()) {
    if (d.chi_square_flagged)
      figures += "; " + chi_square_figures(r);
    text = "the residuals are systematic: " + figures +
           ". The model lacks a term or has a wrong fixed term";
  } else {
    text = "the residuals are larger than the sigma column allows: " +
           chi_square_figures(r) +
           ". Their signs pass the runs test, so the sigmas may be too small; "
           "otherwise the model lacks a term or has a wrong fixed term";
  }
  return text +
         ", and the standard errors and covariance above, computed as if the model "
         "were exact and the weights right, do not then measure the parameters' "
         "uncertainty. " +
         suggestion_text(d.suggestions) +
         " See docs/fitting.md, \"Systematic residuals\".";
}

/** One line of the report for one observable's runs test. */
std::string runs_line(const ObservableDiagnostics& o) {
  const RunsTest& t = o.runs;
  std::string line = std::string("  ") + detail::observable_label(o.kind) + ": ";
  if (t.one_sign)
    return line + "all " + std::to_string(t.n) + " residuals " +
           (t.n_positive > 0 ? "positive" : "negative") +
           (t.systematic ? ": systematic\n"
                         : ", too few rows to test (one sign counts from " +
                               std::to_string(one_sign_min_rows) + " rows)\n");
  line += std::to_string(t.runs) + " runs in " + std::to_string(t.n) + " rows";
  if (!t.tested)
    return line + ", too few rows to test (from " + std::to_string(runs_test_min_rows) +
           " rows with both signs)\n";
  return line + ", " + figure(t.expected) + " expected, z = " + figure(t.z) + ", p " +
         probability(t.p) + " (" + (t.exact ? "exact" : "normal approximation") + ")" +
         (t.systematic ? ": systematic\n" : "\n");
}

} // namespace

const char* detail::observable_label(Observable kind) {
  switch (kind) {
  case Observable::capacity:
    return "c_p";
  case Observable::energy_increment:
    return "energy-increment";
  case Observable::conductivity:
    return "k";
  }
  return "";
}

std::string detail::diagnostics_report(const FitResult& r) {
  const FitDiagnostics& d = r.diagnostics;
  std::string o = "residual signs, rows ordered by T (Wald-Wolfowitz runs test, "
                  "systematic at one-sided p < " +
                  figure(runs_test_level) + "):\n";
  for (const ObservableDiagnostics& obs : d.observables)
    o += runs_line(obs);
  if (d.chi_square_tested)
    o += "chi-square upper-tail probability Q " + probability(d.chi_square_p) +
         (d.chi_square_flagged ? " < " + figure(chi_square_level) +
                                     ": residuals larger than the sigma column allows\n"
                               : " (flagged below " + figure(chi_square_level) + ")\n");
  return o;
}

RunsTest runs_test(const std::vector<double>& residuals) {
  RunsTest t;
  int previous = 0;
  for (double r : residuals) {
    const int sign = r > 0.0 ? 1 : (r < 0.0 ? -1 : 0);
    if (sign == 0)
      continue; // no sign: left out
    ++t.n;
    (sign > 0 ? t.n_positive : t.n_negative) += 1;
    if (sign != previous)
      ++t.runs;
    previous = sign;
  }
  const double n = static_cast<double>(t.n);
  const double n1 = static_cast<double>(t.n_positive),
               n2 = static_cast<double>(t.n_negative);
  t.one_sign = t.n > 0 && (t.n_positive == 0 || t.n_negative == 0);
  if (t.n == 0 || t.one_sign) {
    t.expected = t.n > 0 ? 1.0 : 0.0;
    t.z = t.p = std::numeric_limits<double>::quiet_NaN();
    t.tested = t.one_sign && t.n >= one_sign_min_rows;
    t.systematic = t.tested;
    return t;
  }
  t.expected = 2.0 * n1 * n2 / n + 1.0;
  const double variance = (t.expected - 1.0) * (t.expected - 2.0) / (n - 1.0);
  t.z = variance > 0.0 ? (static_cast<double>(t.runs) - t.expected) / std::sqrt(variance)
                       : 0.0;
  t.exact = t.n_positive <= exact_runs_limit && t.n_negative <= exact_runs_limit;
  if (t.exact) {
    double p = 0.0;
    for (std::size_t r = 2; r <= t.runs; ++r)
      p += runs_probability(r, t.n_positive, t.n_negative);
    t.p = std::min(1.0, p);
  } else {
    t.p = 0.5 * std::erfc(-t.z / std::sqrt(2.0));
  }
  t.tested = t.n >= runs_test_min_rows;
  t.systematic = t.tested && t.p < runs_test_level;
  return t;
}

void detail::add_diagnostics(FitResult& r, bool has_sigma) {
  FitDiagnostics& d = r.diagnostics;
  d.observables = runs_per_observable(r.residuals);
  d.chi_square_tested = has_sigma && r.degrees_of_freedom > 0;
  if (d.chi_square_tested) {
    d.chi_square_p =
        gsl_cdf_chisq_Q(r.chi_square, static_cast<double>(r.degrees_of_freedom));
    d.chi_square_flagged = d.chi_square_p < chi_square_level;
  }
  if (!d.flagged())
    return;
  d.suggestions = suggest_parameters(r);
  r.warnings.push_back(warning_text(r));
}

} // namespace quantacal::fit
