// SPDX-License-Identifier: Apache-2.0
// Reading the `time`, `output` and `solver` blocks of a case file (docs/cases.md).
#include "case_reader.h"

#include <quantacal/common/format.h>
#include <quantacal/common/text.h>

#include <algorithm>
#include <set>

namespace quantacal::solver::detail {
namespace {

using quantacal::detail::index_path;

/** The optional limits of the time block: tolerance, steps and rejections. */
void read_step_limits(const CaseReader& reader, const YAML::Node& block, TimeSpec& time) {
  if (block["tolerance"])
    time.tolerance =
        reader.positive(block["tolerance"], "time.tolerance", dimension::temperature(),
                        "a temperature error per step (e.g. \"0.1 K\")");
  if (block["min_step"])
    time.min_step =
        reader.positive(block["min_step"], "time.min_step", dimension::time(), "a time");
  if (block["max_step"])
    time.max_step =
        reader.positive(block["max_step"], "time.max_step", dimension::time(), "a time");
  if (block["max_rejections"])
    time.max_rejections = reader.count(block["max_rejections"], "time.max_rejections",
                                       "a whole number from 1 to 60", 1, 60);
  if (block["max_steps"])
    time.max_steps = reader.count(block["max_steps"], "time.max_steps",
                                  "a whole number from 1 to 10000000", 1, 10000000);
  if (block["adaptive"])
    time.adaptive = reader.boolean(block["adaptive"], "time.adaptive");
}

Probe read_probe(const CaseReader& reader, const YAML::Node& entry,
                 const std::string& field, int dim, std::set<std::string>& names) {
  reader.check_keys(entry, field, {"name", "point"});
  for (const char* key : {"name", "point"})
    if (!entry[key])
      reader.fail_missing(entry, field, key,
                          key == std::string("name") ? "a probe name" : "a point");
  Probe probe;
  probe.name = reader.text(entry["name"], field + ".name");
  if (probe.name.empty() || probe.name.find_first_of(",\"\n ") != std::string::npos)
    reader.fail(entry["name"], field + ".name",
                "a name without blanks, commas or quotes");
  if (!names.insert(probe.name).second)
    reader.fail(entry["name"], field + ".name", "a probe name used once");
  probe.point = reader.point(entry["point"], field + ".point", dim);
  probe.where = reader.where(entry["point"], field + ".point");
  return probe;
}

void read_probes(const CaseReader& reader, const YAML::Node& list, int dim,
                 OutputSpec& output) {
  if (!list.IsSequence())
    reader.fail(list, "output.probes", "a list of {name, point}");
  std::set<std::string> names;
  for (std::size_t i = 0; i < list.size(); ++i)
    output.probes.push_back(
        read_probe(reader, list[i], index_path("output.probes", i), dim, names));
}

void read_crossing_temperatures(const CaseReader& reader, const YAML::Node& list,
                                OutputSpec& output) {
  if (!list.IsSequence())
    reader.fail(list, "output.crossing_temperatures", "a list of temperatures");
  for (std::size_t i = 0; i < list.size(); ++i) {
    const std::string field = index_path("output.crossing_temperatures", i);
    const double t = reader.temperature(list[i], field);
    if (std::find(output.crossing_temperatures.begin(),
                  output.crossing_temperatures.end(),
                  t) != output.crossing_temperatures.end())
      reader.fail(list[i], field, "a temperature not already in the list");
    output.crossing_temperatures.push_back(t);
  }
}

/** output.windows: pairs of temperatures, each stored upper first. */
void read_windows(const CaseReader& reader, const YAML::Node& list, OutputSpec& output) {
  const std::string expected =
      "a pair of two different temperatures, e.g. [\"400 degC\", \"290 degC\"]";
  if (!list.IsSequence())
    reader.fail(list, "output.windows", "a list of temperature pairs, each " + expected);
  for (std::size_t i = 0; i < list.size(); ++i) {
    const std::string field = index_path("output.windows", i);
    const YAML::Node pair = list[i];
    if (!pair.IsSequence() || pair.size() != 2)
      reader.fail(pair, field, expected);
    const double a = reader.temperature(pair[0], index_path(field, 0));
    const double b = reader.temperature(pair[1], index_path(field, 1));
    if (a == b)
      reader.fail(pair, field, expected);
    output.windows.push_back({std::max(a, b), std::min(a, b), reader.where(pair, field)});
  }
}

/**
 * output.temperature_unit, or else the unit the case's initial temperature is
 * written in (a temperature is written in K, mK, degC or degF).
 */
TemperatureUnit read_temperature_unit(const CaseReader& reader, const YAML::Node& root,
                                      const YAML::Node& block) {
  const std::vector<std::pair<std::string, TemperatureUnit>> units = {
      {"K", TemperatureUnit::kelvin},
      {"degC", TemperatureUnit::celsius},
      {"degF", TemperatureUnit::fahrenheit}};
  if (block["temperature_unit"]) {
    const YAML::Node node = block["temperature_unit"];
    const std::string text = reader.text(node, "output.temperature_unit");
    for (const auto& [name, unit] : units)
      if (text == name)
        return unit;
    reader.fail(node, "output.temperature_unit",
                "K, degC or degF" + did_you_mean(text, {"K", "degC", "degF"}));
  }
  const std::string initial =
      reader.text(root["initial_temperature"], "initial_temperature");
  for (const auto& [name, unit] : units)
    if (name != "K" && initial.find(name) != std::string::npos)
      return unit;
  return TemperatureUnit::kelvin;
}

/** `mass` and `formulation`, two words of the solver block. */
void read_solver_choices(const CaseReader& reader, const YAML::Node& block,
                         SolverSpec& solver) {
  if (block["mass"]) {
    const std::string mass = reader.text(block["mass"], "solver.mass");
    if (mass == "lumped")
      solver.mass = SolverSpec::Mass::lumped;
    else if (mass == "consistent")
      solver.mass = SolverSpec::Mass::consistent;
    else if (mass == "automatic")
      solver.mass = SolverSpec::Mass::automatic;
    else
      reader.fail(block["mass"], "solver.mass", "lumped, consistent or automatic");
  }
  if (block["formulation"]) {
    const std::string form = reader.text(block["formulation"], "solver.formulation");
    if (form == "energy")
      solver.formulation = Formulation::energy;
    else if (form == "capacity")
      solver.formulation = Formulation::capacity;
    else
      reader.fail(block["formulation"], "solver.formulation", "energy or capacity");
  }
}

/** A plain number in (0, @probe largest]; @probe range is the range as written in
 * messages. */
double read_small_tolerance(const CaseReader& reader, const YAML::Node& node,
                            const std::string& field, double largest,
                            const std::string& range) {
  const double v = reader.number(node, field, "a number in " + range);
  if (!(v > 0 && v <= largest))
    reader.fail(node, field, "a number in " + range);
  return v;
}

} // namespace

void read_time(const CaseReader& reader, const YAML::Node& root,
               CaseDescription& description) {
  const YAML::Node block = root["time"];
  reader.check_keys(block, "time",
                    {"end", "first_step", "tolerance", "min_step", "max_step",
                     "max_rejections", "max_steps", "adaptive"});
  description.time.where = reader.where(block, "time");
  for (const char* key : {"end", "first_step"})
    if (!block[key])
      reader.fail_missing(block, "time", key, "a time (e.g. \"60 s\")");
  description.time.end =
      reader.positive(block["end"], "time.end", dimension::time(), "a time");
  description.time.first_step = reader.positive(block["first_step"], "time.first_step",
                                                dimension::time(), "a time");
  if (description.time.first_step > description.time.end)
    reader.fail(block["first_step"], "time.first_step",
                "a first step no longer than time.end");
  read_step_limits(reader, block, description.time);
  const TimeSpec& time = description.time;
  if (block["min_step"] && time.min_step > time.first_step)
    reader.fail(block["min_step"], "time.min_step",
                "a smallest step no longer than time.first_step (" +
                    format_double(time.first_step) + " s)");
  if (block["max_step"] && time.max_step < time.first_step)
    reader.fail(block["max_step"], "time.max_step",
                "a largest step no shorter than time.first_step (" +
                    format_double(time.first_step) + " s)");
  if (block["max_step"] && time.max_step > time.end)
    reader.fail(block["max_step"], "time.max_step",
                "a largest step no longer than time.end (" + format_double(time.end) +
                    " s)");
}

void read_output(const CaseReader& reader, const YAML::Node& root,
                 CaseDescription& description) {
  const YAML::Node block = root["output"];
  reader.check_keys(block, "output",
                    {"folder", "interval", "fields", "plot", "report", "probes",
                     "crossing_temperatures", "windows", "temperature_unit",
                     "checkpoint_interval", "checkpoint_wall_interval"});
  description.output.where = reader.where(block, "output");
  if (!block["folder"])
    reader.fail_missing(block, "output", "folder", "an output folder");
  description.output.folder = reader.path(block["folder"], "output.folder");
  description.output.where = reader.where(block["folder"], "output.folder");
  if (block["interval"])
    description.output.interval = reader.positive(block["interval"], "output.interval",
                                                  dimension::time(), "a time");
  if (block["interval"] && description.output.interval > description.time.end)
    reader.fail(block["interval"], "output.interval",
                "an interval no longer than time.end (" +
                    format_double(description.time.end) + " s)");
  if (block["checkpoint_interval"])
    description.output.checkpoint_interval =
        reader.positive(block["checkpoint_interval"], "output.checkpoint_interval",
                        dimension::time(), "a simulated time (e.g. \"5 s\")");
  if (block["checkpoint_wall_interval"])
    description.output.checkpoint_wall_interval = reader.positive(
        block["checkpoint_wall_interval"], "output.checkpoint_wall_interval",
        dimension::time(), "a wall-clock time (e.g. \"10 min\")");
  if (block["fields"])
    description.output.fields = reader.boolean(block["fields"], "output.fields");
  if (block["plot"])
    description.output.plot = reader.boolean(block["plot"], "output.plot");
  if (block["probes"])
    read_probes(reader, block["probes"], description.dimension(), description.output);
  if (block["crossing_temperatures"])
    read_crossing_temperatures(reader, block["crossing_temperatures"],
                               description.output);
  if (block["report"])
    description.output.report = reader.boolean(block["report"], "output.report");
  if (block["windows"])
    read_windows(reader, block["windows"], description.output);
  description.output.temperature_unit = read_temperature_unit(reader, root, block);
}

void read_solver_settings(const CaseReader& reader, const YAML::Node& root,
                          CaseDescription& description) {
  if (!root["solver"])
    return;
  const YAML::Node block = root["solver"];
  reader.check_keys(block, "solver",
                    {"formulation", "degree", "newton_tolerance", "max_newton_iterations",
                     "linear_tolerance", "mass"});
  read_solver_choices(reader, block, description.solver);
  if (block["degree"])
    description.solver.degree =
        reader.count(block["degree"], "solver.degree", "a degree 1, 2 or 3", 1, 3);
  if (block["newton_tolerance"])
    description.solver.newton_tolerance = read_small_tolerance(
        reader, block["newton_tolerance"], "solver.newton_tolerance", 1e-3, "(0, 1e-3]");
  if (block["max_newton_iterations"])
    description.solver.max_newton_iterations =
        reader.count(block["max_newton_iterations"], "solver.max_newton_iterations",
                     "a whole number from 1 to 100", 1, 100);
  if (block["linear_tolerance"])
    description.solver.linear_tolerance = read_small_tolerance(
        reader, block["linear_tolerance"], "solver.linear_tolerance", 1e-4, "(0, 1e-4]");
}

} // namespace quantacal::solver::detail
