// SPDX-License-Identifier: Apache-2.0
// Material: an exact model, a conductivity, metadata and a table built on first use.
#include <quantacal/material/material.h>

#include <quantacal/common/exceptions.h>

#include <cmath>
#include <stdexcept>

namespace quantacal {
namespace {

void require(bool condition, const std::string& name, const std::string& what) {
  if (!condition)
    throw std::invalid_argument(
        "quantacal::Material: " + (name.empty() ? "<unnamed>" : name) + ": " + what);
}

} // namespace

Material::Material(MaterialData data) : data_(std::move(data)) {
  const std::string& n = data_.name;
  require(!n.empty(), n, "a name is required");
  require(static_cast<bool>(data_.model), n, "a heat-capacity model is required");
  require(static_cast<bool>(data_.conductivity), n, "a conductivity model is required");
  require(std::isfinite(data_.molar_mass) && data_.molar_mass > 0.0, n,
          "requires molar_mass > 0 kg/mol but got " + format_double(data_.molar_mass));
  require(std::isfinite(data_.reference_density) && data_.reference_density > 0.0, n,
          "requires reference_density > 0 kg/m^3 but got " +
              format_double(data_.reference_density));
  require(std::isfinite(data_.lower_temperature) && data_.lower_temperature > 0.0, n,
          "requires a lower temperature > 0 K but got " +
              format_double(data_.lower_temperature));
  require(std::isfinite(data_.upper_temperature) &&
              data_.upper_temperature > data_.lower_temperature,
          n,
          "requires an upper temperature above the lower (" +
              format_double(data_.lower_temperature) + " K) but got " +
              format_double(data_.upper_temperature));
  require(data_.lower_temperature >= data_.model->lower_temperature() &&
              data_.upper_temperature <= data_.model->upper_temperature(),
          n, "the valid range must lie inside the model's domain");
  require(
      std::isfinite(data_.reference_temperature) && data_.reference_temperature >= 0.0, n,
      "requires reference_temperature >= 0 K but got " +
          format_double(data_.reference_temperature));
  if (data_.reference_temperature > 0.0)
    energy_offset_ = data_.model->evaluate(data_.reference_temperature).energy;
  data_.table_options.lower_temperature = data_.lower_temperature;
  data_.table_options.upper_temperature = data_.upper_temperature;
}

double Material::basis_factor(Basis basis) const noexcept {
  switch (basis) {
  case Basis::mass:
    return 1.0 / data_.molar_mass;
  case Basis::mole:
    return 1.0;
  case Basis::volume:
    return data_.reference_density / data_.molar_mass;
  }
  return 1.0;
}

TablePtr Material::shared_table() const {
  std::call_once(table_once_, [this] {
    table_ = PropertyTable::build(*data_.model, data_.table_options);
  });
  return table_;
}

const PropertyTable& Material::table() const {
  return *shared_table();
}

void Material::check_temperature(double temperature, const char* function) const {
  if (!(std::isfinite(temperature) && temperature >= data_.lower_temperature &&
        temperature <= data_.upper_temperature))
    throw RangeError(function, data_.name,
                     format_double(data_.lower_temperature) +
                         " K <= T <= " + format_double(data_.upper_temperature) + " K",
                     temperature);
}

ThermalState Material::thermal(double temperature, Basis basis) const {
  check_temperature(temperature, "quantacal::Material::thermal");
  ThermalState s = table().evaluate(temperature);
  s.energy -= energy_offset_;
  return basis_factor(basis) * s;
}

ThermalState Material::thermal_exact(double temperature, Basis basis) const {
  check_temperature(temperature, "quantacal::Material::thermal_exact");
  ThermalState s = data_.model->evaluate(temperature);
  s.energy -= energy_offset_;
  return basis_factor(basis) * s;
}

ConductivityValue Material::conductivity(double temperature) const {
  check_temperature(temperature, "quantacal::Material::conductivity");
  return data_.conductivity->evaluate(temperature);
}

} // namespace quantacal
