// SPDX-License-Identifier: Apache-2.0
/**
 * @file card.h
 * @brief Loading YAML material cards into Materials.
 *
 * The card format is documented in docs/cards.md. Every error is a CardError
 * naming the file, line, column, field path and value.
 */
#ifndef QUANTACAL_CARDS_CARD_H
#define QUANTACAL_CARDS_CARD_H

#include <quantacal/material/material.h>

#include <string>

namespace quantacal {

/**
 * Loads the card at @p path (components of a composition are resolved
 * relative to the card's folder, and cycles are reported).
 * @param path file path
 * @return the material, immutable and shareable
 * @throws CardError for any malformed, mis-united or non-physical content
 */
MaterialPtr load_card(const std::string& path);

/**
 * Loads a card from text (for tests and embedded cards).
 * @param text YAML text
 * @param file name used in messages and to resolve composition paths
 */
MaterialPtr load_card_from_string(const std::string& text, const std::string& file);

} // namespace quantacal

#endif
