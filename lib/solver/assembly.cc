// SPDX-License-Identifier: Apache-2.0
// Assembly of the residual and Jacobian of one implicit stage (see assembly.h).
#include "assembly.h"

#include "wall_clock.h"

#include <quantacal/common/constants.h>
#include <quantacal/common/exceptions.h>

#include <deal.II/base/mpi.h>
#include <deal.II/fe/fe_values.h>
#include <deal.II/lac/full_matrix.h>
#include <deal.II/lac/vector.h>

#include <algorithm>
#include <cmath>

namespace quantacal::solver::detail {

using namespace dealii;

namespace {

/** What the stored energy reads: E (and C, dC/dT for the Jacobian or the capacity
 * form). */
fe::PropertyFlags stored_energy_flags(bool capacity_form, bool with_jacobian) {
  fe::PropertyFlags flags = fe::property_energy;
  if (capacity_form || with_jacobian)
    flags |= fe::property_capacity;
  if (capacity_form && with_jacobian)
    flags |= fe::property_capacity_derivative;
  return flags;
}

void check_temperature(double temperature) {
  if (!(temperature > 0.0) || !std::isfinite(temperature))
    throw RangeError("quantacal::solver::run_case", "temperature field",
                     "a positive, finite temperature", temperature);
}

} // namespace

/** The FEValues and buffers of one assembly, reused cell after cell. */
template <int dim>
struct Assembler<dim>::CellScratch {
  CellScratch(const Discretization<dim>& d, bool capacity_form, bool with_jacobian)
      : values(d.mapping, d.fe, d.cell_quadrature,
               update_values | update_gradients | update_quadrature_points |
                   update_JxW_values),
        face_values(d.mapping, d.fe, d.face_quadrature,
                    update_values | update_quadrature_points | update_JxW_values),
        mass_values(d.mapping, d.fe, d.mass_quadrature,
                    update_values | update_quadrature_points | update_JxW_values),
        n_dofs(d.fe.n_dofs_per_cell()), n_points(d.cell_quadrature.size()),
        // lumped: the stored energy is evaluated at the nodes, not per cell
        n_mass_points(d.lumped_mass ? 0 : d.mass_quadrature.size()),
        n_face_points(d.face_quadrature.size()), mass_temperature(n_mass_points),
        mass_reference(n_mass_points), cell_jacobian(n_dofs, n_dofs), cell_energy(n_dofs),
        cell_flow(n_dofs), cell_absolute(n_dofs), dofs(n_dofs), temperature(n_points),
        face_temperature(n_face_points), gradient(n_points) {
    // each point set gets only what the assembly reads from it: E (and C, dC/dT for
    // the Jacobian or the capacity form) at the mass points, k (and dk/dT for the
    // Jacobian) at the Gauss points
    if (n_mass_points > 0)
      mass_flags = stored_energy_flags(capacity_form, with_jacobian);
    point_flags = fe::property_conductivity;
    if (with_jacobian)
      point_flags |= fe::property_conductivity_derivative;
  }

