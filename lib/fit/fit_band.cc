// SPDX-License-Identifier: Apache-2.0
// `quantacal fit`: the fit record of a fitted card, and one-sigma bands from its
// covariance.
#include <quantacal/fit/fit.h>

#include <quantacal/common/exceptions.h>

#include <yaml-cpp/yaml.h>

#include <cmath>
#include <stdexcept>

namespace quantacal::fit {
namespace {

int line_of(const YAML::Node& n) {
  return n.Mark().is_null() ? 0 : n.Mark().line + 1;
}
int column_of(const YAML::Node& n) {
  return n.Mark().is_null() ? 0 : n.Mark().column + 1;
}

/** The material with the record's parameters set to @p values. */
MaterialPtr with_values(const Material& material, const FitRecord& record,
                        const std::vector<double>& values) {
  HeatCapacityModel model = material.model();
  ConductivityPtr k = material.data().conductivity;
  for (std::size_t j = 0; j < values.size(); ++j) {
    const FreeParameter& f = record.parameters[j];
    if (f.conductivity) {
      const auto metal = std::dynamic_pointer_cast<const MetalConductivity>(k);
      k = metal->with_parameter(f.name, values[j]);
    } else {
      model = model.with_contribution(
          f.index, model.contributions()[f.index]->with_parameter(f.name, values[j]));
    }
  }
  MaterialData d = material.data();
  d.model = std::make_shared<const HeatCapacityModel>(std::move(model));
  d.conductivity = k;
  return std::make_shared<const Material>(std::move(d));
}

} // namespace

FitRecord read_fit_record(const std::string& card_text, const std::string& file,
                          const Material& material) {
  YAML::Node root;
  try {
    root = YAML::Load(card_text);
  } catch (const YAML::Exception& e) {
    throw CardError(file, e.mark.is_null() ? 0 : e.mark.line + 1,
                    e.mark.is_null() ? 0 : e.mark.column + 1, "", "",
                    "YAML syntax error: " + e.msg);
  }
  const YAML::Node fit = root["fit"];
  if (!fit.IsDefined() || !fit.IsMap())
    throw CardError(file, 0, 0, "fit", "",
                    "no `fit` record: a band needs a card written by quantacal fit");
  const YAML::Node list = fit["parameters"];
  const YAML::Node cov = fit["covariance"];
  if (!list.IsDefined() || !list.IsSequence() || list.size() == 0)
    throw CardError(file, line_of(fit), column_of(fit), "fit.parameters", "",
                    "expected a list of fitted parameters");
  std::vector<std::string> paths;
  for (std::size_t i = 0; i < list.size(); ++i) {
    const YAML::Node path = list[i]["path"];
    if (!path.IsDefined() || !path.IsScalar())
      throw CardError(file, line_of(list[i]), column_of(list[i]),
                      "fit.parameters[" + std::to_string(i) + "].path", "",
                      "expected the parameter path");
    paths.push_back(path.Scalar());
  }
  FitRecord r;
  try {
    r.parameters = resolve_free_parameters(material, paths);
  } catch (const std::invalid_argument& e) {
    throw CardError(file, line_of(list), column_of(list), "fit.parameters", "", e.what());
  }
  const std::size_t m = paths.size();
  if (!cov.IsDefined() || !cov.IsSequence() || cov.size() != m)
    throw CardError(file, line_of(fit), column_of(fit), "fit.covariance", "",
                    "expected a " + std::to_string(m) + " x " + std::to_string(m) +
                        " matrix");
  r.covariance.assign(m, std::vector<double>(m));
  for (std::size_t a = 0; a < m; ++a) {
    if (!cov[a].IsSequence() || cov[a].size() != m)
      throw CardError(file, line_of(cov[a]), column_of(cov[a]),
                      "fit.covariance[" + std::to_string(a) + "]", "",
                      "expected a row of " + std::to_string(m) + " numbers");
    for (std::size_t b = 0; b < m; ++b) {
      const YAML::Node cell = cov[a][b];
      double v = 0.0;
      try {
        v = cell.as<double>();
      } catch (const YAML::Exception&) {
        throw CardError(file, line_of(cell), column_of(cell),
                        "fit.covariance[" + std::to_string(a) + "][" + std::to_string(b) +
                            "]",
                        cell.IsScalar() ? cell.Scalar() : "", "expected a number");
      }
      if (!std::isfinite(v) || (a == b && v < 0.0))
        throw CardError(file, line_of(cell), column_of(cell),
                        "fit.covariance[" + std::to_string(a) + "][" + std::to_string(b) +
                            "]",
                        cell.Scalar(), "expected a finite number (>= 0 on the diagonal)");
      r.covariance[a][b] = v;
    }
  }
  for (std::size_t a = 0; a < m; ++a)
    for (std::size_t b = 0; b < a; ++b)
      if (std::abs(r.covariance[a][b] - r.covariance[b][a]) >
          1e-9 * std::sqrt(r.covariance[a][a] * r.covariance[b][b]) + 1e-300)
        throw CardError(file, line_of(cov), column_of(cov), "fit.covariance", "",
                        "expected a symmetric matrix");
  return r;
}

BandRow band(const Material& material, const FitRecord& record, double temperature,
             Basis basis) {
  const std::size_t m = record.parameters.size();
  std::vector<double> values(m);
  for (std::size_t j = 0; j < m; ++j) {
    const FreeParameter& f = record.parameters[j];
    values[j] = f.start; // resolved against the fitted card: the fitted value
  }
  BandRow row;
  const ThermalState s = material.thermal_exact(temperature, basis);
  row.capacity = s.capacity;
  row.energy = s.energy;
  row.conductivity = material.conductivity(temperature).value;
  std::vector<double> gc(m), ge(m), gk(m);
  for (std::size_t j = 0; j < m; ++j) {
    const double se = std::sqrt(record.covariance[j][j]);
    const double h = se > 0.0 ? 1e-3 * se : 1e-7 * std::max(std::abs(values[j]), 1e-30);
    std::vector<double> plus = values, minus = values;
    plus[j] += h;
    minus[j] -= h;
    const MaterialPtr a = with_values(material, record, plus);
    const MaterialPtr b = with_values(material, record, minus);
    const ThermalState sa = a->thermal_exact(temperature, basis);
    const ThermalState sb = b->thermal_exact(temperature, basis);
    gc[j] = (sa.capacity - sb.capacity) / (2 * h);
    ge[j] = (sa.energy - sb.energy) / (2 * h);
    gk[j] = (a->conductivity(temperature).value - b->conductivity(temperature).value) /
            (2 * h);
  }
  double vc = 0.0, ve = 0.0, vk = 0.0;
  for (std::size_t a = 0; a < m; ++a)
    for (std::size_t b = 0; b < m; ++b) {
      vc += gc[a] * record.covariance[a][b] * gc[b];
      ve += ge[a] * record.covariance[a][b] * ge[b];
      vk += gk[a] * record.covariance[a][b] * gk[b];
    }
  row.capacity_sigma = std::sqrt(std::max(0.0, vc));
  row.energy_sigma = std::sqrt(std::max(0.0, ve));
  row.conductivity_sigma = std::sqrt(std::max(0.0, vk));
  return row;
}

} // namespace quantacal::fit
