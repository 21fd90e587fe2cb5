// SPDX-License-Identifier: Apache-2.0
// Internal: reading the `fit` record of a card into its Material.
#ifndef QUANTACAL_LIB_CARDS_FIT_RECORD_READER_H
#define QUANTACAL_LIB_CARDS_FIT_RECORD_READER_H

#include "card_reader.h"

#include <quantacal/material/material.h>

#include <yaml-cpp/yaml.h>

namespace quantacal::detail {

/**
 * @p material with its MaterialData::fit read from the card's top-level `fit`
 * block (unchanged if the card has none). The parameter paths are resolved
 * against @p material as loaded.
 * @throws CardError located at the offending node for a malformed record: an
 *         unknown key, no parameter list, a path the card does not have, a
 *         covariance that is not square, finite, symmetric, with a non-negative
 *         diagonal
 */
MaterialPtr with_fit_record(const CardReader& reader, const YAML::Node& root,
                            MaterialPtr material);

} // namespace quantacal::detail

#endif
