// SPDX-License-Identifier: Apache-2.0
// The physical domain of every value of a case file: a value that is legal YAML
// but not physics (a temperature at or below 0 K, a negative time or length, a
// negative heat-transfer coefficient, an emissivity outside (0, 1], NaN or an
// infinity) is an InputError at its own line and column, naming the field, the
// value as written and what was expected. One row per kind of value. The case is
// illustrative; the cards it names are not loaded here.
#include <quantacal/common/exceptions.h>
#include <quantacal/solver/case.h>

#include <gtest/gtest.h>

#include <algorithm>
#include <string>

namespace {

using quantacal::InputError;
using quantacal::solver::CaseDescription;
using quantacal::solver::load_case_from_string;

// Illustrative case: every block that carries a physical value.
const std::string kCase = R"(name: domain checks
geometry: planar
mesh:
  generator: plate
  size: ["20 mm", "10 mm"]
  origin: ["0 mm", "0 mm"]
  cells: [4, 2]
  refinements: 1
  regions:
    - {material_id: 2, lower: ["0 mm", "0 mm"], upper: ["5 mm", "10 mm"]}
materials:
  - {id: 1, card: a.yaml}
  - {id: 2, card: b.yaml, initial_temperature: "400 degC"}
initial_temperature: "500 degC"
boundaries:
  - id: 0
    convection:
      ambient: "30 degC"
      h: [["40 degC", "1 kW/m^2/K"], ["300 degC", "12 kW/m^2/K"]]
    radiation: {emissivity: 0.8, ambient: "30 degC"}
  - id: 1
    temperature: [["0 s", "500 degC"], ["10 s", "100 degC"]]
  - id: 2
    convection: {ambient: "20 degC", h: "50 W/m^2/K"}
sources:
  - {power_density: "2 MW/m^3", materials: [1], start: "0 s", end: "5 s"}
time:
  end: "60 s"
  first_step: "0.01 s"
  tolerance: "0.5 K"
  min_step: "1 ms"
  max_step: "5 s"
output:
  folder: results
  interval: "10 s"
  probes:
    - {name: centre, point: ["10 mm", "5 mm"]}
  crossing_temperatures: ["200 degC"]
solver:
  newton_tolerance: 1e-8
)";

CaseDescription load(const std::string& text) {
  return load_case_from_string(text, "case.yaml", "/nonexistent-quantacal-case", false);
}

// One bad value: `from` (unique in kCase) becomes `to`; the error must point at
// `at`, the first occurrence of it inside the replacement (its line and column
// found in the text here, independently of the reader).
struct Row {
  const char* kind;
  const char* from;
  const char* to;
  const char* at;
  const char* field;
  const char* value;
  const char* expected; // a part of InputError::expected()
};

