// SPDX-License-Identifier: Apache-2.0
// Internal: errors found while running a case (against its mesh, its output
// folder), located at the entry of the case file they come from.
#ifndef QUANTACAL_LIB_SOLVER_CASE_ERRORS_H
#define QUANTACAL_LIB_SOLVER_CASE_ERRORS_H

#include <quantacal/common/exceptions.h>
#include <quantacal/solver/case.h>

#include <set>
#include <string>

namespace quantacal::solver::detail {

/**
 * `file:line:column: field = "value": expected <expected>` at @p where (its own
 * field path if it has one, else @p field).
 */
inline InputError case_error(const CaseDescription& description,
                             const CaseLocation& where, const std::string& field,
                             const std::string& expected) {
  return InputError(description.file, where.line, where.column,
                    where.field.empty() ? field : where.field, where.value,
                    "expected " + expected);
}

/** "0, 1, 3", or "none". */
inline std::string ids_text(const std::set<unsigned int>& ids) {
  std::string s;
  for (const unsigned int id : ids)
    s += (s.empty() ? "" : ", ") + std::to_string(id);
  return s.empty() ? "none" : s;
}

} // namespace quantacal::solver::detail

#endif
