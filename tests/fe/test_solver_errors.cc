// SPDX-License-Identifier: Apache-2.0
// Bad input to `quantacal run`: each a clear error (file:line:column: field =
// "value": expected ...), a non-zero exit code and no truncated output file.
#include <quantacal/common/exceptions.h>
#include <quantacal/solver/solver.h>

#include <gtest/gtest.h>

#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <regex>
#include <sstream>
#include <string>
#include <sys/wait.h>

namespace {

namespace fs = std::filesystem;
using namespace quantacal::solver;

const std::string source_dir = QUANTACAL_SOURCE_DIR;

fs::path scratch(const std::string& name) {
  const fs::path p = fs::path(QUANTACAL_BINARY_DIR) / "tests" / "fe" / "scratch" / name;
  fs::remove_all(p);
  fs::create_directories(p);
  return p;
}

// A valid case; `edit` replaces one block of lines.
std::string base_case(const std::string& mesh, const std::string& boundaries,
                      const std::string& folder) {
  std::ostringstream s;
  s << "name: error case\n"
       "geometry: axisymmetric\n"
    << mesh
    << "materials:\n"
       "  - id: 1\n"
       "    card: "
    << source_dir
    << "/materials/aluminium.yaml\n"
       "initial_temperature: \"500 degC\"\n"
    << boundaries
    << "time:\n"
       "  end: \"2 s\"\n"
       "  first_step: \"0.01 s\"\n"
       "output:\n"
       "  folder: "
    << folder
    << "\n"
       "  fields: false\n"
       "  plot: false\n"
       "  probes:\n"
       "    - {name: centre, point: [\"0 mm\", \"5 mm\"]}\n";
  return s.str();
}

const std::string cylinder_mesh = "mesh:\n"
                                  "  generator: cylinder\n"
                                  "  radius: \"5 mm\"\n"
                                  "  length: \"10 mm\"\n"
                                  "  cells: [2, 4]\n";
const std::string water = "boundaries:\n"
                          "  - id: 0\n"
                          "    convection: {ambient: \"30 degC\", h: \"2 kW/m^2/K\"}\n";

struct Outcome {
  int code = -1;
  std::string text;
};

Outcome run_cli(const fs::path& dir, const std::string& case_text) {
  const fs::path file = dir / "case.yaml";
  std::ofstream(file) << case_text;
  const fs::path log = dir / "log.txt";
  const std::string cmd = std::string("cd '") + dir.string() + "' && '" +
                          QUANTACAL_EXECUTABLE + "' run case.yaml > '" + log.string() +
                          "' 2>&1";
  const int status = std::system(cmd.c_str());
  Outcome o;
  o.code = WIFEXITED(status) ? WEXITSTATUS(status) : -1;
  std::ifstream in(log);
  std::stringstream ss;
  ss << in.rdbuf();
  o.text = ss.str();
  return o;
}

bool has_temporary_files(const fs::path& dir) {
  if (!fs::exists(dir))
    return false;
  for (const auto& e : fs::recursive_directory_iterator(dir))
    if (e.path().extension() == ".tmp")
      return true;
  return false;
}

TEST(SolverErrors, MissingMeshFileNamesTheField) {
  const fs::path dir = scratch("missing_mesh");
  const Outcome o =
      run_cli(dir, base_case("mesh:\n  file: no_such_mesh.msh\n", water, "out"));
  EXPECT_EQ(o.code, 2) << o.text;
  EXPECT_TRUE(std::regex_search(
      o.text,
      std::regex(
          R"(case\.yaml:4:9: mesh\.file = "no_such_mesh\.msh": expected an existing Gmsh)")))
      << o.text;
  EXPECT_FALSE(fs::exists(dir / "out" / "probes.csv"));
}

TEST(SolverErrors, BoundaryIdNotInTheMesh) {
  const fs::path dir = scratch("bad_boundary");
  const std::string bc = "boundaries:\n"
                         "  - id: 7\n"
                         "    convection: {ambient: \"30 degC\", h: \"2 kW/m^2/K\"}\n";
  const Outcome o = run_cli(dir, base_case(cylinder_mesh, bc, "out"));
  EXPECT_EQ(o.code, 2) << o.text;
  EXPECT_NE(o.text.find(
                "case.yaml:13:9: boundaries[0].id = \"7\": expected a boundary id of the "
                "mesh (the mesh has boundary ids: 0, 1, 2, 3)"),
            std::string::npos)
      << o.text;
  EXPECT_FALSE(fs::exists(dir / "out" / "probes.csv"));
}

TEST(SolverErrors, MaterialIdWithoutACard) {
  const fs::path dir = scratch("missing_card");
  const std::string mesh = cylinder_mesh + "  regions:\n"
                                           "    - {material_id: 2, lower: [\"0 mm\", \"0 "
                                           "mm\"], upper: [\"5 mm\", \"3 mm\"]}\n";
  const Outcome o = run_cli(dir, base_case(mesh, water, "out"));
  EXPECT_EQ(o.code, 2) << o.text;
  EXPECT_NE(
      o.text.find("materials = \"2\": expected a card for every material id of the mesh: "
                  "id 2 has none"),
      std::string::npos)
      << o.text;
}

TEST(SolverErrors, UnwritableOutputFolder) {
  const fs::path dir = scratch("unwritable");
  std::ofstream(dir / "a_file") << "not a folder\n";
  const Outcome o = run_cli(dir, base_case(cylinder_mesh, water, "a_file/out"));
  EXPECT_EQ(o.code, 2) << o.text;
  EXPECT_TRUE(std::regex_search(
      o.text,
      std::regex(
          R"(case\.yaml:\d+:\d+: output\.folder = "a_file/out": expected a folder that can be created and written)")))
      << o.text;
}

// A fixed temperature far above the card's valid range: every attempt fails in
// the material evaluation, the step is halved until time.max_rejections, and the
// run stops with exit code 3, keeping complete files of what it did.
TEST(SolverErrors, DivergingCaseStopsWithClearMessageAndCompleteFiles) {
  const fs::path dir = scratch("diverging");
  const std::string bc = "boundaries:\n"
                         "  - id: 0\n"
                         "    temperature: \"3000 K\"\n";
  const Outcome o = run_cli(dir, base_case(cylinder_mesh, bc, "out"));
  EXPECT_EQ(o.code, 3) << o.text;
  EXPECT_NE(o.text.find("consecutive rejected steps"), std::string::npos) << o.text;
  EXPECT_NE(o.text.find("aluminium"), std::string::npos) << o.text;
  ASSERT_TRUE(fs::exists(dir / "out" / "probes.csv"));
  ASSERT_TRUE(fs::exists(dir / "out" / "summary.yaml"));
  std::ifstream csv(dir / "out" / "probes.csv");
  std::string header, first;
  std::getline(csv, header);
  std::getline(csv, first);
  EXPECT_EQ(header, "time [s],centre [degC],centre dT/dt [K/s]");
  EXPECT_EQ(first.rfind("0,", 0), 0u);
  std::ifstream summary(dir / "out" / "summary.yaml");
  std::stringstream ss;
  ss << summary.rdbuf();
  EXPECT_NE(ss.str().find("status: stopped"), std::string::npos);
  EXPECT_FALSE(has_temporary_files(dir / "out"));
}

// In-process, the same failure is a NumericalError, and the partial result is
// available with throw_on_failure = false.
TEST(SolverErrors, DivergingCaseInProcess) {
  const fs::path dir = scratch("diverging_api");
  std::ofstream(dir / "case.yaml") << base_case(
      cylinder_mesh, "boundaries:\n  - id: 0\n    temperature: \"3000 K\"\n", "out");
  const CaseDescription c = load_case((dir / "case.yaml").string());
  RunOptions opt;
  opt.communicator = MPI_COMM_SELF;
  opt.write_output = false;
  EXPECT_THROW(run_case(c, opt), quantacal::NumericalError);
  opt.throw_on_failure = false;
  const RunResult r = run_case(c, opt);
  EXPECT_FALSE(r.completed);
  EXPECT_EQ(r.steps.n_steps, 0u);
  EXPECT_GE(r.steps.n_rejected, c.time.max_rejections);
}

// ---- values a user would try: each a located error, exit code 2, nothing written ----

/** True if @p dir does not exist or holds nothing. */
bool nothing_written(const fs::path& dir) {
  return !fs::exists(dir) || fs::is_empty(dir);
}

/** A cylinder case whose boundary 0 has @p condition (the lines after `- id: 0`). */
std::string case_with_condition(const std::string& condition) {
  return base_case(cylinder_mesh, "boundaries:\n  - id: 0\n" + condition, "out");
}

// A negative coefficient used to be accepted when given as a single value and run
// (heat pumped against the temperature difference); a table row was refused.
TEST(SolverErrors, NegativeHeatTransferCoefficientIsRejected) {
  const fs::path dir = scratch("negative_h");
  const Outcome o = run_cli(dir, case_with_condition("    convection: {ambient: \"30 "
                                                     "degC\", h: \"-2 kW/m^2/K\"}\n"));
  EXPECT_EQ(o.code, 2) << o.text;
  EXPECT_NE(o.text.find("case.yaml:14:41: boundaries[0].convection.h = \"-2 kW/m^2/K\": "
                        "expected a heat-transfer coefficient >= 0 W/m^2/K"),
            std::string::npos)
      << o.text;
  EXPECT_TRUE(nothing_written(dir / "out"));
}

TEST(SolverErrors, NegativeCoefficientInABoilingTableIsRejected) {
  const fs::path dir = scratch("negative_h_table");
  const Outcome o = run_cli(
      dir, case_with_condition("    convection:\n"
                               "      ambient: \"30 degC\"\n"
                               "      h: [[\"40 degC\", \"1 kW/m^2/K\"], [\"100 degC\", "
                               "\"-3 kW/m^2/K\"], [\"130 degC\", \"12 kW/m^2/K\"]]\n"));
  EXPECT_EQ(o.code, 2) << o.text;
  EXPECT_NE(o.text.find("case.yaml:16:51: boundaries[0].convection.h[1][1] = \"-3 "
                        "kW/m^2/K\": expected a heat-transfer coefficient"),
            std::string::npos)
      << o.text;
  EXPECT_NE(o.text.find(">= 0"), std::string::npos) << o.text;
  EXPECT_TRUE(nothing_written(dir / "out"));
}

TEST(SolverErrors, NotANumberOrInfiniteCoefficientIsRejected) {
  struct Bad {
    const char* name;
    std::string condition;
    std::string located; // file:line:column: field = "value"
  };
  const Bad cases[] = {
      {"nan_h", "    convection: {ambient: \"30 degC\", h: \"nan W/m^2/K\"}\n",
       "case.yaml:14:41: boundaries[0].convection.h = \"nan W/m^2/K\": expected a "
       "heat-transfer coefficient"},
      {"inf_h", "    convection: {ambient: \"30 degC\", h: \"inf W/m^2/K\"}\n",
       "case.yaml:14:41: boundaries[0].convection.h = \"inf W/m^2/K\": expected a "
       "heat-transfer coefficient"},
      {"nan_h_table",
       "    convection: {ambient: \"30 degC\", h: [[\"40 degC\", \"1 kW/m^2/K\"], "
       "[\"100 degC\", \"NaN kW/m^2/K\"]]}\n",
       "boundaries[0].convection.h[1][1] = \"NaN kW/m^2/K\": expected a heat-transfer "
       "coefficient"},
  };
  for (const Bad& b : cases) {
    SCOPED_TRACE(b.name);
    const fs::path dir = scratch(b.name);
    const Outcome o = run_cli(dir, case_with_condition(b.condition));
    EXPECT_EQ(o.code, 2) << o.text;
    EXPECT_NE(o.text.find(b.located), std::string::npos) << o.text;
    EXPECT_NE(o.text.find("NaN and infinity are not allowed"), std::string::npos)
        << o.text;
    EXPECT_TRUE(nothing_written(dir / "out"));
  }
}

TEST(SolverErrors, EmissivityOutsideZeroToOneIsRejected) {
  for (const std::string e : {"0", "1.5", "-0.2", "nan"}) {
    SCOPED_TRACE(e);
    const fs::path dir = scratch("emissivity_" + e);
    const Outcome o =
        run_cli(dir, case_with_condition("    radiation: {emissivity: " + e +
                                         ", ambient: \"30 degC\"}\n"));
    EXPECT_EQ(o.code, 2) << o.text;
    EXPECT_NE(o.text.find("case.yaml:14:29: boundaries[0].radiation.emissivity = \"" + e +
                          "\": expected an emissivity in (0, 1]"),
              std::string::npos)
        << o.text;
    EXPECT_TRUE(nothing_written(dir / "out"));
  }
}

// A Gmsh mesh whose physical tags are not those the case names: the sphere
// quadrant (examples/meshes) has boundary ids 1, 2, 3 and material id 1.
std::string gmsh_case(const std::string& material_id, const std::string& boundary_id) {
  return "name: tag mismatch\n"
         "geometry: axisymmetric\n"
         "mesh:\n"
         "  file: " +
         source_dir +
         "/examples/meshes/sphere_quadrant.msh\n"
         "materials:\n"
         "  - id: " +
         material_id + "\n    card: " + source_dir +
         "/materials/aluminium.yaml\n"
         "initial_temperature: \"500 degC\"\n"
         "boundaries:\n"
         "  - id: " +
         boundary_id +
         "\n"
         "    convection: {ambient: \"30 degC\", h: \"2 kW/m^2/K\"}\n"
         "time:\n"
         "  end: \"2 s\"\n"
         "  first_step: \"0.01 s\"\n"
         "output:\n"
         "  folder: out\n"
         "  fields: false\n"
         "  plot: false\n";
}

TEST(SolverErrors, GmshBoundaryTagNotInTheMesh) {
  const fs::path dir = scratch("gmsh_boundary_tag");
  const Outcome o = run_cli(dir, gmsh_case("1", "0")); // the generators' id 0
  EXPECT_EQ(o.code, 2) << o.text;
  EXPECT_NE(o.text.find("case.yaml:10:9: boundaries[0].id = \"0\": expected a boundary "
                        "id of the mesh (the mesh has boundary ids: 1, 2, 3)"),
            std::string::npos)
      << o.text;
  EXPECT_TRUE(nothing_written(dir / "out"));
}

TEST(SolverErrors, GmshMaterialTagWithoutACard) {
  const fs::path dir = scratch("gmsh_material_tag");
  const Outcome o = run_cli(dir, gmsh_case("2", "1"));
  EXPECT_EQ(o.code, 2) << o.text;
  EXPECT_NE(o.text.find("case.yaml:7:11: materials = \"1\": expected a card for every "
                        "material id of the mesh: id 1 has none (mesh material ids: 1; "
                        "cards given for: 2)"),
            std::string::npos)
      << o.text;
  EXPECT_TRUE(nothing_written(dir / "out"));
}

TEST(CaseFile, MisspeltKeyGetsDidYouMean) {
  try {
    load_case_from_string(
        "name: x\ngeometry: planar\nmesh: {generator: plate, size: [\"1 m\", \"1 m\"]}\n"
        "materials: [{id: 1, card: c.yaml}]\ninitial_temperature: \"300 K\"\n"
        "time: {end: \"1 s\", frist_step: \"0.1 s\"}\noutput: {folder: o}\n",
        "t.yaml", ".", false);
    FAIL() << "no error";
  } catch (const quantacal::CardError& e) {
    EXPECT_EQ(e.field(), "time.frist_step");
    EXPECT_EQ(e.line(), 6);
    EXPECT_NE(std::string(e.what()).find("did you mean 'first_step'?"), std::string::npos)
        << e.what();
  }
}

// The whole message, in the shape docs/cases.md shows: the key is the value.
TEST(CaseFile, UnknownKeyMessageNamesTheKeyAndTheChoices) {
  try {
    load_case_from_string(
        "name: x\ngeometry: planar\nmesh: {generator: plate, size: [\"1 m\", \"1 m\"]}\n"
        "materials: [{id: 1, card: c.yaml}]\ninitial_temperature: \"300 K\"\n"
        "time: {end: \"1 s\", frist_step: \"0.1 s\"}\noutput: {folder: o}\n",
        "t.yaml", ".", false);
    FAIL() << "no error";
  } catch (const quantacal::InputError& e) {
    EXPECT_EQ(e.value(), "frist_step");
    EXPECT_EQ(std::string(e.what()),
              "t.yaml:6:20: time.frist_step = \"frist_step\": unknown key (did you mean "
              "'first_step'?); expected one of: end, first_step, tolerance, min_step, "
              "max_step, max_rejections, max_steps, adaptive");
  }
}

// Broken YAML is reported where the parser stopped, in the cards' wording (one
// reader for cards and case files).
TEST(CaseFile, YamlSyntaxErrorIsLocated) {
  try {
    load_case_from_string(
        "name: x\ngeometry: planar\nmesh: {generator: plate, size: [\"1 m\"\n", "t.yaml",
        ".", false);
    FAIL() << "no error";
  } catch (const quantacal::InputError& e) {
    EXPECT_EQ(e.file(), "t.yaml");
    EXPECT_GE(e.line(), 3);
    EXPECT_GT(e.column(), 0);
    EXPECT_NE(e.expected().find("YAML syntax error"), std::string::npos) << e.what();
  }
}

// A key given twice is an error at the second one (YAML alone would keep the first
// and drop the second without a word).
TEST(CaseFile, RepeatedKeyIsRejectedWithItsLocation) {
  try {
    load_case_from_string(
        "name: x\ngeometry: planar\nmesh: {generator: plate, size: [\"1 m\", \"1 m\"]}\n"
        "materials: [{id: 1, card: c.yaml}]\ninitial_temperature: \"300 K\"\n"
        "time:\n  end: \"1 s\"\n  first_step: \"0.1 s\"\n  end: \"2 s\"\n"
        "output: {folder: o}\n",
        "t.yaml", ".", false);
    FAIL() << "no error";
  } catch (const quantacal::InputError& e) {
    EXPECT_EQ(e.field(), "time.end");
    EXPECT_EQ(e.line(), 9);
    EXPECT_EQ(e.column(), 3);
    EXPECT_EQ(e.expected(), "duplicate key");
  }
}

TEST(CaseFile, WrongUnitIsRejectedWithItsLocation) {
  try {
    load_case_from_string(
        "name: x\ngeometry: planar\nmesh: {generator: plate, size: [\"1 m\", \"1 m\"]}\n"
        "materials: [{id: 1, card: c.yaml}]\ninitial_temperature: \"300 W\"\n"
        "time: {end: \"1 s\", first_step: \"0.1 s\"}\noutput: {folder: o}\n",
        "t.yaml", ".", false);
    FAIL() << "no error";
  } catch (const quantacal::CardError& e) {
    EXPECT_EQ(e.field(), "initial_temperature");
    EXPECT_EQ(e.line(), 5);
    EXPECT_EQ(e.column(), 22);
    EXPECT_EQ(e.value(), "300 W");
  }
}

TEST(CaseFile, BoilingCurveTableIsMonotoneCubic) {
  // Fritsch and Carlson (1980): the interpolant passes through the points and
  // stays within the range of neighbouring points (no overshoot).
  Curve c{{300, 400, 430, 500}, {1500, 20000, 8000, 600}};
  EXPECT_DOUBLE_EQ(c.value(400), 20000);
  EXPECT_DOUBLE_EQ(c.value(250), 1500);
  EXPECT_DOUBLE_EQ(c.value(600), 600);
  for (double t = 300; t <= 500; t += 0.5) {
    EXPECT_LE(c.value(t), 20000 + 1e-9);
    EXPECT_GE(c.value(t), 600 - 1e-9);
    const double fd = (c.value(t + 1e-4) - c.value(t - 1e-4)) / 2e-4;
    if (t > 300 && t < 500 && std::abs(t - 400) > 1e-3 && std::abs(t - 430) > 1e-3) {
      EXPECT_NEAR(c.derivative(t), fd, 1e-3 * (std::abs(fd) + 1)) << t;
    }
  }
}

} // namespace
