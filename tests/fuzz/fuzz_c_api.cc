// SPDX-License-Identifier: Apache-2.0
// libFuzzer target: the C interface's qc_load_card_text. Any NUL-free text
// gives QC_OK and a handle that evaluates (finite values, C > 0, T(e) inside the
// range), or QC_INPUT_ERROR with a message and a 1-based line and column inside
// the text (qc_last_error_location). Any other status is a finding:
// QC_INTERNAL_ERROR means an unexpected exception reached the interface.
#include "fuzz_support.h"

#include <quantacal/c/quantacal.h>

#include <cstddef>
#include <cstdint>
#include <cstring>
#include <string>

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  using quantacal_fuzz::require;
  std::string text(reinterpret_cast<const char*>(data), size);
  text = text.substr(0, text.find('\0')); // a C string ends at its first NUL
  qc_material* m = nullptr;
  const qc_status status = qc_load_card_text(text.c_str(), "fuzz.yaml", &m);
  if (status != QC_OK) {
    require(m == nullptr, "a failed load left a handle");
    const std::string message = qc_last_error();
    require(status == QC_INPUT_ERROR, std::string("qc_load_card_text returned ") +
                                          qc_status_name(status) + ": " + message);
    int line = -1, column = -1;
    qc_last_error_location(&line, &column);
    const auto lines = quantacal_fuzz::split_lines(text);
    require(line >= 1 && line <= static_cast<int>(lines.size()) && column >= 1 &&
                column <= static_cast<int>(lines[std::size_t(line - 1)].size()) + 1,
            "C error location " + std::to_string(line) + ":" + std::to_string(column) +
                " outside the text: " + message);
    require(message.find("fuzz.yaml:") != std::string::npos,
            "C error message does not name the text: " + message);
    return 0;
  }
  double lower = 0.0, upper = 0.0;
  require(qc_valid_range(m, &lower, &upper) == QC_OK && lower > 0.0 && upper > lower &&
              std::isfinite(upper),
          "qc_valid_range");
  const std::size_t n = 5;
  double t[n], e[n], c[n], k[n], back[n];
  for (std::size_t i = 0; i < n; ++i)
    t[i] = std::min(upper, lower * std::pow(upper / lower, double(i) / (n - 1)));
  const qc_status s =
      qc_evaluate(m, t, n, QC_PER_MASS, QC_ENERGY | QC_CAPACITY | QC_CONDUCTIVITY, e, c,
                  nullptr, k, nullptr);
  require(s == QC_OK, std::string("qc_evaluate: ") + qc_last_error());
  for (std::size_t i = 0; i < n; ++i)
    require(std::isfinite(e[i]) && quantacal_fuzz::finite_positive(c[i]) &&
                quantacal_fuzz::finite_positive(k[i]),
            "qc_evaluate gave a non-finite value");
  require(qc_temperature_from_energy(m, e, n, QC_PER_MASS, back) == QC_OK,
          std::string("qc_temperature_from_energy: ") + qc_last_error());
  for (std::size_t i = 0; i < n; ++i)
    require(back[i] >= lower && back[i] <= upper, "T(e) outside the valid range");
  qc_free(m);
  return 0;
}
