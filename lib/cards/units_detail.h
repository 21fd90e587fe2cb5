// SPDX-License-Identifier: Apache-2.0
// Internal helpers of the card layer shared by units.cc and the card readers.
#ifndef QUANTACAL_LIB_CARDS_UNITS_DETAIL_H
#define QUANTACAL_LIB_CARDS_UNITS_DETAIL_H

#include <quantacal/cards/units.h>
#include <quantacal/common/text.h>

#include <cstddef>
#include <string>
#include <vector>

namespace quantacal::detail {

/** "a temperature (K, mK or degC)", "a molar energy (e.g. J/mol)", ... */
std::string dimension_description(const Dimension& d);

/** A whole string as a finite number, locale-free; InputError otherwise. */
double parse_number(const std::string& text);

} // namespace quantacal::detail

#endif
