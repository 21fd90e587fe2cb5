// SPDX-License-Identifier: Apache-2.0
// The `heat_capacity` list and the `dilation` block of a card.
#include "card_reader.h"

#include <quantacal/common/text.h>
#include <quantacal/models/phases.h>

#include "units_detail.h"

#include <functional>
#include <map>
#include <stdexcept>

namespace quantacal::detail {
namespace {

const std::vector<std::string> kKinds = {"debye",    "einstein",   "electronic",
                                         "schottky", "transition", "tabulated",
                                         "shomate",  "magnetic",   "gibbs_series"};

const std::vector<std::string> kOrderings = {"ferromagnetic", "antiferromagnetic"};

// How SGTE data of an antiferromagnet translate into the card's positive values.
const char* const kSgteAntiferromagnets =
    " (an antiferromagnet's SGTE value is negative: divide it by the antiferromagnetic "
    "factor, -1 for bcc, -3 for other structures)";

double modes_of(CardReader& reader, const YAML::Node& node, const std::string& path) {
  const YAML::Node m = reader.optional(node, "modes");
  if (!m.IsDefined())
    return 3.0;
  const std::string mpath = join_path(path, "modes");
  const double modes = reader.number(m, mpath);
  if (!(modes > 0.0))
    reader.fail(m, mpath, reader.text(m, mpath),
                "expected a number of modes > 0 (3 per atom)");
  reader.record_parameter(m, mpath);
  return modes;
}

double temperature_parameter(CardReader& reader, const YAML::Node& node,
                             const std::string& path, const std::string& key) {
  const YAML::Node n = reader.require(node, path, key);
  const std::string p = join_path(path, key);
  const double t = reader.positive_temperature(n, p);
  reader.record_parameter(n, p);
  return t;
}

// A required bare number > 0; the error reads "expected <what> > 0<after>".
double positive_number(CardReader& reader, const YAML::Node& node,
                       const std::string& path, const std::string& key,
                       const std::string& what, const std::string& after = "") {
  const YAML::Node n = reader.require(node, path, key);
  const std::string p = join_path(path, key);
  const double v = reader.number(n, p);
  if (!(v > 0.0))
    reader.fail(n, p, reader.text(n, p), "expected " + what + " > 0" + after);
  reader.record_parameter(n, p);
  return v;
}

/// The quantity at @p n (path @p p) in @p dim, which must be > 0 (else @p expected).
double positive_quantity(CardReader& reader, const YAML::Node& n, const std::string& p,
                         const Dimension& dim, const std::string& expected) {
  const double v = reader.quantity(n, p, dim);
  if (!(v > 0.0))
    reader.fail(n, p, reader.text(n, p), expected);
  reader.record_parameter(n, p);
  return v;
}

/** `below: debye-t3` (default) or `below: "<energy at the first temperature>"`. */
LowerExtension read_below(CardReader& reader, const YAML::Node& node,
                          const std::string& path, const CardBasics& basics) {
  LowerExtension below;
  const YAML::Node b = reader.optional(node, "below");
  if (!b.IsDefined())
    return below;
  const std::string bpath = join_path(path, "below");
  const std::string t = reader.text(b, bpath);
  if (t == "debye-t3")
    return below;
  std::size_t found = 0;
  Quantity q;
  try {
    q = parse_quantity(t);
  } catch (const std::invalid_argument&) {
    reader.fail(b, bpath, t,
                "expected \"debye-t3\" or the energy at the first temperature (e.g. "
                "\"1.2 kJ/mol\")");
  }
  (void)q;
  const double e = reader.quantity_of(
      b, bpath, {dimension::molar_energy(), dimension::specific_energy()}, found);
  if (!(e >= 0.0))
    reader.fail(b, bpath, t, "expected an energy >= 0");
  below.kind = LowerExtension::Kind::energy;
  below.energy = found == 0 ? e : e * basics.molar_mass;
  reader.record_parameter(b, bpath);
  return below;
}

// A Sommerfeld term: `gamma` >= 0 J/mol/K^2.
ContributionPtr read_electronic(CardReader& reader, const YAML::Node& node,
                                const std::string& path) {
  reader.check_keys(node, path, {"kind", "gamma"});
  const std::string gpath = join_path(path, "gamma");
  const YAML::Node g = reader.require(node, path, "gamma");
  const double gamma = reader.quantity(g, gpath, dimension::sommerfeld());
  if (!(gamma >= 0.0))
    reader.fail(g, gpath, reader.text(g, gpath),
                "expected a Sommerfeld coefficient >= 0 J/mol/K^2");
  reader.record_parameter(g, gpath);
  return make_electronic(gamma);
}

// A latent heat smeared over `width` around `temperature` (molar or specific latent
// heat).
// `kind: gibbs_series`: pieces of the Gibbs-energy series of assessed element data,
// each {from (first piece only), to, c, d, e, f, g, h, i}, coefficients in J/mol with
// T in K (phases.h).
ContributionPtr read_gibbs_series(CardReader& reader, const YAML::Node& node,
                                  const std::string& path) {
  reader.check_keys(node, path, {"kind", "pieces"});
  const std::string ppath = join_path(path, "pieces");
  const YAML::Node list = reader.require(node, path, "pieces");
  reader.expect_sequence(list, ppath);
  if (list.size() == 0)
    reader.fail(list, ppath, "", "expected at least one piece");
  std::vector<GibbsPiece> pieces;
  for (std::size_t k = 0; k < list.size(); ++k) {
    const std::string ip = index_path(ppath, k);
    const YAML::Node item = list[k];
    reader.check_keys(item, ip, {"from", "to", "c", "d", "e", "f", "g", "h", "i"});
    GibbsPiece p;
    if (k == 0) {
      p.from = temperature_parameter(reader, item, ip, "from");
    } else {
      if (item["from"].IsDefined())
        reader.fail(item["from"], join_path(ip, "from"), "",
                    "a later piece starts where the one before ends; remove `from`");
      p.from = pieces.back().to;
    }
    const YAML::Node to = reader.require(item, ip, "to");
    p.to = temperature_parameter(reader, item, ip, "to");
    if (!(p.to > p.from))
      reader.fail(to, join_path(ip, "to"), reader.text(to, join_path(ip, "to")),
                  "expected the end of the piece above its start (" +
                      format_double(p.from) + " K)");
    double* coefficient[] = {&p.c, &p.d, &p.e, &p.f, &p.g, &p.h, &p.i};
    const char* names[] = {"c", "d", "e", "f", "g", "h", "i"};
    for (int i = 0; i < 7; ++i) {
      const YAML::Node n = reader.optional(item, names[i]);
      if (!n.IsDefined())
        continue;
      const std::string cp = join_path(ip, names[i]);
      *coefficient[i] = reader.number(n, cp);
      reader.record_parameter(n, cp);
    }
    pieces.push_back(p);
  }
  return make_gibbs_series(std::move(pieces));
}

ContributionPtr read_transition(CardReader& reader, const YAML::Node& node,
                                const std::string& path, const CardBasics& basics) {
  reader.check_keys(node, path, {"kind", "temperature", "latent_heat", "width"});
  const double t = temperature_parameter(reader, node, path, "temperature");
  const std::string lpath = join_path(path, "latent_heat");
  const YAML::Node l = reader.require(node, path, "latent_heat");
  std::size_t found = 0;
  double latent = reader.quantity_of(
      l, lpath, {dimension::molar_energy(), dimension::specific_energy()}, found);
  if (found == 1)
    latent *= basics.molar_mass;
  if (!(latent > 0.0))
    reader.fail(l, lpath, reader.text(l, lpath), "expected a latent heat > 0");
  reader.record_parameter(l, lpath);
  const std::string wpath = join_path(path, "width");
  const YAML::Node w = reader.require(node, path, "width");
  const double width = reader.positive_temperature_difference(w, wpath);
  reader.record_parameter(w, wpath);
  if (!(width < t / 4))
    reader.fail(w, wpath, reader.text(w, wpath),
                "expected a width below a quarter of the transition temperature");
  return make_transition(t, latent, width);
}

// Measured points, molar or specific, with the extension below the first point.
ContributionPtr read_tabulated(CardReader& reader, const YAML::Node& node,
                               const std::string& path, const CardBasics& basics) {
  reader.check_keys(node, path, {"kind", "columns", "rows", "points", "below"});
  ReadTable t = read_temperature_table(
      reader, node, path, {dimension::molar_capacity(), dimension::specific_capacity()},
      "a heat capacity (J/mol/K or J/kg/K)", true);
  if (t.y_dimension == 1)
    for (double& c : t.y)
      c *= basics.molar_mass;
  const bool has_points = node["points"].IsDefined();
  const std::string rows_path = join_path(path, has_points ? "points" : "rows");
  reader.record_parameter(has_points ? node["points"] : node["rows"], rows_path);
  const LowerExtension below = read_below(reader, node, path, basics);
  return make_tabulated(std::move(t.x), std::move(t.y), below);
}

// A Shomate polynomial with its range and the extension below it.
ContributionPtr read_shomate(CardReader& reader, const YAML::Node& node,
                             const std::string& path, const CardBasics& basics) {
  reader.check_keys(node, path, {"kind", "A", "B", "C", "D", "E", "range", "below"});
  std::vector<double> coefficients;
  for (const char* key : {"A", "B", "C", "D", "E"}) {
    const YAML::Node c = reader.require(node, path, key);
    const std::string cpath = join_path(path, key);
    coefficients.push_back(reader.number(c, cpath));
    reader.record_parameter(c, cpath);
  }
  const std::string rpath = join_path(path, "range");
  const YAML::Node range = reader.require(node, path, "range");
  reader.check_keys(range, rpath, {"from", "to"});
  const double from = reader.positive_temperature(reader.require(range, rpath, "from"),
                                                  join_path(rpath, "from"));
  const YAML::Node to_node = reader.require(range, rpath, "to");
  const double to = reader.positive_temperature(to_node, join_path(rpath, "to"));
  if (!(to > from))
    reader.fail(to_node, join_path(rpath, "to"),
                reader.text(to_node, join_path(rpath, "to")),
                "expected the end of the range above its start");
  reader.record_parameter(range, rpath);
  const LowerExtension below = read_below(reader, node, path, basics);
  return make_shomate(coefficients, from, to, below);
}

// Magnetic ordering (Inden, Hillert and Jarl): the Curie or Neel temperature, the mean
// moment, the structure factor and, as a label, the kind of `ordering`.
ContributionPtr read_magnetic(CardReader& reader, const YAML::Node& node,
                              const std::string& path) {
  reader.check_keys(
      node, path,
      {"kind", "critical_temperature", "moment", "structure_factor", "ordering"});
  const std::string tpath = join_path(path, "critical_temperature");
  const YAML::Node tn = reader.require(node, path, "critical_temperature");
  const double tc = reader.quantity(tn, tpath, dimension::temperature());
  if (!(tc > 0.0))
    reader.fail(tn, tpath, reader.text(tn, tpath),
                std::string("expected a Curie or Neel temperature > 0 K") +
                    kSgteAntiferromagnets);
  reader.record_parameter(tn, tpath);
  const double moment =
      positive_number(reader, node, path, "moment", "a magnetic moment",
                      std::string(" Bohr magnetons per atom") + kSgteAntiferromagnets);
  const std::string ppath = join_path(path, "structure_factor");
  const YAML::Node pn = reader.require(node, path, "structure_factor");
  const double p = reader.number(pn, ppath);
  if (!(p > 0.0 && p < 1.0))
    reader.fail(pn, ppath, reader.text(pn, ppath),
                "expected a structure factor between 0 and 1 (0.40 for bcc, 0.28 for "
                "other structures)");
  reader.record_parameter(pn, ppath);
  const YAML::Node on = reader.optional(node, "ordering");
  if (on.IsDefined()) {
    const std::string opath = join_path(path, "ordering");
    const std::string ordering = reader.text(on, opath);
    if (ordering != kOrderings[0] && ordering != kOrderings[1])
      reader.fail(on, opath, ordering,
                  "unknown ordering" + did_you_mean(ordering, kOrderings) +
                      "; expected one of: ferromagnetic, antiferromagnetic");
  }
  return make_magnetic(tc, moment, p);
}

ContributionPtr read_contribution(CardReader& reader, const YAML::Node& node,
                                  const std::string& path, const CardBasics& basics) {
  reader.expect_map(node, path);
  const std::string kpath = join_path(path, "kind");
  const YAML::Node kind_node = reader.require(node, path, "kind");
  const std::string kind = reader.text(kind_node, kpath);

  if (kind == "debye") {
    reader.check_keys(node, path, {"kind", "theta_D", "modes"});
    const double theta = temperature_parameter(reader, node, path, "theta_D");
    return make_debye(theta, modes_of(reader, node, path));
  }
  if (kind == "einstein") {
    reader.check_keys(node, path, {"kind", "theta_E", "modes"});
    const double theta = temperature_parameter(reader, node, path, "theta_E");
    return make_einstein(theta, modes_of(reader, node, path));
  }
  if (kind == "electronic")
    return read_electronic(reader, node, path);
  if (kind == "schottky") {
    reader.check_keys(node, path, {"kind", "gap", "degeneracy_ratio", "centres"});
    const double gap = temperature_parameter(reader, node, path, "gap");
    const double g =
        positive_number(reader, node, path, "degeneracy_ratio", "a degeneracy ratio");
    const double n = positive_number(reader, node, path, "centres",
                                     "a number of centres per formula unit");
    return make_schottky(gap, g, n);
  }
  if (kind == "transition")
    return read_transition(reader, node, path, basics);
  if (kind == "tabulated")
    return read_tabulated(reader, node, path, basics);
  if (kind == "shomate")
    return read_shomate(reader, node, path, basics);
  if (kind == "magnetic")
    return read_magnetic(reader, node, path);
  if (kind == "gibbs_series")
    return read_gibbs_series(reader, node, path);
  std::string list;
  for (const auto& k : kKinds)
    list += (list.empty() ? "" : ", ") + k;
  reader.fail(kind_node, kpath, kind,
              "unknown contribution kind" + did_you_mean(kind, kKinds) +
                  "; expected one of: " + list);
}

} // namespace

std::vector<ContributionPtr> read_heat_capacity(CardReader& reader,
                                                const YAML::Node& list,
                                                const std::string& path,
                                                const CardBasics& basics) {
  reader.expect_sequence(list, path);
  if (list.size() == 0)
    reader.fail(list, path, "", "expected at least one contribution");
  std::vector<ContributionPtr> contributions;
  for (std::size_t i = 0; i < list.size(); ++i) {
    const std::string p = index_path(path, i);
    const YAML::Node item = list[i];
    try {
      contributions.push_back(read_contribution(reader, item, p, basics));
    } catch (const InputError& e) {
      if (!e.file().empty() || e.line() > 0)
        throw; // already located by the reader
      // The model layer's own check of a parameter (Boost.Math style message).
      reader.fail(item, p, "", e.what());
    }
  }
  return contributions;
}

Dilation read_dilation(CardReader& reader, const YAML::Node& node,
                       const std::string& path) {
  reader.check_keys(node, path,
                    {"nernst_lindemann", "grueneisen", "bulk_modulus", "molar_volume"});
  Dilation d;
  const YAML::Node nl = reader.optional(node, "nernst_lindemann");
  const YAML::Node gg = reader.optional(node, "grueneisen");
  if (nl.IsDefined()) {
    for (const char* key : {"grueneisen", "bulk_modulus", "molar_volume"})
      if (node[key].IsDefined())
        reader.fail(node[key], join_path(path, key), "",
                    "give either `nernst_lindemann` or `grueneisen`, `bulk_modulus` and "
                    "`molar_volume`, not both");
    d.kind = Dilation::Kind::nernst_lindemann;
    d.coefficient =
        positive_quantity(reader, nl, join_path(path, "nernst_lindemann"),
                          dimension::inverse_molar_energy(),
                          "expected a Nernst-Lindemann coefficient > 0 mol/J");
    return d;
  }
  if (!gg.IsDefined())
    reader.fail(node, path, "",
                "expected `nernst_lindemann`, or `grueneisen` with `bulk_modulus` and "
                "`molar_volume`");
  d.kind = Dilation::Kind::grueneisen;
  d.grueneisen =
      positive_number(reader, node, path, "grueneisen", "a Grueneisen parameter");
  d.bulk_modulus = positive_quantity(
      reader, reader.require(node, path, "bulk_modulus"), join_path(path, "bulk_modulus"),
      dimension::pressure(), "expected a bulk modulus > 0 Pa");
  d.molar_volume = positive_quantity(
      reader, reader.require(node, path, "molar_volume"), join_path(path, "molar_volume"),
      dimension::molar_volume(), "expected a molar volume > 0 m^3/mol");
  return d;
}

} // namespace quantacal::detail
