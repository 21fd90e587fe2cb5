// SPDX-License-Identifier: Apache-2.0
// Helpers for the command-line tests: run the built `quantacal` executable with
// its output redirected into a temporary folder, write temporary cards, parse CSV.
#ifndef QUANTACAL_TESTS_CLI_SUPPORT_H
#define QUANTACAL_TESTS_CLI_SUPPORT_H

#include <charconv>
#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <random>
#include <sstream>
#include <stdexcept>
#include <string>
#include <sys/wait.h>
#include <vector>

namespace quantacal::test {

/** A fresh folder under the system temp folder, removed with its contents at the end. */
class TempDir {
public:
  TempDir() {
    std::random_device device;
    const auto base = std::filesystem::temp_directory_path();
    for (int attempt = 0; attempt < 100; ++attempt) {
      auto candidate = base / ("quantacal-cli-" + std::to_string(device()));
      if (std::filesystem::create_directory(candidate)) {
        path_ = candidate;
        return;
      }
    }
    throw std::runtime_error("could not create a temporary folder");
  }
  ~TempDir() {
    std::error_code ignored;
    std::filesystem::remove_all(path_, ignored);
  }
  TempDir(const TempDir&) = delete;
  TempDir& operator=(const TempDir&) = delete;

  const std::filesystem::path& path() const { return path_; }

  /** Writes @p text to file @p name in the folder; returns its full path. */
  std::string write(const std::string& name, const std::string& text) const {
    const auto file = path_ / name;
    std::ofstream out(file);
    out << text;
    if (!out)
      throw std::runtime_error("could not write " + file.string());
    return file.string();
  }

private:
  std::filesystem::path path_;
};

/** Single-quotes @p s for /bin/sh. */
inline std::string shell_quote(const std::string& s) {
  std::string out = "'";
  for (const char c : s) {
    if (c == '\'')
      out += "'\\''";
    else
      out += c;
  }
  return out + "'";
}

inline std::string read_file(const std::filesystem::path& path) {
  std::ifstream in(path);
  std::ostringstream text;
  text << in.rdbuf();
  return text.str();
}

/** What a run of the executable produced. */
struct RunResult {
  int exit_code = -1;
  std::string out; ///< stdout
  std::string err; ///< stderr
};

/** Runs QUANTACAL_EXECUTABLE with @p args (each quoted for the shell). */
inline RunResult run_quantacal(const std::vector<std::string>& args) {
  TempDir dir;
  std::string command = shell_quote(QUANTACAL_EXECUTABLE);
  for (const auto& a : args)
    command += " " + shell_quote(a);
  command += " >" + shell_quote((dir.path() / "out").string()) + " 2>" +
             shell_quote((dir.path() / "err").string()) + " </dev/null";
  const int status = std::system(command.c_str());
  RunResult r;
  r.exit_code = WIFEXITED(status) ? WEXITSTATUS(status) : -1;
  r.out = read_file(dir.path() / "out");
  r.err = read_file(dir.path() / "err");
  return r;
}

/** Path of a file in the source tree. */
inline std::string source_path(const std::string& relative) {
  return std::string(QUANTACAL_SOURCE_DIR) + "/" + relative;
}

/** Splits @p text into lines (without the newline characters). */
inline std::vector<std::string> lines_of(const std::string& text) {
  std::vector<std::string> lines;
  std::istringstream in(text);
  for (std::string line; std::getline(in, line);)
    lines.push_back(line);
  return lines;
}

/** Parses a whole field as a double (locale-free); throws if it is not one number. */
inline double to_double(const std::string& field) {
  double v = 0.0;
  const auto r = std::from_chars(field.data(), field.data() + field.size(), v);
  if (r.ec != std::errc() || r.ptr != field.data() + field.size())
    throw std::runtime_error("not a number: '" + field + "'");
  return v;
}

/** The data rows of a CSV text (header skipped), each split at commas into numbers. */
inline std::vector<std::vector<double>> csv_rows(const std::string& text) {
  std::vector<std::vector<double>> rows;
  const auto lines = lines_of(text);
  for (std::size_t i = 1; i < lines.size(); ++i) {
    std::vector<double> row;
    std::istringstream in(lines[i]);
    for (std::string field; std::getline(in, field, ',');)
      row.push_back(to_double(field));
    rows.push_back(row);
  }
  return rows;
}

} // namespace quantacal::test

#endif
