// SPDX-License-Identifier: Apache-2.0
/**
 * @file text.h
 * @brief Small text helpers shared by the card loader and the command line.
 */
#ifndef QUANTACAL_DETAIL_TEXT_H
#define QUANTACAL_DETAIL_TEXT_H

#include <cstddef>
#include <string>
#include <vector>

namespace quantacal::detail {

/** Levenshtein distance (insertions, deletions, substitutions) between two words. */
std::size_t edit_distance(const std::string& a, const std::string& b);

/** " (did you mean 'x'?)" for the nearest candidate within 2 edits, else "". */
std::string did_you_mean(const std::string& word,
                         const std::vector<std::string>& candidates);

} // namespace quantacal::detail

#endif
