// SPDX-License-Identifier: Apache-2.0
// The `magnetic` heat-capacity kind in cards: it loads, its parameters are named,
// sourced and editable, and each mistake is a located CardError. The cards here are
// illustrative (iron-like values: T_C = 1043 K, beta = 2.22, p = 0.40 of bcc iron in
// Dinsdale, CALPHAD 15 (1991) 317).
#include "support.h"

#include <quantacal/cards/card.h>
#include <quantacal/cards/card_parameters.h>
#include <quantacal/cards/card_writer.h>
#include <quantacal/common/exceptions.h>

#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <string>

using namespace quantacal;
using quantacal::test::card_error;
using quantacal::test::replace;

namespace {

// Line numbers below refer to this text.
const std::string kIron = R"(name: test iron
description: illustrative card with a magnetic term
molar_mass: "55.845 g/mol"
reference_density: "7874 kg/m^3"
valid_range: {from: "100 K", to: "1200 K"}
heat_capacity:
  - kind: debye
    theta_D: "470 K"
  - kind: magnetic
    critical_temperature: "1043 K"
    moment: 2.22
    structure_factor: 0.40
    ordering: ferromagnetic
conductivity: {kind: constant, value: "80 W/m/K"}
sources:
  - {for: [molar_mass, reference_density, heat_capacity, conductivity], cite: "illustrative"}
)";

const std::string kSgteHint =
    " (an antiferromagnet's SGTE value is negative: divide it by the antiferromagnetic "
    "factor, -1 for bcc, -3 for other structures)";

double parameter(const ContributionPtr& c, const std::string& name) {
  for (const auto& p : c->parameters())
    if (p.name == name)
      return p.value;
  ADD_FAILURE() << name;
  return 0.0;
}

} // namespace

TEST(MagneticCard, Loads) {
  const MaterialPtr m = load_card_from_string(kIron, "iron.yaml");
  const auto& c = m->model().contributions();
  ASSERT_EQ(c.size(), 2u);
  EXPECT_EQ(c[1]->kind(), "magnetic");
  EXPECT_EQ(parameter(c[1], "critical_temperature"), 1043.0);
  EXPECT_EQ(parameter(c[1], "moment"), 2.22);
  EXPECT_EQ(parameter(c[1], "structure_factor"), 0.40);
  // the peak is a breakpoint of the model, so a node of the cached table
  const auto b = m->model().breakpoints();
  EXPECT_NE(std::find(b.begin(), b.end(), 1043.0), b.end());
  const auto nodes = m->table().node_temperatures();
  EXPECT_TRUE(std::binary_search(nodes.begin(), nodes.end(), 1043.0));
  // the term as the model layer builds it (same function, same numbers)
  const auto direct = make_magnetic(1043.0, 2.22, 0.40);
  EXPECT_EQ(c[1]->evaluate(1043.0).capacity, direct->evaluate(1043.0).capacity);
  // an antiferromagnet is the same function with its Neel temperature
  const MaterialPtr afm = load_card_from_string(
      replace(kIron, "ordering: ferromagnetic", "ordering: antiferromagnetic"), "a.yaml");
  EXPECT_EQ(afm->thermal_exact(1000.0, Basis::mole).capacity,
            m->thermal_exact(1000.0, Basis::mole).capacity);
  // `ordering` is optional (ferromagnetic by default)
  EXPECT_NO_THROW(load_card_from_string(
      replace(kIron, "    ordering: ferromagnetic\n", ""), "b.yaml"));
}

TEST(MagneticCard, ParametersAreNamedSourcedAndEditable) {
  const MaterialPtr m = load_card_from_string(kIron, "iron.yaml");
  const auto all = card_parameters(*m);
  std::vector<std::string> paths;
  for (const auto& p : all)
    paths.push_back(p.path);
  EXPECT_EQ(paths, (std::vector<std::string>{
                       "heat_capacity[0].theta_D", "heat_capacity[0].modes",
                       "heat_capacity[1].critical_temperature", "heat_capacity[1].moment",
                       "heat_capacity[1].structure_factor"}));
  // a bare name resolves for fitting
  const auto free = resolve_card_parameters(*m, {"moment"}, "--free");
  ASSERT_EQ(free.size(), 1u);
  EXPECT_EQ(free[0].path, "heat_capacity[1].moment");
  // every parameter needs its own source: recorded with its location
  const std::string sources = "  - {for: [molar_mass, reference_density, "
                              "\"heat_capacity[0]\", conductivity], cite: "
                              "\"illustrative\"}\n"
                              "  - for: [\"heat_capacity[1].critical_temperature\", "
                              "\"heat_capacity[1].structure_factor\"]\n"
                              "    cite: \"illustrative\"\n";
  const CardError e = card_error(replace(
      kIron,
      "  - {for: [molar_mass, reference_density, heat_capacity, conductivity], cite: "
      "\"illustrative\"}\n",
      sources));
  EXPECT_EQ(e.field(), "heat_capacity[1].moment") << e.what();
  EXPECT_EQ(e.line(), 11) << e.what();
  EXPECT_EQ(e.column(), 13);
  EXPECT_NE(e.expected().find("no `sources` entry"), std::string::npos);
  // the card writer edits a magnetic parameter in place
  CardChanges changes;
  changes.values.push_back({all[4], 0.28});
  const std::string edited = edit_card(kIron, "iron.yaml", changes);
  EXPECT_NE(edited.find("structure_factor: 0.28\n"), std::string::npos) << edited;
  const MaterialPtr fcc = load_card_from_string(edited, "iron.yaml");
  EXPECT_EQ(parameter(fcc->model().contributions()[1], "structure_factor"), 0.28);
}

