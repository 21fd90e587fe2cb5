// SPDX-License-Identifier: Apache-2.0
#include <quantacal/common/format.h>

#include <charconv>
#include <cmath>

namespace quantacal {

std::string format_double(double value) {
  if (std::isnan(value))
    return "nan";
  if (std::isinf(value))
    return value > 0 ? "inf" : "-inf";
  char buffer[64];
  const auto result = std::to_chars(buffer, buffer + sizeof buffer, value);
  return std::string(buffer, result.ptr);
}

} // namespace quantacal
