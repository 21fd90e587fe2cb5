// SPDX-License-Identifier: Apache-2.0
/**
 * @file card_writer.h
 * @brief Writing cards: a card's text with new parameter values, `sources`
 *        entries and a `fit` record, everything else kept as written.
 *
 * A card is edited as text, not re-emitted from YAML, so its comments, key
 * order, quoting and layout survive: only the changed values, the new `sources`
 * entries, moved `composition` paths and the `fit` record differ. This is how
 * `quantacal fit` writes a fitted card (docs/fitting.md, "The fitted card").
 */
#ifndef QUANTACAL_CARDS_CARD_WRITER_H
#define QUANTACAL_CARDS_CARD_WRITER_H

#include <quantacal/cards/card_parameters.h>
#include <quantacal/material/material.h>

#include <cstddef>
#include <optional>
#include <string>
#include <vector>

namespace quantacal {

/** A new value of one card parameter. */
struct ParameterValue {
  CardParameter parameter; ///< which parameter (its value is not used)
  double value = 0.0;      ///< the new value, SI (in parameter.unit)
};

/** One row of the `parameters` list of a `fit` record. */
struct FitRecordParameter {
  std::string path;            ///< heat_capacity[i].<name> or conductivity.<name>
  std::string unit;            ///< SI unit ("1" for a bare number)
  double value = 0.0;          ///< fitted value, SI
  double standard_error = 0.0; ///< SI
  double start = 0.0;          ///< start value, SI
};

/** Everything a `fit` record states (docs/fitting.md, "The fitted card"). */
struct FitRecordEntry {
  std::string data_file;          ///< the data file as named to the fit
  std::string data_sha256;        ///< SHA-256 of its bytes, 64 hex digits
  double from = 0.0;              ///< K, lowest temperature of the rows used
  double to = 0.0;                ///< K, highest temperature of the rows used
  std::size_t n_points = 0;       ///< rows used
  bool relative_weights = true;   ///< relative (else absolute) residuals
  bool covariance_scaled = false; ///< scaled by the reduced chi-square (no sigma)
  std::size_t iterations = 0;     ///< solver iterations
  double chi_square = 0.0;        ///< weighted sum of squared residuals
  std::size_t degrees_of_freedom = 0;
  double reduced_chi_square = 0.0;
  double rms_relative_residual = 0.0; ///< rms of (model - data)/data
  double max_relative_residual = 0.0; ///< largest |model - data|/data
  std::vector<FitRecordParameter> parameters;
  std::vector<std::vector<double>> covariance; ///< SI, in the order of parameters
};

/** What edit_card() changes. */
struct CardChanges {
  /// Values replaced in place (as quoted quantities with their SI units); a
  /// parameter the card leaves at its default is added as a key on the line
  /// after the start of its block.
  std::vector<ParameterValue> values;
  /// Entries put first in the card's `sources` list, each `for: parameter`,
  /// `cite: citation` (added only where `sources` is a non-empty block list).
  std::vector<Source> sources;
  /// A `fit` record appended at the end of the card.
  std::optional<FitRecordEntry> fit;
};

/**
 * The text of a card with @p changes made. An earlier `fit` record is removed
 * whenever values change or a new record is given (it no longer describes the
 * card). Relative `composition` card paths are rewritten so that they still
 * find the same files from @p output_file's folder.
 * @param text the card's YAML text
 * @param file its path (for messages; relative composition paths start from its
 *        folder)
 * @param changes what to change
 * @param output_file where the text will be written ("" = beside @p file)
 * @return the new text, ending in a newline
 * @throws InputError (located in @p file) for a YAML syntax error, a changed
 *         parameter whose block is not in the text, or a defaulted parameter of a
 *         flow-style block (`{...}`), which has no line to add it on
 */
std::string edit_card(const std::string& text, const std::string& file,
                      const CardChanges& changes, const std::string& output_file = "");

/**
 * A value with its unit as a card writes it: `%.<digits>g` followed by the
 * unit, except J/mol/K^2 in mJ/mol/K^2 and a bare number for unit "1" or "".
 * @param si the value, SI
 * @param unit its SI unit
 * @param digits significant digits
 */
std::string card_quantity_text(double si, const std::string& unit, int digits = 7);

/**
 * Reads a card file as text (for edit_card()).
 * @throws InputError naming the file if it cannot be read
 */
std::string read_card_text(const std::string& path);

/**
 * Writes a card: checks that @p text loads as a card at @p path (so relative
 * composition paths are checked from there), then writes it to a temporary file
 * beside @p path renamed over it at the end; on any error nothing is written.
 * @param path where to write
 * @param text the card's YAML text
 * @throws InputError if @p text does not load (located in @p path)
 * @throws std::ios_base::failure if the file cannot be written
 */
void save_card(const std::string& path, const std::string& text);

} // namespace quantacal

#endif
