// SPDX-License-Identifier: Apache-2.0
// PropertyTable: evaluation (scalar, batch, inverse); the build is in table_builder.cc.
#include "table_layout.h"

#include <quantacal/common/exceptions.h>
#include <quantacal/tables/property_table.h>

#include <algorithm>
#include <atomic>
#include <cmath>
#if defined(__GNUC__) && defined(__x86_64__)
#define QUANTACAL_TABLES_AVX2 1
#include <immintrin.h>
#endif
#include <cstdint>
#include <limits>
#include <string>
#include <utility>
#include <vector>

namespace quantacal {
namespace detail {
namespace {

std::string kelvin(double t) {
  return format_double(t) + " K";
}

RangeError out_of_range(const TableData& d, const char* function, double temperature) {
  return RangeError(function, d.name, kelvin(d.lower) + " <= T <= " + kelvin(d.upper),
                    temperature);
}

#ifdef QUANTACAL_TABLES_AVX2
// The batch with AVX2, four points at a time: scalar lookup, then the six coefficients of
// the four segments are loaded and transposed and the three Horner chains run on vectors.
// The operations and their order are those of locate() and evaluate_segment() (no FMA),
// so the results are bit-identical to the scalar path. Selected at run time: the library
// itself is built for the baseline x86-64.
/** True if lower <= T <= upper for all n temperatures (false for NaN), AVX2. */
__attribute__((target("avx2"))) bool inside_avx2(const double* temperature, std::size_t n,
                                                 double lower, double upper) {
  const __m256d lo = _mm256_set1_pd(lower), hi = _mm256_set1_pd(upper);
  __m256d inside = _mm256_castsi256_pd(_mm256_set1_epi64x(-1));
  std::size_t j = 0;
  for (; j + 4 <= n; j += 4) {
    const __m256d x = _mm256_loadu_pd(temperature + j);
    inside = _mm256_and_pd(inside, _mm256_and_pd(_mm256_cmp_pd(x, lo, _CMP_GE_OQ),
                                                 _mm256_cmp_pd(x, hi, _CMP_LE_OQ)));
  }
  bool ok = _mm256_movemask_pd(inside) == 0xf;
  for (; j < n; ++j)
    ok &= temperature[j] >= lower && temperature[j] <= upper;
  return ok;
}

/** The batch on in-range temperatures (checked before), AVX2. */
__attribute__((target("avx2"))) void batch_avx2(const TableData& d,
                                                const double* temperature, std::size_t m,
                                                double* energy, double* capacity,
                                                double* capacity_derivative) {
  static_assert(sizeof(TableSegment) == 48, "layout assumed by the loads");
  const TableSegment* segments = d.segments.data();
  const __m256d two = _mm256_set1_pd(2.0), three = _mm256_set1_pd(3.0);
  const __m256d four = _mm256_set1_pd(4.0), five = _mm256_set1_pd(5.0);
  const __m256d six = _mm256_set1_pd(6.0), twelve = _mm256_set1_pd(12.0);
  const __m256d twenty = _mm256_set1_pd(20.0);
  std::size_t j = 0;
  for (; j + 4 <= m; j += 4) {
    // lookup: scalar (AVX2 gathers of the octave, cell and region entries
    // measured slower here: 6.6 against 4.9 ns per point in all)
    const TableOctave* oct = d.octaves.data();
    const TableCell* cel = d.cells.data();
    const TableLocation l0 = locate(oct, cel, d.exponent0, temperature[j]);
    const TableLocation l1 = locate(oct, cel, d.exponent0, temperature[j + 1]);
    const TableLocation l2 = locate(oct, cel, d.exponent0, temperature[j + 2]);
    const TableLocation l3 = locate(oct, cel, d.exponent0, temperature[j + 3]);
    const __m256d t = _mm256_setr_pd(l0.t, l1.t, l2.t, l3.t);
    const __m256d ih = _mm256_setr_pd(l0.inv_h, l1.inv_h, l2.inv_h, l3.inv_h);
    // coefficients, transposed
    const double* p0 = segments[l0.segment].a;
    const double* p1 = segments[l1.segment].a;
    const double* p2 = segments[l2.segment].a;
    const double* p3 = segments[l3.segment].a;
    const __m256d r0 = _mm256_loadu_pd(p0), r1 = _mm256_loadu_pd(p1);
    const __m256d r2 = _mm256_loadu_pd(p2), r3 = _mm256_loadu_pd(p3);
    const __m256d s0 = _mm256_unpacklo_pd(r0, r1), s1 = _mm256_unpackhi_pd(r0, r1);
    const __m256d s2 = _mm256_unpacklo_pd(r2, r3), s3 = _mm256_unpackhi_pd(r2, r3);
    const __m256d a0 = _mm256_permute2f128_pd(s0, s2, 0x20);
    const __m256d a2 = _mm256_permute2f128_pd(s0, s2, 0x31);
    const __m256d a1 = _mm256_permute2f128_pd(s1, s3, 0x20);
    const __m256d a3 = _mm256_permute2f128_pd(s1, s3, 0x31);
    const __m256d q02 = _mm256_set_m128d(_mm_loadu_pd(p2 + 4), _mm_loadu_pd(p0 + 4));
    const __m256d q13 = _mm256_set_m128d(_mm_loadu_pd(p3 + 4), _mm_loadu_pd(p1 + 4));
    const __m256d a4 = _mm256_unpacklo_pd(q02, q13);
    const __m256d a5 = _mm256_unpackhi_pd(q02, q13);
    // three Horner chains (evaluate_segment)
    __m256d u = _mm256_add_pd(a4, _mm256_mul_pd(t, a5));
    u = _mm256_add_pd(a3, _mm256_mul_pd(t, u));
    u = _mm256_add_pd(a2, _mm256_mul_pd(t, u));
    u = _mm256_add_pd(a1, _mm256_mul_pd(t, u));
    u = _mm256_add_pd(a0, _mm256_mul_pd(t, u));
    __m256d c =
        _mm256_add_pd(_mm256_mul_pd(four, a4), _mm256_mul_pd(t, _mm256_mul_pd(five, a5)));
    c = _mm256_add_pd(_mm256_mul_pd(three, a3), _mm256_mul_pd(t, c));
    c = _mm256_add_pd(_mm256_mul_pd(two, a2), _mm256_mul_pd(t, c));
    c = _mm256_mul_pd(_mm256_add_pd(a1, _mm256_mul_pd(t, c)), ih);
    __m256d dc = _mm256_add_pd(_mm256_mul_pd(twelve, a4),
                               _mm256_mul_pd(t, _mm256_mul_pd(twenty, a5)));
    dc = _mm256_add_pd(_mm256_mul_pd(six, a3), _mm256_mul_pd(t, dc));
    dc = _mm256_mul_pd(_mm256_add_pd(_mm256_mul_pd(two, a2), _mm256_mul_pd(t, dc)),
                       _mm256_mul_pd(ih, ih));
    _mm256_storeu_pd(energy + j, u);
    _mm256_storeu_pd(capacity + j, c);
    _mm256_storeu_pd(capacity_derivative + j, dc);
  }
  for (; j < m; ++j) {
    const TableLocation loc =
        locate(d.octaves.data(), d.cells.data(), d.exponent0, temperature[j]);
    evaluate_segment(segments[loc.segment], loc.t, loc.inv_h, energy[j], capacity[j],
                     capacity_derivative[j]);
  }
}

std::atomic<bool> portable_only{false};

bool has_avx2() {
  static const bool yes = __builtin_cpu_supports("avx2");
  return yes && !portable_only.load(std::memory_order_relaxed);
}
#endif

template <bool WantEnergy, bool WantCapacity, bool WantDerivative>
void evaluate_batch(const TableData& d, const double* temperatures, std::size_t n,
                    double* energy, double* capacity, double* capacity_derivative) {
  constexpr std::size_t chunk = 128;
  std::int32_t segment[chunk];
  double local[chunk];
  double inv_h[chunk];
  const TableOctave* octaves = d.octaves.data();
  const TableCell* cells = d.cells.data();
  const TableSegment* segments = d.segments.data();
  const int exponent0 = d.exponent0;
  const double lower = d.lower;
  const double upper = d.upper;
#ifdef QUANTACAL_TABLES_AVX2
  if (WantEnergy && WantCapacity && WantDerivative && has_avx2()) {
    if (!inside_avx2(temperatures, n, lower, upper))
      for (std::size_t j = 0; j < n; ++j)
        if (!(temperatures[j] >= lower && temperatures[j] <= upper))
          throw out_of_range(d, "quantacal::PropertyTable::evaluate", temperatures[j]);
    batch_avx2(d, temperatures, n, energy, capacity, capacity_derivative);
    return;
  }
#endif
  for (std::size_t i0 = 0; i0 < n; i0 += chunk) {
    const std::size_t m = std::min(chunk, n - i0);
    const double* t = temperatures + i0;
    bool ok = true;
    for (std::size_t j = 0; j < m; ++j)
      ok &= (t[j] >= lower) & (t[j] <= upper);
    if (!ok)
      for (std::size_t j = 0; j < m; ++j)
        if (!(t[j] >= lower && t[j] <= upper))
          throw out_of_range(d, "quantacal::PropertyTable::evaluate", t[j]);
    // Pass 1: lookup (integer and gather work).
    for (std::size_t j = 0; j < m; ++j) {
      const TableLocation loc = locate(octaves, cells, exponent0, t[j]);
      segment[j] = loc.segment;
      local[j] = loc.t;
      inv_h[j] = loc.inv_h;
    }
    // Pass 2: polynomials, independent across points.
    for (std::size_t j = 0; j < m; ++j) {
      const double* a = segments[segment[j]].a;
      const double x = local[j];
      if (WantEnergy)
        energy[i0 + j] =
            a[0] + x * (a[1] + x * (a[2] + x * (a[3] + x * (a[4] + x * a[5]))));
      if (WantCapacity)
        capacity[i0 + j] =
            (a[1] +
             x * (2.0 * a[2] + x * (3.0 * a[3] + x * (4.0 * a[4] + x * (5.0 * a[5]))))) *
            inv_h[j];
      if (WantDerivative)
        capacity_derivative[i0 + j] =
            (2.0 * a[2] + x * (6.0 * a[3] + x * (12.0 * a[4] + x * (20.0 * a[5])))) *
            (inv_h[j] * inv_h[j]);
    }
  }
}

} // namespace
} // namespace detail

namespace detail {
void force_portable_batch(bool on) noexcept {
#ifdef QUANTACAL_TABLES_AVX2
  portable_only.store(on, std::memory_order_relaxed);
#else
  (void)on;
#endif
}
} // namespace detail

struct PropertyTable::Impl : detail::TableData {
  explicit Impl(detail::TableData&& d) : detail::TableData(std::move(d)) {}
};

std::shared_ptr<const PropertyTable> PropertyTable::build(const ThermalModel& model,
                                                          const TableOptions& options) {
  auto impl = std::make_unique<Impl>(detail::build_table_data(model, options));
  return std::shared_ptr<const PropertyTable>(new PropertyTable(std::move(impl)));
}

PropertyTable::PropertyTable(std::unique_ptr<Impl> impl) : impl_(std::move(impl)) {}
PropertyTable::~PropertyTable() = default;

ThermalState PropertyTable::evaluate(double temperature) const {
  const Impl& d = *impl_;
  if (!(temperature >= d.lower && temperature <= d.upper))
    throw detail::out_of_range(d, "quantacal::PropertyTable::evaluate", temperature);
  const detail::TableLocation loc =
      detail::locate(d.octaves.data(), d.cells.data(), d.exponent0, temperature);
  ThermalState s;
  detail::evaluate_segment(d.segments[std::size_t(loc.segment)], loc.t, loc.inv_h,
                           s.energy, s.capacity, s.capacity_derivative);
  return s;
}

void PropertyTable::evaluate(const double* temperatures, std::size_t n, double* energy,
                             double* capacity, double* capacity_derivative) const {
  const detail::TableData& d = *impl_;
  const int mask = (energy ? 4 : 0) | (capacity ? 2 : 0) | (capacity_derivative ? 1 : 0);
  switch (mask) {
  case 7:
    return detail::evaluate_batch<true, true, true>(d, temperatures, n, energy, capacity,
                                                    capacity_derivative);
  case 6:
    return detail::evaluate_batch<true, true, false>(d, temperatures, n, energy, capacity,
                                                     capacity_derivative);
  case 5:
    return detail::evaluate_batch<true, false, true>(d, temperatures, n, energy, capacity,
                                                     capacity_derivative);
  case 4:
    return detail::evaluate_batch<true, false, false>(d, temperatures, n, energy,
                                                      capacity, capacity_derivative);
  case 3:
    return detail::evaluate_batch<false, true, true>(d, temperatures, n, energy, capacity,
                                                     capacity_derivative);
  case 2:
    return detail::evaluate_batch<false, true, false>(d, temperatures, n, energy,
                                                      capacity, capacity_derivative);
  case 1:
    return detail::evaluate_batch<false, false, true>(d, temperatures, n, energy,
                                                      capacity, capacity_derivative);
  default: // nothing wanted: still apply the range rule
    return detail::evaluate_batch<false, false, false>(d, temperatures, n, energy,
                                                       capacity, capacity_derivative);
  }
}

double PropertyTable::temperature_from_energy(double energy) const {
  const Impl& d = *impl_;
  const char* const function = "quantacal::PropertyTable::temperature_from_energy";
  const double lowest = d.segments.front().a[0];
  if (!(energy >= lowest && energy <= d.upper_energy))
    throw RangeError(function, d.name,
                     format_double(lowest) +
                         " J/mol <= U <= " + format_double(d.upper_energy) +
                         " J/mol (U at " + detail::kelvin(d.lower) + " and " +
                         detail::kelvin(d.upper) + ")",
                     energy, "J/mol");
  // Segment: the last one whose start energy is <= energy (not on the hot path).
  const auto it = std::upper_bound(
      d.segments.begin(), d.segments.end(), energy,
      [](double e, const detail::TableSegment& s) { return e < s.a[0]; });
  const std::size_t k = std::size_t(it - d.segments.begin()) - 1;
  double lo = d.segment_start[k];
  double hi = k + 1 < d.segment_start.size() ? d.segment_start[k + 1] : d.upper;
  auto f = [&](double t, double& c) {
    const detail::TableLocation loc =
        detail::locate(d.octaves.data(), d.cells.data(), d.exponent0, t);
    double u, dc;
    detail::evaluate_segment(d.segments[std::size_t(loc.segment)], loc.t, loc.inv_h, u, c,
                             dc);
    return u - energy;
  };
  double c_lo, c_hi;
  const double f_lo = f(lo, c_lo);
  const double f_hi = f(hi, c_hi);
  if (f_lo >= 0.0)
    return lo;
  if (f_hi <= 0.0)
    return hi;
  // Safeguarded Newton on the segment's polynomial, bisection when a step leaves the
  // bracket.
  double t = lo - f_lo * (hi - lo) / (f_hi - f_lo);
  double best = t, best_residual = std::numeric_limits<double>::infinity();
  for (int iteration = 0; iteration < 100; ++iteration) {
    double c;
    const double r = f(t, c);
    if (std::abs(r) < best_residual) {
      best_residual = std::abs(r);
      best = t;
    }
    if (r == 0.0)
      break;
    (r < 0.0 ? lo : hi) = t;
    double next = t - r / c;
    if (!(next > lo && next < hi))
      next = 0.5 * (lo + hi);
    if (next == t || !(hi - lo > 4.0 * std::numeric_limits<double>::epsilon() * hi))
      break;
    t = next;
  }
  return best;
}

double PropertyTable::lower_temperature() const noexcept {
  return impl_->lower;
}
double PropertyTable::upper_temperature() const noexcept {
  return impl_->upper;
}
const TableStatistics& PropertyTable::statistics() const noexcept {
  return impl_->statistics;
}
const std::string& PropertyTable::name() const noexcept {
  return impl_->name;
}

std::vector<double> PropertyTable::node_temperatures() const {
  std::vector<double> t = impl_->segment_start;
  t.push_back(impl_->upper);
  return t;
}

} // namespace quantacal
