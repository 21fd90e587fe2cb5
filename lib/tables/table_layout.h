// SPDX-License-Identifier: Apache-2.0
/**
 * @file table_layout.h
 * @brief Internal memory layout and hot-path lookup of PropertyTable.
 *
 * Lookup of T (K, inside the range, so positive and normal):
 *  1. octave  o = biased exponent of T - biased exponent of the lower end;
 *  2. cell    c = octave[o].cell_offset + (mantissa bits >> octave[o].shift);
 *  3. side    s = (T >= cell[c].split), one compare for a breakpoint in the cell;
 *  4. segment k = min(floor((T - x0) * inv_h), last), t = (T - x0) * inv_h - k.
 * Then three Horner chains on the six coefficients of segment offset + k.
 */
#ifndef QUANTACAL_LIB_TABLES_TABLE_LAYOUT_H
#define QUANTACAL_LIB_TABLES_TABLE_LAYOUT_H

#include <quantacal/tables/property_table.h>

#include <algorithm>
#include <cstdint>
#include <cstring>
#include <string>
#include <vector>

namespace quantacal::detail {

/** A run of uniform segments: [x0, x0 + (last + 1) / inv_h]. */
struct TableRegion {
  double x0;           ///< start temperature, K
  double inv_h;        ///< 1 / segment width, 1/K
  std::int32_t offset; ///< index of the first segment
  std::int32_t last;   ///< number of segments - 1
};

/** One lookup cell: at most one breakpoint (split) and the regions on either side. */
struct alignas(64) TableCell {
  double split; ///< K; T >= split selects side[1]
  TableRegion side[2];
};

/** Per-octave lookup: where the octave's cells start and how many mantissa bits index
 * them. */
struct TableOctave {
  std::int32_t
      cell_offset; ///< index of cell 0 of the octave (may point before the array start)
  std::int32_t shift; ///< 52 - mantissa bits used
};

/** U(t) = a0 + a1 t + ... + a5 t^5 on one segment, J/mol. */
struct alignas(16) TableSegment {
  double a[6];
};

/** Where a temperature falls. */
struct TableLocation {
  std::int32_t segment; ///< segment index
  double t;             ///< local coordinate in [0, 1]
  double inv_h;         ///< 1 / segment width, 1/K
};

constexpr std::uint64_t mantissa_mask = (std::uint64_t(1) << 52) - 1;

inline std::uint64_t bits_of(double x) noexcept {
  std::uint64_t b;
  std::memcpy(&b, &x, sizeof b);
  return b;
}

/** Hot-path lookup; @p temperature must be inside the table's range. */
inline TableLocation locate(const TableOctave* octaves, const TableCell* cells,
                            int exponent0, double temperature) noexcept {
  const std::uint64_t bits = bits_of(temperature);
  const TableOctave o = octaves[int(bits >> 52) - exponent0];
  const TableCell& c =
      cells[o.cell_offset + std::int32_t((bits & mantissa_mask) >> o.shift)];
  const TableRegion& r = c.side[temperature >= c.split ? 1 : 0];
  const double y = (temperature - r.x0) * r.inv_h;
  const std::int32_t k = std::min(std::int32_t(y), r.last);
  return {r.offset + k, y - double(k), r.inv_h};
}

/** Energy, capacity and capacity derivative of one segment at local t. */
inline void evaluate_segment(const TableSegment& s, double t, double inv_h,
                             double& energy, double& capacity,
                             double& capacity_derivative) noexcept {
  const double* a = s.a;
  energy = a[0] + t * (a[1] + t * (a[2] + t * (a[3] + t * (a[4] + t * a[5]))));
  capacity =
      (a[1] + t * (2.0 * a[2] + t * (3.0 * a[3] + t * (4.0 * a[4] + t * (5.0 * a[5]))))) *
      inv_h;
  capacity_derivative =
      (2.0 * a[2] + t * (6.0 * a[3] + t * (12.0 * a[4] + t * (20.0 * a[5])))) *
      (inv_h * inv_h);
}

/**
 * For tests: true makes the batch take the portable path even where the AVX2
 * kernel could run (both paths must give the same numbers). Thread-safe.
 */
void force_portable_batch(bool on) noexcept;

/** Everything a built table holds. */
struct TableData {
  std::string name;
  double lower = 0.0;        ///< K
  double upper = 0.0;        ///< K
  double upper_energy = 0.0; ///< U(upper) of the interpolant, J/mol
  int exponent0 = 0;         ///< biased IEEE exponent of lower
  std::vector<TableOctave> octaves;
  std::vector<TableCell> cells;
  std::vector<TableSegment> segments;
  std::vector<double> segment_start; ///< K, for the inverse and node_temperatures()
  TableStatistics statistics;
};

/**
 * Builds the table data of @p model with error control (table_builder.cc);
 * PropertyTable::build wraps it. Errors as PropertyTable::build.
 */
TableData build_table_data(const ThermalModel& model, const TableOptions& options);

} // namespace quantacal::detail

#endif
