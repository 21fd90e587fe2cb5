// SPDX-License-Identifier: Apache-2.0
// `quantacal fit`: what the fitted card changes in the start card, and the report.
#include "fit_detail.h"
#include <quantacal/fit/fit.h>

#include <quantacal/common/format.h>

#include <cmath>
#include <cstdio>
#include <iomanip>
#include <sstream>

namespace quantacal::fit {
namespace {

std::string number(double v, int digits = 7) {
  char buffer[64];
  std::snprintf(buffer, sizeof buffer, "%.*g", digits, v);
  return buffer;
}

FitRecordEntry fit_record(const FitResult& result, const DataSet& data,
                          Weighting weighting) {
  FitRecordEntry e;
  e.data_file = data.file;
  e.data_sha256 = data.sha256;
  e.from = result.from;
  e.to = result.to;
  e.n_points = result.residuals.size();
  e.relative_weights = weighting == Weighting::relative;
  e.covariance_scaled = result.covariance_scaled;
  e.iterations = result.iterations;
  e.chi_square = result.chi_square;
  e.degrees_of_freedom = result.degrees_of_freedom;
  e.reduced_chi_square = result.reduced_chi_square;
  e.rms_relative_residual = result.rms_relative;
  e.max_relative_residual = result.max_relative;
  for (std::size_t j = 0; j < result.parameters.size(); ++j) {
    const FreeParameter& f = result.parameters[j];
    e.parameters.push_back(
        {f.path, f.unit, result.values[j], result.standard_errors[j], f.start});
  }
  e.covariance = result.covariance;
  return e;
}

} // namespace

CardChanges fitted_card_changes(const FitResult& result, const DataSet& data,
                                Weighting weighting) {
  CardChanges changes;
  for (std::size_t j = 0; j < result.parameters.size(); ++j) {
    const FreeParameter& f = result.parameters[j];
    const CardParameter parameter{f.path, f.conductivity, f.index,
                                  f.name, f.unit,         f.start};
    changes.values.push_back({parameter, result.values[j]});
    changes.sources.push_back({f.path, "fitted by quantacal fit to " + data.file +
                                           " (sha256 " + data.sha256.substr(0, 16) +
                                           "...; see the fit record); start value " +
                                           card_quantity_text(f.start, f.unit)});
  }
  changes.fit = fit_record(result, data, weighting);
  return changes;
}

std::string fitted_card(const std::string& start_text, const std::string& start_file,
                        const FitResult& result, const DataSet& data, Weighting weighting,
                        const std::string& output_file) {
  return edit_card(start_text, start_file, fitted_card_changes(result, data, weighting),
                   output_file);
}

std::string report(const FitResult& result, const DataSet& data) {
  std::ostringstream o;
  o << "fit of " << data.file << ": " << result.residuals.size() << " rows, "
    << number(result.from, 6) << " K to " << number(result.to, 6)
    << " K, converged after " << result.iterations << " iterations\n\n";
  o << std::left << std::setw(36) << "parameter" << std::setw(24) << "value"
    << std::setw(28) << "standard error"
    << "start\n";
  for (std::size_t j = 0; j < result.parameters.size(); ++j) {
    const FreeParameter& f = result.parameters[j];
    const double rel = result.values[j] != 0.0 ? 100.0 * result.standard_errors[j] /
                                                     std::abs(result.values[j])
                                               : 0.0;
    o << std::setw(36) << f.path << std::setw(24)
      << card_quantity_text(result.values[j], f.unit) << std::setw(28)
      << (card_quantity_text(result.standard_errors[j], f.unit, 3) + " (" +
          number(rel, 2) + " %)")
      << card_quantity_text(f.start, f.unit) << "\n";
  }
  o << "\ncorrelation matrix\n" << std::setw(8) << "";
  for (std::size_t j = 0; j < result.parameters.size(); ++j)
    o << std::right << std::setw(9) << ("[" + std::to_string(j) + "]");
  o << "\n";
  for (std::size_t a = 0; a < result.parameters.size(); ++a) {
    o << std::left << std::setw(8) << ("[" + std::to_string(a) + "]");
    for (std::size_t b = 0; b < result.parameters.size(); ++b) {
      char cell[32];
      std::snprintf(cell, sizeof cell, "%9.4f", result.correlation[a][b]);
      o << cell;
    }
    o << "   " << result.parameters[a].path << "\n";
  }
  o << "\nchi-square " << number(result.chi_square, 6) << " on "
    << result.degrees_of_freedom << " degrees of freedom, reduced chi-square "
    << number(result.reduced_chi_square, 6) << "\n"
    << "standard errors "
    << (result.covariance_scaled ? "scaled by the reduced chi-square (no sigma column)"
                                 : "from the sigma column")
    << "\nrelative residuals: rms " << number(100 * result.rms_relative, 3) << " %, max "
    << number(100 * result.max_relative, 3) << " %\n"
    << detail::diagnostics_report(result) << "\n";
  for (const std::string& w : result.warnings)
    o << "warning: " << w << "\n\n";
  o << "residuals\n";
  char line[256];
  std::snprintf(line, sizeof line, "%6s %10s %10s %-9s %14s %14s %13s %9s %10s\n", "line",
                "T_K", "T_from_K", "quantity", "data", "model", "model-data", "rel_%",
                "weighted");
  o << line;
  for (const ResidualRow& r : result.residuals) {
    const char* q = r.point.kind == Observable::capacity           ? "cp"
                    : r.point.kind == Observable::energy_increment ? "e"
                                                                   : "k";
    std::snprintf(line, sizeof line,
                  "%6d %10.5g %10s %-9s %14.7g %14.7g %13.4g %9.3f %10.4g\n",
                  r.point.line, r.point.temperature,
                  r.point.kind == Observable::energy_increment
                      ? number(r.point.from_temperature, 5).c_str()
                      : "",
                  q, r.point.value, r.model, r.residual, 100 * r.relative, r.weighted);
    o << line;
  }
  return o.str();
}

} // namespace quantacal::fit
