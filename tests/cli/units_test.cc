// SPDX-License-Identifier: Apache-2.0
// `--unit` of `table` and `export`: every conversion against factors computed by
// hand from the unit definitions (SI prefixes; degC = K - 273.15; degF = K 9/5 -
// 459.67, a degF interval 5/9 K (NIST SP 811, B.8); the thermochemical calorie,
// 4.184 J exactly (ISO 80000-5)), the headers, and each refusal (exit 2, the
// option, item, unit and expected dimension named, nothing written).
#include "cli/cli_support.h"

#include <gtest/gtest.h>

#include <cmath>
#include <filesystem>
#include <string>

namespace quantacal::test {
namespace {

namespace fs = std::filesystem;

bool contains(const std::string& text, const std::string& part) {
  return text.find(part) != std::string::npos;
}

/// |a - b| within 4 ulp-sized relative steps of b (the converted value is one
/// division and one subtraction away from the SI value: a numerical tolerance).
void expect_close(double a, double b, const std::string& what) {
  EXPECT_NEAR(a, b, 4e-16 * std::max(1.0, std::fabs(b))) << what;
}

const std::string copper = source_path("materials/copper.yaml");

/// The table of copper from 250 K to 400 K in 37.5 K steps with extra arguments.
RunResult copper_table(std::vector<std::string> extra) {
  std::vector<std::string> args = {"table", copper, "--from", "250",
                                   "--to",  "400",  "--step", "37.5"};
  args.insert(args.end(), extra.begin(), extra.end());
  return run_quantacal(args);
}

TEST(TableUnits, EachQuantityConvertedByItsHandComputedFactor) {
  const RunResult si = copper_table({});
  const RunResult r = copper_table({"--unit", "cp=J/g/K,T=degC,k=W/cm/K,H=kJ/kg"});
  ASSERT_EQ(si.exit_code, 0) << si.err;
  ASSERT_EQ(r.exit_code, 0) << r.err;
  EXPECT_EQ(lines_of(r.out)[0], "T_degC,cp_J_per_g_K,e_kJ_per_kg,k_W_per_cm_K");
  const auto a = csv_rows(si.out), b = csv_rows(r.out);
  ASSERT_EQ(a.size(), 5u);
  ASSERT_EQ(b.size(), a.size());
  for (std::size_t i = 0; i < a.size(); ++i) {
    expect_close(b[i][0], a[i][0] - 273.15, "T in degC");
    expect_close(b[i][1], a[i][1] / 1000.0, "1 J/g/K = 1000 J/kg/K");
    expect_close(b[i][2], a[i][2] / 1000.0, "1 kJ/kg = 1000 J/kg");
    expect_close(b[i][3], a[i][3] / 100.0, "1 W/cm/K = 100 W/m/K");
  }
  EXPECT_EQ(b[0][0], 250.0 - 273.15);
}

TEST(TableUnits, FahrenheitCaloriesAndPerDegreeCelsius) {
  const RunResult si = copper_table({});
  const RunResult f = copper_table({"--unit", "T=degF,cp=J/g/degF,e=cal/g,k=mW/m/K"});
  const RunResult c = copper_table({"--unit", "cp=J/g/degC"});
  const RunResult k = copper_table({"--unit", "cp=J/g/K"});
  const RunResult cal = copper_table({"--unit", "cp=cal/g/K,e=kcal/kg"});
  for (const RunResult* r : {&si, &f, &c, &k, &cal})
    ASSERT_EQ(r->exit_code, 0) << r->err;
  EXPECT_EQ(lines_of(f.out)[0], "T_degF,cp_J_per_g_degF,e_cal_per_g,k_mW_per_m_K");
  EXPECT_EQ(lines_of(cal.out)[0], "T_K,cp_cal_per_g_K,e_kcal_per_kg,k_W_per_m_K");
  const auto a = csv_rows(si.out), b = csv_rows(f.out), d = csv_rows(cal.out);
  for (std::size_t i = 0; i < a.size(); ++i) {
    // Fahrenheit: an absolute temperature, (T - 255.372...) 9/5 = T 9/5 - 459.67.
    EXPECT_NEAR(b[i][0], a[i][0] * 1.8 - 459.67, 1e-12) << "T in degF";
    // Per degF: 1 J/g/degF = 1000 J/kg per 5/9 K = 1800 J/kg/K (an interval).
    expect_close(b[i][1], a[i][1] / 1800.0, "J/g/degF");
    expect_close(b[i][2], a[i][2] / 4184.0, "1 cal/g = 4184 J/kg (thermochemical)");
    expect_close(b[i][3], a[i][3] * 1000.0, "1 W/m/K = 1000 mW/m/K");
    expect_close(d[i][1], a[i][1] / 4184.0, "1 cal/g/K = 4184 J/kg/K");
    expect_close(d[i][2], a[i][2] / 4184.0, "1 kcal/kg = 4184 J/kg");
  }
  // Per degC is per K: the same numbers; only the header differs.
  EXPECT_EQ(lines_of(c.out)[0], "T_K,cp_J_per_g_degC,e_J_per_kg,k_W_per_m_K");
  EXPECT_EQ(csv_rows(c.out), csv_rows(k.out));
}

TEST(TableUnits, MoleAndVolumeBasesTakeTheirOwnUnits) {
  const RunResult mole = copper_table({"--basis", "mole"});
  const RunResult mole_u =
      copper_table({"--basis", "mole", "--unit", "cp=mJ/mol/K,e=kJ/mol"});
  const RunResult volume = copper_table({"--basis", "volume"});
  const RunResult volume_u =
      copper_table({"--basis", "volume", "--unit", "cp=J/cm^3/K,e=MJ/m^3"});
  for (const RunResult* r : {&mole, &mole_u, &volume, &volume_u})
    ASSERT_EQ(r->exit_code, 0) << r->err;
  EXPECT_EQ(lines_of(mole_u.out)[0], "T_K,cp_mJ_per_mol_K,e_kJ_per_mol,k_W_per_m_K");
  EXPECT_EQ(lines_of(volume_u.out)[0], "T_K,cp_J_per_cm3_K,e_MJ_per_m3,k_W_per_m_K");
  const auto a = csv_rows(mole.out), b = csv_rows(mole_u.out);
  const auto c = csv_rows(volume.out), d = csv_rows(volume_u.out);
  for (std::size_t i = 0; i < a.size(); ++i) {
    expect_close(b[i][1], a[i][1] * 1000.0, "1 J/mol/K = 1000 mJ/mol/K");
    expect_close(b[i][2], a[i][2] / 1000.0, "1 kJ/mol = 1000 J/mol");
    expect_close(d[i][1], c[i][1] / 1e6, "1 J/cm^3/K = 1e6 J/m^3/K");
    expect_close(d[i][2], c[i][2] / 1e6, "1 MJ/m^3 = 1e6 J/m^3");
  }
}

TEST(TableUnits, DefaultUnitsWrittenOutLeaveTheOutputUnchanged) {
  const RunResult si = copper_table({});
  const RunResult same = copper_table({"--unit", "T=K,cp=J/(kg K),e=J/kg,k=W*m^-1*K^-1"});
  ASSERT_EQ(same.exit_code, 0) << same.err;
  EXPECT_EQ(same.out, si.out);
}

/// A refused table: exit 2, every part of @p parts in the message, nothing printed.
void expect_table_refused(const std::string& unit, const std::vector<std::string>& parts,
                          const std::vector<std::string>& extra = {}) {
  std::vector<std::string> args = {"--unit", unit};
  args.insert(args.end(), extra.begin(), extra.end());
  const RunResult r = copper_table(args);
  EXPECT_EQ(r.exit_code, 2) << unit;
  EXPECT_TRUE(r.out.empty()) << r.out;
  EXPECT_TRUE(
      contains(r.err, "quantacal table: error: option --unit = \"" + unit + "\": "))
      << r.err;
  for (const auto& part : parts)
    EXPECT_TRUE(contains(r.err, part)) << "expected \"" << part << "\" in: " << r.err;
}

TEST(TableUnitsErrors, EachMistakeIsNamedWithItsItem) {
  expect_table_refused(
      "T=degC,cp=J/g",
      {"item 2 (column 8) \"cp=J/g\": unit \"J/g\" is a specific energy (e.g. J/kg, "
       "kJ/kg), but cp is the specific heat per mass (--basis mass): expected a unit "
       "such as J/kg/K, J/g/K"});
  expect_table_refused("cp=J/mol/K", {"is a molar heat capacity",
                                      "(this unit fits cp with --basis mole)"});
  expect_table_refused("cp=J/kg/K", {"(this unit fits cp with --basis mass)"},
                       {"--basis", "mole"});
  expect_table_refused("T=W/m/K", {"item 1 (column 1) \"T=W/m/K\"",
                                   "is a thermal conductivity (e.g. W/m/K), but T is "
                                   "the temperature: expected a unit such as K, degC"});
  expect_table_refused("k=W/m", {"unit \"W/m\" is a quantity of dimension kg m s^-3",
                                 "k is the thermal conductivity"});
  expect_table_refused("Cp=J/g/K",
                       {"unknown quantity 'Cp' (did you mean 'cp'?); table prints T, "
                        "cp, e, k"});
  expect_table_refused("rho=g/cm^3",
                       {"unknown quantity 'rho'; table prints T, cp, e, k"});
  expect_table_refused("cp=J/gram/K",
                       {"unit \"J/gram/K\": unknown unit 'gram'", "docs/cards.md"});
  expect_table_refused("k=W/m/k", {"unknown unit 'k' (did you mean 'K'?)"});
  expect_table_refused("k=W m-1 K-1", {"unit \"W m-1 K-1\": unexpected '-'"});
  expect_table_refused("cp", {"item 1 (column 1) \"cp\": expected QUANTITY=UNIT"});
  expect_table_refused("cp=", {"no unit after '='"});
  expect_table_refused("T=degC,,cp=J/g/K", {"item 2 (column 8) \"\": empty item"});
  expect_table_refused("T=degC,", {"item 2 (column 8) \"\": empty item"});
  expect_table_refused("T=K,cp=J/g/K,T=degC",
                       {"item 3 (column 14) \"T=degC\": T was already given in item 1"});
  expect_table_refused("e=kJ/kg,H=J/kg", {"e was already given in item 1"});
  expect_table_refused("T=degC^1", {"write degC alone for a temperature"});
  expect_table_refused("", {"expected QUANTITY=UNIT items separated by commas"});
}

TEST(TableUnits, HelpDescribesTheOption) {
  const RunResult r = run_quantacal({"table", "--help"});
  ASSERT_EQ(r.exit_code, 0);
  EXPECT_TRUE(contains(r.out, "--unit Q=UNIT,...")) << r.out;
  EXPECT_TRUE(contains(r.out, "T_degC,cp_J_per_g_K,e_kJ_per_kg,k_W_per_cm_K")) << r.out;
  EXPECT_TRUE(contains(r.out, "thermochemical 4.184 J")) << r.out;
}

// ---- export --------------------------------------------------------------------------

struct Exported {
  RunResult run;
  std::string text;
};

Exported export_copper(const std::string& name, std::vector<std::string> extra) {
  TempDir dir;
  const std::string file = (dir.path() / name).string();
  std::vector<std::string> args = {"export", copper, "--to",    file,
                                   "--from", "250",  "--until", "400"};
  args.insert(args.end(), extra.begin(), extra.end());
  Exported e{run_quantacal(args), ""};
  if (fs::exists(file))
    e.text = read_file(file);
  return e;
}

/// The CSV rows of an export (comment lines dropped).
std::vector<std::vector<double>> export_rows(const std::string& text) {
  std::string body;
  for (const auto& line : lines_of(text))
    if (line.rfind("#", 0) != 0)
      body += line + "\n";
  return csv_rows(body);
}

std::string export_header(const std::string& text) {
  for (const auto& line : lines_of(text))
    if (line.rfind("#", 0) != 0)
      return line;
  return "";
}

TEST(ExportUnits, CsvColumnsConvertedAndGuaranteesUnchanged) {
  const Exported si = export_copper("si.csv", {});
  const Exported u =
      export_copper("u.csv", {"--unit", "T=degC,cp=J/g/K,H=kJ/kg,k=W/cm/K,rho=g/cm^3"});
  ASSERT_EQ(si.run.exit_code, 0) << si.run.err;
  ASSERT_EQ(u.run.exit_code, 0) << u.run.err;
  EXPECT_EQ(export_header(u.text),
            "T_degC,cp_J_per_g_K,H_kJ_per_kg,k_W_per_cm_K,rho_g_per_cm3");
  const auto a = export_rows(si.text), b = export_rows(u.text);
  ASSERT_GT(a.size(), 2u);
  ASSERT_EQ(b.size(), a.size()); // the same nodes: the tolerance is relative
  for (std::size_t i = 0; i < a.size(); ++i) {
    expect_close(b[i][0], a[i][0] - 273.15, "T in degC");
    expect_close(b[i][1], a[i][1] / 1000.0, "J/g/K");
    expect_close(b[i][2], a[i][2] / 1000.0, "H in kJ/kg");
    expect_close(b[i][3], a[i][3] / 100.0, "W/cm/K");
    expect_close(b[i][4], a[i][4] / 1000.0, "1 g/cm^3 = 1000 kg/m^3");
  }
  // H stays the trapezoid integral of c_p in the new units (J/g/K times K is kJ/kg).
  for (std::size_t i = 1; i < b.size(); ++i)
    EXPECT_NEAR(b[i][2] - b[i - 1][2],
                0.5 * (b[i][1] + b[i - 1][1]) * (b[i][0] - b[i - 1][0]),
                1e-9 * std::fabs(b[i][2]));
  // The tolerance and measured errors are the same statements; the H bound is in kJ/kg.
  for (const char* key : {"# tolerance: ", "# worst_found: "}) {
    std::string x, y;
    for (const auto& line : lines_of(si.text))
      if (line.rfind(key, 0) == 0)
        x = line;
    for (const auto& line : lines_of(u.text))
      if (line.rfind(key, 0) == 0)
        y = line;
    EXPECT_FALSE(x.empty());
    EXPECT_EQ(x, y);
  }
  EXPECT_TRUE(contains(si.text, "J/kg = ")) << si.text;
  EXPECT_TRUE(contains(u.text, "kJ/kg = ")) << u.text;
  EXPECT_FALSE(contains(u.text, "times the trapezoid sum")) << "consistent units";
}

TEST(ExportUnits, InconsistentUnitsStateTheFactorOfH) {
  // cp in J/kg/K with T in degF: H (J/kg) steps by 5/9 of the trapezoid sum.
  const Exported u = export_copper("f.csv", {"--unit", "T=degF"});
  ASSERT_EQ(u.run.exit_code, 0) << u.run.err;
  EXPECT_TRUE(contains(u.text, "H steps by 0.5555555555555556 times the trapezoid sum"))
      << u.text;
  const auto b = export_rows(u.text);
  for (std::size_t i = 1; i < b.size(); ++i)
    EXPECT_NEAR(b[i][2] - b[i - 1][2],
                5.0 / 9.0 * 0.5 * (b[i][1] + b[i - 1][1]) * (b[i][0] - b[i - 1][0]),
                1e-9 * std::fabs(b[i][2]));
}

TEST(ExportUnits, JsonAndMatmlNameTheUnits) {
  const Exported json =
      export_copper("u.json", {"--unit", "T=degC,density=g/cm^3,e=J/g,cp=J/g/degC"});
  ASSERT_EQ(json.run.exit_code, 0) << json.run.err;
  EXPECT_TRUE(contains(json.text, "\"units\": {\"T\": \"degC\", \"cp\": \"J/g/degC\", "
                                  "\"H\": \"J/g\", \"k\": \"W/m/K\", \"density\": "
                                  "\"g/cm^3\"}"))
      << json.text;
  const Exported xml = export_copper("u.xml", {"--unit", "T=degF,cp=kJ/kg/K"});
  ASSERT_EQ(xml.run.exit_code, 0) << xml.run.err;
  EXPECT_TRUE(
      contains(xml.text, "<Units name=\"degF\">\n        <Unit><Name>degF</Name>"))
      << xml.text;
  EXPECT_TRUE(contains(xml.text, "<Units name=\"kJ/kg/K\">\n        <Unit><Name>kJ</Name>"
                                 "</Unit>\n        <Unit power=\"-1\"><Name>kg</Name>"))
      << xml.text;
}

TEST(ExportUnits, RefusalsWriteNothing) {
  TempDir dir;
  const std::string file = dir.write("kept.csv", "old content\n");
  for (const auto& [unit, message] : std::vector<std::pair<std::string, std::string>>{
           {"rho=kg/m^2", "unit \"kg/m^2\" is a "
                          "quantity of dimension kg m^-2, but rho is the density: "
                          "expected a unit such as kg/m^3, g/cm^3"},
           {"H=J/kg/K", "unit \"J/kg/K\" is a specific heat capacity (e.g. J/kg/K), but "
                        "H is the stored energy per mass (--basis mass)"},
           {"Rho=g/cm^3", "unknown quantity 'Rho' (did you mean 'rho'?); export prints "
                          "T, cp, H, k, rho"},
           {"T=degc", "unknown unit 'degc' (did you mean 'degC'?)"}}) {
    const RunResult r = run_quantacal({"export", copper, "--to", file, "--unit", unit});
    EXPECT_EQ(r.exit_code, 2) << unit;
    EXPECT_TRUE(contains(r.err, "quantacal export: error: option --unit = \"" + unit +
                                    "\": item 1 (column 1) \"" + unit + "\": "))
        << r.err;
    EXPECT_TRUE(contains(r.err, message)) << r.err;
    EXPECT_TRUE(r.out.empty()) << r.out;
    EXPECT_EQ(read_file(file), "old content\n");
  }
  EXPECT_EQ(std::distance(fs::directory_iterator(dir.path()), fs::directory_iterator()),
            1);
}

TEST(ExportUnits, HelpDescribesTheOption) {
  const RunResult r = run_quantacal({"export", "--help"});
  ASSERT_EQ(r.exit_code, 0);
  EXPECT_TRUE(contains(r.out, "--unit Q=UNIT,...")) << r.out;
  EXPECT_TRUE(contains(r.out, "the guarantees hold unchanged")) << r.out;
}

} // namespace
} // namespace quantacal::test
