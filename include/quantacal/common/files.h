// SPDX-License-Identifier: Apache-2.0
/**
 * @file files.h
 * @brief Writing a whole file so that a reader never sees half of it.
 *
 * Why it exists: a card saved by `fit` and the result files of a run are
 * written while other programs (a plot, a file watcher, the user) may read
 * them, and a write can fail half-way (disk full, a folder made read-only).
 * Every file quantacal writes goes through one function that writes a
 * temporary file next to the target and renames it over the target: the
 * target is either the old file or the complete new one.
 */
#ifndef QUANTACAL_COMMON_FILES_H
#define QUANTACAL_COMMON_FILES_H

#include <string>

namespace quantacal {

/**
 * Writes @p content to @p path through `<path>.tmp` and a rename (atomic on
 * POSIX file systems when both lie in one folder, which they do).
 * @param path the file to create or replace; its folder must exist
 * @param content the bytes to write
 * @throws std::ios_base::failure if the temporary file cannot be opened or
 *         written, or the rename fails; the message names the file. The
 *         temporary file is removed, and @p path is left as it was.
 */
void write_file_atomically(const std::string& path, const std::string& content);

} // namespace quantacal

#endif
