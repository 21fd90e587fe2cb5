// SPDX-License-Identifier: Apache-2.0
// Regression tests for what the fuzz target fuzz_fit_data found in the
// measurement CSV reader (docs/reliability.md).
#include <quantacal/common/exceptions.h>
#include <quantacal/fit/fit.h>

#include <gtest/gtest.h>

#include <string>

using namespace quantacal;

namespace {

InputError data_error(const std::string& text) {
  try {
    fit::read_data_from_string(text, "data.csv");
  } catch (const InputError& e) {
    return e;
  }
  ADD_FAILURE() << "expected an InputError for: " << text;
  return InputError("", 0, 0, "", "", "");
}

} // namespace

// fuzz_fit_data: an empty file (or one of blank and comment lines only) was
// reported at line 0, column 0, outside any text; it is now located at 1:1, as
// an empty card is.
TEST(FitDataHardening, EmptyFileIsLocatedAtItsStart) {
  for (const std::string text : {"", "\n\n", "# only a comment\n", "\xEF\xBB\xBF"}) {
    const InputError e = data_error(text);
    EXPECT_EQ(e.file(), "data.csv");
    EXPECT_EQ(e.line(), 1) << e.what();
    EXPECT_EQ(e.column(), 1) << e.what();
    EXPECT_EQ(std::string(e.what()),
              "data.csv:1:1: empty data file: expected a header row naming the columns, "
              "e.g. \"T_K,cp_J_per_kg_K\"");
  }
}
