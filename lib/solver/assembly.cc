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
        // lumped: one "point" per node (its temperature, weight int w phi_i)
        n_mass_points(d.lumped_mass ? n_dofs : d.mass_quadrature.size()),
        n_face_points(d.face_quadrature.size()), mass_temperature(n_mass_points),
        mass_reference(n_mass_points), lumped_weight(n_dofs), local_values(n_dofs),
        cell_jacobian(n_dofs, n_dofs), cell_energy(n_dofs), cell_flow(n_dofs),
        cell_absolute(n_dofs), dofs(n_dofs), temperature(n_points),
        face_temperature(n_face_points), gradient(n_points) {
    // each point set gets only what the assembly reads from it: E (and C, dC/dT for
    // the Jacobian or the capacity form) at the mass points, k (and dk/dT for the
    // Jacobian) at the Gauss points
    mass_flags = fe::property_energy;
    if (capacity_form || with_jacobian)
      mass_flags |= fe::property_capacity;
    if (capacity_form && with_jacobian)
      mass_flags |= fe::property_capacity_derivative;
    point_flags = fe::property_conductivity;
    if (with_jacobian)
      point_flags |= fe::property_conductivity_derivative;
  }

  FEValues<dim> values;          ///< Gauss points: conduction and sources
  FEFaceValues<dim> face_values; ///< boundary faces
  FEValues<dim> mass_values;     ///< stored energy (consistent mass)
  const unsigned int n_dofs, n_points, n_mass_points, n_face_points;
  std::vector<double> mass_temperature, mass_reference, lumped_weight;
  dealii::Vector<double> local_values;
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
      absolute_energy_(discretization.owned_vector()) {}

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
  const bool lumped = discretization_.lumped_mass;
  scratch.values.reinit(cell);
  scratch.values.get_function_values(temperature, scratch.temperature);
  scratch.values.get_function_gradients(temperature, scratch.gradient);
  if (lumped) {
    cell->get_dof_values(temperature, scratch.local_values);
    for (unsigned int i = 0; i < scratch.n_dofs; ++i)
      scratch.mass_temperature[i] = scratch.local_values(i);
  } else {
    scratch.mass_values.reinit(cell);
    scratch.mass_values.get_function_values(temperature, scratch.mass_temperature);
  }
  if (capacity_form_ && capacity_reference) {
    if (lumped) {
      cell->get_dof_values(*capacity_reference, scratch.local_values);
      for (unsigned int i = 0; i < scratch.n_dofs; ++i)
        scratch.mass_reference[i] = scratch.local_values(i);
    } else {
      scratch.mass_values.get_function_values(*capacity_reference,
                                              scratch.mass_reference);
    }
  }
}

template <int dim>
void Assembler<dim>::evaluate_materials(const Cell& cell, CellScratch& scratch) const {
  for (unsigned int q = 0; q < scratch.n_points; ++q)
    if (!(scratch.temperature[q] > 0.0) || !std::isfinite(scratch.temperature[q]))
      throw RangeError("quantacal::solver::run_case", "temperature field",
                       "a positive, finite temperature", scratch.temperature[q]);
  for (unsigned int q = 0; q < scratch.n_mass_points; ++q)
    if (!(scratch.mass_temperature[q] > 0.0) ||
        !std::isfinite(scratch.mass_temperature[q]))
      throw RangeError("quantacal::solver::run_case", "temperature field",
                       "a positive, finite temperature", scratch.mass_temperature[q]);
  const auto start = Clock::now();
  field_.evaluate(cell->material_id(), scratch.mass_temperature, scratch.mass_properties,
                  scratch.mass_flags);
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
// would give zero weight). `measure` is w JxW of a quadrature point, or m_i.
template <int dim>
void Assembler<dim>::add_lumped_energy(double shift, bool with_jacobian,
                                       CellScratch& scratch, AssembledSums& sums) const {
  const FEValues<dim>& values = scratch.values;
  const fe::PointProperties& properties = scratch.mass_properties;
  for (unsigned int i = 0; i < scratch.n_dofs; ++i) {
    scratch.lumped_weight[i] = 0.0;
    for (unsigned int q = 0; q < scratch.n_points; ++q)
      scratch.lumped_weight[i] +=
          values.shape_value(i, q) * values.JxW(q) * weight(values.quadrature_point(q));
  }
  for (unsigned int i = 0; i < scratch.n_dofs; ++i) {
    const double measure = scratch.lumped_weight[i];
    const double energy = properties.energy[i] - shift;
    const double T_change = scratch.mass_temperature[i] - scratch.mass_reference[i];
    sums.stored += energy * measure;
    sums.shift += shift * measure;
    scratch.cell_energy(i) +=
        (capacity_form_ ? properties.capacity[i] * T_change : energy) * measure;
    scratch.cell_absolute(i) += std::abs(properties.energy[i]) * measure;
    if (with_jacobian)
      scratch.cell_jacobian(i, i) +=
          (capacity_form_
               ? properties.capacity[i] + properties.capacity_derivative[i] * T_change
               : properties.capacity[i]) *
          measure;
  }
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
    if (discretization_.lumped_mass)
      add_lumped_energy(shift, with_jacobian, scratch, local);
    else
      add_consistent_energy(cell, shift, with_jacobian, scratch, local);
    add_conduction_and_source(source, beta_h, with_jacobian, scratch, local);
    add_natural_boundaries(cell, temperature, beta_h, with_jacobian, scratch, local);
    distribute(cell, with_jacobian, scratch);
  }
  timings_.material_evaluation += scratch.material_seconds;
  stored_energy_.compress(VectorOperation::add);
  absolute_energy_.compress(VectorOperation::add);
  heat_flow_.compress(VectorOperation::add);
  if (with_jacobian)
    discretization_.jacobian.compress(VectorOperation::add);
  return global_sums(local, failed, message);
}

template class Assembler<2>;
template class Assembler<3>;

} // namespace quantacal::solver::detail
