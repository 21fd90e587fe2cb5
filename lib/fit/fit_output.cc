// SPDX-License-Identifier: Apache-2.0
// `quantacal fit`: the fitted card (text edits of the start card), the report and the
// plot.
#include <quantacal/fit/fit.h>

#include <quantacal/common/exceptions.h>
#include <quantacal/version.h>

#include <yaml-cpp/yaml.h>

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <iomanip>
#include <sstream>

namespace quantacal::fit {
namespace {

std::string number(double v, int digits = 7) {
  char buffer[64];
  std::snprintf(buffer, sizeof buffer, "%.*g", digits, v);
  return buffer;
}

std::string quote(const std::string& s) {
  std::string out = "\"";
  for (char c : s) {
    if (c == '"' || c == '\\')
      out.push_back('\\');
    out.push_back(c);
  }
  return out + "\"";
}

/** A value with its unit as a card writes it; gamma in mJ/mol/K^2, "1" bare. */
std::string quantity_text(double si, const std::string& unit, int digits = 7) {
  if (unit == "1" || unit.empty())
    return number(si, digits);
  if (unit == "J/mol/K^2")
    return number(si * 1e3, digits) + " mJ/mol/K^2";
  return number(si, digits) + " " + unit;
}

std::string card_value(double si, const std::string& unit) {
  const std::string t = quantity_text(si, unit);
  return unit == "1" || unit.empty() ? t : quote(t);
}

struct Edit {
  std::size_t position;
  std::size_t length;
  std::string text;
};

/** Extent of the scalar starting at @p pos (quoted or plain). */
std::size_t scalar_length(const std::string& text, std::size_t pos) {
  if (pos >= text.size())
    return 0;
  const char q = text[pos];
  if (q == '"' || q == '\'') {
    std::size_t i = pos + 1;
    while (i < text.size()) {
      if (q == '"' && text[i] == '\\') {
        i += 2;
        continue;
      }
      if (text[i] == q) {
        if (q == '\'' && i + 1 < text.size() && text[i + 1] == '\'') {
          i += 2;
          continue;
        }
        return i + 1 - pos;
      }
      ++i;
    }
    return text.size() - pos;
  }
  std::size_t i = pos;
  while (i < text.size() && text[i] != '\n' && text[i] != ',' && text[i] != '}' &&
         text[i] != ']' && !(text[i] == '#' && i > pos && text[i - 1] == ' '))
    ++i;
  while (i > pos && (text[i - 1] == ' ' || text[i - 1] == '\t' || text[i - 1] == '\r'))
    --i;
  return i - pos;
}

std::size_t line_start(const std::string& text, std::size_t pos) {
  const std::size_t nl = pos == 0 ? std::string::npos : text.rfind('\n', pos - 1);
  return nl == std::string::npos ? 0 : nl + 1;
}

std::size_t next_line(const std::string& text, std::size_t pos) {
  const std::size_t nl = text.find('\n', pos);
  return nl == std::string::npos ? text.size() : nl + 1;
}

} // namespace

std::string fitted_card(const std::string& start_text, const std::string& start_file,
                        const FitResult& result, const DataSet& data, Weighting weighting,
                        const std::string& output_file) {
  YAML::Node root;
  try {
    root = YAML::Load(start_text);
  } catch (const YAML::Exception& e) {
    throw CardError(start_file, e.mark.is_null() ? 0 : e.mark.line + 1,
                    e.mark.is_null() ? 0 : e.mark.column + 1, "", "",
                    "YAML syntax error: " + e.msg);
  }
  std::vector<Edit> edits;
  for (std::size_t j = 0; j < result.parameters.size(); ++j) {
    const FreeParameter& f = result.parameters[j];
    const YAML::Node map = f.conductivity ? YAML::Node(root["conductivity"])
                                          : YAML::Node(root["heat_capacity"][f.index]);
    if (!map.IsDefined() || !map.IsMap())
      throw CardError(
          start_file, 0, 0, f.path, "",
          "cannot locate this block in the start card to write the fitted value");
    const YAML::Node value = map[f.name];
    const std::string text = card_value(result.values[j], f.unit);
    if (value.IsDefined()) {
      const std::size_t pos = static_cast<std::size_t>(value.Mark().pos);
      edits.push_back({pos, scalar_length(start_text, pos), text});
    } else if (map.Style() == YAML::EmitterStyle::Block) {
      // A defaulted parameter (e.g. modes): a new key below the block's first line.
      const std::size_t pos = static_cast<std::size_t>(map.Mark().pos);
      const std::string indent(static_cast<std::size_t>(map.Mark().column), ' ');
      edits.push_back(
          {next_line(start_text, pos), 0, indent + f.name + ": " + text + "\n"});
    } else {
      throw CardError(
          start_file, map.Mark().line + 1, map.Mark().column + 1, f.path, "",
          "the parameter is not written in this flow-style block; write it out "
          "in the start card");
    }
  }
  // Component cards are found relative to the card's folder: keep them found.
  const YAML::Node composition = root["composition"];
  if (!output_file.empty() && composition.IsDefined() && composition.IsSequence()) {
    namespace fs = std::filesystem;
    const fs::path from = fs::absolute(fs::path(start_file)).parent_path();
    const fs::path to = fs::absolute(fs::path(output_file)).parent_path();
    for (std::size_t i = 0; i < composition.size(); ++i) {
      const YAML::Node c = composition[i]["card"];
      if (!c.IsDefined() || !c.IsScalar() || fs::path(c.Scalar()).is_absolute())
        continue;
      const fs::path target = (from / c.Scalar()).lexically_normal();
      const std::string moved = target.lexically_relative(to.lexically_normal()).string();
      if (moved.empty() || moved == c.Scalar())
        continue;
      const std::size_t pos = static_cast<std::size_t>(c.Mark().pos);
      edits.push_back({pos, scalar_length(start_text, pos), quote(moved)});
    }
  }
  // A sources entry for each fitted value, first in the list.
  const YAML::Node sources = root["sources"];
  if (sources.IsDefined() && sources.IsSequence() && sources.size() > 0 &&
      sources.Style() == YAML::EmitterStyle::Block) {
    const std::size_t item = static_cast<std::size_t>(sources[0].Mark().pos);
    const std::size_t start = line_start(start_text, item);
    const std::string prefix = start_text.substr(start, item - start);
    const std::size_t dash = prefix.find('-');
    std::string indent =
        dash == std::string::npos ? std::string() : prefix.substr(0, dash);
    std::string entries;
    for (const FreeParameter& f : result.parameters)
      entries +=
          indent + "- for: " + f.path + "\n" + indent + "  cite: " +
          quote("fitted by quantacal fit to " + data.file + " (sha256 " +
                data.sha256.substr(0, 16) + "...; see the fit record); start value " +
                quantity_text(f.start, f.unit)) +
          "\n";
    edits.push_back({start, 0, entries});
  }
  // An earlier fit record is replaced.
  std::string text = start_text;
  std::size_t fit_begin = std::string::npos, fit_end = std::string::npos;
  if (root["fit"].IsDefined()) {
    for (std::size_t p = 0; p < text.size(); p = next_line(text, p))
      if (text.compare(p, 4, "fit:") == 0) {
        fit_begin = p;
        fit_end = next_line(text, p);
        while (fit_end < text.size() &&
               (text[fit_end] == ' ' || text[fit_end] == '\n' || text[fit_end] == '#' ||
                text[fit_end] == '\t' || text[fit_end] == '\r'))
          fit_end = next_line(text, fit_end);
        break;
      }
  }
  if (fit_begin != std::string::npos)
    edits.push_back({fit_begin, fit_end - fit_begin, ""});
  std::sort(edits.begin(), edits.end(),
            [](const Edit& a, const Edit& b) { return a.position > b.position; });
  for (const Edit& e : edits)
    text.replace(e.position, e.length, e.text);
  if (!text.empty() && text.back() != '\n')
    text.push_back('\n');

  std::ostringstream r;
  r << "fit:\n"
    << "  data: " << quote(data.file) << "\n"
    << "  data_sha256: " << data.sha256 << "\n"
    << "  temperature_range: {from: " << quote(number(result.from) + " K")
    << ", to: " << quote(number(result.to) + " K") << "}\n"
    << "  n_points: " << result.residuals.size() << "\n"
    << "  weights: " << (weighting == Weighting::relative ? "relative" : "absolute")
    << "\n"
    << "  uncertainties: "
    << (result.covariance_scaled ? "estimated from the scatter (covariance scaled by the "
                                   "reduced chi-square)"
                                 : "from the sigma column of the data")
    << "\n"
    << "  iterations: " << result.iterations << "\n"
    << "  chi_square: " << number(result.chi_square) << "\n"
    << "  degrees_of_freedom: " << result.degrees_of_freedom << "\n"
    << "  reduced_chi_square: " << number(result.reduced_chi_square) << "\n"
    << "  rms_relative_residual: " << number(result.rms_relative, 4) << "\n"
    << "  max_relative_residual: " << number(result.max_relative, 4) << "\n"
    << "  parameters:\n";
  for (std::size_t j = 0; j < result.parameters.size(); ++j) {
    const FreeParameter& f = result.parameters[j];
    r << "    - {path: " << quote(f.path)
      << ", value: " << card_value(result.values[j], f.unit)
      << ", standard_error: " << card_value(result.standard_errors[j], f.unit)
      << ", start: " << card_value(f.start, f.unit) << "}\n";
  }
  r << "  covariance:   # SI units, rows and columns in the order of `parameters`\n";
  for (const auto& row : result.covariance) {
    r << "    - [";
    for (std::size_t b = 0; b < row.size(); ++b)
      r << (b ? ", " : "") << format_double(row[b]);
    r << "]\n";
  }
  r << "  tool: " << quote(std::string("quantacal ") + QUANTACAL_VERSION_STRING) << "\n";
  return text + r.str();
}

std::string report(const FitResult& result, const DataSet& data) {
  std::ostringstream o;
  o << "fit of " << data.file << ": " << result.residuals.size() << " rows, "
    << number(result.from, 6) << " K to " << number(result.to, 6)
    << " K, converged after " << result.iterations << " iterations\n\n";
  o << std::left << std::setw(36) << "parameter" << std::setw(24) << "value"
    << std::setw(28) << "standard error"
    << "start\n";
  for (std::size_t j = 0; j < result.parameters.size(); ++j) {
    const FreeParameter& f = result.parameters[j];
    const double rel = result.values[j] != 0.0 ? 100.0 * result.standard_errors[j] /
                                                     std::abs(result.values[j])
                                               : 0.0;
    o << std::setw(36) << f.path << std::setw(24)
      << quantity_text(result.values[j], f.unit) << std::setw(28)
      << (quantity_text(result.standard_errors[j], f.unit, 3) + " (" + number(rel, 2) +
          " %)")
      << quantity_text(f.start, f.unit) << "\n";
  }
  o << "\ncorrelation matrix\n" << std::setw(8) << "";
  for (std::size_t j = 0; j < result.parameters.size(); ++j)
    o << std::right << std::setw(9) << ("[" + std::to_string(j) + "]");
  o << "\n";
  for (std::size_t a = 0; a < result.parameters.size(); ++a) {
    o << std::left << std::setw(8) << ("[" + std::to_string(a) + "]");
    for (std::size_t b = 0; b < result.parameters.size(); ++b) {
      char cell[32];
      std::snprintf(cell, sizeof cell, "%9.4f", result.correlation[a][b]);
      o << cell;
    }
    o << "   " << result.parameters[a].path << "\n";
  }
  o << "\nchi-square " << number(result.chi_square, 6) << " on "
    << result.degrees_of_freedom << " degrees of freedom, reduced chi-square "
    << number(result.reduced_chi_square, 6) << "\n"
    << "standard errors "
    << (result.covariance_scaled ? "scaled by the reduced chi-square (no sigma column)"
                                 : "from the sigma column")
    << "\nrelative residuals: rms " << number(100 * result.rms_relative, 3) << " %, max "
    << number(100 * result.max_relative, 3) << " %\n\n";
  for (const std::string& w : result.warnings)
    o << "warning: " << w << "\n\n";
  o << "residuals\n";
  char line[256];
  std::snprintf(line, sizeof line, "%6s %10s %10s %-9s %14s %14s %13s %9s %10s\n", "line",
                "T_K", "T_from_K", "quantity", "data", "model", "model-data", "rel_%",
                "weighted");
  o << line;
  for (const ResidualRow& r : result.residuals) {
    const char* q = r.point.kind == Observable::capacity           ? "cp"
                    : r.point.kind == Observable::energy_increment ? "e"
                                                                   : "k";
    std::snprintf(line, sizeof line,
                  "%6d %10.5g %10s %-9s %14.7g %14.7g %13.4g %9.3f %10.4g\n",
                  r.point.line, r.point.temperature,
                  r.point.kind == Observable::energy_increment
                      ? number(r.point.from_temperature, 5).c_str()
                      : "",
                  q, r.point.value, r.model, r.residual, 100 * r.relative, r.weighted);
    o << line;
  }
  return o.str();
}

std::string plot(const FitResult& result, const std::string& svg_path) {
  namespace fs = std::filesystem;
  // The panel shows the most common observable; residuals show every row.
  std::size_t counts[3] = {0, 0, 0};
  for (const auto& r : result.residuals)
    ++counts[static_cast<int>(r.point.kind)];
  const Observable shown = counts[2] > counts[0] && counts[2] > counts[1]
                               ? Observable::conductivity
                           : counts[0] >= counts[1] ? Observable::capacity
                                                    : Observable::energy_increment;
  bool per_mass = false;
  for (const auto& r : result.residuals)
    if (r.point.kind == shown)
      per_mass = r.point.per_mass;
  std::error_code ec;
  const fs::path dir =
      fs::temp_directory_path(ec) /
      ("quantacal-fit-" + std::to_string(std::hash<std::string>{}(svg_path)) + "-" +
       std::to_string(reinterpret_cast<std::uintptr_t>(&result)));
  fs::create_directories(dir, ec);
  if (ec)
    return "cannot create a temporary folder for the plot: " + ec.message();
  const fs::path data_file = dir / "data.txt", model_file = dir / "model.txt",
                 script = dir / "plot.gp", tmp_svg = fs::path(svg_path + ".tmp");
  {
    std::ofstream d(data_file), m(model_file);
    for (const auto& r : result.residuals)
      d << format_double(r.point.temperature) << ' ' << format_double(r.point.value)
        << ' ' << format_double(100 * r.relative) << ' '
        << (r.point.kind == shown ? 1 : 0) << '\n';
    const double lo = result.from > 0 ? result.from : 1.0, hi = result.to;
    const int n = 200;
    for (int i = 0; i <= n && shown != Observable::energy_increment; ++i) {
      const double t = lo * std::pow(hi / lo, double(i) / n);
      try {
        double v = 0;
        if (shown == Observable::capacity) {
          v = result.material->model().evaluate(t).capacity;
          if (per_mass)
            v /= result.material->molar_mass();
        } else {
          v = result.material->data().conductivity->evaluate(t).value;
        }
        m << format_double(t) << ' ' << format_double(v) << '\n';
      } catch (const std::exception&) {
      }
    }
    if (shown == Observable::energy_increment)
      for (const auto& r : result.residuals)
        if (r.point.kind == shown)
          m << format_double(r.point.temperature) << ' ' << format_double(r.model)
            << '\n';
  }
  const std::string ylabel =
      shown == Observable::capacity ? (per_mass ? "c_p (J/kg/K)" : "c_p (J/mol/K)")
      : shown == Observable::conductivity
          ? "k (W/m/K)"
          : (per_mass ? "e increment (J/kg)" : "e increment (J/mol)");
  {
    std::ofstream g(script);
    g << "set terminal svg size 800,720 dynamic font 'sans,12'\n"
      << "set output '" << tmp_svg.string() << "'\n"
      << "set termoption noenhanced\nset lmargin 12\n"
      << "set multiplot layout 2,1\n"
      << "set logscale xy\nset grid\nset key top left\n"
      << "set xrange [" << format_double(result.from / 1.15) << ":"
      << format_double(result.to * 1.15) << "]\n"
      << "set ylabel '" << ylabel << "'\nset xlabel 'T (K)'\n"
      << "set title 'quantacal fit: data and fitted model'\n"
      << "plot '" << model_file.string()
      << "' using 1:2 with lines lw 2 lc rgb '#1f5fa8' title 'model', '"
      << data_file.string()
      << "' using 1:($4 > 0 ? $2 : 1/0) with points pt 7 ps 0.6 lc rgb '#c0392b' title "
         "'data'\n"
      << "unset logscale y\nset ylabel 'model/data - 1 (%)'\n"
      << "set title 'relative residuals'\nset key off\n"
      << "plot '" << data_file.string()
      << "' using 1:3 with impulses lw 1 lc rgb '#c0392b' title 'residual', '' using 1:3 "
         "with points pt 7 ps 0.5 lc rgb '#c0392b' title 'residual', 0 lw 1 lc 'black' "
         "title 'zero'\n"
      << "unset multiplot\n";
  }
  const std::string command =
      "gnuplot '" + script.string() + "' 2>'" + (dir / "gnuplot.log").string() + "'";
  const int status = std::system(command.c_str());
  std::string why;
  if (status != 0) {
    std::ifstream log(dir / "gnuplot.log");
    std::string first;
    std::getline(log, first);
    why = "gnuplot failed (exit status " + std::to_string(status) + ")" +
          (first.empty() ? std::string() : ": " + first);
    fs::remove(tmp_svg, ec);
  } else {
    fs::rename(tmp_svg, svg_path, ec);
    if (ec)
      why = "cannot write " + svg_path + ": " + ec.message();
  }
  fs::remove_all(dir, ec);
  return why;
}

} // namespace quantacal::fit
