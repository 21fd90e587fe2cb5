// SPDX-License-Identifier: Apache-2.0
// Quenchant files (docs/quenchants.md): reading one with located errors, and
// finding one by name in the quenchant folders.
#include "case_reader.h"

#include <quantacal/common/exceptions.h>
#include <quantacal/common/text.h>
#include <quantacal/solver/quenchant.h>

#include <algorithm>
#include <cmath>
#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <set>
#include <sstream>

namespace quantacal::solver {
namespace {

namespace fs = std::filesystem;
using quantacal::detail::index_path;

const std::vector<std::string> statuses = {"illustrative", "digitised", "tabulated"};

/** A required text entry (a scalar). */
std::string required_text(const detail::CaseReader& reader, const YAML::Node& root,
                          const std::string& key, const std::string& expected) {
  if (!root[key])
    reader.fail_missing(root, "", key, expected);
  const std::string text = reader.text(root[key], key);
  if (text.empty())
    reader.fail(root[key], key, expected);
  return text;
}

/** `source: {cite: [...], obtained: ...}`. */
void read_source(const detail::CaseReader& reader, const YAML::Node& root,
                 Quenchant& quenchant) {
  if (!root["source"])
    reader.fail_missing(root, "", "source",
                        "the published source: {cite: [...], obtained: ...}");
  const YAML::Node source = root["source"];
  reader.check_keys(source, "source", {"cite", "obtained"});
  const YAML::Node cite = source["cite"];
  if (!cite)
    reader.fail_missing(source, "source", "cite",
                        "a list of the publications the curve comes from");
  if (!cite.IsSequence() || cite.size() == 0)
    reader.fail(cite, "source.cite", "a list of the publications the curve comes from");
  for (std::size_t i = 0; i < cite.size(); ++i) {
    const std::string field = index_path("source.cite", i);
    quenchant.cite.push_back(reader.text(cite[i], field));
    if (quenchant.cite.back().empty())
      reader.fail(cite[i], field, "a publication: author, title, journal or book, year");
  }
  quenchant.obtained = required_text(
      reader, source, "obtained",
      "how the numbers were obtained (digitised from Fig. N, a table, illustrative ...)");
}

/** `curve: [[T_surface, h], ...]`, checked against the bath temperature. */
Curve read_curve(const detail::CaseReader& reader, const YAML::Node& root,
                 double bath_temperature) {
  if (!root["curve"])
    reader.fail_missing(root, "", "curve",
                        "a table [[T_surface, h], ...] of at least 2 rows");
  const YAML::Node node = root["curve"];
  if (!node.IsSequence())
    reader.fail(node, "curve", "a table [[T_surface, h], ...] of at least 2 rows");
  Curve curve = reader.curve(node, "curve",
                             {dimension::temperature(), "a surface temperature",
                              dimension::heat_transfer_coefficient(),
                              "a heat-transfer coefficient (e.g. \"5 kW/m^2/K\")",
                              /*positive_y=*/false});
  for (std::size_t i = 0; i < curve.size(); ++i)
    if (!std::isfinite(curve.y()[i]) || !std::isfinite(curve.x()[i]))
      reader.fail(node[i], index_path("curve", i), "finite numbers");
  if (curve.x().front() > bath_temperature)
    reader.fail(node[0][0], "curve[0][0]",
                "a first surface temperature at or below the bath temperature (" +
                    format_double(bath_temperature - 273.15) + " degC)");
  if (std::none_of(curve.y().begin(), curve.y().end(), [](double h) { return h > 0; }))
    reader.fail(node, "curve", "some heat-transfer coefficient > 0");
  return curve;
}

Quenchant read_quenchant(const detail::CaseReader& reader, const YAML::Node& root,
                         const std::string& path) {
  reader.check_keys(root, "",
                    {"name", "description", "status", "bath_temperature", "agitation",
                     "probe", "source", "curve", "notes"});
  Quenchant q;
  q.file = path;
  q.name = required_text(reader, root, "name", "the file's stem");
  const std::string stem = fs::path(path).stem().string();
  if (q.name != stem)
    reader.fail(root["name"], "name",
                "the file's stem \"" + stem + "\" (cases name a quenchant by its file)");
  q.description = required_text(reader, root, "description", "what the bath is");
  q.status = required_text(reader, root, "status",
                           "one of illustrative, digitised, "
                           "tabulated");
  if (std::find(statuses.begin(), statuses.end(), q.status) == statuses.end())
    reader.fail(root["status"], "status",
                "one of illustrative, digitised, tabulated" +
                    did_you_mean(q.status, statuses));
  if (!root["bath_temperature"])
    reader.fail_missing(root, "", "bath_temperature", "the bath temperature");
  q.bath_temperature = reader.temperature(root["bath_temperature"], "bath_temperature");
  q.agitation = required_text(reader, root, "agitation",
                              "the agitation of the source data, in words");
  q.probe = required_text(reader, root, "probe",
                          "the probe or part the data came from, in words");
  read_source(reader, root, q);
  if (root["notes"])
    reader.text(root["notes"], "notes");
  q.coefficient = read_curve(reader, root, q.bath_temperature);
  return q;
}

/** @p folder's quenchant names (stems of *.yaml files). */
void add_names(const std::string& folder, std::set<std::string>& names) {
  std::error_code error;
  if (!fs::is_directory(folder, error))
    return;
  for (const auto& entry : fs::directory_iterator(folder, error))
    if (entry.is_regular_file(error) && entry.path().extension() == ".yaml")
      names.insert(entry.path().stem().string());
}

} // namespace

Quenchant load_quenchant(const std::string& path) {
  std::ifstream in(path, std::ios::binary);
  if (!in)
    throw InputError(path, 0, 0, "", "",
                     "expected a readable quenchant file (cannot open it)");
  std::ostringstream text;
  text << in.rdbuf();
  const YAML::Node root = quantacal::detail::parse_yaml(text.str(), path);
  const std::string base = fs::path(path).parent_path().string();
  const detail::CaseReader reader(path, base.empty() ? "." : base);
  try {
    if (!root.IsMap())
      reader.fail(root, "",
                  "a quenchant file: a mapping with keys name, description, status, "
                  "bath_temperature, agitation, probe, source, curve");
    return read_quenchant(reader, root, path);
  } catch (const YAML::Exception& e) {
    throw InputError(path, e.mark.line >= 0 ? e.mark.line + 1 : 0,
                     e.mark.column >= 0 ? e.mark.column + 1 : 0, "", "",
                     "expected a well-formed quenchant file (" + e.msg + ")");
  }
}

std::vector<std::string> quenchant_folders() {
  std::vector<std::string> folders;
  const auto add = [&folders](const std::string& folder) {
    if (!folder.empty() &&
        std::find(folders.begin(), folders.end(), folder) == folders.end())
      folders.push_back(folder);
  };
  if (const char* list = std::getenv("QUANTACAL_QUENCHANT_PATH")) {
    std::istringstream in(list);
    std::string folder;
    while (std::getline(in, folder, ':'))
      add(folder);
  }
#ifdef QUANTACAL_QUENCHANT_INSTALL_DIR
  add(QUANTACAL_QUENCHANT_INSTALL_DIR);
#endif
#ifdef QUANTACAL_QUENCHANT_SOURCE_DIR
  add(QUANTACAL_QUENCHANT_SOURCE_DIR);
#endif
  return folders;
}

std::vector<std::string> quenchant_names() {
  std::set<std::string> names;
  for (const std::string& folder : quenchant_folders())
    add_names(folder, names);
  return {names.begin(), names.end()};
}

std::string find_quenchant(const std::string& name) {
  // a plain name: no folder, no hidden file, no extension (those are paths)
  if (name.empty() || name.find('/') != std::string::npos || name[0] == '.' ||
      fs::path(name).has_extension())
    return "";
  for (const std::string& folder : quenchant_folders()) {
    const fs::path file = fs::path(folder) / (name + ".yaml");
    std::error_code error;
    if (fs::is_regular_file(file, error))
      return file.string();
  }
  return "";
}

} // namespace quantacal::solver
