// SPDX-License-Identifier: Apache-2.0
#include <quantacal/common/exceptions.h>
#include <quantacal/common/format.h>

namespace quantacal {
namespace {

std::string card_message(const std::string& file, int line, int column,
                         const std::string& field, const std::string& value,
                         const std::string& expected) {
  std::string m = file.empty() ? std::string("<card>") : file;
  if (line > 0) {
    m += ':' + std::to_string(line);
    if (column > 0)
      m += ':' + std::to_string(column);
  }
  m += ": ";
  if (!field.empty()) {
    m += field;
    if (!value.empty())
      m += " = \"" + value + "\"";
    m += ": ";
  }
  m += expected;
  return m;
}

} // namespace

InputError::InputError(std::string file, int line, int column, std::string field,
                       std::string value, std::string expected)
    : std::invalid_argument(card_message(file, line, column, field, value, expected)),
      file_(std::move(file)), line_(line), column_(column), field_(std::move(field)),
      value_(std::move(value)), expected_(std::move(expected)) {}

InputError::InputError(Message message, std::string field, std::string value,
                       std::string expected)
    : std::invalid_argument(message.text), line_(0), column_(0), field_(std::move(field)),
      value_(std::move(value)), expected_(std::move(expected)) {}

InputError InputError::argument(const std::string& function, std::string field,
                                std::string value, std::string expected) {
  std::string text = function.empty() ? std::string() : function + ": ";
  if (!field.empty())
    text += field + " = " + value + ": expected ";
  text += expected;
  return InputError(Message{std::move(text)}, std::move(field), std::move(value),
                    std::move(expected));
}

RangeError::RangeError(std::string function, std::string subject, std::string condition,
                       double value, std::string unit)
    : std::runtime_error(function + ": " +
                         (subject.empty() ? std::string() : subject + ": ") +
                         "requires " + condition + " but got " + format_double(value) +
                         (unit.empty() ? std::string() : " " + unit)),
      function_(std::move(function)), subject_(std::move(subject)),
      condition_(std::move(condition)), value_(value) {}

NumericalError::NumericalError(std::string function, const std::string& what)
    : std::runtime_error(function + ": " + what), function_(std::move(function)) {}

} // namespace quantacal
