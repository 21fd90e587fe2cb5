// SPDX-License-Identifier: Apache-2.0
// YAML material cards -> Material (docs/cards.md).
#include <quantacal/cards/card.h>
#include <quantacal/common/text.h>

#include "card_reader.h"
#include "fit_record_reader.h"
#include "units_detail.h"

#include <quantacal/common/exceptions.h>

#include <yaml-cpp/yaml.h>

#include <algorithm>
#include <cmath>
#include <filesystem>
#include <fstream>
#include <limits>
#include <sstream>
#include <stdexcept>

namespace quantacal {
namespace detail {
namespace {

namespace fs = std::filesystem;

const std::vector<std::string> kTopKeys = {"name",
                                           "description",
                                           "molar_mass",
                                           "reference_density",
                                           "valid_range",
                                           "reference_temperature",
                                           "table_tolerance",
                                           "heat_capacity",
                                           "dilation",
                                           "conductivity",
                                           "composition",
                                           "phases",
                                           "sources",
                                           "measurements",
                                           "fit"};

/** Cards being loaded, outermost first, for cycle reports. */
struct LoadChain {
  std::vector<std::string> canonical;
  std::vector<std::string> shown;
};

std::string canonical_name(const std::string& file) {
  std::error_code ec;
  const fs::path p = fs::weakly_canonical(fs::absolute(fs::path(file)), ec);
  return ec ? file : p.string();
}

MaterialPtr load_file(const std::string& path, LoadChain& chain);

void read_sources(CardReader& reader, const YAML::Node& list, const std::string& path,
                  MaterialData& data) {
  reader.expect_sequence(list, path);
  std::vector<std::string> parameter_paths;
  for (const auto& p : reader.parameters())
    parameter_paths.push_back(p.path);
  std::vector<std::string> covered;
  for (std::size_t i = 0; i < list.size(); ++i) {
    const std::string ipath = index_path(path, i);
    const YAML::Node item = list[i];
    reader.check_keys(item, ipath, {"for", "cite"});
    const YAML::Node cite = reader.require(item, ipath, "cite");
    const std::string citation = reader.text(cite, join_path(ipath, "cite"));
    if (citation.find_first_not_of(" \t") == std::string::npos)
      reader.fail(cite, join_path(ipath, "cite"), citation, "expected a citation");
    const YAML::Node for_node = reader.require(item, ipath, "for");
    const std::string fpath = join_path(ipath, "for");
    std::vector<std::pair<YAML::Node, std::string>> targets;
    if (for_node.IsSequence()) {
      for (std::size_t k = 0; k < for_node.size(); ++k)
        targets.emplace_back(for_node[k], reader.text(for_node[k], index_path(fpath, k)));
    } else {
      targets.emplace_back(for_node, reader.text(for_node, fpath));
    }
    std::string joined;
    for (const auto& [node, target] : targets) {
      // A target names a parameter, or a prefix of parameters ("heat_capacity[0]").
      bool matches = false;
      for (const auto& p : parameter_paths)
        matches = matches || p == target ||
                  (p.size() > target.size() && p.compare(0, target.size(), target) == 0 &&
                   (p[target.size()] == '.' || p[target.size()] == '['));
      if (!matches)
        reader.fail(node, fpath, target,
                    "names no parameter of this card" +
                        did_you_mean(target, parameter_paths));
      covered.push_back(target);
      joined += (joined.empty() ? "" : ", ") + target;
    }
    data.sources.push_back(Source{joined, citation});
  }
  for (const auto& p : reader.parameters()) {
    bool ok = false;
    for (const auto& c : covered)
      ok = ok || p.path == c ||
           (p.path.size() > c.size() && p.path.compare(0, c.size(), c) == 0 &&
            (p.path[c.size()] == '.' || p.path[c.size()] == '['));
    if (!ok)
      reader.fail_at(p.line, p.column, p.path, p.value,
                     "no `sources` entry names this parameter (every parameter needs a "
                     "published source, \"from memory\" or \"illustrative\")");
  }
}

void read_measurements(CardReader& reader, const YAML::Node& list,
                       const std::string& path, MaterialData& data) {
  reader.expect_sequence(list, path);
  for (std::size_t i = 0; i < list.size(); ++i) {
    const std::string ipath = index_path(path, i);
    const YAML::Node item = list[i];
    reader.check_keys(item, ipath, {"quantity", "T", "value", "tolerance", "source"});
    Measurement m;
    m.line = CardReader::line_of(item);
    const YAML::Node q = reader.require(item, ipath, "quantity");
    const std::string qpath = join_path(ipath, "quantity");
    const std::string quantity = reader.text(q, qpath);
    const std::vector<std::string> kinds = {"specific_heat", "stored_energy",
                                            "conductivity"};
    std::vector<Dimension> dimensions;
    if (quantity == "specific_heat") {
      m.quantity = Measurement::Quantity::specific_heat;
      dimensions = {dimension::molar_capacity(), dimension::specific_capacity()};
    } else if (quantity == "stored_energy") {
      m.quantity = Measurement::Quantity::stored_energy;
      dimensions = {dimension::molar_energy(), dimension::specific_energy()};
    } else if (quantity == "conductivity") {
      m.quantity = Measurement::Quantity::conductivity;
      dimensions = {dimension::conductivity()};
    } else {
      reader.fail(q, qpath, quantity,
                  "unknown quantity" + did_you_mean(quantity, kinds) +
                      "; expected specific_heat, stored_energy or conductivity");
    }
    const std::string tpath = join_path(ipath, "T");
    const YAML::Node t = reader.require(item, ipath, "T");
    m.temperature = reader.positive_temperature(t, tpath);
    if (m.temperature < data.lower_temperature || m.temperature > data.upper_temperature)
      reader.fail(t, tpath, reader.text(t, tpath),
                  "expected a temperature inside the valid range " +
                      format_double(data.lower_temperature) + " K to " +
                      format_double(data.upper_temperature) + " K");
    const std::string vpath = join_path(ipath, "value");
    const YAML::Node v = reader.require(item, ipath, "value");
    std::size_t found = 0;
    m.value = reader.quantity_of(v, vpath, dimensions, found);
    if (found == 1)
      m.value *= data.molar_mass; // per kg -> per mole
    // A heat capacity or a conductivity is positive; a stored energy may have
    // either sign (it counts from the reference temperature).
    if (m.quantity != Measurement::Quantity::stored_energy && !(m.value > 0.0))
      reader.fail(v, vpath, reader.text(v, vpath),
                  m.quantity == Measurement::Quantity::conductivity
                      ? "expected a measured conductivity > 0 W/m/K"
                      : "expected a measured specific heat > 0");
    const std::string tolpath = join_path(ipath, "tolerance");
    const YAML::Node tol = reader.require(item, ipath, "tolerance");
    m.tolerance = reader.number(tol, tolpath);
    if (!(m.tolerance > 0.0 && m.tolerance < 1.0))
      reader.fail(tol, tolpath, reader.text(tol, tolpath),
                  "expected a relative tolerance between 0 and 1 (e.g. 0.03)");
    const YAML::Node s = reader.require(item, ipath, "source");
    m.source = reader.text(s, join_path(ipath, "source"));
    data.measurements.push_back(m);
  }
}

// The valid range shared by the components of a composed card: from the
// highest of their lower ends to the lowest of their upper ends.
struct ComponentRange {
  double lower = 0.0;
  double upper = std::numeric_limits<double>::infinity();
  std::string list; ///< "iron.yaml: 100 K to 800 K, ..." for messages
};

std::vector<ContributionPtr> read_composition(CardReader& reader, const YAML::Node& list,
                                              const std::string& path,
                                              const std::string& file, LoadChain& chain,
                                              double& molar_mass, ComponentRange& range) {
  reader.expect_sequence(list, path);
  if (list.size() == 0)
    reader.fail(list, path, "", "expected at least one component");
  const fs::path folder = fs::path(file).parent_path();
  std::vector<ContributionPtr> parts;
  double sum = 0.0;
  molar_mass = 0.0;
  for (std::size_t i = 0; i < list.size(); ++i) {
    const std::string ipath = index_path(path, i);
    const YAML::Node item = list[i];
    reader.check_keys(item, ipath, {"card", "mole_fraction"});
    const YAML::Node card = reader.require(item, ipath, "card");
    const std::string cpath = join_path(ipath, "card");
    const std::string relative = reader.text(card, cpath);
    const YAML::Node x_node = reader.require(item, ipath, "mole_fraction");
    const std::string xpath = join_path(ipath, "mole_fraction");
    const double x = reader.number(x_node, xpath);
    if (!(x > 0.0 && x <= 1.0))
      reader.fail(x_node, xpath, reader.text(x_node, xpath),
                  "expected a mole fraction in (0, 1]");
    reader.record_parameter(x_node, xpath);
    sum += x;
    const std::string component_file = (folder / fs::path(relative)).string();
    const std::string canonical = canonical_name(component_file);
    for (std::size_t k = 0; k < chain.canonical.size(); ++k) {
      if (chain.canonical[k] == canonical) {
        std::string cycle;
        for (std::size_t j = k; j < chain.shown.size(); ++j)
          cycle += chain.shown[j] + " -> ";
        cycle += component_file;
        reader.fail(card, cpath, relative, "composition cycle: " + cycle);
      }
    }
    if (!fs::exists(component_file))
      reader.fail(card, cpath, relative,
                  "expected an existing card file (looked for " + component_file + ")");
    const MaterialPtr component = load_file(component_file, chain);
    parts.push_back(make_scaled(component->data().model, x));
    molar_mass += x * component->molar_mass();
    range.lower = std::max(range.lower, component->lower_temperature());
    range.upper = std::min(range.upper, component->upper_temperature());
    range.list += (range.list.empty() ? "" : ", ") + relative + ": " +
                  format_double(component->lower_temperature()) + " K to " +
                  format_double(component->upper_temperature()) + " K";
  }
  if (std::abs(sum - 1.0) > 1e-6)
    reader.fail(list, path, format_double(sum),
                "expected mole fractions summing to 1 (within 1e-6), but they sum to " +
                    format_double(sum));
  return parts;
}

// The top-level nodes that later parts of the card reading refer back to.
struct CardNodes {
  YAML::Node composition;
  YAML::Node heat_capacity;
  YAML::Node phases;
  YAML::Node molar_mass;
  YAML::Node range;
  YAML::Node reference_temperature;
};

// Name, description, molar mass, density, valid range, reference temperature and
// table tolerance of the card rooted at @p root.
CardNodes read_card_basics(CardReader& reader, const YAML::Node& root,
                           MaterialData& data) {
  data.name = reader.text(reader.require(root, "", "name"), "name");
  data.description = reader.text(reader.require(root, "", "description"), "description");

  const YAML::Node composition = reader.optional(root, "composition");
  const YAML::Node heat_capacity = reader.optional(root, "heat_capacity");
  const YAML::Node phases = reader.optional(root, "phases");
  const int models = int(composition.IsDefined()) + int(heat_capacity.IsDefined()) +
                     int(phases.IsDefined());
  if (models > 1) {
    const YAML::Node second = phases.IsDefined() ? phases : composition;
    reader.fail(second, phases.IsDefined() ? "phases" : "composition", "",
                "give one of `heat_capacity`, `phases` or `composition`, not several");
  }
  if (models == 0)
    reader.fail(root, "heat_capacity", "",
                "missing field (or `phases` for a card with phase changes, or "
                "`composition` for a card made of other cards)");

  const YAML::Node mm = reader.optional(root, "molar_mass");
  if (mm.IsDefined()) {
    data.molar_mass = reader.quantity(mm, "molar_mass", dimension::molar_mass());
    if (!(data.molar_mass > 0.0))
      reader.fail(mm, "molar_mass", reader.text(mm, "molar_mass"),
                  "expected a molar mass > 0 g/mol");
    reader.record_parameter(mm, "molar_mass");
  } else if (!composition.IsDefined()) {
    reader.fail(root, "molar_mass", "", "missing field");
  }

  const YAML::Node rho = reader.require(root, "", "reference_density");
  data.reference_density =
      reader.quantity(rho, "reference_density", dimension::density());
  if (!(data.reference_density > 0.0))
    reader.fail(rho, "reference_density", reader.text(rho, "reference_density"),
                "expected a density > 0 kg/m^3");
  reader.record_parameter(rho, "reference_density");

  const YAML::Node range = reader.require(root, "", "valid_range");
  reader.check_keys(range, "valid_range", {"from", "to"});
  data.range_line = CardReader::line_of(range);
  data.range_column = CardReader::column_of(range);
  data.lower_temperature = reader.positive_temperature(
      reader.require(range, "valid_range", "from"), "valid_range.from");
  const YAML::Node to = reader.require(range, "valid_range", "to");
  data.upper_temperature = reader.positive_temperature(to, "valid_range.to");
  if (!(data.upper_temperature > data.lower_temperature))
    reader.fail(to, "valid_range.to", reader.text(to, "valid_range.to"),
                "expected the end of the valid range above its start (" +
                    format_double(data.lower_temperature) + " K)");

  const YAML::Node tref = reader.optional(root, "reference_temperature");
  if (tref.IsDefined()) {
    data.reference_temperature =
        reader.quantity(tref, "reference_temperature", dimension::temperature());
    if (!(data.reference_temperature >= 0.0))
      reader.fail(tref, "reference_temperature",
                  reader.text(tref, "reference_temperature"),
                  "expected a temperature >= 0 K");
  }
  const YAML::Node tol = reader.optional(root, "table_tolerance");
  if (tol.IsDefined()) {
    data.table_options.tolerance = reader.number(tol, "table_tolerance");
    if (!(data.table_options.tolerance >= 1e-13 && data.table_options.tolerance <= 1e-2))
      reader.fail(tol, "table_tolerance", reader.text(tol, "table_tolerance"),
                  "expected a relative tolerance between 1e-13 and 1e-2");
  }
  // (built at the end: assigning to a YAML::Node would assign the node's content)
  return CardNodes{composition, heat_capacity, phases, mm, range, tref};
}

// The terms of the heat-capacity model.
struct ModelTerms {
  std::vector<ContributionPtr> contributions;
  std::optional<Dilation> dilation;
};

// The terms of the heat-capacity model: the card's own terms and dilation, or
// composed from other cards (whose molar masses then give the card's if it
// states none).
ModelTerms read_model_terms(CardReader& reader, const YAML::Node& root,
                            const CardNodes& nodes, const std::string& file,
                            LoadChain& chain, MaterialData& data) {
  ModelTerms terms;
  const YAML::Node dil = reader.optional(root, "dilation");
  if (nodes.composition.IsDefined()) {
    if (dil.IsDefined())
      reader.fail(
          dil, "dilation", "",
          "a composed card takes the dilation of its components; remove `dilation`");
    double composed_mass = 0.0;
    ComponentRange shared;
    terms.contributions = read_composition(reader, nodes.composition, "composition", file,
                                           chain, composed_mass, shared);
    if (!nodes.molar_mass.IsDefined())
      data.molar_mass = composed_mass;
    // Neumann-Kopp adds the components' capacities, each valid only over its
    // own card's range: the composed card cannot claim more.
    if (data.lower_temperature < shared.lower || data.upper_temperature > shared.upper)
      reader.fail(nodes.range, "valid_range",
                  format_double(data.lower_temperature) + " K to " +
                      format_double(data.upper_temperature) + " K",
                  "expected a range inside the valid ranges of the composed cards, " +
                      format_double(shared.lower) + " K to " +
                      format_double(shared.upper) + " K (" + shared.list + ")");
  } else if (nodes.phases.IsDefined()) {
    if (dil.IsDefined())
      reader.fail(dil, "dilation", "",
                  "a card with phases gives a `dilation` in each phase that has one");
    CardBasics basics;
    basics.molar_mass = data.molar_mass;
    ConductivityContext range;
    range.lower_temperature = data.lower_temperature;
    range.upper_temperature = data.upper_temperature;
    ReadPhases phases =
        read_phases(reader, nodes.phases, "phases", basics, data.name, range,
                    data.reference_density, root["conductivity"].IsDefined());
    terms.contributions = {phases.heat_capacity};
    data.conductivity = phases.conductivity;
    data.phases = std::move(phases.info);
    data.phase_layout = std::move(phases.layout);
  } else {
    CardBasics basics;
    basics.molar_mass = data.molar_mass;
    terms.contributions =
        read_heat_capacity(reader, nodes.heat_capacity, "heat_capacity", basics);
    if (dil.IsDefined())
      terms.dilation = read_dilation(reader, dil, "dilation");
  }
  return terms;
}

// The heat-capacity model of @p terms; a rejection is located at the card's
// heat_capacity (or composition) block.
void build_model(CardReader& reader, const CardNodes& nodes, const ModelTerms& terms,
                 MaterialData& data) {
  try {
    data.model = std::make_shared<const HeatCapacityModel>(data.name, terms.contributions,
                                                           terms.dilation);
  } catch (const std::invalid_argument& e) {
    const bool composed = nodes.composition.IsDefined();
    const bool phased = nodes.phases.IsDefined();
    reader.fail(composed ? nodes.composition
                : phased ? nodes.phases
                         : nodes.heat_capacity,
                composed ? "composition"
                : phased ? "phases"
                         : "heat_capacity",
                "", e.what());
  }
}

// The model must be defined, finite and of positive capacity over the whole
// valid range, and the reference temperature inside its domain.
void check_model_over_range(CardReader& reader, const CardNodes& nodes,
                            const MaterialData& data) {
  const HeatCapacityModel& model = *data.model;
  if (data.lower_temperature < model.lower_temperature() ||
      data.upper_temperature > model.upper_temperature())
    reader.fail(nodes.range, "valid_range", "",
                "expected a range inside the domain of the heat-capacity terms, " +
                    format_double(model.lower_temperature()) + " K to " +
                    format_double(model.upper_temperature()) + " K");
  // 65 temperatures spread over the range, and both sides of every breakpoint
  // of the model (phase joins, kinks), where a table puts nodes: a capacity
  // that turns negative just below a join was missed by the spread alone
  // (fuzz_card, docs/reliability.md) and failed only when the table was built.
  std::vector<double> temperatures;
  const int n = 64;
  for (int i = 0; i <= n; ++i)
    temperatures.push_back(std::min(
        data.lower_temperature *
            std::pow(data.upper_temperature / data.lower_temperature, double(i) / n),
        data.upper_temperature));
  for (const double b : model.breakpoints())
    for (const double t : {std::nextafter(b, 0.0), b, std::nextafter(b, b + 1.0)})
      if (t >= data.lower_temperature && t <= data.upper_temperature)
        temperatures.push_back(t);
  for (const double t : temperatures) {
    try {
      const ThermalState s = model.evaluate(t);
      if (!std::isfinite(s.energy) || !std::isfinite(s.capacity) || !(s.capacity > 0.0))
        throw std::invalid_argument("C = " + format_double(s.capacity) + " J/mol/K at " +
                                    format_double(t) + " K");
    } catch (const std::exception& e) {
      reader.fail(nodes.range, "valid_range", "",
                  std::string("the heat-capacity model is not physical inside the valid "
                              "range: ") +
                      e.what());
    }
  }
  if (data.reference_temperature > 0.0 &&
      (data.reference_temperature < model.lower_temperature() ||
       data.reference_temperature > model.upper_temperature()))
    reader.fail(nodes.reference_temperature, "reference_temperature",
                reader.text(nodes.reference_temperature, "reference_temperature"),
                "expected a temperature inside the domain of the heat-capacity terms");
}

// A latent heat of the card's own terms must lie inside its valid range: above
// it the transition is never reached, below it its heat is already in every
// energy the card gives (most often a temperature written in the wrong unit).
void check_transitions_in_range(CardReader& reader, const CardNodes& nodes,
                                const MaterialData& data) {
  if (!nodes.heat_capacity.IsDefined())
    return;
  const auto& terms = data.model->contributions();
  for (std::size_t i = 0; i < terms.size(); ++i) {
    if (terms[i]->kind() != "transition")
      continue;
    double t = 0.0;
    for (const Parameter& p : terms[i]->parameters())
      if (p.name == "temperature")
        t = p.value;
    if (t >= data.lower_temperature && t <= data.upper_temperature)
      continue;
    const std::string path = join_path(index_path("heat_capacity", i), "temperature");
    const YAML::Node node = nodes.heat_capacity[i]["temperature"];
    reader.fail(node, path, reader.text(node, path),
                "expected a transition inside the valid range (" +
                    format_double(data.lower_temperature) + " K to " +
                    format_double(data.upper_temperature) +
                    " K): outside it the latent heat is never reached, or already "
                    "spent below it");
  }
}

MaterialPtr load_text(const std::string& text, const std::string& file,
                      LoadChain& chain) {
  const YAML::Node root = parse_yaml(text, file);
  CardReader reader(file);
  if (!root.IsDefined() || root.IsNull())
    throw CardError(file, 1, 1, "", "", "empty card: expected a map of keys and values");
  reader.check_keys(root, "", kTopKeys);

  MaterialData data;
  data.file = file;
  const CardNodes nodes = read_card_basics(reader, root, data);
  const ModelTerms terms = read_model_terms(reader, root, nodes, file, chain, data);
  ConductivityContext cc;
  cc.lower_temperature = data.lower_temperature;
  cc.upper_temperature = data.upper_temperature;
  if (!data.conductivity) // (a card with phases may give one per phase)
    data.conductivity = read_conductivity(
        reader, reader.require(root, "", "conductivity"), "conductivity", cc);
  build_model(reader, nodes, terms, data);
  check_model_over_range(reader, nodes, data);
  check_transitions_in_range(reader, nodes, data);

  read_sources(reader, reader.require(root, "", "sources"), "sources", data);
  const YAML::Node meas = reader.optional(root, "measurements");
  if (meas.IsDefined())
    read_measurements(reader, meas, "measurements", data);

  MaterialPtr material;
  try {
    material = std::make_shared<const Material>(std::move(data));
  } catch (const std::invalid_argument& e) {
    throw CardError(file, 0, 0, "", "", e.what());
  }
  return with_fit_record(reader, root, std::move(material));
}

MaterialPtr load_file(const std::string& path, LoadChain& chain) {
  std::ifstream in(path, std::ios::binary);
  if (!in)
    throw CardError(path, 0, 0, "", "", "cannot open the card file");
  std::ostringstream text;
  text << in.rdbuf();
  chain.canonical.push_back(canonical_name(path));
  chain.shown.push_back(path);
  MaterialPtr m = load_text(text.str(), path, chain);
  chain.canonical.pop_back();
  chain.shown.pop_back();
  return m;
}

} // namespace
} // namespace detail

MaterialPtr load_card(const std::string& path) {
  detail::LoadChain chain;
  return detail::load_file(path, chain);
}

MaterialPtr load_card_from_string(const std::string& text, const std::string& file) {
  detail::LoadChain chain;
  chain.canonical.push_back(detail::canonical_name(file));
  chain.shown.push_back(file);
  return detail::load_text(text, file, chain);
}

} // namespace quantacal