TEST(MagneticCard, NonPositiveMoment) {
  for (const char* bad : {"0", "-2.22"}) {
    const CardError e =
        card_error(replace(kIron, "moment: 2.22", "moment: " + std::string(bad)));
    EXPECT_EQ(e.field(), "heat_capacity[1].moment");
    EXPECT_EQ(e.line(), 11) << e.what();
    EXPECT_EQ(e.column(), 13);
    EXPECT_EQ(e.value(), bad);
    EXPECT_EQ(e.expected(),
              "expected a magnetic moment > 0 Bohr magnetons per atom" + kSgteHint);
  }
  const CardError unit = card_error(replace(kIron, "moment: 2.22", "moment: \"2.22 K\""));
  EXPECT_EQ(unit.field(), "heat_capacity[1].moment");
  EXPECT_EQ(unit.expected(), "expected a finite number without a unit");
}

TEST(MagneticCard, NonPositiveCriticalTemperature) {
  const CardError e = card_error(replace(kIron, "\"1043 K\"", "\"-311.5 K\""));
  EXPECT_EQ(std::string(e.what()),
            "bad.yaml:10:27: heat_capacity[1].critical_temperature = \"-311.5 K\": "
            "expected a Curie or Neel temperature > 0 K" +
                kSgteHint);
  EXPECT_EQ(e.line(), 10);
  EXPECT_EQ(e.column(), 27);
  EXPECT_EQ(e.value(), "-311.5 K");
  const CardError dim = card_error(replace(kIron, "\"1043 K\"", "1043"));
  EXPECT_EQ(dim.field(), "heat_capacity[1].critical_temperature");
  EXPECT_EQ(dim.line(), 10);
}

TEST(MagneticCard, StructureFactorOutsideZeroOne) {
  for (const char* bad : {"1.0", "0", "-0.4", "1.4"}) {
    const CardError e = card_error(replace(kIron, "structure_factor: 0.40",
                                           "structure_factor: " + std::string(bad)));
    EXPECT_EQ(e.field(), "heat_capacity[1].structure_factor");
    EXPECT_EQ(e.line(), 12);
    EXPECT_EQ(e.column(), 23);
    EXPECT_EQ(e.value(), bad);
    EXPECT_EQ(e.expected(), "expected a structure factor between 0 and 1 (0.40 for bcc, "
                            "0.28 for other structures)");
  }
}

TEST(MagneticCard, MissingKeys) {
  for (const std::string& line :
       {std::string("    critical_temperature: \"1043 K\"\n"),
        std::string("    moment: 2.22\n"), std::string("    structure_factor: 0.40\n")}) {
    const CardError e = card_error(replace(kIron, line, ""));
    const std::string key = line.substr(4, line.find(':') - 4);
    EXPECT_EQ(e.field(), "heat_capacity[1]." + key);
    EXPECT_EQ(e.line(), 9); // the enclosing map
    EXPECT_EQ(e.column(), 5);
    EXPECT_EQ(e.expected(), "missing field");
  }
}

TEST(MagneticCard, UnknownOrderingKeyAndKind) {
  const CardError e =
      card_error(replace(kIron, "ordering: ferromagnetic", "ordering: antiferomagnetic"));
  EXPECT_EQ(std::string(e.what()),
            "bad.yaml:13:15: heat_capacity[1].ordering = \"antiferomagnetic\": unknown "
            "ordering (did you mean 'antiferromagnetic'?); expected one of: "
            "ferromagnetic, antiferromagnetic");
  EXPECT_EQ(e.line(), 13);
  EXPECT_EQ(e.column(), 15);
  const CardError far =
      card_error(replace(kIron, "ordering: ferromagnetic", "ordering: spin glass"));
  EXPECT_EQ(far.value(), "spin glass");
  EXPECT_EQ(far.expected(),
            "unknown ordering; expected one of: ferromagnetic, antiferromagnetic");
  const CardError key = card_error(replace(kIron, "moment: 2.22", "moments: 2.22"));
  EXPECT_EQ(key.field(), "heat_capacity[1].moments");
  EXPECT_EQ(key.line(), 11);
  EXPECT_EQ(key.column(), 5);
  EXPECT_EQ(key.expected(),
            "unknown key (did you mean 'moment'?); expected one of: kind, "
            "critical_temperature, moment, structure_factor, ordering");
  const CardError kind = card_error(replace(kIron, "kind: magnetic", "kind: magnetc"));
  EXPECT_EQ(kind.field(), "heat_capacity[1].kind");
  EXPECT_NE(kind.expected().find("did you mean 'magnetic'?"), std::string::npos);
}
