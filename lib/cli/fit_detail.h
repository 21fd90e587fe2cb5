// SPDX-License-Identifier: Apache-2.0
// Internal helpers of the fit engine (not installed).
#ifndef QUANTACAL_CLI_FIT_DETAIL_H
#define QUANTACAL_CLI_FIT_DETAIL_H

#include <quantacal/detail/text.h>

#include <algorithm>
#include <cstddef>
#include <optional>
#include <string>
#include <vector>

namespace quantacal::fit::detail {

/** Levenshtein distance (the core library's). */
using quantacal::detail::edit_distance;

/** " (did you mean 'x'?)" for the closest choice, or "" when none is close. */
std::string did_you_mean(const std::string& word,
                         const std::vector<std::string>& choices);

/** A whole string as a finite double, locale-free; nullopt otherwise. */
std::optional<double> parse_double(const std::string& text);

} // namespace quantacal::fit::detail

#endif
