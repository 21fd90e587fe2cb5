// SPDX-License-Identifier: Apache-2.0
// MaterialField: material id -> Material, evaluated at quadrature points.
#include <quantacal/common/exceptions.h>
#include <quantacal/fe/material_field.h>
#include <quantacal/models/contribution.h>
#include <quantacal/models/heat_capacity_model.h>

#include <stdexcept>
#include <utility>

namespace quantacal::fe {

void PointProperties::resize(std::size_t n) {
  energy.resize(n);
  capacity.resize(n);
  capacity_derivative.resize(n);
  conductivity.resize(n);
  conductivity_derivative.resize(n);
}

template <int dim>
MaterialField<dim>::MaterialField(
    std::map<dealii::types::material_id, MaterialPtr> materials) {
  for (auto& [id, m] : materials) {
    if (!m)
      throw std::invalid_argument("quantacal::fe::MaterialField: material id " +
                                  std::to_string(static_cast<unsigned>(id)) +
                                  " has no material");
    Entry e{m,
            m->basis_factor(Basis::volume),
            m->lower_temperature(),
            m->upper_temperature(),
            m->shared_table(),
            m->shared_conductivity_table()};
    // The table applies the same range rule (lower <= T <= upper, NaN rejected) in its
    // batch, vectorised. When its range is the material's (always, for a Material: the
    // table is built over the valid range), that check is the only one on the hot path.
    e.table_checks_range = e.table->lower_temperature() == e.lower_temperature &&
                           e.table->upper_temperature() == e.upper_temperature;
    entries_[id] = std::move(e);
  }
}

template <int dim>
bool MaterialField<dim>::has_material(dealii::types::material_id id) const {
  return entries_.count(id) != 0;
}

template <int dim>
const typename MaterialField<dim>::Entry&
MaterialField<dim>::entry(dealii::types::material_id id) const {
  const auto it = entries_.find(id);
  if (it == entries_.end())
    throw std::out_of_range("quantacal::fe::MaterialField: material id " +
                            std::to_string(static_cast<unsigned>(id)) +
                            " has no material");
  return it->second;
}

template <int dim>
const Material& MaterialField<dim>::material(dealii::types::material_id id) const {
  return *entry(id).material;
}

template <int dim>
std::vector<dealii::types::material_id> MaterialField<dim>::material_ids() const {
  std::vector<dealii::types::material_id> ids;
  for (const auto& [id, e] : entries_)
    ids.push_back(id);
  return ids;
}

template <int dim>
void MaterialField<dim>::check_range(const Entry& e, const double* temperatures,
                                     std::size_t n) {
  // the condition of Material::check_temperature (false for NaN and inf), inline; the
  // material builds the exception, so the message is the material's own
  for (std::size_t q = 0; q < n; ++q)
    if (!(temperatures[q] >= e.lower_temperature &&
          temperatures[q] <= e.upper_temperature))
      e.material->check_temperature(temperatures[q],
                                    "quantacal::fe::MaterialField::evaluate");
}

namespace {

/** Resizes @p array to @p count for a wanted property and returns its data, else
 * empties it. */
double* output(std::vector<double>& array, bool wanted, std::size_t count) {
  if (!wanted) {
    array.clear();
    return nullptr;
  }
  array.resize(count);
  return array.data();
}

} // namespace

template <int dim>
void MaterialField<dim>::evaluate_thermal(const Entry& material,
                                          const double* temperatures, std::size_t count,
                                          PointProperties& out, PropertyFlags flags) {
  double* energy = output(out.energy, contains(flags, property_energy), count);
  double* capacity = output(out.capacity, contains(flags, property_capacity), count);
  double* derivative = output(out.capacity_derivative,
                              contains(flags, property_capacity_derivative), count);
  if (!material.table_checks_range)
    check_range(material, temperatures, count);
  try {
    // one batch call per cell (the table's fast path); null outputs are skipped
    material.table->evaluate(temperatures, count, energy, capacity, derivative);
  } catch (const RangeError&) {
    // the points again, for the material's message (the table names its model)
    check_range(material, temperatures, count);
    throw;
  }
  const double factor = material.volume_factor;
  const double offset = material.material->energy_offset();
  for (std::size_t q = 0; energy && q < count; ++q)
    energy[q] = factor * (energy[q] - offset);
  for (std::size_t q = 0; capacity && q < count; ++q)
    capacity[q] *= factor;
  for (std::size_t q = 0; derivative && q < count; ++q)
    derivative[q] *= factor;
}

template <int dim>
void MaterialField<dim>::evaluate_conduction(const Entry& material,
                                             const double* temperatures,
                                             std::size_t count, PointProperties& out,
                                             PropertyFlags flags) {
  double* conductivity =
      output(out.conductivity, contains(flags, property_conductivity), count);
  double* slope = output(out.conductivity_derivative,
                         contains(flags, property_conductivity_derivative), count);
  if (!conductivity && !slope)
    return;
  // one batch call of the conductivity table (O(1) lookup, no log, exp or search);
  // Material::conductivity reads the same table, so the values are the same bit for
  // bit. Its range is the valid range, so its own check is the range check.
  try {
    material.conductivity_table->evaluate(temperatures, count, conductivity, slope);
  } catch (const RangeError&) {
    check_range(material, temperatures, count); // the material's message
    throw;
  }
}

template <int dim>
void MaterialField<dim>::evaluate(const dealii::CellAccessor<dim, dim>& cell,
                                  dealii::ArrayView<const double> temperatures,
                                  PointProperties& out, PropertyFlags flags) const {
  evaluate(cell.material_id(), temperatures, out, flags);
}

template <int dim>
void MaterialField<dim>::evaluate(dealii::types::material_id id,
                                  dealii::ArrayView<const double> temperatures,
                                  PointProperties& out, PropertyFlags flags) const {
  const Entry& material = entry(id);
  const std::size_t count = temperatures.size();
  const double* points = temperatures.data();
  if ((flags & property_thermal) != property_none) {
    evaluate_thermal(material, points, count, out, flags); // checks the range on the way
  } else {
    out.energy.clear();
    out.capacity.clear();
    out.capacity_derivative.clear();
    if ((flags & property_conduction) == property_none)
      check_range(material, points, count); // else the conductivity table checks it
  }
  evaluate_conduction(material, points, count, out, flags);
}

template <int dim>
VectorizedProperties<double> MaterialField<dim>::evaluate(
    const std::array<dealii::types::material_id, dealii::VectorizedArray<double>::size()>&
        ids,
    const dealii::VectorizedArray<double>& temperature) const {
  VectorizedProperties<double> out;
  constexpr std::size_t width = dealii::VectorizedArray<double>::size();
  for (std::size_t l = 0; l < width; ++l) {
    const Entry& e = entry(ids[l]);
    const double t = temperature[l];
    e.material->check_temperature(t, "quantacal::fe::MaterialField::evaluate");
    const ThermalState s = e.table->evaluate(t);
    const ConductivityValue k = e.conductivity_table->evaluate(t);
    out.energy[l] = e.volume_factor * (s.energy - e.material->energy_offset());
    out.capacity[l] = e.volume_factor * s.capacity;
    out.capacity_derivative[l] = e.volume_factor * s.capacity_derivative;
    out.conductivity[l] = k.value;
    out.conductivity_derivative[l] = k.derivative;
  }
  return out;
}

template <int dim>
double MaterialField<dim>::energy(dealii::types::material_id id,
                                  double temperature) const {
  const Entry& e = entry(id);
  e.material->check_temperature(temperature, "quantacal::fe::MaterialField::energy");
  return e.volume_factor *
         (e.table->evaluate(temperature).energy - e.material->energy_offset());
}

template <int dim>
double MaterialField<dim>::conductivity(dealii::types::material_id id,
                                        double temperature) const {
  const Entry& e = entry(id);
  return e.material->conductivity(temperature).value;
}

MaterialPtr make_constant_material(const std::string& name, double density,
                                   double specific_heat, double conductivity,
                                   double lower_temperature, double upper_temperature,
                                   double molar_mass) {
  if (!(density > 0 && specific_heat > 0 && conductivity > 0 && lower_temperature > 0 &&
        upper_temperature > lower_temperature && molar_mass > 0))
    throw std::invalid_argument("quantacal::fe::make_constant_material: " + name +
                                ": every property must be > 0 and lower < upper");
  const double molar_capacity = specific_heat * molar_mass; // J/mol/K
  LowerExtension below;
  below.kind = LowerExtension::Kind::energy;
  below.energy = 0.0;
  auto term = make_tabulated({lower_temperature, upper_temperature},
                             {molar_capacity, molar_capacity}, below);
  MaterialData d;
  d.name = name;
  d.description = "constant properties (for analytic checks)";
  d.molar_mass = molar_mass;
  d.reference_density = density;
  d.lower_temperature = lower_temperature;
  d.upper_temperature = upper_temperature;
  d.reference_temperature = 0.0;
  d.model = std::make_shared<HeatCapacityModel>(name, std::vector<ContributionPtr>{term});
  d.conductivity = make_constant_conductivity(conductivity);
  d.sources = {Source{"all", "constant properties chosen for an analytic check"}};
  return std::make_shared<const Material>(std::move(d));
}

template class MaterialField<2>;
template class MaterialField<3>;

} // namespace quantacal::fe
