// SPDX-License-Identifier: Apache-2.0
// Internal: the vocabulary of case files (quantities with units, counts,
// switches, points, paths, curves), on top of the cards layer's located YAML
// access (lib/cards/card_reader.h), and the readers of the case file's sections.
//
// Every error is an InputError with the case file, the 1-based line and
// column, the field path, the raw value and what was expected, in the form
// `case.yaml:6:22: time.end = "-1 s": expected a time > 0` (docs/cases.md).
// No deal.II here, so these translation units compile quickly.
#ifndef QUANTACAL_LIB_SOLVER_CASE_READER_H
#define QUANTACAL_LIB_SOLVER_CASE_READER_H

#include "card_reader.h"

#include <quantacal/cards/units.h>
#include <quantacal/solver/case.h>

#include <yaml-cpp/yaml.h>

#include <string>
#include <vector>

namespace quantacal::solver::detail {

/** Located reading of one case file. */
class CaseReader {
public:
  /**
   * @param file case file name used in messages
   * @param base_directory folder against which relative paths are resolved
   */
  CaseReader(std::string file, std::string base_directory);

  const std::string& file() const noexcept { return cards_.file(); }

  /** Line, column, field and raw text of @p node. */
  CaseLocation where(const YAML::Node& node, const std::string& field) const;

  /** Throws at @p node: `field = "value": expected <expected>`. */
  [[noreturn]] void fail(const YAML::Node& node, const std::string& field,
                         const std::string& expected) const;

  /** Throws at @p parent that its key @p key is missing. */
  [[noreturn]] void fail_missing(const YAML::Node& parent,
                                 const std::string& parent_field, const std::string& key,
                                 const std::string& expected) const;

  /** Requires a mapping whose keys are all in @p allowed, each once. */
  void check_keys(const YAML::Node& node, const std::string& field,
                  const std::vector<std::string>& allowed) const;

  /** The scalar text of @p node. */
  std::string text(const YAML::Node& node, const std::string& field) const;

  /** A quantity of dimension @p dimension in SI; @p expected names it in messages. */
  double quantity(const YAML::Node& node, const std::string& field,
                  const Dimension& dimension, const std::string& expected) const;

  /** A plain number. */
  double number(const YAML::Node& node, const std::string& field,
                const std::string& expected) const;

  /** A whole number in [lowest, highest]. */
  unsigned int count(const YAML::Node& node, const std::string& field,
                     const std::string& expected, unsigned int lowest,
                     unsigned int highest) const;

  /** true/yes/on or false/no/off. */
  bool boolean(const YAML::Node& node, const std::string& field) const;

  /**
   * A quantity > 0. A temperature read here is a difference (a tolerance, an
   * error estimate): "0.1 degC" gives 0.1 K; absolute temperatures use temperature().
   */
  double positive(const YAML::Node& node, const std::string& field,
                  const Dimension& dimension, const std::string& what) const;

  /** A temperature > 0 K. */
  double temperature(const YAML::Node& node, const std::string& field) const;

  /** A list of @p dimension lengths. */
  std::vector<double> point(const YAML::Node& node, const std::string& field,
                            int dimension) const;

  /** A file path, resolved against the case file's folder. */
  std::string path(const YAML::Node& node, const std::string& field) const;

  /** What a curve's columns are, for reading and for messages. */
  struct CurveColumns {
    Dimension x_dimension;
    std::string x_description; ///< e.g. "a time"
    Dimension y_dimension;
    std::string y_description; ///< e.g. "a temperature"
    bool positive_y = false;   ///< y > 0 (else y >= 0)
  };

  /**
   * A single value (a constant) or a table of pairs [[x, y], ...], x increasing;
   * a temperature column x > 0 K, a time column x >= 0 s; y > 0 if positive_y,
   * else a table's y >= 0 (the caller checks a single value).
   */
  Curve curve(const YAML::Node& node, const std::string& field,
              const CurveColumns& columns) const;

private:
  /** The domain of a curve's first column: temperatures > 0 K, times >= 0 s. */
  void check_abscissa(const YAML::Node& node, const std::string& field,
                      const CurveColumns& columns, double x) const;

  quantacal::detail::CardReader cards_;
  std::string base_directory_;
};

// The sections of a case file, in the order read_case reads them; each reads
// its part of @p root into @p description (case_file.cc, case_conditions.cc,
// case_settings.cc).
void read_mesh(const CaseReader& reader, const YAML::Node& root,
               CaseDescription& description);
void read_materials(const CaseReader& reader, const YAML::Node& root, bool load_materials,
                    CaseDescription& description);
void read_boundaries(const CaseReader& reader, const YAML::Node& root,
                     CaseDescription& description);
void read_sources(const CaseReader& reader, const YAML::Node& root,
                  CaseDescription& description);
void read_time(const CaseReader& reader, const YAML::Node& root,
               CaseDescription& description);
void read_output(const CaseReader& reader, const YAML::Node& root,
                 CaseDescription& description);
void read_solver_settings(const CaseReader& reader, const YAML::Node& root,
                          CaseDescription& description);
void read_adaptivity(const CaseReader& reader, const YAML::Node& root,
                     CaseDescription& description); // case_adaptivity.cc

} // namespace quantacal::solver::detail

#endif
