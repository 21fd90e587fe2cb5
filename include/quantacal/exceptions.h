// SPDX-License-Identifier: Apache-2.0
/**
 * @file exceptions.h
 * @brief The exception types of quantacal (kept at this path for code written
 *        against earlier versions; the declarations live in common/exceptions.h).
 */
#ifndef QUANTACAL_EXCEPTIONS_H
#define QUANTACAL_EXCEPTIONS_H

#include <quantacal/common/exceptions.h>

#endif
