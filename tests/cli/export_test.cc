// SPDX-License-Identifier: Apache-2.0
// `quantacal export`: each format is read back and checked against the exact model
// of the card at 10^5 random temperatures (linear interpolation within the stated
// tolerance for c_p and k), the H column is checked to be the trapezoid integral of
// the c_p column, and H against the model's stored energy within the figure the file
// states. Then the refusals: each a clear message, exit code 2, no file written.
//
// The reference is the card's own exact model (Material::thermal_exact,
// conductivity_exact, density): these tests check the export, not the cards (the
// cards are validated against published data in tests/cards).
#include "cli/cli_support.h"

#include <quantacal/cards/card.h>
#include <quantacal/common/exceptions.h>

#include <gtest/gtest.h>

#include <algorithm>
#include <cctype>
#include <chrono>
#include <cmath>
#include <cstdio>
#include <cstring>
#include <map>
#include <memory>
#include <random>
#include <sstream>
#include <string>
#include <vector>

namespace quantacal::test {
namespace {

namespace fs = std::filesystem;

bool contains(const std::string& text, const std::string& part) {
  return text.find(part) != std::string::npos;
}

/// What an export file holds, whatever its format.
struct Columns {
  std::vector<double> t, cp, h, k, rho;
  std::vector<std::pair<double, double>> jumps; ///< intervals not covered, K
  double h_bound = -1.0;                        ///< stated |H - e_model| bound
  double tolerance = -1.0;                      ///< stated relative tolerance
};

/// The number that follows @p key in @p text (throws if there is none).
double number_after(const std::string& text, const std::string& key) {
  const auto at = text.find(key);
  if (at == std::string::npos)
    throw std::runtime_error("no '" + key + "' in the file");
  const char* begin = text.c_str() + at + key.size();
  char* end = nullptr;
  const double v = std::strtod(begin, &end);
  if (end == begin)
    throw std::runtime_error("no number after '" + key + "'");
  return v;
}

/// "A K to B K" jump intervals written after each @p key.
std::vector<std::pair<double, double>> jumps_after(const std::string& text,
                                                   const std::string& key) {
  std::vector<std::pair<double, double>> out;
  for (auto at = text.find(key); at != std::string::npos; at = text.find(key, at + 1)) {
    const std::string rest = text.substr(at + key.size());
    const double a = number_after(rest, "");
    out.emplace_back(a, number_after(rest, "K to "));
  }
  return out;
}

// ---- CSV --------------------------------------------------------------------------

Columns read_csv(const std::string& text, const std::string& expected_header) {
  Columns c;
  std::string comments;
  bool header_seen = false;
  for (const std::string& line : lines_of(text)) {
    if (!line.empty() && line[0] == '#') {
      EXPECT_FALSE(header_seen) << "comment after the header: " << line;
      comments += line + "\n";
      continue;
    }
    if (!header_seen) {
      EXPECT_EQ(line, expected_header);
      header_seen = true;
      continue;
    }
    std::vector<double> row;
    std::istringstream in(line);
    for (std::string field; std::getline(in, field, ',');)
      row.push_back(to_double(field));
    EXPECT_EQ(row.size(), 5u) << line;
    if (row.size() != 5)
      continue;
    c.t.push_back(row[0]);
    c.cp.push_back(row[1]);
    c.h.push_back(row[2]);
    c.k.push_back(row[3]);
    c.rho.push_back(row[4]);
  }
  c.tolerance = number_after(comments, "# tolerance: ") / 100.0;
  c.h_bound = number_after(comments, "|H - e_model| <= ");
  c.jumps = jumps_after(comments, "# jump: ");
  EXPECT_TRUE(contains(comments, "# card: ")) << comments;
  EXPECT_TRUE(contains(comments, "# source: ")) << comments;
  return c;
}

// ---- JSON: a small parser, so that the file is checked to be JSON -------------------

struct Json {
  enum Kind { null, boolean, number, string, array, object } kind = null;
  double value = 0.0;
  std::string text;
  std::vector<Json> items;
  std::map<std::string, Json> members;

