// SPDX-License-Identifier: Apache-2.0
// Internal: reading one YAML card with locations in every error.
//
// All access goes through const YAML::Node, IsDefined() is checked before
// any conversion, and every failure becomes a CardError naming the file, the
// 1-based line and column, the field path and the raw value.
#ifndef QUANTACAL_LIB_CARDS_CARD_READER_H
#define QUANTACAL_LIB_CARDS_CARD_READER_H

#include <quantacal/cards/units.h>
#include <quantacal/common/exceptions.h>
#include <quantacal/material/material.h>
#include <quantacal/models/conductivity.h>
#include <quantacal/models/contribution.h>
#include <quantacal/models/heat_capacity_model.h>
#include <quantacal/models/phases.h>

#include <yaml-cpp/yaml.h>

#include <filesystem>
#include <optional>
#include <string>
#include <vector>

namespace quantacal::detail {

/** "a.b", "a[3]" */
/**
 * The YAML document in @p text: the one parse of every card and case file.
 * @throws InputError at the line and column where the parser stopped
 *         ("YAML syntax error: ..."), naming @p file
 */
YAML::Node parse_yaml(const std::string& text, const std::string& file);

std::string join_path(const std::string& parent, const std::string& key);
std::string index_path(const std::string& parent, std::size_t index);

/** A parameter that needs a `sources` entry, with where it was written. */
struct ParameterSite {
  std::string path;
  int line = 0;
  int column = 0;
  std::string value;
};

class CardReader {
public:
  explicit CardReader(std::string file) : file_(std::move(file)) {}

  const std::string& file() const noexcept { return file_; }

  /** Throws a CardError located at @p node (or at the file if the node has no mark). */
  [[noreturn]] void fail(const YAML::Node& node, const std::string& path,
                         const std::string& value, const std::string& expected) const;
  [[noreturn]] void fail_at(int line, int column, const std::string& path,
                            const std::string& value, const std::string& expected) const;

  /**
   * Rejects keys of @p map not in @p allowed (with "did you mean") and duplicate keys.
   * @param key_as_value also give the offending key as the error's value (case files:
   *        `time.frist_step = "frist_step": unknown key ...`); cards leave it empty
   */
  void check_keys(const YAML::Node& map, const std::string& path,
                  const std::vector<std::string>& allowed,
                  bool key_as_value = false) const;

  /** The child @p key of @p map, or a "missing field" error. */
  YAML::Node require(const YAML::Node& map, const std::string& path,
                     const std::string& key) const;
  /** The child @p key, or an undefined node. */
  YAML::Node optional(const YAML::Node& map, const std::string& key) const;

  void expect_map(const YAML::Node& node, const std::string& path) const;
  void expect_sequence(const YAML::Node& node, const std::string& path) const;

  /** The scalar text of @p node; error for a map, sequence or null. */
  std::string text(const YAML::Node& node, const std::string& path) const;
  /** A bare finite number. */
  double number(const YAML::Node& node, const std::string& path) const;
  /** A quantity with its unit, converted to SI and checked against @p dimension. */
  double quantity(const YAML::Node& node, const std::string& path,
                  const Dimension& dimension) const;
  /** A quantity of any of @p dimensions; @p found receives the index of the match. */
  double quantity_of(const YAML::Node& node, const std::string& path,
                     const std::vector<Dimension>& dimensions, std::size_t& found) const;
  /** A temperature (K) > 0. */
  double positive_temperature(const YAML::Node& node, const std::string& path) const;
  /** A temperature difference (K) > 0: "3 K" or "3 degC" both mean 3 K. */
  double positive_temperature_difference(const YAML::Node& node,
                                         const std::string& path) const;

  /** Records a parameter that must be covered by a `sources` entry. */
  void record_parameter(const YAML::Node& node, const std::string& path);
  const std::vector<ParameterSite>& parameters() const noexcept { return parameters_; }

  static int line_of(const YAML::Node& node);
  static int column_of(const YAML::Node& node);

private:
  std::string file_;
  std::vector<ParameterSite> parameters_;
};

/** What the contribution readers need to know of the card so far. */
struct CardBasics {
  double molar_mass = 0.0; ///< kg/mol, for per-kg inputs
};

/** A table read from `columns` + `rows` (or `points` with units in every cell). */
struct ReadTable {
  std::vector<double> x;          ///< first column, SI
  std::vector<double> y;          ///< second column, SI
  std::vector<YAML::Node> x_node; ///< for messages
  std::vector<YAML::Node> y_node;
  std::size_t y_dimension = 0; ///< index into the accepted second-column dimensions
};

/**
 * Reads a two-column table whose first column is a temperature: `columns`
 * (a unit per column) and `rows` of bare numbers, or `points` of quantities
 * with units. Temperatures must increase strictly; the second column is > 0
 * (or >= 0 when @p allow_zero).
 */
ReadTable read_temperature_table(CardReader& reader, const YAML::Node& map,
                                 const std::string& path,
                                 const std::vector<Dimension>& y_dimensions,
                                 const std::string& y_description, bool allow_zero);

/** Reads the `heat_capacity` list. */
std::vector<ContributionPtr> read_heat_capacity(CardReader& reader,
                                                const YAML::Node& list,
                                                const std::string& path,
                                                const CardBasics& basics);

/** Reads the `dilation` block. */
Dilation read_dilation(CardReader& reader, const YAML::Node& node,
                       const std::string& path);

/** The valid range the conductivity must cover. */
struct ConductivityContext {
  double lower_temperature = 0.0; ///< K
  double upper_temperature = 0.0; ///< K
};

/**
 * Reads the `conductivity` block (conductivity_card.cc). A new kind of
 * conductivity is one branch there.
 */
ConductivityPtr read_conductivity(CardReader& reader, const YAML::Node& node,
                                  const std::string& path,
                                  const ConductivityContext& context);

/** What the `phases` list of a card gives (phase_card.cc). */
struct ReadPhases {
  ContributionPtr heat_capacity; ///< the phase sequence as one term
  ConductivityPtr conductivity;  ///< null if the phases give none (card-level then)
  std::vector<PhaseInfo> info;   ///< name, liquid, density per phase
  std::shared_ptr<const PhaseLayout> layout;
};

/**
 * Reads the `phases` list: each phase {name, liquid, from {temperature,
 * latent_heat, width}, heat_capacity, dilation, conductivity, density}.
 * @param reference_density the card's, the first phase's density unless it states
 *        one (a later phase without one keeps the one before)
 * @param top_conductivity whether the card has a card-level `conductivity`
 *        (then no phase may have one; otherwise the first must, and a later phase
 *        without one keeps the one before)
 */
ReadPhases read_phases(CardReader& reader, const YAML::Node& list,
                       const std::string& path, const CardBasics& basics,
                       const std::string& material_name, const ConductivityContext& range,
                       double reference_density, bool top_conductivity);

} // namespace quantacal::detail

#endif
