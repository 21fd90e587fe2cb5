// SPDX-License-Identifier: Apache-2.0
/**
 * @file exceptions.h
 * @brief The exception types of quantacal: one per kind of failure.
 *
 * Every failure the library reports is one of three kinds, each a
 * std::runtime_error whose what() is built from members that carry the
 * context, so a caller can both print a message and act on its parts:
 *
 *  - CardError: a material card or a case file is malformed or non-physical
 *    (file, 1-based line and column, field path, raw value, what was expected);
 *  - RangeError: a function was called outside its domain (temperature <= 0,
 *    NaN, outside a material's valid range);
 *  - NumericalError: a computation did not reach its goal (a root finder that
 *    did not bracket, a table that could not reach its tolerance, a diverging
 *    solve).
 *
 * The library never calls exit(); the command line turns these into exit codes.
 */
#ifndef QUANTACAL_EXCEPTIONS_H
#define QUANTACAL_EXCEPTIONS_H

#include <stdexcept>
#include <string>

namespace quantacal {

/**
 * A malformed or non-physical input file. The message has the shape of a
 * compiler diagnostic:
 * `materials/copper.yaml:14:12: heat_capacity[0].theta = "-343 K": expected a temperature
 * > 0 K`
 */
class CardError : public std::runtime_error {
public:
  /**
   * @param file path of the file as given by the user ("" if none)
   * @param line 1-based line (0 if unknown)
   * @param column 1-based column (0 if unknown)
   * @param field path of the field, e.g. `heat_capacity[0].theta` ("" for the file)
   * @param value the raw text of the offending value ("" if none)
   * @param expected what was expected, or what is wrong, in words
   */
  CardError(std::string file, int line, int column, std::string field, std::string value,
            std::string expected);

  const std::string& file() const noexcept { return file_; }
  int line() const noexcept { return line_; }
  int column() const noexcept { return column_; }
  const std::string& field() const noexcept { return field_; }
  const std::string& value() const noexcept { return value_; }
  const std::string& expected() const noexcept { return expected_; }

private:
  std::string file_;
  int line_;
  int column_;
  std::string field_;
  std::string value_;
  std::string expected_;
};

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

/** Shortest text that reads back to the same double ("round-trip precision"). */
std::string format_double(double value);

} // namespace quantacal

#endif
