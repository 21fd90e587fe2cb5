// SPDX-License-Identifier: Apache-2.0
// Node selection of `quantacal export` (export_nodes.h; docs/export.md).
#include "export_nodes.h"

#include <quantacal/common/exceptions.h>
#include <quantacal/common/format.h>

#include <algorithm>
#include <cmath>
#include <cstdint>
#include <map>
#include <random>
#include <string>
#include <utility>

namespace quantacal::cli {
namespace {

/// Fraction of the tolerance the selection aims at, so that the verification pass
/// (other points) rarely has to split again.
constexpr double selection_margin = 0.9;
/// Evenly spaced interior points checked on every candidate interval.
constexpr int n_even_checks = 16;
/// Stratified pseudo-random points per interval in the verification pass.
constexpr int n_verification_points = 48;
/// A model step larger than this fraction of the tolerance gets its own jump node.
constexpr double jump_fraction = 0.25;
/// Relative width of the interval left below a model discontinuity.
constexpr double jump_width = 1e-6;
/// Narrowest interval (relative to T) the bisection may make before giving up.
constexpr double narrowest = 1e-9;
/// Breakpoints closer than this (relative) are one node.
constexpr double same_node = 1e-12;

/// The exact model at one temperature, on the export's basis.
struct Sample {
  double capacity = 0.0;
  double energy = 0.0;
  double conductivity = 0.0;
  double density = 0.0;
};

class Sampler {
public:
  Sampler(const Material& material, Basis basis) : material_(material), basis_(basis) {}

  Sample operator()(double t) {
    ++n_evaluations;
    const ThermalState s = material_.thermal_exact(t, basis_);
    return Sample{s.capacity, s.energy, material_.conductivity_exact(t).value,
                  material_.density(t)};
  }

  std::size_t n_evaluations = 0;

private:
  const Material& material_;
  Basis basis_;
};

double relative(double interpolated, double exact) {
  return std::abs(interpolated - exact) / std::abs(exact);
}

/// Relative errors of the linear interpolant between (a, sa) and (b, sb) at t.
struct Errors {
  double capacity = 0.0;
  double conductivity = 0.0;
  double density = 0.0;
  double worst() const { return std::max({capacity, conductivity, density}); }
};

Errors errors_at(double a, const Sample& sa, double b, const Sample& sb, double t,
                 const Sample& st) {
  const double w = (t - a) / (b - a);
  const auto lerp = [w](double ya, double yb) { return ya + w * (yb - ya); };
  return Errors{relative(lerp(sa.capacity, sb.capacity), st.capacity),
                relative(lerp(sa.conductivity, sb.conductivity), st.conductivity),
                relative(lerp(sa.density, sb.density), st.density)};
}

/// Where an interval is split: in log T while it spans more than an octave.
double split_point(double a, double b) {
  return b > 2.0 * a ? std::sqrt(a * b) : 0.5 * (a + b);
}

class NodeBuilder {
public:
  NodeBuilder(const Material& material, Basis basis, double lower, double upper,
              double tolerance)
      : sample_(material, basis), lower_(lower), upper_(upper), tolerance_(tolerance) {
    // Check points from the cached tables: their nodes are placed by error control at
    // 1e-9, so every feature of c_p and k (a narrow peak, a knot) has some of them on
    // it, and a peak cannot hide between the evenly spaced checks of a wide interval.
    std::vector<double> t = material.table().node_temperatures();
    const std::vector<double> tk = material.conductivity_table().node_temperatures();
    t.insert(t.end(), tk.begin(), tk.end());
    std::sort(t.begin(), t.end());
    t.erase(std::unique(t.begin(), t.end()), t.end());
    for (std::size_t i = 0; i < t.size(); ++i) {
      hints_.push_back(t[i]);
      if (i + 1 < t.size())
        hints_.push_back(0.5 * (t[i] + t[i + 1]));
    }
    structural_nodes(material);
  }

  /// Bisects every interval that is not a jump until it passes the selection check.
  void refine_all() {
    std::vector<std::pair<double, double>> work;
    for (auto it = nodes_.begin(); std::next(it) != nodes_.end(); ++it)
      if (!is_jump(it->first))
        work.emplace_back(it->first, std::next(it)->first);
    refine(work);
  }

