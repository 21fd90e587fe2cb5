// SPDX-License-Identifier: Apache-2.0
// PropertyTable's build: breakpoints, a pilot pass for the node density, cells per
// octave, error control per region and an independent final check.
#include "table_layout.h"

#include <quantacal/common/exceptions.h>
#include <quantacal/common/format.h>

#include <algorithm>
#include <cmath>
#include <cstdint>
#include <limits>
#include <string>
#include <utility>
#include <vector>

namespace quantacal {
namespace detail {

namespace {

const char* const build_function = "quantacal::PropertyTable::build";

// Error control checks C at the two extremes of the leading error term of the
// interpolation, which for a quartic matching C, C' at both ends and C at the
// midpoint is C^(5)/120 h^5 t^2 (t - 1/2) (t - 1)^2: t = (5 -+ sqrt 5)/10.
constexpr double check_t1 = 0.27639320225002103; // (5 - sqrt 5) / 10
constexpr double check_t2 = 0.72360679774997897; // (5 + sqrt 5) / 10
// Per-region target = tolerance / region_safety, so that the independent
// final check (other points, higher-order terms) stays below the tolerance.
constexpr double region_safety = 3.0;
// Pilot nodes per octave used to estimate the local node density.
constexpr int pilot_bits = 5;
// Most mantissa bits used to index the cells of one octave.
constexpr int max_bits = 12;
// Breakpoints closer than this fraction of their octave are merged (the later
// one is dropped; error control then refines around it), which bounds the
// mantissa bits needed to give every breakpoint its own cell by 11.
constexpr double merge_fraction = 1.0 / 1024.0;
// Interpolation error of a smooth function falls as h^5: the exponent used to
// predict the number of segments from a measured error.
constexpr double order = 5.0;
constexpr int max_final_rounds = 4;

struct Node {
  double temperature;         // K
  double capacity;            // J/mol/K
  double capacity_derivative; // J/mol/K^2
};

/** C(t) = c0 + c1 t + ... + c4 t^4 on one segment, J/mol/K. */
struct Quartic {
  double c[5];
  double value(double t) const noexcept {
    return c[0] + t * (c[1] + t * (c[2] + t * (c[3] + t * c[4])));
  }
};

/** The quartic with C, dC/dT at both ends and C at the midpoint of [l, r]. */
Quartic make_quartic(const Node& l, double mid_capacity, const Node& r) {
  const double h = r.temperature - l.temperature;
  const double d0 = l.capacity_derivative * h;
  const double d1 = r.capacity_derivative * h;
  const double r1 = r.capacity - l.capacity - d0;                 // c2 + c3 + c4
  const double r2 = d1 - d0;                                      // 2 c2 + 3 c3 + 4 c4
  const double q = 16.0 * (mid_capacity - l.capacity - 0.5 * d0); // 4 c2 + 2 c3 + c4
  Quartic p;
  p.c[0] = l.capacity;
  p.c[1] = d0;
  p.c[4] = 2.0 * r2 - 8.0 * r1 + q;
  p.c[3] = r2 - 2.0 * r1 - 2.0 * p.c[4];
  p.c[2] = r1 - p.c[3] - p.c[4];
  return p;
}

/** [lo, hi] divided into n uniform segments. */
struct Region {
  double lo = 0.0; // K
  double hi = 0.0; // K
  std::int64_t n = 1;
  std::vector<Quartic> quartics;
  double worst = 0.0;             // worst relative error of C at the check points
  double worst_temperature = 0.0; // K
  std::int32_t offset = 0;        // first segment, after layout

  double node(std::int64_t i) const noexcept {
    return i == n ? hi : lo + double(i) * ((hi - lo) / double(n));
  }
  double inv_h() const noexcept { return double(n) / (hi - lo); }
};

struct CellPlan {
  double split;
  std::size_t side0, side1; // region indices
};

struct OctavePlan {
  int exponent = 0; // unbiased: the octave is [2^exponent, 2^(exponent+1))
  int bits = 0;
  std::int64_t first_cell = 0;
  std::vector<CellPlan> cells;
};

struct PilotSegment {
  double lo, hi;  // K
  double density; // predicted segments per kelvin
};

int exponent_of(double x) noexcept {
  return int(bits_of(x) >> 52) - 1023;
}

std::uint64_t
mix(std::uint64_t z) noexcept { // splitmix64 finaliser (Steele, Lea, Flood 2014)
  z += 0x9e3779b97f4a7c15ull;
  z = (z ^ (z >> 30)) * 0xbf58476d1ce4e5b9ull;
  z = (z ^ (z >> 27)) * 0x94d049bb133111ebull;
  return z ^ (z >> 31);
}

std::string kelvin(double t) {
  return format_double(t) + " K";
}

class Builder {
public:
  Builder(const ThermalModel& model, const TableOptions& options)
      : model_(model), name_(model.name()), options_(options) {}

