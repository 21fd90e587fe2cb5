// SPDX-License-Identifier: Apache-2.0
// The `phases` list of a card: solid phases and a liquid, each with its own
// heat-capacity terms, dilation, conductivity and density, joined at transition
// temperatures (docs/cards.md, "Phases"; the join rule is in models/phases.h).
#include "card_reader.h"

#include <quantacal/common/text.h>

#include "units_detail.h"

#include <algorithm>
#include <limits>
#include <stdexcept>

namespace quantacal::detail {
namespace {

const std::vector<std::string> kPhaseKeys = {
    "name", "liquid", "from", "heat_capacity", "dilation", "conductivity", "density"};

bool read_liquid(CardReader& reader, const YAML::Node& phase, const std::string& path) {
  const YAML::Node n = reader.optional(phase, "liquid");
  if (!n.IsDefined())
    return false;
  const std::string p = join_path(path, "liquid");
  const std::string v = reader.text(n, p);
  if (v == "true")
    return true;
  if (v == "false")
    return false;
  reader.fail(n, p, v, "expected true or false");
}

// `from`: where this phase takes over from the one before.
PhaseBoundary read_boundary(CardReader& reader, const YAML::Node& from,
                            const std::string& path, const CardBasics& basics,
                            bool liquid_after_solid) {
  reader.check_keys(from, path, {"temperature", "latent_heat", "width"});
  PhaseBoundary b;
  const std::string tpath = join_path(path, "temperature");
  b.temperature =
      reader.positive_temperature(reader.require(from, path, "temperature"), tpath);
  reader.record_parameter(from["temperature"], tpath);

  const YAML::Node l = reader.optional(from, "latent_heat");
  const std::string lpath = join_path(path, "latent_heat");
  if (l.IsDefined()) {
    std::size_t found = 0;
    b.latent_heat = reader.quantity_of(
        l, lpath, {dimension::molar_energy(), dimension::specific_energy()}, found);
    if (found == 1)
      b.latent_heat *= basics.molar_mass;
    if (!(b.latent_heat >= 0.0))
      reader.fail(l, lpath, reader.text(l, lpath), "expected a latent heat >= 0");
    reader.record_parameter(l, lpath);
  }
  if (liquid_after_solid && !(b.latent_heat > 0.0))
    reader.fail(l.IsDefined() ? l : from, lpath,
                l.IsDefined() ? reader.text(l, lpath) : "",
                "expected the latent heat of melting (> 0): a liquid follows a solid");

  const std::string wpath = join_path(path, "width");
  const YAML::Node w = reader.require(from, path, "width");
  b.width = reader.positive_temperature_difference(w, wpath);
  reader.record_parameter(w, wpath);
  if (!(b.width < b.temperature / 4))
    reader.fail(w, wpath, reader.text(w, wpath),
                "expected a width below a quarter of the transition temperature");
  return b;
}

// Boundaries in order and joins apart: located at the later phase's `from`.
void check_order(CardReader& reader, const std::vector<PhaseBoundary>& b,
                 const std::vector<YAML::Node>& from,
                 const std::vector<std::string>& path) {
  for (std::size_t i = 1; i < b.size(); ++i) {
    const std::string tpath = join_path(path[i], "temperature");
    if (!(b[i].temperature > b[i - 1].temperature))
      reader.fail(from[i]["temperature"], tpath,
                  reader.text(from[i]["temperature"], tpath),
                  "expected a temperature above the previous transition (" +
                      format_double(b[i - 1].temperature) +
                      " K): phases are listed from cold to hot");
    const double start = b[i].temperature - 0.5 * b[i].width;
    const double end_before = b[i - 1].temperature + 0.5 * b[i - 1].width;
    if (!(start > end_before))
      reader.fail(from[i]["width"], join_path(path[i], "width"),
                  reader.text(from[i]["width"], join_path(path[i], "width")),
                  "expected joins that do not overlap: this one starts at " +
                      format_double(start) + " K, before the previous one ends at " +
                      format_double(end_before) + " K");
  }
}

// A join must lie inside the valid range: outside it the phase is never
// reached, or its latent heat is already spent below the range.
void check_inside(CardReader& reader, const PhaseBoundary& b, const YAML::Node& from,
                  const std::string& path, const ConductivityContext& range) {
  const double lo = b.temperature - 0.5 * b.width;
  const double hi = b.temperature + 0.5 * b.width;
  if (lo > range.lower_temperature && hi < range.upper_temperature)
    return;
  const std::string tpath = join_path(path, "temperature");
  reader.fail(from["temperature"], tpath, reader.text(from["temperature"], tpath),
              "expected a transition whose join (" + format_double(lo) + " K to " +
                  format_double(hi) + " K) lies inside the valid range (" +
                  format_double(range.lower_temperature) + " K to " +
                  format_double(range.upper_temperature) + " K)");
}

} // namespace

ReadPhases read_phases(CardReader& reader, const YAML::Node& list,
                       const std::string& path, const CardBasics& basics,
                       const std::string& material_name, const ConductivityContext& range,
                       double reference_density, bool top_conductivity) {
  reader.expect_sequence(list, path);
  if (list.size() < 2)
    reader.fail(
        list, path, "",
        "expected at least two phases (a card of one phase uses `heat_capacity`)");
  std::vector<PhaseBoundary> boundaries;
  std::vector<YAML::Node> from_nodes;
  std::vector<std::string> from_paths;
  std::vector<std::shared_ptr<const HeatCapacityModel>> models;
  std::vector<YAML::Node> conductivity_nodes;
  ReadPhases out;
  for (std::size_t i = 0; i < list.size(); ++i) {
    const std::string ip = index_path(path, i);
    const YAML::Node phase = list[i];
    reader.check_keys(phase, ip, kPhaseKeys);
    PhaseInfo info;
    info.name = reader.text(reader.require(phase, ip, "name"), join_path(ip, "name"));
    info.liquid = read_liquid(reader, phase, ip);
    const YAML::Node from = reader.optional(phase, "from");
    if (i == 0 && from.IsDefined())
      reader.fail(from, join_path(ip, "from"), "",
                  "the first phase starts at the card's lower end; remove `from`");
    if (i > 0) {
      const YAML::Node f = reader.require(phase, ip, "from");
      if (out.info.back().liquid && !info.liquid)
        reader.fail(phase["liquid"].IsDefined() ? phase["liquid"] : phase, ip, info.name,
                    "expected a liquid after a liquid (a solid phase above the melt)");
      const std::string fpath = join_path(ip, "from");
      boundaries.push_back(read_boundary(reader, f, fpath, basics,
                                         info.liquid && !out.info.back().liquid));
      from_nodes.push_back(f);
      from_paths.push_back(fpath);
      check_inside(reader, boundaries.back(), f, fpath, range);
    }
    const YAML::Node rho = reader.optional(phase, "density");
    info.density = i == 0 ? reference_density : out.info.back().density;
    if (rho.IsDefined()) {
      const std::string dpath = join_path(ip, "density");
      info.density = reader.quantity(rho, dpath, dimension::density());
      if (!(info.density > 0.0))
        reader.fail(rho, dpath, reader.text(rho, dpath), "expected a density > 0 kg/m^3");
      reader.record_parameter(rho, dpath);
    }

    const std::string hpath = join_path(ip, "heat_capacity");
    const YAML::Node hc = reader.require(phase, ip, "heat_capacity");
    std::vector<ContributionPtr> terms = read_heat_capacity(reader, hc, hpath, basics);
    std::optional<Dilation> dilation;
    const YAML::Node dil = reader.optional(phase, "dilation");
    if (dil.IsDefined())
      dilation = read_dilation(reader, dil, join_path(ip, "dilation"));
    try {
      models.push_back(std::make_shared<const HeatCapacityModel>(
          material_name + " (" + info.name + ")", std::move(terms), dilation));
    } catch (const std::invalid_argument& e) {
      reader.fail(hc, hpath, "", e.what());
    }
    conductivity_nodes.push_back(reader.optional(phase, "conductivity"));
    if (top_conductivity && conductivity_nodes.back().IsDefined())
      reader.fail(conductivity_nodes.back(), join_path(ip, "conductivity"), "",
                  "the card has a card-level `conductivity`: give it there or in every "
                  "phase, not both");
    if (!top_conductivity && i == 0 && !conductivity_nodes.back().IsDefined())
      reader.fail(phase, join_path(ip, "conductivity"), "",
                  "missing field (or one card-level `conductivity` for all phases; a "
                  "later phase without one keeps the one before)");
    out.info.push_back(std::move(info));
  }
  check_order(reader, boundaries, from_nodes, from_paths);
  PhaseLayout layout(boundaries);

  // Each phase model must be defined where it is evaluated, joins included.
  for (std::size_t i = 0; i < models.size(); ++i) {
    const double lo = std::max(layout.phase_lower(i), range.lower_temperature);
    const double hi = std::min(layout.phase_upper(i), range.upper_temperature);
    if (models[i]->lower_temperature() > lo || models[i]->upper_temperature() < hi) {
      const std::string hpath = join_path(index_path(path, i), "heat_capacity");
      reader.fail(list[i]["heat_capacity"], hpath, "",
                  "expected terms defined from " + format_double(lo) + " K to " +
                      format_double(hi) +
                      " K (the phase with its joins, inside the "
                      "valid range), but they are defined from " +
                      format_double(models[i]->lower_temperature()) + " K to " +
                      format_double(models[i]->upper_temperature()) + " K");
    }
  }
  out.heat_capacity = make_phase_sequence(models, layout);

  if (!top_conductivity) {
    // A phase without its own conductivity keeps the one before, which must then
    // cover that phase too.
    std::vector<ConductivityPtr> k(models.size());
    for (std::size_t i = 0; i < models.size(); ++i) {
      if (!conductivity_nodes[i].IsDefined())
        continue;
      std::size_t last = i;
      while (last + 1 < models.size() && !conductivity_nodes[last + 1].IsDefined())
        ++last;
      ConductivityContext cc;
      cc.lower_temperature = std::max(layout.phase_lower(i), range.lower_temperature);
      cc.upper_temperature = std::min(layout.phase_upper(last), range.upper_temperature);
      const ConductivityPtr model =
          read_conductivity(reader, conductivity_nodes[i],
                            join_path(index_path(path, i), "conductivity"), cc);
      for (std::size_t j = i; j <= last; ++j)
        k[j] = model;
    }
    out.conductivity = make_phase_conductivity(std::move(k), layout);
  }
  out.layout = std::make_shared<const PhaseLayout>(std::move(layout));
  return out;
}

} // namespace quantacal::detail
