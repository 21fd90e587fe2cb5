// SPDX-License-Identifier: Apache-2.0
/**
 * @file fit.h
 * @brief The engine of `quantacal fit`: measured data, free parameters, a
 *        GSL nonlinear least-squares fit, and the fitted card.
 *
 * Why it exists: a card's lattice parameters usually come from one
 * publication, while the hardware at hand was measured. This engine adjusts
 * any numeric parameter of a card's contributions (and of a `metal`
 * conductivity) to measured c_p, energy-increment and k points, with
 * standard errors and covariance, and writes the card back with the values
 * replaced and a `fit` record. See docs/fitting.md.
 *
 * It is a library (quantacal::fit, installed) linked by the command and by the
 * tests; it is the only part of quantacal that links GSL. Bad input of every call
 * is an InputError (a std::invalid_argument): located in the data file for the
 * data, InputError::argument for a bad parameter of a call.
 */
#ifndef QUANTACAL_FIT_FIT_H
#define QUANTACAL_FIT_FIT_H

#include <quantacal/cards/card_parameters.h>
#include <quantacal/cards/card_writer.h>
#include <quantacal/material/material.h>
#include <quantacal/models/metal_conductivity.h>

#include <cstddef>
#include <memory>
#include <string>
#include <vector>

namespace quantacal::fit {

/** What one data row measures. */
enum class Observable {
  capacity,         ///< c_p at T
  energy_increment, ///< e(T) - e(T_from)
  conductivity      ///< k at T
};

/** One measured row, SI units, as read from the CSV file. */
struct DataPoint {
  Observable kind = Observable::capacity;
  double temperature = 0.0;      ///< T, K
  double from_temperature = 0.0; ///< T_from, K (energy increments; 0 = from 0 K)
  double value = 0.0;    ///< J/kg/K or J/mol/K, J/kg or J/mol, W/m/K (see per_mass)
  bool per_mass = false; ///< value is per kg (else per mole; k rows: false)
  double sigma =
      0.0;      ///< uncertainty from the `sigma` column in the unit of value; 0 = none
  int line = 0; ///< 1-based line in the file
};

/** A CSV data file. */
struct DataSet {
  std::string file;
  std::vector<DataPoint> points;
  bool has_sigma = false; ///< the file has a `sigma` column
  std::string sha256;     ///< checksum of the file's bytes, hex
};

/**
 * Reads a data file (docs/fitting.md, "Data files"): a header row naming the
 * columns `T_K` and at least one of `cp_J_per_kg_K`, `cp_J_per_mol_K`,
 * `e_J_per_kg`, `e_J_per_mol` (with `T_from_K`), `k_W_per_m_K`, optionally
 * `sigma`; lines starting with '#' and blank lines are skipped; each row fills
 * exactly one value column.
 * @param path the file
 * @throws CardError naming file:line:column, the column and the cell for a
 *         missing or unknown column (with "did you mean"), a non-numeric cell,
 *         a temperature <= 0 K, a row with no or several values, a sigma <= 0
 */
DataSet read_data(const std::string& path);

/** Parses data from text (for tests); @p file is used in messages. */
DataSet read_data_from_string(const std::string& text, const std::string& file);

/** SHA-256 of @p bytes as 64 lowercase hex digits (FIPS 180-4). */
std::string sha256_hex(const std::string& bytes);

/** A freed parameter, resolved against the start card (a CardParameter whose card
 * value is the start value). */
struct FreeParameter {
  std::string path; ///< full name path: heat_capacity[i].<name> or conductivity.<name>
  bool conductivity = false; ///< a parameter of the `metal` conductivity
  std::size_t index = 0;     ///< contribution index (heat capacity)
  std::string name;          ///< parameter name (card key)
  std::string unit;          ///< SI unit
  double start = 0.0;        ///< SI start value
};

/**
 * Resolves `--free` names (docs/fitting.md, "Naming parameters"): a bare name
 * when it is unique among the heat-capacity contributions, else
 * `heat_capacity[i].<name>`; `conductivity.<name>` for the conductivity
 * (resolve_card_parameters() with messages starting `--free: `).
 * @throws InputError for an unknown name (with "did you mean"), an ambiguous bare
 *         name (listing the full paths), a duplicate, an empty list
 */
std::vector<FreeParameter> resolve_free_parameters(const Material& material,
                                                   const std::vector<std::string>& names);

/** How residuals are weighted. */
enum class Weighting {
  relative, ///< residual (f - y)/(y s); s = sigma as a fraction, or 1 without sigma
  absolute  ///< residual (f - y)/s; s = sigma in the row's unit, or 1 without sigma
};

/** Options of fit(). */
struct FitOptions {
  Weighting weighting = Weighting::relative;
  double from = 0.0; ///< K; rows with T below are left out (0 = all)
  double to = 0.0;   ///< K; rows with T above are left out (0 = all)
  std::size_t max_iterations = 200;
  double xtol = 1e-10; ///< GSL step tolerance (relative)
  double gtol = 1e-12; ///< GSL gradient tolerance
};

/** One residual row of the report. */
struct ResidualRow {
  DataPoint point;
  double model = 0.0;    ///< model value in the row's unit
  double residual = 0.0; ///< model - data, row's unit
  double relative = 0.0; ///< (model - data)/data
  double weighted = 0.0; ///< weighted residual entering chi-square
};

/**
 * Significance level of the runs test: a one-sided p below it marks the residual
 * signs of an observable as systematic. 0.01 is a common choice of significance
 * level (common practice); stricter than 0.05 so that one fit in a hundred, not
 * one in twenty, warns on residuals that are in fact random.
 */
inline constexpr double runs_test_level = 0.01;

/** Fewest rows (non-zero residuals) of an observable on which the runs test is run. */
inline constexpr std::size_t runs_test_min_rows = 10;

/**
 * Fewest rows of an observable whose residuals, all of one sign, are systematic
 * outright: after a least-squares fit of any parameter that moves these rows
 * together, residuals of one sign alone are not a chance outcome.
 */
inline constexpr std::size_t one_sign_min_rows = 6;

/**
 * Level of the chi-square check (with a sigma column): an upper-tail probability
 * of chi-square on its degrees of freedom below it says the residuals are larger
 * than the sigmas allow. 0.001 (common practice for a goodness-of-fit check of a
 * nonlinear fit, whose chi-square is only approximately chi-square distributed).
 */
inline constexpr double chi_square_level = 0.001;

/** Most parameters a systematic-residual warning suggests freeing. */
inline constexpr std::size_t max_suggested_parameters = 5;

/**
 * The Wald-Wolfowitz runs test (Wald and Wolfowitz 1940) on the signs of a
 * sequence of residuals: too few runs of one sign says the residuals are
 * systematic. With n+ and n- the counts of positive and negative residuals
 * (zeros are left out), n = n+ + n-, the number of runs R has, for random signs,
 * the expectation mu = 2 n+ n- / n + 1 and the variance
 * sigma^2 = (mu - 1)(mu - 2)/(n - 1).
 */
struct RunsTest {
  std::size_t n = 0;          ///< residuals with a sign (non-zero)
  std::size_t n_positive = 0; ///< n+
  std::size_t n_negative = 0; ///< n-
  std::size_t runs = 0;       ///< R, the number of runs of one sign
  double expected = 0.0;      ///< mu, runs expected for random signs
  /// (R - mu)/sigma; NaN when only one sign is present (sigma = 0)
  double z = 0.0;
  /// One-sided P(R' <= R) for random signs: from the exact distribution of R
  /// given n+ and n- (Swed and Eisenhart 1943) when both are at most 20, else the
  /// normal approximation Phi(z) = erfc(-z/sqrt 2)/2; NaN when only one sign.
  double p = 1.0;
  bool exact = false;      ///< p is exact (else the normal approximation)
  bool tested = false;     ///< enough rows: n >= runs_test_min_rows with both signs,
                           ///< or one sign only and n >= one_sign_min_rows
  bool one_sign = false;   ///< every residual has the same sign
  bool systematic = false; ///< tested and (one_sign or p < runs_test_level)
};

/**
 * The runs test on @p residuals in the order given (a fit orders each
 * observable's rows by temperature); zeros are left out.
 */
RunsTest runs_test(const std::vector<double>& residuals);

/** The runs test of one observable's rows (capacity, energy or conductivity). */
struct ObservableDiagnostics {
  Observable kind = Observable::capacity;
  RunsTest runs; ///< on the residual signs, rows ordered by T (then T_from)
};

/** A parameter of the start card that a systematic-residual warning suggests freeing. */
struct SuggestedParameter {
  std::string path; ///< card path, as --free takes it
  /// Largest |d ln(model) / d ln(parameter)| over the rows that showed the
  /// systematic residuals, at the fitted values (dimensionless; 1 = a 1 % change
  /// of the parameter moves some row by 1 %).
  double sensitivity = 0.0;
};

/**
 * Whether the residuals say the model cannot describe the data (docs/fitting.md,
 * "Systematic residuals"): when flagged(), the standard errors and covariance,
 * computed for a model assumed exact, do not measure the parameters' uncertainty.
 */
struct FitDiagnostics {
  std::vector<ObservableDiagnostics> observables; ///< one per kind of row present
  bool chi_square_tested = false;                 ///< the data have a sigma column
  double chi_square_p = 1.0;       ///< upper-tail probability of chi-square on its dof
  bool chi_square_flagged = false; ///< chi_square_tested and chi_square_p < level
  /// Parameters of the start card not freed whose derivative on the flagged rows
  /// is not negligible, most sensitive first (at most max_suggested_parameters);
  /// empty when nothing is flagged.
  std::vector<SuggestedParameter> suggestions;

