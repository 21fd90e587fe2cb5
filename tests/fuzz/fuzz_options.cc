// SPDX-License-Identifier: Apache-2.0
// libFuzzer target: the command-line option parser of `quantacal`
// (lib/cli/options.cc). The input is split at '\n' into the argument list of a
// parser declared like `quantacal table` (valued options with and without
// choices, flags). Any arguments give parsed options whose values read as
// numbers and temperatures or fail with UsageError (the command's exit code 2);
// the parser's own help text is never empty.
#include "fuzz_support.h"

#include "options.h"

#include <cstddef>
#include <cstdint>
#include <string>
#include <vector>

namespace {

const quantacal::cli::OptionParser& parser() {
  static const quantacal::cli::OptionParser p = [] {
    quantacal::cli::OptionParser q("table", "CARD [options]", "fuzzed table command");
    q.add_value("from", "K", "first temperature")
        .add_value("to", "K", "last temperature")
        .add_value("step", "K", "temperature step")
        .add_value("basis", "BASIS", "basis", {"mass", "mole", "volume"})
        .add_value("max-iterations", "N", "a count")
        .add_flag("exact", "exact model")
        .add_flag("band", "band");
    return q;
  }();
  return p;
}

// Reads every option the way the commands do; each read either gives a finite
// value or throws UsageError.
void read_values(const quantacal::cli::ParsedOptions& o) {
  using quantacal_fuzz::require;
  for (const auto& entry : o.values) {
    const std::string& name = entry.first;
    const std::string& raw = entry.second;
    require(o.has(name) && o.text(name) == raw, "option --" + name + " not found again");
    const auto guarded = [&](auto&& read) {
      try {
        require(std::isfinite(read()),
                "option --" + name + " read as a non-finite value");
      } catch (const quantacal::cli::UsageError& e) {
        require(*e.what() != '\0', "UsageError with an empty message");
      }
    };
    guarded([&] { return o.number(name, 0.0); });
    guarded([&] { return o.temperature(name, 0.0); });
    guarded([&] { return o.temperature_difference(name, 0.0); });
  }
}

} // namespace

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  const std::string text(reinterpret_cast<const char*>(data), size);
  std::vector<std::string> args = quantacal_fuzz::split_lines(text);
  if (size == 0)
    args.clear();
  try {
    const quantacal::cli::ParsedOptions o = parser().parse(args);
    quantacal_fuzz::require(o.positional.size() <= args.size(),
                            "more positional arguments than arguments");
    read_values(o);
    if (o.values.count("basis"))
      quantacal_fuzz::require(o.values.at("basis") == "mass" ||
                                  o.values.at("basis") == "mole" ||
                                  o.values.at("basis") == "volume",
                              "--basis outside its choices");
  } catch (const quantacal::cli::UsageError& e) {
    quantacal_fuzz::require(*e.what() != '\0', "UsageError with an empty message");
  } catch (const std::exception& e) {
    quantacal_fuzz::fuzz_fail(std::string("unexpected exception: ") + e.what());
  }
  quantacal_fuzz::require(!parser().help().empty() && !parser().usage().empty(),
                          "empty help");
  return 0;
}
