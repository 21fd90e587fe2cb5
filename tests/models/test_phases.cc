// SPDX-License-Identifier: Apache-2.0
// Phase sequences and the Gibbs-energy series (include/quantacal/models/phases.h)
// against independent references: the SGTE Gibbs energy of aluminium written out
// here with all its terms (Dinsdale, CALPHAD 15 (1991) 317) and differentiated by
// Richardson differences; Boost.Math quadrature of the joined capacity; the
// identities the join was built on (exact energy, the latent heat as the step
// between the phases' energies, C and dC/dT continuous at the join's ends).
#include "support.h"

#include <quantacal/common/exceptions.h>
#include <quantacal/models/heat_capacity_model.h>
#include <quantacal/models/phases.h>

#include <gtest/gtest.h>

#include <cmath>
#include <memory>
#include <vector>

namespace {

using namespace quantacal;
using quantacal_test::integrate;
using quantacal_test::relative_difference;
using quantacal_test::richardson_derivative;

// GHSERAL, the full published function (Dinsdale 1991), J/mol:
// 298.15-700 K, 700-933.47 K, 933.47-2900 K.
double ghser_al(double t) {
  const double l = std::log(t);
  if (t < 700.0)
    return -7976.15 + 137.093038 * t - 24.3671976 * t * l - 1.884662e-3 * t * t -
           8.77664e-7 * t * t * t + 74092.0 / t;
  if (t < 933.47)
    return -11276.24 + 223.048446 * t - 38.5844296 * t * l + 18.531982e-3 * t * t -
           5.764227e-6 * t * t * t + 74092.0 / t;
  return -11278.378 + 188.684153 * t - 31.748192 * t * l - 1.230524e28 * std::pow(t, -9);
}

// H = G - T dG/dT and C = -T d2G/dT2 by Richardson differences of G.
double enthalpy_from_g(double t) {
  return ghser_al(t) - t * richardson_derivative(ghser_al, t, 0.5);
}
double capacity_from_g(double t) {
  return -t *
         richardson_derivative(
             [](double x) { return richardson_derivative(ghser_al, x, 0.5); }, t, 0.5);
}

ContributionPtr ghser_al_series() {
  return make_gibbs_series(
      {{298.15, 700.0, -24.3671976, -1.884662e-3, -0.877664e-6, 74092},
       {700.0, 933.47, -38.5844296, 18.531982e-3, -5.764227e-6, 74092},
       {933.47, 2900.0, -31.748192, 0, 0, 0, 0, -1.230524e28}});
}

TEST(GibbsSeries, CapacityIsMinusTTimesTheSecondDerivativeOfG) {
  const ContributionPtr s = ghser_al_series();
  for (double t : {300.0, 450.0, 650.0, 750.0, 900.0, 1000.0, 2000.0}) {
    const ThermalState st = s->evaluate(t);
    EXPECT_LT(relative_difference(st.capacity, capacity_from_g(t)), 1e-6) << t;
    const double dc =
        richardson_derivative([&](double x) { return s->evaluate(x).capacity; }, t, 0.5);
    EXPECT_LT(std::fabs(st.capacity_derivative - dc), 1e-8 * st.capacity) << t;
  }
}

TEST(GibbsSeries, EnergyIsTheEnthalpyOfGAcrossItsPieces) {
  const ContributionPtr s = ghser_al_series();
  const double u0 = s->evaluate(400.0).energy;
  const double h0 = enthalpy_from_g(400.0);
  for (double t : {500.0, 690.0, 710.0, 920.0, 950.0, 1500.0}) {
    const double du = s->evaluate(t).energy - u0;
    const double dh = enthalpy_from_g(t) - h0;
    EXPECT_LT(std::fabs(du - dh), 1e-6 * dh) << t;
  }
  EXPECT_EQ(s->lower_temperature(), 298.15);
  EXPECT_EQ(s->upper_temperature(), 2900.0);
  EXPECT_EQ(s->breakpoints(), (std::vector<double>{700.0, 933.47}));
  EXPECT_EQ(s->evaluate(298.15).energy, 0.0);
}

// GHSERWW (tungsten, 298.15-3695 K, Dinsdale 1991), the one element function
// here with a T^4 term: C and H against G written out and differentiated.
double ghser_w(double t) {
  return -7646.311 + 130.4 * t - 24.1 * t * std::log(t) - 1.936e-3 * t * t +
         2.07e-7 * t * t * t - 5.33e-11 * t * t * t * t + 44500.0 / t;
}

TEST(GibbsSeries, TheTFourthTermOfTungsten) {
  GibbsPiece w{298.15, 3695.0, -24.1, -1.936e-3, 2.07e-7, 44500.0};
  w.i = -5.33e-11;
  const ContributionPtr s = make_gibbs_series({w});
  const auto h = [](double t) {
    return ghser_w(t) - t * richardson_derivative(ghser_w, t, 0.5);
  };
  for (double t : {400.0, 1500.0, 3000.0}) {
    const double c =
        -t * richardson_derivative(
                 [](double x) { return richardson_derivative(ghser_w, x, 0.5); }, t, 0.5);
    EXPECT_LT(relative_difference(s->evaluate(t).capacity, c), 1e-6) << t;
    const double du = s->evaluate(t).energy - s->evaluate(400.0).energy;
    if (t > 400.0)
      EXPECT_LT(std::fabs(du - (h(t) - h(400.0))), 1e-6 * du) << t;
    const double dc =
        richardson_derivative([&](double x) { return s->evaluate(x).capacity; }, t, 0.5);
    EXPECT_LT(std::fabs(s->evaluate(t).capacity_derivative - dc), 1e-8 * c) << t;
  }
}

TEST(GibbsSeries, RejectsGapsEmptyPiecesAndNonFiniteCoefficients) {
  EXPECT_THROW(make_gibbs_series({}), InputError);
  EXPECT_THROW(make_gibbs_series({{300, 700, -24}, {710, 900, -24}}), InputError);
  EXPECT_THROW(make_gibbs_series({{300, 300, -24}}), InputError);
  EXPECT_THROW(make_gibbs_series({{300, 700, std::nan("")}}), InputError);
  EXPECT_THROW(make_gibbs_series({{-1, 700, -24}}), InputError);
}

// Two phases of different lattices, joined at 300 K with L = 1000 J/mol over 20 K.
struct TwoPhases {
  std::shared_ptr<const HeatCapacityModel> a = std::make_shared<const HeatCapacityModel>(
      "a", std::vector<ContributionPtr>{make_debye(400.0), make_electronic(1e-3)});
  std::shared_ptr<const HeatCapacityModel> b = std::make_shared<const HeatCapacityModel>(
      "b", std::vector<ContributionPtr>{make_einstein(250.0), make_electronic(3e-3)});
  PhaseLayout layout{{{300.0, 1000.0, 20.0}}};
  ContributionPtr joined = make_phase_sequence({a, b}, layout);
};

TEST(PhaseSequence, IsEachPhaseOutsideTheJoin) {
  const TwoPhases p;
  for (double t : {10.0, 100.0, 289.9}) {
    const ThermalState s = p.joined->evaluate(t);
    EXPECT_EQ(s.capacity, p.a->evaluate(t).capacity) << t;
    EXPECT_EQ(s.energy, p.a->evaluate(t).energy) << t;
  }
  for (double t : {310.1, 500.0, 2000.0})
    EXPECT_EQ(p.joined->evaluate(t).capacity, p.b->evaluate(t).capacity) << t;
}

TEST(PhaseSequence, LatentHeatIsTheEnergyStepBetweenThePhasesAtTheTransition) {
  const TwoPhases p;
  // Above the join U = U_b + offset with U_b(Tt) + offset - U_a(Tt) = L exactly.
  const double t1 = 250.0, t2 = 350.0;
  const double expected = (p.a->evaluate(300.0).energy - p.a->evaluate(t1).energy) +
                          1000.0 +
                          (p.b->evaluate(t2).energy - p.b->evaluate(300.0).energy);
  const double got = p.joined->evaluate(t2).energy - p.joined->evaluate(t1).energy;
  EXPECT_LT(std::fabs(got - expected), 1e-9 * expected);
}

TEST(PhaseSequence, CapacityIntegratesToTheEnergyThroughTheJoin) {
  const TwoPhases p;
  const auto c = [&](double t) { return p.joined->evaluate(t).capacity; };
  for (auto [t1, t2] :
       {std::pair{250.0, 350.0}, std::pair{295.0, 305.0}, std::pair{290.0, 301.0}}) {
    const double quad = integrate(c, t1, t2, {290.0, 300.0, 310.0});
    const double du = p.joined->evaluate(t2).energy - p.joined->evaluate(t1).energy;
    EXPECT_LT(relative_difference(quad, du), 1e-12) << t1 << " " << t2;
  }
}

TEST(PhaseSequence, CapacityDerivativeIsExactAndBothAreContinuousAtTheJoinEnds) {
  const TwoPhases p;
  const auto c = [&](double t) { return p.joined->evaluate(t).capacity; };
  for (double t : {291.0, 295.0, 299.0, 300.0, 303.0, 309.0}) {
    const double dc = richardson_derivative(c, t, 0.05);
    EXPECT_LT(std::fabs(p.joined->evaluate(t).capacity_derivative - dc),
              1e-6 * std::fabs(c(t)))
        << t;
  }
  for (double edge : {290.0, 310.0}) {
    const ThermalState below = p.joined->evaluate(edge - 1e-7);
    const ThermalState above = p.joined->evaluate(edge + 1e-7);
    EXPECT_LT(relative_difference(below.capacity, above.capacity), 1e-6) << edge;
    EXPECT_LT(std::fabs(below.capacity_derivative - above.capacity_derivative), 1e-4)
        << edge;
  }
  // The peak of the latent heat: L s'(Tt) = 1.875 L / w on top of the mean capacity.
  const double mean =
      0.5 * (p.a->evaluate(300.0).capacity + p.b->evaluate(300.0).capacity);
  EXPECT_NEAR(c(300.0) - mean, 1.875 * 1000.0 / 20.0, 2.0);
}

TEST(PhaseSequence, ReportsJoinBreakpointsAndItsParameters) {
  const TwoPhases p;
  const std::vector<double> bp = p.joined->breakpoints();
  for (double t : {290.0, 300.0, 310.0})
    EXPECT_NE(std::find(bp.begin(), bp.end(), t), bp.end()) << t;
  const ContributionPtr moved =
      p.joined->with_parameter("phases[1].from.latent_heat", 2000.0);
  EXPECT_NEAR(moved->evaluate(400.0).energy - p.joined->evaluate(400.0).energy, 1000.0,
              1e-9);
  // The terms of a phase are parameters too, by their card paths.
  const ContributionPtr hotter =
      p.joined->with_parameter("phases[0].heat_capacity[0].theta_D", 350.0);
  EXPECT_NEAR(hotter->evaluate(100.0).capacity,
              make_debye(350.0)->evaluate(100.0).capacity + 1e-3 * 100.0, 1e-9);
  bool listed = false;
  for (const Parameter& q : p.joined->parameters())
    listed =
        listed || (q.name == "phases[1].heat_capacity[0].theta_E" && q.value == 250.0);
  EXPECT_TRUE(listed);
  EXPECT_THROW(p.joined->with_parameter("latent", 1.0), InputError);
  EXPECT_THROW(p.joined->with_parameter("phases[0].from.width", 1.0), InputError);
}

TEST(PhaseLayout, RejectsUnorderedOverlappingAndNonPhysicalBoundaries) {
  EXPECT_THROW(PhaseLayout({{300, 10, 20}, {250, 10, 20}}), InputError); // unordered
  EXPECT_THROW(PhaseLayout({{300, 10, 20}, {315, 10, 20}}), InputError); // overlapping
  EXPECT_THROW(PhaseLayout({{300, -1, 20}}), InputError);                // L < 0
  EXPECT_THROW(PhaseLayout({{300, 10, 0}}), InputError);                 // no width
  EXPECT_THROW(PhaseLayout({{5, 10, 20}}), InputError);                  // below 0 K
  EXPECT_NO_THROW(PhaseLayout({{300, 10, 20}, {331, 10, 20}}));
}

TEST(PhaseSequence, RejectsAPhaseModelUndefinedWhereItIsEvaluated) {
  const TwoPhases p;
  const auto series = std::make_shared<const HeatCapacityModel>(
      "series", std::vector<ContributionPtr>{ghser_al_series()});
  // The series starts at 298.15 K; a join centred at 300 K starts at 290 K.
  EXPECT_THROW(make_phase_sequence({p.a, series}, PhaseLayout({{300.0, 0.0, 20.0}})),
               InputError);
  EXPECT_NO_THROW(make_phase_sequence({p.a, series}, PhaseLayout({{340.0, 0.0, 60.0}})));
  EXPECT_THROW(make_phase_sequence({p.a}, PhaseLayout({{340.0, 0.0, 60.0}})), InputError);
}

TEST(PhaseConductivity, BlendsTheValuesAndDifferentiatesTheBlend) {
  const PhaseLayout layout({{500.0, 0.0, 10.0}});
  const ConductivityPtr k = make_phase_conductivity(
      {make_table_conductivity({100, 600}, {200, 150}), make_constant_conductivity(90)},
      layout);
  EXPECT_NEAR(k->evaluate(400.0).value,
              make_table_conductivity({100, 600}, {200, 150})->evaluate(400.0).value,
              1e-12);
  EXPECT_EQ(k->evaluate(506.0).value, 90.0);
  for (double t : {496.0, 500.0, 503.0}) {
    const double d =
        richardson_derivative([&](double x) { return k->evaluate(x).value; }, t, 0.01);
    EXPECT_NEAR(k->evaluate(t).derivative, d, 1e-6 * 150) << t;
  }
  EXPECT_THROW(make_phase_conductivity({make_constant_conductivity(90)}, layout),
               InputError);
}

} // namespace
