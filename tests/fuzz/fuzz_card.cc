// SPDX-License-Identifier: Apache-2.0
// libFuzzer target: a material card from text (quantacal::load_card_from_string).
// Any text gives a Material that passes check_material(), or an InputError
// located inside the text. A card that names other cards (`composition`)
// resolves them against the folder of the name given here, a folder that does
// not exist, so the fuzzer never reads files.
#include "fuzz_support.h"

#include <quantacal/cards/card.h>

#include <cstddef>
#include <cstdint>
#include <string>

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  const std::string text(reinterpret_cast<const char*>(data), size);
  const std::string file = "/nonexistent-quantacal-fuzz/card.yaml";
  try {
    const quantacal::MaterialPtr m = quantacal::load_card_from_string(text, file);
    quantacal_fuzz::require(m != nullptr, "load_card_from_string returned null");
    quantacal_fuzz::check_material(*m);
  } catch (const quantacal::InputError& e) {
    quantacal_fuzz::check_located(e, text, file);
  } catch (const std::exception& e) {
    quantacal_fuzz::fuzz_fail(std::string("unexpected exception: ") + e.what());
  }
  return 0;
}
