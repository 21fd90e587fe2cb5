// SPDX-License-Identifier: Apache-2.0
/**
 * @file contribution.h
 * @brief One additive term of a heat-capacity model, and the concrete terms.
 *
 * A heat-capacity model is a sum of contributions (docs/theory.md).
 * Each contribution gives the molar capacity C(T), its derivative dC/dT and
 * its thermal energy U(T) = int_0^T C dT' (closed form or an accurate special
 * function), with stable branches at small and large x = theta/T.
 * Contributions do not check their argument: HeatCapacityModel does, once,
 * and raises a RangeError naming the material.
 */
#ifndef QUANTACAL_MODELS_CONTRIBUTION_H
#define QUANTACAL_MODELS_CONTRIBUTION_H

#include <quantacal/models/thermal_state.h>

#include <limits>
#include <memory>
#include <string>
#include <vector>

namespace quantacal {

/** A named numeric parameter of a contribution, in SI units. */
struct Parameter {
  /// name within the contribution, the same as its card key: "theta_D", "theta_E",
  /// "modes", "gamma", "gap", "degeneracy_ratio", "centres", "temperature",
  /// "latent_heat", "width", "A".."E" (shomate), "mole_fraction" (scaled),
  /// "critical_temperature", "moment", "structure_factor" (magnetic)
  std::string name;
  double value;     ///< SI value
  std::string unit; ///< SI unit of @p value, e.g. "K", "J/mol/K^2", "1"
};

/** Base class of the additive heat-capacity terms. Immutable once built. */
class Contribution {
public:
  virtual ~Contribution() = default;

  /** Kind as written in cards: "einstein", "debye", "electronic", ... */
  virtual std::string kind() const = 0;

  /**
   * @param temperature T in K, > 0 and inside [lower_temperature(), upper_temperature()]
   * @return U (J/mol), C (J/mol/K), dC/dT (J/mol/K^2)
   */
  virtual ThermalState evaluate(double temperature) const = 0;

  /** Lowest temperature of definition, K; 0 means defined down to 0 K. */
  virtual double lower_temperature() const { return 0.0; }
  /** Highest temperature of definition, K. */
  virtual double upper_temperature() const {
    return std::numeric_limits<double>::infinity();
  }

  /** Non-smooth points or narrow peaks, K (see ThermalModel::breakpoints). */
  virtual std::vector<double> breakpoints() const { return {}; }

  /**
   * True if the term is part of the constant-volume capacity C_v to which a
   * dilation correction applies (einstein, debye, electronic). Terms that
   * already describe C_p (transition, tabulated, shomate, a scaled component
   * model) return false.
   */
  virtual bool dilated() const { return false; }

  /** Numeric parameters, by name, in SI units (used by fitting and reports). */
  virtual std::vector<Parameter> parameters() const = 0;

