// SPDX-License-Identifier: Apache-2.0
// Reading YAML case files into CaseDescription (schema: docs/cases.md).
// No deal.II here, so this translation unit compiles quickly.
#include <quantacal/cards/card.h>
#include <quantacal/cards/units.h>
#include <quantacal/common/exceptions.h>
#include <quantacal/solver/solver.h>

#include <yaml-cpp/yaml.h>

#include <algorithm>
#include <charconv>
#include <cmath>
#include <filesystem>
#include <fstream>
#include <set>
#include <sstream>

namespace quantacal::fe {

// ---- Curve -------------------------------------------------------------------------

namespace {

// Fritsch-Carlson slopes of a monotone piecewise cubic Hermite interpolant
// (Fritsch and Carlson, SIAM J. Numer. Anal. 17 (1980) 238).
std::vector<double> monotone_slopes(const std::vector<double>& x,
                                    const std::vector<double>& y) {
  const std::size_t n = x.size();
  std::vector<double> d(n, 0.0);
  if (n < 2)
    return d;
  std::vector<double> delta(n - 1);
  for (std::size_t i = 0; i + 1 < n; ++i)
    delta[i] = (y[i + 1] - y[i]) / (x[i + 1] - x[i]);
  d[0] = delta[0];
  d[n - 1] = delta[n - 2];
  for (std::size_t i = 1; i + 1 < n; ++i) {
    if (delta[i - 1] * delta[i] <= 0.0) {
      d[i] = 0.0;
    } else {
      // weighted harmonic mean (Fritsch and Butland), keeps monotonicity
      const double h0 = x[i] - x[i - 1], h1 = x[i + 1] - x[i];
      const double w1 = 2 * h1 + h0, w2 = h1 + 2 * h0;
      d[i] = (w1 + w2) / (w1 / delta[i - 1] + w2 / delta[i]);
    }
  }
  return d;
}

} // namespace

double Curve::value(double t) const {
  if (y.empty())
    return 0.0;
  if (y.size() == 1 || t <= x.front())
    return y.front();
  if (t >= x.back())
    return y.back();
  const auto it = std::upper_bound(x.begin(), x.end(), t);
  const std::size_t i = static_cast<std::size_t>(it - x.begin()) - 1;
  const auto d = monotone_slopes(x, y);
  const double h = x[i + 1] - x[i], s = (t - x[i]) / h;
  const double h00 = (1 + 2 * s) * (1 - s) * (1 - s), h10 = s * (1 - s) * (1 - s);
  const double h01 = s * s * (3 - 2 * s), h11 = s * s * (s - 1);
  return h00 * y[i] + h10 * h * d[i] + h01 * y[i + 1] + h11 * h * d[i + 1];
}

double Curve::derivative(double t) const {
  if (y.size() < 2 || t <= x.front() || t >= x.back())
    return 0.0;
  const auto it = std::upper_bound(x.begin(), x.end(), t);
  const std::size_t i = static_cast<std::size_t>(it - x.begin()) - 1;
  const auto d = monotone_slopes(x, y);
  const double h = x[i + 1] - x[i], s = (t - x[i]) / h;
  const double dh00 = 6 * s * s - 6 * s, dh10 = 3 * s * s - 4 * s + 1;
  const double dh01 = -6 * s * s + 6 * s, dh11 = 3 * s * s - 2 * s;
  return (dh00 * y[i] + dh01 * y[i + 1]) / h + dh10 * d[i] + dh11 * d[i + 1];
}

const char* run_caution() {
  return "Results are estimates from models and published data: check them against "
         "measurements before relying on them. Quench and cryogen work follows local "
         "codes and licensed practice.";
}

// ---- reader ------------------------------------------------------------------------

namespace {

std::size_t edit_distance(const std::string& a, const std::string& b) {
  std::vector<std::size_t> prev(b.size() + 1), cur(b.size() + 1);
  for (std::size_t j = 0; j <= b.size(); ++j)
    prev[j] = j;
  for (std::size_t i = 1; i <= a.size(); ++i) {
    cur[0] = i;
    for (std::size_t j = 1; j <= b.size(); ++j)
      cur[j] =
          std::min({prev[j] + 1, cur[j - 1] + 1, prev[j - 1] + (a[i - 1] != b[j - 1])});
    std::swap(prev, cur);
  }
  return prev[b.size()];
}

std::string scalar_text(const YAML::Node& node) {
  if (node.IsScalar())
    return node.Scalar();
  if (node.IsSequence())
    return "[...]";
  if (node.IsMap())
    return "{...}";
  return "";
}

// Messages read "field = "value": expected ..." (the shape of card errors).
std::string expect_text(const std::string& s) {
  for (const char* lead : {"expected", "missing", "unknown"})
    if (s.rfind(lead, 0) == 0)
      return s;
  return "expected " + s;
}

class Reader {
public:
  Reader(std::string file, std::string base)
      : file_(std::move(file)), base_(std::move(base)) {}

