// SPDX-License-Identifier: Apache-2.0
// The vocabulary of case files on top of the cards layer's CardReader.
#include "case_reader.h"

#include <quantacal/common/constants.h>
#include <quantacal/common/exceptions.h>

#include <charconv>
#include <filesystem>
#include <stdexcept>
#include <utility>

namespace quantacal::solver::detail {
namespace {

/** The raw text shown in messages: the scalar, or [...] / {...} for a list / mapping. */
std::string value_text(const YAML::Node& node) {
  if (!node.IsDefined())
    return "";
  if (node.IsScalar())
    return node.Scalar();
  if (node.IsSequence())
    return "[...]";
  if (node.IsMap())
    return "{...}";
  return "";
}

/** Messages read "field = "value": expected ..." (the shape of card errors). */
std::string expected_text(const std::string& s) {
  for (const char* lead : {"expected", "missing", "unknown"})
    if (s.rfind(lead, 0) == 0)
      return s;
  return "expected " + s;
}

} // namespace

CaseReader::CaseReader(std::string file, std::string base_directory)
    : cards_(std::move(file)), base_directory_(std::move(base_directory)) {}

CaseLocation CaseReader::where(const YAML::Node& node, const std::string& field) const {
  CaseLocation location;
  location.line = quantacal::detail::CardReader::line_of(node);
  location.column = quantacal::detail::CardReader::column_of(node);
  location.field = field;
  location.value = value_text(node);
  return location;
}

void CaseReader::fail(const YAML::Node& node, const std::string& field,
                      const std::string& expected) const {
  cards_.fail(node, field, value_text(node), expected_text(expected));
}

void CaseReader::fail_missing(const YAML::Node& parent, const std::string& parent_field,
                              const std::string& key, const std::string& expected) const {
  cards_.fail(parent, quantacal::detail::join_path(parent_field, key), "",
              "missing; expected " + expected);
}

void CaseReader::check_keys(const YAML::Node& node, const std::string& field,
                            const std::vector<std::string>& allowed) const {
  if (!node.IsMap())
    fail(node, field, "a mapping of keys to values");
  cards_.check_keys(node, field, allowed, /*key_as_value=*/true);
}

std::string CaseReader::text(const YAML::Node& node, const std::string& field) const {
  if (!node.IsScalar())
    fail(node, field, "a single value");
  return node.Scalar();
}

double CaseReader::quantity(const YAML::Node& node, const std::string& field,
                            const Dimension& dimension,
                            const std::string& expected) const {
  const std::string t = text(node, field);
  try {
    return parse_quantity(t, dimension);
  } catch (const std::invalid_argument& e) {
    fail(node, field, expected + " (" + e.what() + ")");
  }
}

double CaseReader::number(const YAML::Node& node, const std::string& field,
                          const std::string& expected) const {
  return quantity(node, field, dimension::dimensionless(), expected);
}

unsigned int CaseReader::count(const YAML::Node& node, const std::string& field,
                               const std::string& expected, unsigned int lowest,
                               unsigned int highest) const {
  const std::string t = text(node, field);
  unsigned long v = 0;
  const auto r = std::from_chars(t.data(), t.data() + t.size(), v);
  if (r.ec != std::errc() || r.ptr != t.data() + t.size() || v < lowest || v > highest)
    fail(node, field, expected);
  return static_cast<unsigned int>(v);
}

bool CaseReader::boolean(const YAML::Node& node, const std::string& field) const {
  const std::string t = text(node, field);
  if (t == "true" || t == "yes" || t == "on")
    return true;
  if (t == "false" || t == "no" || t == "off")
    return false;
  fail(node, field, "true or false");
}

double CaseReader::positive(const YAML::Node& node, const std::string& field,
                            const Dimension& dimension, const std::string& what) const {
  double v = quantity(node, field, dimension, what);
  if (dimension == dimension::temperature()) {
    // A temperature here is a difference (a tolerance, an error estimate): "0.1 degC"
    // is 0.1 K, not 273.25 K.
    const Quantity q = parse_quantity(text(node, field));
    if (q.is_temperature_offset)
      v = q.value - celsius_offset;
  }
  if (!(v > 0.0))
    fail(node, field, what + " > 0");
  return v;
}

double CaseReader::temperature(const YAML::Node& node, const std::string& field) const {
  const double v = quantity(node, field, dimension::temperature(),
                            "a temperature (e.g. \"300 K\" or \"25 degC\")");
  if (!(v > 0.0))
    fail(node, field, "a temperature > 0 K");
  return v;
}

std::vector<double> CaseReader::point(const YAML::Node& node, const std::string& field,
                                      int dimension) const {
  if (!node.IsSequence() || static_cast<int>(node.size()) != dimension)
    fail(node, field,
         "a list of " + std::to_string(dimension) +
             " coordinates with units, e.g. [\"0 mm\", \"5 mm\"" +
             (dimension == 3 ? ", \"0 mm\"]" : "]"));
  std::vector<double> p;
  for (std::size_t i = 0; i < node.size(); ++i)
    p.push_back(quantity(node[i], quantacal::detail::index_path(field, i),
                         dimension::length(), "a length (e.g. \"5 mm\")"));
  return p;
}

std::string CaseReader::path(const YAML::Node& node, const std::string& field) const {
  const std::string t = text(node, field);
  if (t.empty())
    fail(node, field, "a file path");
  std::filesystem::path p(t);
  if (p.is_relative() && !base_directory_.empty())
    p = std::filesystem::path(base_directory_) / p;
  return p.lexically_normal().string();
}

void CaseReader::check_abscissa(const YAML::Node& node, const std::string& field,
                                const CurveColumns& columns, double x) const {
  // A surface temperature is absolute (> 0 K); a time counts from the start of the
  // run (>= 0 s).
  if (columns.x_dimension == dimension::temperature() && !(x > 0.0))
    fail(node, field, columns.x_description + " > 0 K");
  if (columns.x_dimension == dimension::time() && !(x >= 0.0))
    fail(node, field, columns.x_description + " >= 0 s (from the start of the run)");
}

Curve CaseReader::curve(const YAML::Node& node, const std::string& field,
                        const CurveColumns& columns) const {
  const std::string& x_what = columns.x_description;
  const std::string& y_what = columns.y_description;
  if (node.IsScalar()) {
    const double y = quantity(node, field, columns.y_dimension, y_what);
    if (columns.positive_y && !(y > 0.0))
      fail(node, field, y_what + " > 0");
    return Curve({0.0}, {y});
  }
  if (!node.IsSequence() || node.size() < 2)
    fail(node, field,
         y_what + ", or a table of at least 2 pairs [[" + x_what + ", " + y_what +
             "], ...]");
  std::vector<double> xs, ys;
  for (std::size_t i = 0; i < node.size(); ++i) {
    const std::string row = quantacal::detail::index_path(field, i);
    const YAML::Node pair = node[i];
    if (!pair.IsSequence() || pair.size() != 2)
      fail(pair, row, "a pair [" + x_what + ", " + y_what + "]");
    const double x = quantity(pair[0], row + "[0]", columns.x_dimension, x_what);
    const double y = quantity(pair[1], row + "[1]", columns.y_dimension, y_what);
    check_abscissa(pair[0], row + "[0]", columns, x);
    if (!xs.empty() && !(x > xs.back()))
      fail(pair[0], row + "[0]", "values increasing down the table");
    if (columns.positive_y && !(y > 0.0))
      fail(pair[1], row + "[1]", y_what + " > 0");
    if (!columns.positive_y && y < 0.0)
      fail(pair[1], row + "[1]", y_what + " >= 0");
    xs.push_back(x);
    ys.push_back(y);
  }
  return Curve(std::move(xs), std::move(ys));
}

} // namespace quantacal::solver::detail
