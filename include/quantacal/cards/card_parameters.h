// SPDX-License-Identifier: Apache-2.0
/**
 * @file card_parameters.h
 * @brief The numeric parameters of a loaded card, named by their field paths.
 *
 * A parameter is named `heat_capacity[i].<name>` (a parameter of the i-th
 * heat-capacity contribution, as its card key) or `conductivity.<name>` (a
 * parameter of a conductivity of kind `metal`; the other kinds have none to
 * name). `quantacal fit --free`, the `fit` record of a fitted card and
 * edit_card() (card_writer.h) use these names (docs/fitting.md, "Naming
 * parameters").
 */
#ifndef QUANTACAL_CARDS_CARD_PARAMETERS_H
#define QUANTACAL_CARDS_CARD_PARAMETERS_H

#include <quantacal/material/material.h>

#include <cstddef>
#include <string>
#include <vector>

namespace quantacal {

/** One numeric parameter of a card. */
struct CardParameter {
  std::string path;          ///< heat_capacity[i].<name> or conductivity.<name>
  bool conductivity = false; ///< a parameter of the `metal` conductivity
  std::size_t index = 0;     ///< contribution index (heat capacity)
  std::string name;          ///< parameter name (card key)
  std::string unit;          ///< SI unit ("1" for a bare number)
  double value = 0.0;        ///< the card's value, SI
};

/**
 * Every parameter of @p material: those of its heat-capacity contributions in
 * order, then those of a `metal` conductivity.
 */
std::vector<CardParameter> card_parameters(const Material& material);

/**
 * Resolves parameter names: a full path, or a bare name when it is unique among
 * the heat-capacity contributions (`theta_D` for `heat_capacity[0].theta_D`).
 * @param material the card
 * @param names the names, each once
 * @param option what the names were given as, the start of every message
 *        (e.g. "--free"; "" for none)
 * @return the parameters, in the order of @p names
 * @throws InputError (InputError::argument, `option: ...`) for an unknown name
 *         (with "did you mean" and the card's parameters), an ambiguous bare name
 *         (listing its full paths), a parameter named twice, an empty list
 */
std::vector<CardParameter> resolve_card_parameters(const Material& material,
                                                   const std::vector<std::string>& names,
                                                   const std::string& option);

} // namespace quantacal

#endif
