// SPDX-License-Identifier: Apache-2.0
// Quantities with units as strings -> SI, with dimension checks.
//
// The list of units is closed and documented in docs/cards.md ("Units"). A unit
// expression is a product of factors: `J/mol/K^2`, `W/m^2/K`, `J/(mol K)`,
// `kg m^-3`, `mJ*mol^-1*K^-2`. A `/` divides by the factor (or parenthesised
// group) that follows it only, so `J/mol/K` is J mol^-1 K^-1.
#include "units_detail.h"

#include <quantacal/cards/units.h>
#include <quantacal/common/constants.h>
#include <quantacal/common/exceptions.h>

#include <algorithm>
#include <cctype>
#include <charconv>
#include <cmath>
#include <map>
#include <stdexcept>
#include <utility>

namespace quantacal {
namespace {

// Exponent order: kg, m, s, K, mol, A.
Dimension dim(int kg, int m, int s, int k, int mol, int a = 0) {
  Dimension d;
  d.exponents = {kg, m, s, k, mol, a};
  return d;
}

/// Thrown by the exponent arithmetic below, turned into an InputError by UnitParser.
struct ExponentOutOfRange {};

/// The largest power of a base unit a unit expression may reach (fuzz_units found
/// "m^1937919210 m^1937919210" overflowing int): far beyond any physical unit.
constexpr long long max_unit_exponent = 1000;

int checked_exponent(long long e) {
  if (e > max_unit_exponent || e < -max_unit_exponent)
    throw ExponentOutOfRange{};
  return static_cast<int>(e);
}

Dimension operator*(const Dimension& a, const Dimension& b) {
  Dimension r;
  for (std::size_t i = 0; i < r.exponents.size(); ++i)
    r.exponents[i] =
        checked_exponent(static_cast<long long>(a.exponents[i]) + b.exponents[i]);
  return r;
}

Dimension power(const Dimension& a, int p) {
  Dimension r;
  for (std::size_t i = 0; i < r.exponents.size(); ++i)
    r.exponents[i] = checked_exponent(static_cast<long long>(a.exponents[i]) * p);
  return r;
}

struct UnitSymbol {
  double scale;
  Dimension dimension;
  double offset; ///< non-zero for degC and degF: read alone, (x + offset) * scale is K
};

/// 0 K on the Fahrenheit scale is -459.67 degF, and one degF is 5/9 K (the
/// definition of the Fahrenheit scale from the kelvin, NIST SP 811 B.8).
constexpr double fahrenheit_offset = 459.67;
constexpr double fahrenheit_degree = 5.0 / 9.0;

/// The thermochemical calorie, 4.184 J exactly (ISO 80000-5; NIST SP 811 B.8
/// "calorie_th"), the calorie of the older calorimetry literature.
constexpr double thermochemical_calorie = 4.184;

// The closed list of unit symbols (docs/cards.md, "Units").
const std::map<std::string, UnitSymbol>& unit_symbols() {
  static const std::map<std::string, UnitSymbol> symbols = [] {
    std::map<std::string, UnitSymbol> s;
    const auto add = [&s](const std::string& name, double scale, Dimension d) {
      s.emplace(name, UnitSymbol{scale, d, 0.0});
    };
    // Prefixed families: symbol, dimension, allowed prefixes.
    const std::map<char, double> prefix = {{'n', 1e-9}, {'u', 1e-6}, {'m', 1e-3},
                                           {'c', 1e-2}, {'k', 1e3},  {'M', 1e6},
                                           {'G', 1e9}};
    const auto family = [&](const std::string& name, double scale, Dimension d,
                            const std::string& prefixes) {
      add(name, scale, d);
      for (char p : prefixes)
        add(std::string(1, p) + name, scale * prefix.at(p), d);
    };
    family("m", 1.0, dim(0, 1, 0, 0, 0), "numck");      // nm um mm cm km
    family("g", 1e-3, dim(1, 0, 0, 0, 0), "umk");       // ug mg g kg
    family("s", 1.0, dim(0, 0, 1, 0, 0), "num");        // ns us ms s
    family("K", 1.0, dim(0, 0, 0, 1, 0), "m");          // mK K
    family("mol", 1.0, dim(0, 0, 0, 0, 1), "mk");       // mmol mol kmol
    family("J", 1.0, dim(1, 2, -2, 0, 0), "umkMG");     // uJ mJ J kJ MJ GJ
    family("W", 1.0, dim(1, 2, -3, 0, 0), "umkMG");     // uW mW W kW MW GW
    family("Pa", 1.0, dim(1, -1, -2, 0, 0), "kMG");     // Pa kPa MPa GPa
    family("N", 1.0, dim(1, 1, -2, 0, 0), "k");         // N kN
    family("Ohm", 1.0, dim(1, 2, -3, 0, 0, -2), "num"); // nOhm uOhm mOhm Ohm
    // cal kcal: the thermochemical calorie
    family("cal", thermochemical_calorie, dim(1, 2, -2, 0, 0), "k");
    add("min", 60.0, dim(0, 0, 1, 0, 0));
    add("h", 3600.0, dim(0, 0, 1, 0, 0));
    add("L", 1e-3, dim(0, 3, 0, 0, 0));
    add("bar", 1e5, dim(1, -1, -2, 0, 0));
    add("1", 1.0, dim(0, 0, 0, 0, 0));
    s.emplace("degC", UnitSymbol{1.0, dim(0, 0, 0, 1, 0), celsius_offset});
    s.emplace("degF",
              UnitSymbol{fahrenheit_degree, dim(0, 0, 0, 1, 0), fahrenheit_offset});
    return s;
  }();
  return symbols;
}

// Recursive-descent parser of a unit expression.
class UnitParser {
public:
  explicit UnitParser(const std::string& text) : text_(text) {}

