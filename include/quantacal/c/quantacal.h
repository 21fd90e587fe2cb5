/* SPDX-License-Identifier: Apache-2.0 */
/**
 * @file quantacal.h
 * @brief The C interface of quantacal: material cards behind opaque handles,
 *        batch evaluation with flags, status codes and a per-thread message.
 *
 * For solvers that are not written in C++ (C, Fortran through the module
 * lib/fortran/quantacal.f90, or any language with a C foreign-function
 * interface). Plain C (C89 declarations, C99 `size_t` from <stddef.h>); no C++
 * type crosses this boundary and no exception leaves it.
 *
 * Error model. Every function that can fail returns a ::qc_status; on
 * failure the outputs are unspecified (batch outputs may be partly written) and
 * qc_last_error() returns a message for this thread, for a card error in the
 * compiler form `path:line:column: field = "value": expected ...`, for a range
 * error the function, the material, the valid range and the offending value
 * (`qc_evaluate: temperatures[3] = 2000 K: ...: requires 4 K <= T <= 1500 K but
 * got 2000 K`).
 *
 * Threads. A loaded material is immutable: its tables are built by the load
 * call, so any number of threads may evaluate one handle at once without
 * locks. Loads of different cards may also run at once. The only mutable
 * state of the library is the per-thread error message. A handle must not be
 * freed while another thread uses it.
 *
 * Units are SI throughout: K, J/kg, J/mol, J/m^3 (of the reference
 * configuration), W/m/K, kg/mol, kg/m^3.
 */
#ifndef QUANTACAL_C_QUANTACAL_H
#define QUANTACAL_C_QUANTACAL_H

#include <stddef.h>

#if defined(_WIN32) && defined(QUANTACAL_C_BUILDING)
#define QUANTACAL_C_API __declspec(dllexport)
#elif defined(__GNUC__)
#define QUANTACAL_C_API __attribute__((visibility("default")))
#else
#define QUANTACAL_C_API
#endif

