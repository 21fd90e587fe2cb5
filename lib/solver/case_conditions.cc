// SPDX-License-Identifier: Apache-2.0
// Reading the `boundaries` and `sources` of a case file (docs/cases.md); a
// convection may name a quenchant curve (docs/quenchants.md).
#include "case_reader.h"

#include <quantacal/common/exceptions.h>
#include <quantacal/common/text.h>
#include <quantacal/solver/quenchant.h>

#include <algorithm>
#include <cmath>
#include <filesystem>
#include <set>

namespace quantacal::solver::detail {
namespace {

using quantacal::detail::index_path;

std::optional<Curve> read_fixed_temperature(const CaseReader& reader,
                                            const YAML::Node& entry,
                                            const std::string& field) {
  if (entry["convection"] || entry["radiation"] || entry["insulated"])
    reader.fail(
        entry["temperature"], field + ".temperature",
        "a fixed temperature alone (not with convection, radiation or insulated)");
  return reader.curve(entry["temperature"], field + ".temperature",
                      {dimension::time(), "a time", dimension::temperature(),
                       "a temperature", /*positive_y=*/true});
}

/** `h:` a constant or a table [[T_surface, h], ...], and the ambient temperature. */
BoundarySpec::Convection read_coefficient(const CaseReader& reader,
                                          const YAML::Node& node,
                                          const std::string& field) {
  for (const char* key : {"h", "ambient"})
    if (!node[key])
      reader.fail_missing(
          node, field, key,
          key == std::string("h")
              ? "a heat-transfer coefficient or a table [[T_surface, h], ...], or a "
                "quenchant (docs/quenchants.md)"
              : "an ambient temperature");
  if (node["agitation"])
    reader.fail(node["agitation"], field + ".agitation",
                "agitation only with a quenchant (scale h itself otherwise)");
  BoundarySpec::Convection convection;
  convection.coefficient = reader.curve(
      node["h"], field + ".h",
      {dimension::temperature(), "a surface temperature",
       dimension::heat_transfer_coefficient(),
       "a heat-transfer coefficient (e.g. \"500 W/m^2/K\")", /*positive_y=*/false});
  // Every coefficient finite and >= 0: a negative h would pump heat against the
  // temperature difference. The rows of a table are checked by curve() too; a single
  // value is checked only here. (NaN and infinity are already refused by the units
  // parser; the test is kept for values that reach here any other way.)
  const YAML::Node h = node["h"];
  for (std::size_t i = 0; i < convection.coefficient.size(); ++i) {
    const double value = convection.coefficient.y()[i];
    if (!(value >= 0.0) || !std::isfinite(value)) {
      if (h.IsScalar())
        reader.fail(h, field + ".h",
                    "a heat-transfer coefficient >= 0 W/m^2/K (finite), e.g. \"500 "
                    "W/m^2/K\"");
      reader.fail(h[i][1], index_path(field + ".h", i) + "[1]",
                  "a heat-transfer coefficient >= 0 W/m^2/K (finite), e.g. \"500 "
                  "W/m^2/K\"");
    }
  }
  convection.ambient_temperature =
      reader.temperature(node["ambient"], field + ".ambient");
  return convection;
}

/** The file of `quenchant: NAME` (looked up by name) or `quenchant_file: PATH`. */
std::string quenchant_path(const CaseReader& reader, const YAML::Node& node,
                           const std::string& field) {
  if (node["quenchant_file"]) {
    const std::string path =
        reader.path(node["quenchant_file"], field + ".quenchant_file");
    if (!std::filesystem::is_regular_file(path))
      reader.fail(node["quenchant_file"], field + ".quenchant_file",
                  "an existing quenchant file (not found: " + path + ")");
    return path;
  }
  const std::string name = reader.text(node["quenchant"], field + ".quenchant");
  const std::string path = find_quenchant(name);
  if (!path.empty())
    return path;
  std::string names, folders;
  for (const std::string& n : quenchant_names())
    names += (names.empty() ? "" : ", ") + n;
  for (const std::string& f : quenchant_folders())
    folders += (folders.empty() ? "" : ", ") + f;
  reader.fail(node["quenchant"], field + ".quenchant",
              "the name of a quenchant" + did_you_mean(name, quenchant_names()) +
                  "; available: " + (names.empty() ? "none" : names) + " (searched: " +
                  folders + "); or quenchant_file: a path to a quenchant file");
}

/** `quenchant:` or `quenchant_file:`, with `agitation:` and `ambient:` optional. */
BoundarySpec::Convection read_quenchant(const CaseReader& reader, const YAML::Node& node,
                                        const std::string& field) {
  const char* key = node["quenchant"] ? "quenchant" : "quenchant_file";
  if (node["h"])
    reader.fail(node[key], field + "." + key,
                "either h or a quenchant, not both (the quenchant gives h)");
  if (node["quenchant"] && node["quenchant_file"])
    reader.fail(node["quenchant_file"], field + ".quenchant_file",
                "either quenchant (a name) or quenchant_file (a path), not both");
  const std::string path = quenchant_path(reader, node, field);
  Quenchant quenchant;
  try {
    quenchant = load_quenchant(path);
  } catch (const InputError& e) {
    const CaseLocation at = reader.where(node[key], field + "." + key);
    throw InputError(e.file(), e.line(), e.column(), e.field(), e.value(),
                     e.expected() + " (in the quenchant of " + reader.file() + ":" +
                         std::to_string(at.line) + ":" + std::to_string(at.column) + ")");
  }
  double agitation = 1.0;
  if (node["agitation"]) {
    agitation = reader.number(node["agitation"], field + ".agitation",
                              "an agitation factor multiplying h, > 0 and <= 10");
    if (!(agitation > 0.0 && agitation <= 10.0))
      reader.fail(
          node["agitation"], field + ".agitation",
          "an agitation factor multiplying h, > 0 and <= 10 (docs/quenchants.md)");
  }
  std::vector<double> h = quenchant.coefficient.y();
  for (double& value : h)
    value *= agitation;
  BoundarySpec::Convection convection;
  convection.coefficient = Curve(quenchant.coefficient.x(), std::move(h));
  convection.ambient_temperature =
      node["ambient"] ? reader.temperature(node["ambient"], field + ".ambient")
                      : quenchant.bath_temperature;
  return convection;
}

BoundarySpec::Convection read_convection(const CaseReader& reader, const YAML::Node& node,
                                         const std::string& field) {
  reader.check_keys(node, field,
                    {"h", "ambient", "quenchant", "quenchant_file", "agitation"});
  if (node["quenchant"] || node["quenchant_file"])
    return read_quenchant(reader, node, field);
  return read_coefficient(reader, node, field);
}

BoundarySpec::Radiation read_radiation(const CaseReader& reader, const YAML::Node& node,
                                       const std::string& field) {
  reader.check_keys(node, field, {"emissivity", "ambient"});
  for (const char* key : {"emissivity", "ambient"})
    if (!node[key])
      reader.fail_missing(node, field, key,
                          key == std::string("ambient") ? "an ambient temperature"
                                                        : "an emissivity in (0, 1]");
  BoundarySpec::Radiation radiation;
  radiation.emissivity =
      reader.number(node["emissivity"], field + ".emissivity", "an emissivity in (0, 1]");
  if (!(radiation.emissivity > 0.0 && radiation.emissivity <= 1.0))
    reader.fail(node["emissivity"], field + ".emissivity", "an emissivity in (0, 1]");
  radiation.ambient_temperature = reader.temperature(node["ambient"], field + ".ambient");
  return radiation;
}

void check_insulated(const CaseReader& reader, const YAML::Node& entry,
                     const std::string& field) {
  if (!reader.boolean(entry["insulated"], field + ".insulated"))
    reader.fail(entry["insulated"], field + ".insulated",
                "true (omit the key otherwise)");
  if (entry["convection"] || entry["radiation"])
    reader.fail(entry["insulated"], field + ".insulated",
                "insulated alone (not with convection or radiation)");
}

/** One entry of `boundaries`; @p seen holds the boundary ids so far. */
BoundarySpec read_boundary(const CaseReader& reader, const YAML::Node& entry,
                           const std::string& field, std::set<unsigned int>& seen) {
  reader.check_keys(entry, field,
                    {"id", "temperature", "convection", "radiation", "insulated"});
  if (!entry["id"])
    reader.fail_missing(entry, field, "id", "a boundary id");
  BoundarySpec spec;
  spec.boundary_id =
      reader.count(entry["id"], field + ".id", "a boundary id from 0 to 254", 0, 254);
  spec.where = reader.where(entry["id"], field + ".id");
  if (!seen.insert(spec.boundary_id).second)
    reader.fail(entry["id"], field + ".id",
                "each boundary id once (combine convection and radiation in one entry)");
  if (entry["temperature"])
    spec.temperature = read_fixed_temperature(reader, entry, field);
  if (entry["convection"])
    spec.convection = read_convection(reader, entry["convection"], field + ".convection");
  if (entry["radiation"])
    spec.radiation = read_radiation(reader, entry["radiation"], field + ".radiation");
  if (entry["insulated"])
    check_insulated(reader, entry, field);
  if (!entry["temperature"] && !entry["convection"] && !entry["radiation"] &&
      !entry["insulated"])
    reader.fail(entry, field,
                "one of temperature, convection, radiation or insulated: true");
  return spec;
}

HeatSource read_source(const CaseReader& reader, const YAML::Node& entry,
                       const std::string& field,
                       const std::vector<MaterialSpec>& materials) {
  reader.check_keys(entry, field, {"power_density", "materials", "start", "end"});
  if (!entry["power_density"])
    reader.fail_missing(entry, field, "power_density",
                        "a power density (e.g. \"2 MW/m^3\")");
  HeatSource source;
  source.power_density =
      reader.quantity(entry["power_density"], field + ".power_density",
                      dimension::power_density(), "a power density (e.g. \"2 MW/m^3\")");
  if (entry["materials"]) {
    const YAML::Node ids = entry["materials"];
    if (!ids.IsSequence())
      reader.fail(ids, field + ".materials", "a list of material ids");
    for (std::size_t j = 0; j < ids.size(); ++j) {
      const std::string path = index_path(field + ".materials", j);
      const auto id = reader.count(ids[j], path, "a material id from 0 to 255", 0, 255);
      if (std::find(source.material_ids.begin(), source.material_ids.end(), id) !=
          source.material_ids.end())
        reader.fail(ids[j], path, "a material id not already in the list");
      // a source on an id no material has would heat nothing, silently
      const bool known = std::any_of(materials.begin(), materials.end(),
                                     [id](const MaterialSpec& m) { return m.id == id; });
      if (!known) {
        std::string listed;
        for (const MaterialSpec& m : materials)
          listed += (listed.empty() ? "" : ", ") + std::to_string(m.id);
        reader.fail(ids[j], path,
                    "the id of a material of this case (materials[].id: " +
                        (listed.empty() ? std::string("none") : listed) + ")");
      }
      source.material_ids.push_back(id);
    }
  }
  if (entry["start"]) {
    source.start =
        reader.quantity(entry["start"], field + ".start", dimension::time(), "a time");
    if (!(source.start >= 0.0))
      reader.fail(entry["start"], field + ".start",
                  "a start time >= 0 s (the run starts at 0 s)");
  }
  if (entry["end"])
    source.end =
        reader.quantity(entry["end"], field + ".end", dimension::time(), "a time");
  if (!(source.end > source.start))
    reader.fail(entry["end"] ? entry["end"] : entry, field + ".end",
                "an end time after the start time");
  source.where = reader.where(entry, field);
  return source;
}

} // namespace

void read_boundaries(const CaseReader& reader, const YAML::Node& root,
                     CaseDescription& description) {
  if (!root["boundaries"])
    return;
  const YAML::Node list = root["boundaries"];
  if (!list.IsSequence())
    reader.fail(list, "boundaries", "a list of boundary conditions {id, ...}");
  std::set<unsigned int> seen;
  for (std::size_t i = 0; i < list.size(); ++i)
    description.boundaries.push_back(
        read_boundary(reader, list[i], index_path("boundaries", i), seen));
}

void read_sources(const CaseReader& reader, const YAML::Node& root,
                  CaseDescription& description) {
  if (!root["sources"])
    return;
  const YAML::Node list = root["sources"];
  if (!list.IsSequence())
    reader.fail(list, "sources",
                "a list of heat sources {power_density, materials, start, end}");
  for (std::size_t i = 0; i < list.size(); ++i)
    description.sources.push_back(
        read_source(reader, list[i], index_path("sources", i), description.materials));
}

} // namespace quantacal::solver::detail