  UnitSymbol parse() {
    UnitSymbol result;
    try {
      result = product();
    } catch (const ExponentOutOfRange&) {
      fail("a power beyond " + std::to_string(max_unit_exponent) + " of a base unit");
    }
    skip_space();
    if (pos_ != text_.size())
      fail("unexpected '" + std::string(1, text_[pos_]) + "'");
    return result;
  }

  int n_factors() const { return n_factors_; }
  /// The offset of degC or degF written alone (an absolute temperature), else 0.
  double only_offset() const {
    return n_factors_ == 1 && n_offset_ == 1 && !powered_offset_ ? offset_ : 0.0;
  }
  /// The symbols with their net powers, merged, in written order.
  std::vector<std::pair<std::string, int>> factors() const {
    std::vector<std::pair<std::string, int>> merged;
    for (const auto& leaf : leaves_) {
      // (not a structured binding: C++17 cannot capture one in the lambda; clang rejects
      // it)
      const std::string& symbol = leaf.first;
      const int power = leaf.second;
      const auto it = std::find_if(merged.begin(), merged.end(),
                                   [&](const auto& f) { return f.first == symbol; });
      if (it == merged.end())
        merged.emplace_back(symbol, power);
      else
        it->second += power;
    }
    merged.erase(std::remove_if(merged.begin(), merged.end(),
                                [](const auto& f) { return f.second == 0; }),
                 merged.end());
    return merged;
  }

private:
  [[noreturn]] void fail(const std::string& what) const {
    throw InputError::argument("", "", "", "unit \"" + text_ + "\": " + what);
  }

  void skip_space() {
    while (pos_ < text_.size() && (text_[pos_] == ' ' || text_[pos_] == '\t'))
      ++pos_;
  }

  static bool is_symbol_char(char c) {
    return (c >= 'a' && c <= 'z') || (c >= 'A' && c <= 'Z') || c == '1';
  }

