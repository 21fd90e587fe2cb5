// SPDX-License-Identifier: Apache-2.0
// Starting gnuplot from the command layer, without a shell.
#ifndef QUANTACAL_CLI_GNUPLOT_H
#define QUANTACAL_CLI_GNUPLOT_H

#include <string>

namespace quantacal::cli {

/**
 * Runs `gnuplot <script>` as a child process with an argument vector (no
 * shell, so folder names with spaces, quotes or `$` need no escaping), in the
 * script's folder, so the script may name its data files relative to it.
 * Standard output is discarded; standard error is kept for the message.
 * @param script_path path of the gnuplot script
 * @return "" on success, else why no plot was made (gnuplot not installed, or its
 *         exit status and first line of error output)
 */
std::string run_gnuplot(const std::string& script_path);

} // namespace quantacal::cli

#endif