  TableData run() {
    check_range();
    collect_breakpoints();
    pilot();
    plan_octaves();
    for (Region& r : regions_)
      refine(r);
    for (int round = 0;; ++round) {
      TableData data = assemble();
      std::vector<std::size_t> failing;
      final_check(data, failing);
      if (failing.empty())
        return data;
      if (round + 1 == max_final_rounds)
        throw NumericalError(build_function,
                             name_ + ": the tolerance " + format_double(tolerance_) +
                                 " is not met after " + std::to_string(max_final_rounds) +
                                 " refinement rounds: worst relative error of C " +
                                 format_double(data.statistics.worst_error) + " at " +
                                 kelvin(data.statistics.worst_temperature));
      for (std::size_t i : failing) {
        Region& r = regions_[i];
        resize(r, std::max<std::int64_t>(2 * r.n, r.n + 1));
        refine(r);
      }
    }
  }

private:
  ThermalState eval(double temperature) {
    ++n_evaluations_;
    const ThermalState s = model_.evaluate(temperature);
    if (!std::isfinite(s.energy) || !std::isfinite(s.capacity) ||
        !std::isfinite(s.capacity_derivative) || !(s.capacity > 0.0))
      throw NumericalError(
          build_function,
          name_ + ": the model gives U = " + format_double(s.energy) +
              " J/mol, C = " + format_double(s.capacity) +
              " J/mol/K, dC/dT = " + format_double(s.capacity_derivative) +
              " J/mol/K^2 at T = " + kelvin(temperature) +
              "; a table needs finite values and C > 0");
    return s;
  }

  /**
   * The model at a node. At a breakpoint C or dC/dT may jump, so a segment
   * that ends there takes the one-sided value from inside itself: side -1
   * evaluates one ulp below, +1 one ulp above (the node stays at T).
   */
  Node node(double temperature, int side = 0) {
    double at = temperature;
    if (side != 0 &&
        std::binary_search(breakpoints_.begin(), breakpoints_.end(), temperature))
      at = std::nextafter(temperature,
                          side < 0 ? 0.0 : std::numeric_limits<double>::infinity());
    const ThermalState s = eval(at);
    return {temperature, s.capacity, s.capacity_derivative};
  }

  void check_range() {
    const double model_lower = model_.lower_temperature();
    const double model_upper = model_.upper_temperature();
    lower_ = options_.lower_temperature > 0.0 ? options_.lower_temperature : model_lower;
    upper_ = options_.upper_temperature > 0.0 ? options_.upper_temperature : model_upper;
    const std::string domain =
        "[" + kelvin(model_lower) + ", " + kelvin(model_upper) + "]";
    if (!(lower_ >= model_lower && lower_ >= std::numeric_limits<double>::min() &&
          lower_ < upper_ && std::isfinite(lower_)))
      throw RangeError(build_function, name_,
                       "a lower temperature inside the model's domain " + domain +
                           " and below the upper temperature",
                       lower_);
    if (!(upper_ <= model_upper && std::isfinite(upper_)))
      throw RangeError(build_function, name_,
                       "a finite upper temperature inside the model's domain " + domain,
                       upper_);
    if (!(options_.tolerance > 0.0 && options_.tolerance < 1.0))
      throw NumericalError(build_function, name_ + ": tolerance " +
                                               format_double(options_.tolerance) +
                                               " is not in (0, 1)");
    tolerance_ = options_.tolerance;
    target_ = tolerance_ / region_safety;
  }

  void collect_breakpoints() {
    std::vector<double> all = model_.breakpoints();
    std::sort(all.begin(), all.end());
    for (double p : all) {
      if (!(p > lower_ && p < upper_))
        continue;
      const double gap = std::ldexp(merge_fraction, exponent_of(p));
      if (!breakpoints_.empty() && p - breakpoints_.back() < gap)
        continue;
      breakpoints_.push_back(p);
    }
  }

