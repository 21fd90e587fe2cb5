// SPDX-License-Identifier: Apache-2.0
// Writing cards: text edits of a card that keep its comments and layout.
#include <quantacal/cards/card_writer.h>

#include "card_reader.h"

#include <quantacal/cards/card.h>
#include <quantacal/common/exceptions.h>
#include <quantacal/common/files.h>
#include <quantacal/common/format.h>
#include <quantacal/version.h>

#include <yaml-cpp/yaml.h>

#include <algorithm>
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <ios>
#include <sstream>

namespace quantacal {
namespace {

namespace fs = std::filesystem;

std::string number(double v, int digits = 7) {
  char buffer[64];
  std::snprintf(buffer, sizeof buffer, "%.*g", digits, v);
  return buffer;
}

std::string quote(const std::string& s) {
  std::string out = "\"";
  for (char c : s) {
    if (c == '"' || c == '\\')
      out.push_back('\\');
    out.push_back(c);
  }
  return out + "\"";
}

std::string card_value(double si, const std::string& unit) {
  const std::string t = card_quantity_text(si, unit);
  return unit == "1" || unit.empty() ? t : quote(t);
}

/** A replacement of text[position, position + length) by text. */
struct Edit {
  std::size_t position;
  std::size_t length;
  std::string text;
};

/** Extent of the scalar starting at @p pos (quoted or plain). */
std::size_t scalar_length(const std::string& text, std::size_t pos) {
  if (pos >= text.size())
    return 0;
  const char q = text[pos];
  if (q == '"' || q == '\'') {
    std::size_t i = pos + 1;
    while (i < text.size()) {
      if (q == '"' && text[i] == '\\') {
        i += 2;
        continue;
      }
      if (text[i] == q) {
        if (q == '\'' && i + 1 < text.size() && text[i + 1] == '\'') {
          i += 2;
          continue;
        }
        return i + 1 - pos;
      }
      ++i;
    }
    return text.size() - pos;
  }
  std::size_t i = pos;
  while (i < text.size() && text[i] != '\n' && text[i] != ',' && text[i] != '}' &&
         text[i] != ']' && !(text[i] == '#' && i > pos && text[i - 1] == ' '))
    ++i;
  while (i > pos && (text[i - 1] == ' ' || text[i - 1] == '\t' || text[i - 1] == '\r'))
    --i;
  return i - pos;
}

std::size_t line_start(const std::string& text, std::size_t pos) {
  const std::size_t nl = pos == 0 ? std::string::npos : text.rfind('\n', pos - 1);
  return nl == std::string::npos ? 0 : nl + 1;
}

std::size_t next_line(const std::string& text, std::size_t pos) {
  const std::size_t nl = text.find('\n', pos);
  return nl == std::string::npos ? text.size() : nl + 1;
}

/**
 * The map holding the last key of @p path ("phases[0].heat_capacity[1].theta_D":
 * the map of phases[0].heat_capacity[1]), and that key; an undefined node if the
 * path does not lead to a map.
 */
YAML::Node parent_of(const YAML::Node& root, const std::string& path, std::string& key) {
  const std::size_t dot = path.rfind('.');
  key = path.substr(dot + 1);
  YAML::Node node(root);
  std::size_t at = 0;
  while (dot != std::string::npos && at < dot) {
    const std::size_t end = std::min(path.find('.', at), dot);
    const std::string part = path.substr(at, end - at);
    const std::size_t bracket = part.find('[');
    node.reset(node[part.substr(0, bracket)]);
    for (std::size_t b = bracket; b != std::string::npos && node.IsDefined();
         b = part.find('[', b + 1))
      node.reset(node[static_cast<std::size_t>(std::stoul(part.substr(b + 1)))]);
    if (!node.IsDefined())
      return node;
    at = end + 1;
  }
  return node;
}

/** The edit writing one new value: in place, or as a new key of a block map. */
Edit value_edit(const std::string& text, const std::string& file, const YAML::Node& root,
                const ParameterValue& change) {
  const CardParameter& p = change.parameter;
  std::string key;
  const YAML::Node map = parent_of(root, p.path, key);
  if (!map.IsDefined() || !map.IsMap())
    throw InputError(file, 0, 0, p.path, "",
                     "cannot locate this block in the start card to write the fitted "
                     "value");
  const YAML::Node value = map[key];
  const std::string written = card_value(change.value, p.unit);
  if (value.IsDefined()) {
    const std::size_t pos = static_cast<std::size_t>(value.Mark().pos);
    return {pos, scalar_length(text, pos), written};
  }
  if (map.Style() == YAML::EmitterStyle::Block) {
    // A defaulted parameter (e.g. modes): a new key below the block's first line.
    const std::size_t pos = static_cast<std::size_t>(map.Mark().pos);
    const std::string indent(static_cast<std::size_t>(map.Mark().column), ' ');
    return {next_line(text, pos), 0, indent + key + ": " + written + "\n"};
  }
  throw InputError(file, map.Mark().line + 1, map.Mark().column + 1, p.path, "",
                   "the parameter is not written in this flow-style block; write it out "
                   "in the start card");
}

/** Component cards are found relative to the card's folder: keep them found. */
void add_composition_edits(const std::string& text, const std::string& file,
                           const YAML::Node& root, const std::string& output_file,
                           std::vector<Edit>& edits) {
  const YAML::Node composition = root["composition"];
  if (output_file.empty() || !composition.IsDefined() || !composition.IsSequence())
    return;
  const fs::path from = fs::absolute(fs::path(file)).parent_path();
  const fs::path to = fs::absolute(fs::path(output_file)).parent_path();
  for (std::size_t i = 0; i < composition.size(); ++i) {
    const YAML::Node c = composition[i]["card"];
    if (!c.IsDefined() || !c.IsScalar() || fs::path(c.Scalar()).is_absolute())
      continue;
    const fs::path target = (from / c.Scalar()).lexically_normal();
    const std::string moved = target.lexically_relative(to.lexically_normal()).string();
    if (moved.empty() || moved == c.Scalar())
      continue;
    const std::size_t pos = static_cast<std::size_t>(c.Mark().pos);
    edits.push_back({pos, scalar_length(text, pos), quote(moved)});
  }
}

/** New `sources` entries, first in the list, with the indentation of its items. */
void add_source_edit(const std::string& text, const YAML::Node& root,
                     const std::vector<Source>& entries, std::vector<Edit>& edits) {
  const YAML::Node sources = root["sources"];
  if (entries.empty() || !sources.IsDefined() || !sources.IsSequence() ||
      sources.size() == 0 || sources.Style() != YAML::EmitterStyle::Block)
    return;
  const std::size_t item = static_cast<std::size_t>(sources[0].Mark().pos);
  const std::size_t start = line_start(text, item);
  const std::string prefix = text.substr(start, item - start);
  const std::size_t dash = prefix.find('-');
  const std::string indent =
      dash == std::string::npos ? std::string() : prefix.substr(0, dash);
  std::string written;
  for (const Source& s : entries)
    written += indent + "- for: " + s.parameter + "\n" + indent +
               "  cite: " + quote(s.citation) + "\n";
  edits.push_back({start, 0, written});
}

/** Removal of the top-level `fit:` block and the blank or comment lines after it. */
void add_fit_removal(const std::string& text, const YAML::Node& root,
                     std::vector<Edit>& edits) {
  if (!root["fit"].IsDefined())
    return;
  for (std::size_t p = 0; p < text.size(); p = next_line(text, p))
    if (text.compare(p, 4, "fit:") == 0) {
      std::size_t end = next_line(text, p);
      while (end < text.size() &&
             (text[end] == ' ' || text[end] == '\n' || text[end] == '#' ||
              text[end] == '\t' || text[end] == '\r'))
        end = next_line(text, end);
      edits.push_back({p, end - p, ""});
      return;
    }
}

std::string fit_record_text(const FitRecordEntry& fit) {
  std::ostringstream r;
  r << "fit:\n"
    << "  data: " << quote(fit.data_file) << "\n"
    << "  data_sha256: " << fit.data_sha256 << "\n"
    << "  temperature_range: {from: " << quote(number(fit.from) + " K")
    << ", to: " << quote(number(fit.to) + " K") << "}\n"
    << "  n_points: " << fit.n_points << "\n"
    << "  weights: " << (fit.relative_weights ? "relative" : "absolute") << "\n"
    << "  uncertainties: "
    << (fit.covariance_scaled ? "estimated from the scatter (covariance scaled by the "
                                "reduced chi-square)"
                              : "from the sigma column of the data")
    << "\n"
    << "  iterations: " << fit.iterations << "\n"
    << "  chi_square: " << number(fit.chi_square) << "\n"
    << "  degrees_of_freedom: " << fit.degrees_of_freedom << "\n"
    << "  reduced_chi_square: " << number(fit.reduced_chi_square) << "\n"
    << "  rms_relative_residual: " << number(fit.rms_relative_residual, 4) << "\n"
    << "  max_relative_residual: " << number(fit.max_relative_residual, 4) << "\n"
    << "  parameters:\n";
  for (const FitRecordParameter& p : fit.parameters)
    r << "    - {path: " << quote(p.path) << ", value: " << card_value(p.value, p.unit)
      << ", standard_error: " << card_value(p.standard_error, p.unit)
      << ", start: " << card_value(p.start, p.unit) << "}\n";
  r << "  covariance:   # SI units, rows and columns in the order of `parameters`\n";
  for (const auto& row : fit.covariance) {
    r << "    - [";
    for (std::size_t b = 0; b < row.size(); ++b)
      r << (b ? ", " : "") << format_double(row[b]);
    r << "]\n";
  }
  r << "  tool: " << quote(std::string("quantacal ") + QUANTACAL_VERSION_STRING) << "\n";
  return r.str();
}

} // namespace

std::string card_quantity_text(double si, const std::string& unit, int digits) {
  if (unit == "1" || unit.empty())
    return number(si, digits);
  if (unit == "J/mol/K^2")
    return number(si * 1e3, digits) + " mJ/mol/K^2";
  return number(si, digits) + " " + unit;
}

std::string edit_card(const std::string& text, const std::string& file,
                      const CardChanges& changes, const std::string& output_file) {
  const YAML::Node root = detail::parse_yaml(text, file);
  std::vector<Edit> edits;
  for (const ParameterValue& change : changes.values)
    edits.push_back(value_edit(text, file, root, change));
  add_composition_edits(text, file, root, output_file, edits);
  add_source_edit(text, root, changes.sources, edits);
  if (!changes.values.empty() || changes.fit)
    add_fit_removal(text, root, edits);
  // Edits apply back to front, so the positions of the ones still to come hold.
  std::sort(edits.begin(), edits.end(),
            [](const Edit& a, const Edit& b) { return a.position > b.position; });
  std::string out = text;
  for (const Edit& e : edits)
    out.replace(e.position, e.length, e.text);
  if (!out.empty() && out.back() != '\n')
    out.push_back('\n');
  if (changes.fit)
    out += fit_record_text(*changes.fit);
  return out;
}

std::string read_card_text(const std::string& path) {
  std::ifstream in(path, std::ios::binary);
  if (!in)
    throw InputError(path, 0, 0, "", "", "cannot open the card file");
  std::ostringstream text;
  text << in.rdbuf();
  return text.str();
}

void save_card(const std::string& path, const std::string& text) {
  (void)load_card_from_string(text, path);
  write_file_atomically(path, text);
}

} // namespace quantacal
