// SPDX-License-Identifier: Apache-2.0
// The C++ API's answers for the C interface test (see cxx_reference.h).
#include "cxx_reference.h"

#include <quantacal/quantacal.h>

#include <chrono>
#include <cstdio>
#include <exception>
#include <vector>

namespace {

quantacal::Basis basis_of(int basis) {
  return basis == 1   ? quantacal::Basis::mole
         : basis == 2 ? quantacal::Basis::volume
                      : quantacal::Basis::mass;
}

template <typename Body>
int reporting(Body&& body) {
  try {
    body();
    return 0;
  } catch (const std::exception& e) {
    std::fprintf(stderr, "reference (C++): %s\n", e.what());
    return 1;
  }
}

} // namespace

extern "C" {

int reference_metadata(const char* card, double* lower, double* upper, double* molar_mass,
                       double* density) {
  return reporting([&] {
    const quantacal::MaterialPtr m = quantacal::load_card(card);
    *lower = m->lower_temperature();
    *upper = m->upper_temperature();
    *molar_mass = m->molar_mass();
    *density = m->reference_density();
  });
}

int reference_evaluate(const char* card, const double* temperatures, size_t n, int basis,
                       double* energy, double* capacity, double* capacity_derivative,
                       double* conductivity, double* conductivity_derivative) {
  return reporting([&] {
    const quantacal::MaterialPtr m = quantacal::load_card(card);
    m->thermal(temperatures, n, basis_of(basis), energy, capacity, capacity_derivative);
    m->conductivity(temperatures, n, conductivity, conductivity_derivative);
  });
}

int reference_inverse(const char* card, const double* energies, size_t n, int basis,
                      double* temperatures) {
  return reporting([&] {
    const quantacal::MaterialPtr m = quantacal::load_card(card);
    for (size_t i = 0; i < n; ++i)
      temperatures[i] = m->temperature_from_energy(energies[i], basis_of(basis));
  });
}

int reference_equilibrium(const char* card_a, double mass_a, double start_a,
                          const char* card_b, double mass_b, double start_b,
                          double* final_temperature) {
  return reporting([&] {
    const quantacal::EquilibriumResult r = quantacal::solve_equilibrium(
        {{quantacal::load_card(card_a), mass_a, start_a, "a"},
         {quantacal::load_card(card_b), mass_b, start_b, "b"}});
    *final_temperature = r.temperature;
  });
}

double reference_nanoseconds(const char* card, const double* temperatures, size_t n,
                             size_t chunk, int repeats) {
  static const quantacal::MaterialPtr m = quantacal::load_card(card);
  static std::vector<double> e, c, dc, k, dk;
  for (std::vector<double>* v : {&e, &c, &dc, &k, &dk})
    v->resize(n);
  const auto start = std::chrono::steady_clock::now();
  for (int r = 0; r < repeats; ++r)
    for (size_t i = 0; i < n; i += chunk) {
      m->thermal(temperatures + i, chunk, quantacal::Basis::volume, &e[i], &c[i], &dc[i]);
      m->conductivity(temperatures + i, chunk, &k[i], &dk[i]);
    }
  const std::chrono::duration<double, std::nano> took =
      std::chrono::steady_clock::now() - start;
  return took.count() / (static_cast<double>(repeats) * n);
}

} // extern "C"