  /** Coarse pass: node density needed, from the error on a coarse grid and the h^5 law.
   */
  void pilot() {
    std::vector<double> t = breakpoints_;
    t.push_back(lower_);
    t.push_back(upper_);
    for (int e = exponent_of(lower_); e <= exponent_of(upper_); ++e)
      for (int j = 0; j < (1 << pilot_bits); ++j) {
        const double x = std::ldexp(1.0 + std::ldexp(double(j), -pilot_bits), e);
        if (x > lower_ && x < upper_)
          t.push_back(x);
      }
    std::sort(t.begin(), t.end());
    t.erase(std::unique(t.begin(), t.end()), t.end());
    for (std::size_t i = 0; i + 1 < t.size(); ++i) {
      const Node left = node(t[i], +1);
      const Node right = node(t[i + 1], -1);
      const double h = right.temperature - left.temperature;
      const Quartic q =
          make_quartic(left, eval(left.temperature + 0.5 * h).capacity, right);
      double worst = 0.0;
      for (double s : {check_t1, check_t2}) {
        const double exact = eval(left.temperature + s * h).capacity;
        worst = std::max(worst, std::abs(q.value(s) - exact) / exact);
      }
      pilot_.push_back({left.temperature, right.temperature,
                        std::pow(worst / target_, 1.0 / order) / h});
    }
  }

  /** Largest predicted density over [lo, hi], segments per kelvin. */
  double density(double lo, double hi) const {
    auto it = std::upper_bound(pilot_.begin(), pilot_.end(), lo,
                               [](double x, const PilotSegment& s) { return x < s.hi; });
    double d = 0.0;
    for (; it != pilot_.end() && it->lo < hi; ++it)
      d = std::max(d, it->density);
    return d;
  }

  static std::int64_t predicted_segments(double d, double width) {
    const double n = std::ceil(1.1 * d * width);
    return std::int64_t(std::clamp(n, 1.0, double(std::int64_t(1) << 30)));
  }

  /** Cells of octave e with b mantissa bits: index range, or false if a cell has 2
   * breakpoints. */
  struct CellRange {
    std::int64_t first, last;
  };
  CellRange cell_range(int e, int b) const {
    const int shift = 52 - b;
    const std::int64_t first =
        exponent_of(lower_) == e
            ? std::int64_t((bits_of(lower_) & mantissa_mask) >> shift)
            : 0;
    const std::int64_t last =
        exponent_of(upper_) == e
            ? std::int64_t((bits_of(upper_) & mantissa_mask) >> shift)
            : (std::int64_t(1) << b) - 1;
    return {first, last};
  }

  void cell_bounds(int e, int b, std::int64_t j, double& lo, double& hi) const {
    lo = std::max(lower_, std::ldexp(1.0 + std::ldexp(double(j), -b), e));
    hi = std::min(upper_, std::ldexp(1.0 + std::ldexp(double(j + 1), -b), e));
  }

  /** Breakpoints strictly inside (lo, hi). */
  std::pair<std::size_t, std::size_t> interior(double lo, double hi) const {
    const auto first = std::upper_bound(breakpoints_.begin(), breakpoints_.end(), lo);
    const auto last = std::lower_bound(first, breakpoints_.end(), hi);
    return {std::size_t(first - breakpoints_.begin()), std::size_t(last - first)};
  }

  /** Predicted bytes of octave e with b bits, or max if a cell would hold two
   * breakpoints. */
  std::size_t predicted_bytes(int e, int b, std::size_t limit) const {
    const CellRange range = cell_range(e, b);
    std::size_t bytes = 0;
    for (std::int64_t j = range.first; j <= range.last; ++j) {
      bytes += sizeof(TableCell);
      if (bytes > limit)
        return std::numeric_limits<std::size_t>::max();
      double lo, hi;
      cell_bounds(e, b, j, lo, hi);
      if (!(lo < hi))
        continue;
      const auto [first, count] = interior(lo, hi);
      if (count > 1)
        return std::numeric_limits<std::size_t>::max();
      const std::size_t per_segment = sizeof(TableSegment) + sizeof(double);
      if (count == 0) {
        bytes += per_segment * std::size_t(predicted_segments(density(lo, hi), hi - lo));
      } else {
        const double p = breakpoints_[first];
        bytes += per_segment * std::size_t(predicted_segments(density(lo, p), p - lo));
        bytes += per_segment * std::size_t(predicted_segments(density(p, hi), hi - p));
      }
    }
    return bytes;
  }

  std::size_t add_region(double lo, double hi) {
    Region r;
    r.lo = lo;
    r.hi = hi;
    r.n = predicted_segments(density(lo, hi), hi - lo);
    total_segments_ += r.n;
    regions_.push_back(std::move(r));
    return regions_.size() - 1;
  }

