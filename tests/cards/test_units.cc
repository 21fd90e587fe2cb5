// SPDX-License-Identifier: Apache-2.0
// Units: conversions to SI and dimension checks. The conversion factors are
// the SI definitions (prefixes, degree Celsius = K - 273.15): common practice.
#include <quantacal/cards/units.h>

#include <gtest/gtest.h>

#include <cmath>
#include <stdexcept>
#include <string>
#include <utility>
#include <vector>

using namespace quantacal;

namespace {

std::string message_of(const std::string& text, const Dimension& d) {
  try {
    parse_quantity(text, d);
  } catch (const std::invalid_argument& e) {
    return e.what();
  }
  return "";
}

} // namespace

TEST(Units, PlainUnitsAndPrefixes) {
  // SI prefixes and units (common practice); exact binary comparisons where the
  // factor is exact, else 1 ulp-level relative tolerance (numerical).
  EXPECT_EQ(parse_quantity("343 K", dimension::temperature()), 343.0);
  EXPECT_EQ(parse_quantity("343K", dimension::temperature()), 343.0);
  EXPECT_NEAR(parse_quantity("0.695 mJ/mol/K^2", dimension::sommerfeld()), 0.695e-3,
              1e-18);
  EXPECT_NEAR(parse_quantity("63.546 g/mol", dimension::molar_mass()), 0.063546, 1e-17);
  EXPECT_NEAR(parse_quantity("8.96 g/cm^3", dimension::density()), 8960.0, 1e-11);
  EXPECT_EQ(parse_quantity("8960 kg/m^3", dimension::density()), 8960.0);
  EXPECT_NEAR(parse_quantity("137.8 GPa", dimension::pressure()), 137.8e9, 1e-3);
  EXPECT_NEAR(parse_quantity("7.112 cm^3/mol", dimension::molar_volume()), 7.112e-6,
              1e-20);
  EXPECT_NEAR(parse_quantity("4.1e-6 mol/J", dimension::inverse_molar_energy()), 4.1e-6,
              1e-21);
  EXPECT_NEAR(parse_quantity("10.71 kJ/mol", dimension::molar_energy()), 10710.0, 1e-9);
  EXPECT_EQ(parse_quantity("5000 W/m^2/K", dimension::heat_transfer_coefficient()),
            5000.0);
  EXPECT_EQ(parse_quantity("5 kW/m^2/K", dimension::heat_transfer_coefficient()), 5000.0);
  EXPECT_EQ(parse_quantity("24.44 J/(mol K)", dimension::molar_capacity()), 24.44);
  EXPECT_EQ(parse_quantity("24.44 J*mol^-1*K^-1", dimension::molar_capacity()), 24.44);
  EXPECT_EQ(parse_quantity("2 min", dimension::time()), 120.0);
  EXPECT_EQ(parse_quantity("+1.5e3 W/m^3", dimension::power_density()), 1500.0);
  EXPECT_EQ(parse_quantity("2.02", dimension::dimensionless()), 2.02);
}

TEST(Units, Celsius) {
  // degC: an offset for a temperature, a kelvin inside a per-degree unit (SI definition)
  const Quantity t = parse_quantity("25 degC");
  EXPECT_DOUBLE_EQ(t.value, 298.15);
  EXPECT_TRUE(t.is_temperature_offset);
  EXPECT_EQ(parse_quantity("449 J/kg/degC", dimension::specific_capacity()), 449.0);
  EXPECT_FALSE(parse_quantity("449 J/kg/degC").is_temperature_offset);
  EXPECT_EQ(parse_quantity("-273.15 degC", dimension::temperature()), 0.0);
}

TEST(Units, DimensionStrings) {
  EXPECT_EQ(dimension::molar_capacity().to_string(), "kg m^2 s^-2 K^-1 mol^-1");
  EXPECT_EQ(dimension::dimensionless().to_string(), "1");
  EXPECT_EQ(parse_quantity("1 W/m/K").dimension, dimension::conductivity());
}