  const Json& operator[](const std::string& key) const {
    const auto it = members.find(key);
    if (kind != object || it == members.end())
      throw std::runtime_error("JSON: no member '" + key + "'");
    return it->second;
  }
  std::vector<double> numbers() const {
    std::vector<double> out;
    for (const Json& item : items) {
      if (item.kind != number)
        throw std::runtime_error("JSON: not a number in an array");
      out.push_back(item.value);
    }
    return out;
  }
};

class JsonParser {
public:
  explicit JsonParser(const std::string& text) : s_(text) {}
  Json parse() {
    Json v = value();
    space();
    if (i_ != s_.size())
      fail("trailing text");
    return v;
  }

private:
  [[noreturn]] void fail(const std::string& what) const {
    throw std::runtime_error("JSON: " + what + " at offset " + std::to_string(i_));
  }
  void space() {
    while (i_ < s_.size() && std::isspace(static_cast<unsigned char>(s_[i_])))
      ++i_;
  }
  void expect(char c) {
    space();
    if (i_ >= s_.size() || s_[i_] != c)
      fail(std::string("expected '") + c + "'");
    ++i_;
  }
  std::string string_value() {
    expect('"');
    std::string out;
    while (i_ < s_.size() && s_[i_] != '"') {
      char c = s_[i_++];
      if (static_cast<unsigned char>(c) < 0x20)
        fail("control character in a string");
      if (c == '\\') {
        if (i_ >= s_.size())
          fail("bad escape");
        const char e = s_[i_++];
        if (e == 'n')
          c = '\n';
        else if (e == 't')
          c = '\t';
        else if (e == 'r')
          c = '\r';
        else if (e == '"' || e == '\\' || e == '/')
          c = e;
        else if (e == 'u') {
          i_ += 4; // code point not needed by these tests
          c = '?';
        } else
          fail("bad escape");
      }
      out += c;
    }
    expect('"');
    return out;
  }
  Json value() {
    space();
    if (i_ >= s_.size())
      fail("unexpected end");
    Json v;
    const char c = s_[i_];
    if (c == '{') {
      v.kind = Json::object;
      ++i_;
      space();
      if (s_[i_] == '}') {
        ++i_;
        return v;
      }
      for (;;) {
        const std::string key = string_value();
        expect(':');
        if (!v.members.emplace(key, value()).second)
          fail("duplicate key " + key);
        space();
        if (s_[i_] == ',') {
          ++i_;
          continue;
        }
        expect('}');
        return v;
      }
    }
    if (c == '[') {
      v.kind = Json::array;
      ++i_;
      space();
      if (s_[i_] == ']') {
        ++i_;
        return v;
      }
      for (;;) {
        v.items.push_back(value());
        space();
        if (s_[i_] == ',') {
          ++i_;
          continue;
        }
        expect(']');
        return v;
      }
    }
    if (c == '"') {
      v.kind = Json::string;
      v.text = string_value();
      return v;
    }
    for (const char* word : {"true", "false", "null"})
      if (s_.compare(i_, std::strlen(word), word) == 0) {
        i_ += std::strlen(word);
        v.kind = word[0] == 'n' ? Json::null : Json::boolean;
        v.value = word[0] == 't';
        return v;
      }
    std::size_t end = i_;
    while (end < s_.size() && std::strchr("+-0123456789.eE", s_[end]))
      ++end;
    if (end == i_)
      fail("unexpected character");
    v.kind = Json::number;
    v.value = to_double(s_.substr(i_, end - i_));
    i_ = end;
    return v;
  }