  /** Chooses the mantissa bits of each octave by predicted memory, then lays out regions.
   */
  void plan_octaves() {
    for (int e = exponent_of(lower_); e <= exponent_of(upper_); ++e) {
      OctavePlan o;
      o.exponent = e;
      std::size_t best = std::numeric_limits<std::size_t>::max();
      for (int b = 0; b <= max_bits; ++b) {
        const std::size_t bytes = predicted_bytes(e, b, best);
        if (bytes < best) {
          best = bytes;
          o.bits = b;
        }
      }
      if (best == std::numeric_limits<std::size_t>::max())
        throw NumericalError(build_function,
                             name_ + ": breakpoints too dense in the octave [" +
                                 kelvin(std::ldexp(1.0, e)) + ", " +
                                 kelvin(std::ldexp(2.0, e)) + ")");
      const CellRange range = cell_range(e, o.bits);
      o.first_cell = range.first;
      for (std::int64_t j = range.first; j <= range.last; ++j) {
        double lo, hi;
        cell_bounds(e, o.bits, j, lo, hi);
        if (!(lo <
              hi)) { // only the point T = upper, at a cell start: reuse the last region
          o.cells.push_back({lo, regions_.size() - 1, regions_.size() - 1});
          continue;
        }
        const auto [first, count] = interior(lo, hi);
        if (count == 0) {
          const std::size_t r = add_region(lo, hi);
          o.cells.push_back({lo, r, r});
        } else {
          const double p = breakpoints_[first];
          const std::size_t r0 = add_region(lo, p);
          const std::size_t r1 = add_region(p, hi);
          o.cells.push_back({p, r0, r1});
        }
      }
      n_cells_ += o.cells.size();
      octaves_.push_back(std::move(o));
    }
  }

  std::size_t estimated_bytes() const {
    return n_cells_ * sizeof(TableCell) + octaves_.size() * sizeof(TableOctave) +
           std::size_t(total_segments_) * (sizeof(TableSegment) + sizeof(double));
  }

  void resize(Region& r, std::int64_t n) {
    total_segments_ += n - r.n;
    r.n = n;
    if (estimated_bytes() > options_.max_bytes ||
        r.n > std::numeric_limits<std::int32_t>::max())
      throw NumericalError(
          build_function,
          name_ + ": the tolerance " + format_double(tolerance_) +
              " needs more than max_bytes = " + std::to_string(options_.max_bytes) +
              " bytes (" + std::to_string(estimated_bytes()) + " estimated; " +
              std::to_string(r.n) + " segments on [" + kelvin(r.lo) + ", " +
              kelvin(r.hi) + "], where the worst relative error of C is " +
              format_double(r.worst) + " at " + kelvin(r.worst_temperature) + ")");
  }

  /** Builds the region's quartics with r.n segments and measures its error. */
  void fill(Region& r) {
    r.quartics.resize(std::size_t(r.n));
    r.worst = 0.0;
    r.worst_temperature = r.lo;
    Node left = node(r.lo, +1);
    for (std::int64_t i = 0; i < r.n; ++i) {
      const Node right = node(r.node(i + 1), i + 1 == r.n ? -1 : 0);
      const double h = right.temperature - left.temperature;
      const Quartic q =
          make_quartic(left, eval(left.temperature + 0.5 * h).capacity, right);
      for (double s : {check_t1, check_t2}) {
        const double t = left.temperature + s * h;
        const double exact = eval(t).capacity;
        const double error = std::abs(q.value(s) - exact) / exact;
        if (error > r.worst) {
          r.worst = error;
          r.worst_temperature = t;
        }
      }
      r.quartics[std::size_t(i)] = q;
      left = right;
    }
  }

  /** Error control: more segments until the check points meet the target. */
  void refine(Region& r) {
    if (estimated_bytes() > options_.max_bytes)
      resize(r, r.n); // throws with the figures
    for (;;) {
      fill(r);
      if (r.worst <= target_)
        return;
      const double factor =
          std::clamp(1.1 * std::pow(r.worst / target_, 1.0 / order), 1.25, 16.0);
      resize(r, std::max(r.n + 1, std::int64_t(std::ceil(double(r.n) * factor))));
    }
  }

