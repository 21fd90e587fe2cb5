// SPDX-License-Identifier: Apache-2.0
// Sub-commands of the `quantacal` executable register themselves here.
#ifndef QUANTACAL_CLI_COMMAND_REGISTRY_H
#define QUANTACAL_CLI_COMMAND_REGISTRY_H

#include <functional>
#include <map>
#include <string>
#include <vector>

namespace quantacal::cli {

/**
 * Exit codes of the command (documented in README.md and `quantacal --help`):
 * 0 success; 1 ran but a check failed (e.g. `check` outside tolerance);
 * 2 invalid input (bad card, bad case, bad option); 3 numerical failure
 * (no convergence, diverging solve); 4 input/output failure.
 */
enum ExitCode : int {
  ok = 0,
  check_failed = 1,
  invalid_input = 2,
  numerical = 3,
  io = 4
};

/** A sub-command: gets its arguments after the sub-command name. */
using CommandFunction = std::function<int(const std::vector<std::string>& args)>;

struct Command {
  std::string name;
  std::string summary; ///< one line for `quantacal --help`
  CommandFunction run;
};

std::map<std::string, Command>& command_registry();

/** Registers a command at static-initialisation time. */
struct CommandRegistrar {
  CommandRegistrar(std::string name, std::string summary, CommandFunction run);
};

/**
 * Runs @p body, turning quantacal exceptions into a message on stderr and the
 * documented exit code (CardError -> 2, RangeError -> 2, NumericalError -> 3,
 * std::ios_base::failure / filesystem errors -> 4, std::invalid_argument -> 2).
 */
int guarded(const std::string& command, const std::function<int()>& body);

} // namespace quantacal::cli

#endif
