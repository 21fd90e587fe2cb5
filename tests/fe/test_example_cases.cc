// SPDX-License-Identifier: Apache-2.0
// Every bundled example case reads, with its cards, and every card's initial
// temperature lies inside its valid range (a case that cannot start is caught
// here, not by a user). The full runs are timed in each example's README.
#include "reference/validation_support.h"

#include <quantacal/solver/case.h>

#include <gtest/gtest.h>

#include <filesystem>
#include <string>

namespace {

namespace fs = std::filesystem;

TEST(ExampleCases, EveryExampleCaseReadsWithItsCards) {
  const fs::path examples = fs::path(quantacal::reference::source_root()) / "examples";
  int found = 0;
  for (const auto& entry : fs::directory_iterator(examples)) {
    const fs::path file = entry.path() / "case.yaml";
    if (!fs::exists(file))
      continue;
    ++found;
    SCOPED_TRACE(file.string());
    quantacal::solver::CaseDescription d;
    ASSERT_NO_THROW(d = quantacal::solver::load_case(file.string()));
    ASSERT_FALSE(d.materials.empty());
    for (const auto& m : d.materials) {
      ASSERT_TRUE(m.material) << m.card;
      const double t0 = m.initial_temperature.value_or(d.initial_temperature);
      EXPECT_GE(t0, m.material->lower_temperature()) << m.card;
      EXPECT_LE(t0, m.material->upper_temperature()) << m.card;
    }
  }
  EXPECT_GE(found, 4); // cases (a) to (d)
}

} // namespace
