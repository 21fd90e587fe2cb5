// SPDX-License-Identifier: Apache-2.0
// Reading a YAML case file into a CaseDescription (schema: docs/cases.md): the
// file as a whole, its geometry, mesh and materials. The boundary conditions
// and sources are read in case_conditions.cc, the time span, outputs and
// solver settings in case_settings.cc.
#include "case_reader.h"

#include <quantacal/cards/card.h>
#include <quantacal/common/exceptions.h>
#include <quantacal/solver/case.h>

#include <yaml-cpp/yaml.h>

#include <filesystem>
#include <fstream>
#include <set>
#include <sstream>

namespace quantacal::solver {
namespace detail {
namespace {

using quantacal::detail::index_path;

const char* const kCaseFile =
    "a case file: a mapping with keys name, geometry, mesh, materials, ...";

/** Whether @p text has more than blanks, comments, directives and bare "---"/"...". */
bool has_content(const std::string& text) {
  std::size_t start = 0;
  while (start < text.size()) {
    std::size_t end = text.find('\n', start);
    if (end == std::string::npos)
      end = text.size();
    const std::string line = text.substr(start, end - start);
    std::size_t first = line.find_first_not_of(" \t\r");
    if (first != std::string::npos &&
        (line.compare(first, 3, "---") == 0 || line.compare(first, 3, "...") == 0))
      first = line.find_first_not_of(" \t\r", first + 3); // a marker alone is none
    if (first != std::string::npos && line[first] != '#' && line[first] != '%')
      return true;
    start = end + 1;
  }
  return false;
}

void read_geometry(const CaseReader& reader, const YAML::Node& root,
                   CaseDescription& description) {
  if (!root["geometry"])
    return;
  const std::string name = reader.text(root["geometry"], "geometry");
  if (name == "planar")
    description.geometry = Geometry::planar;
  else if (name == "axisymmetric")
    description.geometry = Geometry::axisymmetric;
  else if (name == "solid" || name == "3d")
    description.geometry = Geometry::solid;
  else
    reader.fail(root["geometry"], "geometry", "one of planar, axisymmetric, solid");
}

void read_mesh_file(const CaseReader& reader, const YAML::Node& mesh, MeshSpec& spec) {
  if (mesh["generator"])
    reader.fail(mesh["generator"], "mesh.generator",
                "either mesh.file or mesh.generator, not both");
  spec.kind = MeshSpec::Kind::gmsh;
  spec.file = reader.path(mesh["file"], "mesh.file");
  spec.where = reader.where(mesh["file"], "mesh.file");
  if (!std::filesystem::exists(spec.file))
    reader.fail(mesh["file"], "mesh.file",
                "an existing Gmsh .msh file (not found: " + spec.file + ")");
}

/** The generator's name, checked against the geometry. */
MeshSpec::Kind read_generator_kind(const CaseReader& reader, const YAML::Node& node,
                                   Geometry geometry, int dim) {
  const std::string name = reader.text(node, "mesh.generator");
  MeshSpec::Kind kind = MeshSpec::Kind::plate;
  if (name == "plate")
    kind = MeshSpec::Kind::plate;
  else if (name == "block")
    kind = MeshSpec::Kind::block;
  else if (name == "cylinder")
    kind = MeshSpec::Kind::cylinder;
  else
    reader.fail(node, "mesh.generator", "one of plate, block, cylinder");
  if (kind == MeshSpec::Kind::plate && dim != 2)
    reader.fail(node, "mesh.generator", "block or cylinder for geometry solid");
  if (kind == MeshSpec::Kind::block && dim != 3)
    reader.fail(node, "mesh.generator",
                "plate or cylinder for geometry planar or axisymmetric");
  if (kind == MeshSpec::Kind::cylinder && geometry == Geometry::planar)
    reader.fail(node, "mesh.generator",
                "plate for geometry planar (a cylinder needs axisymmetric or solid)");
  return kind;
}

/** Radius and length of a cylinder, or size and origin of a plate or block. */
void read_generator_extent(const CaseReader& reader, const YAML::Node& mesh, int dim,
                           MeshSpec& spec) {
  if (spec.kind == MeshSpec::Kind::cylinder) {
    for (const char* key : {"radius", "length"})
      if (!mesh[key])
        reader.fail_missing(mesh, "mesh", key, "a length, e.g. \"10 mm\"");
    spec.radius =
        reader.positive(mesh["radius"], "mesh.radius", dimension::length(), "a length");
    spec.length =
        reader.positive(mesh["length"], "mesh.length", dimension::length(), "a length");
    return;
  }
  if (!mesh["size"])
    reader.fail_missing(mesh, "mesh", "size",
                        "a list of " + std::to_string(dim) + " lengths");
  spec.size = reader.point(mesh["size"], "mesh.size", dim);
  for (int i = 0; i < dim; ++i)
    if (!(spec.size[i] > 0))
      reader.fail(mesh["size"][i], index_path("mesh.size", i), "a length > 0");
  spec.origin = mesh["origin"] ? reader.point(mesh["origin"], "mesh.origin", dim)
                               : std::vector<double>(dim, 0.0);
}

void read_generator_cells(const CaseReader& reader, const YAML::Node& cells, int dim,
                          MeshSpec& spec) {
  const bool cylinder = spec.kind == MeshSpec::Kind::cylinder;
  const int n = cylinder ? (dim == 2 ? 2 : 1) : dim;
  if (!cells.IsSequence() || static_cast<int>(cells.size()) != n)
    reader.fail(cells, "mesh.cells",
                "a list of " + std::to_string(n) + " cell counts" +
                    (cylinder ? (dim == 2 ? " (radial, axial)" : " (axial)") : ""));
  for (int i = 0; i < n; ++i)
    spec.cells.push_back(reader.count(cells[i], index_path("mesh.cells", i),
                                      "a whole number from 1 to 1000", 1, 1000));
}

void read_regions(const CaseReader& reader, const YAML::Node& regions, int dim,
                  MeshSpec& spec) {
  if (!regions.IsSequence())
    reader.fail(regions, "mesh.regions", "a list of {material_id, lower, upper}");
  for (std::size_t i = 0; i < regions.size(); ++i) {
    const std::string field = index_path("mesh.regions", i);
    const YAML::Node entry = regions[i];
    reader.check_keys(entry, field, {"material_id", "lower", "upper"});
    for (const char* key : {"material_id", "lower", "upper"})
      if (!entry[key])
        reader.fail_missing(entry, field, key, "see docs/cases.md");
    MeshSpec::Region region;
    region.material_id = reader.count(entry["material_id"], field + ".material_id",
                                      "a material id from 0 to 255", 0, 255);
    region.lower = reader.point(entry["lower"], field + ".lower", dim);
    region.upper = reader.point(entry["upper"], field + ".upper", dim);
    for (int k = 0; k < dim; ++k) // an empty box would select no cell
      if (!(region.upper[k] > region.lower[k]))
        reader.fail(entry["upper"][k], index_path(field + ".upper", k),
                    "a coordinate above the box's lower one (" +
                        format_double(region.lower[k]) + " m)");
    region.where = reader.where(entry, field);
    spec.regions.push_back(region);
  }
}

/** The valid-range message of a material's initial temperature. */
std::string inside_range_of(const Material& material) {
  return "a temperature inside the valid range of " + material.name() + " (" +
         format_double(material.lower_temperature()) + " K to " +
         format_double(material.upper_temperature()) + " K)";
}

/** Loads the card of @p spec and checks the initial temperature against its range. */
void load_material(const CaseReader& reader, const YAML::Node& root,
                   const YAML::Node& entry, const std::string& field,
                   const CaseDescription& description, MaterialSpec& spec) {
  if (!std::filesystem::exists(spec.card))
    reader.fail(entry["card"], field + ".card",
                "an existing material card (not found: " + spec.card + ")");
  spec.material = load_card(spec.card);
  const Material& material = *spec.material;
  if (material.lower_temperature() > description.initial_temperature ||
      material.upper_temperature() < description.initial_temperature) {
    if (!spec.initial_temperature)
      reader.fail(root["initial_temperature"], "initial_temperature",
                  inside_range_of(material));
  }
  if (spec.initial_temperature &&
      (material.lower_temperature() > *spec.initial_temperature ||
       material.upper_temperature() < *spec.initial_temperature))
    reader.fail(entry["initial_temperature"], field + ".initial_temperature",
                inside_range_of(material));
}

/** One entry {id, card, initial_temperature} of `materials`; @p seen holds the ids so
 * far. */
MaterialSpec read_material(const CaseReader& reader, const YAML::Node& root,
                           const YAML::Node& entry, const std::string& field,
                           bool load_materials, const CaseDescription& description,
                           std::set<unsigned int>& seen) {
  reader.check_keys(entry, field, {"id", "card", "initial_temperature"});
  for (const char* key : {"id", "card"})
    if (!entry[key])
      reader.fail_missing(entry, field, key,
                          key == std::string("id") ? "a material id" : "a card path");
  MaterialSpec spec;
  spec.id =
      reader.count(entry["id"], field + ".id", "a material id from 0 to 255", 0, 255);
  if (!seen.insert(spec.id).second)
    reader.fail(entry["id"], field + ".id", "each material id once");
  spec.card = reader.path(entry["card"], field + ".card");
  spec.where = reader.where(entry["card"], field + ".card");
  if (entry["initial_temperature"])
    spec.initial_temperature =
        reader.temperature(entry["initial_temperature"], field + ".initial_temperature");
  if (load_materials)
    load_material(reader, root, entry, field, description, spec);
  return spec;
}

CaseDescription read_case(const YAML::Node& root, const CaseReader& reader,
                          bool load_materials) {
  CaseDescription description;
  description.file = reader.file();
  if (!root.IsMap() && quantacal::detail::CardReader::line_of(root) == 0)
    // No node where the parser stopped (a NUL byte ends yaml-cpp's stream): at 1:1.
    throw InputError(reader.file(), 1, 1, "", "", std::string("expected ") + kCaseFile);
  if (!root.IsMap())
    reader.fail(root, "", kCaseFile);
  reader.check_keys(root, "",
                    {"name", "geometry", "mesh", "materials", "initial_temperature",
                     "boundaries", "sources", "time", "output", "solver", "adaptivity"});
  for (const char* key : {"mesh", "materials", "initial_temperature", "time", "output"})
    if (!root[key])
      reader.fail_missing(root, "", key, "see docs/cases.md");
  description.name = root["name"] ? reader.text(root["name"], "name")
                                  : std::filesystem::path(reader.file()).stem().string();
  read_geometry(reader, root, description);
  read_mesh(reader, root, description);
  description.initial_temperature =
      reader.temperature(root["initial_temperature"], "initial_temperature");
  description.initial_where =
      reader.where(root["initial_temperature"], "initial_temperature");
  read_materials(reader, root, load_materials, description);
  read_boundaries(reader, root, description);
  read_sources(reader, root, description);
  read_time(reader, root, description);
  read_output(reader, root, description);
  read_solver_settings(reader, root, description);
  read_adaptivity(reader, root, description);
  return description;
}

} // namespace

void read_mesh(const CaseReader& reader, const YAML::Node& root,
               CaseDescription& description) {
  const YAML::Node block = root["mesh"];
  const int dim = description.dimension();
  reader.check_keys(block, "mesh",
                    {"file", "generator", "origin", "size", "cells", "radius", "length",
                     "refinements", "material_id", "regions"});
  description.mesh.where = reader.where(block, "mesh");
  if (block["file"]) {
    read_mesh_file(reader, block, description.mesh);
  } else if (block["generator"]) {
    description.mesh.kind =
        read_generator_kind(reader, block["generator"], description.geometry, dim);
    read_generator_extent(reader, block, dim, description.mesh);
    if (block["cells"])
      read_generator_cells(reader, block["cells"], dim, description.mesh);
  } else {
    reader.fail(
        block, "mesh",
        "a mesh with a `file` (Gmsh .msh) or a `generator` (plate, block, cylinder)");
  }
  if (block["refinements"])
    description.mesh.refinements = reader.count(block["refinements"], "mesh.refinements",
                                                "a whole number from 0 to 8", 0, 8);
  if (block["material_id"])
    description.mesh.material_id = reader.count(block["material_id"], "mesh.material_id",
                                                "a material id from 0 to 255", 0, 255);
  if (block["regions"])
    read_regions(reader, block["regions"], dim, description.mesh);
}

void read_materials(const CaseReader& reader, const YAML::Node& root, bool load_materials,
                    CaseDescription& description) {
  const YAML::Node list = root["materials"];
  if (!list.IsSequence() || list.size() == 0)
    reader.fail(list, "materials", "a list of {id, card} entries");
  std::set<unsigned int> seen;
  for (std::size_t i = 0; i < list.size(); ++i)
    description.materials.push_back(read_material(reader, root, list[i],
                                                  index_path("materials", i),
                                                  load_materials, description, seen));
}

} // namespace detail

CaseDescription load_case_from_string(const std::string& text, const std::string& file,
                                      const std::string& base_directory,
                                      bool load_materials) {
  const YAML::Node root = quantacal::detail::parse_yaml(text, file);
  if (!detail::has_content(text)) // (blank, comments only, "---"): at its start
    throw InputError(file, 1, 1, "", "",
                     std::string("expected ") + detail::kCaseFile +
                         " (the file is empty)");
  const detail::CaseReader reader(file, base_directory);
  try {
    return detail::read_case(root, reader, load_materials);
  } catch (const YAML::Exception& e) {
    throw InputError(file, e.mark.line >= 0 ? e.mark.line + 1 : 0,
                     e.mark.column >= 0 ? e.mark.column + 1 : 0, "", "",
                     "expected a well-formed case file (" + e.msg + ")");
  }
}

CaseDescription load_case(const std::string& path) {
  std::ifstream in(path, std::ios::binary);
  if (!in)
    throw InputError(path, 0, 0, "", "",
                     "expected a readable case file (cannot open it)");
  std::ostringstream ss;
  ss << in.rdbuf();
  const std::filesystem::path p(path);
  std::string base = p.parent_path().string();
  if (base.empty())
    base = ".";
  return load_case_from_string(ss.str(), path, base, true);
}

} // namespace quantacal::solver