  UnitSymbol product() {
    UnitSymbol acc{1.0, Dimension{}, 0.0};
    bool first = true;
    while (true) {
      skip_space();
      if (pos_ >= text_.size() || text_[pos_] == ')')
        break;
      int sign = 1;
      if (text_[pos_] == '/') {
        sign = -1;
        ++pos_;
        skip_space();
      } else if (text_[pos_] == '*' || text_[pos_] == '.') {
        if (first)
          fail("a unit cannot start with '" + std::string(1, text_[pos_]) + "'");
        ++pos_;
        skip_space();
      }
      const std::size_t first_leaf = leaves_.size();
      const UnitSymbol f = factor();
      if (sign < 0)
        for (std::size_t i = first_leaf; i < leaves_.size(); ++i)
          leaves_[i].second = -leaves_[i].second;
      acc.scale *= sign > 0 ? f.scale : 1.0 / f.scale;
      acc.dimension = acc.dimension * power(f.dimension, sign);
      first = false;
    }
    if (first)
      fail("missing unit symbol");
    return acc;
  }

  UnitSymbol factor() {
    skip_space();
    UnitSymbol base;
    bool offset_scale = false;
    const std::size_t first_leaf = leaves_.size();
    if (pos_ < text_.size() && text_[pos_] == '(') {
      // Each level is two stack frames: a bound keeps "((((..." from
      // overflowing the stack.
      if (++depth_ > max_depth)
        fail("parentheses nested deeper than " + std::to_string(max_depth));
      ++pos_;
      base = product();
      skip_space();
      if (pos_ >= text_.size() || text_[pos_] != ')')
        fail("missing ')'");
      ++pos_;
      --depth_;
    } else {
      const std::size_t start = pos_;
      while (pos_ < text_.size() && is_symbol_char(text_[pos_]))
        ++pos_;
      if (start == pos_)
        fail(pos_ < text_.size() ? "unexpected '" + std::string(1, text_[pos_]) + "'"
                                 : "missing unit symbol");
      const std::string symbol = text_.substr(start, pos_ - start);
      const auto it = unit_symbols().find(symbol);
      if (it == unit_symbols().end())
        fail("unknown unit '" + symbol + "'" + did_you_mean(symbol, unit_names()) +
             " (the list of units is in docs/cards.md)");
      base = it->second;
      offset_scale = base.offset != 0.0;
      ++n_factors_;
      leaves_.emplace_back(symbol, 1);
      if (offset_scale) {
        ++n_offset_;
        offset_ = base.offset;
      }
    }
    skip_space();
    if (pos_ < text_.size() && text_[pos_] == '^') {
      ++pos_;
      skip_space();
      int exponent = 0;
      const char* begin = text_.data() + pos_;
      const char* end = text_.data() + text_.size();
      if (begin != end && *begin == '+')
        ++begin;
      const auto r = std::from_chars(begin, end, exponent);
      if (r.ec != std::errc() || exponent == 0)
        fail("expected a non-zero integer exponent after '^'");
      pos_ = static_cast<std::size_t>(r.ptr - text_.data());
      base.scale = std::pow(base.scale, exponent);
      base.dimension = power(base.dimension, exponent);
      // a leaf's power as written is bounded as the dimension's is (fuzz_units:
      // "(1^ 97103)^ 97103" overflowed int on a dimensionless leaf)
      for (std::size_t i = first_leaf; i < leaves_.size(); ++i)
        leaves_[i].second =
            checked_exponent(static_cast<long long>(leaves_[i].second) * exponent);
      if (offset_scale)
        powered_offset_ = true;
    }
    base.offset = 0.0;
    return base;
  }

  static std::vector<std::string> unit_names() {
    std::vector<std::string> names;
    for (const auto& [name, symbol] : unit_symbols())
      names.push_back(name);
    return names;
  }

