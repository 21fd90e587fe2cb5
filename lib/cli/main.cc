// SPDX-License-Identifier: Apache-2.0
// Entry point of the `quantacal` command: dispatches to registered sub-commands.
#include "command_registry.h"

#include <quantacal/cards/card.h>
#include <quantacal/common/exceptions.h>
#include <quantacal/version.h>

#include <filesystem>
#include <ios>
#include <iostream>

namespace quantacal::cli {

std::map<std::string, Command>& command_registry() {
  static std::map<std::string, Command> registry;
  return registry;
}

CommandRegistrar::CommandRegistrar(std::string name, std::string summary,
                                   CommandFunction run) {
  auto key = name;
  command_registry()[key] = Command{std::move(name), std::move(summary), std::move(run)};
}

int guarded(const std::string& command, const std::function<int()>& body) {
  const std::string prefix = "quantacal " + command + ": ";
  try {
    return body();
  } catch (const CardError& e) {
    std::cerr << prefix << "error: " << e.what() << '\n';
    return invalid_input;
  } catch (const RangeError& e) {
    std::cerr << prefix << "error: " << e.what() << '\n';
    return invalid_input;
  } catch (const NumericalError& e) {
    std::cerr << prefix << "error: " << e.what() << '\n';
    return numerical;
  } catch (const std::filesystem::filesystem_error& e) {
    std::cerr << prefix << "error: " << e.what() << '\n';
    return io;
  } catch (const std::ios_base::failure& e) {
    std::cerr << prefix << "error: " << e.what() << '\n';
    return io;
  } catch (const std::invalid_argument& e) {
    std::cerr << prefix << "error: " << e.what() << '\n';
    return invalid_input;
  } catch (const std::exception& e) {
    std::cerr << prefix << "error: " << e.what() << '\n';
    return numerical;
  }
}

namespace {

void print_help(std::ostream& out) {
  out << "usage: quantacal <command> [options]\n"
         "       quantacal <command> --help\n\n"
         "Thermal properties from lattice models, for finite-element heat-conduction "
         "work.\n\n"
         "commands:\n";
  for (const auto& [name, command] : command_registry())
    out << "  " << name << std::string(name.size() < 13 ? 13 - name.size() : 1, ' ')
        << command.summary << '\n';
  out << "\nexit codes: 0 success, 1 a check failed, 2 invalid input, 3 numerical "
         "failure,\n"
         "            4 input/output failure\n"
         "Results are estimates from models and published data: check them against\n"
         "measurements before relying on them; quench and cryogen work follows local\n"
         "codes and licensed practice.\n";
}

} // namespace
} // namespace quantacal::cli

int main(int argc, char** argv) {
  using namespace quantacal::cli;
  std::vector<std::string> args(argv + 1, argv + argc);
  if (args.empty()) {
    print_help(std::cerr);
    return invalid_input;
  }
  if (args[0] == "help" && args.size() == 2 && command_registry().count(args[1]))
    return command_registry().at(args[1]).run({"--help"}); // quantacal help COMMAND
  if (args[0] == "--help" || args[0] == "-h" || args[0] == "help") {
    print_help(std::cout);
    return ok;
  }
  if (args[0] == "--version") {
    std::cout << "quantacal " << QUANTACAL_VERSION_STRING << '\n';
    return ok;
  }
  auto& registry = command_registry();
  const auto it = registry.find(args[0]);
  if (it == registry.end()) {
    std::cerr << "quantacal: error: unknown command '" << args[0]
              << "' (run 'quantacal --help' for the list)\n";
    return invalid_input;
  }
  args.erase(args.begin());
  return it->second.run(args);
}