  FEValues<dim> values;          ///< Gauss points: conduction and sources
  FEFaceValues<dim> face_values; ///< boundary faces
  FEValues<dim> mass_values;     ///< stored energy (consistent mass)
  const unsigned int n_dofs, n_points, n_mass_points, n_face_points;
  std::vector<double> mass_temperature, mass_reference;
  fe::PointProperties mass_properties, point_properties;
  fe::PropertyFlags mass_flags = fe::property_none, point_flags = fe::property_none;
  FullMatrix<double> cell_jacobian;
  dealii::Vector<double> cell_energy, cell_flow, cell_absolute;
  std::vector<types::global_dof_index> dofs;
  std::vector<double> temperature, face_temperature;
  std::vector<Tensor<1, dim>> gradient;
  double material_seconds = 0.0; ///< inside MaterialField::evaluate, this assembly
};

std::pair<double, double> boundary_heat_flux(const BoundarySpec& boundary,
                                             double surface) {
  double flux = 0.0, derivative = 0.0; // into the body, W/m^2 and W/m^2/K
  if (boundary.convection) {
    const Curve& coefficient = boundary.convection->coefficient;
    const double h = coefficient.value(surface);
    const double h_slope = coefficient.derivative(surface);
    const double difference = boundary.convection->ambient_temperature - surface;
    flux += h * difference;
    derivative += h_slope * difference - h;
  }
  if (boundary.radiation) {
    const double emissivity_sigma = boundary.radiation->emissivity * stefan_boltzmann;
    const double ambient = boundary.radiation->ambient_temperature;
    flux += emissivity_sigma * (ambient * ambient * ambient * ambient -
                                surface * surface * surface * surface);
    derivative += -4.0 * emissivity_sigma * surface * surface * surface;
  }
  return {flux, derivative};
}

template <int dim>
Assembler<dim>::Assembler(const CaseDescription& description,
                          Discretization<dim>& discretization,
                          const fe::MaterialField<dim>& field,
                          std::map<types::material_id, double> energy_shift,
                          std::map<types::boundary_id, std::size_t> natural_boundaries,
                          PhaseTimes& timings)
    : description_(description), discretization_(discretization), field_(field),
      energy_shift_(std::move(energy_shift)),
      natural_boundaries_(std::move(natural_boundaries)), timings_(timings),
      axisymmetric_(description.geometry == Geometry::axisymmetric),
      capacity_form_(description.solver.formulation == Formulation::capacity),
      stored_energy_(discretization.owned_vector()),
      heat_flow_(discretization.owned_vector()),
      absolute_energy_(discretization.owned_vector()) {
  if (discretization_.lumped_mass)
    build_nodal_masses();
}

// m_i = int w phi_i per material, summed over the cells of every rank at the node's
// owner (a distributed vector per material), then kept as lists of owned nodes.
template <int dim>
void Assembler<dim>::build_nodal_masses() {
  nodal_masses_.clear();
  FEValues<dim> values(discretization_.mapping, discretization_.fe,
                       discretization_.cell_quadrature,
                       update_values | update_quadrature_points | update_JxW_values);
  const unsigned int n_dofs = discretization_.fe.n_dofs_per_cell();
  std::vector<types::global_dof_index> dofs(n_dofs);
  dealii::Vector<double> local(n_dofs);
  for (const auto& [id, shift] : energy_shift_) {
    Vector weights = discretization_.owned_vector();
    for (const auto& cell : discretization_.dof_handler.active_cell_iterators()) {
      if (!cell->is_locally_owned() || cell->material_id() != id)
        continue;
      values.reinit(cell);
      for (unsigned int i = 0; i < n_dofs; ++i) {
        local(i) = 0.0;
        for (unsigned int q = 0; q < values.n_quadrature_points; ++q)
          local(i) += values.shape_value(i, q) * values.JxW(q) *
                      weight(values.quadrature_point(q));
      }
      cell->get_dof_indices(dofs);
      weights.add(dofs, local);
    }
    weights.compress(VectorOperation::add);
    if (discretization_.has_hanging_nodes)
      weights = condense_hanging(weights);
    NodalMass mass;
    mass.id = id;
    mass.shift = shift;
    for (const auto i : discretization_.owned_dofs)
      if (weights[i] != 0.0) {
        mass.dofs.push_back(i);
        mass.weights.push_back(weights[i]);
        mass.constrained.push_back(discretization_.constraints.is_constrained(i) ? 1 : 0);
      }
    const std::size_t n = mass.dofs.size();
    mass.temperature.resize(n);
    mass.reference.assign(n, 0.0);
    mass.energy.resize(n);
    mass.absolute.resize(n);
    nodal_masses_.push_back(std::move(mass));
  }
}

// A hanging node's T is the weighted mean of its parents' (T_i = sum_j w_ij T_j), so
// its row belongs to theirs: v_j += w_ij v_i, v_i = 0 (for a nodal mass, an energy
// or a heat flow). The weights sum to 1, so the totals are kept; the hanging node
// carries no equation of its own.
template <int dim>
Vector Assembler<dim>::condense_hanging(const Vector& weights) const {
  Vector condensed = discretization_.owned_vector();
  const auto& constraints = discretization_.constraints;
  std::vector<types::global_dof_index> nodes;
  std::vector<double> masses;
  for (const auto i : discretization_.owned_dofs) {
    const auto* entries = constraints.get_constraint_entries(i);
    if (entries == nullptr || entries->empty()) {
      nodes.push_back(i);
      masses.push_back(weights[i]);
      continue;
    }
    for (const auto& [j, w] : *entries) {
      nodes.push_back(j);
      masses.push_back(w * weights[i]);
    }
  }
  condensed.add(nodes, masses);
  condensed.compress(VectorOperation::add);
  return condensed;
}

template <int dim>
double Assembler<dim>::weight(const Point<dim>& point) const {
  return axisymmetric_ ? 2.0 * M_PI * point[0] : 1.0;
}

template <int dim>
void Assembler<dim>::reset(bool with_jacobian) {
  if (with_jacobian)
    discretization_.jacobian = 0;
  stored_energy_ = 0;
  absolute_energy_ = 0;
  heat_flow_ = 0;
}

// Temperatures at the Gauss points (values, gradients) and at the mass points (the
// nodes when lumped), and the capacity form's reference temperatures there.
template <int dim>
void Assembler<dim>::gather_temperatures(const Cell& cell, const Vector& temperature,
                                         const Vector* capacity_reference,
                                         CellScratch& scratch) const {
  scratch.values.reinit(cell);
  scratch.values.get_function_values(temperature, scratch.temperature);
  scratch.values.get_function_gradients(temperature, scratch.gradient);
  if (discretization_.lumped_mass)
    return; // the stored energy is evaluated at the nodes (add_lumped_energy)
  scratch.mass_values.reinit(cell);
  scratch.mass_values.get_function_values(temperature, scratch.mass_temperature);
  if (capacity_form_ && capacity_reference)
    scratch.mass_values.get_function_values(*capacity_reference, scratch.mass_reference);
}

template <int dim>
void Assembler<dim>::evaluate_materials(const Cell& cell, CellScratch& scratch) const {
  for (unsigned int q = 0; q < scratch.n_points; ++q)
    check_temperature(scratch.temperature[q]);
  for (unsigned int q = 0; q < scratch.n_mass_points; ++q)
    check_temperature(scratch.mass_temperature[q]);
  const auto start = Clock::now();
  if (scratch.n_mass_points > 0)
    field_.evaluate(cell->material_id(), scratch.mass_temperature,
                    scratch.mass_properties, scratch.mass_flags);
  field_.evaluate(cell->material_id(), scratch.temperature, scratch.point_properties,
                  scratch.point_flags);
  scratch.material_seconds += seconds_since(start);
}

/** q, W/m^3: the sum of the sources switched on at @p time in material @p id. */
template <int dim>
double Assembler<dim>::source_density(types::material_id id, double time) const {
  double density = 0.0;
  for (const HeatSource& source : description_.sources)
    if (time >= source.start && time < source.end &&
        (source.material_ids.empty() ||
         std::find(source.material_ids.begin(), source.material_ids.end(), id) !=
             source.material_ids.end()))
      density += source.power_density;
  return density;
}

// Lumped stored energy: M_i = m_i E(T_i) with m_i = int w phi_i, the row sum of the
// w-weighted mass matrix (positive also on the axis r = 0, where a nodal quadrature
// would give zero weight), one batch per material over its owned nodes. A node on
// the interface of two materials gets both terms. The Jacobian's diagonal m_i C(T_i)
// goes to the free rows (a fixed node's row is set by the constraints).
template <int dim>
void Assembler<dim>::add_lumped_energy(const Vector& temperature,
                                       const Vector* capacity_reference,
                                       bool with_jacobian, AssembledSums& sums,
                                       bool& failed, std::string& message) {
  const fe::PropertyFlags flags = stored_energy_flags(capacity_form_, with_jacobian);
  double material_seconds = 0.0;
  for (NodalMass& mass : nodal_masses_) {
    const std::size_t n = mass.dofs.size();
    try {
      for (std::size_t k = 0; k < n; ++k) {
        mass.temperature[k] = temperature[mass.dofs[k]];
        check_temperature(mass.temperature[k]);
      }
      const auto start = Clock::now();
      field_.evaluate(mass.id, mass.temperature, mass.properties, flags);
      material_seconds += seconds_since(start);
    } catch (const std::exception& e) {
      if (!failed)
        message = e.what();
      failed = true;
      continue;
    }
    if (capacity_form_)
      for (std::size_t k = 0; k < n; ++k)
        mass.reference[k] =
            capacity_reference ? (*capacity_reference)[mass.dofs[k]] : 0.0;
    const fe::PointProperties& properties = mass.properties;
    for (std::size_t k = 0; k < n; ++k) {
      const double measure = mass.weights[k];
      const double energy = properties.energy[k] - mass.shift;
      const double T_change = mass.temperature[k] - mass.reference[k];
      sums.stored += energy * measure;
      sums.shift += mass.shift * measure;
      mass.energy[k] =
          (capacity_form_ ? properties.capacity[k] * T_change : energy) * measure;
      mass.absolute[k] = std::abs(properties.energy[k]) * measure;
      if (with_jacobian && !mass.constrained[k])
        discretization_.jacobian.add(
            mass.dofs[k], mass.dofs[k],
            (capacity_form_
                 ? properties.capacity[k] + properties.capacity_derivative[k] * T_change
                 : properties.capacity[k]) *
                measure);
    }
    stored_energy_.add(mass.dofs, mass.energy);
    absolute_energy_.add(mass.dofs, mass.absolute);
  }
  timings_.material_evaluation += material_seconds;
}

// Consistent stored energy: int w phi_i E(T_h) on Gauss points.
template <int dim>
void Assembler<dim>::add_consistent_energy(const Cell& cell, double shift,
                                           bool with_jacobian, CellScratch& scratch,
                                           AssembledSums& sums) const {
  FEValues<dim>& values = scratch.mass_values;
  const fe::PointProperties& properties = scratch.mass_properties;
  values.reinit(cell);
  for (unsigned int q = 0; q < scratch.n_mass_points; ++q) {
    const double measure = values.JxW(q) * weight(values.quadrature_point(q));
    const double energy = properties.energy[q] - shift;
    const double T_change = scratch.mass_temperature[q] - scratch.mass_reference[q];
    sums.stored += energy * measure;
    sums.shift += shift * measure;
    const double value = capacity_form_ ? properties.capacity[q] * T_change : energy;
    const double derivative =
        !with_jacobian ? 0.0
        : capacity_form_
            ? properties.capacity[q] + properties.capacity_derivative[q] * T_change
            : properties.capacity[q];
    for (unsigned int i = 0; i < scratch.n_dofs; ++i) {
      const double phi_i = values.shape_value(i, q);
      scratch.cell_energy(i) += phi_i * value * measure;
      scratch.cell_absolute(i) += phi_i * std::abs(properties.energy[q]) * measure;
      if (with_jacobian)
        for (unsigned int j = 0; j < scratch.n_dofs; ++j)
          scratch.cell_jacobian(i, j) +=
              phi_i * derivative * values.shape_value(j, q) * measure;
    }
  }
}

// Conduction and sources on the Gauss quadrature.
template <int dim>
void Assembler<dim>::add_conduction_and_source(double source, double beta_h,
                                               bool with_jacobian, CellScratch& scratch,
                                               AssembledSums& sums) const {
  const FEValues<dim>& values = scratch.values;
  const fe::PointProperties& properties = scratch.point_properties;
  for (unsigned int q = 0; q < scratch.n_points; ++q) {
    const double measure = values.JxW(q) * weight(values.quadrature_point(q));
    const double conductivity = properties.conductivity[q];
    sums.source += source * measure;
    for (unsigned int i = 0; i < scratch.n_dofs; ++i) {
      const double phi_i = values.shape_value(i, q);
      const Tensor<1, dim> grad_i = values.shape_grad(i, q);
      scratch.cell_flow(i) +=
          (-conductivity * (scratch.gradient[q] * grad_i) + source * phi_i) * measure;
      if (with_jacobian) {
        const double conductivity_slope = properties.conductivity_derivative[q];
        const double gradient_i = scratch.gradient[q] * grad_i;
        for (unsigned int j = 0; j < scratch.n_dofs; ++j)
          scratch.cell_jacobian(i, j) +=
              beta_h *
              (conductivity * (grad_i * values.shape_grad(j, q)) +
               conductivity_slope * values.shape_value(j, q) * gradient_i) *
              measure;
      }
    }
  }
}

// Natural boundaries: convection and radiation.
template <int dim>
void Assembler<dim>::add_natural_boundaries(const Cell& cell, const Vector& temperature,
                                            double beta_h, bool with_jacobian,
                                            CellScratch& scratch,
                                            AssembledSums& sums) const {
  FEFaceValues<dim>& values = scratch.face_values;
  for (const unsigned int f : cell->face_indices()) {
    if (!cell->at_boundary(f))
      continue;
    const auto it = natural_boundaries_.find(cell->face(f)->boundary_id());
    if (it == natural_boundaries_.end())
      continue;
    const BoundarySpec& boundary = description_.boundaries[it->second];
    values.reinit(cell, f);
    values.get_function_values(temperature, scratch.face_temperature);
    for (unsigned int q = 0; q < scratch.n_face_points; ++q) {
      const double measure = values.JxW(q) * weight(values.quadrature_point(q));
      const auto [flux, derivative] =
          boundary_heat_flux(boundary, scratch.face_temperature[q]);
      sums.boundary += flux * measure;
      for (unsigned int i = 0; i < scratch.n_dofs; ++i) {
        const double phi_i = values.shape_value(i, q);
        scratch.cell_flow(i) += flux * phi_i * measure;
        if (with_jacobian)
          for (unsigned int j = 0; j < scratch.n_dofs; ++j)
            scratch.cell_jacobian(i, j) -=
                beta_h * derivative * phi_i * values.shape_value(j, q) * measure;
      }
    }
  }
}

template <int dim>
void Assembler<dim>::distribute(const Cell& cell, bool with_jacobian,
                                CellScratch& scratch) {
  cell->get_dof_indices(scratch.dofs);
  stored_energy_.add(scratch.dofs, scratch.cell_energy);
  absolute_energy_.add(scratch.dofs, scratch.cell_absolute);
  heat_flow_.add(scratch.dofs, scratch.cell_flow);
  if (with_jacobian)
    discretization_.constraints.distribute_local_to_global(
        scratch.cell_jacobian, scratch.dofs, discretization_.jacobian);
}

template <int dim>
AssembledSums Assembler<dim>::global_sums(const AssembledSums& local, bool failed,
                                          std::string message) const {
  const MPI_Comm comm = discretization_.communicator;
  const int any_failed = Utilities::MPI::max(failed ? 1 : 0, comm);
  if (any_failed) {
    const unsigned int n_ranks = discretization_.n_ranks;
    const unsigned int who =
        Utilities::MPI::min(failed ? discretization_.rank : n_ranks, comm);
    message = Utilities::MPI::broadcast(comm, message, who);
    throw StageFailure{message};
  }
  AssembledSums global;
  global.stored = Utilities::MPI::sum(local.stored, comm);
  global.boundary = Utilities::MPI::sum(local.boundary, comm);
  global.source = Utilities::MPI::sum(local.source, comm);
  global.shift = Utilities::MPI::sum(local.shift, comm);
  return global;
}

template <int dim>
AssembledSums Assembler<dim>::assemble(const Vector& temperature, double time,
                                       double beta_h, const Vector* capacity_reference,
                                       bool with_jacobian) {
  CellScratch scratch(discretization_, capacity_form_, with_jacobian);
  reset(with_jacobian);
  AssembledSums local;
  bool failed = false;
  std::string message;
  for (const auto& cell : discretization_.dof_handler.active_cell_iterators()) {
    if (!cell->is_locally_owned())
      continue;
    gather_temperatures(cell, temperature, capacity_reference, scratch);
    try {
      evaluate_materials(cell, scratch);
    } catch (const std::exception& e) {
      if (!failed)
        message = e.what();
      failed = true;
      continue;
    }
    const auto shift_it = energy_shift_.find(cell->material_id());
    const double shift = shift_it != energy_shift_.end() ? shift_it->second : 0.0;
    const double source = source_density(cell->material_id(), time);
    scratch.cell_jacobian = 0;
    scratch.cell_energy = 0;
    scratch.cell_absolute = 0;
    scratch.cell_flow = 0;
    if (!discretization_.lumped_mass)
      add_consistent_energy(cell, shift, with_jacobian, scratch, local);
    add_conduction_and_source(source, beta_h, with_jacobian, scratch, local);
    add_natural_boundaries(cell, temperature, beta_h, with_jacobian, scratch, local);
    distribute(cell, with_jacobian, scratch);
  }
  timings_.material_evaluation += scratch.material_seconds;
  if (discretization_.lumped_mass)
    add_lumped_energy(temperature, capacity_reference, with_jacobian, local, failed,
                      message);
  stored_energy_.compress(VectorOperation::add);
  absolute_energy_.compress(VectorOperation::add);
  heat_flow_.compress(VectorOperation::add);
  if (discretization_.has_hanging_nodes) {
    stored_energy_ = condense_hanging(stored_energy_);
    absolute_energy_ = condense_hanging(absolute_energy_);
    heat_flow_ = condense_hanging(heat_flow_);
  }
  if (with_jacobian)
    discretization_.jacobian.compress(VectorOperation::add);
  return global_sums(local, failed, message);
}

template class Assembler<2>;
template class Assembler<3>;

} // namespace quantacal::solver::detail
