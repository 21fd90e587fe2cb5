// SPDX-License-Identifier: Apache-2.0
/**
 * @file metal_conductivity.h
 * @brief Thermal conductivity of a metal from its electrical resistivity:
 *        residual + Bloch-Grueneisen resistivity, Wiedemann-Franz, optional lattice term.
 *
 * Why it exists: handbook conductivity tables of pure metals hold for one
 * purity only, while below about 50 K the conductivity of copper or aluminium
 * changes tenfold with the residual-resistivity ratio (RRR). This model builds
 * k(T) from a few physical parameters, so a card can state the RRR of the
 * actual hardware. See docs/theory.md, "Conductivity of metals".
 *
 * The model, in SI units (resistivities in Ohm m, conductivities in W/m/K):
 *
 *  - electrical resistivity (Matthiessen's rule)
 *    \f$ \rho(T) = \rho_0 + \rho_{ph}(T) \f$ with the Bloch-Grueneisen (n = 5) term
 *    \f$ \rho_{ph}(T) = C (T/\theta_R)^5 J_5(\theta_R/T) \f$,
 *    \f$ J_n(x) = \int_0^x t^n e^t / (e^t - 1)^2\,dt \f$; the scale C is fixed by
 *    \f$ \rho(T_{ref}) = \rho_{ref} \f$;
 *  - the residual resistivity either given (rho_0) or from the residual-resistivity
 *    ratio \f$ RRR = \rho(273\,K) / \rho(4\,K) \f$ (both sides from the model, solved
 *    exactly together with C);
 *  - electronic thermal resistivity (Wiedemann-Franz for the elastic residual
 *    scattering, optional Wilson inelastic factor B for the phonon scattering)
 *    \f$ W_e = \rho_0/(L_0 T) + \rho_{ph} B(x) / (L_{ph} T) \f$,
 *    \f$ B(x) = 1 + (3/\pi^2) s x^2 - J_7(x) / (2 \pi^2 J_5(x)) \f$, or B = 1 when no
 *    Wilson ratio s is given (plain Wiedemann-Franz), \f$ k_e = 1/W_e \f$;
 *  - optional lattice (phonon) conductivity, phonon-electron and umklapp
 *    scattering in series, \f$ 1/k_g = 1/(a T^2) + b T \f$;
 *  - \f$ k = k_e + k_g \f$.
 *
 * With no Wilson ratio and no lattice term this is k = L0 T / rho(T), the
 * plain Wiedemann-Franz law, known to overestimate k at intermediate
 * temperatures (about theta_R/20 to theta_R/2) where inelastic small-angle
 * electron-phonon scattering lowers the Lorenz ratio.
 */
#ifndef QUANTACAL_MODELS_METAL_CONDUCTIVITY_H
#define QUANTACAL_MODELS_METAL_CONDUCTIVITY_H

#include <quantacal/common/constants.h>
#include <quantacal/models/conductivity.h>
#include <quantacal/models/contribution.h>

#include <memory>
#include <string>
#include <vector>

namespace quantacal {

/** Upper temperature of the residual-resistivity ratio RRR = rho(273 K)/rho(4 K), K. */
inline constexpr double rrr_upper_temperature = 273.0;
/** Lower temperature of the residual-resistivity ratio, K. */
inline constexpr double rrr_lower_temperature = 4.0;

/**
 * Inputs of the metal conductivity model, SI units. Exactly one of @ref rrr
 * and @ref residual_resistivity is > 0; optional terms are off at 0.
 */
struct MetalConductivityParameters {
  double resistive_debye_temperature = 0.0; ///< theta_R, K (> 0); card key "theta_R"
  double reference_resistivity = 0.0;   ///< rho_ref at reference_temperature, Ohm m (> 0)
  double reference_temperature = 293.0; ///< T_ref, K (> rrr_lower_temperature)
  double rrr = 0.0; ///< RRR = rho(273 K)/rho(4 K), dimensionless (> 1), or 0
  double residual_resistivity = 0.0; ///< rho_0, Ohm m (> 0), or 0 to derive it from rrr
  double lorenz_number = sommerfeld_lorenz_number; ///< L0 of the residual term, W Ohm/K^2
  double phonon_lorenz_number =
      0.0; ///< L_ph of the phonon term, W Ohm/K^2; 0 = lorenz_number
  double wilson_ratio =
      0.0; ///< s = (k_F/q_D)^2 of the Wilson factor, dimensionless; 0 = off
  double lattice_coefficient =
      0.0;                      ///< a of k_g = a T^2 (electron-limited), W/m/K^3; 0 = off
  double lattice_umklapp = 0.0; ///< b of the umklapp resistance b T, m/W (>= 0)
};

/**
 * Bloch-Grueneisen integral \f$ J_n(x) = \int_0^x t^n e^t/(e^t - 1)^2\,dt \f$.
 * @param n order, 2 <= n <= 9
 * @param x theta_R/T, dimensionless, >= 0 (J_n(inf) = n! zeta(n))
 * @return J_n(x), dimensionless, relative error about 1e-15
 */
double bloch_grueneisen_integral(int n, double x) noexcept;

/**
 * Metal thermal conductivity k(T) from resistivity (see the file comment for
 * the formulas). Immutable and thread-safe; evaluate() costs two series or
 * exponential sums (no quadrature).
 */
class MetalConductivity : public ConductivityModel {
public:
  /**
   * @param parameters the inputs (SI)
   * @throws InputError naming the parameter for a non-physical value,
   *         for both or neither of rrr and residual_resistivity, or for a Wilson
   *         ratio so small that the thermal resistivity turns negative
   */
  explicit MetalConductivity(const MetalConductivityParameters& parameters);

