// SPDX-License-Identifier: Apache-2.0
// The case bound to its mesh: materials per material id, conditions per boundary id.
#include "mesh_binding.h"

#include "case_errors.h"

#include <quantacal/cards/card.h>

#include <filesystem>

namespace quantacal::solver::detail {
namespace {

using dealii::types::boundary_id;
using dealii::types::material_id;

/** The material of @p spec: given in code, or loaded from its card. */
MaterialPtr material_of(const CaseDescription& description, const MaterialSpec& spec) {
  if (spec.material)
    return spec.material;
  if (spec.card.empty() || !std::filesystem::exists(spec.card))
    throw case_error(description, spec.where, "materials",
                     "an existing material card (not found: " + spec.card + ")");
  return load_card(spec.card);
}

void require_a_card_for_every_id(const CaseDescription& description, const MeshIds& mesh,
                                 const std::set<unsigned int>& carded) {
  for (const unsigned int id : mesh.materials)
    if (!carded.count(id)) {
      const CaseLocation where = description.materials.empty()
                                     ? CaseLocation{}
                                     : description.materials.front().where;
      throw InputError(
          description.file, where.line, where.column, "materials", std::to_string(id),
          "expected a card for every material id of the mesh: id " + std::to_string(id) +
              " has none (mesh material ids: " + ids_text(mesh.materials) +
              "; cards given for: " + ids_text(carded) + ")");
    }
}

void check_initial_temperatures(const CaseDescription& description,
                                const MaterialBinding& binding) {
  for (const auto& [id, material] : binding.materials) {
    const double initial = binding.initial_temperatures.at(id);
    if (initial < material->lower_temperature() ||
        initial > material->upper_temperature())
      throw case_error(description, description.initial_where, "initial_temperature",
                       "an initial temperature inside the valid range of " +
                           material->name() + " (" +
                           format_double(material->lower_temperature()) + " K to " +
                           format_double(material->upper_temperature()) + " K), got " +
                           format_double(initial) + " K");
  }
}

void check_boundary(const CaseDescription& description, const MeshIds& mesh,
                    const BoundarySpec& boundary) {
  if (!mesh.boundaries.count(boundary.boundary_id))
    throw InputError(description.file, boundary.where.line, boundary.where.column,
                     boundary.where.field.empty() ? "boundaries" : boundary.where.field,
                     std::to_string(boundary.boundary_id),
                     "expected a boundary id of the mesh (the mesh has boundary ids: " +
                         ids_text(mesh.boundaries) + ")");
  if (description.geometry == Geometry::axisymmetric &&
      description.mesh.kind == MeshSpec::Kind::cylinder && boundary.boundary_id == 3 &&
      (boundary.temperature || boundary.convection || boundary.radiation))
    throw InputError(
        description.file, boundary.where.line, boundary.where.column,
        boundary.where.field, "3",
        "expected no condition on the axis r = 0 (boundary id 3 is always insulated)");
}

} // namespace

MaterialBinding bind_materials(const CaseDescription& description, const MeshIds& mesh,
                               const RunLog& log) {
  MaterialBinding binding;
  std::set<unsigned int> carded;
  for (const MaterialSpec& spec : description.materials) {
    carded.insert(spec.id);
    if (!mesh.materials.count(spec.id)) {
      log.line("note: materials: id " + std::to_string(spec.id) +
               " is not in the mesh (mesh material ids: " + ids_text(mesh.materials) +
               ")");
      continue;
    }
    const auto id = static_cast<material_id>(spec.id);
    binding.materials[id] = material_of(description, spec);
    binding.initial_temperatures[id] = spec.initial_temperature
                                           ? *spec.initial_temperature
                                           : description.initial_temperature;
  }
  require_a_card_for_every_id(description, mesh, carded);
  check_initial_temperatures(description, binding);
  return binding;
}

BoundaryBinding bind_boundaries(const CaseDescription& description, const MeshIds& mesh,
                                const RunLog& log) {
  BoundaryBinding binding;
  std::set<unsigned int> given;
  for (std::size_t index = 0; index < description.boundaries.size(); ++index) {
    const BoundarySpec& spec = description.boundaries[index];
    check_boundary(description, mesh, spec);
    if (spec.temperature)
      binding.fixed.push_back(index);
    else if (spec.convection || spec.radiation)
      binding.natural[static_cast<boundary_id>(spec.boundary_id)] = index;
    given.insert(spec.boundary_id);
  }
  std::set<unsigned int> open;
  for (const unsigned int id : mesh.boundaries)
    if (!given.count(id))
      open.insert(id);
  if (!open.empty())
    log.line("note: boundary ids without a condition are insulated: " + ids_text(open));
  return binding;
}

} // namespace quantacal::solver::detail
