// SPDX-License-Identifier: Apache-2.0
// The `fit` record of a card written by `quantacal fit` (docs/fitting.md): the
// fitted parameter paths and their covariance, kept in MaterialData::fit.
#include "fit_record_reader.h"

#include <quantacal/cards/card_parameters.h>

#include <cmath>
#include <memory>

namespace quantacal::detail {
namespace {

const std::vector<std::string> kFitKeys = {"data",
                                           "data_sha256",
                                           "temperature_range",
                                           "n_points",
                                           "weights",
                                           "uncertainties",
                                           "iterations",
                                           "chi_square",
                                           "degrees_of_freedom",
                                           "reduced_chi_square",
                                           "rms_relative_residual",
                                           "max_relative_residual",
                                           "parameters",
                                           "covariance",
                                           "tool"};

/** The parameter paths of `fit.parameters`, each a parameter of @p material. */
std::vector<std::string> read_parameter_paths(const CardReader& reader,
                                              const YAML::Node& fit,
                                              const Material& material) {
  const YAML::Node list = fit["parameters"];
  if (!list.IsDefined() || !list.IsSequence() || list.size() == 0)
    reader.fail(fit, "fit.parameters", "", "expected a list of fitted parameters");
  std::vector<std::string> paths;
  for (std::size_t i = 0; i < list.size(); ++i) {
    const std::string ipath = index_path("fit.parameters", i);
    reader.check_keys(list[i], ipath, {"path", "value", "standard_error", "start"});
    const YAML::Node path = list[i]["path"];
    if (!path.IsDefined() || !path.IsScalar())
      reader.fail(list[i], join_path(ipath, "path"), "", "expected the parameter path");
    paths.push_back(path.Scalar());
  }
  try {
    // The record names its parameters as `quantacal fit --free` takes them.
    (void)resolve_card_parameters(material, paths, "--free");
  } catch (const InputError& e) {
    if (!e.file().empty())
      throw; // already located
    // (without the "--free: " of the command's wording: the field is named here)
    reader.fail(list, "fit.parameters", "", e.expected());
  }
  return paths;
}

std::string cell_path(std::size_t a, std::size_t b) {
  return "fit.covariance[" + std::to_string(a) + "][" + std::to_string(b) + "]";
}

/** `fit.covariance`: m x m, finite, non-negative diagonal, symmetric. */
std::vector<std::vector<double>> read_covariance(const CardReader& reader,
                                                 const YAML::Node& fit, std::size_t m) {
  const YAML::Node cov = fit["covariance"];
  if (!cov.IsDefined() || !cov.IsSequence() || cov.size() != m)
    reader.fail(fit, "fit.covariance", "",
                "expected a " + std::to_string(m) + " x " + std::to_string(m) +
                    " matrix");
  std::vector<std::vector<double>> c(m, std::vector<double>(m));
  for (std::size_t a = 0; a < m; ++a) {
    if (!cov[a].IsSequence() || cov[a].size() != m)
      reader.fail(cov[a], "fit.covariance[" + std::to_string(a) + "]", "",
                  "expected a row of " + std::to_string(m) + " numbers");
    for (std::size_t b = 0; b < m; ++b) {
      const YAML::Node cell = cov[a][b];
      double v = 0.0;
      try {
        v = cell.as<double>();
      } catch (const YAML::Exception&) {
        reader.fail(cell, cell_path(a, b), cell.IsScalar() ? cell.Scalar() : "",
                    "expected a number");
      }
      if (!std::isfinite(v) || (a == b && v < 0.0))
        reader.fail(cell, cell_path(a, b), cell.Scalar(),
                    "expected a finite number (>= 0 on the diagonal)");
      c[a][b] = v;
    }
  }
  for (std::size_t a = 0; a < m; ++a)
    for (std::size_t b = 0; b < a; ++b)
      if (std::abs(c[a][b] - c[b][a]) > 1e-9 * std::sqrt(c[a][a] * c[b][b]) + 1e-300)
        reader.fail(cov, "fit.covariance", "", "expected a symmetric matrix");
  return c;
}

} // namespace

MaterialPtr with_fit_record(const CardReader& reader, const YAML::Node& root,
                            MaterialPtr material) {
  const YAML::Node fit = reader.optional(root, "fit");
  if (!fit.IsDefined())
    return material;
  reader.check_keys(fit, "fit", kFitKeys);
  FitRecord record;
  record.parameters = read_parameter_paths(reader, fit, *material);
  record.covariance = read_covariance(reader, fit, record.parameters.size());
  MaterialData data = material->data();
  data.fit = std::move(record);
  return std::make_shared<const Material>(std::move(data));
}

} // namespace quantacal::detail