  CaseLocation where(const YAML::Node& node, const std::string& field) const {
    CaseLocation loc;
    const YAML::Mark m = node.Mark();
    if (m.line >= 0) {
      loc.line = m.line + 1;
      loc.column = m.column + 1;
    }
    loc.field = field;
    loc.value = scalar_text(node);
    return loc;
  }

  [[noreturn]] void fail(const YAML::Node& node, const std::string& field,
                         const std::string& expected) const {
    const CaseLocation loc = where(node, field);
    throw CardError(file_, loc.line, loc.column, field, loc.value, expect_text(expected));
  }

  [[noreturn]] void fail_missing(const YAML::Node& parent,
                                 const std::string& parent_field, const std::string& key,
                                 const std::string& expected) const {
    const CaseLocation loc = where(parent, parent_field);
    throw CardError(file_, loc.line, loc.column, join(parent_field, key), "",
                    "missing; expected " + expected);
  }

  static std::string join(const std::string& a, const std::string& b) {
    return a.empty() ? b : a + "." + b;
  }

  void require_map(const YAML::Node& node, const std::string& field) const {
    if (!node.IsMap())
      fail(node, field, "a mapping of keys to values");
  }

  void check_keys(const YAML::Node& node, const std::string& field,
                  const std::vector<std::string>& allowed) const {
    require_map(node, field);
    for (auto it = node.begin(); it != node.end(); ++it) {
      const std::string key = it->first.Scalar();
      if (std::find(allowed.begin(), allowed.end(), key) != allowed.end())
        continue;
      std::string best;
      std::size_t best_d = 1000;
      for (const auto& a : allowed) {
        const std::size_t d = edit_distance(key, a);
        if (d < best_d) {
          best_d = d;
          best = a;
        }
      }
      std::string msg = "unknown key";
      if (best_d <= std::max<std::size_t>(2, key.size() / 3))
        msg += " (did you mean '" + best + "'?)";
      std::string list;
      for (const auto& a : allowed)
        list += (list.empty() ? "" : ", ") + a;
      const YAML::Node k = it->first;
      const CaseLocation loc = where(k, join(field, key));
      throw CardError(file_, loc.line, loc.column, join(field, key), key,
                      msg + "; expected one of: " + list);
    }
  }

  std::string text(const YAML::Node& node, const std::string& field) const {
    if (!node.IsScalar())
      fail(node, field, "a single value");
    return node.Scalar();
  }

  double quantity(const YAML::Node& node, const std::string& field, const Dimension& dim,
                  const std::string& expected) const {
    const std::string t = text(node, field);
    try {
      return parse_quantity(t, dim);
    } catch (const std::invalid_argument& e) {
      fail(node, field, expected + " (" + e.what() + ")");
    }
  }

  double number(const YAML::Node& node, const std::string& field,
                const std::string& expected) const {
    return quantity(node, field, dimension::dimensionless(), expected);
  }

  unsigned int count(const YAML::Node& node, const std::string& field,
                     const std::string& expected, unsigned int lo,
                     unsigned int hi) const {
    const std::string t = text(node, field);
    unsigned long v = 0;
    const auto r = std::from_chars(t.data(), t.data() + t.size(), v);
    if (r.ec != std::errc() || r.ptr != t.data() + t.size() || v < lo || v > hi)
      fail(node, field, expected);
    return static_cast<unsigned int>(v);
  }

  bool boolean(const YAML::Node& node, const std::string& field) const {
    const std::string t = text(node, field);
    if (t == "true" || t == "yes" || t == "on")
      return true;
    if (t == "false" || t == "no" || t == "off")
      return false;
    fail(node, field, "true or false");
  }

