// SPDX-License-Identifier: Apache-2.0
// Loads a card and prints its specific heat at 300 K, in J/kg/K, using only the installed
// API.
#include <quantacal/quantacal.h>

#include <iostream>

int main(int argc, char** argv) {
  if (argc != 2) {
    std::cerr << "usage: consumer CARD\n";
    return 2;
  }
  try {
    const quantacal::MaterialPtr material = quantacal::load_card(argv[1]);
    const quantacal::ThermalState state =
        material->thermal(300.0, quantacal::Basis::mass);
    std::cout << "cp(300 K) = " << quantacal::format_double(state.capacity)
              << " J/kg/K\n";
    return 0;
  } catch (const std::exception& e) {
    std::cerr << "consumer: error: " << e.what() << '\n';
    return 2;
  }
}