  /**
   * One verification pass over all intervals with new points; splits the intervals
   * that fail the full tolerance. @return true when none failed (the figures in
   * @p out are then final).
   */
  bool verify(ExportTable& out) {
    fill_columns(out);
    std::mt19937_64 random(0x5eed + pass_++);
    std::uniform_real_distribution<double> unit(0.0, 1.0);
    std::vector<std::pair<double, double>> failed;
    out.n_checked = 0;
    out.worst_capacity_error = out.worst_conductivity_error = out.worst_density_error =
        0.0;
    out.worst_enthalpy_difference = 0.0;
    for (std::size_t i = 0; i < out.temperature.size(); ++i)
      note_enthalpy(out, out.temperature[i],
                    std::abs(out.enthalpy[i] - nodes_.at(out.temperature[i]).energy));
    for (std::size_t i = 0; i + 1 < out.temperature.size(); ++i) {
      const double a = out.temperature[i], b = out.temperature[i + 1];
      const Sample& sa = nodes_.at(a);
      const Sample& sb = nodes_.at(b);
      const bool jump = is_jump(a);
      bool fails = false;
      for (int j = 0; j < n_verification_points; ++j) {
        const double t = a + (b - a) * (j + unit(random)) / n_verification_points;
        if (!(t > a && t < b))
          continue;
        const Sample st = sample_(t);
        ++out.n_checked;
        // H as the exact integral of the linear c_p from node i.
        const double x = t - a;
        const double h = out.enthalpy[i] + sa.capacity * x +
                         0.5 * (sb.capacity - sa.capacity) * x * x / (b - a);
        // Between two check points H - e can grow by at most the integral of
        // |L - C| <= tolerance C over their spacing (2 (b - a) / n at most): adding
        // that makes the figure a bound between the points too, not only at them.
        const double slack = tolerance_ *
                             std::max({sa.capacity, sb.capacity, st.capacity}) * 2.0 *
                             (b - a) / n_verification_points;
        note_enthalpy(out, t, std::abs(h - st.energy) + slack);
        if (jump)
          continue;
        const Errors e = errors_at(a, sa, b, sb, t, st);
        if (e.capacity > out.worst_capacity_error) {
          out.worst_capacity_error = e.capacity;
          out.worst_capacity_temperature = t;
        }
        if (e.conductivity > out.worst_conductivity_error) {
          out.worst_conductivity_error = e.conductivity;
          out.worst_conductivity_temperature = t;
        }
        out.worst_density_error = std::max(out.worst_density_error, e.density);
        fails = fails || e.worst() > tolerance_;
      }
      if (fails)
        failed.emplace_back(a, b);
    }
    if (failed.empty())
      return true;
    std::vector<std::pair<double, double>> work;
    for (const auto& [a, b] : failed) {
      const double m = split_point(a, b);
      check_width(a, b);
      nodes_.emplace(m, sample_(m));
      work.emplace_back(a, m);
      work.emplace_back(m, b);
    }
    refine(work);
    return false;
  }

  std::vector<ExportJump> jumps;
  std::size_t n_evaluations() const { return sample_.n_evaluations; }
  double energy_at(double t) const { return nodes_.at(t).energy; }

private:
  /// Both ends, the models' breakpoints inside the range, and a node below each jump.
  void structural_nodes(const Material& material) {
    std::vector<double> t = {lower_, upper_};
    for (const auto& list :
         {material.model().breakpoints(), material.conductivity_model().breakpoints()})
      for (const double b : list)
        if (b > lower_ && b < upper_)
          t.push_back(b);
    std::sort(t.begin(), t.end());
    std::vector<double> kept;
    for (const double v : t)
      if (kept.empty() || v - kept.back() > same_node * v)
        kept.push_back(v);
    kept.back() = upper_;
    for (const double v : kept)
      nodes_.emplace(v, sample_(v));

    // A step of the model itself (the Hillert-Jarl magnetic capacity jumps at T*, a
    // piecewise assessed polynomial may step at a join) cannot be interpolated
    // linearly: a node just below it leaves an interval of width 1e-6 T that holds
    // the step, listed in the export.
    for (std::size_t i = 1; i < kept.size(); ++i) {
      const double b = kept[i];
      const Sample right = nodes_.at(b);
      const Sample left = sample_(std::nextafter(b, 0.0));
      const auto step = [](double l, double r) {
        return std::abs(r - l) / std::max(std::abs(l), std::abs(r));
      };
      const std::pair<const char*, double> steps[] = {
          {"c_p", step(left.capacity, right.capacity)},
          {"k", step(left.conductivity, right.conductivity)},
          {"density", step(left.density, right.density)}};
      const auto* worst = std::max_element(
          std::begin(steps), std::end(steps),
          [](const auto& x, const auto& y) { return x.second < y.second; });
      if (worst->second <= jump_fraction * tolerance_)
        continue;
      const double below = b * (1.0 - jump_width);
      if (!(below > kept[i - 1]))
        continue; // the previous node is already that close: the check will tell
      nodes_.emplace(below, sample_(below));
      jumps.push_back(ExportJump{below, b, worst->second, worst->first});
    }
  }

