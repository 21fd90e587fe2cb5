// SPDX-License-Identifier: Apache-2.0
#include "options.h"

#include <quantacal/common/constants.h>
#include <quantacal/common/text.h>

#include <algorithm>
#include <charconv>
#include <cmath>
#include <sstream>

namespace quantacal::cli {
namespace {

/// Splits "12.5 K" or "12.5K" into the number and the unit text ("" if none).
bool split_number_unit(const std::string& raw, double& value, std::string& unit) {
  const std::string text = trim_blanks(raw);
  if (text.empty())
    return false;
  const char* begin = text.data();
  const char* end = begin + text.size();
  if (*begin == '+') // from_chars does not take a leading '+'
    ++begin;
  const auto result = std::from_chars(begin, end, value, std::chars_format::general);
  if (result.ec != std::errc() || !std::isfinite(value))
    return false;
  unit = trim_blanks(std::string(result.ptr, end));
  return true;
}

std::string quoted(const std::string& s) {
  return "\"" + s + "\"";
}

} // namespace

UsageError::UsageError(const std::string& message) : std::invalid_argument(message) {}

std::optional<double> parse_number(const std::string& text) {
  double value = 0.0;
  std::string unit;
  if (!split_number_unit(text, value, unit) || !unit.empty())
    return std::nullopt;
  return value;
}

double parse_temperature_argument(const std::string& text, const std::string& what) {
  double value = 0.0;
  std::string unit;
  if (split_number_unit(text, value, unit)) {
    if (unit.empty() || unit == "K")
      return value;
    if (unit == "degC")
      return value + celsius_offset;
  }
  throw UsageError(what + " = " + quoted(text) +
                   ": expected a temperature (a number in K, or with unit K or degC)");
}

std::string exit_code_help() {
  return "exit codes: 0 success, 1 a check failed, 2 invalid input (card, option,\n"
         "            argument), 3 numerical failure, 4 input/output failure\n";
}

// ---- ParsedOptions
// ---------------------------------------------------------------------

bool ParsedOptions::has(const std::string& name) const {
  return values.count(name) > 0;
}

std::optional<std::string> ParsedOptions::text(const std::string& name) const {
  const auto it = values.find(name);
  if (it == values.end())
    return std::nullopt;
  return it->second;
}

double ParsedOptions::number(const std::string& name, double fallback) const {
  const auto raw = text(name);
  if (!raw)
    return fallback;
  const auto value = parse_number(*raw);
  if (!value)
    throw UsageError("option --" + name + " = " + quoted(*raw) +
                     ": expected a finite number");
  return *value;
}

double ParsedOptions::temperature(const std::string& name, double fallback) const {
  const auto raw = text(name);
  if (!raw)
    return fallback;
  return parse_temperature_argument(*raw, "option --" + name);
}

double ParsedOptions::temperature_difference(const std::string& name,
                                             double fallback) const {
  const auto raw = text(name);
  if (!raw)
    return fallback;
  double value = 0.0;
  std::string unit;
  if (split_number_unit(*raw, value, unit) &&
      (unit.empty() || unit == "K" || unit == "degC"))
    return value; // a difference of 1 degC is a difference of 1 K
  throw UsageError("option --" + name + " = " + quoted(*raw) +
                   ": expected a temperature difference (a number in K, or with unit K)");
}

// ---- OptionParser
// ----------------------------------------------------------------------

OptionParser::OptionParser(std::string command, std::string synopsis,
                           std::string description)
    : command_(std::move(command)), synopsis_(std::move(synopsis)),
      description_(std::move(description)) {}

OptionParser& OptionParser::add_flag(const std::string& name, const std::string& help) {
  specs_.push_back(Spec{name, "", help, {}});
  return *this;
}

OptionParser& OptionParser::add_value(const std::string& name, const std::string& metavar,
                                      const std::string& help,
                                      std::vector<std::string> choices) {
  specs_.push_back(
      Spec{name, metavar.empty() ? "VALUE" : metavar, help, std::move(choices)});
  return *this;
}

OptionParser& OptionParser::add_epilogue(const std::string& text) {
  epilogue_.push_back(text);
  return *this;
}

const OptionParser::Spec* OptionParser::find(const std::string& name) const {
  for (const auto& spec : specs_)
    if (spec.name == name)
      return &spec;
  return nullptr;
}

ParsedOptions OptionParser::parse(const std::vector<std::string>& args) const {
  ParsedOptions out;
  bool options_ended = false;
  for (std::size_t i = 0; i < args.size(); ++i) {
    const std::string& arg = args[i];
    if (options_ended || arg.size() < 2 || arg[0] != '-') {
      out.positional.push_back(arg);
      continue;
    }
    if (arg == "--") {
      options_ended = true;
      continue;
    }
    if (arg == "-h" || arg == "--help") {
      out.help = true;
      continue;
    }
    if (arg.compare(0, 2, "--") != 0) {
      // A negative number is not an option; anything else with one dash is.
      if (parse_number(arg)) {
        out.positional.push_back(arg);
        continue;
      }
      throw UsageError("unknown option '" + arg + "' (options are written --name; " +
                       "run 'quantacal " + command_ + " --help')");
    }
    std::string name = arg.substr(2);
    std::optional<std::string> value;
    if (const auto eq = name.find('='); eq != std::string::npos) {
      value = name.substr(eq + 1);
      name = name.substr(0, eq);
    }
    const Spec* spec = find(name);
    if (!spec) {
      std::string message = "unknown option '--" + name + "'";
      std::vector<std::string> names;
      for (const auto& candidate : specs_)
        names.push_back(candidate.name);
      const std::string hint = did_you_mean(name, names, "--");
      if (!hint.empty())
        message += hint;
      else
        message += " (run 'quantacal " + command_ + " --help' for the options)";
      throw UsageError(message);
    }
    if (spec->metavar.empty()) {
      if (value)
        throw UsageError("option --" + name + " takes no value but got " +
                         quoted(*value));
      out.values[name] = "";
      continue;
    }
    if (!value) {
      if (i + 1 >= args.size())
        throw UsageError("option --" + name + " needs a value (" + spec->metavar + ")");
      value = args[++i];
    }
    if (!spec->choices.empty() && std::find(spec->choices.begin(), spec->choices.end(),
                                            *value) == spec->choices.end()) {
      std::string list;
      for (const auto& c : spec->choices)
        list += (list.empty() ? "" : ", ") + c;
      throw UsageError("option --" + name + " = " + quoted(*value) +
                       ": expected one of " + list);
    }
    out.values[name] = *value;
  }
  return out;
}

std::string OptionParser::usage() const {
  return "usage: quantacal " + command_ + (synopsis_.empty() ? "" : " " + synopsis_);
}

std::string OptionParser::help() const {
  std::ostringstream out;
  out << usage() << "\n\n" << description_;
  if (!description_.empty() && description_.back() != '\n')
    out << '\n';
  out << "\noptions:\n";
  std::vector<std::pair<std::string, std::string>> rows;
  for (const auto& spec : specs_) {
    std::string left = "--" + spec.name;
    if (!spec.metavar.empty())
      left += " " + spec.metavar;
    rows.emplace_back(left, spec.help);
  }
  rows.emplace_back("-h, --help", "show this help and exit");
  std::size_t width = 0;
  for (const auto& row : rows)
    width = std::max(width, row.first.size());
  for (const auto& [left, text] : rows) {
    out << "  " << left << std::string(width - left.size() + 2, ' ');
    // Continuation lines of a help text are indented under its first line.
    for (const char c : text) {
      out << c;
      if (c == '\n')
        out << std::string(width + 4, ' ');
    }
    out << '\n';
  }
  for (const auto& paragraph : epilogue_) {
    out << '\n' << paragraph;
    if (!paragraph.empty() && paragraph.back() != '\n')
      out << '\n';
  }
  return out.str();
}

} // namespace quantacal::cli
