// SPDX-License-Identifier: Apache-2.0
// `quantacal table --band` on a card written by `quantacal fit`, and the
// Wiedemann-Franz warning of `quantacal check` for the metal conductivity model.
#include "cli/cli_support.h"
#include <quantacal/fit/fit.h>

#include <quantacal/cards/card.h>
#include <quantacal/common/exceptions.h>

#include <gtest/gtest.h>

#include <cmath>
#include <random>
#include <sstream>

using namespace quantacal;
using test::run_quantacal;
using test::TempDir;

namespace {

const std::string source_dir = QUANTACAL_SOURCE_DIR;
const std::string start_card = source_dir + "/tests/fit/data/copper_start.yaml";

// Synthetic per-mole c_p of the start card itself, 2 % seeded noise, 8 K to 40 K
// where the electronic term gamma T matters (illustrative data made here).
std::string synthetic_csv() {
  const MaterialPtr s = load_card(start_card);
  std::mt19937 random(7u);
  std::normal_distribution<double> gauss(0.0, 1.0);
  std::string csv = "T_K,cp_J_per_mol_K,sigma\n";
  for (int i = 0; i < 20; ++i) {
    const double t = 8.0 + 32.0 * i / 19.0;
    const double c = s->model().evaluate(t).capacity;
    csv += format_double(t) + "," + format_double(c * (1 + 0.02 * gauss(random))) + "," +
           format_double(0.02 * c) + "\n";
  }
  return csv;
}

std::vector<std::vector<double>> parse_rows(const std::string& csv, std::string& header) {
  std::istringstream in(csv);
  std::getline(in, header);
  std::vector<std::vector<double>> rows;
  for (std::string line; std::getline(in, line);) {
    std::vector<double> row;
    std::istringstream cells(line);
    for (std::string cell; std::getline(cells, cell, ',');)
      row.push_back(std::stod(cell));
    rows.push_back(row);
  }
  return rows;
}

} // namespace

TEST(TableBand, SigmaOfALinearParameterIsTTimesItsStandardError) {
  TempDir dir;
  const std::string data = dir.write("cp.csv", synthetic_csv());
  const std::string fitted = (dir.path() / "fitted.yaml").string();
  const auto f = run_quantacal({"fit", data, "--card", start_card, "--free", "gamma",
                                "--weights", "absolute", "-o", fitted});
  ASSERT_EQ(f.exit_code, 0) << f.err;

  const auto r = run_quantacal({"table", fitted, "--band", "--basis", "mole", "--from",
                                "10", "--to", "50", "--step", "20"});
  ASSERT_EQ(r.exit_code, 0) << r.err;
  std::string header;
  const auto rows = parse_rows(r.out, header);
  EXPECT_EQ(header,
            "T_K,cp_J_per_mol_K,cp_sigma_J_per_mol_K,e_J_per_mol,e_sigma_J_per_mol,"
            "k_W_per_m_K,k_sigma_W_per_m_K");
  ASSERT_EQ(rows.size(), 3u);

  const MaterialPtr material = load_card(fitted);
  ASSERT_TRUE(material->data().fit);
  const FitRecord& record = *material->data().fit;
  ASSERT_EQ(record.parameters.size(), 1u);
  const double sigma_gamma = std::sqrt(record.covariance[0][0]);
  ASSERT_GT(sigma_gamma, 0.0);
  for (const auto& row : rows) {
    ASSERT_EQ(row.size(), 7u);
    const double t = row[0];
    // C = ... + gamma T and U = ... + gamma T^2/2 (Sommerfeld term, Kittel, Introduction
    // to Solid State Physics), so linear propagation gives sigma_C = T sigma_gamma and
    // sigma_U = T^2/2 sigma_gamma; the dilation term couples gamma weakly below 50 K
    // (A T C_v < 1e-3), hence 1 % (a model limit, not a numerical one).
    EXPECT_NEAR(row[2], t * sigma_gamma, 1e-2 * t * sigma_gamma) << "T = " << t;
    EXPECT_NEAR(row[4], 0.5 * t * t * sigma_gamma, 1e-2 * 0.5 * t * t * sigma_gamma);
    // the values themselves are the card's exact model
    EXPECT_NEAR(row[1], material->thermal_exact(t, Basis::mole).capacity, 1e-9 * row[1]);
    EXPECT_DOUBLE_EQ(row[6], 0.0); // no conductivity parameter was fitted
  }
}

TEST(TableBand, CardWithoutFitRecordIsAnError) {
  const auto r =
      run_quantacal({"table", source_dir + "/materials/copper.yaml", "--band"});
  EXPECT_EQ(r.exit_code, 2);
  EXPECT_NE(r.err.find("fit"), std::string::npos) << r.err;
  EXPECT_TRUE(r.out.empty()) << "nothing is printed when the band cannot be computed";
}

TEST(CheckWarning, MetalConductivityWithoutMeasurementsInTheIntermediateBand) {
  TempDir dir;
  // Illustrative card: copper's heat capacity with the metal conductivity model and
  // no conductivity measurements.
  const std::string card = dir.write("metal.yaml", R"(name: copper, metal model only
description: illustrative test card
composition:
  - {card: )" + source_dir + R"(/materials/copper.yaml, mole_fraction: 1}
reference_density: "8935 kg/m^3"
valid_range: {from: "4 K", to: "300 K"}
conductivity:
  kind: metal
  rrr: 100
  theta_R: "343 K"
  reference_resistivity: "1.68e-8 Ohm m"
  reference_temperature: "293 K"
sources:
  - {for: composition, cite: "illustrative"}
  - {for: reference_density, cite: "illustrative"}
  - {for: conductivity, cite: "illustrative"}
)");
  const auto r = run_quantacal({"check", card, "--quiet"});
  EXPECT_EQ(r.exit_code, 0) << r.err;
  // theta_R/20 to theta_R/2 is the band of inelastic scattering where the law is off
  // (Ziman, Electrons and Phonons, from memory); 343/20 = 17.15 K, 343/2 = 171.5 K.
  EXPECT_NE(r.err.find("warning"), std::string::npos) << r.err;
  EXPECT_NE(r.err.find("Wiedemann-Franz"), std::string::npos) << r.err;
  EXPECT_NE(r.err.find("17.15 K and 171.5 K"), std::string::npos) << r.err;

  // The bundled card has conductivity measurements in that band: no warning.
  const auto quiet = run_quantacal({"check", source_dir + "/materials/copper_rrr.yaml"});
  EXPECT_EQ(quiet.exit_code, 0) << quiet.err;
  EXPECT_EQ(quiet.err.find("Wiedemann-Franz"), std::string::npos) << quiet.err;
}