  /**
   * A copy with one parameter changed.
   * @param name a name from parameters()
   * @param value the new SI value
   * @throws InputError for an unknown name or a non-physical value
   */
  virtual std::shared_ptr<const Contribution> with_parameter(const std::string& name,
                                                             double value) const = 0;
};

using ContributionPtr = std::shared_ptr<const Contribution>;

/**
 * Einstein oscillators: C = n R x^2 e^x/(e^x-1)^2, U = n R theta/(e^x-1), x = theta/T.
 * @param theta Einstein temperature theta_E, K (> 0)
 * @param modes number of oscillator modes per formula unit n (3 per atom), > 0
 */
ContributionPtr make_einstein(double theta, double modes = 3.0);

/**
 * Debye lattice: C = n R [4 D3(x) - 3x/(e^x-1)], U = n R T D3(x), with
 * D3(x) = 3 x^-3 int_0^x t^3/(e^t-1) dt.
 * @param theta Debye temperature theta_D, K (> 0)
 * @param modes number of modes per formula unit n (3 per atom), > 0
 */
ContributionPtr make_debye(double theta, double modes = 3.0);

/**
 * Conduction electrons (Sommerfeld): C = gamma T, U = gamma T^2/2.
 * @param gamma Sommerfeld coefficient, J/mol/K^2 (>= 0)
 */
ContributionPtr make_electronic(double gamma);

/**
 * Two-level (Schottky) anomaly, per mole of centres:
 * C = n R x^2 g e^-x/(1+g e^-x)^2, U = n R Delta g e^-x/(1+g e^-x), x = Delta/T.
 * @param gap level splitting Delta as a temperature, K (> 0)
 * @param degeneracy_ratio g = g1/g0 (> 0)
 * @param centres n, moles of two-level centres per mole of formula units (> 0)
 */
ContributionPtr make_schottky(double gap, double degeneracy_ratio, double centres);

/**
 * A latent heat spread over a normal distribution (melting, a solid-state
 * transformation): C = L phi((T-Tt)/w)/w, U = L [Phi((T-Tt)/w) - Phi(-Tt/w)].
 * @param temperature transition temperature Tt, K (> 0)
 * @param latent_heat L, J/mol (> 0)
 * @param width standard deviation w, K (> 0)
 */
ContributionPtr make_transition(double temperature, double latent_heat, double width);

/**
 * Magnetic ordering: Inden's function as simplified by Hillert and Jarl (CALPHAD 2
 * (1978) 227), the form of the SGTE unary database (Dinsdale, CALPHAD 15 (1991) 317).
 * With tau = T/T*, K = R ln(beta + 1), q = 1/p - 1, a = (474/497) q and
 * D = 518/1125 + (11692/15975) q:
 * C = (K a/D)(2 tau^3 + 2 tau^9/3 + 2 tau^15/5) for tau < 1 and
 * C = (K/D)(2 tau^-5 + 2 tau^-15/3 + 2 tau^-25/5) for tau >= 1, with U in closed form.
 * C drops by the factor a at T* (a breakpoint; at T* itself the upper value, as a
 * PropertyTable takes it); U and the entropy are continuous there, and the total
 * entropy int_0^inf C/T dT is K. The same function serves antiferromagnets with the
 * Neel temperature and a positive moment.
 * @param critical_temperature Curie or Neel temperature T*, K (> 0)
 * @param moment mean magnetic moment beta, Bohr magnetons per atom (> 0)
 * @param structure_factor p, the fraction of the magnetic enthalpy absorbed above
 *        T*: 0.40 for bcc, 0.28 for fcc, hcp and other structures; 0 < p < 1
 */
ContributionPtr make_magnetic(double critical_temperature, double moment,
                              double structure_factor);

/** How a tabulated or Shomate term gets its energy below its first temperature. */
struct LowerExtension {
  enum class Kind {
    debye_t3, ///< C = C(T1) (T/T1)^3 from 0 to T1, so U(T1) = C(T1) T1 / 4; C defined
              ///< from 0
    energy    ///< U(T1) given (J/mol); the term, and so the model, is undefined below T1
  };
  Kind kind = Kind::debye_t3;
  double energy = 0.0; ///< U at the first temperature, J/mol (Kind::energy only)
};

/**
 * Measured capacity points, joined by a monotone piecewise cubic (Fritsch-
 * Carlson slopes, as Boost.Math's pchip); U is the exact integral of the
 * cubic. Above the last point the term is undefined (the card's range must
 * end there).
 * @param temperatures strictly increasing, K, at least 2
 * @param capacities C at those points, J/mol/K (>= 0)
 * @param below how the energy below the first point is obtained
 */
ContributionPtr make_tabulated(std::vector<double> temperatures,
                               std::vector<double> capacities, LowerExtension below);

/**
 * Shomate polynomial (NIST-JANAF form), t = T/1000:
 * C = A + B t + C t^2 + D t^3 + E/t^2 in J/mol/K, defined on [t_low, t_high];
 * U(T) = U(t_low) + int_{t_low}^T C.
 * @param coefficients A, B, C, D, E (J/mol/K, J/mol/K per kK^n)
 * @param t_low lowest temperature of the fit, K
 * @param t_high highest temperature of the fit, K
 * @param below energy at t_low (Kind::energy) or a Debye T^3 extension to 0 K
 */
ContributionPtr make_shomate(const std::vector<double>& coefficients, double t_low,
                             double t_high, LowerExtension below);

class HeatCapacityModel;

/**
 * A whole component model scaled by a mole fraction (Neumann-Kopp rule for
 * an alloy or compound composed of other cards).
 * @param component the component's model (not changed, shared)
 * @param mole_fraction x in (0, 1]
 */
ContributionPtr make_scaled(std::shared_ptr<const HeatCapacityModel> component,
                            double mole_fraction);

} // namespace quantacal

#endif
