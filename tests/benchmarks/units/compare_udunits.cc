// SPDX-License-Identifier: Apache-2.0
// Measured comparison of quantacal's unit parser (lib/cards/units.cc) with
// UDUNITS-2 on every unit string the project reads and on a list of edge cases.
// Not part of the build (UDUNITS-2 is not a dependency of quantacal); build it
// by hand, against the current units.cc, with the Debian package libudunits2-dev:
//
//   python3 tests/benchmarks/units/unit_strings.py > /tmp/units.tsv
//   g++ -std=c++17 -O2 -I include -I lib/cards
//       tests/benchmarks/units/compare_udunits.cc lib/cards/units.cc
//       BUILD/lib/libquantacal_common.a -ludunits2 -o /tmp/compare_udunits
//   (one command line; BUILD is a build folder of the project)
//   /tmp/compare_udunits /tmp/units.tsv
//
// It prints Markdown tables (docs/units.md holds the result): for each unit,
// what each parser accepts, the SI factor and zero point each gives, whether
// they agree with each other and with the definition written here by hand,
// the parse time per string, and the message each gives for a refused unit.
#include <quantacal/cards/units.h>

#include <udunits2.h>

#include <algorithm>
#include <chrono>
#include <cmath>
#include <cstdarg>
#include <cstdio>
#include <fstream>
#include <iostream>
#include <sstream>
#include <string>
#include <tuple>
#include <utility>
#include <vector>

namespace {

std::string last_udunits_message;

int capture_message(const char* format, va_list args) {
  char buffer[1024];
  const int n = std::vsnprintf(buffer, sizeof buffer, format, args);
  if (!last_udunits_message.empty())
    last_udunits_message += "; ";
  last_udunits_message += buffer;
  return n;
}

const char* status_name(ut_status s) {
  switch (s) {
  case UT_SUCCESS:
    return "UT_SUCCESS";
  case UT_BAD_ARG:
    return "UT_BAD_ARG";
  case UT_UNKNOWN:
    return "UT_UNKNOWN";
  case UT_SYNTAX:
    return "UT_SYNTAX";
  case UT_MEANINGLESS:
    return "UT_MEANINGLESS";
  default:
    return "UT_(other)";
  }
}

/// A case: the unit, where it comes from, and, for the hand-written cases, the
/// SI unit (UDUNITS syntax) and the definition's factor and zero point.
struct Case {
  std::string unit;
  std::string where;
  std::string si;      ///< "" = take the dimension quantacal finds
  double scale = NAN;  ///< SI per unit by definition (NAN: not given)
  double zero = 0.0;   ///< SI value of a reading of 0 (non-zero for degC/degF alone)
  std::string meaning; ///< what the project means by it
};

/// A Dimension as a UDUNITS unit string, e.g. "kg m2 s-2 K-1 mol-1".
std::string udunits_si(const quantacal::Dimension& d) {
  static const char* names[] = {"kg", "m", "s", "K", "mol", "A"};
  std::string out;
  for (std::size_t i = 0; i < d.exponents.size(); ++i) {
    if (d.exponents[i] == 0)
      continue;
    out += (out.empty() ? "" : " ") + std::string(names[i]);
    if (d.exponents[i] != 1)
      out += std::to_string(d.exponents[i]);
  }
  return out.empty() ? "1" : out;
}

std::string number(double v) {
  if (std::isnan(v))
    return "-";
  char b[64];
  std::snprintf(b, sizeof b, "%.10g", v);
  return b;
}

bool same(double a, double b) {
  return std::fabs(a - b) <= 1e-12 * std::max(std::fabs(a), std::fabs(b));
}

/// Factor and zero point of @p from in units of @p to_text (NAN if not convertible).
std::pair<double, double> factor_to(ut_system* system, const ut_unit* from,
                                    const std::string& to_text) {
  ut_unit* to = ut_parse(system, to_text.c_str(), UT_ASCII);
  std::pair<double, double> r{NAN, NAN};
  if (to && ut_are_convertible(from, to)) {
    cv_converter* conv = ut_get_converter(const_cast<ut_unit*>(from), to);
    r.second = cv_convert_double(conv, 0.0);
    r.first = cv_convert_double(conv, 1.0) - r.second;
    cv_free(conv);
  }
  ut_free(to);
  return r;
}

/// Whether two SI unit strings (UDUNITS syntax) have the same dimension.
bool same_dimension(ut_system* system, const std::string& a, const std::string& b) {
  ut_unit* ua = ut_parse(system, a.c_str(), UT_ASCII);
  ut_unit* ub = ut_parse(system, b.c_str(), UT_ASCII);
  const bool r = ua && ub && ut_are_convertible(ua, ub);
  ut_free(ua);
  ut_free(ub);
  return r;
}

std::string cell(std::string s) {
  std::replace(s.begin(), s.end(), '|', '/');
  std::replace(s.begin(), s.end(), '\n', ' ');
  return s;
}

/// Median time of @p body in ns over @p repeats blocks of @p n calls.
template <typename Body>
double nanoseconds_per_call(Body body, int n = 2000, int repeats = 7) {
  std::vector<double> t;
  for (int r = 0; r < repeats; ++r) {
    const auto start = std::chrono::steady_clock::now();
    for (int i = 0; i < n; ++i)
      body();
    const auto end = std::chrono::steady_clock::now();
    t.push_back(std::chrono::duration<double, std::nano>(end - start).count() / n);
  }
  std::sort(t.begin(), t.end());
  return t[t.size() / 2];
}

} // namespace

