// SPDX-License-Identifier: Apache-2.0
/**
 * @file version.h
 * @brief The single source of the quantacal version; CMake parses it.
 */
#ifndef QUANTACAL_VERSION_H
#define QUANTACAL_VERSION_H

#define QUANTACAL_VERSION_MAJOR 0
#define QUANTACAL_VERSION_MINOR 1
#define QUANTACAL_VERSION_PATCH 0
#define QUANTACAL_VERSION_STRING "0.1.0"

#endif
