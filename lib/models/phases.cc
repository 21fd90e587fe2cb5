// SPDX-License-Identifier: Apache-2.0
// Phase sequences (smooth-step joins with exact energy) and the Gibbs-energy
// series of assessed element data. Formulas: include/quantacal/models/phases.h
// and docs/theory.md, "Phases".
#include "validation.h"

#include <quantacal/models/heat_capacity_model.h>
#include <quantacal/models/phases.h>

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <limits>
#include <string>
#include <utility>

namespace quantacal {
namespace {

std::string boundary_name(std::size_t i) {
  return "boundary " + std::to_string(i + 1);
}

// ---- phase sequence ---------------------------------------------------------------

class PhaseSequence final : public Contribution {
public:
  PhaseSequence(std::vector<std::shared_ptr<const HeatCapacityModel>> phases,
                PhaseLayout layout)
      : phases_(std::move(phases)), layout_(std::move(layout)),
        offsets_(phases_.size(), 0.0) {
    // offset_b = U_a(Tt) + offset_a + L - U_b(Tt): the latent heat is the energy
    // step between the two phases' energies at Tt.
    const auto& b = layout_.boundaries();
    for (std::size_t i = 0; i < b.size(); ++i)
      offsets_[i + 1] = phases_[i]->evaluate(b[i].temperature).energy + offsets_[i] +
                        b[i].latent_heat -
                        phases_[i + 1]->evaluate(b[i].temperature).energy;
  }

  std::string kind() const override { return "phases"; }
  double lower_temperature() const override {
    return phases_.front()->lower_temperature();
  }
  double upper_temperature() const override {
    return phases_.back()->upper_temperature();
  }

  std::vector<double> breakpoints() const override {
    std::vector<double> points;
    for (std::size_t i = 0; i < phases_.size(); ++i)
      for (double p : phases_[i]->breakpoints())
        if (p > layout_.phase_lower(i) && p < layout_.phase_upper(i))
          points.push_back(p);
    for (const PhaseBoundary& b : layout_.boundaries()) {
      points.push_back(b.temperature - 0.5 * b.width);
      points.push_back(b.temperature);
      points.push_back(b.temperature + 0.5 * b.width);
    }
    return points;
  }

  ThermalState evaluate(double t) const override {
    const PhaseLayout::Weight w = layout_.weight(t);
    ThermalState a = phases_[w.phase]->evaluate(t);
    a.energy += offsets_[w.phase];
    if (w.s == 0.0 && w.ds == 0.0)
      return a;
    ThermalState b = phases_[w.phase + 1]->evaluate(t);
    b.energy += offsets_[w.phase + 1];
    const double du = b.energy - a.energy;
    const double dc = b.capacity - a.capacity;
    ThermalState r;
    r.energy = a.energy + w.s * du;
    r.capacity = a.capacity + w.s * dc + w.ds * du;
    r.capacity_derivative = a.capacity_derivative +
                            w.s * (b.capacity_derivative - a.capacity_derivative) +
                            2.0 * w.ds * dc + w.d2s * du;
    return r;
  }

  // Named by their card paths: "phases[i].from.temperature" (latent_heat, width)
  // for the boundary into phase i, "phases[i].heat_capacity[k].<name>" for the
  // terms of phase i.
  std::vector<Parameter> parameters() const override {
    std::vector<Parameter> p;
    const auto& b = layout_.boundaries();
    for (std::size_t i = 0; i < phases_.size(); ++i) {
      const std::string phase = "phases[" + std::to_string(i) + "]";
      if (i > 0) {
        p.push_back({phase + ".from.temperature", b[i - 1].temperature, "K"});
        p.push_back({phase + ".from.latent_heat", b[i - 1].latent_heat, "J/mol"});
        p.push_back({phase + ".from.width", b[i - 1].width, "K"});
      }
      const auto& terms = phases_[i]->contributions();
      for (std::size_t k = 0; k < terms.size(); ++k)
        for (const Parameter& q : terms[k]->parameters())
          p.push_back({phase + ".heat_capacity[" + std::to_string(k) + "]." + q.name,
                       q.value, q.unit});
    }
    return p;
  }

