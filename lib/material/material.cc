// SPDX-License-Identifier: Apache-2.0
// Material: an exact model, a conductivity, metadata and a table built on first use.
#include <quantacal/material/material.h>

#include <quantacal/common/exceptions.h>

#include <algorithm>
#include <cmath>
#include <stdexcept>

namespace quantacal {
namespace {

void require(bool condition, const std::string& name, const std::string& what) {
  if (!condition)
    throw InputError::argument(
        "", "", "",
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
  require(data_.phases.empty() ||
              (data_.phase_layout &&
               data_.phase_layout->phase_count() == data_.phases.size()),
          n, "requires one phase description per phase of the layout");
  for (const PhaseInfo& p : data_.phases)
    require(std::isfinite(p.density) && p.density > 0.0, n,
            "requires a density > 0 kg/m^3 for phase " + p.name + " but got " +
                format_double(p.density));
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

// A card whose terms are finite and positive at every checked temperature can still
// be beyond tabulation (a capacity that swings by orders of magnitude inside a
// kelvin; found by fuzz_card, docs/reliability.md): that is the card's fault, so it
// is reported at the card's valid range.
template <typename Build>
auto Material::build_for_card(Build build) const {
  try {
    return build();
  } catch (const NumericalError& e) {
    if (data_.file.empty())
      throw;
    throw InputError(data_.file, data_.range_line > 0 ? data_.range_line : 1,
                     data_.range_column > 0 ? data_.range_column : 1, "valid_range", "",
                     std::string("the card's terms cannot be tabulated inside the valid "
                                 "range: ") +
                         e.what());
  }
}

TablePtr Material::shared_table() const {
  // (call_once: a build that throws leaves the flag unset, the next call retries)
  std::call_once(table_once_, [this] {
    table_ = build_for_card(
        [this] { return PropertyTable::build(*data_.model, data_.table_options); });
  });
  return table_;
}

const PropertyTable& Material::table() const {
  return *shared_table();
}

ConductivityTablePtr Material::shared_conductivity_table() const {
  // the same pattern as the table: one build, every other caller waits for it
  std::call_once(conductivity_table_once_, [this] {
    conductivity_table_ = build_for_card([this] {
      return ConductivityTable::build(*data_.conductivity, data_.name,
                                      data_.table_options);
    });
  });
  return conductivity_table_;
}

const ConductivityTable& Material::conductivity_table() const {
  return *shared_conductivity_table();
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

void Material::thermal(const double* temperatures, std::size_t n, Basis basis,
                       double* energy, double* capacity,
                       double* capacity_derivative) const {
  for (std::size_t i = 0; i < n; ++i)
    check_temperature(temperatures[i], "quantacal::Material::thermal");
  table().evaluate(temperatures, n, energy, capacity, capacity_derivative);
  const double factor = basis_factor(basis);
  const double offset = energy_offset_;
  if (energy)
    for (std::size_t i = 0; i < n; ++i)
      energy[i] = factor * (energy[i] - offset);
  if (capacity)
    for (std::size_t i = 0; i < n; ++i)
      capacity[i] *= factor;
  if (capacity_derivative)
    for (std::size_t i = 0; i < n; ++i)
      capacity_derivative[i] *= factor;
}

double Material::temperature_from_energy(double energy, Basis basis) const {
  const PropertyTable& t = table();
  const double factor = basis_factor(basis);
  const double lowest = t.evaluate(t.lower_temperature()).energy;
  const double highest = t.evaluate(t.upper_temperature()).energy;
  // The range check is made on the caller's basis, with the very expression
  // thermal() uses, so that the energies it returns at both ends of the range
  // are accepted: undoing the basis factor and the offset rounds, and may put
  // e(lower) a unit in the last place below the table's lowest energy.
  const double low = factor * (lowest - energy_offset_);
  const double high = factor * (highest - energy_offset_);
  if (!(std::isfinite(energy) && energy >= low && energy <= high)) {
    static const char* units[] = {"J/kg", "J/mol", "J/m^3"};
    const char* unit = units[static_cast<int>(basis)];
    throw RangeError("quantacal::Material::temperature_from_energy", data_.name,
                     format_double(low) + " " + unit + " <= e <= " + format_double(high) +
                         " " + unit + " (the valid range " +
                         format_double(data_.lower_temperature) + " K to " +
                         format_double(data_.upper_temperature) + " K)",
                     energy, unit);
  }
  // Molar energy on the table's own scale (the offset undone).
  const double molar = std::clamp(energy / factor + energy_offset_, lowest, highest);
  return t.temperature_from_energy(molar);
}

void Material::conductivity(const double* temperatures, std::size_t n,
                            double* conductivity, double* derivative) const {
  for (std::size_t i = 0; i < n; ++i)
    check_temperature(temperatures[i], "quantacal::Material::conductivity");
  conductivity_table().evaluate(temperatures, n, conductivity, derivative);
}

ConductivityValue Material::conductivity(double temperature) const {
  check_temperature(temperature, "quantacal::Material::conductivity");
  return conductivity_table().evaluate(temperature);
}

ConductivityValue Material::conductivity_exact(double temperature) const {
  check_temperature(temperature, "quantacal::Material::conductivity_exact");
  return data_.conductivity->evaluate(temperature);
}

double Material::density(double temperature) const {
  check_temperature(temperature, "quantacal::Material::density");
  if (data_.phases.empty() || !data_.phase_layout)
    return data_.reference_density;
  const PhaseLayout::Weight w = data_.phase_layout->weight(temperature);
  const double a = data_.phases[w.phase].density;
  if (w.s == 0.0)
    return a;
  return a + w.s * (data_.phases[w.phase + 1].density - a);
}

} // namespace quantacal