  const std::string& text_;
  std::size_t pos_ = 0;
  int n_factors_ = 0;
  int n_offset_ = 0;
  bool powered_offset_ = false;
  static constexpr int max_depth = 16; ///< of nested parentheses
  int depth_ = 0;
  double offset_ = 0.0;
  std::vector<std::pair<std::string, int>> leaves_; ///< (symbol, power) as written
};

} // namespace

std::string Dimension::to_string() const {
  static const char* names[] = {"kg", "m", "s", "K", "mol", "A"};
  std::string out;
  for (std::size_t i = 0; i < exponents.size(); ++i) {
    if (exponents[i] == 0)
      continue;
    if (!out.empty())
      out += ' ';
    out += names[i];
    if (exponents[i] != 1)
      out += '^' + std::to_string(exponents[i]);
  }
  return out.empty() ? "1" : out;
}

namespace dimension {
Dimension dimensionless() {
  return dim(0, 0, 0, 0, 0);
}
Dimension temperature() {
  return dim(0, 0, 0, 1, 0);
}
Dimension molar_capacity() {
  return dim(1, 2, -2, -1, -1);
}
Dimension specific_capacity() {
  return dim(0, 2, -2, -1, 0);
}
Dimension molar_energy() {
  return dim(1, 2, -2, 0, -1);
}
Dimension specific_energy() {
  return dim(0, 2, -2, 0, 0);
}
Dimension sommerfeld() {
  return dim(1, 2, -2, -2, -1);
}
Dimension molar_mass() {
  return dim(1, 0, 0, 0, -1);
}
Dimension density() {
  return dim(1, -3, 0, 0, 0);
}
Dimension conductivity() {
  return dim(1, 1, -3, -1, 0);
}
Dimension pressure() {
  return dim(1, -1, -2, 0, 0);
}
Dimension molar_volume() {
  return dim(0, 3, 0, 0, -1);
}
Dimension inverse_molar_energy() {
  return dim(-1, -2, 2, 0, 1);
}
Dimension heat_transfer_coefficient() {
  return dim(1, 0, -3, -1, 0);
}
Dimension heat_flux() {
  return dim(1, 0, -3, 0, 0);
}
Dimension power_density() {
  return dim(1, -1, -3, 0, 0);
}
Dimension time() {
  return dim(0, 0, 1, 0, 0);
}
Dimension length() {
  return dim(0, 1, 0, 0, 0);
}
} // namespace dimension

std::string describe_dimension(const Dimension& d) {
  return detail::dimension_description(d);
}

Unit parse_unit(const std::string& text) {
  UnitParser parser(text);
  const UnitSymbol u = parser.parse();
  Unit unit;
  unit.scale = u.scale;
  unit.dimension = u.dimension;
  unit.factors = parser.factors();
  // degC or degF alone is an absolute temperature; anywhere else (J/kg/degC,
  // 1/degC, degC^2) a degree interval.
  const double offset = parser.only_offset();
  if (offset != 0.0 && u.dimension == dimension::temperature()) {
    unit.offset = offset;
    unit.is_temperature_offset = true;
  }
  return unit;
}

namespace detail {

std::string dimension_description(const Dimension& d) {
  static const std::vector<std::pair<Dimension, std::string>> known = {
      {dimension::dimensionless(), "a plain number"},
      {dimension::temperature(), "a temperature (K, mK or degC)"},
      {dimension::molar_capacity(), "a molar heat capacity (e.g. J/mol/K)"},
      {dimension::specific_capacity(), "a specific heat capacity (e.g. J/kg/K)"},
      {dimension::molar_energy(), "a molar energy (e.g. J/mol, kJ/mol)"},
      {dimension::specific_energy(), "a specific energy (e.g. J/kg, kJ/kg)"},
      {dimension::sommerfeld(), "a Sommerfeld coefficient (e.g. mJ/mol/K^2)"},
      {dimension::molar_mass(), "a molar mass (e.g. g/mol)"},
      {dimension::density(), "a density (e.g. kg/m^3, g/cm^3)"},
      {dimension::conductivity(), "a thermal conductivity (e.g. W/m/K)"},
      {dimension::pressure(), "a pressure (e.g. Pa, GPa)"},
      {dimension::molar_volume(), "a molar volume (e.g. cm^3/mol)"},
      {dimension::inverse_molar_energy(), "an inverse molar energy (e.g. mol/J)"},
      {dimension::heat_transfer_coefficient(),
       "a heat-transfer coefficient (e.g. W/m^2/K)"},
      {dimension::heat_flux(), "a heat flux (e.g. W/m^2)"},
      {dimension::power_density(), "a power density (e.g. W/m^3)"},
      {dimension::time(), "a time (e.g. s, min, h)"},
      {dimension::length(), "a length (e.g. m, mm)"},
  };
  for (const auto& [dimension, text] : known)
    if (dimension == d)
      return text;
  return "a quantity of dimension " + d.to_string();
}

double parse_number(const std::string& text) {
  std::size_t begin = 0, end = text.size();
  while (begin < end && (text[begin] == ' ' || text[begin] == '\t'))
    ++begin;
  while (end > begin && (text[end - 1] == ' ' || text[end - 1] == '\t'))
    --end;
  const char* first = text.data() + begin;
  const char* last = text.data() + end;
  if (first != last && *first == '+')
    ++first;
  double value = 0.0;
  const auto r = std::from_chars(first, last, value);
  if (r.ec != std::errc() || r.ptr != last || first == last)
    throw InputError::argument("", "", "", "\"" + text + "\" is not a number");
  if (!std::isfinite(value))
    throw InputError::argument("", "", "", "\"" + text + "\" is not a finite number");
  return value;
}

} // namespace detail

Quantity parse_quantity(const std::string& text) {
  std::size_t begin = 0;
  while (begin < text.size() && (text[begin] == ' ' || text[begin] == '\t'))
    ++begin;
  const char* first = text.data() + begin;
  const char* last = text.data() + text.size();
  if (first != last && *first == '+')
    ++first;
  double number = 0.0;
  const auto r = std::from_chars(first, last, number);
  if (r.ec == std::errc::result_out_of_range)
    throw InputError::argument("", "", "", "\"" + text + "\": number out of range");
  if (r.ec != std::errc() || first == last)
    throw InputError::argument("", "", "",
                               "\"" + text + "\" does not start with a number");
  if (!std::isfinite(number))
    throw InputError::argument("", "", "",
                               "\"" + text + "\": NaN and infinity are not allowed");
  std::string unit(r.ptr, last);
  while (!unit.empty() && (unit.back() == ' ' || unit.back() == '\t'))
    unit.pop_back();
  Quantity q;
  if (unit.find_first_not_of(" \t") == std::string::npos) {
    q.value = number;
    q.dimension = dimension::dimensionless();
    return q;
  }
  // A unit that starts with a letter must be separated from the number only
  // by optional blanks; "343K" and "343 K" both read.
  Unit u;
  try {
    u = parse_unit(unit);
  } catch (const std::invalid_argument& e) {
    throw InputError::argument("", "", "", "\"" + text + "\": " + e.what());
  }
  q.dimension = u.dimension;
  if (u.is_temperature_offset) {
    q.value = (number + u.offset) * u.scale;
    q.is_temperature_offset = true;
  } else {
    q.value = number * u.scale;
  }
  if (!std::isfinite(q.value))
    throw InputError::argument("", "", "",
                               "\"" + text + "\": value out of range in SI units");
  return q;
}

double parse_quantity(const std::string& text, const Dimension& expected) {
  const Quantity q = parse_quantity(text);
  if (q.dimension != expected) {
    const std::string found = q.dimension == dimension::dimensionless()
                                  ? "a plain number without a unit"
                                  : detail::dimension_description(q.dimension);
    throw InputError::argument("", "", "",
                               "expected " + detail::dimension_description(expected) +
                                   " but found " + found);
  }
  return q.value;
}

} // namespace quantacal