  ContributionPtr with_parameter(const std::string& name, double value) const override {
    std::size_t i = 0, k = 0;
    char rest[64] = {};
    if (std::sscanf(name.c_str(), "phases[%zu].heat_capacity[%zu].%63s", &i, &k, rest) ==
            3 &&
        i < phases_.size() && k < phases_[i]->contributions().size()) {
      auto phases = phases_;
      phases[i] = std::make_shared<const HeatCapacityModel>(phases_[i]->with_contribution(
          k, phases_[i]->contributions()[k]->with_parameter(rest, value)));
      return make_phase_sequence(std::move(phases), layout_);
    }
    if (std::sscanf(name.c_str(), "phases[%zu].from.%63s", &i, rest) == 2 && i > 0 &&
        i < phases_.size()) {
      std::vector<PhaseBoundary> b = layout_.boundaries();
      const std::string key = rest;
      if (key == "temperature")
        b[i - 1].temperature = value;
      else if (key == "latent_heat")
        b[i - 1].latent_heat = value;
      else if (key == "width")
        b[i - 1].width = value;
      else
        detail::unknown_parameter("phases", name, "temperature, latent_heat, width");
      return make_phase_sequence(phases_, PhaseLayout(std::move(b)));
    }
    std::string known;
    for (const Parameter& q : parameters())
      known += (known.empty() ? "" : ", ") + q.name;
    detail::unknown_parameter("phases", name, known);
  }

private:
  std::vector<std::shared_ptr<const HeatCapacityModel>> phases_;
  PhaseLayout layout_;
  std::vector<double> offsets_; // J/mol, added to each phase's energy
};

// ---- phase conductivity -----------------------------------------------------------

class PhaseConductivity final : public ConductivityModel {
public:
  PhaseConductivity(std::vector<ConductivityPtr> phases, PhaseLayout layout)
      : phases_(std::move(phases)), layout_(std::move(layout)) {}
  std::string kind() const override { return "phases"; }
  // Each phase's own breakpoints inside the region where it is evaluated, and both
  // ends of every join (the smooth step's third derivative jumps there), as the
  // phase sequence of the heat capacity lists them.
  std::vector<double> breakpoints() const override {
    std::vector<double> points;
    for (std::size_t i = 0; i < phases_.size(); ++i)
      for (double p : phases_[i]->breakpoints())
        if (p > layout_.phase_lower(i) && p < layout_.phase_upper(i))
          points.push_back(p);
    for (const PhaseBoundary& b : layout_.boundaries()) {
      points.push_back(b.temperature - 0.5 * b.width);
      points.push_back(b.temperature + 0.5 * b.width);
    }
    std::sort(points.begin(), points.end());
    return points;
  }
  ConductivityValue evaluate(double t) const override {
    const PhaseLayout::Weight w = layout_.weight(t);
    const ConductivityValue a = phases_[w.phase]->evaluate(t);
    if (w.s == 0.0 && w.ds == 0.0)
      return a;
    const ConductivityValue b = phases_[w.phase + 1]->evaluate(t);
    return {a.value + w.s * (b.value - a.value), a.derivative +
                                                     w.s * (b.derivative - a.derivative) +
                                                     w.ds * (b.value - a.value)};
  }

private:
  std::vector<ConductivityPtr> phases_;
  PhaseLayout layout_;
};

// ---- Gibbs-energy series ----------------------------------------------------------

class GibbsSeries final : public Contribution {
public:
  explicit GibbsSeries(std::vector<GibbsPiece> pieces)
      : pieces_(std::move(pieces)), base_(pieces_.size(), 0.0) {
    for (std::size_t k = 0; k + 1 < pieces_.size(); ++k)
      base_[k + 1] = base_[k] + enthalpy(pieces_[k], pieces_[k].to) -
                     enthalpy(pieces_[k], pieces_[k].from);
  }

  std::string kind() const override { return "gibbs_series"; }
  double lower_temperature() const override { return pieces_.front().from; }
  double upper_temperature() const override { return pieces_.back().to; }
  std::vector<double> breakpoints() const override {
    std::vector<double> points;
    for (std::size_t k = 1; k < pieces_.size(); ++k)
      points.push_back(pieces_[k].from);
    return points;
  }

