// SPDX-License-Identifier: Apache-2.0
/**
 * @file equilibrium.h
 * @brief The common final temperature of bodies that exchange heat with each
 *        other and with nothing else, latent heats included.
 *
 * The final temperature T_f solves  sum_i m_i e_i(T_f) = sum_i m_i e_i(T0_i),
 * with e_i the stored energy per kilogram of body i (latent heats are part of
 * e). Stored energy rises with temperature, so T_f lies between the lowest
 * and the highest start and is found by a bracketing root finder (TOMS 748,
 * Alefeld, Potra and Shi, ACM TOMS 21 (1995) 327) to a few ulp.
 */
#ifndef QUANTACAL_MATERIAL_EQUILIBRIUM_H
#define QUANTACAL_MATERIAL_EQUILIBRIUM_H

#include <quantacal/material/material.h>

#include <string>
#include <vector>

namespace quantacal {

/** One body of an equilibrium problem. */
struct Body {
  MaterialPtr material;             ///< its material (non-null)
  double mass = 0.0;                ///< kg (> 0)
  double initial_temperature = 0.0; ///< K, inside the material's valid range
  std::string label;                ///< how messages name the body ("" = its number)
};

/** Where energies come from. */
enum class EnergySource {
  table, ///< the material's cached table (fast; the default)
  exact  ///< the exact model (slow; for checks)
};

/** A latent-heat transition of a body's material and where the body stands in it. */
struct TransitionPassage {
  double temperature = 0.0; ///< K, centre of the transition
  double latent_heat = 0.0; ///< J/kg
  double fraction = 0.0;    ///< share of the high-temperature phase at T_f, 0..1
  bool crossed = false;     ///< the transition lies between the start and T_f
  bool ends_inside = false; ///< T_f lies inside the smeared transition
};

/** The result of solve_equilibrium. */
struct EquilibriumResult {
  double temperature = 0.0;        ///< T_f, K
  std::vector<double> heat;        ///< J per body: + taken, - given
  double heat_sum = 0.0;           ///< J, sum of the heats (round-off only)
  double relative_imbalance = 0.0; ///< |heat_sum| / largest |heat|
  unsigned int iterations = 0;     ///< root-finder iterations
  /// Per body, its material's transitions that it crosses or ends inside.
  std::vector<std::vector<TransitionPassage>> transitions;
};

/**
 * Final common temperature of @p bodies in an insulated vessel.
 * @param bodies two or more bodies
 * @param source table (default) or exact model
 * @throws InputError fewer than two bodies, a null material, a mass that is not > 0
 * @throws RangeError a start outside its material's valid range, or a final
 *         temperature outside the valid range of one of the materials (the message
 *         names the material's card, or the material if it has no card)
 * @throws NumericalError if the root finder does not converge in 200 iterations or
 *         the heats do not balance to 1e-8 of the largest heat
 */
EquilibriumResult solve_equilibrium(const std::vector<Body>& bodies,
                                    EnergySource source = EnergySource::table);

} // namespace quantacal

#endif
