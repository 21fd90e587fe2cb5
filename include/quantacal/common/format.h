// SPDX-License-Identifier: Apache-2.0
/**
 * @file format.h
 * @brief Number formatting shared by messages and output files.
 */
#ifndef QUANTACAL_COMMON_FORMAT_H
#define QUANTACAL_COMMON_FORMAT_H

#include <string>

namespace quantacal {

/**
 * Shortest text that reads back to the same double ("round-trip precision"),
 * locale-free; "nan", "inf" and "-inf" for the non-finite values.
 */
std::string format_double(double value);

} // namespace quantacal

#endif
