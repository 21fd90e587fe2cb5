// SPDX-License-Identifier: Apache-2.0
// libFuzzer target: quantities with units (quantacal::parse_quantity).
// A unit string is a parameter, not a file: its errors are InputError::argument
// (no file, line 0). A parsed quantity is finite, and parsing it against its
// own dimension gives the same value; against another dimension an InputError.
#include "fuzz_support.h"

#include <quantacal/cards/units.h>

#include <cstddef>
#include <cstdint>
#include <string>

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  const std::string text(reinterpret_cast<const char*>(data), size);
  using quantacal_fuzz::require;
  try {
    const quantacal::Quantity q = quantacal::parse_quantity(text);
    require(std::isfinite(q.value), "parse_quantity gave a non-finite value");
    require(!q.is_temperature_offset ||
                q.dimension == quantacal::dimension::temperature(),
            "a degC offset on a quantity that is not a temperature");
    (void)q.dimension.to_string();
    const double again = quantacal::parse_quantity(text, q.dimension);
    require(again == q.value, "parse_quantity(text, its own dimension) differs");
    const quantacal::Dimension other = q.dimension == quantacal::dimension::length()
                                           ? quantacal::dimension::time()
                                           : quantacal::dimension::length();
    try {
      (void)quantacal::parse_quantity(text, other);
      quantacal_fuzz::fuzz_fail("parse_quantity accepted a wrong dimension");
    } catch (const quantacal::InputError& e) {
      require(e.file().empty() && e.line() == 0, "unit error carries a location");
    }
  } catch (const quantacal::InputError& e) {
    require(e.file().empty() && e.line() == 0 && e.column() == 0,
            std::string("unit error carries a location: ") + e.what());
    require(*e.what() != '\0', "unit error with an empty message");
  } catch (const std::exception& e) {
    quantacal_fuzz::fuzz_fail(std::string("unexpected exception: ") + e.what());
  }
  return 0;
}