const Row kRows[] = {
    // temperatures > 0 K
    {"initial temperature", "initial_temperature: \"500 degC\"",
     "initial_temperature: \"-300 degC\"", "\"-300", "initial_temperature", "-300 degC",
     "expected a temperature > 0 K"},
    {"initial temperature of one material", "\"400 degC\"", "\"0 K\"", "\"0 K\"",
     "materials[1].initial_temperature", "0 K", "expected a temperature > 0 K"},
    {"convection ambient", "ambient: \"30 degC\"\n", "ambient: \"-280 degC\"\n", "\"-280",
     "boundaries[0].convection.ambient", "-280 degC", "expected a temperature > 0 K"},
    {"radiation ambient at 0 K", "0.8, ambient: \"30 degC\"", "0.8, ambient: \"0 K\"",
     "\"0 K", "boundaries[0].radiation.ambient", "0 K", "expected a temperature > 0 K"},
    {"fixed temperature", "[\"10 s\", \"100 degC\"]", "[\"10 s\", \"-300 degC\"]",
     "\"-300", "boundaries[1].temperature[1][1]", "-300 degC", "a temperature > 0"},
    {"surface temperature of an h(T) table", "[[\"40 degC\", \"1 kW",
     "[[\"-280 degC\", \"1 kW", "\"-280", "boundaries[0].convection.h[0][0]", "-280 degC",
     "expected a surface temperature > 0 K"},
    {"crossing temperature", "[\"200 degC\"]", "[\"-274 degC\"]", "\"-274",
     "output.crossing_temperatures[0]", "-274 degC", "expected a temperature > 0 K"},
    // heat-transfer coefficients >= 0, emissivity in (0, 1]
    {"h, single value", "h: \"50 W/m^2/K\"", "h: \"-50 W/m^2/K\"", "\"-50",
     "boundaries[2].convection.h", "-50 W/m^2/K",
     "expected a heat-transfer coefficient >= 0 W/m^2/K"},
    {"h, table row", "\"12 kW/m^2/K\"", "\"-12 kW/m^2/K\"", "\"-12",
     "boundaries[0].convection.h[1][1]", "-12 kW/m^2/K",
     "expected a heat-transfer coefficient"},
    {"emissivity 0", "emissivity: 0.8", "emissivity: 0", "0,",
     "boundaries[0].radiation.emissivity", "0", "expected an emissivity in (0, 1]"},
    {"emissivity above 1", "emissivity: 0.8", "emissivity: 1.2", "1.2",
     "boundaries[0].radiation.emissivity", "1.2", "expected an emissivity in (0, 1]"},
    // times
    {"time.end", "end: \"60 s\"", "end: \"0 s\"", "\"0 s", "time.end", "0 s",
     "expected a time > 0"},
    {"time.first_step", "first_step: \"0.01 s\"", "first_step: \"-0.01 s\"", "\"-0.01",
     "time.first_step", "-0.01 s", "expected a time > 0"},
    {"first step longer than the run", "first_step: \"0.01 s\"", "first_step: \"2 min\"",
     "\"2 min", "time.first_step", "2 min", "no longer than time.end"},
    {"time.tolerance", "tolerance: \"0.5 K\"", "tolerance: \"0 K\"", "\"0 K",
     "time.tolerance", "0 K", "> 0"},
    {"time.min_step", "min_step: \"1 ms\"", "min_step: \"-1 ms\"", "\"-1 ms",
     "time.min_step", "-1 ms", "expected a time > 0"},
    {"time.max_step", "max_step: \"5 s\"", "max_step: \"0 s\"", "\"0 s", "time.max_step",
     "0 s", "expected a time > 0"},
    {"output.interval", "interval: \"10 s\"", "interval: \"-10 s\"", "\"-10",
     "output.interval", "-10 s", "expected a time > 0"},
    {"time of a fixed-temperature table", "[[\"0 s\", \"500 degC\"]",
     "[[\"-1 s\", \"500 degC\"]", "\"-1 s", "boundaries[1].temperature[0][0]", "-1 s",
     "expected a time >= 0 s"},
    {"source end before its start", "end: \"5 s\"}", "end: \"0 s\"}", "\"0 s",
     "sources[0].end", "0 s", "expected an end time after the start time"},
    {"source start before 0 s", "start: \"0 s\"", "start: \"-1 s\"", "\"-1 s",
     "sources[0].start", "-1 s", "expected a start time >= 0 s"},
    {"smallest step above the first", "min_step: \"1 ms\"", "min_step: \"20 ms\"",
     "\"20 ms", "time.min_step", "20 ms", "no longer than time.first_step"},
    {"largest step below the first", "max_step: \"5 s\"", "max_step: \"5 ms\"", "\"5 ms",
     "time.max_step", "5 ms", "no shorter than time.first_step"},
    {"largest step longer than the run", "max_step: \"5 s\"", "max_step: \"2 min\"",
     "\"2 min", "time.max_step", "2 min", "no longer than time.end"},
    {"output interval longer than the run", "interval: \"10 s\"", "interval: \"2 min\"",
     "\"2 min", "output.interval", "2 min", "no longer than time.end"},
    // lists that name a thing twice
    {"source material named twice", "materials: [1]", "materials: [1, 1]", "1]",
     "sources[0].materials[1]", "1", "not already in the list"},
    {"source on a material the case lacks", "materials: [1]", "materials: [1, 7]", "7]",
     "sources[0].materials[1]", "7",
     "expected the id of a material of this case (materials[].id: 1, 2)"},
    {"crossing temperature named twice", "[\"200 degC\"]", "[\"200 degC\", \"200 degC\"]",
     "\"200 degC\"]", "output.crossing_temperatures[1]", "200 degC",
     "not already in the list"},
    // lengths, counts and boxes of the mesh
    {"mesh.size", "size: [\"20 mm\", \"10 mm\"]", "size: [\"20 mm\", \"-10 mm\"]",
     "\"-10", "mesh.size[1]", "-10 mm", "expected a length > 0"},
    {"mesh.cells", "cells: [4, 2]", "cells: [4, 0]", "0]", "mesh.cells[1]", "0",
     "expected a whole number from 1 to 1000"},
    {"mesh.refinements", "refinements: 1", "refinements: 9", "9", "mesh.refinements", "9",
     "expected a whole number from 0 to 8"},
    {"mesh.refinements negative", "refinements: 1", "refinements: -1", "-1",
     "mesh.refinements", "-1", "expected a whole number from 0 to 8"},
    {"empty region box", "upper: [\"5 mm\"", "upper: [\"0 mm\"", "\"0 mm",
     "mesh.regions[0].upper[0]", "0 mm",
     "expected a coordinate above the box's lower one (0 m)"},
    {"solver.newton_tolerance", "newton_tolerance: 1e-8", "newton_tolerance: 0", "0",
     "solver.newton_tolerance", "0", "expected a number in (0, 1e-3]"},
    // NaN and infinities, wherever a number is read
    {"NaN temperature", "initial_temperature: \"500 degC\"",
     "initial_temperature: \"nan K\"", "\"nan", "initial_temperature", "nan K",
     "NaN and infinity are not allowed"},
    {"infinite time", "end: \"60 s\"", "end: \"inf s\"", "\"inf", "time.end", "inf s",
     "NaN and infinity are not allowed"},
    {"overflowing time", "end: \"60 s\"", "end: \"1e999 s\"", "\"1e999", "time.end",
     "1e999 s", "number out of range"},
    {"NaN power density", "\"2 MW/m^3\"", "\"nan MW/m^3\"", "\"nan",
     "sources[0].power_density", "nan MW/m^3", "NaN and infinity are not allowed"},
    {"infinite probe coordinate", "point: [\"10 mm\", \"5 mm\"]",
     "point: [\"10 mm\", \"-inf mm\"]", "\"-inf", "output.probes[0].point[1]", "-inf mm",
     "NaN and infinity are not allowed"},
    {"NaN emissivity", "emissivity: 0.8", "emissivity: .nan", ".nan",
     "boundaries[0].radiation.emissivity", ".nan", "expected an emissivity in (0, 1]"},
};

