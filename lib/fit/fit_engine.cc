// SPDX-License-Identifier: Apache-2.0
// `quantacal fit`: the GSL nonlinear least-squares fit of free card parameters.
#include "fit_detail.h"
#include <quantacal/fit/fit.h>

#include <quantacal/common/exceptions.h>

#include <gsl/gsl_blas.h>
#include <gsl/gsl_errno.h>
#include <gsl/gsl_matrix.h>
#include <gsl/gsl_multifit_nlinear.h>
#include <gsl/gsl_vector.h>

#include <algorithm>
#include <cmath>
#include <memory>
#include <sstream>

namespace quantacal::fit {

double detail::model_value(const ModelState& s, const DataPoint& p, double molar_mass) {
  switch (p.kind) {
  case Observable::capacity: {
    const double c = s.model->evaluate(p.temperature).capacity;
    return p.per_mass ? c / molar_mass : c;
  }
  case Observable::energy_increment: {
    const double hi = s.model->evaluate(p.temperature).energy;
    const double lo =
        p.from_temperature > 0.0 ? s.model->evaluate(p.from_temperature).energy : 0.0;
    return p.per_mass ? (hi - lo) / molar_mass : hi - lo;
  }
  case Observable::conductivity:
    return s.conductivity->evaluate(p.temperature).value;
  }
  return 0.0;
}

namespace {

using detail::model_value;
using detail::ModelState;
using VectorPtr = std::unique_ptr<gsl_vector, decltype(&gsl_vector_free)>;

struct Problem {
  const Material* start = nullptr;
  const std::vector<FreeParameter>* parameters = nullptr;
  std::vector<DataPoint> points;
  Weighting weighting = Weighting::relative;
  bool has_sigma = false;
  std::vector<bool> logarithmic; // per parameter: p = p0 e^q, else p = p0 + q
  std::string last_error;

  std::vector<double> values(const gsl_vector* q) const {
    std::vector<double> v(parameters->size());
    for (std::size_t j = 0; j < v.size(); ++j) {
      const double p0 = (*parameters)[j].start;
      const double qj = gsl_vector_get(q, j);
      v[j] = logarithmic[j] ? p0 * std::exp(qj) : p0 + qj;
    }
    return v;
  }

