// SPDX-License-Identifier: Apache-2.0
// Internal helpers of the fit engine (not installed).
#ifndef QUANTACAL_LIB_FIT_DETAIL_H
#define QUANTACAL_LIB_FIT_DETAIL_H

#include <quantacal/common/text.h>

#include <algorithm>
#include <cstddef>
#include <optional>
#include <string>
#include <vector>

namespace quantacal::fit::detail {

/** A whole string as a finite double, locale-free; nullopt otherwise. */
std::optional<double> parse_double(const std::string& text);

} // namespace quantacal::fit::detail

#endif