int main(int argc, char** argv) {
  std::vector<Case> cases;
  if (argc > 1) {
    std::ifstream in(argv[1]);
    for (std::string line; std::getline(in, line);) {
      std::istringstream fields(line);
      Case c;
      std::string count;
      std::getline(fields, c.unit, '\t');
      std::getline(fields, c.where, '\t');
      std::getline(fields, count, '\t');
      c.where += " (" + count + "x)";
      cases.push_back(c);
    }
  }
  const double btu_it_per_lb_degf = 4186.8; // J/kg/K: IT Btu/lb/degF, exact by definition
  const std::vector<Case> edge = {
      {"J/g/K", "edge", "J kg-1 K-1", 1000.0, 0.0, "specific heat per gram"},
      {"kJ/kg/K", "edge", "J kg-1 K-1", 1000.0, 0.0, "prefixed energy"},
      {"J/g/degC", "edge", "J kg-1 K-1", 1000.0, 0.0, "per degree Celsius = per K"},
      {"W m-1 K-1", "edge", "W m-1 K-1", 1.0, 0.0, "exponents without ^"},
      {"W m^-1 K^-1", "edge", "W m-1 K-1", 1.0, 0.0, "exponents with ^"},
      {"W/cm/K", "edge", "W m-1 K-1", 100.0, 0.0, "conductivity per cm"},
      {"W/m^2/K", "edge", "W m-2 K-1", 1.0, 0.0, "heat-transfer coefficient"},
      {"W/m^2/degC", "edge", "W m-2 K-1", 1.0, 0.0, "h per degree Celsius (interval)"},
      {"degC", "edge", "K", 1.0, 273.15, "absolute Celsius temperature"},
      {"degF", "edge", "K", 5.0 / 9.0, 459.67 * 5.0 / 9.0, "absolute Fahrenheit"},
      {"J/g/degF", "edge", "J kg-1 K-1", 1800.0, 0.0, "per degree Fahrenheit"},
      {"degC/min", "edge", "K s-1", 1.0 / 60.0, 0.0, "cooling rate (interval)"},
      {"1/degC", "edge", "K-1", 1.0, 0.0, "expansion coefficient (interval)"},
      {"mK", "edge", "K", 1e-3, 0.0, "millikelvin"},
      {"mJ/mol/K^2", "edge", "J mol-1 K-2", 1e-3, 0.0, "Sommerfeld coefficient"},
      {"cal/g/K", "edge", "J kg-1 K-1", 4184.0, 0.0, "thermochemical calorie"},
      {"cal/mol/K", "edge", "J mol-1 K-1", 4.184, 0.0, "thermochemical calorie"},
      {"kcal/mol", "edge", "J mol-1", 4184.0, 0.0, "thermochemical kilocalorie"},
      {"BTU/lb/F", "edge", "J kg-1 K-1", btu_it_per_lb_degf, 0.0, "F meant as degF"},
      {"Btu/lb/degF", "edge", "J kg-1 K-1", btu_it_per_lb_degf, 0.0, "IT Btu"},
      {"%", "edge", "1", 0.01, 0.0, "percent"},
      {"Cel", "edge", "K", 1.0, 273.15, "UCUM spelling of Celsius"},
      {"celsius", "edge", "K", 1.0, 273.15, "name of degC"},
      {"kelvin", "edge", "K", 1.0, 0.0, "name of K"},
      {"eV", "edge", "J", 1.602176634e-19, 0.0, "electronvolt, exact since 2019 SI"},
      {"furlong", "edge", "m", NAN, 0.0, "not a card unit"},
      {"J/kg K", "edge", "J kg-1 K-1", 1.0, 0.0, "meant J/(kg K); both read J K/kg"},
      {"J/(mol K)", "edge", "J mol-1 K-1", 1.0, 0.0, "parenthesised"},
      {"J/(mol K", "edge", "J mol-1 K-1", NAN, 0.0, "syntax error"},
      {"g/cm3", "edge", "kg m-3", 1000.0, 0.0, "exponent without ^"},
      {"Ohm m", "edge", "kg m3 s-3 A-2", 1.0, 0.0, "resistivity"},
      {"W/m^2/k", "edge", "W m-2 K-1", 1.0, 0.0, "typo: lower-case k"},
      {"K^0", "edge", "1", NAN, 0.0, "zero exponent"},
  };
  // An edge case already found in the project's files adds its definition there.
  for (const Case& e : edge) {
    const auto it = std::find_if(cases.begin(), cases.end(),
                                 [&](const Case& c) { return c.unit == e.unit; });
    if (it == cases.end()) {
      cases.push_back(e);
    } else {
      it->si = e.si;
      it->scale = e.scale;
      it->zero = e.zero;
      it->meaning = e.meaning;
    }
  }

  ut_set_error_message_handler(capture_message);
  const auto load_start = std::chrono::steady_clock::now();
  ut_system* system = ut_read_xml(nullptr);
  const auto load_end = std::chrono::steady_clock::now();
  if (!system) {
    std::cerr << "cannot read the UDUNITS-2 database: " << last_udunits_message << '\n';
    return 1;
  }
  const double load_ms =
      std::chrono::duration<double, std::milli>(load_end - load_start).count();

  std::cout
      << "| unit | found in | meaning | quantacal: factor, zero (SI unit) | UDUNITS-2: "
         "factor, zero in the same SI unit | agree | against the definition | "
         "quantacal ns | UDUNITS-2 ns |\n"
         "|---|---|---|---|---|---|---|---|---|\n";
  std::vector<std::string> errors;
  int n_both = 0, n_agree = 0, n_ours_only = 0, n_theirs_only = 0, n_neither = 0;
  std::vector<double> ours_ns, theirs_ns, convert_ns;
  for (const Case& c : cases) {
    // quantacal
    bool ours_ok = true;
    quantacal::Unit ours;
    std::string ours_error;
    try {
      ours = quantacal::parse_unit(c.unit);
    } catch (const std::exception& e) {
      ours_ok = false;
      ours_error = e.what();
    }
    const double ours_zero = ours.offset * ours.scale;
    const double t_ours = nanoseconds_per_call([&] {
      try {
        volatile double s = quantacal::parse_unit(c.unit).scale;
        (void)s;
      } catch (const std::exception&) {
      }
    });
    // UDUNITS-2
    last_udunits_message.clear();
    ut_unit* theirs = ut_parse(system, c.unit.c_str(), UT_ASCII);
    const ut_status parse_status = ut_get_status();
    std::string theirs_text, theirs_error;
    double theirs_scale = NAN, theirs_zero = NAN;   // in quantacal's SI unit
    double defined_scale = NAN, defined_zero = NAN; // in the case's SI unit
    const bool theirs_ok = theirs != nullptr;
    const std::string ours_si = ours_ok ? udunits_si(ours.dimension) : "";
    if (!theirs_ok) {
      theirs_error = std::string(status_name(parse_status)) +
                     (last_udunits_message.empty() ? "" : ": " + last_udunits_message);
    } else {
      char b[256];
      ut_format(theirs, b, sizeof b, UT_ASCII | UT_DEFINITION);
      theirs_text = b;
      if (ours_ok)
        std::tie(theirs_scale, theirs_zero) = factor_to(system, theirs, ours_si);
      if (!c.si.empty())
        std::tie(defined_scale, defined_zero) = factor_to(system, theirs, c.si);
      ut_unit* target = ut_parse(system, ours_ok ? ours_si.c_str() : "1", UT_ASCII);
      if (target && ut_are_convertible(theirs, target))
        convert_ns.push_back(nanoseconds_per_call([&] {
          cv_converter* k = ut_get_converter(theirs, target);
          volatile double v = cv_convert_double(k, 1.0);
          (void)v;
          cv_free(k);
        }));
      ut_free(target);
      ut_free(theirs);
    }
    const double t_theirs = nanoseconds_per_call([&] {
      ut_unit* u = ut_parse(system, c.unit.c_str(), UT_ASCII);
      ut_free(u);
    });
    last_udunits_message.clear();
    ours_ns.push_back(t_ours);
    theirs_ns.push_back(t_theirs);

    std::string agree;
    if (ours_ok && theirs_ok) {
      ++n_both;
      const bool a = !std::isnan(theirs_scale) && same(ours.scale, theirs_scale) &&
                     same(ours_zero, theirs_zero);
      n_agree += a;
      agree = a                          ? "yes"
              : std::isnan(theirs_scale) ? "**no** (dimension)"
                                         : "**no** (factor)";
    } else if (ours_ok) {
      ++n_ours_only;
      agree = "quantacal only";
    } else if (theirs_ok) {
      ++n_theirs_only;
      agree = "UDUNITS-2 only";
    } else {
      ++n_neither;
      agree = "both refuse";
    }
    std::string definition = "-";
    if (!std::isnan(c.scale)) {
      const bool o = ours_ok && same_dimension(system, ours_si, c.si) &&
                     same(ours.scale, c.scale) && same(ours_zero, c.zero);
      const bool t = theirs_ok && !std::isnan(defined_scale) &&
                     same(defined_scale, c.scale) && same(defined_zero, c.zero);
      definition = std::string("quantacal ") +
                   (o         ? "right"
                    : ours_ok ? "**wrong**"
                              : "refuses") +
                   ", UDUNITS-2 " +
                   (t           ? "right"
                    : theirs_ok ? "**wrong**"
                                : "refuses");
    }
    std::cout << "| `" << cell(c.unit) << "` | " << cell(c.where) << " | "
              << cell(c.meaning) << " | "
              << (ours_ok ? number(ours.scale) + ", " + number(ours_zero) + " (" +
                                ours_si + ")"
                          : "refused")
              << " | "
              << (theirs_ok ? (std::isnan(theirs_scale)
                                   ? "= " + cell(theirs_text)
                                   : number(theirs_scale) + ", " + number(theirs_zero))
                            : "refused")
              << " | " << agree << " | " << definition << " | " << number(t_ours) << " | "
              << number(t_theirs) << " |\n";
    if (!ours_ok || !theirs_ok)
      errors.push_back("| `" + cell(c.unit) + "` | " +
                       (ours_ok ? "(accepted)" : cell(ours_error)) + " | " +
                       (theirs_ok ? "(accepted)" : cell(theirs_error)) + " |");
  }
  std::cout << "\n| refused unit | quantacal message | UDUNITS-2 status (and message) |\n"
               "|---|---|---|\n";
  for (const auto& e : errors)
    std::cout << e << '\n';

  const auto median = [](std::vector<double> v) {
    std::sort(v.begin(), v.end());
    return v.empty() ? NAN : v[v.size() / 2];
  };
  const auto maximum = [](const std::vector<double>& v) {
    return v.empty() ? NAN : *std::max_element(v.begin(), v.end());
  };
  std::cout << "\nsummary: " << cases.size() << " unit strings; both accept " << n_both
            << " (agree on " << n_agree << "), quantacal only " << n_ours_only
            << ", UDUNITS-2 only " << n_theirs_only << ", both refuse " << n_neither
            << "\nparse time per string, median (max): quantacal "
            << number(median(ours_ns)) << " ns (" << number(maximum(ours_ns))
            << "), UDUNITS-2 ut_parse " << number(median(theirs_ns)) << " ns ("
            << number(maximum(theirs_ns)) << "); UDUNITS-2 ut_get_converter + convert "
            << number(median(convert_ns))
            << " ns\nUDUNITS-2 database load (ut_read_xml): " << number(load_ms)
            << " ms\n";
  ut_free_system(system);
  return 0;
}
