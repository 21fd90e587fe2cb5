/**
 * @file phases.h
 * @brief Phases joined at transition temperatures, and the high-temperature
 *        series of assessed element data.
 *
 * A material that changes phase (alpha-gamma iron, alpha-beta titanium,
 * melting) is a sequence of phases, each with its own heat-capacity model,
 * conductivity and density, joined at transition temperatures. Every join is
 * spread over a stated width w with the quintic smooth step
 * s(x) = x^3 (10 - 15 x + 6 x^2), x = (T - Tt)/w + 1/2, which has s' = s'' = 0
 * at both ends. Between phases a and b the energy is
 *
 *   U = (1 - s) U_a + s (U_b + offset_b),
 *
 * with offset_b chosen so that U_b + offset_b - U_a = L at Tt, and C = dU/dT,
 * dC/dT are its exact derivatives (docs/theory.md, "Phases"):
 *
 *   C = (1 - s) C_a + s C_b + s' (U_b + offset_b - U_a).
 *
 * The latent heat is therefore absorbed over [Tt - w/2, Tt + w/2], C is
 * continuous with a continuous derivative, and int C dT equals the energy
 * difference to rounding. With L = 0 the same rule joins two descriptions of
 * one phase (a lattice model at low temperature and a published polynomial at
 * high temperature) without a step in C or U.
 */
#ifndef QUANTACAL_MODELS_PHASES_H
#define QUANTACAL_MODELS_PHASES_H

#include <quantacal/models/conductivity.h>
#include <quantacal/models/contribution.h>

#include <cstddef>
#include <memory>
#include <vector>

namespace quantacal {

class HeatCapacityModel;

/** Where one phase gives way to the next. */
struct PhaseBoundary {
  double temperature = 0.0; ///< Tt, K (> 0)
  double latent_heat = 0.0; ///< L absorbed on heating through Tt, J/mol (>= 0)
  double width = 0.0;       ///< full width w of the join, K (> 0)
};

/**
 * The ordered boundaries of a phase sequence and the smooth-step weights of a
 * temperature. Phase i lies between boundary i-1 and boundary i.
 */
class PhaseLayout {
public:
  /**
   * @param boundaries in increasing temperature; each join [Tt - w/2, Tt + w/2]
   *        must lie above 0 K and end before the next one starts
   * @throws InputError naming the boundary for a non-physical value, an
   *         unordered list or overlapping joins
   */
  explicit PhaseLayout(std::vector<PhaseBoundary> boundaries);

  /** The blend at one temperature: value = (1 - s) v[phase] + s v[phase + 1]. */
  struct Weight {
    std::size_t phase = 0; ///< the lower phase of the join, or the only phase
    double s = 0.0;        ///< weight of phase + 1 (0 outside a join)
    double ds = 0.0;       ///< ds/dT, 1/K
    double d2s = 0.0;      ///< d2s/dT2, 1/K^2
  };

  Weight weight(double temperature) const noexcept;

  const std::vector<PhaseBoundary>& boundaries() const noexcept { return boundaries_; }
  std::size_t phase_count() const noexcept { return boundaries_.size() + 1; }

  /** Lower end of the region in which phase @p i is evaluated, K (0 for the first). */
  double phase_lower(std::size_t i) const noexcept;
  /** Upper end of that region, K (inf for the last). */
  double phase_upper(std::size_t i) const noexcept;

private:
  std::vector<PhaseBoundary> boundaries_;
};

/**
 * The heat capacity of a phase sequence as one contribution (not dilated: each
 * phase model carries its own dilation).
 * @param phases one model per phase, phase i evaluated over
 *        [layout.phase_lower(i), layout.phase_upper(i)]
 * @param layout the boundaries between them (phases.size() - 1 of them)
 * @throws InputError if the counts differ, a model is null, or a phase model is
 *         not defined over the region in which it is evaluated (the message
 *         names the phase by number)
 */
ContributionPtr
make_phase_sequence(std::vector<std::shared_ptr<const HeatCapacityModel>> phases,
                    PhaseLayout layout);

/**
 * Conductivity of a phase sequence: k = (1 - s) k_a + s k_b over each join,
 * dk/dT = (1 - s) k_a' + s k_b' + s' (k_b - k_a).
 * @throws InputError if the counts differ or a model is null
 */
ConductivityPtr make_phase_conductivity(std::vector<ConductivityPtr> phases,
                                        PhaseLayout layout);

/**
 * One temperature interval of the Gibbs-energy series of assessed element data
 * (the SGTE unary form, Dinsdale, CALPHAD 15 (1991) 317):
 * G = a + b T + c T ln T + d T^2 + e T^3 + f/T + g T^7 + h T^-9 + i T^4 (J/mol,
 * T in K; the T^4 term appears for a few elements, e.g. tungsten). Only c to i
 * set the capacity, C = -c - 2 d T - 6 e T^2 - 2 f/T^2 - 42 g T^6 - 90 h T^-10
 * - 12 i T^3, and the enthalpy H = a - c T - d T^2 - 2 e T^3 + 2 f/T - 6 g T^7
 * + 10 h T^-9 - 3 i T^4.
 */
struct GibbsPiece {
  double from = 0.0; ///< K
  double to = 0.0;   ///< K
  double c = 0.0, d = 0.0, e = 0.0, f = 0.0, g = 0.0, h = 0.0, i = 0.0;
};

/**
 * The capacity of a Gibbs-energy series over contiguous pieces, with
 * U(T) = H(T) - H(first from) (the offset is set by the model it is joined to).
 * Defined only over [first from, last to]; breakpoints at the inner joins.
 * @throws InputError for no piece, non-contiguous or empty intervals, or
 *         non-finite coefficients
 */
ContributionPtr make_gibbs_series(std::vector<GibbsPiece> pieces);

} // namespace quantacal

#endif