  bool is_jump(double a) const {
    for (const auto& j : jumps)
      if (j.lower == a)
        return true;
    return false;
  }

  void check_width(double a, double b) const {
    if (b - a < narrowest * b)
      throw NumericalError(
          "quantacal export",
          "cannot reach the relative tolerance " + format_double(tolerance_) +
              " between " + format_double(a) + " K and " + format_double(b) +
              " K: the interval is already narrower than " + format_double(narrowest) +
              " T (is the model continuous "
              "there?)");
  }

  /// The selection check of one interval: false at the first point that fails.
  bool passes(double a, double b) {
    const Sample sa = nodes_.at(a);
    const Sample sb = nodes_.at(b);
    const double limit = selection_margin * tolerance_;
    for (int i = 1; i <= n_even_checks; ++i) {
      const double t = a + (b - a) * i / (n_even_checks + 1.0);
      if (errors_at(a, sa, b, sb, t, sample_(t)).worst() > limit)
        return false;
    }
    auto it = std::upper_bound(hints_.begin(), hints_.end(), a);
    for (; it != hints_.end() && *it < b; ++it)
      if (errors_at(a, sa, b, sb, *it, sample_(*it)).worst() > limit)
        return false;
    return true;
  }

  void refine(std::vector<std::pair<double, double>> work) {
    while (!work.empty()) {
      const auto [a, b] = work.back();
      work.pop_back();
      if (passes(a, b))
        continue;
      check_width(a, b);
      const double m = split_point(a, b);
      nodes_.emplace(m, sample_(m));
      work.emplace_back(a, m);
      work.emplace_back(m, b);
    }
  }

  void fill_columns(ExportTable& out) const {
    out.temperature.clear();
    out.capacity.clear();
    out.enthalpy.clear();
    out.conductivity.clear();
    out.density.clear();
    for (const auto& [t, s] : nodes_) {
      // H is the trapezoid sum of the exported c_p, started at the model's e.
      const double h =
          out.temperature.empty()
              ? s.energy
              : out.enthalpy.back() + 0.5 * (out.capacity.back() + s.capacity) *
                                          (t - out.temperature.back());
      out.temperature.push_back(t);
      out.capacity.push_back(s.capacity);
      out.enthalpy.push_back(h);
      out.conductivity.push_back(s.conductivity);
      out.density.push_back(s.density);
    }
  }

  static void note_enthalpy(ExportTable& out, double t, double difference) {
    if (difference > out.worst_enthalpy_difference) {
      out.worst_enthalpy_difference = difference;
      out.worst_enthalpy_temperature = t;
    }
  }

  Sampler sample_;
  double lower_, upper_, tolerance_;
  std::vector<double> hints_;
  std::map<double, Sample> nodes_;
  std::uint64_t pass_ = 0;
};

} // namespace

ExportTable build_export_table(const Material& material, double lower, double upper,
                               double tolerance, Basis basis) {
  material.check_temperature(lower, "quantacal export (first temperature)");
  material.check_temperature(upper, "quantacal export (last temperature)");
  if (!(upper > lower))
    throw RangeError(
        "quantacal export", material.name(),
        "a last temperature above the first (" + format_double(lower) + " K)", upper);
  if (!(tolerance > 0.0 && tolerance < 1.0))
    throw RangeError("quantacal export", material.name(), "0 < tolerance < 1", tolerance,
                     "");
  NodeBuilder builder(material, basis, lower, upper, tolerance);
  builder.refine_all();
  ExportTable out;
  out.tolerance = tolerance;
  // Each failed pass splits what failed; a handful of passes is plenty in practice.
  for (int pass = 0;; ++pass) {
    if (builder.verify(out))
      break;
    if (pass == 20)
      throw NumericalError("quantacal export",
                           "the verification pass still finds intervals above the "
                           "tolerance after 20 refinements");
  }
  out.jumps = builder.jumps;
  out.enthalpy_range = builder.energy_at(upper) - builder.energy_at(lower);
  out.n_evaluations = builder.n_evaluations();
  return out;
}

} // namespace quantacal::cli