  ThermalState evaluate(double t) const override {
    std::size_t k = 0;
    while (k + 1 < pieces_.size() && t >= pieces_[k].to)
      ++k;
    const GibbsPiece& p = pieces_[k];
    const double t2 = t * t;
    const double t6 = t2 * t2 * t2;
    const double inv2 = 1.0 / t2;
    const double inv10 = inv2 * inv2 * inv2 * inv2 * inv2;
    ThermalState s;
    s.capacity = -p.c - 2.0 * p.d * t - 6.0 * p.e * t2 - 2.0 * p.f * inv2 -
                 42.0 * p.g * t6 - 90.0 * p.h * inv10 - 12.0 * p.i * t2 * t;
    s.capacity_derivative = -2.0 * p.d - 12.0 * p.e * t + 4.0 * p.f * inv2 / t -
                            252.0 * p.g * t6 / t + 900.0 * p.h * inv10 / t -
                            36.0 * p.i * t2;
    s.energy = base_[k] + enthalpy(p, t) - enthalpy(p, p.from);
    return s;
  }

  std::vector<Parameter> parameters() const override { return {}; }
  ContributionPtr with_parameter(const std::string& name, double) const override {
    detail::unknown_parameter("gibbs_series", name,
                              "none: published coefficients are not fitted");
  }

private:
  // H - a = -c T - d T^2 - 2 e T^3 + 2 f/T - 6 g T^7 + 10 h T^-9 - 3 i T^4
  static double enthalpy(const GibbsPiece& p, double t) {
    const double t2 = t * t;
    const double t3 = t2 * t;
    return -p.c * t - p.d * t2 - 2.0 * p.e * t3 + 2.0 * p.f / t -
           6.0 * p.g * t3 * t3 * t + 10.0 * p.h / (t3 * t3 * t3) - 3.0 * p.i * t2 * t2;
  }

