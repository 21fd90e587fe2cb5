/* SPDX-License-Identifier: Apache-2.0 */
/* An outside C program on the installed C interface (quantacal::c): loads a card,
 * prints c_p(300 K) in J/kg/K in the same form as the C++ consumer, the inverse of
 * e(350 K), and the message of a card that does not exist. */
#include <quantacal/c/quantacal.h>

#include <stdio.h>

int main(int argc, char** argv) {
  if (argc != 2) {
    fprintf(stderr, "usage: c_consumer CARD\n");
    return 2;
  }
  qc_material* material = NULL;
  if (qc_load_card(argv[1], &material) != QC_OK) {
    fprintf(stderr, "c_consumer: error: %s\n", qc_last_error());
    return 2;
  }
  const double t[2] = {300.0, 350.0};
  double e[2], c[2], back = 0.0;
  if (qc_evaluate(material, t, 2, QC_PER_MASS, QC_ENERGY | QC_CAPACITY, e, c, NULL, NULL,
                  NULL) != QC_OK ||
      qc_temperature_from_energy(material, &e[1], 1, QC_PER_MASS, &back) != QC_OK) {
    fprintf(stderr, "c_consumer: error: %s\n", qc_last_error());
    qc_free(material);
    return 2;
  }
  printf("C cp(300 K) = %.17g J/kg/K\n", c[0]);
  printf("C cp(300 K) bits = %a\n", c[0]);
  printf("C T(e(350 K)) = %.17g K\n", back);
  qc_free(material);
  qc_material* missing = NULL;
  const qc_status s = qc_load_card("no-such-card.yaml", &missing);
  printf("C missing card: %s: %s\n", qc_status_name(s), qc_last_error());
  return s == QC_INPUT_ERROR && missing == NULL ? 0 : 2;
}
