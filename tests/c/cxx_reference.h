/* SPDX-License-Identifier: Apache-2.0 */
/*
 * The C++ API's answers for the C interface test (tests/c/test_c_api.c): each
 * function loads the card through quantacal::load_card (a Material of its own, not
 * the C handle's) and calls the C++ Material layer directly. Returns 0 on success,
 * 1 if the C++ call threw (the message is printed).
 */
#ifndef QUANTACAL_TESTS_C_CXX_REFERENCE_H
#define QUANTACAL_TESTS_C_CXX_REFERENCE_H

#include <stddef.h>

#ifdef __cplusplus
extern "C" {
#endif

/** Valid range (K), molar mass (kg/mol) and reference density (kg/m^3). */
int reference_metadata(const char* card, double* lower, double* upper, double* molar_mass,
                       double* density);

/** Material::thermal and Material::conductivity batches; basis 0 mass, 1 mole, 2 volume.
 */
int reference_evaluate(const char* card, const double* temperatures, size_t n, int basis,
                       double* energy, double* capacity, double* capacity_derivative,
                       double* conductivity, double* conductivity_derivative);

/** Material::temperature_from_energy at each of n energies. */
int reference_inverse(const char* card, const double* energies, size_t n, int basis,
                      double* temperatures);

/** solve_equilibrium of two bodies (table energies). */
int reference_equilibrium(const char* card_a, double mass_a, double start_a,
                          const char* card_b, double mass_b, double start_b,
                          double* final_temperature);

/**
 * Nanoseconds per point of the C++ batch calls over n temperatures in calls of
 * `chunk` points (thermal on the volume basis with all three outputs, then
 * conductivity with both), `repeats` times over (one timing round). The card is
 * loaded on the first call and kept.
 */
double reference_nanoseconds(const char* card, const double* temperatures, size_t n,
                             size_t chunk, int repeats);

#ifdef __cplusplus
}
#endif

#endif
