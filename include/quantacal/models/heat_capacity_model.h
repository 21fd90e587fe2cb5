// SPDX-License-Identifier: Apache-2.0
/**
 * @file heat_capacity_model.h
 * @brief A sum of contributions plus an optional dilation (C_p - C_v) term.
 */
#ifndef QUANTACAL_MODELS_HEAT_CAPACITY_MODEL_H
#define QUANTACAL_MODELS_HEAT_CAPACITY_MODEL_H

#include <quantacal/models/contribution.h>
#include <quantacal/models/thermal_model.h>

#include <optional>
#include <string>
#include <vector>

namespace quantacal {

/**
 * The dilation (C_p - C_v) correction, applied to C_v, the sum of the
 * contributions whose dilated() is true.
 *
 *  - Nernst-Lindemann: C_p - C_v = A C_p^2 T with A constant. The relation is
 *    solved for C_p exactly, C_p = 2 C_v / (1 + sqrt(1 - 4 A T C_v)).
 *  - Grueneisen: C_p - C_v = alpha^2 K_T V_m T with alpha = gamma_G C_v/(K_T V_m),
 *    i.e. C_p - C_v = A C_v^2 T with A = gamma_G^2 / (K_T V_m).
 *
 * The energy of the correction has no closed form; it is integrated with
 * Boost.Math Gauss-Kronrod quadrature.
 */
struct Dilation {
  enum class Kind { nernst_lindemann, grueneisen };
  Kind kind = Kind::nernst_lindemann;
  double coefficient =
      0.0; ///< A, mol/J (Nernst-Lindemann) or derived from the three below
  double grueneisen = 0.0;   ///< gamma_G, dimensionless (Kind::grueneisen)
  double bulk_modulus = 0.0; ///< K_T, Pa (Kind::grueneisen)
  double molar_volume = 0.0; ///< V_m, m^3/mol (Kind::grueneisen)

  /** A in mol/J for either kind. */
  double a() const noexcept {
    return kind == Kind::nernst_lindemann
               ? coefficient
               : grueneisen * grueneisen / (bulk_modulus * molar_volume);
  }
};

/**
 * The exact molar heat-capacity model of one material.
 *
 * Checks its argument once for all terms: T must be finite, > 0 and inside
 * the intersection of the terms' domains, otherwise a RangeError names the
 * material and the value.
 */
class HeatCapacityModel : public ThermalModel {
public:
  /**
   * @param name the material's name (for messages)
   * @param contributions the additive terms (at least one)
   * @param dilation optional C_p - C_v correction
   * @throws InputError if there is no term, a term is null, the terms'
   *         domains do not overlap, or the dilation parameters are non-physical.
   *         (A Nernst-Lindemann dilation with 4 A T C_v >= 1 is found lazily:
   *         evaluate() then throws NumericalError naming the material and T.)
   */
  HeatCapacityModel(std::string name, std::vector<ContributionPtr> contributions,
                    std::optional<Dilation> dilation = std::nullopt);

  ThermalState evaluate(double temperature) const override;
  double lower_temperature() const override;
  double upper_temperature() const override;
  std::vector<double> breakpoints() const override;
  std::string name() const override { return name_; }

  const std::vector<ContributionPtr>& contributions() const noexcept {
    return contributions_;
  }
  const std::optional<Dilation>& dilation() const noexcept { return dilation_; }

  /** The same model with one term replaced (for fitting). */
  HeatCapacityModel with_contribution(std::size_t index,
                                      ContributionPtr replacement) const;

private:
  std::string name_;
  std::vector<ContributionPtr> contributions_;
  std::optional<Dilation> dilation_;
};

} // namespace quantacal

#endif
