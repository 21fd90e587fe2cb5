// SPDX-License-Identifier: Apache-2.0
/**
 * @file fit_record.h
 * @brief The `fit` record of a card written by `quantacal fit`: which parameters
 *        were fitted, and their covariance.
 *
 * The card loader fills MaterialData::fit from the record (docs/fitting.md, "The
 * fitted card"); fit::band propagates the covariance to one-sigma bands of c_p, e
 * and k. The rest of the record (data file, checksum, statistics) is for the reader
 * of the card and is not kept here.
 */
#ifndef QUANTACAL_MATERIAL_FIT_RECORD_H
#define QUANTACAL_MATERIAL_FIT_RECORD_H

#include <string>
#include <vector>

namespace quantacal {

/** The fitted parameters of a card and their covariance matrix. */
struct FitRecord {
  /// Field paths of the fitted parameters, e.g. "heat_capacity[0].theta_D" or
  /// "conductivity.rrr", each naming a parameter of the card.
  std::vector<std::string> parameters;
  /// Covariance, SI units, rows and columns in the order of `parameters`: square,
  /// symmetric, finite, with a non-negative diagonal.
  std::vector<std::vector<double>> covariance;
};

} // namespace quantacal

#endif