TEST(Units, Errors) {
  EXPECT_EQ(message_of("343 J/mol", dimension::temperature()),
            "expected a temperature (K, mK or degC) but found a molar energy (e.g. "
            "J/mol, kJ/mol)");
  EXPECT_EQ(
      message_of("343", dimension::temperature()),
      "expected a temperature (K, mK or degC) but found a plain number without a unit");
  EXPECT_NE(
      message_of("343 Kelvin", dimension::temperature()).find("unknown unit 'Kelvin'"),
      std::string::npos);
  EXPECT_NE(message_of("5 W/m^2/k", dimension::heat_transfer_coefficient())
                .find("unknown unit 'k' (did you mean 'K'?)"),
            std::string::npos);
  EXPECT_NE(message_of("nan K", dimension::temperature()).find("NaN and infinity"),
            std::string::npos);
  EXPECT_NE(message_of("inf K", dimension::temperature()).find("NaN and infinity"),
            std::string::npos);
  EXPECT_NE(message_of("1e999 K", dimension::temperature()).find("out of range"),
            std::string::npos);
  EXPECT_NE(
      message_of("K 343", dimension::temperature()).find("does not start with a number"),
      std::string::npos);
  EXPECT_NE(message_of("1,5 K", dimension::temperature()).find("unexpected ','"),
            std::string::npos);
  EXPECT_NE(message_of("1 J/(mol K", dimension::molar_capacity()).find("missing ')'"),
            std::string::npos);
  EXPECT_NE(
      message_of("1 K^0", dimension::temperature()).find("non-zero integer exponent"),
      std::string::npos);
}

TEST(Units, FahrenheitAndThermochemicalCalorie) {
  // degF alone: T/K = (x + 459.67) 5/9; inside a unit a 5/9 K interval (NIST SP 811,
  // B.8). cal: the thermochemical calorie, 4.184 J exactly (ISO 80000-5).
  const Quantity f = parse_quantity("32 degF");
  EXPECT_TRUE(f.is_temperature_offset);
  EXPECT_NEAR(f.value, 273.15, 1e-13);
  EXPECT_NEAR(parse_quantity("-459.67 degF", dimension::temperature()), 0.0, 1e-13);
  EXPECT_NEAR(parse_quantity("1 J/g/degF", dimension::specific_capacity()), 1800.0,
              1e-12);
  EXPECT_FALSE(parse_quantity("1 J/g/degF").is_temperature_offset);
  EXPECT_NEAR(parse_quantity("1 cal/g/K", dimension::specific_capacity()), 4184.0, 1e-12);
  EXPECT_NEAR(parse_quantity("1 kcal/mol", dimension::molar_energy()), 4184.0, 1e-12);
}

TEST(Units, ParseUnitGivesFactorOffsetAndWrittenFactors) {
  const Unit cp = parse_unit("J/(g K)");
  EXPECT_NEAR(cp.scale, 1000.0, 1e-12);
  EXPECT_EQ(cp.offset, 0.0);
  EXPECT_EQ(cp.dimension, dimension::specific_capacity());
  const std::vector<std::pair<std::string, int>> factors = {
      {"J", 1}, {"g", -1}, {"K", -1}};
  EXPECT_EQ(cp.factors, factors);
  const std::vector<std::pair<std::string, int>> merged = {{"kg", 1}, {"m", -3}};
  EXPECT_EQ(parse_unit("kg m^-1 m^-2").factors, merged);
  EXPECT_EQ(parse_unit("W*m^-1*K^-1").factors,
            (std::vector<std::pair<std::string, int>>{{"W", 1}, {"m", -1}, {"K", -1}}));
  const Unit c = parse_unit("degC");
  EXPECT_TRUE(c.is_temperature_offset);
  EXPECT_EQ(c.offset, 273.15);
  EXPECT_EQ(c.scale, 1.0);
  const Unit f = parse_unit("degF");
  EXPECT_EQ(f.offset, 459.67);
  EXPECT_EQ(f.scale, 5.0 / 9.0);
  // degC under '/' or a power is an interval, not an offset scale.
  EXPECT_FALSE(parse_unit("1/degC").is_temperature_offset);
  EXPECT_EQ(parse_quantity("2 /degC").value, 2.0);
  EXPECT_FALSE(parse_unit("degC/min").is_temperature_offset);
  EXPECT_EQ(describe_dimension(dimension::conductivity()),
            "a thermal conductivity (e.g. W/m/K)");
  try {
    parse_unit("J/gram/K");
    ADD_FAILURE() << "no error";
  } catch (const std::invalid_argument& e) {
    EXPECT_EQ(std::string(e.what()).find("unit \"J/gram/K\": unknown unit 'gram'"), 0u)
        << e.what();
  }
}
