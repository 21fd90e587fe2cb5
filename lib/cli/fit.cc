// SPDX-License-Identifier: Apache-2.0
// `quantacal fit`: fits card parameters to measured c_p, energy-increment and k points.
#include "command_registry.h"
#include "gnuplot.h"
#include "options.h"
#include <quantacal/fit/fit.h>

#include <quantacal/cards/card.h>
#include <quantacal/cards/card_writer.h>
#include <quantacal/common/exceptions.h>

#include <cerrno>
#include <cstdlib>
#include <cstring>
#include <filesystem>
#include <iostream>
#include <sstream>
#include <string>
#include <vector>

namespace quantacal::cli {
namespace {

OptionParser fit_parser() {
  OptionParser parser(
      "fit",
      "DATA.csv --card START.yaml --free NAME[,NAME...] [--weights relative|absolute]\n"
      "       [--from K] [--to K] [--plot FILE.svg] [--max-iterations N] -o FITTED.yaml",
      "Fits parameters of the card START.yaml to the measurements in DATA.csv by\n"
      "nonlinear least squares (GSL, trust-region Levenberg-Marquardt), prints a report\n"
      "(values, standard errors, correlation matrix, reduced chi-square, residuals),\n"
      "writes a plot of data, model and residuals, and writes FITTED.yaml: the start "
      "card\n"
      "with the fitted values, a sources entry for each and a `fit` record (data file,\n"
      "SHA-256, temperature range, residual statistics, covariance).\n"
      "\n"
      "DATA.csv has a header row; columns: T_K (required), one or more of\n"
      "cp_J_per_kg_K | cp_J_per_mol_K, e_J_per_kg | e_J_per_mol (energy increment from\n"
      "T_from_K to T_K; needs a T_from_K column), k_W_per_m_K, and optionally sigma "
      "(the\n"
      "uncertainty of the row's value). Each row fills one value column. Lines starting\n"
      "with '#' are comments.\n"
      "\n"
      "Parameter names for --free: a bare name when it is unique among the card's\n"
      "heat-capacity contributions (theta_D, gamma), else heat_capacity[i].NAME;\n"
      "conductivity.NAME for a conductivity of kind metal (theta_R, rrr, "
      "wilson_ratio...).\n"
      "\n"
      "Weights: relative (default) minimises (model - data)/(data s), absolute\n"
      "(model - data)/s, with s the sigma column (a fraction for relative weights, in "
      "the\n"
      "row's unit for absolute) or 1 without one; without sigma the standard errors are\n"
      "scaled by the reduced chi-square. Nothing is written unless the fit converges.\n"
      "See docs/fitting.md.");
  parser.add_value("card", "START.yaml", "the start card (required)")
      .add_value("free", "NAMES", "comma-separated parameter names to fit (required)")
      .add_value("weights", "MODE", "relative (default) or absolute",
                 {"relative", "absolute"})
      .add_value("from", "K", "leave out rows below this temperature")
      .add_value("to", "K", "leave out rows above this temperature")
      .add_value("output", "FITTED.yaml", "the fitted card (required; also -o)")
      .add_value("plot", "FILE.svg", "the plot (default: FITTED.svg beside the output)")
      .add_value("max-iterations", "N", "iteration limit of the solver (default 200)")
      .add_epilogue(exit_code_help());
  return parser;
}

std::vector<std::string> split_names(const std::string& text) {
  std::vector<std::string> out;
  std::string item;
  std::istringstream in(text);
  while (std::getline(in, item, ',')) {
    const auto a = item.find_first_not_of(' ');
    const auto b = item.find_last_not_of(' ');
    if (a == std::string::npos)
      throw UsageError("option --free = \"" + text + "\": empty parameter name");
    out.push_back(item.substr(a, b - a + 1));
  }
  if (out.empty())
    throw UsageError("option --free: expected at least one parameter name");
  return out;
}

/**
 * Draws the plot: the library writes the script and data into a temporary folder,
 * gnuplot writes the SVG beside @p svg_path, renamed over it when complete.
 * @return "" on success, else why no plot was written
 */
std::string draw_plot(const fit::FitResult& result, const std::string& svg_path) {
  namespace fs = std::filesystem;
  std::error_code ec;
  std::string folder = (fs::temp_directory_path(ec) / "quantacal-fit-XXXXXX").string();
  if (ec || ::mkdtemp(folder.data()) == nullptr)
    return "cannot create a temporary folder for the plot: " +
           (ec ? ec.message() : std::string(std::strerror(errno)));
  const std::string tmp_svg = svg_path + ".tmp";
  std::string why;
  try {
    why = run_gnuplot(fit::write_plot_script(result, folder, tmp_svg));
  } catch (const std::exception& e) {
    why = e.what();
  }
  if (why.empty()) {
    fs::rename(tmp_svg, svg_path, ec);
    if (ec)
      why = "cannot write " + svg_path + ": " + ec.message();
  }
  if (!why.empty())
    fs::remove(tmp_svg, ec);
  fs::remove_all(folder, ec);
  return why;
}

int run_fit(std::vector<std::string> args) {
  for (auto& a : args)
    if (a == "-o")
      a = "--output";
  const OptionParser parser = fit_parser();
  const ParsedOptions options = parser.parse(args);
  if (options.help) {
    std::cout << parser.help();
    return ok;
  }
  if (options.positional.size() != 1)
    throw UsageError("expected one data file (DATA.csv), got " +
                     std::to_string(options.positional.size()) + " arguments; " +
                     parser.usage());
  const auto card = options.text("card");
  if (!card)
    throw UsageError("missing option --card START.yaml; " + parser.usage());
  const auto free = options.text("free");
  if (!free)
    throw UsageError("missing option --free NAME[,NAME...]; " + parser.usage());
  const auto output = options.text("output");
  if (!output)
    throw UsageError("missing option -o FITTED.yaml; " + parser.usage());

  fit::FitOptions fo;
  fo.weighting = options.text("weights").value_or("relative") == "absolute"
                     ? fit::Weighting::absolute
                     : fit::Weighting::relative;
  fo.from = options.temperature("from", 0.0);
  fo.to = options.temperature("to", 0.0);
  if (options.has("from") && !(fo.from > 0.0))
    throw UsageError("option --from: expected a temperature > 0 K");
  if (options.has("to") && !(fo.to > fo.from))
    throw UsageError("option --to: expected a temperature above --from");
  const double max_iterations = options.number("max-iterations", 200);
  if (!(max_iterations >= 1 && max_iterations <= 1e6 &&
        max_iterations == static_cast<double>(static_cast<long>(max_iterations))))
    throw UsageError("option --max-iterations: expected a whole number >= 1");
  fo.max_iterations = static_cast<std::size_t>(max_iterations);

  const std::string start_text = read_card_text(*card);
  const MaterialPtr start = load_card_from_string(start_text, *card);
  const fit::DataSet data = fit::read_data(options.positional.front());
  const auto parameters = fit::resolve_free_parameters(*start, split_names(*free));
  const fit::FitResult result = fit::fit(*start, data, parameters, fo);
  // Written only if it loads; the report follows, then the plot.
  save_card(*output,
            fit::fitted_card(start_text, *card, result, data, fo.weighting, *output));

  std::cout << fit::report(result, data);
  std::string plot_path = options.text("plot").value_or("");
  if (plot_path.empty())
    plot_path = std::filesystem::path(*output).replace_extension(".svg").string();
  const std::string why = draw_plot(result, plot_path);
  if (why.empty())
    std::cout << "\nplot: " << plot_path << "\n";
  else
    std::cerr << "quantacal fit: warning: no plot written: " << why << "\n";
  std::cout << "fitted card: " << *output << "\n";
  return ok;
}

const CommandRegistrar registrar("fit",
                                 "fit card parameters to measured c_p, energy or k data",
                                 [](const std::vector<std::string>& args) {
                                   return guarded("fit", [&] { return run_fit(args); });
                                 });

} // namespace
} // namespace quantacal::cli
