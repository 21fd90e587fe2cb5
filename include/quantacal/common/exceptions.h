// SPDX-License-Identifier: Apache-2.0
/**
 * @file exceptions.h
 * @brief The exception types of quantacal: one per kind of failure.
 *
 * Every failure the library reports is one of three kinds, each a standard
 * exception (InputError a std::invalid_argument, the others
 * std::runtime_error) whose what() is built from members that carry the
 * context, so a caller can both print a message and act on its parts:
 *
 *  - InputError: an input is malformed or non-physical: a card, a case file,
 *    a data file, a unit string or a parameter of a library call (file,
 *    1-based line and column, field path, raw value, what was expected);
 *  - RangeError: a function was called outside its domain (temperature <= 0,
 *    NaN, outside a material's valid range);
 *  - NumericalError: a computation did not reach its goal (a root finder that
 *    did not bracket, a table that could not reach its tolerance, a diverging
 *    solve).
 *
 * No other exception type leaves a public call of quantacal except
 * std::bad_alloc and, where a call writes files, std::ios_base::failure (each
 * call documents its @throws). The library never calls exit(); the command
 * line turns these into exit codes.
 */
#ifndef QUANTACAL_COMMON_EXCEPTIONS_H
#define QUANTACAL_COMMON_EXCEPTIONS_H

#include <quantacal/common/format.h>

#include <stdexcept>
#include <string>

namespace quantacal {

/**
 * Malformed or non-physical input: a material card, a case file, a
 * measurement CSV, a quantity with its unit, or a parameter handed to a
 * library call (then `file` is empty and `field` names the parameter). The
 * one input-error type of quantacal. The message has the shape of a compiler
 * diagnostic:
 * `materials/copper.yaml:14:12: heat_capacity[0].theta = "-343 K": expected a temperature
 * > 0 K`
 */
class InputError : public std::invalid_argument {
public:
  /**
   * @param file path of the file as given by the user ("" if none)
   * @param line 1-based line (0 if unknown)
   * @param column 1-based column (0 if unknown)
   * @param field path of the field, e.g. `heat_capacity[0].theta` ("" for the file)
   * @param value the raw text of the offending value ("" if none)
   * @param expected what was expected, or what is wrong, in words
   */
  InputError(std::string file, int line, int column, std::string field, std::string value,
             std::string expected);

  /**
   * A bad parameter of a library call (no file):
   * `function: field = value: expected` (`function: expected` if @p field is empty;
   * without `function: ` if @p function is empty).
   * @param function the call or object kind, e.g. "debye" or "Material" (may be "")
   * @param field parameter name ("" if the message names it)
   * @param value the offending value as text, with its unit ("" if none)
   * @param expected what was expected, or what is wrong, in words
   */
  static InputError argument(const std::string& function, std::string field,
                             std::string value, std::string expected);

  const std::string& file() const noexcept { return file_; }
  int line() const noexcept { return line_; }
  int column() const noexcept { return column_; }
  const std::string& field() const noexcept { return field_; }
  const std::string& value() const noexcept { return value_; }
  const std::string& expected() const noexcept { return expected_; }

private:
  struct Message {
    std::string text;
  };
  InputError(Message message, std::string field, std::string value, std::string expected);

  std::string file_;
  int line_;
  int column_;
  std::string field_;
  std::string value_;
  std::string expected_;
};

/// The name of InputError in code written before case files and data files shared it.
using CardError = InputError;

/**
 * A function called outside its domain, reported the Boost.Math way:
 * `quantacal::Debye::evaluate: copper: requires 0 < T < inf but got T = -3 K`.
 */
class RangeError : public std::runtime_error {
public:
  /**
   * @param function the function that was called
   * @param subject the material or object it was called on ("" if none)
   * @param condition the condition that failed, e.g. "4 K <= T <= 1357 K"
   * @param value the offending value in SI units (may be NaN or inf)
   * @param unit the unit of @p value, e.g. "K"
   */
  RangeError(std::string function, std::string subject, std::string condition,
             double value, std::string unit = "K");

  const std::string& function() const noexcept { return function_; }
  const std::string& subject() const noexcept { return subject_; }
  const std::string& condition() const noexcept { return condition_; }
  double value() const noexcept { return value_; }

private:
  std::string function_;
  std::string subject_;
  std::string condition_;
  double value_;
};

/** A computation that did not reach its goal (no bracket, no convergence, tolerance
 * missed). */
class NumericalError : public std::runtime_error {
public:
  /**
   * @param function the function that failed
   * @param what what went wrong, with the figures that show it
   */
  NumericalError(std::string function, const std::string& what);

  const std::string& function() const noexcept { return function_; }

private:
  std::string function_;
};

} // namespace quantacal

#endif