  const std::string& s_;
  std::size_t i_ = 0;
};

Columns read_json(const std::string& text, const std::string& cp_unit) {
  const Json doc = JsonParser(text).parse();
  Columns c;
  const Json& columns = doc["columns"];
  c.t = columns["T"].numbers();
  c.cp = columns["cp"].numbers();
  c.h = columns["H"].numbers();
  c.k = columns["k"].numbers();
  c.rho = columns["density"].numbers();
  c.tolerance = doc["tolerance"]["relative"].value;
  c.h_bound = doc["enthalpy"]["difference_from_model_bound"].value;
  for (const Json& j : doc["jumps"].items)
    c.jumps.emplace_back(j["from_K"].value, j["to_K"].value);
  EXPECT_EQ(doc["units"]["cp"].text, cp_unit);
  EXPECT_EQ(doc["units"]["T"].text, "K");
  EXPECT_EQ(doc["units"]["k"].text, "W/m/K");
  EXPECT_FALSE(doc["card"]["name"].text.empty());
  EXPECT_FALSE(doc["sources"].items.empty());
  return c;
}

// ---- XML (MatML): enough of a reader to extract the values -------------------------

/// Checks that tags nest properly (a well-formedness check of the element structure).
void expect_balanced_tags(const std::string& xml) {
  std::vector<std::string> open;
  for (std::size_t at = xml.find('<'); at != std::string::npos;
       at = xml.find('<', at + 1)) {
    if (xml.compare(at, 2, "<?") == 0 || xml.compare(at, 4, "<!--") == 0)
      continue;
    const std::size_t close = xml.find('>', at);
    ASSERT_NE(close, std::string::npos);
    std::string tag = xml.substr(at + 1, close - at - 1);
    const bool self_closing = !tag.empty() && tag.back() == '/';
    const bool end_tag = !tag.empty() && tag[0] == '/';
    const std::string name = tag.substr(
        end_tag ? 1 : 0, tag.find_first_of(" /", end_tag ? 1 : 0) - (end_tag ? 1 : 0));
    if (self_closing)
      continue;
    if (end_tag) {
      ASSERT_FALSE(open.empty()) << "</" << name << "> without an opening tag";
      ASSERT_EQ(open.back(), name);
      open.pop_back();
    } else
      open.push_back(name);
  }
  EXPECT_TRUE(open.empty());
}

std::string unescape_xml(std::string s) {
  const std::pair<const char*, const char*> entities[] = {
      {"&lt;", "<"}, {"&gt;", ">"}, {"&quot;", "\""}, {"&#39;", "'"}, {"&amp;", "&"}};
  for (const auto& [from, to] : entities)
    for (auto at = s.find(from); at != std::string::npos; at = s.find(from, at + 1))
      s.replace(at, std::strlen(from), to);
  return s;
}

/// Text of the first <tag ...>text</tag> at or after @p from.
std::string element_text(const std::string& xml, const std::string& tag,
                         std::size_t from = 0) {
  const auto open = xml.find("<" + tag, from);
  if (open == std::string::npos)
    throw std::runtime_error("XML: no <" + tag + ">");
  const auto start = xml.find('>', open) + 1;
  const auto end = xml.find("</" + tag + ">", start);
  return xml.substr(start, end - start);
}

std::vector<double> delimited_numbers(const std::string& text) {
  std::vector<double> out;
  std::istringstream in(text);
  for (std::string field; std::getline(in, field, ',');)
    out.push_back(to_double(field));
  return out;
}

Columns read_matml(const std::string& xml) {
  expect_balanced_tags(xml);
  EXPECT_TRUE(contains(xml, "<MatML_Doc>"));
  // PropertyDetails id -> Name, then each PropertyData by its property id.
  std::map<std::string, std::string> id_of;
  for (auto at = xml.find("<PropertyDetails id=\""); at != std::string::npos;
       at = xml.find("<PropertyDetails id=\"", at + 1)) {
    const auto q = at + std::strlen("<PropertyDetails id=\"");
    const std::string id = xml.substr(q, xml.find('"', q) - q);
    id_of[element_text(xml, "Name", at)] = id;
  }
  const auto property = [&](const std::string& name, std::vector<double>& temperatures) {
    const auto at = xml.find("<PropertyData property=\"" + id_of.at(name) + "\"");
    if (at == std::string::npos)
      throw std::runtime_error("XML: no PropertyData for " + name);
    const auto parameter = xml.find("<ParameterValue parameter=\"pa1\"", at);
    temperatures = delimited_numbers(element_text(xml, "Data", parameter));
    return delimited_numbers(element_text(xml, "Data", at));
  };
  Columns c;
  std::vector<double> t_h, t_k, t_rho;
  c.cp = property("Specific Heat Capacity", c.t);
  c.h = property("Enthalpy", t_h);
  c.k = property("Thermal Conductivity", t_k);
  c.rho = property("Density", t_rho);
  EXPECT_EQ(t_h, c.t);
  EXPECT_EQ(t_k, c.t);
  EXPECT_EQ(t_rho, c.t);
  EXPECT_EQ(element_text(xml, "Name", xml.find("<ParameterDetails id=\"pa1\"")),
            "Temperature");
  const std::string notes = unescape_xml(element_text(xml, "Notes"));
  c.tolerance = number_after(notes, "\n") / 100.0; // the line after the summary
  c.h_bound = number_after(notes, "|H - e_model| <= ");
  c.jumps = jumps_after(notes, "Jump: ");
  return c;
}

// ---- the check against the model ---------------------------------------------------

/// Model values at the random temperatures, computed once per card.
struct Reference {
  std::vector<double> t, cp, e, k;
};

/// 10^5 random temperatures: half uniform in T, half uniform in ln T (so that the
/// low-temperature decades, where c_p changes fastest, get their share).
Reference reference_points(const Material& material, Basis basis) {
  Reference r;
  std::mt19937_64 random(20240611);
  const double lo = material.lower_temperature(), hi = material.upper_temperature();
  std::uniform_real_distribution<double> uniform(lo, hi);
  std::uniform_real_distribution<double> logarithmic(std::log(lo), std::log(hi));
  constexpr int n = 100000;
  for (int i = 0; i < n; ++i) {
    const double t =
        i % 2 ? uniform(random) : std::min(hi, std::exp(logarithmic(random)));
    const ThermalState s = material.thermal_exact(t, basis);
    r.t.push_back(t);
    r.cp.push_back(s.capacity);
    r.e.push_back(s.energy);
    r.k.push_back(material.conductivity_exact(t).value);
  }
  return r;
}

struct Measured {
  double cp = 0.0, k = 0.0, h = 0.0;
  std::size_t skipped = 0;
};

Measured check_columns(const Material& material, const Columns& c, Basis basis,
                       const Reference& ref, const std::string& label) {
  Measured m;
  const std::size_t n = c.t.size();
  EXPECT_GT(n, 10u) << label;
  if (n < 2)
    return m;
  EXPECT_EQ(c.cp.size(), n);
  EXPECT_EQ(c.h.size(), n);
  EXPECT_EQ(c.k.size(), n);
  EXPECT_EQ(c.rho.size(), n);
  EXPECT_EQ(c.t.front(), material.lower_temperature()) << label;
  EXPECT_EQ(c.t.back(), material.upper_temperature()) << label;
  for (std::size_t i = 0; i + 1 < n; ++i)
    if (!(c.t[i] < c.t[i + 1])) {
      ADD_FAILURE() << label << ": temperatures not increasing at row " << i;
      return m;
    }

  // Energy consistency: H is the trapezoid integral of the exported c_p, to round-off,
  // starting at the model's stored energy at the first node.
  const double range = material.thermal_exact(c.t.back(), basis).energy -
                       material.thermal_exact(c.t.front(), basis).energy;
  EXPECT_NEAR(c.h[0], material.thermal_exact(c.t[0], basis).energy, 1e-12 * range);
  double sum = c.h[0], worst_trapezoid = 0.0;
  for (std::size_t i = 1; i < n; ++i) {
    sum += 0.5 * (c.cp[i - 1] + c.cp[i]) * (c.t[i] - c.t[i - 1]);
    worst_trapezoid = std::max(worst_trapezoid, std::abs(c.h[i] - sum));
  }
  EXPECT_LE(worst_trapezoid, 1e-12 * range) << label; // round-off of n additions

  // The jump intervals must be tiny (they hold a step of the model).
  double jump_width = 0.0;
  for (const auto& [a, b] : c.jumps) {
    EXPECT_LT(a, b);
    jump_width += b - a;
  }
  EXPECT_LE(jump_width, 1e-5 * (c.t.back() - c.t.front())) << label;

  for (std::size_t i = 0; i < ref.t.size(); ++i) {
    const double t = ref.t[i];
    bool in_jump = false;
    for (const auto& [a, b] : c.jumps)
      in_jump = in_jump || (t > a && t < b);
    const std::size_t j = std::min<std::size_t>(
        std::upper_bound(c.t.begin(), c.t.end(), t) - c.t.begin(), n - 1);
    const double a = c.t[j - 1], b = c.t[j];
    const double w = (t - a) / (b - a);
    const double x = t - a;
    // H between nodes: the exact integral of the linear c_p.
    const double h =
        c.h[j - 1] + c.cp[j - 1] * x + 0.5 * (c.cp[j] - c.cp[j - 1]) * x * x / (b - a);
    m.h = std::max(m.h, std::abs(h - ref.e[i]));
    if (in_jump) {
      ++m.skipped;
      continue;
    }
    const double cp = c.cp[j - 1] + w * (c.cp[j] - c.cp[j - 1]);
    const double k = c.k[j - 1] + w * (c.k[j] - c.k[j - 1]);
    m.cp = std::max(m.cp, std::abs(cp - ref.cp[i]) / ref.cp[i]);
    m.k = std::max(m.k, std::abs(k - ref.k[i]) / ref.k[i]);
  }
  EXPECT_LE(m.cp, c.tolerance) << label;
  EXPECT_LE(m.k, c.tolerance) << label;
  EXPECT_LE(m.h, c.h_bound) << label;
  EXPECT_LE(m.skipped, 10u) << label; // 1e-6 T wide intervals: almost never hit
  std::printf("  %-28s %4zu nodes  worst c_p %.3f %%  k %.3f %%  |H - e| %.3g "
              "(stated bound %.3g, %.3f %% of the range)  skipped %zu\n",
              label.c_str(), n, 100.0 * m.cp, 100.0 * m.k, m.h, c.h_bound,
              100.0 * c.h_bound / range, m.skipped);
  return m;
}

class ExportOfBundledCard : public ::testing::TestWithParam<std::string> {};

TEST_P(ExportOfBundledCard, EachFormatReadBackMeetsTheToleranceAndConservesEnergy) {
  const std::string card = source_path("materials/" + GetParam());
  const MaterialPtr material = load_card(card);
  const auto started = std::chrono::steady_clock::now();
  const Reference ref = reference_points(*material, Basis::mass);
  TempDir dir;
  std::map<std::string, Columns> read;
  for (const std::string ext : {"csv", "json", "xml"}) {
    const std::string file = (dir.path() / ("export." + ext)).string();
    const RunResult r = run_quantacal({"export", card, "--to", file});
    ASSERT_EQ(r.exit_code, 0) << r.err;
    const std::string text = read_file(file);
    read[ext] = ext == "csv"    ? read_csv(text, "T_K,cp_J_per_kg_K,H_J_per_kg,"
                                                    "k_W_per_m_K,rho_kg_per_m3")
                : ext == "json" ? read_json(text, "J/kg/K")
                                : read_matml(text);
    EXPECT_EQ(read[ext].tolerance, 0.005) << ext; // the default, 0.5 %
    check_columns(*material, read[ext], Basis::mass, ref, GetParam() + " " + ext);
  }
  // The three formats carry the same numbers (round-trip text).
  for (const std::string ext : {"json", "xml"}) {
    EXPECT_EQ(read[ext].t, read["csv"].t) << ext;
    EXPECT_EQ(read[ext].cp, read["csv"].cp) << ext;
    EXPECT_EQ(read[ext].h, read["csv"].h) << ext;
    EXPECT_EQ(read[ext].k, read["csv"].k) << ext;
    EXPECT_EQ(read[ext].rho, read["csv"].rho) << ext;
  }
  std::printf(
      "  %s: %.2f s\n", GetParam().c_str(),
      std::chrono::duration<double>(std::chrono::steady_clock::now() - started).count());
}

/// Every bundled card (materials/*.yaml), among them aluminium (melting: latent
/// heat), iron and nickel (Curie peaks, with the step of the magnetic c_p at T_C),
/// steel_c45 (a small step), copper (the 4 K decades).
std::vector<std::string> bundled_cards() {
  std::vector<std::string> names;
  for (const auto& entry : fs::directory_iterator(source_path("materials")))
    if (entry.path().extension() == ".yaml")
      names.push_back(entry.path().filename().string());
  std::sort(names.begin(), names.end());
  return names;
}

TEST(Export, TheBundledCardsIncludeTheCasesThisFileIsAbout) {
  const std::vector<std::string> names = bundled_cards();
  for (const char* needed : {"aluminium.yaml", "iron.yaml", "nickel.yaml", "copper.yaml"})
    EXPECT_NE(std::find(names.begin(), names.end(), needed), names.end()) << needed;
}

INSTANTIATE_TEST_SUITE_P(BundledCards, ExportOfBundledCard,
                         ::testing::ValuesIn(bundled_cards()), [](const auto& info) {
                           std::string name = info.param;
                           return name.substr(0, name.find('.'));
                         });

TEST(Export, LatentHeatIsASteepRiseOfHOverTheTransitionWidth) {
  // Both ends of the melting join of aluminium.yaml are nodes, and H rises across
  // the join by the card's latent heat plus the sensible heat of the width.
  const std::string card = source_path("materials/aluminium.yaml");
  const MaterialPtr material = load_card(card);
  ASSERT_TRUE(material->data().phase_layout);
  const PhaseBoundary melt = material->data().phase_layout->boundaries().back();
  TempDir dir;
  const std::string file = (dir.path() / "al.csv").string();
  ASSERT_EQ(run_quantacal({"export", card, "--to", file, "--basis", "mole"}).exit_code,
            0);
  const Columns c = read_csv(read_file(file),
                             "T_K,cp_J_per_mol_K,H_J_per_mol,k_W_per_m_K,rho_kg_per_m3");
  const double lo = melt.temperature - 0.5 * melt.width,
               hi = melt.temperature + 0.5 * melt.width;
  const auto node = [&](double t) {
    const auto it = std::find(c.t.begin(), c.t.end(), t);
    EXPECT_NE(it, c.t.end()) << t << " K is not a node";
    return static_cast<std::size_t>(it - c.t.begin());
  };
  const std::size_t i = node(lo), j = node(hi);
  ASSERT_LT(i, j);
  EXPECT_GT(j - i, 4u) << "the peak should be resolved by several nodes";
  const double rise = c.h[j] - c.h[i];
  const double model_rise = material->thermal_exact(hi, Basis::mole).energy -
                            material->thermal_exact(lo, Basis::mole).energy;
  EXPECT_GT(rise, melt.latent_heat);
  EXPECT_NEAR(rise, model_rise, 0.005 * model_rise); // within the stated tolerance
  // Steep: the mean c_p over the join is many times the c_p just below it.
  EXPECT_GT(rise / melt.width, 10.0 * c.cp[i]);
}

TEST(Export, MoleBasisAndLooserToleranceGiveFewerNodesAndStillMeetIt) {
  const std::string card = source_path("materials/nickel.yaml");
  const MaterialPtr material = load_card(card);
  TempDir dir;
  const std::string tight = (dir.path() / "tight.json").string();
  const std::string loose = (dir.path() / "loose.json").string();
  ASSERT_EQ(run_quantacal({"export", card, "--to", tight, "--basis", "mole"}).exit_code,
            0);
  const RunResult r = run_quantacal(
      {"export", card, "--to", loose, "--basis=mole", "--tolerance", "2 %"});
  ASSERT_EQ(r.exit_code, 0) << r.err;
  const Columns a = read_json(read_file(tight), "J/mol/K");
  const Columns b = read_json(read_file(loose), "J/mol/K");
  EXPECT_EQ(b.tolerance, 0.02);
  EXPECT_LT(b.t.size(), a.t.size());
  const Reference ref = reference_points(*material, Basis::mole);
  check_columns(*material, b, Basis::mole, ref, "nickel json mole 2 %");
}

TEST(Export, RangeOptionsLimitTheNodes) {
  const std::string card = source_path("materials/copper.yaml");
  TempDir dir;
  const std::string file = (dir.path() / "part.csv").string();
  const RunResult r = run_quantacal(
      {"export", card, "--to", file, "--from", "20", "--until", "26.85 degC"});
  ASSERT_EQ(r.exit_code, 0) << r.err;
  const Columns c =
      read_csv(read_file(file), "T_K,cp_J_per_kg_K,H_J_per_kg,k_W_per_m_K,rho_kg_per_m3");
  ASSERT_FALSE(c.t.empty());
  EXPECT_EQ(c.t.front(), 20.0);
  EXPECT_DOUBLE_EQ(c.t.back(), 300.0);
}

TEST(Export, HelpByOptionAndByHelpCommand) {
  const RunResult a = run_quantacal({"export", "--help"});
  const RunResult b = run_quantacal({"help", "export"});
  EXPECT_EQ(a.exit_code, 0);
  EXPECT_EQ(b.exit_code, 0);
  EXPECT_EQ(a.out, b.out);
  EXPECT_TRUE(contains(a.out, "usage: quantacal export CARD --to")) << a.out;
  EXPECT_TRUE(contains(a.out, "--tolerance PERCENT")) << a.out;
  EXPECT_TRUE(contains(a.out, "MatML")) << a.out;
  EXPECT_TRUE(contains(run_quantacal({"--help"}).out, "export")) << "not in the list";
}

// ---- refusals ----------------------------------------------------------------------

/// Runs an export that must be refused: exit 2, @p message on stderr, folder empty.
void expect_refused(std::vector<std::string> args, const std::string& message,
                    const std::string& file_name = "out.csv") {
  TempDir dir;
  const std::string file = (dir.path() / file_name).string();
  for (auto& a : args)
    if (a == "OUT")
      a = file;
  const RunResult r = run_quantacal(args);
  EXPECT_EQ(r.exit_code, 2) << r.err;
  EXPECT_TRUE(contains(r.err, message)) << "expected \"" << message << "\" in: " << r.err;
  EXPECT_TRUE(contains(r.err, "quantacal export: error: ")) << r.err;
  EXPECT_TRUE(r.out.empty()) << r.out;
  EXPECT_TRUE(fs::is_empty(dir.path())) << "a file was written";
}

TEST(Export, RefusesAnUnknownExtension) {
  const std::string card = source_path("materials/copper.yaml");
  expect_refused({"export", card, "--to", "OUT"},
                 "unknown extension '.txt': expected .csv, .json or .xml", "out.txt");
  expect_refused({"export", card, "--to", "OUT"}, "(did you mean '.json'?)", "out.jsn");
  expect_refused({"export", card, "--to", "OUT"}, "the file name has no extension",
                 "table");
  expect_refused({"export", card, "--to", "500"},
                 "--to names the output file; the last temperature is --until");
}

TEST(Export, RefusesABadTolerance) {
  const std::string card = source_path("materials/copper.yaml");
  expect_refused({"export", card, "--to", "OUT", "--tolerance", "0%"},
                 "option --tolerance = \"0%\": expected a tolerance > 0%");
  expect_refused({"export", card, "--to", "OUT", "--tolerance", "-0.5%"},
                 "expected a tolerance > 0%");
  expect_refused({"export", card, "--to", "OUT", "--tolerance", "0.005"},
                 "option --tolerance = \"0.005\": expected a percentage such as 0.5%");
  expect_refused({"export", card, "--to", "OUT", "--tolerance", "half%"},
                 "expected a percentage such as 0.5%");
  expect_refused({"export", card, "--to", "OUT", "--tolerance", "50%"},
                 "expected a tolerance from 0.001% to 10%");
}

TEST(Export, RefusesAnUnknownBasisAnOptionTypoAndMissingArguments) {
  const std::string card = source_path("materials/copper.yaml");
  expect_refused({"export", card, "--to", "OUT", "--basis", "weight"},
                 "option --basis = \"weight\": expected one of mass, mole, volume");
  expect_refused({"export", card, "--to", "OUT", "--tolerence", "1%"},
                 "unknown option '--tolerence' (did you mean '--tolerance'?)");
  expect_refused({"export", card}, "option --to FILE is required");
  expect_refused({"export", "--to", "OUT"}, "expected exactly one CARD but got 0");
}

TEST(Export, RefusesAMissingCardAndATemperatureOutsideTheRange) {
  TempDir cards;
  const std::string missing = (cards.path() / "no-such-card.yaml").string();
  expect_refused({"export", missing, "--to", "OUT"}, "no-such-card.yaml");
  const std::string card = source_path("materials/copper.yaml");
  expect_refused({"export", card, "--to", "OUT", "--until", "5000"}, "--until");
  expect_refused({"export", card, "--to", "OUT", "--from", "300", "--until", "200"},
                 "must be below --until");
}

TEST(Export, AFailedRunLeavesAnExistingFileAsItWas) {
  const std::string card = source_path("materials/copper.yaml");
  TempDir dir;
  const std::string file = dir.write("kept.csv", "old content\n");
  const RunResult r = run_quantacal({"export", card, "--to", file, "--until", "1e6"});
  EXPECT_EQ(r.exit_code, 2);
  EXPECT_EQ(read_file(file), "old content\n");
  EXPECT_FALSE(fs::exists(file + ".tmp"));
  // A successful run replaces it whole.
  ASSERT_EQ(run_quantacal({"export", card, "--to", file}).exit_code, 0);
  EXPECT_EQ(read_file(file).rfind("# quantacal export of card", 0), 0u);
}

} // namespace
} // namespace quantacal::test
