// SPDX-License-Identifier: Apache-2.0
// Internal: located access to a YAML card (see card_reader.h).
#include "card_reader.h"

#include <quantacal/common/constants.h>
#include <quantacal/common/text.h>

#include "units_detail.h"

#include <algorithm>
#include <set>
#include <stdexcept>

namespace quantacal::detail {

namespace {

// yaml-cpp may mark an error past the end of its line or of the text (after a
// NUL byte or a malformed UTF-8 sequence, at the end of the stream): the
// location is moved to the nearest place that exists in @p text, one past
// the last byte of the line at most.
void clamp_to_text(const std::string& text, int& line, int& column) {
  int n_lines = 1;
  std::size_t start = 0; // of the line `line` (or of the last line)
  for (std::size_t i = 0; i < text.size() && n_lines < line; ++i)
    if (text[i] == '\n') {
      ++n_lines;
      start = i + 1;
    }
  line = std::max(1, std::min(line, n_lines));
  const std::size_t end = std::min(text.find('\n', start), text.size());
  column = std::max(1, std::min(column, static_cast<int>(end - start) + 1));
}

} // namespace

YAML::Node parse_yaml(const std::string& text, const std::string& file) {
  try {
    return YAML::Load(text);
  } catch (const YAML::Exception& e) {
    int line = e.mark.is_null() ? 1 : e.mark.line + 1;
    int column = e.mark.is_null() ? 1 : e.mark.column + 1;
    clamp_to_text(text, line, column);
    throw InputError(file, line, column, "", "", "YAML syntax error: " + e.msg);
  }
}

std::string join_path(const std::string& parent, const std::string& key) {
  return parent.empty() ? key : parent + "." + key;
}

std::string index_path(const std::string& parent, std::size_t index) {
  return parent + "[" + std::to_string(index) + "]";
}

int CardReader::line_of(const YAML::Node& node) {
  if (!node.IsDefined())
    return 0;
  const YAML::Mark m = node.Mark();
  return m.is_null() ? 0 : m.line + 1;
}

int CardReader::column_of(const YAML::Node& node) {
  if (!node.IsDefined())
    return 0;
  const YAML::Mark m = node.Mark();
  return m.is_null() ? 0 : m.column + 1;
}

void CardReader::fail(const YAML::Node& node, const std::string& path,
                      const std::string& value, const std::string& expected) const {
  throw CardError(file_, line_of(node), column_of(node), path, value, expected);
}

void CardReader::fail_at(int line, int column, const std::string& path,
                         const std::string& value, const std::string& expected) const {
  throw CardError(file_, line, column, path, value, expected);
}

void CardReader::expect_map(const YAML::Node& node, const std::string& path) const {
  if (!node.IsMap())
    fail(node, path, node.IsScalar() ? node.Scalar() : "",
         "expected a map of keys and values");
}

void CardReader::expect_sequence(const YAML::Node& node, const std::string& path) const {
  if (!node.IsSequence())
    fail(node, path, node.IsScalar() ? node.Scalar() : "", "expected a list");
}

void CardReader::check_keys(const YAML::Node& map, const std::string& path,
                            const std::vector<std::string>& allowed,
                            bool key_as_value) const {
  expect_map(map, path);
  std::set<std::string> seen;
  for (const auto& entry : map) {
    const YAML::Node key = entry.first;
    if (!key.IsScalar())
      fail(key, path, "", "expected a plain key");
    const std::string name = key.Scalar();
    const std::string key_path = join_path(path, name);
    bool known = false;
    for (const auto& a : allowed)
      known = known || a == name;
    if (!known) {
      std::string list;
      for (const auto& a : allowed)
        list += (list.empty() ? "" : ", ") + a;
      fail(key, key_path, key_as_value ? name : "",
           "unknown key" + did_you_mean(name, allowed) + "; expected one of: " + list);
    }
    if (!seen.insert(name).second)
      fail(key, key_path, key_as_value ? name : "", "duplicate key");
  }
}

YAML::Node CardReader::require(const YAML::Node& map, const std::string& path,
                               const std::string& key) const {
  expect_map(map, path);
  const YAML::Node child = map[key];
  if (!child.IsDefined())
    fail(map, join_path(path, key), "", "missing field");
  return child;
}

YAML::Node CardReader::optional(const YAML::Node& map, const std::string& key) const {
  const YAML::Node child = map[key];
  return child;
}

std::string CardReader::text(const YAML::Node& node, const std::string& path) const {
  if (!node.IsDefined())
    fail(node, path, "", "missing field");
  if (node.IsNull())
    fail(node, path, "", "expected a value, found nothing");
  if (!node.IsScalar())
    fail(node, path, "",
         node.IsMap() ? "expected a value, found a map"
                      : "expected a value, found a list");
  return node.Scalar();
}

double CardReader::number(const YAML::Node& node, const std::string& path) const {
  const std::string t = text(node, path);
  try {
    return parse_number(t);
  } catch (const std::invalid_argument&) {
    fail(node, path, t, "expected a finite number without a unit");
  }
}

double CardReader::quantity(const YAML::Node& node, const std::string& path,
                            const Dimension& dimension) const {
  std::size_t found = 0;
  return quantity_of(node, path, {dimension}, found);
}

double CardReader::quantity_of(const YAML::Node& node, const std::string& path,
                               const std::vector<Dimension>& dimensions,
                               std::size_t& found) const {
  const std::string t = text(node, path);
  Quantity q;
  try {
    q = parse_quantity(t);
  } catch (const std::invalid_argument& e) {
    fail(node, path, t, e.what());
  }
  for (std::size_t i = 0; i < dimensions.size(); ++i) {
    if (q.dimension == dimensions[i]) {
      found = i;
      return q.value;
    }
  }
  std::string wanted;
  for (std::size_t i = 0; i < dimensions.size(); ++i)
    wanted += (i == 0 ? "" : " or ") + dimension_description(dimensions[i]);
  const std::string got = q.dimension == dimension::dimensionless()
                              ? "a plain number without a unit"
                              : dimension_description(q.dimension);
  fail(node, path, t, "expected " + wanted + ", found " + got);
}

double CardReader::positive_temperature(const YAML::Node& node,
                                        const std::string& path) const {
  const double t = quantity(node, path, dimension::temperature());
  if (!(t > 0.0))
    fail(node, path, text(node, path), "expected a temperature > 0 K");
  return t;
}

double CardReader::positive_temperature_difference(const YAML::Node& node,
                                                   const std::string& path) const {
  const std::string t = text(node, path);
  Quantity q;
  try {
    q = parse_quantity(t);
  } catch (const std::invalid_argument& e) {
    fail(node, path, t, e.what());
  }
  if (q.dimension != dimension::temperature())
    fail(node, path, t,
         "expected a temperature difference (K), found " +
             (q.dimension == dimension::dimensionless()
                  ? std::string("a plain number")
                  : dimension_description(q.dimension)));
  const double value = q.is_temperature_offset ? q.value - celsius_offset : q.value;
  if (!(value > 0.0))
    fail(node, path, t, "expected a temperature difference > 0 K");
  return value;
}

void CardReader::record_parameter(const YAML::Node& node, const std::string& path) {
  parameters_.push_back(ParameterSite{path, line_of(node), column_of(node),
                                      node.IsScalar() ? node.Scalar() : ""});
}

namespace {

// The two units of a table's `columns` (temperature, then the tabulated
// quantity), each checked now so that a wrong unit is reported at the unit.
void read_column_units(CardReader& reader, const YAML::Node& map,
                       const YAML::Node& columns, const YAML::Node& rows,
                       const std::string& path,
                       const std::vector<Dimension>& y_dimensions,
                       const std::string& y_description, std::string units[2]) {
  if (!columns.IsDefined())
    reader.fail(
        map, join_path(path, "columns"), "",
        "missing field (a unit per column, e.g. [\"K\", \"W/m/K\"]), or give `points`");
  if (!rows.IsDefined())
    reader.fail(map, join_path(path, "rows"), "", "missing field");
  const std::string cpath = join_path(path, "columns");
  reader.expect_sequence(columns, cpath);
  if (columns.size() != 2)
    reader.fail(columns, cpath, "",
                "expected two units, for temperature and " + y_description);
  for (std::size_t i = 0; i < 2; ++i)
    units[i] = reader.text(columns[i], index_path(cpath, i));
  for (std::size_t i = 0; i < 2; ++i) {
    const std::string probe = "1 " + units[i];
    Quantity q;
    try {
      q = parse_quantity(probe);
    } catch (const std::invalid_argument& e) {
      reader.fail(columns[i], index_path(cpath, i), units[i], e.what());
    }
    bool ok = false;
    if (i == 0)
      ok = q.dimension == dimension::temperature();
    for (const auto& d : y_dimensions)
      ok = ok || (i == 1 && q.dimension == d);
    if (!ok) {
      std::string wanted = i == 0 ? dimension_description(dimension::temperature()) : "";
      if (i == 1)
        for (std::size_t k = 0; k < y_dimensions.size(); ++k)
          wanted += (k == 0 ? "" : " or ") + dimension_description(y_dimensions[k]);
      reader.fail(columns[i], index_path(cpath, i), units[i],
                  "expected a unit of " + wanted + ", found " +
                      dimension_description(q.dimension));
    }
  }
}

// A cell of a `points` table: a quantity with its own unit. The tabulated
// quantity's kind of unit (index into @p y_dimensions) must be the same in every row.
double read_points_cell(CardReader& reader, const YAML::Node& cell,
                        const std::string& cell_path, std::size_t column, std::size_t row,
                        const std::vector<Dimension>& y_dimensions, ReadTable& table) {
  std::size_t found = 0;
  const double value = column == 0
                           ? reader.quantity(cell, cell_path, dimension::temperature())
                           : reader.quantity_of(cell, cell_path, y_dimensions, found);
  if (column == 1) {
    if (row > 0 && found != table.y_dimension)
      reader.fail(cell, cell_path, reader.text(cell, cell_path),
                  "expected the same kind of unit in every row");
    table.y_dimension = found;
  }
  return value;
}

// A cell of a `columns` + `rows` table: a bare number in its column's @p unit.
double read_rows_cell(CardReader& reader, const YAML::Node& cell,
                      const std::string& cell_path, std::size_t column,
                      const std::string& unit, const std::vector<Dimension>& y_dimensions,
                      ReadTable& table) {
  const std::string t = reader.text(cell, cell_path);
  try {
    (void)detail::parse_number(t);
  } catch (const std::invalid_argument&) {
    reader.fail(cell, cell_path, t,
                "expected a bare number (its unit \"" + unit + "\" is in `columns`)");
  }
  double value = 0.0;
  std::size_t found = 0;
  try {
    const Quantity q = parse_quantity(t + " " + unit);
    value = q.value;
    for (std::size_t k = 0; k < y_dimensions.size(); ++k)
      if (q.dimension == y_dimensions[k])
        found = k;
  } catch (const std::invalid_argument& e) {
    reader.fail(cell, cell_path, t, e.what());
  }
  if (column == 1)
    table.y_dimension = found;
  return value;
}

// A row's values must be a positive temperature, above the previous row's, and
// a positive (or, if @p allow_zero, non-negative) tabulated value.
void check_row(CardReader& reader, const YAML::Node& row, const std::string& row_path,
               const double value[2], const ReadTable& table,
               const std::string& y_description, bool allow_zero) {
  if (!(value[0] > 0.0))
    reader.fail(row[0], index_path(row_path, 0),
                reader.text(row[0], index_path(row_path, 0)),
                "expected a temperature > 0 K");
  if (!table.x.empty() && !(value[0] > table.x.back()))
    reader.fail(row[0], index_path(row_path, 0),
                reader.text(row[0], index_path(row_path, 0)),
                "expected temperatures strictly increasing (previous row has " +
                    format_double(table.x.back()) + " K)");
  if (allow_zero ? !(value[1] >= 0.0) : !(value[1] > 0.0))
    reader.fail(row[1], index_path(row_path, 1),
                reader.text(row[1], index_path(row_path, 1)),
                "expected " + y_description + (allow_zero ? " >= 0" : " > 0"));
}

} // namespace

ReadTable read_temperature_table(CardReader& reader, const YAML::Node& map,
                                 const std::string& path,
                                 const std::vector<Dimension>& y_dimensions,
                                 const std::string& y_description, bool allow_zero) {
  ReadTable table;
  const YAML::Node columns = reader.optional(map, "columns");
  const YAML::Node rows = reader.optional(map, "rows");
  const YAML::Node points = reader.optional(map, "points");
  std::string units[2];
  const std::string rows_path = join_path(path, points.IsDefined() ? "points" : "rows");
  if (points.IsDefined()) {
    if (columns.IsDefined() || rows.IsDefined())
      reader.fail(points, join_path(path, "points"), "",
                  "give either `points` (a unit in every cell) or `columns` and `rows`, "
                  "not both");
  } else {
    read_column_units(reader, map, columns, rows, path, y_dimensions, y_description,
                      units);
  }
  const YAML::Node list = points.IsDefined() ? points : rows;
  reader.expect_sequence(list, rows_path);
  if (list.size() < 2)
    reader.fail(list, rows_path, "", "expected at least 2 rows");
  for (std::size_t r = 0; r < list.size(); ++r) {
    const std::string row_path = index_path(rows_path, r);
    const YAML::Node row = list[r];
    reader.expect_sequence(row, row_path);
    if (row.size() != 2)
      reader.fail(row, row_path, "",
                  "expected 2 values: temperature and " + y_description);
    double value[2];
    for (std::size_t c = 0; c < 2; ++c) {
      const std::string cell_path = index_path(row_path, c);
      value[c] = points.IsDefined() ? read_points_cell(reader, row[c], cell_path, c, r,
                                                       y_dimensions, table)
                                    : read_rows_cell(reader, row[c], cell_path, c,
                                                     units[c], y_dimensions, table);
    }
    check_row(reader, row, row_path, value, table, y_description, allow_zero);
    table.x.push_back(value[0]);
    table.y.push_back(value[1]);
    table.x_node.push_back(row[0]);
    table.y_node.push_back(row[1]);
  }
  return table;
}

} // namespace quantacal::detail
