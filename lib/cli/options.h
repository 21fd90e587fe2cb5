// SPDX-License-Identifier: Apache-2.0
/**
 * @file options.h
 * @brief The small command-line option parser shared by the `quantacal` sub-commands.
 *
 * Why it exists: every sub-command takes a few long options and some
 * positional arguments, and all of them must reject a bad option the same
 * way (a message naming the option and what was expected, exit code 2,
 * nothing written to stdout). One parser keeps that behaviour in one place.
 *
 * Usage, in a sub-command:
 * @code
 *   OptionParser parser("table", "CARD [options]", "Prints a property table as CSV.");
 *   parser.add_value("from", "K", "first temperature (default: the card's lower limit)");
 *   parser.add_flag("exact", "evaluate the model instead of the cached table");
 *   const ParsedOptions options = parser.parse(args); // throws UsageError
 *   if (options.help) { std::cout << parser.help(); return ok; }
 *   const double from = options.temperature("from", material->lower_temperature());
 * @endcode
 *
 * Accepted syntax: `--name value`, `--name=value`, `--flag`, `-h`/`--help`,
 * and `--` to end the options (everything after it is positional). A
 * positional argument may start with '-' only after `--`, except a lone "-" and a
 * negative number.
 * Numbers are read locale-free (std::from_chars); NaN and inf are rejected.
 */
#ifndef QUANTACAL_CLI_OPTIONS_H
#define QUANTACAL_CLI_OPTIONS_H

#include <quantacal/common/text.h>

#include <map>
#include <optional>
#include <stdexcept>
#include <string>
#include <vector>

namespace quantacal::cli {

/**
 * A malformed command line (unknown option, missing or malformed value,
 * wrong number of arguments). Derives from std::invalid_argument, so
 * `guarded` (command_registry.h) reports it with exit code 2.
 */
class UsageError : public std::invalid_argument {
public:
  /**
   * @param message what is wrong, e.g. "option --step = \"-1\": expected a temperature
   * step > 0 K"
   */
  explicit UsageError(const std::string& message);
};

/** The result of OptionParser::parse: option values by name, and the positional
 * arguments. */
class ParsedOptions {
public:
  bool help = false;                   ///< -h or --help was given
  std::vector<std::string> positional; ///< arguments that are not options, in order

  /** True if flag or valued option @p name (without "--") was given. */
  bool has(const std::string& name) const;

  /** The raw text of valued option @p name, if given (the last one wins). */
  std::optional<std::string> text(const std::string& name) const;

  /**
   * Valued option @p name as a plain number, or @p fallback if not given.
   * @throws UsageError if the value is not a finite number
   */
  double number(const std::string& name, double fallback) const;

  /**
   * Valued option @p name as an absolute temperature, K: a plain number is in
   * kelvin; "300 K", "300K" and "26.85 degC" are accepted too.
   * @param name option name without "--"
   * @param fallback value returned (K) if the option was not given
   * @throws UsageError if the value is not a finite temperature
   */
  double temperature(const std::string& name, double fallback) const;

  /**
   * Valued option @p name as a temperature difference, K: a plain number is in
   * kelvin; "5 K" and "5 degC" (a difference of 5 K) are accepted too.
   * @throws UsageError if the value is not a finite temperature difference
   */
  double temperature_difference(const std::string& name, double fallback) const;

  /** Internal: values as parsed (flags map to ""). */
  std::map<std::string, std::string> values;
};

/**
 * Declares the options of one sub-command, parses its arguments and writes
 * its --help text. Option names are given without the leading "--".
 */
class OptionParser {
public:
  /**
   * @param command sub-command name, e.g. "table" (used in messages and help)
   * @param synopsis what follows the command name in the usage line, e.g. "CARD
   * [options]"
   * @param description one or more paragraphs shown after the usage line
   */
  OptionParser(std::string command, std::string synopsis, std::string description);

  /** Declares a flag (an option without a value). */
  OptionParser& add_flag(const std::string& name, const std::string& help);

  /**
   * Declares an option that takes a value.
   * @param name option name without "--"
   * @param metavar placeholder for the value in the help text, e.g. "K"
   * @param help one line of help (more lines may be separated by '\n')
   * @param choices if not empty, the only values accepted
   */
  OptionParser& add_value(const std::string& name, const std::string& metavar,
                          const std::string& help, std::vector<std::string> choices = {});

  /** Adds a paragraph at the end of the help text (exit codes, notes). */
  OptionParser& add_epilogue(const std::string& text);

  /**
   * Parses @p args (the arguments after the sub-command name).
   * @throws UsageError for an unknown option (with "did you mean" when one is
   *         close), a missing value, a value not among the choices, or a value
   *         given to a flag
   */
  ParsedOptions parse(const std::vector<std::string>& args) const;

  /** The full --help text, ending with a newline. */
  std::string help() const;

  /** Short usage line, e.g. "usage: quantacal table CARD [options]". */
  std::string usage() const;

  /** The sub-command name given to the constructor. */
  const std::string& command() const noexcept { return command_; }

private:
  struct Spec {
    std::string name;
    std::string metavar; ///< "" for a flag
    std::string help;
    std::vector<std::string> choices;
  };
  const Spec* find(const std::string& name) const;

  std::string command_;
  std::string synopsis_;
  std::string description_;
  std::vector<Spec> specs_;
  std::vector<std::string> epilogue_;
};

/**
 * Parses a whole string as a finite double, locale-free.
 * @return the value, or std::nullopt if @p text is not exactly one finite number
 */
std::optional<double> parse_number(const std::string& text);

/**
 * Reads a temperature given on the command line: a plain number is in K,
 * otherwise a quantity with a temperature unit ("300 K", "26.85 degC").
 * @param text the text
 * @param what what the value is, for the message, e.g. "option --from"
 * @return T, K
 * @throws UsageError naming @p what and the text
 */
double parse_temperature_argument(const std::string& text, const std::string& what);

/** The exit-code paragraph shared by the sub-commands' --help. */
std::string exit_code_help();

} // namespace quantacal::cli

#endif