  double positive(const YAML::Node& node, const std::string& field, const Dimension& dim,
                  const std::string& what) const {
    const double v = quantity(node, field, dim, what);
    if (!(v > 0.0))
      fail(node, field, what + " > 0");
    return v;
  }

  double temperature(const YAML::Node& node, const std::string& field) const {
    const double v = quantity(node, field, dimension::temperature(),
                              "a temperature (e.g. \"300 K\" or \"25 degC\")");
    if (!(v > 0.0))
      fail(node, field, "a temperature > 0 K");
    return v;
  }

  std::vector<double> point(const YAML::Node& node, const std::string& field,
                            int dim) const {
    if (!node.IsSequence() || static_cast<int>(node.size()) != dim)
      fail(node, field,
           "a list of " + std::to_string(dim) +
               " coordinates with units, e.g. [\"0 mm\", \"5 mm\"" +
               (dim == 3 ? ", \"0 mm\"]" : "]"));
    std::vector<double> p;
    for (std::size_t i = 0; i < node.size(); ++i)
      p.push_back(quantity(node[i], field + "[" + std::to_string(i) + "]",
                           dimension::length(), "a length (e.g. \"5 mm\")"));
    return p;
  }

  std::string path(const YAML::Node& node, const std::string& field) const {
    const std::string t = text(node, field);
    if (t.empty())
      fail(node, field, "a file path");
    std::filesystem::path p(t);
    if (p.is_relative() && !base_.empty())
      p = std::filesystem::path(base_) / p;
    return p.lexically_normal().string();
  }

