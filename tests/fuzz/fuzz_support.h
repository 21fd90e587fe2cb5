// SPDX-License-Identifier: Apache-2.0
// Shared checks of the libFuzzer targets (tests/fuzz, docs/reliability.md).
//
// A reader given any bytes must either return an object that passes its own
// invariants or throw the project's InputError located inside the text (a
// 1-based line and column that exist in it). Anything else -- another
// exception type, a located error pointing outside the text, a non-finite
// value -- calls fuzz_fail(), which aborts so that libFuzzer reports the input.
#ifndef QUANTACAL_TESTS_FUZZ_SUPPORT_H
#define QUANTACAL_TESTS_FUZZ_SUPPORT_H

#include <quantacal/common/exceptions.h>
#include <quantacal/material/material.h>
#include <quantacal/tables/conductivity_table.h>
#include <quantacal/tables/property_table.h>

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <cstdlib>
#include <exception>
#include <string>
#include <vector>

namespace quantacal_fuzz {

[[noreturn]] inline void fuzz_fail(const std::string& what) {
  std::fprintf(stderr, "quantacal fuzz invariant violated: %s\n", what.c_str());
  std::abort();
}

inline void require(bool condition, const std::string& what) {
  if (!condition)
    fuzz_fail(what);
}

/** The lines of @p text as a reader counts them ('\n' ends a line; '\r' stays in it). */
inline std::vector<std::string> split_lines(const std::string& text) {
  std::vector<std::string> lines;
  std::string::size_type start = 0;
  while (true) {
    const auto end = text.find('\n', start);
    lines.push_back(text.substr(start, end == std::string::npos ? end : end - start));
    if (end == std::string::npos)
      break;
    start = end + 1;
  }
  return lines;
}

/**
 * An InputError from reading @p text as @p file must name the file and a
 * 1-based line and column inside the text: the line exists and the column is
 * at most one past its last byte.
 */
inline void check_located(const quantacal::InputError& e, const std::string& text,
                          const std::string& file) {
  const std::string what = e.what();
  require(!what.empty(), "InputError with an empty message");
  require(e.file() == file,
          "InputError names file '" + e.file() + "', expected '" + file + "': " + what);
  const std::vector<std::string> lines = split_lines(text);
  require(e.line() >= 1 && e.line() <= static_cast<int>(lines.size()),
          "InputError line " + std::to_string(e.line()) + " outside 1.." +
              std::to_string(lines.size()) + ": " + what);
  const std::string& line = lines[static_cast<std::size_t>(e.line() - 1)];
  require(e.column() >= 1 && e.column() <= static_cast<int>(line.size()) + 1,
          "InputError column " + std::to_string(e.column()) + " outside 1.." +
              std::to_string(line.size() + 1) + " of line " + std::to_string(e.line()) +
              ": " + what);
}

inline bool finite_positive(double x) {
  return std::isfinite(x) && x > 0.0;
}

/**
 * The invariants of a loaded material: finite positive molar mass and density,
 * an ordered finite valid range, tables that build within their tolerance,
 * and finite values (C > 0) at temperatures across the range, from the table
 * and the exact model alike, with the inverse T(e) inside the range.
 */
inline void check_material(const quantacal::Material& m) {
  const std::string name = "material '" + m.name() + "': ";
  require(finite_positive(m.molar_mass()), name + "molar mass not finite > 0");
  require(finite_positive(m.reference_density()), name + "density not finite > 0");
  const double lower = m.lower_temperature(), upper = m.upper_temperature();
  require(finite_positive(lower) && std::isfinite(upper) && upper > lower,
          name + "valid range not ordered and finite");
  const quantacal::PropertyTable& table = m.table();
  const quantacal::TableStatistics& s = table.statistics();
  require(std::isfinite(s.worst_error) &&
              s.worst_error <= m.data().table_options.tolerance,
          name + "table worst error " + std::to_string(s.worst_error) +
              " above tolerance " + std::to_string(m.data().table_options.tolerance));
  (void)m.conductivity_table();
  const int n = 7;
  for (int i = 0; i < n; ++i) {
    const double t = std::min(
        upper, std::max(lower, lower * std::pow(upper / lower, double(i) / (n - 1))));
    for (const auto basis :
         {quantacal::Basis::mole, quantacal::Basis::mass, quantacal::Basis::volume}) {
      const quantacal::ThermalState a = m.thermal(t, basis);
      const quantacal::ThermalState b = m.thermal_exact(t, basis);
      require(std::isfinite(a.energy) && finite_positive(a.capacity) &&
                  std::isfinite(a.capacity_derivative),
              name + "table value not finite (C > 0) at T = " + std::to_string(t));
      require(std::isfinite(b.energy) && finite_positive(b.capacity),
              name + "model value not finite (C > 0) at T = " + std::to_string(t));
    }
    const quantacal::ConductivityValue k = m.conductivity(t);
    require(finite_positive(k.value),
            name + "conductivity not finite > 0 at T = " + std::to_string(t));
    require(finite_positive(m.density(t)),
            name + "density not finite > 0 at T = " + std::to_string(t));
    const double e = m.thermal(t).energy;
    const double back = m.temperature_from_energy(e);
    require(back >= lower && back <= upper,
            name + "T(e(T)) outside the valid range at T = " + std::to_string(t));
  }
}

} // namespace quantacal_fuzz

#endif