#ifdef __cplusplus
extern "C" {
#endif

/** A loaded material (opaque). Made by qc_load_card(), released by qc_free(). */
typedef struct qc_material qc_material;

/** What a call returns. The values are part of the interface (Fortran uses them). */
typedef enum qc_status {
  QC_OK = 0,               /**< success */
  QC_INPUT_ERROR = 1,      /**< a card (file or text) is missing, malformed or
                                non-physical; the message is located */
  QC_RANGE_ERROR = 2,      /**< a temperature (or energy) outside the valid range */
  QC_NUMERICAL_ERROR = 3,  /**< a computation did not reach its goal */
  QC_INVALID_ARGUMENT = 4, /**< a null pointer, bad flags or basis, a bad parameter */
  QC_OUT_OF_MEMORY = 5,    /**< an allocation failed */
  QC_INTERNAL_ERROR = 6    /**< anything else (a bug: please report the message) */
} qc_status;

/** Per what quantity energies and capacities are expressed. */
typedef enum qc_basis {
  QC_PER_MASS = 0,  /**< J/kg, J/kg/K, J/kg/K^2 */
  QC_PER_MOLE = 1,  /**< J/mol, J/mol/K, J/mol/K^2 */
  QC_PER_VOLUME = 2 /**< J/m^3, J/m^3/K, J/m^3/K^2 of the reference configuration */
} qc_basis;

/** Bits of the `flags` argument of qc_evaluate(): what to compute. */
enum qc_property_flag {
  QC_ENERGY = 1,                   /**< e(T), stored energy from the reference T */
  QC_CAPACITY = 2,                 /**< c_p = de/dT */
  QC_CAPACITY_DERIVATIVE = 4,      /**< dc_p/dT */
  QC_CONDUCTIVITY = 8,             /**< k, W/m/K */
  QC_CONDUCTIVITY_DERIVATIVE = 16, /**< dk/dT, W/m/K^2 */
  QC_THERMAL = 7,                  /**< the first three */
  QC_CONDUCTION = 24,              /**< k and dk/dT */
  QC_ALL = 31                      /**< all five */
};

/**
 * Loads the YAML material card at @p path and builds its tables.
 * @param path file path (NUL-terminated)
 * @param material receives the new handle (NULL on failure)
 * @return QC_OK; QC_INPUT_ERROR for a missing or bad card (message
 *         `path:line:column: ...`); QC_INVALID_ARGUMENT for a null pointer;
 *         QC_NUMERICAL_ERROR if a table misses its tolerance
 */
QUANTACAL_C_API qc_status qc_load_card(const char* path, qc_material** material);

/**
 * Loads a card from YAML text.
 * @param text the card (NUL-terminated)
 * @param name what messages call it, and the folder composition paths are
 *        resolved from (NULL or "" for "<text>")
 * @param material receives the new handle (NULL on failure)
 * @return as qc_load_card()
 */
QUANTACAL_C_API qc_status qc_load_card_text(const char* text, const char* name,
                                            qc_material** material);

/** Releases a handle; NULL is allowed and does nothing. */
QUANTACAL_C_API void qc_free(qc_material* material);

/** The card's name (owned by the handle, valid until qc_free()). */
QUANTACAL_C_API qc_status qc_name(const qc_material* material, const char** name);

/** The valid temperature range, K: every call accepts lower <= T <= upper. */
QUANTACAL_C_API qc_status qc_valid_range(const qc_material* material, double* lower,
                                         double* upper);

/** Molar mass, kg/mol (of the card's formula unit). */
QUANTACAL_C_API qc_status qc_molar_mass(const qc_material* material, double* molar_mass);

/** Reference density, kg/m^3: the density of QC_PER_VOLUME. */
QUANTACAL_C_API qc_status qc_reference_density(const qc_material* material,
                                               double* density);

/**
 * Density at a temperature, kg/m^3 (phases blended over their joins; the
 * reference density for a one-phase card). QC_RANGE_ERROR outside the range.
 */
QUANTACAL_C_API qc_status qc_density(const qc_material* material, double temperature,
                                     double* density);

/**
 * Properties at @p n temperatures from the material's cached tables: one call
 * per batch, no allocation, the same numbers as the C++ `Material::thermal`
 * and `Material::conductivity` batch calls, bit for bit.
 *
 * @param temperatures n temperatures, K, each inside the valid range
 * @param n number of points (0 is allowed and does nothing)
 * @param basis of energy, capacity and its derivative (k is per metre always)
 * @param flags a non-zero OR of ::qc_property_flag bits; an array whose bit is
 *        set must be non-null, one whose bit is clear may be NULL and is not
 *        touched
 * @param energy e(T), J/kg, J/mol or J/m^3, relative to the card's reference
 *        temperature (0 K unless the card names another)
 * @param capacity c_p = de/dT, J/kg/K, J/mol/K or J/m^3/K
 * @param capacity_derivative dc_p/dT, per K^2 on the same basis
 * @param conductivity k, W/m/K
 * @param conductivity_derivative dk/dT, W/m/K^2
 * @return QC_OK; QC_RANGE_ERROR naming the first temperature outside the
 *         valid range (or NaN), its index and the range; QC_INVALID_ARGUMENT
 *         for a null handle or array, unknown flag bits, flags 0 or a bad basis
 */
QUANTACAL_C_API qc_status qc_evaluate(const qc_material* material,
                                      const double* temperatures, size_t n,
                                      qc_basis basis, unsigned flags, double* energy,
                                      double* capacity, double* capacity_derivative,
                                      double* conductivity,
                                      double* conductivity_derivative);

/**
 * The inverse of the energy of qc_evaluate(): the temperatures at which e(T)
 * equals each of @p n energies, solved exactly on the same interpolant.
 * @param energies n energies on @p basis
 * @param temperatures receives n temperatures, K
 * @return QC_OK; QC_RANGE_ERROR for an energy outside [e(lower), e(upper)]
 */
QUANTACAL_C_API qc_status qc_temperature_from_energy(const qc_material* material,
                                                     const double* energies, size_t n,
                                                     qc_basis basis,
                                                     double* temperatures);

/**
 * The common final temperature of @p n bodies that exchange heat only with
 * each other (an insulated vessel), latent heats included:
 * sum_i m_i e_i(T_f) = sum_i m_i e_i(T0_i).
 * @param n number of bodies (>= 2)
 * @param materials n handles (one material may appear more than once)
 * @param masses n masses, kg (> 0)
 * @param initial_temperatures n start temperatures, K, each in its valid range
 * @param final_temperature receives T_f, K
 * @param heats NULL, or receives n heats, J (+ taken, - given)
 * @return QC_OK; QC_INVALID_ARGUMENT (fewer than 2 bodies, a null pointer, a
 *         mass <= 0); QC_RANGE_ERROR (a start, or T_f, outside a valid range);
 *         QC_NUMERICAL_ERROR (the root finder failed)
 */
QUANTACAL_C_API qc_status qc_equilibrium(size_t n, const qc_material* const* materials,
                                         const double* masses,
                                         const double* initial_temperatures,
                                         double* final_temperature, double* heats);

/**
 * The message of the last failed call on this thread ("" after a successful
 * one). Valid until the next call of this interface on the same thread.
 */
QUANTACAL_C_API const char* qc_last_error(void);

/**
 * Where the last failed call's card error points, 1-based (0 and 0 when the
 * last error was not located in a card). Either pointer may be NULL.
 */
QUANTACAL_C_API void qc_last_error_location(int* line, int* column);

/**
 * Records @p message as this thread's error and returns @p status: for
 * wrappers built on this interface (the Fortran module reports its own
 * argument checks through it).
 */
QUANTACAL_C_API qc_status qc_set_error(qc_status status, const char* message);

/** A short name of a status ("ok", "input error", ...); never NULL. */
QUANTACAL_C_API const char* qc_status_name(qc_status status);

/** The library's version, e.g. "0.1.0". */
QUANTACAL_C_API const char* qc_version(void);

#ifdef __cplusplus
}
#endif

#endif
