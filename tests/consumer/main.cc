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

    // The material layer's calls as docs/api.md shows them: a batch on the volume
    // basis, its inverse, and two equal bodies at 300 K and 400 K in contact.
    const double temperatures[] = {300.0, 350.0, 400.0};
    double energy[3], capacity[3];
    material->thermal(temperatures, 3, quantacal::Basis::volume, energy, capacity,
                      nullptr);
    const double back =
        material->temperature_from_energy(energy[1], quantacal::Basis::volume);
    std::cout << "T(e(350 K)) = " << quantacal::format_double(back) << " K\n";
    const quantacal::EquilibriumResult contact = quantacal::solve_equilibrium(
        {{material, 1.0, 300.0, "cold"}, {material, 1.0, 400.0, "hot"}});
    std::cout << "equilibrium = " << quantacal::format_double(contact.temperature)
              << " K\n";
    return 0;
  } catch (const std::exception& e) {
    std::cerr << "consumer: error: " << e.what() << '\n';
    return 2;
  }
}