TEST(CaseDomain, TheCaseOfTheTableLoads) {
  const CaseDescription c = load(kCase);
  EXPECT_EQ(c.boundaries.size(), 3u);
  EXPECT_DOUBLE_EQ(c.initial_temperature, 773.15);
  EXPECT_DOUBLE_EQ(c.time.end, 60.0);
  EXPECT_DOUBLE_EQ(c.time.tolerance, 0.5);
}

TEST(CaseDomain, EveryKindOfBadValueIsALocatedError) {
  for (const Row& row : kRows) {
    SCOPED_TRACE(row.kind);
    const std::size_t at_from = kCase.find(row.from);
    if (at_from == std::string::npos ||
        kCase.find(row.from, at_from + 1) != std::string::npos) {
      ADD_FAILURE() << "not once in the case: " << row.from;
      continue;
    }
    std::string text = kCase;
    text.replace(at_from, std::string(row.from).size(), row.to);
    const std::size_t at = text.find(row.at, at_from);
    if (at == std::string::npos) {
      ADD_FAILURE() << "not in the edited case: " << row.at;
      continue;
    }
    const std::size_t line_start = text.rfind('\n', at) + 1; // npos + 1 == 0
    const int line =
        1 + static_cast<int>(std::count(text.begin(), text.begin() + at, '\n'));
    const int column = 1 + static_cast<int>(at - line_start);
    try {
      load(text);
      ADD_FAILURE() << "accepted:\n" << text;
    } catch (const InputError& e) {
      EXPECT_EQ(e.file(), "case.yaml");
      EXPECT_EQ(e.line(), line) << e.what();
      EXPECT_EQ(e.column(), column) << e.what();
      EXPECT_EQ(e.field(), row.field) << e.what();
      EXPECT_EQ(e.value(), row.value) << e.what();
      EXPECT_NE(e.expected().find(row.expected), std::string::npos) << e.what();
      const std::string located = "case.yaml:" + std::to_string(line) + ":" +
                                  std::to_string(column) + ": " + row.field;
      EXPECT_EQ(std::string(e.what()).rfind(located, 0), 0u) << e.what();
    }
  }
}

