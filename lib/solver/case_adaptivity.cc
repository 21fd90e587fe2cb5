// SPDX-License-Identifier: Apache-2.0
// Reading the `adaptivity` block of a case file (docs/cases.md, "Adaptive meshes").
#include "case_reader.h"

#include <quantacal/common/format.h>

namespace quantacal::solver::detail {

void read_adaptivity(const CaseReader& reader, const YAML::Node& root,
                     CaseDescription& description) {
  if (!root["adaptivity"])
    return;
  const YAML::Node block = root["adaptivity"];
  AdaptivitySpec& spec = description.adaptivity;
  spec.where = reader.where(block, "adaptivity");
  if (block.IsScalar()) { // `adaptivity: true` takes the defaults
    spec.enabled = reader.boolean(block, "adaptivity");
    return;
  }
  if (!block.IsMap())
    reader.fail(block, "adaptivity",
                "true, false or a block {every, levels, max_cells, refine_above, "
                "coarsen_below}");
  reader.check_keys(block, "adaptivity",
                    {"every", "levels", "max_cells", "refine_above", "coarsen_below"});
  spec.enabled = true;
  if (block["every"])
    spec.every = reader.count(block["every"], "adaptivity.every",
                              "a number of accepted steps from 1 to 1000", 1, 1000);
  if (block["levels"])
    spec.levels = reader.count(block["levels"], "adaptivity.levels",
                               "a number of refinement levels from 0 to 6", 0, 6);
  if (block["max_cells"])
    spec.max_cells =
        reader.count(block["max_cells"], "adaptivity.max_cells",
                     "a number of active cells from 1 to 100000000", 1, 100000000);
  if (block["refine_above"])
    spec.refine_above = reader.positive(
        block["refine_above"], "adaptivity.refine_above", dimension::temperature(),
        "a temperature error across a cell (e.g. \"1 K\")");
  if (block["coarsen_below"])
    spec.coarsen_below = reader.positive(
        block["coarsen_below"], "adaptivity.coarsen_below", dimension::temperature(),
        "a temperature error across a cell (e.g. \"0.1 K\")");
  if (!(spec.coarsen_below < spec.refine_above))
    reader.fail(block["coarsen_below"] ? block["coarsen_below"] : block,
                "adaptivity.coarsen_below",
                "a temperature error below adaptivity.refine_above (" +
                    format_double(spec.refine_above) + " K)");
}

} // namespace quantacal::solver::detail