  double scale(const DataPoint& p) const {
    const double s = has_sigma ? p.sigma : 1.0;
    return weighting == Weighting::relative ? std::abs(p.value) * s : s;
  }
};

int residual_function(const gsl_vector* q, void* data, gsl_vector* f) {
  auto* problem = static_cast<Problem*>(data);
  try {
    const ModelState s =
        detail::apply(*problem->start, *problem->parameters, problem->values(q));
    for (std::size_t i = 0; i < problem->points.size(); ++i) {
      const DataPoint& p = problem->points[i];
      const double m = model_value(s, p, problem->start->molar_mass());
      const double r = (m - p.value) / problem->scale(p);
      if (!std::isfinite(r)) {
        problem->last_error =
            "non-finite model value at T = " + format_double(p.temperature) + " K";
        return GSL_EDOM;
      }
      gsl_vector_set(f, i, r);
    }
  } catch (const std::exception& e) {
    problem->last_error = e.what();
    return GSL_EDOM;
  }
  return GSL_SUCCESS;
}

std::vector<double> start_values(const std::vector<FreeParameter>& parameters) {
  std::vector<double> v;
  for (const auto& f : parameters)
    v.push_back(f.start);
  return v;
}

/** Enough rows, and a freed conductivity only where the card's is `metal`. */
void check_rows_and_parameters(const Material& start, const DataSet& data,
                               const std::vector<FreeParameter>& parameters,
                               const FitOptions& options, std::size_t n) {
  const std::size_t m = parameters.size();
  if (n <= m)
    throw InputError(
        data.file, 0, 0, "", "",
        std::to_string(n) + " data row" + (n == 1 ? "" : "s") +
            (options.from > 0.0 || options.to > 0.0 ? " in the selected temperature range"
                                                    : "") +
            " for " + std::to_string(m) + " free parameter" + (m == 1 ? "" : "s") +
            ": a fit needs more rows than free parameters");
  for (const auto& f : parameters)
    if (f.conductivity &&
        !std::dynamic_pointer_cast<const MetalConductivity>(start.data().conductivity))
      throw InputError::argument("--free " + f.path, "", "",
                                 "the card's conductivity is not of kind 'metal'");
}

/** Every row must be inside the valid range and the domain of the start model. */
void check_domain(const Material& start, const DataSet& data,
                  const std::vector<FreeParameter>& parameters,
                  const std::vector<DataPoint>& points) {
  const ModelState s = detail::apply(start, parameters, start_values(parameters));
  for (const DataPoint& p : points) {
    const auto at_row = [&](const std::exception& e) {
      return InputError(data.file, p.line, 1, "T_K", format_double(p.temperature),
                        std::string("the start card cannot be evaluated here: ") +
                            e.what());
    };
    try {
      // Rows outside the card's valid_range would fit a model the card does not
      // stand behind (and its table cannot serve): widen the range instead.
      start.check_temperature(p.temperature, "the card's valid_range");
      if (p.kind == Observable::energy_increment && p.from_temperature > 0.0)
        start.check_temperature(p.from_temperature, "the card's valid_range");
      (void)model_value(s, p, start.molar_mass());
    } catch (const InputError& e) {
      if (!e.file().empty())
        throw; // already located
      throw at_row(e);
    } catch (const std::exception& e) {
      throw at_row(e);
    }
  }
}

/** The selected rows of @p data and the checked problem of fitting them. */
void set_up(Problem& problem, const Material& start, const DataSet& data,
            const std::vector<FreeParameter>& parameters, const FitOptions& options) {
  problem.start = &start;
  problem.parameters = &parameters;
  problem.weighting = options.weighting;
  problem.has_sigma = data.has_sigma;
  for (const DataPoint& p : data.points) {
    if (options.from > 0.0 && p.temperature < options.from)
      continue;
    if (options.to > 0.0 && p.temperature > options.to)
      continue;
    problem.points.push_back(p);
  }
  check_rows_and_parameters(start, data, parameters, options, problem.points.size());
  check_domain(start, data, parameters, problem.points);
  for (const auto& f : parameters)
    problem.logarithmic.push_back(f.start > 0.0);
}

/** The start card evaluates on every row, and each parameter moves some residual. */
void check_determinable(Problem& problem) {
  const std::vector<FreeParameter>& parameters = *problem.parameters;
  const std::size_t n = problem.points.size(), m = parameters.size();
  bool any_k = false;
  for (const DataPoint& p : problem.points)
    any_k = any_k || p.kind == Observable::conductivity;
  const VectorPtr q0(gsl_vector_calloc(m), gsl_vector_free);
  const VectorPtr f0(gsl_vector_alloc(n), gsl_vector_free);
  const VectorPtr f1(gsl_vector_alloc(n), gsl_vector_free);
  if (residual_function(q0.get(), &problem, f0.get()) != GSL_SUCCESS)
    throw NumericalError("quantacal::fit::fit",
                         "the start card cannot be evaluated: " + problem.last_error);
  for (std::size_t j = 0; j < m; ++j) {
    const double h = 1e-6;
    gsl_vector_set(q0.get(), j, h);
    const int status = residual_function(q0.get(), &problem, f1.get());
    gsl_vector_set(q0.get(), j, 0.0);
    double change = 0.0;
    if (status == GSL_SUCCESS)
      for (std::size_t i = 0; i < n; ++i)
        change = std::max(
            change, std::abs(gsl_vector_get(f1.get(), i) - gsl_vector_get(f0.get(), i)));
    if (status == GSL_SUCCESS && change == 0.0)
      throw InputError::argument(
          "--free " + parameters[j].path, "", "",
          std::string("this parameter changes none of the selected data rows") +
              (parameters[j].conductivity && !any_k ? " (it needs k_W_per_m_K rows)"
                                                    : "") +
              ", so the data cannot determine it");
  }
}

/** Why the driver stopped, as the message of the NumericalError. */
std::string not_converged(int status, std::size_t iterations, const FitOptions& options,
                          const std::string& last_error) {
  std::string why = status == GSL_EMAXITER
                        ? "no convergence after " + std::to_string(iterations) +
                              " iterations (--max-iterations " +
                              std::to_string(options.max_iterations) + ")"
                        : std::string("the solver stopped (") + gsl_strerror(status) +
                              ") after " + std::to_string(iterations) + " iterations";
  if (status == GSL_EDOM && !last_error.empty())
    why += ": the model could not be evaluated: " + last_error;
  return "the fit did not converge: " + why +
         "; try other start values in the card, fewer free parameters or a narrower "
         "range";
}

/** Fitted values, covariance (SI), correlation and chi-square from the solver's end. */
void fill_statistics(FitResult& r, const Problem& problem, const gsl_vector* q,
                     const gsl_matrix* cq, double chi2, bool scaled) {
  const std::size_t n = problem.points.size(), m = problem.parameters->size();
  r.values = problem.values(q);
  r.chi_square = chi2;
  r.degrees_of_freedom = n - m;
  r.reduced_chi_square = chi2 / static_cast<double>(n - m);
  r.covariance_scaled = scaled;
  const double factor = r.covariance_scaled ? r.reduced_chi_square : 1.0;
  std::vector<double> d(m); // dp/dq
  for (std::size_t j = 0; j < m; ++j)
    d[j] = problem.logarithmic[j] ? r.values[j] : 1.0;
  r.covariance.assign(m, std::vector<double>(m));
  r.correlation.assign(m, std::vector<double>(m));
  for (std::size_t a = 0; a < m; ++a)
    for (std::size_t b = 0; b < m; ++b)
      r.covariance[a][b] = factor * d[a] * d[b] * gsl_matrix_get(cq, a, b);
  for (std::size_t a = 0; a < m; ++a)
    r.standard_errors.push_back(std::sqrt(std::max(0.0, r.covariance[a][a])));
  for (std::size_t a = 0; a < m; ++a)
    for (std::size_t b = 0; b < m; ++b) {
      const double den = r.standard_errors[a] * r.standard_errors[b];
      r.correlation[a][b] = den > 0.0 ? r.covariance[a][b] / den : (a == b ? 1.0 : 0.0);
    }
}

/**
 * Runs the trust-region solver from the start values; fills the statistics of @p r
 * and returns the weighted residuals at the solution.
 */
std::vector<double> solve(Problem& problem, const FitOptions& options, bool has_sigma,
                          FitResult& r) {
  const std::size_t n = problem.points.size(), m = problem.parameters->size();
  gsl_multifit_nlinear_fdf fdf;
  fdf.f = residual_function;
  fdf.df = nullptr; // finite-difference Jacobian
  fdf.fvv = nullptr;
  fdf.n = n;
  fdf.p = m;
  fdf.params = &problem;
  gsl_multifit_nlinear_parameters fdf_parameters =
      gsl_multifit_nlinear_default_parameters();
  fdf_parameters.trs = gsl_multifit_nlinear_trs_lm;
  fdf_parameters.scale = gsl_multifit_nlinear_scale_more;
  fdf_parameters.fdtype = GSL_MULTIFIT_NLINEAR_CTRDIFF;
  const std::unique_ptr<gsl_multifit_nlinear_workspace,
                        decltype(&gsl_multifit_nlinear_free)>
      w(gsl_multifit_nlinear_alloc(gsl_multifit_nlinear_trust, &fdf_parameters, n, m),
        gsl_multifit_nlinear_free);
  const VectorPtr q0(gsl_vector_calloc(m), gsl_vector_free);
  if (gsl_multifit_nlinear_init(q0.get(), &fdf, w.get()) != GSL_SUCCESS)
    throw NumericalError("quantacal::fit::fit",
                         "cannot start the fit: " + problem.last_error);
  int info = 0;
  const int status =
      gsl_multifit_nlinear_driver(options.max_iterations, options.xtol, options.gtol, 0.0,
                                  nullptr, nullptr, &info, w.get());
  r.iterations = gsl_multifit_nlinear_niter(w.get());
  if (status != GSL_SUCCESS)
    throw NumericalError("quantacal fit", not_converged(status, r.iterations, options,
                                                        problem.last_error));
  const std::unique_ptr<gsl_matrix, decltype(&gsl_matrix_free)> cq(gsl_matrix_alloc(m, m),
                                                                   gsl_matrix_free);
  gsl_multifit_nlinear_covar(gsl_multifit_nlinear_jac(w.get()), 0.0, cq.get());
  const gsl_vector* f = gsl_multifit_nlinear_residual(w.get());
  double chi2 = 0.0;
  gsl_blas_ddot(f, f, &chi2);
  fill_statistics(r, problem, gsl_multifit_nlinear_position(w.get()), cq.get(), chi2,
                  !has_sigma);
  std::vector<double> weighted(n);
  for (std::size_t i = 0; i < n; ++i)
    weighted[i] = gsl_vector_get(f, i);
  return weighted;
}

/** The residual table, its statistics and the temperature range of the rows. */
void add_residual_rows(FitResult& r, const Problem& problem, const ModelState& s,
                       const std::vector<double>& weighted) {
  const std::size_t n = problem.points.size();
  double sum2 = 0.0;
  r.from = problem.points.front().temperature;
  r.to = r.from;
  for (std::size_t i = 0; i < n; ++i) {
    const DataPoint& p = problem.points[i];
    ResidualRow row;
    row.point = p;
    row.model = model_value(s, p, problem.start->molar_mass());
    row.residual = row.model - p.value;
    row.relative = row.residual / p.value;
    row.weighted = weighted[i];
    sum2 += row.relative * row.relative;
    r.max_relative = std::max(r.max_relative, std::abs(row.relative));
    r.from = std::min({r.from, p.temperature,
                       p.kind == Observable::energy_increment && p.from_temperature > 0.0
                           ? p.from_temperature
                           : p.temperature});
    r.to = std::max(r.to, p.temperature);
    r.residuals.push_back(row);
  }
  r.rms_relative = std::sqrt(sum2 / static_cast<double>(n));
}

/**
 * A freed electronic gamma is set by the lowest capacity rows; where the
 * electrons carry only a small share of c_p there, a lattice-shape error of a
 * few per cent (Debye and Einstein terms miss the dispersion of real phonons)
 * moves gamma by tens of per cent while the standard error stays small.
 */
void add_gamma_warnings(FitResult& r, const std::vector<DataPoint>& points) {
  double t_low = 0.0;
  for (const DataPoint& p : points)
    if (p.kind == Observable::capacity && (t_low == 0.0 || p.temperature < t_low))
      t_low = p.temperature;
  if (t_low == 0.0)
    return;
  for (std::size_t j = 0; j < r.parameters.size(); ++j) {
    const FreeParameter& f = r.parameters[j];
    if (f.conductivity || f.name != "gamma")
      continue;
    const double c = r.material->thermal(t_low, Basis::mole).capacity;
    const double share = c > 0.0 ? r.values[j] * t_low / c : 0.0;
    if (share >= gamma_share_threshold)
      continue;
    std::ostringstream w;
    w.precision(3);
    w << f.path << " is poorly determined by these data: at the lowest c_p row (" << t_low
      << " K) the electrons carry only " << 100.0 * share
      << " % of c_p, so a lattice-shape error of 1 % there moves gamma by about "
      << (1.0 - share) / std::max(share, 1e-6) << " %, more than its standard error "
      << "suggests. Add rows at lower temperature (electrons carrying at least "
      << 100.0 * gamma_share_threshold
      << " % of c_p) or fix gamma at a published value; see docs/fitting.md.";
    r.warnings.push_back(w.str());
  }
}
} // namespace

FitResult fit(const Material& start, const DataSet& data,
              const std::vector<FreeParameter>& parameters, const FitOptions& options) {
  Problem problem;
  set_up(problem, start, data, parameters, options);
  gsl_set_error_handler_off();
  check_determinable(problem);

  FitResult r;
  r.parameters = parameters;
  const std::vector<double> weighted = solve(problem, options, data.has_sigma, r);
  const ModelState s = detail::apply(start, parameters, r.values);
  add_residual_rows(r, problem, s, weighted);

  MaterialData md = start.data();
  md.model = s.model;
  md.conductivity = s.conductivity;
  // The fitted material carries its own record (a start card's earlier one no longer
  // applies), so fit::band works on it as on the fitted card once written and loaded.
  md.fit = FitRecord{};
  for (const FreeParameter& f : parameters)
    md.fit->parameters.push_back(f.path);
  md.fit->covariance = r.covariance;
  try {
    r.material = std::make_shared<const Material>(std::move(md));
  } catch (const InputError& e) {
    throw NumericalError("quantacal fit",
                         std::string("the fitted card is not valid: ") + e.what());
  }
  add_gamma_warnings(r, problem.points);
  detail::add_diagnostics(r, data.has_sigma);
  return r;
}

} // namespace quantacal::fit
