// SPDX-License-Identifier: Apache-2.0
// The fingerprint of a case, section by section (see case_fingerprint.h).
#include "case_fingerprint.h"

#include "case_errors.h"

#include <cmath>
#include <cstdio>
#include <fstream>
#include <sstream>

namespace quantacal::solver::detail {
namespace {

/** The canonical text of one section. */
class Canon {
public:
  Canon& operator<<(double value) {
    char buffer[64];
    std::snprintf(buffer, sizeof buffer, "%a;", value);
    text_ += buffer;
    return *this;
  }
  Canon& operator<<(unsigned int value) {
    text_ += std::to_string(value) + ';';
    return *this;
  }
  Canon& operator<<(bool value) {
    text_ += value ? "1;" : "0;";
    return *this;
  }
  Canon& operator<<(const std::string& value) {
    text_ += std::to_string(value.size()) + ':' + value + ';';
    return *this;
  }
  Canon& operator<<(const char* value) { return *this << std::string(value); }
  Canon& operator<<(const std::vector<double>& values) {
    *this << static_cast<unsigned int>(values.size());
    for (const double v : values)
      *this << v;
    return *this;
  }
  Canon& operator<<(const Curve& curve) { return *this << curve.x() << curve.y(); }

  std::string hash() const { return hex64(fnv1a(text_.data(), text_.size())); }

private:
  std::string text_;
};

std::string indexed(const char* list, std::size_t i) {
  return std::string(list) + "[" + std::to_string(i) + "]";
}

/** The bytes of a Gmsh file (its content, not its path, belongs to the case). */
std::string file_bytes(const CaseDescription& description) {
  std::ifstream in(description.mesh.file, std::ios::binary);
  if (!in)
    throw case_error(description, description.mesh.where, "mesh.file",
                     "a readable Gmsh .msh file (cannot open " + description.mesh.file +
                         ")");
  std::ostringstream text;
  text << in.rdbuf();
  return text.str();
}

void add_mesh(const CaseDescription& description, Canon& canon) {
  const MeshSpec& mesh = description.mesh;
  canon << static_cast<unsigned int>(description.geometry)
        << static_cast<unsigned int>(mesh.kind);
  if (mesh.kind == MeshSpec::Kind::gmsh)
    canon << file_bytes(description);
  canon << mesh.origin << mesh.size << static_cast<unsigned int>(mesh.cells.size());
  for (const unsigned int n : mesh.cells)
    canon << n;
  canon << mesh.radius << mesh.length << mesh.refinements << mesh.material_id;
  canon << static_cast<unsigned int>(mesh.regions.size());
  for (const auto& region : mesh.regions)
    canon << region.material_id << region.lower << region.upper;
}

/** What a material computes: 33 samples of e, c_p, k and rho across its range. */
void add_material(const Material& material, Canon& canon) {
  canon << material.name() << material.molar_mass() << material.reference_density()
        << material.lower_temperature() << material.upper_temperature()
        << material.energy_offset();
  const double lower = material.lower_temperature();
  const double upper = material.upper_temperature();
  constexpr int n_samples = 33;
  for (int i = 0; i < n_samples; ++i) {
    // geometric spacing: a cryogenic range gets as many samples as a hot one
    const double t = lower * std::pow(upper / lower, i / double(n_samples - 1));
    const ThermalState state = material.thermal_exact(t, Basis::volume);
    const ConductivityValue k = material.conductivity_exact(t);
    canon << state.energy << state.capacity << k.value << k.derivative
          << material.density(t);
  }
}

void add_boundary(const BoundarySpec& boundary, Canon& canon) {
  canon << boundary.boundary_id << bool(boundary.temperature);
  if (boundary.temperature)
    canon << *boundary.temperature;
  canon << bool(boundary.convection);
  // The coefficient is the resolved curve: for a quenchant (docs/quenchants.md) its
  // file's rows times the agitation factor, so an edited quenchant file is caught.
  if (boundary.convection)
    canon << boundary.convection->coefficient << boundary.convection->ambient_temperature;
  canon << bool(boundary.radiation);
  if (boundary.radiation)
    canon << boundary.radiation->emissivity << boundary.radiation->ambient_temperature;
}

void add_time(const TimeSpec& time, Canon& canon) {
  canon << time.end << time.first_step << time.tolerance << time.min_step << time.max_step
        << time.max_rejections << time.max_steps << time.adaptive;
}

void add_output(const OutputSpec& output, Canon& canon) {
  canon << output.interval << output.fields << output.plot
        << output.crossing_temperatures;
}

void add_solver(const SolverSpec& solver, Canon& canon) {
  canon << static_cast<unsigned int>(solver.formulation) << solver.degree
        << solver.newton_tolerance << solver.max_newton_iterations
        << solver.linear_tolerance << static_cast<unsigned int>(solver.mass);
}

CaseLocation at(const CaseLocation& where, const std::string& field) {
  CaseLocation out = where;
  if (out.field.empty())
    out.field = field;
  return out;
}

} // namespace

std::uint64_t fnv1a(const char* bytes, std::size_t n, std::uint64_t hash) {
  for (std::size_t i = 0; i < n; ++i) {
    hash ^= static_cast<unsigned char>(bytes[i]);
    hash *= 1099511628211ull;
  }
  return hash;
}

std::string hex64(std::uint64_t value) {
  char buffer[17];
  std::snprintf(buffer, sizeof buffer, "%016llx", static_cast<unsigned long long>(value));
  return buffer;
}

std::vector<FingerprintSection>
case_fingerprint(const CaseDescription& description,
                 const std::map<unsigned int, MaterialPtr>& materials) {
  std::vector<FingerprintSection> out;
  const auto add = [&out](std::string key, const Canon& canon, CaseLocation where,
                          std::string what) {
    out.push_back({std::move(key), canon.hash(), std::move(where), std::move(what)});
  };
  {
    Canon canon;
    canon << description.name;
    add("name", canon, CaseLocation{0, 0, "name", description.name}, "case name");
  }
  {
    Canon canon;
    add_mesh(description, canon);
    add("mesh", canon, at(description.mesh.where, "mesh"), "geometry and mesh");
  }
  {
    Canon canon;
    canon << description.initial_temperature;
    add("initial_temperature", canon,
        at(description.initial_where, "initial_temperature"), "initial temperature");
  }
  for (std::size_t i = 0; i < description.materials.size(); ++i) {
    const MaterialSpec& spec = description.materials[i];
    Canon canon;
    canon << spec.id << bool(spec.initial_temperature)
          << spec.initial_temperature.value_or(0.0);
    const auto bound = materials.find(spec.id);
    if (bound != materials.end() && bound->second)
      add_material(*bound->second, canon);
    add(indexed("materials", i), canon, at(spec.where, indexed("materials", i)),
        "material (the properties of its card)");
  }
  for (std::size_t i = 0; i < description.boundaries.size(); ++i) {
    Canon canon;
    add_boundary(description.boundaries[i], canon);
    add(indexed("boundaries", i), canon,
        at(description.boundaries[i].where, indexed("boundaries", i)),
        "boundary condition");
  }
  for (std::size_t i = 0; i < description.sources.size(); ++i) {
    const HeatSource& source = description.sources[i];
    Canon canon;
    canon << static_cast<unsigned int>(source.material_ids.size());
    for (const unsigned int id : source.material_ids)
      canon << id;
    canon << source.power_density << source.start << source.end;
    add(indexed("sources", i), canon, at(source.where, indexed("sources", i)),
        "heat source");
  }
  {
    Canon canon;
    add_time(description.time, canon);
    add("time", canon, at(description.time.where, "time"), "time settings");
  }
  {
    Canon canon;
    add_output(description.output, canon);
    add("output", canon, at(description.output.where, "output"),
        "output settings (interval, fields, plot, crossing temperatures)");
  }
  for (std::size_t i = 0; i < description.output.probes.size(); ++i) {
    const Probe& probe = description.output.probes[i];
    Canon canon;
    canon << probe.name << probe.point;
    add(indexed("output.probes", i), canon, at(probe.where, indexed("output.probes", i)),
        "probe");
  }
  {
    Canon canon;
    add_solver(description.solver, canon);
    add("solver", canon, CaseLocation{0, 0, "solver", ""},
        "solver settings (solver block, or --degree / --formulation)");
  }
  {
    const AdaptivitySpec& adaptivity = description.adaptivity;
    Canon canon;
    canon << adaptivity.enabled << adaptivity.every << adaptivity.levels
          << adaptivity.max_cells << adaptivity.refine_above << adaptivity.coarsen_below;
    add("adaptivity", canon, at(adaptivity.where, "adaptivity"), "adaptivity settings");
  }
  return out;
}

} // namespace quantacal::solver::detail
