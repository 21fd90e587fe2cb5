// SPDX-License-Identifier: Apache-2.0
// libFuzzer target: the measurement CSV of `quantacal fit`
// (quantacal::fit::read_data_from_string). Any text gives a data set whose
// every row is finite and physical, located on a line of the text, or an
// InputError located inside the text.
#include "fuzz_support.h"

#include <quantacal/fit/fit.h>

#include <cstddef>
#include <cstdint>
#include <string>

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  const std::string text(reinterpret_cast<const char*>(data), size);
  const std::string file = "data.csv";
  using quantacal_fuzz::require;
  try {
    const quantacal::fit::DataSet set = quantacal::fit::read_data_from_string(text, file);
    require(!set.points.empty(), "a data set without rows");
    require(set.sha256.size() == 64, "checksum is not 64 hex digits");
    const int n_lines = static_cast<int>(quantacal_fuzz::split_lines(text).size());
    for (const auto& p : set.points) {
      require(quantacal_fuzz::finite_positive(p.temperature), "row T not finite > 0");
      require(quantacal_fuzz::finite_positive(p.value), "row value not finite > 0");
      require(p.line >= 1 && p.line <= n_lines, "row line outside the text");
      if (set.has_sigma)
        require(quantacal_fuzz::finite_positive(p.sigma), "row sigma not finite > 0");
      if (p.kind == quantacal::fit::Observable::energy_increment)
        require(p.from_temperature >= 0.0 && p.from_temperature < p.temperature,
                "energy increment with T_from outside [0, T)");
    }
  } catch (const quantacal::InputError& e) {
    quantacal_fuzz::check_located(e, text, file);
  } catch (const std::exception& e) {
    quantacal_fuzz::fuzz_fail(std::string("unexpected exception: ") + e.what());
  }
  return 0;
}