  /** Lays the regions out into the lookup arrays, integrating U from the lower end. */
  TableData assemble() const {
    TableData d;
    d.name = name_;
    d.lower = lower_;
    d.upper = upper_;
    d.exponent0 = int(bits_of(lower_) >> 52);
    d.segments.reserve(std::size_t(total_segments_));
    d.segment_start.reserve(std::size_t(total_segments_));
    std::vector<std::int32_t> offsets(regions_.size());
    double energy = model_.evaluate(lower_).energy;
    for (std::size_t ri = 0; ri < regions_.size(); ++ri) {
      const Region& r = regions_[ri];
      offsets[ri] = std::int32_t(d.segments.size());
      const double h = 1.0 / r.inv_h();
      for (std::int64_t i = 0; i < r.n; ++i) {
        const Quartic& q = r.quartics[std::size_t(i)];
        TableSegment s;
        s.a[0] = energy;
        for (int j = 0; j < 5; ++j)
          s.a[j + 1] = h * q.c[j] / double(j + 1);
        energy = s.a[0] + (s.a[1] + (s.a[2] + (s.a[3] + (s.a[4] + s.a[5]))));
        d.segments.push_back(s);
        d.segment_start.push_back(r.node(i));
      }
    }
    d.upper_energy = energy;
    auto region = [&](std::size_t ri) {
      const Region& r = regions_[ri];
      return TableRegion{r.lo, r.inv_h(), offsets[ri], std::int32_t(r.n - 1)};
    };
    for (const OctavePlan& o : octaves_) {
      d.octaves.push_back(
          {std::int32_t(std::int64_t(d.cells.size()) - o.first_cell), 52 - o.bits});
      for (const CellPlan& c : o.cells) {
        TableCell cell;
        cell.split = c.split;
        cell.side[0] = region(c.side0);
        cell.side[1] = region(c.side1);
        d.cells.push_back(cell);
      }
    }
    TableStatistics& st = d.statistics;
    st.n_segments = d.segments.size();
    st.n_cells = d.cells.size();
    st.bytes = sizeof(PropertyTable) + sizeof(TableData) + d.name.capacity() +
               d.octaves.capacity() * sizeof(TableOctave) +
               d.cells.capacity() * sizeof(TableCell) +
               d.segments.capacity() * sizeof(TableSegment) +
               d.segment_start.capacity() * sizeof(double);
    return d;
  }

  /**
   * Independent check: two pseudo-random points per segment (not the points
   * error control used) plus both ends, table against model.
   */
  void final_check(TableData& d, std::vector<std::size_t>& failing) {
    TableStatistics& st = d.statistics;
    st.worst_error = 0.0;
    st.worst_energy_error = 0.0;
    st.n_checked = 0;
    auto check = [&](double t) {
      const TableLocation loc = locate(d.octaves.data(), d.cells.data(), d.exponent0, t);
      double u, c, dc;
      evaluate_segment(d.segments[std::size_t(loc.segment)], loc.t, loc.inv_h, u, c, dc);
      const ThermalState exact = eval(t);
      const double error = std::abs(c - exact.capacity) / exact.capacity;
      const double energy_error =
          std::abs(u - exact.energy) / std::max(std::abs(exact.energy), 1e-300);
      ++st.n_checked;
      if (error > st.worst_error) {
        st.worst_error = error;
        st.worst_temperature = t;
      }
      st.worst_energy_error = std::max(st.worst_energy_error, energy_error);
      return error;
    };
    std::uint64_t k = 0;
    for (std::size_t ri = 0; ri < regions_.size(); ++ri) {
      const Region& r = regions_[ri];
      double worst = 0.0;
      for (std::int64_t i = 0; i < r.n; ++i) {
        const double t0 = r.node(i);
        const double t1 = r.node(i + 1);
        for (int m = 0; m < 2; ++m) {
          const double s = double(mix(++k) >> 11) * 0x1.0p-53;
          worst = std::max(worst, check(std::min(t1, t0 + s * (t1 - t0))));
        }
      }
      if (worst > tolerance_)
        failing.push_back(ri);
    }
    if (check(lower_) > tolerance_)
      failing.push_back(0);
    if (check(upper_) > tolerance_)
      failing.push_back(regions_.size() - 1);
    std::sort(failing.begin(), failing.end());
    failing.erase(std::unique(failing.begin(), failing.end()), failing.end());
    st.n_evaluations = n_evaluations_;
  }

  const ThermalModel& model_;
  std::string name_;
  TableOptions options_;
  double lower_ = 0.0, upper_ = 0.0;
  double tolerance_ = 0.0, target_ = 0.0;
  std::vector<double> breakpoints_;
  std::vector<PilotSegment> pilot_;
  std::vector<Region> regions_;
  std::vector<OctavePlan> octaves_;
  std::size_t n_cells_ = 0;
  std::int64_t total_segments_ = 0;
  std::size_t n_evaluations_ = 0;
};

} // namespace

TableData build_table_data(const ThermalModel& model, const TableOptions& options) {
  Builder builder(model, options);
  return builder.run();
}

} // namespace detail
} // namespace quantacal