// A tolerance or an error estimate is a temperature difference: "0.5 degC" is
// 0.5 K (not 273.65 K, the absolute temperature 0.5 degC); common practice.
TEST(CaseDomain, ATemperatureToleranceInDegCIsADifference) {
  std::string text = kCase;
  text.replace(text.find("tolerance: \"0.5 K\""), 18, "tolerance: \"0.5 degC\"");
  EXPECT_NEAR(load(text).time.tolerance, 0.5, 1e-12);
}

// A file without a YAML node (empty, blank, comments only, an empty document) is
// reported at its start, 1:1, not at 0:0.
TEST(CaseDomain, AnEmptyFileIsLocatedAtItsStart) {
  for (const std::string text :
       {"", "\n\n", "# a comment only\n", "---\n", "--- # x\n...\n", "  \n# x\n"}) {
    SCOPED_TRACE("\"" + text + "\"");
    try {
      load(text);
      ADD_FAILURE() << "accepted";
    } catch (const InputError& e) {
      EXPECT_EQ(e.line(), 1);
      EXPECT_EQ(e.column(), 1);
      EXPECT_EQ(e.file(), "case.yaml");
      EXPECT_EQ(std::string(e.what()).rfind("case.yaml:1:1: expected a case file", 0), 0u)
          << e.what();
      EXPECT_NE(e.expected().find("(the file is empty)"), std::string::npos) << e.what();
    }
  }
}

// A text that starts "#", NUL reads to yaml-cpp as UTF-16 (its encoding guess
// from the first bytes) and parses as no node at all: reported at 1:1, not at
// 0:0 (found by fuzz_case in the first CI run of the hardening tests).
TEST(CaseDomain, ATextReadAsAnotherEncodingIsLocatedAtItsStart) {
  const std::string text = std::string("#\0\0\x02", 4) + "\n" + kCase;
  try {
    load(text);
    ADD_FAILURE() << "accepted";
  } catch (const InputError& e) {
    EXPECT_EQ(e.line(), 1);
    EXPECT_EQ(e.column(), 1);
    EXPECT_EQ(std::string(e.what()).rfind("case.yaml:1:1: expected a case file", 0), 0u)
        << e.what();
  }
}

// A document marker followed by content is not an empty file.
TEST(CaseDomain, AMarkerWithContentIsNotAnEmptyFile) {
  try {
    load("--- [1, 2]\n");
    ADD_FAILURE() << "accepted";
  } catch (const InputError& e) {
    EXPECT_EQ(e.line(), 1);
    EXPECT_EQ(e.column(), 5);
    EXPECT_EQ(e.expected().find("(the file is empty)"), std::string::npos) << e.what();
    EXPECT_NE(e.expected().find("expected a case file"), std::string::npos) << e.what();
  }
}

} // namespace
