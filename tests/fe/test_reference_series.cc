// SPDX-License-Identifier: Apache-2.0
// Tests of the exact convection series (tests/fe/reference/conduction_series.h)
// against published coefficients and exact limits. Nothing here runs the solver.
#include "reference/conduction_series.h"

#include <boost/math/constants/constants.hpp>
#include <boost/math/quadrature/gauss_kronrod.hpp>
#include <boost/math/special_functions/bessel.hpp>
#include <boost/math/special_functions/erf.hpp>

#include <gtest/gtest.h>

#include <cmath>
#include <cstddef>

namespace {

using quantacal::reference::ConvectionSeries;
using quantacal::reference::Geometry;
constexpr double pi = boost::math::constants::pi<double>();

struct OneTermRow {
  Geometry geometry;
  double biot;
  double zeta1;
  double c1;
};

// Incropera and DeWitt, Fundamentals of Heat and Mass Transfer, Table 5.1 (values
// computed from its eigen-equations, which match the printed table from memory); printed
// to 4 decimals, so the tolerance is half a unit in the last place.
const OneTermRow table_5_1[] = {
    {Geometry::plane_wall, 0.1, 0.3111, 1.0161},  // Incropera and DeWitt, Table 5.1
    {Geometry::plane_wall, 1.0, 0.8603, 1.1191},  // Incropera and DeWitt, Table 5.1
    {Geometry::plane_wall, 10.0, 1.4289, 1.2620}, // Incropera and DeWitt, Table 5.1
    {Geometry::cylinder, 0.1, 0.4417, 1.0246},    // Incropera and DeWitt, Table 5.1
    {Geometry::cylinder, 1.0, 1.2558, 1.2071},    // Incropera and DeWitt, Table 5.1
    {Geometry::cylinder, 10.0, 2.1795, 1.5677},   // Incropera and DeWitt, Table 5.1
    {Geometry::sphere, 0.1, 0.5423, 1.0298},      // Incropera and DeWitt, Table 5.1
    {Geometry::sphere, 1.0, 1.5708, 1.2732},      // Incropera and DeWitt, Table 5.1
    {Geometry::sphere, 10.0, 2.8363, 1.9249},     // Incropera and DeWitt, Table 5.1
};

const Geometry all_geometries[] = {Geometry::plane_wall, Geometry::cylinder,
                                   Geometry::sphere};

TEST(ReferenceSeries, FirstEigenvalueAndCoefficientMatchTable51) {
  for (const auto& row : table_5_1) {
    const ConvectionSeries s(row.geometry, row.biot, 4);
    EXPECT_NEAR(s.eigenvalue(0), row.zeta1, 0.5e-4) << "Bi = " << row.biot;
    EXPECT_NEAR(s.coefficient(0), row.c1, 0.5e-4) << "Bi = " << row.biot;
  }
}

TEST(ReferenceSeries, EigenvaluesSatisfyTheEigenEquations) {
  // The eigen-equations as printed (Incropera and DeWitt, sec. 5.5; Carslaw and
  // Jaeger, ch. 3, 7, 9), not in the rearranged form the root finder uses.
  for (const double bi : {0.1, 1.0, 10.0}) {
    const ConvectionSeries wall(Geometry::plane_wall, bi, 50);
    const ConvectionSeries cyl(Geometry::cylinder, bi, 50);
    const ConvectionSeries sph(Geometry::sphere, bi, 50);
    for (std::size_t n = 0; n < 50; ++n) {
      const double zw = wall.eigenvalue(n);
      EXPECT_NEAR(zw * std::tan(zw), bi, 1e-9 * bi * (1 + zw)) << n;
      const double zc = cyl.eigenvalue(n);
      EXPECT_NEAR(zc * boost::math::cyl_bessel_j(1, zc) /
                      boost::math::cyl_bessel_j(0, zc),
                  bi, 1e-9 * bi * (1 + zc))
          << n;
      const double zs = sph.eigenvalue(n);
      EXPECT_NEAR(1.0 - zs / std::tan(zs), bi, 1e-9 * (1 + zs)) << n;
      if (n > 0) { // one root per interval, ascending
        EXPECT_GT(zw, wall.eigenvalue(n - 1));
        EXPECT_GT(zc, cyl.eigenvalue(n - 1));
        EXPECT_GT(zs, sph.eigenvalue(n - 1));
      }
    }
  }
}

TEST(ReferenceSeries, SphereAtBiotOneHasOddMultiplesOfHalfPi) {
  // 1 - zeta cot zeta = 1 means cot zeta = 0: zeta_n = (2n - 1) pi / 2 exactly
  // (follows from the eigen-equation, Carslaw and Jaeger ch. 9).
  const ConvectionSeries s(Geometry::sphere, 1.0, 20);
  for (std::size_t n = 0; n < 20; ++n)
    EXPECT_NEAR(s.eigenvalue(n), (2.0 * n + 1.0) * pi / 2.0, 1e-13 * (n + 1));
}

TEST(ReferenceSeries, LargeBiotGivesFixedSurfaceTemperatureSeries) {
  // Bi -> inf: the surface is held at T_inf. Carslaw and Jaeger's series for a
  // prescribed surface temperature: slab zeta_n = (n - 1/2) pi, C_n = 4 (-1)^(n+1) /
  // ((2n - 1) pi) (ch. 3); cylinder zeta_n = j_{0,n}, C_n = 2 / (j_{0,n} J1(j_{0,n}))
  // (ch. 7); sphere zeta_n = n pi, C_n = 2 (-1)^(n+1) (ch. 9).
  const double bi = 1e10;
  const ConvectionSeries wall(Geometry::plane_wall, bi, 10);
  const ConvectionSeries cyl(Geometry::cylinder, bi, 10);
  const ConvectionSeries sph(Geometry::sphere, bi, 10);
  for (std::size_t i = 0; i < 10; ++i) {
    const double n = static_cast<double>(i + 1);
    const double sign = (i % 2 == 0) ? 1.0 : -1.0;
    // The deviation from the limit is O(zeta_n/Bi); measured 3.1e-9 (zeta), 2e-16 (C).
    EXPECT_NEAR(wall.eigenvalue(i), (n - 0.5) * pi, 1e-8);
    EXPECT_NEAR(wall.coefficient(i), 4.0 * sign / ((2.0 * n - 1.0) * pi), 1e-8);
    const double j0n = boost::math::cyl_bessel_j_zero(0.0, static_cast<int>(i + 1));
    EXPECT_NEAR(cyl.eigenvalue(i), j0n, 1e-8);
    EXPECT_NEAR(cyl.coefficient(i), 2.0 / (j0n * boost::math::cyl_bessel_j(1, j0n)),
                1e-8);
    EXPECT_NEAR(sph.eigenvalue(i), n * pi, 1e-8);
    EXPECT_NEAR(sph.coefficient(i), 2.0 * sign, 1e-8);
  }
}

TEST(ReferenceSeries, SmallBiotGivesLumpedCapacitance) {
  // Bi -> 0: theta* -> exp(-(A L/V) Bi Fo), i.e. zeta_1^2 -> (A L / V) Bi with
  // A L/V = 1, 2, 3 (Incropera and DeWitt, sec. 5.1-5.2, lumped capacitance).
  // The relative correction is O(Bi); measured 3.3e-7 at Bi = 1e-6.
  const double bi = 1e-6;
  for (const Geometry g : all_geometries) {
    const ConvectionSeries s(g, bi, 2);
    EXPECT_NEAR(s.eigenvalue(0) * s.eigenvalue(0) / (s.shape_factor() * bi), 1.0, 1e-6);
    EXPECT_NEAR(s.coefficient(0), 1.0, 1e-6);
  }
}

TEST(ReferenceSeries, ShortTimeGivesTheInitialTemperatureInside) {
  // Fo -> 0: theta* -> 1 away from the surface (the initial condition).
  // At Fo = 1e-3 the cooled layer is ~sqrt(Fo) = 0.03 thick, so at x* <= 0.5 the
  // exact deviation is below erfc(0.5 / (2 sqrt(Fo))) ~ 1e-27; what remains is
  // the truncation and rounding of 100 terms (measured 3.7e-14).
  for (const Geometry g : all_geometries)
    for (const double bi : {1.0, 10.0}) {
      const ConvectionSeries s(g, bi, 100);
      EXPECT_NEAR(s.temperature(0.0, 1e-3), 1.0, 1e-12);
      EXPECT_NEAR(s.temperature(0.5, 1e-3), 1.0, 1e-12);
    }
}

TEST(ReferenceSeries, ShortTimeSurfaceMatchesSemiInfiniteSolid) {
  // Semi-infinite solid with surface convection (Carslaw and Jaeger sec. 2.7;
  // Incropera and DeWitt eq. 5.60, case 3): at the surface
  // theta* = exp(beta^2) erfc(beta), beta = Bi sqrt(Fo). A slab at Fo = 1e-4 is
  // semi-infinite to ~1e-40 (the other face is 2 / sqrt(Fo) = 200 lengths away).
  // Measured 1.2e-15.
  const double fo = 1e-4;
  for (const double bi : {1.0, 10.0}) {
    const ConvectionSeries s(Geometry::plane_wall, bi,
                             600); // exp(-(600 pi)^2 Fo) ~ 1e-154
    const double beta = bi * std::sqrt(fo);
    const double expected = std::exp(beta * beta) * boost::math::erfc(beta);
    EXPECT_NEAR(s.temperature(1.0, fo), expected, 1e-11) << "Bi = " << bi;
    // and inside the penetration depth: erfc(eta) - exp(Bi x + beta^2) erfc(eta + beta)
    // in the form theta* = 1 - that expression (same source), depth 0.01 L
    const double xi = 0.01; // distance from the surface / L
    const double eta = xi / (2.0 * std::sqrt(fo));
    const double inside =
        1.0 - (boost::math::erfc(eta) -
               std::exp(bi * xi + beta * beta) * boost::math::erfc(eta + beta));
    EXPECT_NEAR(s.temperature(1.0 - xi, fo), inside, 1e-11) << "Bi = " << bi;
  }
}

TEST(ReferenceSeries, CoefficientsAreTheProjectionOfTheInitialCondition) {
  // C_n = int_0^1 w X(zeta_n x) dx / int_0^1 w X^2 dx with w = 1, x, x^2 (the
  // orthogonal expansion of theta*(x, 0) = 1; Carslaw and Jaeger ch. 3, 7, 9),
  // computed with Boost.Math Gauss-Kronrod quadrature, independent of the closed
  // forms. Measured agreement 7.1e-15; tolerance 1e-13.
  using boost::math::quadrature::gauss_kronrod;
  for (const Geometry g : all_geometries)
    for (const double bi : {0.1, 1.0, 10.0}) {
      const ConvectionSeries s(g, bi, 10);
      const int w = g == Geometry::plane_wall ? 0 : (g == Geometry::cylinder ? 1 : 2);
      for (std::size_t n = 0; n < 10; ++n) {
        const double z = s.eigenvalue(n);
        const auto num = [&](double x) {
          return std::pow(x, w) * s.eigenfunction(z * x);
        };
        const auto den = [&](double x) {
          const double X = s.eigenfunction(z * x);
          return std::pow(x, w) * X * X;
        };
        const double c = gauss_kronrod<double, 61>::integrate(num, 0.0, 1.0, 10, 1e-13) /
                         gauss_kronrod<double, 61>::integrate(den, 0.0, 1.0, 10, 1e-13);
        EXPECT_NEAR(s.coefficient(n), c, 1e-13) << "n = " << n << ", Bi = " << bi;
      }
    }
}

TEST(ReferenceSeries, MeanTemperatureObeysTheEnergyBalance) {
  // Energy balance of the body, rho c V d(mean T)/dt = -h A (T_s - T_inf), in
  // dimensionless form d(mean theta*)/dFo = -(A L/V) Bi theta*(1, Fo)
  // (Incropera and DeWitt, sec. 5.5). Central difference with step 1e-5:
  // truncation ~ zeta^4 * 1e-10 / 6, measured 1.2e-9 relative.
  for (const Geometry g : all_geometries)
    for (const double bi : {1.0, 10.0}) {
      const ConvectionSeries s(g, bi, 100);
      for (const double fo : {0.2, 1.0}) {
        const double d = 1e-5;
        const double rate =
            (s.mean_temperature(fo + d) - s.mean_temperature(fo - d)) / (2 * d);
        const double flux = s.shape_factor() * bi * s.temperature(1.0, fo);
        EXPECT_NEAR(rate, -flux, 1e-7 * flux) << "Fo = " << fo << ", Bi = " << bi;
      }
    }
}

TEST(ReferenceSeries, OneTermFormAtLargeAndModerateFourierNumber) {
  for (const Geometry g : all_geometries)
    for (const double bi : {0.1, 1.0, 10.0}) {
      const ConvectionSeries s(g, bi, 100);
      // Large Fo: the higher terms have decayed like exp(-(zeta_2^2 - zeta_1^2) Fo),
      // below 1e-12 at Fo = 3 for every case here (measured 2e-15 relative).
      for (const double x : {0.0, 0.5, 1.0})
        EXPECT_NEAR(s.temperature(x, 3.0) / s.one_term_temperature(x, 3.0), 1.0, 1e-11);
      // Fo = 0.2: Incropera and DeWitt (sec. 5.5.2) state that the one-term form
      // is within 2 % of the series for Fo > 0.2 (from memory). Measured worst
      // 1.45 % of (T_i - T_inf) (plane wall, Bi = 1, centre).
      for (const double x : {0.0, 1.0})
        EXPECT_NEAR(s.one_term_temperature(x, 0.2), s.temperature(x, 0.2), 0.02);
    }
}

TEST(ReferenceSeries, TruncationIsNegligibleFromFourierOneFifth) {
  // 100 terms against 400 terms at the validation's Fourier numbers.
  for (const Geometry g : all_geometries)
    for (const double bi : {1.0, 10.0}) {
      const ConvectionSeries a(g, bi, 100), b(g, bi, 400);
      for (const double fo : {0.2, 1.0})
        for (const double x : {0.0, 0.5, 1.0})
          EXPECT_NEAR(a.temperature(x, fo), b.temperature(x, fo), 1e-15);
    }
}

TEST(ReferenceSeries, RejectsNonPhysicalInput) {
  EXPECT_THROW(ConvectionSeries(Geometry::sphere, 0.0), std::invalid_argument);
  EXPECT_THROW(ConvectionSeries(Geometry::sphere, -1.0), std::invalid_argument);
  EXPECT_THROW(ConvectionSeries(Geometry::sphere, 1.0, 0), std::invalid_argument);
}

} // namespace