  /**
   * @param temperature T, K (> 0, finite)
   * @return k (W/m/K) and dk/dT (W/m/K^2), analytic
   * @throws RangeError for T <= 0, NaN or inf
   */
  ConductivityValue evaluate(double temperature) const override;

  /** "metal" */
  std::string kind() const override { return "metal"; }

  /**
   * Electrical resistivity rho(T) = rho_0 + rho_ph(T).
   * @param temperature T, K (> 0)
   * @return rho, Ohm m
   * @throws RangeError for T <= 0, NaN or inf
   */
  double resistivity(double temperature) const;

  /** Residual resistivity rho_0 (given or derived from the RRR), Ohm m. */
  double residual_resistivity() const noexcept { return residual_; }
  /** Bloch-Grueneisen scale C, Ohm m. */
  double phonon_scale() const noexcept { return scale_; }
  /** RRR = rho(273 K)/rho(4 K) of the model (given or derived), dimensionless. */
  double residual_resistivity_ratio() const;

  /** Electronic part k_e = 1/W_e at @p temperature (K), W/m/K. */
  double electronic_conductivity(double temperature) const;
  /** Lattice part k_g at @p temperature (K), W/m/K (0 when off). */
  double lattice_conductivity(double temperature) const;

  /**
   * Lower end of the temperature band where the Wiedemann-Franz law is known to
   * be off (inelastic electron-phonon scattering): theta_R/20, K.
   */
  double intermediate_lower_temperature() const noexcept {
    return inputs_.resistive_debye_temperature / 20.0;
  }
  /** Upper end of that band: theta_R/2, K. */
  double intermediate_upper_temperature() const noexcept {
    return inputs_.resistive_debye_temperature / 2.0;
  }
  /** True if the Wilson inelastic factor is used (wilson_ratio > 0). */
  bool has_inelastic_correction() const noexcept { return inputs_.wilson_ratio > 0.0; }

  /** The inputs as given. */
  const MetalConductivityParameters& inputs() const noexcept { return inputs_; }

  /**
   * Numeric parameters by card key, SI: "theta_R" (K), "reference_resistivity"
   * (Ohm m), "reference_temperature" (K), "rrr" (1) or "rho_0" (Ohm m), whichever
   * defines the residual term, "lorenz_number" (W Ohm/K^2), and, when set,
   * "phonon_lorenz_number", "wilson_ratio" (1), "lattice_coefficient" (W/m/K^3),
   * "lattice_umklapp" (m/W).
   */
  std::vector<Parameter> parameters() const;

  /**
   * A copy with one parameter changed (any name from parameters(), and the
   * optional terms "phonon_lorenz_number", "wilson_ratio", "lattice_coefficient",
   * "lattice_umklapp" even when unset).
   * @param name card key
   * @param value SI value
   * @throws InputError for an unknown name or a non-physical value
   */
  std::shared_ptr<const MetalConductivity> with_parameter(const std::string& name,
                                                          double value) const;

private:
  struct Parts {
    double k_e, dk_e, k_g, dk_g;
  };
  Parts parts(double temperature) const;
  double phonon_resistivity(double temperature) const noexcept;

  MetalConductivityParameters inputs_;
  double residual_ = 0.0;      // rho_0, Ohm m
  double scale_ = 0.0;         // C, Ohm m
  double phonon_lorenz_ = 0.0; // L_ph, W Ohm/K^2
};

/**
 * Builds a MetalConductivity.
 * @param parameters the inputs (SI)
 * @throws InputError as the constructor
 */
std::shared_ptr<const MetalConductivity>
make_metal_conductivity(const MetalConductivityParameters& parameters);

} // namespace quantacal

#endif
