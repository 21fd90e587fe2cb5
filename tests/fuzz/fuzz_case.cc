// SPDX-License-Identifier: Apache-2.0
// libFuzzer target: a quench case file from text
// (quantacal::solver::load_case_from_string, without loading the cards it
// names). Any text gives a case description or an InputError located inside
// the text. Relative paths resolve against a folder that does not exist.
#include "fuzz_support.h"

#include <quantacal/solver/case.h>

#include <cstddef>
#include <cstdint>
#include <string>

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  const std::string text(reinterpret_cast<const char*>(data), size);
  const std::string file = "case.yaml";
  try {
    const quantacal::solver::CaseDescription c = quantacal::solver::load_case_from_string(
        text, file, "/nonexistent-quantacal-fuzz", false);
    (void)c;
  } catch (const quantacal::InputError& e) {
    quantacal_fuzz::check_located(e, text, file);
  } catch (const std::exception& e) {
    quantacal_fuzz::fuzz_fail(std::string("unexpected exception: ") + e.what());
  }
  return 0;
}
