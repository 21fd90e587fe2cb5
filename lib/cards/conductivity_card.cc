// SPDX-License-Identifier: Apache-2.0
// The `conductivity` block of a card. Each kind is one branch of
// read_conductivity; the list of kinds is in kConductivityKinds.
#include "card_reader.h"

#include "units_detail.h"

#include <quantacal/common/text.h>
#include <quantacal/models/metal_conductivity.h>

#include <array>
#include <stdexcept>

namespace quantacal::detail {
namespace {

const std::vector<std::string> kConductivityKinds = {"constant", "table", "metal"};

ConductivityPtr read_constant(CardReader& reader, const YAML::Node& node,
                              const std::string& path) {
  reader.check_keys(node, path, {"kind", "value"});
  const std::string vpath = join_path(path, "value");
  const YAML::Node value = reader.require(node, path, "value");
  const double k = reader.quantity(value, vpath, dimension::conductivity());
  if (!(k > 0.0))
    reader.fail(value, vpath, reader.text(value, vpath),
                "expected a conductivity > 0 W/m/K");
  reader.record_parameter(value, vpath);
  return make_constant_conductivity(k);
}

ConductivityPtr read_table(CardReader& reader, const YAML::Node& node,
                           const std::string& path, const ConductivityContext& context) {
  reader.check_keys(node, path, {"kind", "columns", "rows", "points"});
  ReadTable t = read_temperature_table(reader, node, path, {dimension::conductivity()},
                                       "a conductivity (W/m/K)", false);
  const YAML::Node rows = node["points"].IsDefined() ? node["points"] : node["rows"];
  const std::string rows_path =
      join_path(path, node["points"].IsDefined() ? "points" : "rows");
  // The valid range must lie inside the table (no silent power-law extrapolation).
  const double slack = 1e-12;
  if (context.lower_temperature > 0.0 &&
      (t.x.front() > context.lower_temperature * (1 + slack) ||
       t.x.back() < context.upper_temperature * (1 - slack)))
    reader.fail(rows, rows_path, "",
                "expected the table to cover the valid range " +
                    format_double(context.lower_temperature) + " K to " +
                    format_double(context.upper_temperature) + " K, but it spans " +
                    format_double(t.x.front()) + " K to " + format_double(t.x.back()) +
                    " K");
  reader.record_parameter(rows, rows_path);
  try {
    return make_table_conductivity(std::move(t.x), std::move(t.y));
  } catch (const std::invalid_argument& e) {
    reader.fail(rows, rows_path, "", e.what());
  }
}

/** `kind: metal`: residual + Bloch-Grueneisen resistivity and Wiedemann-Franz
 * (docs/cards.md). */
ConductivityPtr read_metal(CardReader& reader, const YAML::Node& node,
                           const std::string& path) {
  reader.check_keys(node, path,
                    {"kind", "theta_R", "reference_resistivity", "reference_temperature",
                     "rrr", "rho_0", "lorenz_number", "phonon_lorenz_number",
                     "wilson_ratio", "lattice_coefficient", "lattice_umklapp"});
  const auto dim = [](std::array<int, 6> e) {
    Dimension d;
    d.exponents = e;
    return d;
  };
  const Dimension resistivity = dim({1, 3, -3, 0, 0, -2}); // Ohm m
  const Dimension lorenz = dim({2, 4, -6, -2, 0, -2});     // W Ohm/K^2
  MetalConductivityParameters p;
  const auto read = [&](const std::string& key, const Dimension* d, double& target) {
    const YAML::Node n = reader.optional(node, key);
    if (!n.IsDefined())
      return;
    const std::string kpath = join_path(path, key);
    target = d ? reader.quantity(n, kpath, *d) : reader.number(n, kpath);
    reader.record_parameter(n, kpath);
  };
  const Dimension temperature = dimension::temperature();
  const Dimension lattice_a = dim({1, 1, -3, -4, 0, 0}); // W/m/K^3
  const Dimension lattice_b = dim({-1, -1, 3, 0, 0, 0}); // m/W
  reader.require(node, path, "theta_R");
  reader.require(node, path, "reference_resistivity");
  read("theta_R", &temperature, p.resistive_debye_temperature);
  read("reference_resistivity", &resistivity, p.reference_resistivity);
  read("reference_temperature", &temperature, p.reference_temperature);
  read("rrr", nullptr, p.rrr);
  read("rho_0", &resistivity, p.residual_resistivity);
  read("lorenz_number", &lorenz, p.lorenz_number);
  read("phonon_lorenz_number", &lorenz, p.phonon_lorenz_number);
  read("wilson_ratio", nullptr, p.wilson_ratio);
  read("lattice_coefficient", &lattice_a, p.lattice_coefficient);
  read("lattice_umklapp", &lattice_b, p.lattice_umklapp);
  if (reader.optional(node, "rrr").IsDefined() ==
      reader.optional(node, "rho_0").IsDefined())
    reader.fail(node, path, "", "give exactly one of `rrr` and `rho_0`");
  try {
    return make_metal_conductivity(p);
  } catch (const InputError& e) {
    // Located at the parameter the model refused where the card gives it.
    const YAML::Node given =
        e.field().empty() ? YAML::Node() : reader.optional(node, e.field());
    if (given.IsDefined()) {
      const std::string kpath = join_path(path, e.field());
      reader.fail(given, kpath, reader.text(given, kpath), "expected " + e.expected());
    }
    reader.fail(node, path, "", e.what());
  }
}

} // namespace

ConductivityPtr read_conductivity(CardReader& reader, const YAML::Node& node,
                                  const std::string& path,
                                  const ConductivityContext& context) {
  reader.expect_map(node, path);
  const std::string kpath = join_path(path, "kind");
  const YAML::Node kind_node = reader.require(node, path, "kind");
  const std::string kind = reader.text(kind_node, kpath);
  if (kind == "constant")
    return read_constant(reader, node, path);
  if (kind == "table")
    return read_table(reader, node, path, context);
  if (kind == "metal")
    return read_metal(reader, node, path);
  std::string list;
  for (const auto& k : kConductivityKinds)
    list += (list.empty() ? "" : ", ") + k;
  reader.fail(kind_node, kpath, kind,
              "unknown conductivity kind" + did_you_mean(kind, kConductivityKinds) +
                  "; expected one of: " + list);
}

} // namespace quantacal::detail
