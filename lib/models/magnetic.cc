// SPDX-License-Identifier: Apache-2.0
// The magnetic-ordering term: Inden's function as simplified by Hillert and Jarl
// (CALPHAD 2 (1978) 227), in the form of the SGTE unary database (Dinsdale,
// CALPHAD 15 (1991) 317). Formulas, derivation and accuracy: docs/theory.md,
// "Magnetic ordering".
//
// With K = R ln(beta + 1), tau = T/T*, q = 1/p - 1, a = (474/497) q and
// D = 518/1125 + (11692/15975) q, the published G = R T ln(beta + 1) g(tau) gives
//   tau < 1:  C = (K a/D) (2 tau^3 + 2 tau^9/3 + 2 tau^15/5)
//             U = (K T* a/D) (tau^4/2 + tau^10/15 + tau^16/40)
//   tau >= 1: C = (K/D) (2 s^5 + 2 s^15/3 + 2 s^25/5),  s = 1/tau
//             U = (K T*/D) [(79/140) q + (1 - s^2) ((1 + s^2)/2 + S7/21 + S12/60)]
// with S_n = sum_{k<n} s^2k (so (1 - s^2) S_n = 1 - s^2n). U(0) = 0, U is continuous
// at T* where C jumps by the factor a, and U -> (79/140) K T*/(p D) as T -> inf.
//
// Branches: the crossover is T*, a true discontinuity of C (listed as a breakpoint),
// chosen on T itself: T < T* is the ordered branch, and T* itself takes the
// paramagnetic (right) limit of C, as PropertyTable does at every breakpoint
// (T >= split), so the table and the exact model agree at T*; one ulp below T* gives
// the peak C(T*-). U is continuous, so U(T*) is the same from both sides. Each branch
// is a polynomial in tau or in s = T*/T with positive terms only, so nothing cancels:
// 1 - s^2 is (1 - s)(1 + s) with 1 - s = (T - T*)/T, exact near T*. No negative power
// is formed (tau^-25 never is); for large tau the powers of s underflow to 0 and U
// tends to its limit.
#include "validation.h"

#include <quantacal/models/contribution.h>

#include <cmath>

namespace quantacal {
namespace {

// Constants of the Hillert-Jarl function (Dinsdale 1991, eq. for g(tau)).
constexpr double d_constant = 518.0 / 1125.0;
constexpr double d_slope = 11692.0 / 15975.0;
constexpr double a_slope = 474.0 / 497.0;
constexpr double enthalpy_above = 79.0 / 140.0; // = 1/2 + 1/21 + 1/60

/** sum_{k=0}^{n-1} x^k by Horner. */
double geometric_sum(double x, int n) {
  double s = 1.0;
  for (int k = 1; k < n; ++k)
    s = s * x + 1.0;
  return s;
}

class Magnetic final : public Contribution {
public:
  Magnetic(double tc, double moment, double p)
      : tc_(tc), moment_(moment), p_(p), q_((1.0 - p) / p),
        k_(gas_constant * std::log1p(moment)), d_(d_constant + d_slope * q_),
        a_(a_slope * q_) {}

  std::string kind() const override { return "magnetic"; }
  std::vector<double> breakpoints() const override { return {tc_}; }

  ThermalState evaluate(double t) const override {
    return t < tc_ ? ordered(t) : disordered(t);
  }

  std::vector<Parameter> parameters() const override {
    return {{"critical_temperature", tc_, "K"},
            {"moment", moment_, "1"},
            {"structure_factor", p_, "1"}};
  }
  ContributionPtr with_parameter(const std::string& name, double value) const override {
    if (name == "critical_temperature")
      return make_magnetic(value, moment_, p_);
    if (name == "moment")
      return make_magnetic(tc_, value, p_);
    if (name == "structure_factor")
      return make_magnetic(tc_, moment_, value);
    detail::unknown_parameter("magnetic", name,
                              "critical_temperature, moment, structure_factor");
  }

private:
  // T < T*: polynomials in tau^6 around tau^3 (C), tau^2 (dC/dT), tau^4 (U).
  ThermalState ordered(double t) const {
    const double tau = t / tc_;
    const double t2 = tau * tau;
    const double t3 = t2 * tau;
    const double t6 = t3 * t3;
    const double f = k_ * a_ / d_;
    ThermalState s;
    s.capacity = f * t3 * (2.0 + t6 * (2.0 / 3.0 + t6 * (2.0 / 5.0)));
    s.capacity_derivative = 6.0 * f / tc_ * t2 * (1.0 + t6 * (1.0 + t6));
    s.energy = f * tc_ * t2 * t2 * (0.5 + t6 * (1.0 / 15.0 + t6 * (1.0 / 40.0)));
    return s;
  }

  // T >= T*: polynomials in s^10 around s^5 (C), s^6 (dC/dT); U from 1 - s^2n.
  ThermalState disordered(double t) const {
    const double s = tc_ / t;
    const double s2 = s * s;
    const double s5 = s2 * s2 * s;
    const double s10 = s5 * s5;
    const double one_minus_s = (t - tc_) / t;
    const double one_minus_s2 = one_minus_s * (1.0 + s);
    const double f = k_ / d_;
    ThermalState r;
    r.capacity = f * s5 * (2.0 + s10 * (2.0 / 3.0 + s10 * (2.0 / 5.0)));
    r.capacity_derivative = -10.0 * f / tc_ * s5 * s * (1.0 + s10 * (1.0 + s10));
    r.energy = f * tc_ *
               (enthalpy_above * q_ +
                one_minus_s2 * (0.5 * (1.0 + s2) + geometric_sum(s2, 7) / 21.0 +
                                geometric_sum(s2, 12) / 60.0));
    return r;
  }

  double tc_;     // T*, K
  double moment_; // beta, Bohr magnetons per atom
  double p_;      // structure factor
  double q_;      // 1/p - 1
  double k_;      // R ln(beta + 1), J/mol/K
  double d_;      // D
  double a_;      // (474/497) (1/p - 1)
};

} // namespace

ContributionPtr make_magnetic(double critical_temperature, double moment,
                              double structure_factor) {
  detail::require_positive("magnetic", "critical_temperature", critical_temperature, "K");
  detail::require_positive("magnetic", "moment", moment, "1");
  if (!(structure_factor > 0.0 && structure_factor < 1.0))
    detail::invalid_parameter("magnetic", "structure_factor", structure_factor, "1",
                              "0 < p < 1 (0.40 for bcc, 0.28 for other structures)");
  return std::make_shared<Magnetic>(critical_temperature, moment, structure_factor);
}

} // namespace quantacal
