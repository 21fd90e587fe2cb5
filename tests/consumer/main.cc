// SPDX-License-Identifier: Apache-2.0
// Loads a card and prints its specific heat at 300 K, in J/kg/K, using only the installed
// API.
#include <quantacal/fit/fit.h>
#include <quantacal/quantacal.h>

#include <cmath>
#include <cstdio>
#include <iostream>
#include <memory>
#include <string>

/**
 * The fitting layer (quantacal::fit, GSL): the card's first heat-capacity parameter,
 * started 5 % off, fitted to c_p rows computed from the card itself, must come back
 * to the card's value. Returns false if it does not.
 */
bool refit_first_parameter(const quantacal::MaterialPtr& material) {
  namespace fit = quantacal::fit;
  std::string csv = "T_K,cp_J_per_mol_K\n";
  for (const double t : {20.0, 50.0, 100.0, 200.0, 300.0})
    csv += quantacal::format_double(t) + "," +
           quantacal::format_double(material->model().evaluate(t).capacity) + "\n";
  const fit::DataSet data = fit::read_data_from_string(csv, "consumer.csv");
  const quantacal::CardParameter first = quantacal::card_parameters(*material).front();
  quantacal::MaterialData start = material->data();
  start.model = std::make_shared<const quantacal::HeatCapacityModel>(
      material->model().with_contribution(
          first.index, material->model().contributions()[first.index]->with_parameter(
                           first.name, 1.05 * first.value)));
  const quantacal::Material off(start);
  const fit::FitResult result =
      fit::fit(off, data, fit::resolve_free_parameters(off, {first.path}), {});
  std::cout << "refit " << first.path << " = "
            << quantacal::card_quantity_text(result.values[0], first.unit) << "\n";
  return std::abs(result.values[0] / first.value - 1.0) < 1e-6;
}

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
    std::printf("cp(300 K) bits = %a\n", state.capacity); // compared with the C consumer

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
    if (!refit_first_parameter(material)) {
      std::cerr << "consumer: error: the refit did not return the card's value\n";
      return 2;
    }
    return 0;
  } catch (const std::exception& e) {
    std::cerr << "consumer: error: " << e.what() << '\n';
    return 2;
  }
}