  std::vector<GibbsPiece> pieces_;
  std::vector<double> base_; // J/mol, U at the start of each piece
};

} // namespace

PhaseLayout::PhaseLayout(std::vector<PhaseBoundary> boundaries)
    : boundaries_(std::move(boundaries)) {
  for (std::size_t i = 0; i < boundaries_.size(); ++i) {
    const PhaseBoundary& b = boundaries_[i];
    const std::string name = boundary_name(i);
    detail::require_positive(name, "temperature", b.temperature, "K");
    detail::require_non_negative(name, "latent_heat", b.latent_heat, "J/mol");
    detail::require_positive(name, "width", b.width, "K");
    if (!(b.temperature - 0.5 * b.width > 0.0))
      detail::invalid_parameter(name, "width", b.width, "K",
                                "a width below twice the transition temperature (" +
                                    format_double(2.0 * b.temperature) + " K)");
    if (i > 0) {
      const PhaseBoundary& prev = boundaries_[i - 1];
      if (!(b.temperature > prev.temperature))
        detail::invalid_parameter(name, "temperature", b.temperature, "K",
                                  "a temperature above that of " + boundary_name(i - 1) +
                                      " (" + format_double(prev.temperature) +
                                      " K): phases are listed from cold to hot");
      if (!(b.temperature - 0.5 * b.width > prev.temperature + 0.5 * prev.width))
        detail::invalid_parameter(name, "width", b.width, "K",
                                  "joins that do not overlap: this one starts at " +
                                      format_double(b.temperature - 0.5 * b.width) +
                                      " K, before " + boundary_name(i - 1) + " ends at " +
                                      format_double(prev.temperature + 0.5 * prev.width) +
                                      " K");
    }
  }
}

PhaseLayout::Weight PhaseLayout::weight(double t) const noexcept {
  Weight w;
  for (std::size_t i = 0; i < boundaries_.size(); ++i) {
    const PhaseBoundary& b = boundaries_[i];
    const double x = (t - b.temperature) / b.width + 0.5;
    w.phase = i;
    if (x <= 0.0)
      return w;
    if (x < 1.0) {
      const double u = 1.0 - x;
      w.s = x * x * x * (10.0 + x * (-15.0 + 6.0 * x));
      w.ds = 30.0 * x * x * u * u / b.width;
      w.d2s = 60.0 * x * u * (1.0 - 2.0 * x) / (b.width * b.width);
      return w;
    }
  }
  w.phase = boundaries_.size();
  return w;
}

double PhaseLayout::phase_lower(std::size_t i) const noexcept {
  if (i == 0)
    return 0.0;
  const PhaseBoundary& b = boundaries_[i - 1];
  return b.temperature - 0.5 * b.width;
}

double PhaseLayout::phase_upper(std::size_t i) const noexcept {
  if (i >= boundaries_.size())
    return std::numeric_limits<double>::infinity();
  const PhaseBoundary& b = boundaries_[i];
  return b.temperature + 0.5 * b.width;
}

ContributionPtr
make_phase_sequence(std::vector<std::shared_ptr<const HeatCapacityModel>> phases,
                    PhaseLayout layout) {
  if (phases.size() != layout.phase_count())
    throw InputError::argument("phases", "", std::to_string(phases.size()) + " models",
                               std::to_string(layout.phase_count()) +
                                   " models, one per phase");
  for (std::size_t i = 0; i < phases.size(); ++i) {
    const std::string name = "phase " + std::to_string(i + 1);
    if (!phases[i])
      throw InputError::argument("phases", name, "", "a heat-capacity model");
    const double lo = layout.phase_lower(i);
    const double hi = layout.phase_upper(i);
    const double mlo = phases[i]->lower_temperature();
    const double mhi = phases[i]->upper_temperature();
    // The first phase is evaluated from its model's own lower end, the last to
    // its upper end; inner regions must be covered by the model.
    if ((i > 0 && mlo > lo) || (i + 1 < phases.size() && mhi < hi))
      throw InputError::argument(
          "phases", name, format_double(mlo) + " K to " + format_double(mhi) + " K",
          "a model defined over its region with the joins, " + format_double(lo) +
              " K to " + format_double(hi) + " K");
  }
  return std::make_shared<PhaseSequence>(std::move(phases), std::move(layout));
}

ConductivityPtr make_phase_conductivity(std::vector<ConductivityPtr> phases,
                                        PhaseLayout layout) {
  if (phases.size() != layout.phase_count())
    throw InputError::argument(
        "phase conductivity", "", std::to_string(phases.size()) + " models",
        std::to_string(layout.phase_count()) + " models, one per phase");
  for (std::size_t i = 0; i < phases.size(); ++i)
    if (!phases[i])
      throw InputError::argument("phase conductivity", "phase " + std::to_string(i + 1),
                                 "", "a conductivity model");
  return std::make_shared<PhaseConductivity>(std::move(phases), std::move(layout));
}

ContributionPtr make_gibbs_series(std::vector<GibbsPiece> pieces) {
  if (pieces.empty())
    throw InputError::argument("gibbs_series", "pieces", "", "at least one piece");
  for (std::size_t k = 0; k < pieces.size(); ++k) {
    const GibbsPiece& p = pieces[k];
    const std::string name = "piece " + std::to_string(k + 1);
    detail::require_positive("gibbs_series", name + " from", p.from, "K");
    if (!(p.to > p.from))
      detail::invalid_parameter("gibbs_series", name + " to", p.to, "K",
                                "a temperature above its start (" +
                                    format_double(p.from) + " K)");
    if (k > 0 && p.from != pieces[k - 1].to)
      detail::invalid_parameter("gibbs_series", name + " from", p.from, "K",
                                "the end of the piece before (" +
                                    format_double(pieces[k - 1].to) + " K)");
    for (double v : {p.c, p.d, p.e, p.f, p.g, p.h, p.i})
      if (!std::isfinite(v))
        detail::invalid_parameter("gibbs_series", name, v, "",
                                  "finite coefficients c to i");
  }
  return std::make_shared<GibbsSeries>(std::move(pieces));
}

} // namespace quantacal
