// SPDX-License-Identifier: Apache-2.0
// `quantacal table`: header, row temperatures, round-trip numbers, --exact, bases,
// errors.
#include "cli/cli_support.h"
#include "cli/test_cards.h"

#include <quantacal/cards/card.h>
#include <quantacal/common/exceptions.h>

#include <gtest/gtest.h>

#include <charconv>
#include <cmath>

namespace quantacal::test {
namespace {

const char* mass_header = "T_K,cp_J_per_kg_K,e_J_per_kg,k_W_per_m_K";

/// Shortest round-trip text of @p v, computed here independently of the library.
std::string shortest(double v) {
  char buffer[64];
  const auto r = std::to_chars(buffer, buffer + sizeof buffer, v);
  return std::string(buffer, r.ptr);
}

TEST(Table, HeaderAndRowsExactlyOnRequestedTemperatures) {
  const std::string card = debye_card_path();
  const RunResult r =
      run_quantacal({"table", card, "--from", "4", "--to", "300", "--step", "7"});
  ASSERT_EQ(r.exit_code, 0) << r.err;
  EXPECT_TRUE(r.err.empty()) << r.err;
  const auto lines = lines_of(r.out);
  ASSERT_FALSE(lines.empty());
  EXPECT_EQ(lines[0], mass_header); // header specified in the command's contract
  const auto rows = csv_rows(r.out);
  // 4, 11, ..., 298 (43 rows), then exactly 300: the step does not divide 296 K.
  ASSERT_EQ(rows.size(), 44u);
  for (std::size_t i = 0; i + 1 < rows.size(); ++i)
    EXPECT_EQ(rows[i][0], 4.0 + 7.0 * static_cast<double>(i));
  EXPECT_EQ(rows.back()[0], 300.0);
  for (const auto& row : rows)
    ASSERT_EQ(row.size(), 4u);
}

TEST(Table, NumbersReadBackToTheLibraryValues) {
  // Round-trip precision: every printed number parses to exactly the double the
  // library returns, and is the shortest text that does so (std::to_chars).
  const std::string card = debye_card_path();
  const RunResult r =
      run_quantacal({"table", card, "--from", "2.5", "--to", "290", "--step", "17.25"});
  ASSERT_EQ(r.exit_code, 0) << r.err;
  const MaterialPtr material = load_card(card);
  const auto lines = lines_of(r.out);
  const auto rows = csv_rows(r.out);
  ASSERT_GT(rows.size(), 10u);
  for (std::size_t i = 0; i < rows.size(); ++i) {
    const double t = rows[i][0];
    const ThermalState s = material->thermal(t, Basis::mass);
    EXPECT_EQ(rows[i][1], s.capacity) << "T = " << t;
    EXPECT_EQ(rows[i][2], s.energy) << "T = " << t;
    EXPECT_EQ(rows[i][3], material->conductivity(t).value) << "T = " << t;
    EXPECT_EQ(lines[i + 1], shortest(t) + "," + shortest(s.capacity) + "," +
                                shortest(s.energy) + "," +
                                shortest(material->conductivity(t).value));
  }
}

TEST(Table, DefaultsCoverTheValidRangeInOneKelvinSteps) {
  const std::string card = debye_card_path();
  const MaterialPtr material = load_card(card);
  const RunResult r = run_quantacal({"table", card});
  ASSERT_EQ(r.exit_code, 0) << r.err;
  const auto rows = csv_rows(r.out);
  ASSERT_GE(rows.size(), 2u);
  EXPECT_EQ(rows.front()[0], material->lower_temperature());
  EXPECT_EQ(rows.back()[0], material->upper_temperature());
  EXPECT_EQ(rows[1][0] - rows[0][0], 1.0);
  const double span = material->upper_temperature() - material->lower_temperature();
  EXPECT_EQ(rows.size(), static_cast<std::size_t>(std::ceil(span - 1e-9)) + 1);
}

TEST(Table, ExactAndTableAgree) {
  // The table's design tolerance on c_p is 1e-9 relative (the default
  // table_tolerance, docs/cards.md); allow 1e-8.
  const std::string card = debye_card_path();
  const std::vector<std::string> range = {"--from", "3", "--to", "295", "--step", "0.75"};
  std::vector<std::string> a = {"table", card}, b = {"table", card, "--exact"};
  a.insert(a.end(), range.begin(), range.end());
  b.insert(b.end(), range.begin(), range.end());
  const RunResult table = run_quantacal(a);
  const RunResult exact = run_quantacal(b);
  ASSERT_EQ(table.exit_code, 0) << table.err;
  ASSERT_EQ(exact.exit_code, 0) << exact.err;
  const auto t = csv_rows(table.out);
  const auto e = csv_rows(exact.out);
  ASSERT_EQ(t.size(), e.size());
  double worst = 0.0;
  for (std::size_t i = 0; i < t.size(); ++i) {
    ASSERT_EQ(t[i][0], e[i][0]);
    worst = std::max(worst, std::abs(t[i][1] - e[i][1]) / std::abs(e[i][1]));
    EXPECT_NEAR(t[i][2], e[i][2], 1e-8 * std::abs(e[i][2]) + 1e-12) << "T = " << t[i][0];
    EXPECT_EQ(t[i][3], e[i][3]); // a constant conductivity is not tabulated
  }
  EXPECT_LT(worst, 1e-8);
}

TEST(Table, BasesDifferByMolarMassAndDensity) {
  // mass = mole / M and volume = mole rho / M (definitions of the bases,
  // quantacal/material/material.h).
  const std::string card = debye_card_path();
  const MaterialPtr material = load_card(card);
  const double molar_mass = material->molar_mass();
  const double density = material->reference_density();
  const std::vector<std::string> range = {"--from", "5", "--to", "250", "--step", "5"};
  auto run = [&](const std::string& basis) {
    std::vector<std::string> args = {"table", card, "--basis", basis};
    args.insert(args.end(), range.begin(), range.end());
    return run_quantacal(args);
  };
  const RunResult mass = run("mass"), mole = run("mole"), volume = run("volume");
  ASSERT_EQ(mass.exit_code, 0) << mass.err;
  ASSERT_EQ(mole.exit_code, 0) << mole.err;
  ASSERT_EQ(volume.exit_code, 0) << volume.err;
  EXPECT_EQ(lines_of(mass.out)[0], mass_header);
  EXPECT_EQ(lines_of(mole.out)[0], "T_K,cp_J_per_mol_K,e_J_per_mol,k_W_per_m_K");
  EXPECT_EQ(lines_of(volume.out)[0], "T_K,cp_J_per_m3_K,e_J_per_m3,k_W_per_m_K");
  const auto m = csv_rows(mass.out), n = csv_rows(mole.out), v = csv_rows(volume.out);
  ASSERT_EQ(m.size(), n.size());
  ASSERT_EQ(m.size(), v.size());
  for (std::size_t i = 0; i < m.size(); ++i) {
    for (int col = 1; col <= 2; ++col) {
      EXPECT_NEAR(n[i][col], m[i][col] * molar_mass, 1e-13 * std::abs(n[i][col]));
      EXPECT_NEAR(v[i][col], m[i][col] * density, 1e-13 * std::abs(v[i][col]));
    }
    EXPECT_EQ(m[i][3], n[i][3]);
    EXPECT_EQ(m[i][3], v[i][3]);
  }
}

TEST(Table, ConstantCapacityCardGivesLinearEnergy) {
  // Illustrative card with c_p = 500 J/kg/K: e(T2) - e(T1) = c (T2 - T1) (calorimetry).
  TempDir dir;
  const std::string card =
      dir.write("const.yaml", constant_capacity_card("const", 500.0));
  const RunResult r =
      run_quantacal({"table", card, "--from", "20", "--to", "400", "--step", "20"});
  ASSERT_EQ(r.exit_code, 0) << r.err;
  const auto rows = csv_rows(r.out);
  ASSERT_EQ(rows.size(), 20u);
  for (const auto& row : rows) {
    EXPECT_NEAR(row[1], 500.0, 1e-9 * 500.0);
    EXPECT_NEAR(row[2] - rows[0][2], 500.0 * (row[0] - 20.0), 1e-9 * 500.0 * 400.0);
  }
}

TEST(Table, TemperaturesWithUnitsAndEqualsSyntax) {
  // 26.85 degC = 300 K (definition of the Celsius scale; 300.00000000000006 in binary
  // arithmetic, so compare to 1e-12); --step=50 is the same as --step 50.
  const RunResult r = run_quantacal(
      {"table", debye_card_path(), "--from", "26.85 degC", "--to=400K", "--step=50"});
  ASSERT_EQ(r.exit_code, 0) << r.err;
  const auto rows = csv_rows(r.out);
  ASSERT_EQ(rows.size(), 3u);
  EXPECT_NEAR(rows[0][0], 300.0, 1e-12);
  EXPECT_NEAR(rows[1][0], 350.0, 1e-12);
  EXPECT_EQ(rows[2][0], 400.0);
}

TEST(Table, SingleRowWhenFromEqualsTo) {
  const RunResult r =
      run_quantacal({"table", debye_card_path(), "--from", "77", "--to", "77"});
  ASSERT_EQ(r.exit_code, 0) << r.err;
  const auto rows = csv_rows(r.out);
  ASSERT_EQ(rows.size(), 1u);
  EXPECT_EQ(rows[0][0], 77.0);
}

TEST(Table, HelpDescribesTheCommand) {
  const RunResult r = run_quantacal({"table", "--help"});
  EXPECT_EQ(r.exit_code, 0);
  EXPECT_NE(r.out.find("usage: quantacal table CARD"), std::string::npos) << r.out;
  EXPECT_NE(r.out.find("exactly at\n--to"), std::string::npos) << r.out;
  EXPECT_NE(r.out.find("--basis"), std::string::npos);
  EXPECT_NE(r.out.find("exit codes"), std::string::npos);
}

// ---- error paths: exit code 2, a message naming what is wrong, nothing on stdout ----

void expect_usage_error(const RunResult& r, const std::string& fragment) {
  EXPECT_EQ(r.exit_code, 2) << r.err;
  EXPECT_TRUE(r.out.empty()) << r.out;
  EXPECT_NE(r.err.find("quantacal table: error: "), std::string::npos) << r.err;
  EXPECT_NE(r.err.find(fragment), std::string::npos) << r.err;
}

TEST(TableErrors, MissingCardFile) {
  TempDir dir;
  const std::string missing = (dir.path() / "no-such-card.yaml").string();
  expect_usage_error(run_quantacal({"table", missing}), "no-such-card.yaml");
}

TEST(TableErrors, UnknownOptionSuggestsTheRightOne) {
  expect_usage_error(run_quantacal({"table", debye_card_path(), "--frm", "5"}),
                     "unknown option '--frm' (did you mean '--from'?)");
}

TEST(TableErrors, FromBelowTheValidRange) {
  const MaterialPtr material = load_card(debye_card_path());
  const std::string below = shortest(material->lower_temperature() / 2);
  expect_usage_error(run_quantacal({"table", debye_card_path(), "--from", below}),
                     "but got " + below + " K");
  expect_usage_error(run_quantacal({"table", debye_card_path(), "--from", below}),
                     "valid range of card");
}

TEST(TableErrors, ToAboveTheValidRange) {
  const MaterialPtr material = load_card(debye_card_path());
  const std::string above = shortest(material->upper_temperature() + 1);
  expect_usage_error(run_quantacal({"table", debye_card_path(), "--to", above}),
                     "--to: " + material->name());
}

TEST(TableErrors, StepMustBePositive) {
  expect_usage_error(run_quantacal({"table", debye_card_path(), "--step", "0"}),
                     "option --step = \"0\": expected a temperature step > 0 K");
  expect_usage_error(run_quantacal({"table", debye_card_path(), "--step=-2"}),
                     "option --step = \"-2\"");
}

TEST(TableErrors, MalformedNumbersAndChoices) {
  expect_usage_error(run_quantacal({"table", debye_card_path(), "--from", "ten"}),
                     "option --from = \"ten\": expected a temperature");
  expect_usage_error(run_quantacal({"table", debye_card_path(), "--to", "300 kg"}),
                     "option --to = \"300 kg\"");
  expect_usage_error(run_quantacal({"table", debye_card_path(), "--basis", "weight"}),
                     "expected one of mass, mole, volume");
  expect_usage_error(run_quantacal({"table", debye_card_path(), "--step"}),
                     "option --step needs a value");
  expect_usage_error(run_quantacal({"table", debye_card_path(), "--exact=yes"}),
                     "option --exact takes no value");
}

TEST(TableErrors, FromAboveTo) {
  expect_usage_error(
      run_quantacal({"table", debye_card_path(), "--from", "200", "--to", "100"}),
      "is above --to");
}

TEST(TableErrors, WrongNumberOfCards) {
  expect_usage_error(run_quantacal({"table"}), "expected exactly one CARD but got 0");
  expect_usage_error(run_quantacal({"table", debye_card_path(), debye_card_path()}),
                     "expected exactly one CARD but got 2");
}

TEST(TableErrors, MalformedCardNamesFileAndLine) {
  TempDir dir;
  const std::string card = dir.write("broken.yaml", broken_unit_card());
  const RunResult r = run_quantacal({"table", card});
  expect_usage_error(r, "broken.yaml:");
}

TEST(CommandLine, UnknownCommandAndTopLevelHelp) {
  const RunResult unknown = run_quantacal({"tabel"});
  EXPECT_EQ(unknown.exit_code, 2);
  EXPECT_NE(unknown.err.find("unknown command 'tabel'"), std::string::npos)
      << unknown.err;
  const RunResult help = run_quantacal({"--help"});
  EXPECT_EQ(help.exit_code, 0);
  for (const char* command : {"table", "check", "equilibrium"})
    EXPECT_NE(help.out.find(std::string("  ") + command), std::string::npos) << help.out;
}

} // namespace
} // namespace quantacal::test
