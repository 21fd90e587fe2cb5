// SPDX-License-Identifier: Apache-2.0
// Bad quenchant input to `quantacal run`: an unknown name (with "did you mean"
// and the list of names), h and a quenchant together, a quenchant file with
// non-increasing temperatures, a negative or NaN h, a name that is not the
// file's stem, a missing file, a bad agitation factor. Each is a located error
// (file:line:column: field = "value": expected ...; in the quenchant file for
// its own entries), exit code 2, and nothing written. And a checkpoint records
// the quenchant's curve: resuming after the quenchant file changed is a located
// error, resuming with it unchanged is not.
#include "cli/cli_support.h"

#include <quantacal/common/exceptions.h>
#include <quantacal/solver/solver.h>

#include <gtest/gtest.h>

#include <mpi.h>

#include <cstdlib>
#include <filesystem>
#include <string>
#include <sys/wait.h>

namespace {

namespace fs = std::filesystem;
namespace qs = quantacal::solver;
using quantacal::test::read_file;
using quantacal::test::shell_quote;
using quantacal::test::source_path;
using quantacal::test::TempDir;

/** "line:column" (1-based) of the first @p needle in @p text. */
std::string location_of(const std::string& text, const std::string& needle) {
  const std::size_t at = text.find(needle);
  if (at == std::string::npos)
    return "(not found: " + needle + ")";
  const std::size_t line_start = text.rfind('\n', at);
  const std::size_t column = line_start == std::string::npos ? at + 1 : at - line_start;
  std::size_t line = 1;
  for (std::size_t i = 0; i < at; ++i)
    line += text[i] == '\n';
  return std::to_string(line) + ":" + std::to_string(column);
}

/** A case whose mantle (boundary 0) has the convection block @p convection. */
std::string case_with(const std::string& convection) {
  return "name: quenchant error case\n"
         "geometry: axisymmetric\n"
         "mesh: {generator: cylinder, radius: \"5 mm\", length: \"10 mm\", cells: [2, "
         "4]}\n"
         "materials:\n"
         "  - {id: 1, card: \"" +
         source_path("materials/aluminium.yaml") +
         "\"}\n"
         "initial_temperature: \"500 degC\"\n"
         "boundaries:\n"
         "  - id: 0\n"
         "    convection: " +
         convection +
         "\n"
         "time: {end: \"1 s\", first_step: \"0.01 s\"}\n"
         "output: {folder: out, fields: false, plot: false}\n";
}

/** A valid quenchant file named @p name (rows at 30, 100, 200 and 600 degC). */
std::string quenchant_text(const std::string& name) {
  return "name: " + name +
         "\n"
         "description: a test curve (illustrative)\n"
         "status: illustrative\n"
         "bath_temperature: \"30 degC\"\n"
         "agitation: none\n"
         "probe: none\n"
         "source:\n"
         "  cite: [\"illustrative test data of the quantacal tests, no publication\"]\n"
         "  obtained: illustrative round figures\n"
         "curve:\n"
         "  - [\"30 degC\", \"1 kW/m^2/K\"]\n"
         "  - [\"100 degC\", \"4 kW/m^2/K\"]\n"
         "  - [\"200 degC\", \"15 kW/m^2/K\"]\n"
         "  - [\"600 degC\", \"2 kW/m^2/K\"]\n";
}

/** @p text with its first @p from replaced by @p to. */
std::string replaced(std::string text, const std::string& from, const std::string& to) {
  const std::size_t at = text.find(from);
  if (at != std::string::npos)
    text.replace(at, from.size(), to);
  return text;
}

struct Outcome {
  int code = -1;
  std::string err;
};

/** `quantacal run case.yaml` inside @p dir. */
Outcome run_in(const TempDir& dir) {
  const std::string command = "cd " + shell_quote(dir.path().string()) + " && " +
                              shell_quote(QUANTACAL_EXECUTABLE) +
                              " run case.yaml --quiet >/dev/null 2>err.txt </dev/null";
  const int status = std::system(command.c_str());
  Outcome o;
  o.code = WIFEXITED(status) ? WEXITSTATUS(status) : -1;
  o.err = read_file(dir.path() / "err.txt");
  return o;
}

/** Runs the case, expects exit code 2, @p message in stderr and no output. */
void expect_located_error(const TempDir& dir, const std::string& message) {
  const Outcome o = run_in(dir);
  EXPECT_EQ(o.code, 2) << o.err;
  EXPECT_NE(o.err.find(message), std::string::npos)
      << "expected: " << message << "\ngot: " << o.err;
  const fs::path out = dir.path() / "out";
  EXPECT_TRUE(!fs::exists(out) || fs::is_empty(out)) << "something was written";
}

TEST(QuenchantErrors, UnknownNameSuggestsTheNearestAndListsTheNames) {
  TempDir dir;
  const std::string text = case_with("{quenchant: watr_30C}");
  dir.write("case.yaml", text);
  expect_located_error(
      dir, "case.yaml:" + location_of(text, "watr_30C") +
               ": boundaries[0].convection.quenchant = \"watr_30C\": expected the name "
               "of a quenchant (did you mean 'water_30C'?); available: "
               "aqueous_polymer_30C, mineral_oil_60C, water_30C, water_60C, water_80C");
}

TEST(QuenchantErrors, HAndAQuenchantTogether) {
  TempDir dir;
  const std::string text =
      case_with("{quenchant: water_30C, h: \"2 kW/m^2/K\", ambient: \"30 degC\"}");
  dir.write("case.yaml", text);
  expect_located_error(dir, "case.yaml:" + location_of(text, "water_30C") +
                                ": boundaries[0].convection.quenchant = \"water_30C\": "
                                "expected either h or a quenchant, not both");
}

TEST(QuenchantErrors, QuenchantAndQuenchantFileTogether) {
  TempDir dir;
  dir.write("mine.yaml", quenchant_text("mine"));
  const std::string text = case_with("{quenchant: water_30C, quenchant_file: mine.yaml}");
  dir.write("case.yaml", text);
  expect_located_error(dir, "case.yaml:" + location_of(text, "mine.yaml") +
                                ": boundaries[0].convection.quenchant_file = "
                                "\"mine.yaml\": expected either quenchant (a name) or "
                                "quenchant_file (a path), not both");
}

/** A case naming the quenchant file mine.yaml whose text is @p quenchant. */
void expect_file_error(const std::string& quenchant, const std::string& needle,
                       const std::string& field_and_value, const std::string& expected) {
  TempDir dir;
  dir.write("mine.yaml", quenchant);
  const std::string text = case_with("{quenchant_file: mine.yaml}");
  dir.write("case.yaml", text);
  expect_located_error(
      dir, "mine.yaml:" + location_of(quenchant, needle) + ": " + field_and_value +
               ": expected " + expected +
               " (in the quenchant of case.yaml:" + location_of(text, "mine.yaml") + ")");
}

TEST(QuenchantErrors, NonIncreasingTemperaturesPointIntoTheQuenchantFile) {
  expect_file_error(replaced(quenchant_text("mine"), "\"200 degC\"", "\"90 degC\""),
                    "\"90 degC\"", "curve[2][0] = \"90 degC\"",
                    "values increasing down the table");
}

TEST(QuenchantErrors, NegativeHPointsIntoTheQuenchantFile) {
  expect_file_error(replaced(quenchant_text("mine"), "\"4 kW", "\"-4 kW"), "\"-4 kW",
                    "curve[1][1] = \"-4 kW/m^2/K\"",
                    "a heat-transfer coefficient (e.g. \"5 kW/m^2/K\") >= 0");
}

TEST(QuenchantErrors, NanHPointsIntoTheQuenchantFile) {
  expect_file_error(replaced(quenchant_text("mine"), "\"4 kW", "\"nan kW"), "\"nan kW",
                    "curve[1][1] = \"nan kW/m^2/K\"",
                    "a heat-transfer coefficient (e.g. \"5 kW/m^2/K\") (\"nan "
                    "kW/m^2/K\": NaN and infinity are not allowed)");
}

TEST(QuenchantErrors, ANameThatIsNotTheFileStem) {
  expect_file_error(quenchant_text("water_30C"), "water_30C", "name = \"water_30C\"",
                    "the file's stem \"mine\" (cases name a quenchant by its file)");
}

TEST(QuenchantErrors, MissingQuenchantFile) {
  TempDir dir;
  const std::string text = case_with("{quenchant_file: no_such_curve.yaml}");
  dir.write("case.yaml", text);
  expect_located_error(dir, "case.yaml:" + location_of(text, "no_such_curve.yaml") +
                                ": boundaries[0].convection.quenchant_file = "
                                "\"no_such_curve.yaml\": expected an existing quenchant "
                                "file (not found: no_such_curve.yaml)");
}

TEST(QuenchantErrors, AgitationOutOfRangeOrWithoutAQuenchant) {
  {
    TempDir dir;
    const std::string text = case_with("{quenchant: water_30C, agitation: 0}");
    dir.write("case.yaml", text);
    expect_located_error(dir, "case.yaml:" + location_of(text, "0}") +
                                  ": boundaries[0].convection.agitation = \"0\": "
                                  "expected an agitation factor multiplying h, > 0 and "
                                  "<= 10");
  }
  {
    TempDir dir;
    const std::string text =
        case_with("{h: \"2 kW/m^2/K\", ambient: \"30 degC\", agitation: 1.5}");
    dir.write("case.yaml", text);
    expect_located_error(dir, "case.yaml:" + location_of(text, "1.5}") +
                                  ": boundaries[0].convection.agitation = \"1.5\": "
                                  "expected agitation only with a quenchant");
  }
}

// ---- checkpoints record the quenchant's curve ------------------------------------

/** A 1 s quench through the quenchant file q.yaml, a checkpoint every 0.25 s. */
std::string checkpointed_case(const std::string& folder) {
  return replaced(
      replaced(case_with("{quenchant_file: q.yaml}"), "output: {folder: out",
               "output: {folder: \"" + folder + "\", checkpoint_interval: \"0.25 s\""),
      "time: {end: \"1 s\"", "time: {end: \"1 s\", tolerance: \"0.5 K\"");
}

TEST(QuenchantCheckpoint, AnEditedQuenchantFileIsALocatedErrorOnResume) {
  for (const bool edited : {true, false}) {
    TempDir dir;
    dir.write("q.yaml", quenchant_text("q"));
    const qs::CaseDescription d =
        qs::load_case_from_string(checkpointed_case((dir.path() / "out").string()),
                                  "case.yaml", dir.path().string());
    qs::RunOptions options;
    options.communicator = MPI_COMM_SELF;
    options.log = nullptr;
    options.progress = false;
    struct Crash {};
    int checkpoints = 0;
    options.on_checkpoint = [&checkpoints](const std::string& point) {
      checkpoints += point == "committed";
    };
    options.on_step = [&checkpoints](double, double) {
      if (checkpoints == 1)
        throw Crash{};
    };
    EXPECT_THROW(qs::run_case(d, options), Crash);
    if (edited) // one row of the curve changes: 15 -> 16 kW/m^2/K
      dir.write("q.yaml", replaced(quenchant_text("q"), "\"15 kW", "\"16 kW"));
    const qs::CaseDescription again =
        qs::load_case_from_string(checkpointed_case((dir.path() / "out").string()),
                                  "case.yaml", dir.path().string());
    options.on_step = nullptr;
    options.resume = true;
    if (!edited) {
      EXPECT_TRUE(qs::run_case(again, options).completed);
      continue;
    }
    try {
      qs::run_case(again, options);
      ADD_FAILURE() << "resumed with an edited quenchant file";
    } catch (const quantacal::InputError& e) {
      const std::string message = e.what();
      EXPECT_NE(message.find("boundaries[0].id = \"0\": expected the same boundary "
                             "condition as when the checkpoint was written"),
                std::string::npos)
          << message;
    }
  }
}

} // namespace
