// SPDX-License-Identifier: Apache-2.0
// The `conductivity` block of a card. Each kind is one branch of
// read_conductivity; the list of kinds is in kConductivityKinds.
#include "card_reader.h"

#include "units_detail.h"

#include <stdexcept>

namespace quantacal::detail {
namespace {

const std::vector<std::string> kConductivityKinds = {"constant", "table"};

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
  std::string list;
  for (const auto& k : kConductivityKinds)
    list += (list.empty() ? "" : ", ") + k;
  reader.fail(kind_node, kpath, kind,
              "unknown conductivity kind" + did_you_mean(kind, kConductivityKinds) +
                  "; expected one of: " + list);
}

} // namespace quantacal::detail