  /** Some observable's residuals are systematic. */
  bool systematic() const {
    for (const auto& o : observables)
      if (o.runs.systematic)
        return true;
    return false;
  }
  /** The residuals are systematic or chi-square is too large for the sigmas. */
  bool flagged() const { return systematic() || chi_square_flagged; }
};

/** The outcome of a fit. */
struct FitResult {
  std::vector<FreeParameter> parameters;
  std::vector<double> values;                   ///< fitted SI values
  std::vector<double> standard_errors;          ///< SI
  std::vector<std::vector<double>> covariance;  ///< SI
  std::vector<std::vector<double>> correlation; ///< dimensionless
  std::vector<ResidualRow> residuals;
  double chi_square = 0.0;
  std::size_t degrees_of_freedom = 0;
  double reduced_chi_square = 0.0;
  bool covariance_scaled = false; ///< scaled by reduced chi-square (no sigma column)
  double rms_relative = 0.0;      ///< rms of relative residuals
  double max_relative = 0.0;      ///< largest |relative residual|
  std::size_t iterations = 0;
  double from = 0.0, to = 0.0; ///< K, temperature range of the rows used
  /// The start material with the fitted values and their record (MaterialData::fit:
  /// the freed paths and `covariance`), as the fitted card loads.
  MaterialPtr material;
  /// Cautions about how well the data determine a parameter (printed by the
  /// report): a freed gamma whose electrons carry little of c_p at the lowest
  /// row; systematic residuals or a chi-square too large for the sigma column
  /// (see `diagnostics`); empty when there is nothing to say.
  std::vector<std::string> warnings;
  /// Runs test per observable and chi-square check; when they flag, a warning
  /// (in `warnings`) says so and suggests parameters to free.
  FitDiagnostics diagnostics;
};

/**
 * Share of the electrons in c_p below which the lowest capacity row cannot pin a
 * freed gamma against the lattice terms. Measured on copper (docs/fitting.md,
 * "How low the data must go"): with the lowest row where electrons carry 47 %
 * the fitted gamma is 3 % low, at 29 % it is 9 % low, at 12 % (10 K) 29 % low.
 */
inline constexpr double gamma_share_threshold = 0.40;

/**
 * Fits the free parameters with GSL's trust-region Levenberg-Marquardt
 * (gsl_multifit_nlinear, geodesic acceleration off, Moré scaling). Parameters
 * whose start value is > 0 are fitted in log space (they stay positive); the
 * covariance is mapped back to SI. Without a sigma column the covariance is
 * scaled by the reduced chi-square. The residuals are then checked
 * (FitResult::diagnostics: the runs test per observable, chi-square against the
 * sigma column) and a warning added when they say the model cannot describe the
 * data (docs/fitting.md, "Systematic residuals").
 * @throws InputError naming the data file for fewer rows than free parameters + 1,
 *         located at file:line for a row outside the card's valid range or the
 *         model's domain; InputError::argument (`--free <path>: ...`) for a
 *         parameter the data cannot determine or a freed conductivity that is not
 *         `metal`
 * @throws NumericalError the fit did not converge (with the iteration count), or
 *         the fitted values do not make a valid material
 */
FitResult fit(const Material& start, const DataSet& data,
              const std::vector<FreeParameter>& parameters, const FitOptions& options);

/**
 * What to change in the start card to make the fitted card: the freed values,
 * a `sources` entry for each (data file, checksum, start value) and the `fit`
 * record (statistics, standard errors, covariance).
 * @param result the fit
 * @param data the data (file, checksum)
 * @param weighting as used
 * @return the changes for edit_card()
 */
CardChanges fitted_card_changes(const FitResult& result, const DataSet& data,
                                Weighting weighting);

/**
 * The fitted card: edit_card() of the start card's text with
 * fitted_card_changes(), so the start card's comments and layout are kept.
 * @param start_text the start card's YAML text
 * @param start_file its path (for messages)
 * @param result the fit
 * @param data the data (file, checksum)
 * @param weighting as used
 * @param output_file where the card will be written: `composition` card paths,
 *        relative to the start card's folder, are rewritten relative to its folder
 *        ("" = the start card's folder)
 * @return the fitted card's text
 * @throws InputError if a freed value cannot be located in the start card
 */
std::string fitted_card(const std::string& start_text, const std::string& start_file,
                        const FitResult& result, const DataSet& data, Weighting weighting,
                        const std::string& output_file = "");

/** The human-readable report (parameters, correlation, statistics, residual table). */
std::string report(const FitResult& result, const DataSet& data);

/**
 * Writes a gnuplot script plotting data, model and relative residuals, and its
 * data files, into @p folder: `gnuplot plot.gp` run in @p folder (it names its
 * data files relative to it) writes the SVG to @p svg_path. The library starts
 * no program; the command runs gnuplot.
 * @param result the fit
 * @param folder an existing folder for the script (plot.gp) and its data files
 *        (data.txt, model.txt)
 * @param svg_path where gnuplot is to write the SVG (made absolute in the script)
 * @return the script's path
 * @throws std::ios_base::failure if a file cannot be written
 */
std::string write_plot_script(const FitResult& result, const std::string& folder,
                              const std::string& svg_path);

/** Values with one-sigma uncertainties at one temperature, on a basis. */
struct BandRow {
  double capacity = 0.0;       ///< c_p, J/kg/K (or per mole, per m^3)
  double capacity_sigma = 0.0; ///< one sigma of c_p, same unit
  double energy = 0.0;       ///< e relative to the card's reference temperature, J/kg ...
  double energy_sigma = 0.0; ///< one sigma of e, same unit
  double conductivity = 0.0; ///< k, W/m/K
  double conductivity_sigma = 0.0; ///< one sigma of k, W/m/K
};

/**
 * Values and one-sigma uncertainties at one temperature, by linear propagation of
 * the covariance C of the card's `fit` record (MaterialData::fit, read by the card
 * loader): sigma^2 = g^T C g, with g the gradient of the exact model value with
 * respect to the fitted parameters (central differences, step 1e-3 standard
 * errors).
 * @param material the fitted card
 * @param temperature K, inside the valid range
 * @param basis mass, mole or volume
 * @throws InputError naming the card's file if it has no `fit` record;
 *         InputError::argument if a record built in code names a parameter the
 *         material does not have or its covariance is not square in their number
 * @throws RangeError outside the valid range
 */
BandRow band(const Material& material, double temperature, Basis basis);

} // namespace quantacal::fit

#endif
