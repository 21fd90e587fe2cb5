// SPDX-License-Identifier: Apache-2.0
/**
 * @file text.h
 * @brief The one "did you mean" of quantacal, used by every reader (cards,
 *        case files, data files, units) and by the command-line options, and
 *        the one trim of their fields, and the one escape of text put into
 *        XML or HTML (the MatML export, report.html).
 *
 * Why it exists: a misspelt key, unit, column or option should get the same
 * suggestion whichever reader found it, so there is one distance and one
 * threshold rule.
 */
#ifndef QUANTACAL_COMMON_TEXT_H
#define QUANTACAL_COMMON_TEXT_H

#include <cstddef>
#include <string>
#include <vector>

namespace quantacal {

/**
 * Levenshtein distance (insertions, deletions, substitutions) between two words.
 * @return the number of single-character edits that turn @p a into @p b
 */
std::size_t edit_distance(const std::string& a, const std::string& b);

/**
 * The nearest of @p candidates to @p word, if it is a near miss: a candidate
 * that differs only in letter case, else the nearest by edit distance when
 * that distance is at most max(1, min(n / 2, max(3, n / 3))) for a word of n
 * characters (1 edit for words of up to 3 characters, 2 for 4 and 5, 3 up to
 * 11, then n / 3).
 * @return the candidate, or "" when none is near enough
 */
std::string nearest_word(const std::string& word,
                         const std::vector<std::string>& candidates);

/**
 * " (did you mean 'x'?)" with x = nearest_word(word, candidates), or "".
 * @param quote_prefix written before x inside the quotes, e.g. "--" for options
 */
std::string did_you_mean(const std::string& word,
                         const std::vector<std::string>& candidates,
                         const std::string& quote_prefix = "");

/** @p s without leading and trailing spaces, tabs and carriage returns. */
std::string trim_blanks(const std::string& s);

/**
 * @p s with & < > " ' written as character references, so it can stand in
 * XML or HTML text and in attribute values of either quote. The apostrophe
 * becomes "&#39;", which XML and every HTML version read.
 */
std::string markup_escape(const std::string& s);

} // namespace quantacal

#endif
