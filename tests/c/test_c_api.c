/* SPDX-License-Identifier: Apache-2.0 */
/*
 * The C interface (include/quantacal/c/quantacal.h), from a C11 program:
 *  - the bundled copper and aluminium cards through every call, against the C++ API
 *    (tests/c/cxx_reference.cc: the same numbers, bit for bit);
 *  - against published values the cards were not fitted to: c_p and H(T) -
 *    H(298.15 K) of the NIST-JANAF Shomate fits (Chase 1998, as in the NIST
 *    Chemistry WebBook, SRD 69), the tolerances of tests/cards (c_p 3 %, H 2 %);
 *  - every error path: status, message text, location;
 *  - 8 threads evaluating one handle at once against the single-thread results,
 *    and the per-thread message;
 *  - the cost per point of a batch through C and through C++ (printed, not checked).
 * Prints each measured deviation; exits 1 on the first failed group's end.
 */
#include <quantacal/c/quantacal.h>

#include "cxx_reference.h"

#include <math.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <threads.h>
#include <time.h>

static int failures = 0;

#define CHECK(condition)                                                                 \
  do {                                                                                   \
    if (!(condition)) {                                                                  \
      fprintf(stderr, "%s:%d: check failed: %s\n", __FILE__, __LINE__, #condition);      \
      ++failures;                                                                        \
    }                                                                                    \
  } while (0)

/* The status and, on failure, a message that must contain each of the fragments. */
#define CHECK_STATUS(call, expected)                                                     \
  do {                                                                                   \
    const qc_status got_ = (call);                                                       \
    if (got_ != (expected)) {                                                            \
      fprintf(stderr, "%s:%d: %s returned %s, expected %s: %s\n", __FILE__, __LINE__,    \
              #call, qc_status_name(got_), qc_status_name(expected), qc_last_error());   \
      ++failures;                                                                        \
    }                                                                                    \
  } while (0)

static void check_message(const char* fragment, int line) {
  if (!strstr(qc_last_error(), fragment)) {
    fprintf(stderr, "%s:%d: message \"%s\" lacks \"%s\"\n", __FILE__, line,
            qc_last_error(), fragment);
    ++failures;
  }
}
#define CHECK_MESSAGE(fragment) check_message(fragment, __LINE__)

static char copper_path[1024], aluminium_path[1024], lead_path[1024], al6061_path[1024];

static void card_path(char* out, const char* file) {
  snprintf(out, 1024, "%s/materials/%s", QUANTACAL_SOURCE_DIR, file);
}

static qc_material* load(const char* path) {
  qc_material* m = NULL;
  const qc_status s = qc_load_card(path, &m);
  if (s != QC_OK) {
    fprintf(stderr, "cannot load %s: %s\n", path, qc_last_error());
    exit(1);
  }
  return m;
}

static double deviation(double model, double reference) {
  return model / reference - 1.0;
}

/* n temperatures spread over [lower, upper], geometric, with both ends. */
static void spread(double lower, double upper, size_t n, double* t) {
  for (size_t i = 0; i < n; ++i)
    t[i] = lower * pow(upper / lower, (double)i / (double)(n - 1));
  t[0] = lower;
  t[n - 1] = upper;
}

/* ---- metadata ------------------------------------------------------------------- */

static void test_metadata(void) {
  qc_material* cu = load(copper_path);
  double lower, upper, molar_mass, density, r_lower, r_upper, r_molar, r_density;
  CHECK_STATUS(qc_valid_range(cu, &lower, &upper), QC_OK);
  CHECK_STATUS(qc_molar_mass(cu, &molar_mass), QC_OK);
  CHECK_STATUS(qc_reference_density(cu, &density), QC_OK);
  CHECK(reference_metadata(copper_path, &r_lower, &r_upper, &r_molar, &r_density) == 0);
  CHECK(lower == r_lower && upper == r_upper);
  CHECK(molar_mass == r_molar && density == r_density);
  const char* name = NULL;
  CHECK_STATUS(qc_name(cu, &name), QC_OK);
  CHECK(name && strcmp(name, "copper (OFHC)") == 0); /* the card's name: field */
  CHECK(qc_last_error()[0] == '\0'); /* a successful call leaves no message */
  double d = 0.0;
  CHECK_STATUS(qc_density(cu, 300.0, &d), QC_OK);
  CHECK(d == density); /* copper at 300 K: the first phase, the reference density */
  printf("copper: %g K to %g K, M = %g kg/mol, rho = %g kg/m^3 (same as C++)\n", lower,
         upper, molar_mass, density);
  CHECK(strcmp(qc_version(), "") != 0);
  qc_free(cu);
}

/* ---- batch evaluation against the C++ API ----------------------------------------- */

enum { n_points = 997 };

static void test_against_cxx(const char* path) {
  qc_material* m = load(path);
  double lower, upper;
  CHECK_STATUS(qc_valid_range(m, &lower, &upper), QC_OK);
  static double t[n_points], e[n_points], c[n_points], dc[n_points], k[n_points],
      dk[n_points];
  static double re[n_points], rc[n_points], rdc[n_points], rk[n_points], rdk[n_points];
  spread(lower, upper, n_points, t);
  int mismatches = 0;
  for (int basis = 0; basis < 3; ++basis) {
    CHECK_STATUS(qc_evaluate(m, t, n_points, (qc_basis)basis, QC_ALL, e, c, dc, k, dk),
                 QC_OK);
    CHECK(reference_evaluate(path, t, n_points, basis, re, rc, rdc, rk, rdk) == 0);
    for (size_t i = 0; i < n_points; ++i)
      mismatches += e[i] != re[i] || c[i] != rc[i] || dc[i] != rdc[i] || k[i] != rk[i] ||
                    dk[i] != rdk[i];
    /* Each flag alone gives the same numbers and leaves the other arrays alone. */
    const unsigned flags[] = {QC_ENERGY, QC_CAPACITY, QC_CAPACITY_DERIVATIVE,
                              QC_CONDUCTIVITY, QC_CONDUCTIVITY_DERIVATIVE};
    double* wanted[] = {re, rc, rdc, rk, rdk};
    for (int f = 0; f < 5; ++f) {
      double* out[5] = {e, c, dc, k, dk};
      for (int a = 0; a < 5; ++a)
        for (size_t i = 0; i < n_points; ++i)
          out[a][i] = -12345.0;
      CHECK_STATUS(qc_evaluate(m, t, n_points, (qc_basis)basis, flags[f],
                               f == 0 ? e : NULL, f == 1 ? c : NULL, f == 2 ? dc : NULL,
                               f == 3 ? k : NULL, f == 4 ? dk : NULL),
                   QC_OK);
      for (int a = 0; a < 5; ++a)
        for (size_t i = 0; i < n_points; ++i)
          mismatches += a == f ? out[a][i] != wanted[a][i] : out[a][i] != -12345.0;
    }
  }
  printf("%s: qc_evaluate against Material::thermal/conductivity, %d points x 3 bases "
         "x 6 flag sets: %d differences (bit for bit)\n",
         path, n_points, mismatches);
  CHECK(mismatches == 0);

  /* The inverse: bit for bit with C++, and T(e(T)) = T. */
  double back[n_points], reference_back[n_points], worst = 0.0;
  for (int basis = 0; basis < 3; ++basis) {
    CHECK_STATUS(qc_evaluate(m, t, n_points, (qc_basis)basis, QC_ENERGY, e, NULL, NULL,
                             NULL, NULL),
                 QC_OK);
    CHECK_STATUS(qc_temperature_from_energy(m, e, n_points, (qc_basis)basis, back),
                 QC_OK);
    CHECK(reference_inverse(path, e, n_points, basis, reference_back) == 0);
    for (size_t i = 0; i < n_points; ++i) {
      CHECK(back[i] == reference_back[i]);
      worst = fmax(worst, fabs(back[i] / t[i] - 1.0));
    }
  }
  printf("%s: T(e(T)) worst relative error %.2e (3 bases)\n", path, worst);
  CHECK(worst < 1e-10); /* a numerical limit: the inverse is solved on the interpolant */
  qc_free(m);
}

/* ---- published values ---------------------------------------------------------------
 */

/* A Shomate fit: C_p = A + B x + C x^2 + D x^3 + E/x^2 (J/mol/K) and
 * H - H(298.15 K) = 1000 (A x + B x^2/2 + C x^3/3 + D x^4/4 - E/x + F) J/mol,
 * x = T/1000 K. */
typedef struct {
  double a, b, c, d, e, f;
} shomate;

static double shomate_capacity(const shomate* s, double t) {
  const double x = t / 1000.0;
  return s->a + s->b * x + s->c * x * x + s->d * x * x * x + s->e / (x * x);
}

static double shomate_enthalpy(const shomate* s, double t) {
  const double x = t / 1000.0;
  return 1000.0 * (s->a * x + s->b * x * x / 2 + s->c * x * x * x / 3 +
                   s->d * x * x * x * x / 4 - s->e / x + s->f);
}

static void test_published(void) {
  /* NIST Chemistry WebBook (SRD 69), NIST-JANAF (Chase 1998): solid copper 298-1358 K */
  const shomate copper = {17.72891, 28.09870, -31.25289, 13.97243, 0.068611, -6.056591};
  /* NIST Chemistry WebBook (SRD 69), NIST-JANAF (Chase 1998): solid aluminium 298-933 K
   */
  const shomate aluminium = {28.08920, -5.414849, 8.560423,
                             3.427370, -0.277375, -9.147187};
  const struct {
    const char* path;
    const shomate* fit;
    double temperatures[5];
  } cases[] = {{copper_path, &copper, {298.15, 400.0, 600.0, 800.0, 1000.0}},
               {aluminium_path, &aluminium, {298.15, 400.0, 500.0, 700.0, 900.0}}};
  for (int c = 0; c < 2; ++c) {
    qc_material* m = load(cases[c].path);
    double energy[5], capacity[5], e298;
    const double t298 = 298.15;
    CHECK_STATUS(qc_evaluate(m, cases[c].temperatures, 5, QC_PER_MOLE,
                             QC_ENERGY | QC_CAPACITY, energy, capacity, NULL, NULL, NULL),
                 QC_OK);
    CHECK_STATUS(
        qc_evaluate(m, &t298, 1, QC_PER_MOLE, QC_ENERGY, &e298, NULL, NULL, NULL, NULL),
        QC_OK);
    for (int i = 0; i < 5; ++i) {
      const double t = cases[c].temperatures[i];
      const double dc = deviation(capacity[i], shomate_capacity(cases[c].fit, t));
      printf("  %s c_p(%6.1f K) %7.3f J/mol/K, NIST-JANAF %7.3f: %+5.2f %%\n",
             cases[c].path, t, capacity[i], shomate_capacity(cases[c].fit, t), 100 * dc);
      CHECK(fabs(dc) <= 0.03); /* Chase 1998 (NIST-JANAF), 3 % as tests/cards */
      if (i == 0)
        continue;
      const double dh = deviation(energy[i] - e298, shomate_enthalpy(cases[c].fit, t));
      printf("  %s H(%6.1f K) - H(298.15 K) %8.1f J/mol, NIST-JANAF %8.1f: %+5.2f %%\n",
             cases[c].path, t, energy[i] - e298, shomate_enthalpy(cases[c].fit, t),
             100 * dh);
      CHECK(fabs(dh) <= 0.02); /* Chase 1998 (NIST-JANAF), 2 % as tests/cards */
    }
    qc_free(m);
  }
  /* k of 6061-T6 at 293 K: 167 W/m/K (ASM Handbook Vol. 2, from memory), 10 % as in
   * tests/cards/test_aluminium_6061_card.cc (a judgement: temper and batch vary). */
  qc_material* al6061 = load(al6061_path);
  const double t293 = 293.0;
  double k = 0.0;
  CHECK_STATUS(qc_evaluate(al6061, &t293, 1, QC_PER_MASS, QC_CONDUCTIVITY, NULL, NULL,
                           NULL, &k, NULL),
               QC_OK);
  printf("  6061-T6 k(293 K) %.2f W/m/K, handbook 167: %+5.2f %%\n", k,
         100 * deviation(k, 167.0));
  CHECK(fabs(deviation(k, 167.0)) <= 0.10); /* ASM Handbook Vol. 2 (from memory) */
  qc_free(al6061);
}

/* ---- equilibrium --------------------------------------------------------------------
 */

static void test_equilibrium(void) {
  qc_material* cu = load(copper_path);
  qc_material* pb = load(lead_path);
  /* A copper block from liquid nitrogen into a lead brick (docs/api.md's example). */
  const qc_material* bodies[] = {cu, pb};
  const double masses[] = {0.5, 2.0}, starts[] = {77.0, 293.15};
  double final_temperature = 0.0, heats[2], reference = 0.0;
  CHECK_STATUS(qc_equilibrium(2, bodies, masses, starts, &final_temperature, heats),
               QC_OK);
  CHECK(reference_equilibrium(copper_path, 0.5, 77.0, lead_path, 2.0, 293.15,
                              &reference) == 0);
  printf("copper 0.5 kg at 77 K + lead 2 kg at 293.15 K: T_f = %.9f K (C++ %.9f K), "
         "heats %+.3f J %+.3f J\n",
         final_temperature, reference, heats[0], heats[1]);
  CHECK(final_temperature == reference);
  CHECK(fabs(heats[0] + heats[1]) <= 1e-8 * fabs(heats[0])); /* energy is conserved */
  /* The heat the copper took is its stored-energy change, from qc_evaluate. */
  double e[2];
  const double ends[] = {77.0, final_temperature};
  CHECK_STATUS(
      qc_evaluate(cu, ends, 2, QC_PER_MASS, QC_ENERGY, e, NULL, NULL, NULL, NULL), QC_OK);
  CHECK(fabs(0.5 * (e[1] - e[0]) / heats[0] - 1.0) <= 1e-12);
  qc_free(cu);
  qc_free(pb);
}

/* ---- error paths ---------------------------------------------------------------------
 */

/* Illustrative card (values only need to be physical); line 15 holds the rows. */
static const char* good_card =
    "name: test metal\n"
    "description: illustrative card for error tests\n"
    "molar_mass: \"63.546 g/mol\"\n"
    "reference_density: \"8960 kg/m^3\"\n"
    "valid_range: {from: \"4 K\", to: \"300 K\"}\n"
    "heat_capacity:\n"
    "  - kind: debye\n"
    "    theta_D: \"343 K\"\n"
    "  - kind: electronic\n"
    "    gamma: \"0.695 mJ/mol/K^2\"\n"
    "conductivity:\n"
    "  kind: table\n"
    "  columns: [\"K\", \"W/m/K\"]\n"
    "  rows: [[4, 642], [20, 2423], [77, 547], [300, 396]]\n"
    "sources:\n"
    "  - {for: [molar_mass, reference_density, heat_capacity, conductivity], cite: "
    "\"illustrative\"}\n";

/* good_card with the first occurrence of `from` replaced by `to`. */
static void edited(char* out, size_t size, const char* from, const char* to) {
  const char* at = strstr(good_card, from);
  CHECK(at != NULL);
  if (!at)
    return;
  snprintf(out, size, "%.*s%s%s", (int)(at - good_card), good_card, to,
           at + strlen(from));
}

static void test_load_errors(void) {
  qc_material* m = (qc_material*)&m; /* not NULL: a failed load must reset it */
  int line = -1, column = -1;

  CHECK_STATUS(qc_load_card("/nonexistent/folder/card.yaml", &m), QC_INPUT_ERROR);
  CHECK(m == NULL);
  CHECK_MESSAGE("qc_load_card: /nonexistent/folder/card.yaml");
  CHECK_MESSAGE("cannot open the card file");

  /* A good card loads from text. */
  CHECK_STATUS(qc_load_card_text(good_card, "good.yaml", &m), QC_OK);
  CHECK(m != NULL);
  qc_free(m);

  /* Malformed YAML: an unclosed flow sequence in line 14, reported at line 15 (where
   * the parser finds the next key), as tests/cards/test_card_errors.cc expects. */
  char text[2048];
  edited(text, sizeof text, "[[4, 642]", "[[4, 642");
  CHECK_STATUS(qc_load_card_text(text, "bad.yaml", &m), QC_INPUT_ERROR);
  CHECK(m == NULL);
  CHECK_MESSAGE("bad.yaml:15:");
  CHECK_MESSAGE("YAML syntax error");
  qc_last_error_location(&line, &column);
  CHECK(line == 15 && column > 0);
  printf("malformed YAML: %s (line %d, column %d)\n", qc_last_error(), line, column);

  /* A non-physical value: located at the value, field path and text named. */
  edited(text, sizeof text, "\"343 K\"", "\"-343 K\"");
  CHECK_STATUS(qc_load_card_text(text, "bad.yaml", &m), QC_INPUT_ERROR);
  CHECK_MESSAGE("bad.yaml:8:");
  CHECK_MESSAGE("heat_capacity[0].theta_D");
  CHECK_MESSAGE("-343 K");
  qc_last_error_location(&line, &column);
  CHECK(line == 8 && column == 14);
  printf("bad value: %s\n", qc_last_error());

  /* A misspelt key gets "did you mean". */
  edited(text, sizeof text, "molar_mass:", "molar_mas:");
  CHECK_STATUS(qc_load_card_text(text, NULL, &m), QC_INPUT_ERROR);
  CHECK_MESSAGE("<text>:3:");
  CHECK_MESSAGE("molar_mass");

  /* Null pointers. */
  CHECK_STATUS(qc_load_card(NULL, &m), QC_INVALID_ARGUMENT);
  CHECK_MESSAGE("qc_load_card: path is a null pointer");
  CHECK_STATUS(qc_load_card(copper_path, NULL), QC_INVALID_ARGUMENT);
  CHECK_MESSAGE("material is a null pointer");
  CHECK_STATUS(qc_load_card_text(NULL, "x.yaml", &m), QC_INVALID_ARGUMENT);
  CHECK_MESSAGE("qc_load_card_text: text is a null pointer");
  qc_last_error_location(&line, &column);
  CHECK(line == 0 && column == 0); /* not a card error */
  qc_free(NULL);                   /* allowed */
}

static void test_call_errors(void) {
  qc_material* cu = load(copper_path);
  double lower, upper;
  CHECK_STATUS(qc_valid_range(cu, &lower, &upper), QC_OK);
  double t[4] = {300.0, 500.0, 2000.0, 100.0}, e[4], c[4], dc[4], k[4], dk[4];

  /* Outside the valid range: the index, the temperature, the material and the range. */
  CHECK_STATUS(qc_evaluate(cu, t, 4, QC_PER_MASS, QC_ALL, e, c, dc, k, dk),
               QC_RANGE_ERROR);
  CHECK_MESSAGE("qc_evaluate: temperatures[2] = 2000 K: ");
  CHECK_MESSAGE("copper (OFHC): requires 4 K <= T <= 1500 K");
  CHECK_MESSAGE("but got 2000 K");
  printf("out of range: %s\n", qc_last_error());
  t[2] = 3.5; /* below, and only conductivity asked for: the same rule */
  CHECK_STATUS(
      qc_evaluate(cu, t, 4, QC_PER_MASS, QC_CONDUCTIVITY, NULL, NULL, NULL, k, NULL),
      QC_RANGE_ERROR);
  CHECK_MESSAGE("temperatures[2] = 3.5 K");
  t[2] = NAN;
  CHECK_STATUS(qc_evaluate(cu, t, 4, QC_PER_VOLUME, QC_ENERGY, e, NULL, NULL, NULL, NULL),
               QC_RANGE_ERROR);
  CHECK_MESSAGE("temperatures[2] = nan K");
  t[2] = 700.0;
  CHECK_STATUS(qc_evaluate(cu, t, 4, QC_PER_MASS, QC_ALL, e, c, dc, k, dk), QC_OK);
  CHECK(qc_last_error()[0] == '\0');
  CHECK_STATUS(qc_density(cu, upper * 2, &lower), QC_RANGE_ERROR);
  CHECK_MESSAGE("qc_density: ");

  /* Bad flags and basis. */
  CHECK_STATUS(qc_evaluate(cu, t, 4, QC_PER_MASS, 0u, e, c, dc, k, dk),
               QC_INVALID_ARGUMENT);
  CHECK_MESSAGE("qc_evaluate: flags = 0: expected a non-zero OR");
  CHECK_STATUS(qc_evaluate(cu, t, 4, QC_PER_MASS, 32u, e, c, dc, k, dk),
               QC_INVALID_ARGUMENT);
  CHECK_MESSAGE("flags = 32");
  CHECK_STATUS(qc_evaluate(cu, t, 4, QC_PER_MASS, QC_ENERGY | 64u, e, c, dc, k, dk),
               QC_INVALID_ARGUMENT);
  CHECK_MESSAGE("flags = 65");
  CHECK_STATUS(qc_evaluate(cu, t, 4, (qc_basis)3, QC_ALL, e, c, dc, k, dk),
               QC_INVALID_ARGUMENT);
  CHECK_MESSAGE("basis = 3: expected QC_PER_MASS (0)");
  CHECK_STATUS(qc_temperature_from_energy(cu, e, 4, (qc_basis)-1, t),
               QC_INVALID_ARGUMENT);
  CHECK_MESSAGE("qc_temperature_from_energy: basis = -1");

  /* Null pointers. */
  CHECK_STATUS(qc_evaluate(NULL, t, 4, QC_PER_MASS, QC_ALL, e, c, dc, k, dk),
               QC_INVALID_ARGUMENT);
  CHECK_MESSAGE("qc_evaluate: material is a null pointer");
  CHECK_STATUS(qc_evaluate(cu, NULL, 4, QC_PER_MASS, QC_ALL, e, c, dc, k, dk),
               QC_INVALID_ARGUMENT);
  CHECK_MESSAGE("temperatures is a null pointer");
  CHECK_STATUS(qc_evaluate(cu, t, 4, QC_PER_MASS, QC_ALL, e, c, NULL, k, dk),
               QC_INVALID_ARGUMENT);
  CHECK_MESSAGE("capacity_derivative is a null pointer but its flag is set");
  CHECK_STATUS(
      qc_evaluate(cu, NULL, 0, QC_PER_MASS, QC_ENERGY, e, NULL, NULL, NULL, NULL),
      QC_OK); /* no points: nothing to read */
  CHECK_STATUS(qc_valid_range(cu, NULL, &upper), QC_INVALID_ARGUMENT);
  CHECK_MESSAGE("qc_valid_range: lower is a null pointer");
  CHECK_STATUS(qc_molar_mass(NULL, &lower), QC_INVALID_ARGUMENT);
  CHECK_STATUS(qc_reference_density(cu, NULL), QC_INVALID_ARGUMENT);
  CHECK_STATUS(qc_name(cu, NULL), QC_INVALID_ARGUMENT);
  CHECK_STATUS(qc_temperature_from_energy(cu, NULL, 1, QC_PER_MASS, t),
               QC_INVALID_ARGUMENT);
  CHECK_MESSAGE("energies is a null pointer");

  /* The inverse outside the range's energies: the point, the interval, the range. */
  double energies[2] = {1e3, 1e12}, back[2];
  CHECK_STATUS(qc_temperature_from_energy(cu, energies, 2, QC_PER_MASS, back),
               QC_RANGE_ERROR);
  CHECK_MESSAGE("qc_temperature_from_energy: energies[1]: ");
  CHECK_MESSAGE("J/kg <= e <= ");
  CHECK_MESSAGE("but got 1e+12 J/kg");
  printf("inverse out of range: %s\n", qc_last_error());

  /* Equilibrium: one body, a mass <= 0, a null handle, a start outside the range. */
  const qc_material* bodies[] = {cu, cu};
  double masses[] = {1.0, 1.0}, starts[] = {300.0, 400.0}, tf = 0.0;
  CHECK_STATUS(qc_equilibrium(1, bodies, masses, starts, &tf, NULL), QC_INVALID_ARGUMENT);
  CHECK_MESSAGE("two or more bodies");
  masses[1] = -1.0;
  CHECK_STATUS(qc_equilibrium(2, bodies, masses, starts, &tf, NULL), QC_INVALID_ARGUMENT);
  CHECK_MESSAGE("bodies[1].mass = -1 kg: expected a mass > 0 kg");
  masses[1] = 1.0;
  const qc_material* with_null[] = {cu, NULL};
  CHECK_STATUS(qc_equilibrium(2, with_null, masses, starts, &tf, NULL),
               QC_INVALID_ARGUMENT);
  CHECK_MESSAGE("materials[1] is a null pointer");
  starts[0] = 1.0;
  CHECK_STATUS(qc_equilibrium(2, bodies, masses, starts, &tf, NULL), QC_RANGE_ERROR);
  CHECK_MESSAGE("qc_equilibrium: ");
  CHECK_MESSAGE("body 1");
  CHECK_MESSAGE("but got 1 K");
  starts[0] = 300.0;
  CHECK_STATUS(qc_equilibrium(2, bodies, masses, starts, &tf, NULL), QC_OK);
  CHECK(fabs(tf - 350.0) < 2.0); /* equal bodies: near the mean (c_p varies a few %) */

  /* Status names, and a wrapper's own message. */
  CHECK(strcmp(qc_status_name(QC_OK), "ok") == 0);
  CHECK(strcmp(qc_status_name(QC_INPUT_ERROR), "input error") == 0);
  CHECK(strcmp(qc_status_name(QC_RANGE_ERROR), "range error") == 0);
  CHECK(strcmp(qc_status_name(QC_NUMERICAL_ERROR), "numerical error") == 0);
  CHECK(strcmp(qc_status_name(QC_INVALID_ARGUMENT), "invalid argument") == 0);
  CHECK(strcmp(qc_status_name(QC_OUT_OF_MEMORY), "out of memory") == 0);
  CHECK(strcmp(qc_status_name(QC_INTERNAL_ERROR), "internal error") == 0);
  CHECK(strcmp(qc_status_name((qc_status)99), "unknown status") == 0);
  CHECK(qc_set_error(QC_INVALID_ARGUMENT, "wrapper: n = -1") == QC_INVALID_ARGUMENT);
  CHECK(strcmp(qc_last_error(), "wrapper: n = -1") == 0);
  qc_free(cu);
}

/* ---- 8 threads ----------------------------------------------------------------------
 */

enum { n_threads = 8, n_thread_points = 4096, n_thread_rounds = 200 };

typedef struct {
  const qc_material* material;
  const double* temperatures;
  const double* expected; /* 5 arrays of n_thread_points, single-thread results */
  int index;
  long mismatches;
  int message_ok;
} thread_job;

static int evaluate_in_thread(void* argument) {
  thread_job* job = (thread_job*)argument;
  double* out = malloc(5 * n_thread_points * sizeof(double));
  if (!out)
    return 1;
  for (int round = 0; round < n_thread_rounds; ++round) {
    /* Rotate the bases and flag sets over the rounds; compare what was asked. */
    const unsigned flags = round % 2 ? QC_ALL : QC_THERMAL;
    if (qc_evaluate(job->material, job->temperatures, n_thread_points, QC_PER_VOLUME,
                    flags, out, out + n_thread_points, out + 2 * n_thread_points,
                    out + 3 * n_thread_points, out + 4 * n_thread_points) != QC_OK) {
      ++job->mismatches;
      continue;
    }
    const int arrays = flags == QC_ALL ? 5 : 3;
    for (size_t i = 0; i < (size_t)arrays * n_thread_points; ++i)
      job->mismatches += out[i] != job->expected[i];
  }
  /* Each thread's own range error: its message names its own temperature, whatever
   * the other threads do in the meantime. */
  const double bad = 5000.0 + job->index;
  char mine[64];
  snprintf(mine, sizeof mine, "temperatures[0] = %d K", 5000 + job->index);
  job->message_ok = qc_evaluate(job->material, &bad, 1, QC_PER_MASS, QC_ENERGY, out, NULL,
                                NULL, NULL, NULL) == QC_RANGE_ERROR;
  for (int round = 0; round < 20; ++round) { /* others fail and succeed meanwhile */
    thrd_yield();
    job->message_ok = job->message_ok && strstr(qc_last_error(), mine) != NULL;
  }
  free(out);
  return 0;
}

static void test_threads(void) {
  qc_material* cu = load(copper_path);
  double lower, upper;
  CHECK_STATUS(qc_valid_range(cu, &lower, &upper), QC_OK);
  static double t[n_thread_points], expected[5 * n_thread_points];
  spread(lower, upper, n_thread_points, t);
  CHECK_STATUS(qc_evaluate(cu, t, n_thread_points, QC_PER_VOLUME, QC_ALL, expected,
                           expected + n_thread_points, expected + 2 * n_thread_points,
                           expected + 3 * n_thread_points,
                           expected + 4 * n_thread_points),
               QC_OK);
  /* The main thread's message stays its own. */
  CHECK(qc_set_error(QC_NUMERICAL_ERROR, "main thread") == QC_NUMERICAL_ERROR);
  thrd_t threads[n_threads];
  thread_job jobs[n_threads];
  for (int j = 0; j < n_threads; ++j) {
    jobs[j] = (thread_job){cu, t, expected, j, 0, 0};
    CHECK(thrd_create(&threads[j], evaluate_in_thread, &jobs[j]) == thrd_success);
  }
  long mismatches = 0;
  int messages_ok = 1;
  for (int j = 0; j < n_threads; ++j) {
    int result = 1;
    CHECK(thrd_join(threads[j], &result) == thrd_success && result == 0);
    mismatches += jobs[j].mismatches;
    messages_ok = messages_ok && jobs[j].message_ok;
  }
  printf("%d threads x %d rounds x %d points on one handle: %ld differences from the "
         "single-thread results; per-thread messages %s\n",
         n_threads, n_thread_rounds, n_thread_points, mismatches,
         messages_ok ? "kept" : "MIXED");
  CHECK(mismatches == 0);
  CHECK(messages_ok);
  CHECK(strcmp(qc_last_error(), "main thread") == 0);
  qc_free(cu);
}

/* ---- cost per point (printed, never checked) -----------------------------------------
 */

static double seconds_now(void) {
  struct timespec ts;
  timespec_get(&ts, TIME_UTC);
  return (double)ts.tv_sec + 1e-9 * (double)ts.tv_nsec;
}

/* Nanoseconds per point of qc_evaluate over n points in calls of `chunk` points. */
static double c_nanoseconds(const qc_material* m, const double* t, size_t n, size_t chunk,
                            int repeats) {
  static double e[1024], c[1024], dc[1024], k[1024], dk[1024];
  const double start = seconds_now();
  for (int r = 0; r < repeats; ++r)
    for (size_t i = 0; i < n; i += chunk)
      qc_evaluate(m, t + i, chunk, QC_PER_VOLUME, QC_ALL, e + i, c + i, dc + i, k + i,
                  dk + i);
  return (seconds_now() - start) * 1e9 / ((double)repeats * (double)n);
}

/* Best of interleaved rounds (C, then C++, in each), so load on the machine
 * falls on both alike. */
static void measure_cost(void) {
  enum { n = 1024, rounds = 15 };
  qc_material* cu = load(copper_path);
  double lower, upper;
  CHECK_STATUS(qc_valid_range(cu, &lower, &upper), QC_OK);
  static double t[n];
  spread(lower, upper, n, t);
  const size_t chunks[] = {n, 1};
  for (int s = 0; s < 2; ++s) {
    const int repeats = chunks[s] == 1 ? 20 : 200;
    double c_best = 1e30, cxx_best = 1e30;
    for (int round = 0; round < rounds; ++round) {
      c_best = fmin(c_best, c_nanoseconds(cu, t, n, chunks[s], repeats));
      cxx_best =
          fmin(cxx_best, reference_nanoseconds(copper_path, t, n, chunks[s], repeats));
    }
    printf("cost per point, all five properties of copper, %4zu points per call: C %6.1f "
           "ns, C++ %6.1f ns (C/C++ %.2f)\n",
           chunks[s], c_best, cxx_best, c_best / cxx_best);
  }
  qc_free(cu);
}

int main(void) {
  card_path(copper_path, "copper.yaml");
  card_path(aluminium_path, "aluminium.yaml");
  card_path(lead_path, "lead.yaml");
  card_path(al6061_path, "aluminium_6061.yaml");
  test_metadata();
  test_against_cxx(copper_path);
  test_against_cxx(aluminium_path);
  test_published();
  test_equilibrium();
  test_load_errors();
  test_call_errors();
  test_threads();
  measure_cost();
  if (failures) {
    fprintf(stderr, "test_c_api: %d checks failed\n", failures);
    return 1;
  }
  printf("test_c_api: all checks passed\n");
  return 0;
}
