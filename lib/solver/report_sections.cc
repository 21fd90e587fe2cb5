// SPDX-License-Identifier: Apache-2.0
// The sections of report.html about the case and its results (report_html.h).
#include "report_html.h"

#include "result_files.h"

#include <quantacal/common/text.h>

#include <algorithm>
#include <cstdio>
#include <map>
#include <sstream>

namespace quantacal::solver::detail {
namespace {

using Path = std::vector<PathPart>;

/** Four significant digits, for the text of a cell. */
std::string short_number(double value) {
  return display_number(value);
}

std::string temperature_text(double kelvin, const TemperatureScale& scale) {
  return short_number(scale.value(kelvin)) + " " + scale.symbol();
}

/** The head of a table whose columns from @p first_number on hold numbers. */
/** "4 K to 1040 K (-269.1 to 766.9 degC)", or in K alone. */
std::string range_text(double lower, double upper, const TemperatureScale& scale) {
  std::string text = short_number(lower) + " K to " + short_number(upper) + " K";
  if (scale.symbol() != "K")
    text += " (" + short_number(scale.value(lower)) + " to " +
            short_number(scale.value(upper)) + " " + scale.symbol() + ")";
  return text;
}

std::string header_row(const std::vector<std::string>& names,
                       std::size_t first_number = 1000) {
  std::string row = "<thead><tr>";
  for (std::size_t i = 0; i < names.size(); ++i)
    row += (i >= first_number ? "<th class=\"num\">" : "<th>") + markup_escape(names[i]) +
           "</th>";
  return row + "</tr></thead>\n";
}

std::string section(const std::string& id, const std::string& title,
                    const std::string& body) {
  return "<section id=\"" + id + "\">\n<h2>" + markup_escape(title) + "</h2>\n" + body +
         "</section>\n";
}

/** "constant 500 W/m^2/K" or "table of 6 points: 0.25 to 12.6 kW..." of a curve. */
std::string curve_text(const Curve& curve, const std::string& what, double y_scale,
                       const std::string& y_unit, const std::string& x_text) {
  const auto& y = curve.y();
  if (y.size() == 1)
    return what + " " + short_number(y.front() / y_scale) + " " + y_unit;
  const auto [low, high] = std::minmax_element(y.begin(), y.end());
  return what + " from a table of " + std::to_string(y.size()) + " points, " +
         short_number(*low / y_scale) + " to " + short_number(*high / y_scale) + " " +
         y_unit + " " + x_text;
}

std::string boundary_text(const BoundarySpec& b, const TemperatureScale& scale) {
  std::vector<std::string> parts;
  if (b.temperature)
    parts.push_back(curve_text(*b.temperature, "fixed temperature", 1.0, "K",
                               "over t = " + short_number(b.temperature->x().front()) +
                                   " to " + short_number(b.temperature->x().back()) +
                                   " s"));
  if (b.convection) {
    const Curve& h = b.convection->coefficient;
    parts.push_back("convection to " +
                    temperature_text(b.convection->ambient_temperature, scale) + ", " +
                    curve_text(h, "h", 1.0, "W/m^2/K",
                               "against the surface temperature " +
                                   temperature_text(h.x().front(), scale) + " to " +
                                   temperature_text(h.x().back(), scale)));
  }
  if (b.radiation)
    parts.push_back("radiation to " +
                    temperature_text(b.radiation->ambient_temperature, scale) +
                    ", emissivity " + short_number(b.radiation->emissivity));
  if (parts.empty())
    return "insulated";
  std::string text;
  for (const std::string& part : parts)
    text += (text.empty() ? "" : "; ") + part;
  return text;
}

std::string row(const std::string& name, const std::string& cell) {
  return "<tr><th scope=\"row\">" + markup_escape(name) + "</th>" + cell + "</tr>\n";
}

Path probe_path(const std::string& probe, const char* list, long index,
                const std::string& key) {
  return {{"probes"}, {probe}, {list}, {"", index}, {key}};
}

} // namespace

std::string materials_section(const CaseDescription& description,
                              const TemperatureScale& scale) {
  std::ostringstream out;
  out << "<table>\n"
      << header_row({"id", "material", "card", "valid range", "initial temperature"});
  std::ostringstream sources;
  for (const MaterialSpec& m : description.materials) {
    const double initial =
        m.initial_temperature.value_or(description.initial_temperature);
    out << "<tr>" << text_cell(std::to_string(m.id));
    if (!m.material) {
      out << text_cell("(loaded at the run)") << text_cell(m.card) << text_cell("")
          << text_cell(temperature_text(initial, scale)) << "</tr>\n";
      continue;
    }
    const MaterialData& data = m.material->data();
    out << text_cell(data.name) << text_cell(m.card.empty() ? data.file : m.card)
        << text_cell(range_text(data.lower_temperature, data.upper_temperature, scale))
        << text_cell(temperature_text(initial, scale)) << "</tr>\n";
    sources << "<h3>Sources of " << markup_escape(data.name) << " (material " << m.id
            << ")</h3>\n<ul class=\"sources\">\n";
    for (const Source& s : data.sources)
      sources << "<li><span class=\"param\">" << markup_escape(s.parameter)
              << "</span>: " << markup_escape(s.citation) << "</li>\n";
    if (data.sources.empty())
      sources << "<li>the card names no sources</li>\n";
    sources << "</ul>\n";
  }
  out << "</table>\n" << sources.str();
  return section("materials", "Materials", out.str());
}

std::string boundaries_section(const CaseDescription& description,
                               const TemperatureScale& scale) {
  std::ostringstream out;
  out << "<table>\n" << header_row({"boundary id", "condition"});
  for (const BoundarySpec& b : description.boundaries)
    out << "<tr>" << text_cell(std::to_string(b.boundary_id))
        << text_cell(boundary_text(b, scale)) << "</tr>\n";
  out << "</table>\n<p class=\"note\">Boundary ids not listed are insulated.";
  if (!description.sources.empty())
    out << " Heat sources: " << description.sources.size() << " (see the case file).";
  out << "</p>\n";
  return section("boundaries", "Boundary conditions", out.str());
}

std::string mesh_section(const CaseDescription& description, const RunResult& result) {
  static const char* const geometry[] = {"2D planar", "2D axisymmetric", "3D"};
  std::ostringstream out;
  out << "<table class=\"pairs\">\n"
      << row("geometry", text_cell(geometry[static_cast<int>(description.geometry)]))
      << row("cells", number_cell({{"mesh"}, {"cells"}}, double(result.n_cells)))
      << row("unknowns", number_cell({{"mesh"}, {"dofs"}}, double(result.n_dofs)))
      << row("element", text_cell("FE_Q" + std::to_string(description.solver.degree)))
      << row("MPI ranks", number_cell({{"ranks"}}, result.n_ranks)) << "</table>\n";
  return section("mesh", "Mesh", out.str());
}

std::string solver_section(const RunResult& result) {
  const StepStatistics& s = result.steps;
  const auto steps = [](const char* key) { return Path{{"steps"}, {key}}; };
  std::ostringstream out;
  out << "<table class=\"pairs\">\n"
      << row("time integration", text_cell("TR-BDF2, energy form"))
      << row("status",
             text_cell(result.completed ? "completed" : "stopped: " + result.stop_reason))
      << row("accepted steps", number_cell(steps("accepted"), s.n_steps))
      << row("rejected steps", number_cell(steps("rejected"), s.n_rejected))
      << row("Newton iterations",
             number_cell(steps("newton_iterations"), s.n_newton_iterations))
      << row("linear iterations",
             number_cell(steps("linear_iterations"), s.n_linear_iterations))
      << row("smallest step (s)", number_cell(steps("smallest_step_s"), s.smallest_step))
      << row("largest step (s)", number_cell(steps("largest_step_s"), s.largest_step))
      << row("wall time (s)",
             number_cell({{"wall_time_s"}, {"total"}}, result.timings.total))
      << "</table>\n";
  return section("solver", "Solver statistics", out.str());
}

std::string glance_section(const CaseDescription& description, const RunResult& result,
                           const TemperatureScale& scale) {
  std::vector<std::string> names = {"probe",
                                    "final temperature (" + scale.symbol() + ")"};
  for (const double t : description.output.crossing_temperatures)
    names.push_back("time to " + temperature_text(t, scale) + " (s)");
  std::ostringstream out;
  out << "<div class=\"wide\"><table id=\"glance-table\">\n" << header_row(names, 1);
  for (std::size_t p = 0; p < result.probe_names.size(); ++p) {
    const std::string& probe = result.probe_names[p];
    const auto& history = result.probe_temperatures[p];
    out << "<tr>" << text_cell(probe)
        << number_cell({{"probes"}, {probe}, {"final_temperature_" + scale.symbol()}},
                       history.empty() ? 0.0 : scale.value(history.back()));
    long i = 0;
    for (const Crossing& c : result.crossings)
      if (c.probe == probe) {
        out << (c.crossed
                    ? number_cell(probe_path(probe, "crossings", i, "time_s"), c.time)
                    : text_cell("not reached"));
        ++i;
      }
    out << "</tr>\n";
  }
  out << "</table></div>\n";
  return section("glance", "At a glance", out.str());
}

std::string windows_section(const RunResult& result, const TemperatureScale& scale) {
  if (result.windows.empty())
    return section("windows", "Temperature windows",
                   "<p class=\"note\">No windows were requested (output.windows in the "
                   "case file).</p>\n");
  const std::string rate = " (" + scale.rate_symbol() + ")";
  std::ostringstream out;
  out << "<table id=\"window-metrics\">\n"
      << header_row({"probe", "window (" + scale.symbol() + ")", "passed through",
                     "first inside (s)", "last inside (s)", "time inside (s)",
                     "mean cooling rate" + rate, "max cooling rate" + rate},
                    3);
  std::map<std::string, long> index;
  for (const WindowPassage& w : result.windows) {
    const long i = index[w.probe]++;
    const auto at = [&](const std::string& key) {
      return probe_path(w.probe, "windows", i, key);
    };
    out << "<tr>" << text_cell(w.probe) << "<td class=\"nowrap\">"
        << short_number(scale.value(w.upper)) << " to "
        << short_number(scale.value(w.lower)) << "</td>";
    if (!w.entered) {
      out << "<td colspan=\"6\" class=\"note\">never inside during the run</td></tr>\n";
      continue;
    }
    out << text_cell(w.passed ? "yes" : "no (inside or above it at the end)");
    const std::string r = "_" + scale.rate_key();
    out << number_cell(at("first_in_s"), w.first_in)
        << number_cell(at("last_in_s"), w.last_in)
        << number_cell(at("time_inside_s"), w.time_inside)
        << number_cell(at("mean_cooling_rate" + r), scale.interval(w.mean_cooling_rate))
        << number_cell(at("max_cooling_rate" + r), scale.interval(w.max_cooling_rate))
        << "</tr>\n";
  }
  out << "</table>\n<p class=\"note\">Mean cooling rate: the temperature fallen inside "
         "the window over the time spent inside. Max: the largest -dT/dt inside, from "
         "the solver's own derivative.</p>\n";
  return section("windows", "Temperature windows", out.str());
}

std::string crossings_section(const RunResult& result, const TemperatureScale& scale) {
  std::ostringstream out;
  out << "<table id=\"crossing-metrics\">\n"
      << header_row({"probe", "temperature (" + scale.symbol() + ")", "first reached (s)",
                     "dT/dt there (" + scale.rate_symbol() + ")"},
                    1);
  std::map<std::string, long> index;
  for (const Crossing& c : result.crossings) {
    const long i = index[c.probe]++;
    out << "<tr>" << text_cell(c.probe)
        << number_cell(
               probe_path(c.probe, "crossings", i, "temperature_" + scale.symbol()),
               scale.value(c.temperature));
    if (c.crossed)
      out << number_cell(probe_path(c.probe, "crossings", i, "time_s"), c.time)
          << number_cell(probe_path(c.probe, "crossings", i, "rate_" + scale.rate_key()),
                         scale.interval(c.rate));
    else
      out << "<td colspan=\"2\" class=\"note\">not reached during the run</td>";
    out << "</tr>\n";
  }
  out << "</table>\n";
  if (result.crossings.empty())
    out << "<p class=\"note\">No crossing temperatures were requested "
           "(output.crossing_temperatures).</p>\n";
  return section("crossings", "Crossing temperatures", out.str());
}

std::string ledger_section(const CaseDescription& description, const RunResult& result) {
  if (result.energy.empty())
    return section("ledger", "Energy ledger", "<p>No ledger rows.</p>\n");
  const EnergyRecord& first = result.energy.front();
  const EnergyRecord& last = result.energy.back();
  const std::string j = description.geometry == Geometry::planar ? " (J/m)" : " (J)";
  const double change = last.stored_energy - first.stored_energy;
  std::ostringstream out;
  out << "<table class=\"pairs\" id=\"ledger-table\">\n"
      << row("stored-energy change" + j,
             number_cell({{"energy"}, {"stored_change_J"}}, change))
      << row("heat through the boundary" + j,
             number_cell({{"energy"}, {"boundary_heat_J"}}, last.boundary_heat))
      << row("heat from sources" + j,
             number_cell({{"energy"}, {"source_heat_J"}}, last.source_heat));
  if (description.adaptivity.enabled)
    out << row("stored-energy change of remeshing" + j,
               number_cell({{"energy"}, {"remesh_change_J"}}, last.remesh_change));
  out << row("worst relative imbalance of any row",
             number_cell({{"worst_relative_imbalance"}}, result.worst_relative_imbalance))
      << "</table>\n<p class=\"note\">The ledger closes when the stored-energy change "
         "equals the heat that entered; the imbalance is |change - heat| / |change| "
         "(energy.csv has every row).</p>\n";
  return section("ledger", "Energy ledger", out.str());
}

} // namespace quantacal::solver::detail