  const std::string& file() const { return file_; }

private:
  std::string file_;
  std::string base_;
};

// A table written as a list of pairs [[x, y], ...] or a single value.
Curve read_curve(const Reader& r, const YAML::Node& node, const std::string& field,
                 const Dimension& xdim, const std::string& xwhat, const Dimension& ydim,
                 const std::string& ywhat, bool positive_y) {
  Curve c;
  if (node.IsScalar()) {
    c.x = {0.0};
    c.y = {r.quantity(node, field, ydim, ywhat)};
    if (positive_y && !(c.y[0] > 0.0))
      r.fail(node, field, ywhat + " > 0");
    return c;
  }
  if (!node.IsSequence() || node.size() < 2)
    r.fail(node, field,
           ywhat + ", or a table of at least 2 pairs [[" + xwhat + ", " + ywhat +
               "], ...]");
  for (std::size_t i = 0; i < node.size(); ++i) {
    const std::string f = field + "[" + std::to_string(i) + "]";
    const YAML::Node pair = node[i];
    if (!pair.IsSequence() || pair.size() != 2)
      r.fail(pair, f, "a pair [" + xwhat + ", " + ywhat + "]");
    const double x = r.quantity(pair[0], f + "[0]", xdim, xwhat);
    const double y = r.quantity(pair[1], f + "[1]", ydim, ywhat);
    if (!c.x.empty() && !(x > c.x.back()))
      r.fail(pair[0], f + "[0]", "values increasing down the table");
    if (positive_y && !(y > 0.0))
      r.fail(pair[1], f + "[1]", ywhat + " > 0");
    if (!positive_y && y < 0.0)
      r.fail(pair[1], f + "[1]", ywhat + " >= 0");
    c.x.push_back(x);
    c.y.push_back(y);
  }
  return c;
}

CaseDescription read_case(const YAML::Node& root, const Reader& r, bool load_materials) {
  CaseDescription c;
  c.file = r.file();
  if (!root.IsMap())
    r.fail(root, "",
           "a case file: a mapping with keys name, geometry, mesh, materials, ...");
  r.check_keys(root, "",
               {"name", "geometry", "mesh", "materials", "initial_temperature",
                "boundaries", "sources", "time", "output", "solver"});
  for (const char* key : {"mesh", "materials", "initial_temperature", "time", "output"})
    if (!root[key])
      r.fail_missing(root, "", key, "see docs/cases.md");

  c.name = root["name"] ? r.text(root["name"], "name")
                        : std::filesystem::path(r.file()).stem().string();

  // geometry
  if (root["geometry"]) {
    const std::string g = r.text(root["geometry"], "geometry");
    if (g == "planar")
      c.geometry = Geometry::planar;
    else if (g == "axisymmetric")
      c.geometry = Geometry::axisymmetric;
    else if (g == "solid" || g == "3d")
      c.geometry = Geometry::solid;
    else
      r.fail(root["geometry"], "geometry", "one of planar, axisymmetric, solid");
  }
  const int dim = c.dimension();

  // mesh
  {
    const YAML::Node m = root["mesh"];
    r.check_keys(m, "mesh",
                 {"file", "generator", "origin", "size", "cells", "radius", "length",
                  "refinements", "material_id", "regions"});
    c.mesh.where = r.where(m, "mesh");
    if (m["file"]) {
      if (m["generator"])
        r.fail(m["generator"], "mesh.generator",
               "either mesh.file or mesh.generator, not both");
      c.mesh.kind = MeshSpec::Kind::gmsh;
      c.mesh.file = r.path(m["file"], "mesh.file");
      c.mesh.where = r.where(m["file"], "mesh.file");
      if (!std::filesystem::exists(c.mesh.file))
        r.fail(m["file"], "mesh.file",
               "an existing Gmsh .msh file (not found: " + c.mesh.file + ")");
    } else if (m["generator"]) {
      const std::string g = r.text(m["generator"], "mesh.generator");
      if (g == "plate")
        c.mesh.kind = MeshSpec::Kind::plate;
      else if (g == "block")
        c.mesh.kind = MeshSpec::Kind::block;
      else if (g == "cylinder")
        c.mesh.kind = MeshSpec::Kind::cylinder;
      else
        r.fail(m["generator"], "mesh.generator", "one of plate, block, cylinder");
      if (c.mesh.kind == MeshSpec::Kind::plate && dim != 2)
        r.fail(m["generator"], "mesh.generator", "block or cylinder for geometry solid");
      if (c.mesh.kind == MeshSpec::Kind::block && dim != 3)
        r.fail(m["generator"], "mesh.generator",
               "plate or cylinder for geometry planar or axisymmetric");
      if (c.mesh.kind == MeshSpec::Kind::cylinder && c.geometry == Geometry::planar)
        r.fail(m["generator"], "mesh.generator",
               "plate for geometry planar (a cylinder needs axisymmetric or solid)");
      if (c.mesh.kind == MeshSpec::Kind::cylinder) {
        for (const char* key : {"radius", "length"})
          if (!m[key])
            r.fail_missing(m, "mesh", key, "a length, e.g. \"10 mm\"");
        c.mesh.radius =
            r.positive(m["radius"], "mesh.radius", dimension::length(), "a length");
        c.mesh.length =
            r.positive(m["length"], "mesh.length", dimension::length(), "a length");
      } else {
        if (!m["size"])
          r.fail_missing(m, "mesh", "size",
                         "a list of " + std::to_string(dim) + " lengths");
        c.mesh.size = r.point(m["size"], "mesh.size", dim);
        for (int i = 0; i < dim; ++i)
          if (!(c.mesh.size[i] > 0))
            r.fail(m["size"][i], "mesh.size[" + std::to_string(i) + "]", "a length > 0");
        c.mesh.origin = m["origin"] ? r.point(m["origin"], "mesh.origin", dim)
                                    : std::vector<double>(dim, 0.0);
      }
      if (m["cells"]) {
        const YAML::Node cells = m["cells"];
        const int n = c.mesh.kind == MeshSpec::Kind::cylinder ? (dim == 2 ? 2 : 1) : dim;
        if (!cells.IsSequence() || static_cast<int>(cells.size()) != n)
          r.fail(cells, "mesh.cells",
                 "a list of " + std::to_string(n) + " cell counts" +
                     (c.mesh.kind == MeshSpec::Kind::cylinder
                          ? (dim == 2 ? " (radial, axial)" : " (axial)")
                          : ""));
        for (int i = 0; i < n; ++i)
          c.mesh.cells.push_back(r.count(cells[i],
                                         "mesh.cells[" + std::to_string(i) + "]",
                                         "a whole number from 1 to 1000", 1, 1000));
      }
    } else {
      r.fail(
          m, "mesh",
          "a mesh with a `file` (Gmsh .msh) or a `generator` (plate, block, cylinder)");
    }
    if (m["refinements"])
      c.mesh.refinements = r.count(m["refinements"], "mesh.refinements",
                                   "a whole number from 0 to 8", 0, 8);
    if (m["material_id"])
      c.mesh.material_id = r.count(m["material_id"], "mesh.material_id",
                                   "a material id from 0 to 255", 0, 255);
    if (m["regions"]) {
      const YAML::Node regs = m["regions"];
      if (!regs.IsSequence())
        r.fail(regs, "mesh.regions", "a list of {material_id, lower, upper}");
      for (std::size_t i = 0; i < regs.size(); ++i) {
        const std::string f = "mesh.regions[" + std::to_string(i) + "]";
        r.check_keys(regs[i], f, {"material_id", "lower", "upper"});
        for (const char* key : {"material_id", "lower", "upper"})
          if (!regs[i][key])
            r.fail_missing(regs[i], f, key, "see docs/cases.md");
        MeshSpec::Region reg;
        reg.material_id = r.count(regs[i]["material_id"], f + ".material_id",
                                  "a material id from 0 to 255", 0, 255);
        reg.lower = r.point(regs[i]["lower"], f + ".lower", dim);
        reg.upper = r.point(regs[i]["upper"], f + ".upper", dim);
        reg.where = r.where(regs[i], f);
        c.mesh.regions.push_back(reg);
      }
    }
  }

  // initial temperature
  c.initial_temperature =
      r.temperature(root["initial_temperature"], "initial_temperature");
  c.initial_where = r.where(root["initial_temperature"], "initial_temperature");

  // materials
  {
    const YAML::Node ms = root["materials"];
    if (!ms.IsSequence() || ms.size() == 0)
      r.fail(ms, "materials", "a list of {id, card} entries");
    std::set<unsigned int> seen;
    for (std::size_t i = 0; i < ms.size(); ++i) {
      const std::string f = "materials[" + std::to_string(i) + "]";
      r.check_keys(ms[i], f, {"id", "card", "initial_temperature"});
      for (const char* key : {"id", "card"})
        if (!ms[i][key])
          r.fail_missing(ms[i], f, key,
                         key == std::string("id") ? "a material id" : "a card path");
      MaterialSpec spec;
      spec.id = r.count(ms[i]["id"], f + ".id", "a material id from 0 to 255", 0, 255);
      if (!seen.insert(spec.id).second)
        r.fail(ms[i]["id"], f + ".id", "each material id once");
      spec.card = r.path(ms[i]["card"], f + ".card");
      spec.where = r.where(ms[i]["card"], f + ".card");
      if (ms[i]["initial_temperature"])
        spec.initial_temperature =
            r.temperature(ms[i]["initial_temperature"], f + ".initial_temperature");
      if (load_materials) {
        if (!std::filesystem::exists(spec.card))
          r.fail(ms[i]["card"], f + ".card",
                 "an existing material card (not found: " + spec.card + ")");
        spec.material = load_card(spec.card);
        if (spec.material->lower_temperature() > c.initial_temperature ||
            spec.material->upper_temperature() < c.initial_temperature) {
          if (!spec.initial_temperature)
            r.fail(root["initial_temperature"], "initial_temperature",
                   "a temperature inside the valid range of " + spec.material->name() +
                       " (" + format_double(spec.material->lower_temperature()) +
                       " K to " + format_double(spec.material->upper_temperature()) +
                       " K)");
        }
        if (spec.initial_temperature &&
            (spec.material->lower_temperature() > *spec.initial_temperature ||
             spec.material->upper_temperature() < *spec.initial_temperature))
          r.fail(ms[i]["initial_temperature"], f + ".initial_temperature",
                 "a temperature inside the valid range of " + spec.material->name() +
                     " (" + format_double(spec.material->lower_temperature()) + " K to " +
                     format_double(spec.material->upper_temperature()) + " K)");
      }
      c.materials.push_back(spec);
    }
  }

  // boundaries
  if (root["boundaries"]) {
    const YAML::Node bs = root["boundaries"];
    if (!bs.IsSequence())
      r.fail(bs, "boundaries", "a list of boundary conditions {id, ...}");
    std::set<unsigned int> seen;
    for (std::size_t i = 0; i < bs.size(); ++i) {
      const std::string f = "boundaries[" + std::to_string(i) + "]";
      const YAML::Node b = bs[i];
      r.check_keys(b, f, {"id", "temperature", "convection", "radiation", "insulated"});
      if (!b["id"])
        r.fail_missing(b, f, "id", "a boundary id");
      BoundarySpec spec;
      spec.boundary_id =
          r.count(b["id"], f + ".id", "a boundary id from 0 to 254", 0, 254);
      spec.where = r.where(b["id"], f + ".id");
      if (!seen.insert(spec.boundary_id).second)
        r.fail(b["id"], f + ".id",
               "each boundary id once (combine convection and radiation in one entry)");
      if (b["temperature"]) {
        if (b["convection"] || b["radiation"] || b["insulated"])
          r.fail(
              b["temperature"], f + ".temperature",
              "a fixed temperature alone (not with convection, radiation or insulated)");
        spec.temperature =
            read_curve(r, b["temperature"], f + ".temperature", dimension::time(),
                       "a time", dimension::temperature(), "a temperature", true);
      }
      if (b["convection"]) {
        const YAML::Node cv = b["convection"];
        const std::string g = f + ".convection";
        r.check_keys(cv, g, {"h", "ambient"});
        for (const char* key : {"h", "ambient"})
          if (!cv[key])
            r.fail_missing(
                cv, g, key,
                key == std::string("h")
                    ? "a heat-transfer coefficient or a table [[T_surface, h], ...]"
                    : "an ambient temperature");
        BoundarySpec::Convection conv;
        conv.coefficient =
            read_curve(r, cv["h"], g + ".h", dimension::temperature(),
                       "a surface temperature", dimension::heat_transfer_coefficient(),
                       "a heat-transfer coefficient (e.g. \"500 W/m^2/K\")", false);
        conv.ambient_temperature = r.temperature(cv["ambient"], g + ".ambient");
        spec.convection = conv;
      }
      if (b["radiation"]) {
        const YAML::Node rd = b["radiation"];
        const std::string g = f + ".radiation";
        r.check_keys(rd, g, {"emissivity", "ambient"});
        for (const char* key : {"emissivity", "ambient"})
          if (!rd[key])
            r.fail_missing(rd, g, key,
                           key == std::string("ambient") ? "an ambient temperature"
                                                         : "an emissivity in (0, 1]");
        BoundarySpec::Radiation rad;
        rad.emissivity =
            r.number(rd["emissivity"], g + ".emissivity", "an emissivity in (0, 1]");
        if (!(rad.emissivity > 0.0 && rad.emissivity <= 1.0))
          r.fail(rd["emissivity"], g + ".emissivity", "an emissivity in (0, 1]");
        rad.ambient_temperature = r.temperature(rd["ambient"], g + ".ambient");
        spec.radiation = rad;
      }
      if (b["insulated"]) {
        if (!r.boolean(b["insulated"], f + ".insulated"))
          r.fail(b["insulated"], f + ".insulated", "true (omit the key otherwise)");
        if (b["convection"] || b["radiation"])
          r.fail(b["insulated"], f + ".insulated",
                 "insulated alone (not with convection or radiation)");
      }
      if (!b["temperature"] && !b["convection"] && !b["radiation"] && !b["insulated"])
        r.fail(b, f, "one of temperature, convection, radiation or insulated: true");
      c.boundaries.push_back(spec);
    }
  }

  // sources
  if (root["sources"]) {
    const YAML::Node ss = root["sources"];
    if (!ss.IsSequence())
      r.fail(ss, "sources",
             "a list of heat sources {power_density, materials, start, end}");
    for (std::size_t i = 0; i < ss.size(); ++i) {
      const std::string f = "sources[" + std::to_string(i) + "]";
      const YAML::Node s = ss[i];
      r.check_keys(s, f, {"power_density", "materials", "start", "end"});
      if (!s["power_density"])
        r.fail_missing(s, f, "power_density", "a power density (e.g. \"2 MW/m^3\")");
      HeatSource src;
      src.power_density =
          r.quantity(s["power_density"], f + ".power_density", dimension::power_density(),
                     "a power density (e.g. \"2 MW/m^3\")");
      if (s["materials"]) {
        if (!s["materials"].IsSequence())
          r.fail(s["materials"], f + ".materials", "a list of material ids");
        for (std::size_t j = 0; j < s["materials"].size(); ++j)
          src.material_ids.push_back(r.count(s["materials"][j],
                                             f + ".materials[" + std::to_string(j) + "]",
                                             "a material id from 0 to 255", 0, 255));
      }
      if (s["start"])
        src.start = r.quantity(s["start"], f + ".start", dimension::time(), "a time");
      if (s["end"])
        src.end = r.quantity(s["end"], f + ".end", dimension::time(), "a time");
      if (!(src.end > src.start))
        r.fail(s["end"] ? s["end"] : s, f + ".end", "an end time after the start time");
      src.where = r.where(s, f);
      c.sources.push_back(src);
    }
  }

  // time
  {
    const YAML::Node t = root["time"];
    r.check_keys(t, "time",
                 {"end", "first_step", "tolerance", "min_step", "max_step",
                  "max_rejections", "max_steps", "adaptive"});
    c.time.where = r.where(t, "time");
    for (const char* key : {"end", "first_step"})
      if (!t[key])
        r.fail_missing(t, "time", key, "a time (e.g. \"60 s\")");
    c.time.end = r.positive(t["end"], "time.end", dimension::time(), "a time");
    c.time.first_step =
        r.positive(t["first_step"], "time.first_step", dimension::time(), "a time");
    if (c.time.first_step > c.time.end)
      r.fail(t["first_step"], "time.first_step", "a first step no longer than time.end");
    if (t["tolerance"])
      c.time.tolerance =
          r.positive(t["tolerance"], "time.tolerance", dimension::temperature(),
                     "a temperature error per step (e.g. \"0.1 K\")");
    if (t["min_step"])
      c.time.min_step =
          r.positive(t["min_step"], "time.min_step", dimension::time(), "a time");
    if (t["max_step"])
      c.time.max_step =
          r.positive(t["max_step"], "time.max_step", dimension::time(), "a time");
    if (t["max_rejections"])
      c.time.max_rejections = r.count(t["max_rejections"], "time.max_rejections",
                                      "a whole number from 1 to 60", 1, 60);
    if (t["max_steps"])
      c.time.max_steps = r.count(t["max_steps"], "time.max_steps",
                                 "a whole number from 1 to 10000000", 1, 10000000);
    if (t["adaptive"])
      c.time.adaptive = r.boolean(t["adaptive"], "time.adaptive");
  }

  // output
  {
    const YAML::Node o = root["output"];
    r.check_keys(
        o, "output",
        {"folder", "interval", "fields", "plot", "probes", "crossing_temperatures"});
    c.output.where = r.where(o, "output");
    if (!o["folder"])
      r.fail_missing(o, "output", "folder", "an output folder");
    c.output.folder = r.path(o["folder"], "output.folder");
    c.output.where = r.where(o["folder"], "output.folder");
    if (o["interval"])
      c.output.interval =
          r.positive(o["interval"], "output.interval", dimension::time(), "a time");
    if (o["fields"])
      c.output.fields = r.boolean(o["fields"], "output.fields");
    if (o["plot"])
      c.output.plot = r.boolean(o["plot"], "output.plot");
    if (o["probes"]) {
      const YAML::Node ps = o["probes"];
      if (!ps.IsSequence())
        r.fail(ps, "output.probes", "a list of {name, point}");
      std::set<std::string> names;
      for (std::size_t i = 0; i < ps.size(); ++i) {
        const std::string f = "output.probes[" + std::to_string(i) + "]";
        r.check_keys(ps[i], f, {"name", "point"});
        for (const char* key : {"name", "point"})
          if (!ps[i][key])
            r.fail_missing(ps[i], f, key,
                           key == std::string("name") ? "a probe name" : "a point");
        Probe p;
        p.name = r.text(ps[i]["name"], f + ".name");
        if (p.name.empty() || p.name.find_first_of(",\"\n ") != std::string::npos)
          r.fail(ps[i]["name"], f + ".name", "a name without blanks, commas or quotes");
        if (!names.insert(p.name).second)
          r.fail(ps[i]["name"], f + ".name", "a probe name used once");
        p.point = r.point(ps[i]["point"], f + ".point", dim);
        p.where = r.where(ps[i]["point"], f + ".point");
        c.output.probes.push_back(p);
      }
    }
    if (o["crossing_temperatures"]) {
      const YAML::Node ts = o["crossing_temperatures"];
      if (!ts.IsSequence())
        r.fail(ts, "output.crossing_temperatures", "a list of temperatures");
      for (std::size_t i = 0; i < ts.size(); ++i)
        c.output.crossing_temperatures.push_back(r.temperature(
            ts[i], "output.crossing_temperatures[" + std::to_string(i) + "]"));
    }
  }

  // solver
  if (root["solver"]) {
    const YAML::Node s = root["solver"];
    r.check_keys(s, "solver",
                 {"formulation", "degree", "newton_tolerance", "max_newton_iterations",
                  "linear_tolerance", "mass"});
    if (s["mass"]) {
      const std::string mm = r.text(s["mass"], "solver.mass");
      if (mm == "lumped")
        c.solver.mass = SolverSpec::Mass::lumped;
      else if (mm == "consistent")
        c.solver.mass = SolverSpec::Mass::consistent;
      else if (mm == "automatic")
        c.solver.mass = SolverSpec::Mass::automatic;
      else
        r.fail(s["mass"], "solver.mass", "lumped, consistent or automatic");
    }
    if (s["formulation"]) {
      const std::string fm = r.text(s["formulation"], "solver.formulation");
      if (fm == "energy")
        c.solver.formulation = Formulation::energy;
      else if (fm == "capacity")
        c.solver.formulation = Formulation::capacity;
      else
        r.fail(s["formulation"], "solver.formulation", "energy or capacity");
    }
    if (s["degree"])
      c.solver.degree = r.count(s["degree"], "solver.degree", "a degree 1, 2 or 3", 1, 3);
    if (s["newton_tolerance"]) {
      c.solver.newton_tolerance = r.number(
          s["newton_tolerance"], "solver.newton_tolerance", "a number in (0, 1e-3]");
      if (!(c.solver.newton_tolerance > 0 && c.solver.newton_tolerance <= 1e-3))
        r.fail(s["newton_tolerance"], "solver.newton_tolerance", "a number in (0, 1e-3]");
    }
    if (s["max_newton_iterations"])
      c.solver.max_newton_iterations =
          r.count(s["max_newton_iterations"], "solver.max_newton_iterations",
                  "a whole number from 1 to 100", 1, 100);
    if (s["linear_tolerance"]) {
      c.solver.linear_tolerance = r.number(
          s["linear_tolerance"], "solver.linear_tolerance", "a number in (0, 1e-4]");
      if (!(c.solver.linear_tolerance > 0 && c.solver.linear_tolerance <= 1e-4))
        r.fail(s["linear_tolerance"], "solver.linear_tolerance", "a number in (0, 1e-4]");
    }
  }
  return c;
}

} // namespace

CaseDescription load_case_from_string(const std::string& text, const std::string& file,
                                      const std::string& base_directory,
                                      bool load_materials) {
  YAML::Node root;
  try {
    root = YAML::Load(text);
  } catch (const YAML::Exception& e) {
    throw CardError(file, e.mark.line >= 0 ? e.mark.line + 1 : 0,
                    e.mark.column >= 0 ? e.mark.column + 1 : 0, "", "",
                    "expected valid YAML (" + e.msg + ")");
  }
  const Reader reader(file, base_directory);
  try {
    return read_case(root, reader, load_materials);
  } catch (const YAML::Exception& e) {
    throw CardError(file, e.mark.line >= 0 ? e.mark.line + 1 : 0,
                    e.mark.column >= 0 ? e.mark.column + 1 : 0, "", "",
                    "expected a well-formed case file (" + e.msg + ")");
  }
}

CaseDescription load_case(const std::string& path) {
  std::ifstream in(path, std::ios::binary);
  if (!in)
    throw CardError(path, 0, 0, "", "", "expected a readable case file (cannot open it)");
  std::ostringstream ss;
  ss << in.rdbuf();
  const std::filesystem::path p(path);
  std::string base = p.parent_path().string();
  if (base.empty())
    base = ".";
  return load_case_from_string(ss.str(), path, base, true);
}

} // namespace quantacal::fe
