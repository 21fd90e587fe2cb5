// SPDX-License-Identifier: Apache-2.0
// The C++ API's answers for the Python tests (tests/python/test_api.py) to compare
// with, printed as hexadecimal floats (%a) so the comparison is bit for bit:
//
//   python_cxx_reference values CARD BASIS T...     e c dc/dT k dk/dT T(e), one line per
//   T python_cxx_reference equilibrium CARD M T0 ...  T_f, then the heats
//   python_cxx_reference statistics CARD            the two tables' statistics
//   python_cxx_reference time CARD N REPEATS        ns per point of the batch calls
//
// BASIS is mass, mole or volume. The timing mode measures Material::thermal (all
// three outputs) and Material::conductivity over N temperatures spread over the
// card's range, the best of REPEATS calls.
#include <quantacal/quantacal.h>

#include <algorithm>
#include <chrono>
#include <cmath>
#include <cstdio>
#include <cstdlib>
#include <limits>
#include <string>
#include <vector>

namespace {

using namespace quantacal;

Basis basis_of(const std::string& s) {
  if (s == "mass")
    return Basis::mass;
  if (s == "mole")
    return Basis::mole;
  if (s == "volume")
    return Basis::volume;
  throw InputError::argument("python_cxx_reference", "basis", s, "mass, mole or volume");
}

int values(int argc, char** argv) {
  const MaterialPtr m = load_card(argv[2]);
  const Basis b = basis_of(argv[3]);
  for (int i = 4; i < argc; ++i) {
    const double t = std::strtod(argv[i], nullptr);
    double e, c, dc, k, dk; // the batch calls, one point each
    m->thermal(&t, 1, b, &e, &c, &dc);
    m->conductivity(&t, 1, &k, &dk);
    std::printf("%a %a %a %a %a %a\n", e, c, dc, k, dk, m->temperature_from_energy(e, b));
  }
  return 0;
}

int equilibrium(int argc, char** argv) {
  std::vector<Body> bodies;
  for (int i = 2; i + 2 < argc; i += 3)
    bodies.push_back({load_card(argv[i]), std::strtod(argv[i + 1], nullptr),
                      std::strtod(argv[i + 2], nullptr), ""});
  const EquilibriumResult r = solve_equilibrium(bodies);
  std::printf("%a\n", r.temperature);
  for (double q : r.heat)
    std::printf("%a\n", q);
  return 0;
}

int statistics(char** argv) {
  const MaterialPtr m = load_card(argv[2]);
  for (const TableStatistics* s :
       {&m->table().statistics(), &m->conductivity_table().statistics()})
    std::printf("%zu %zu %a %a %zu\n", s->n_segments, s->bytes, s->worst_error,
                s->worst_temperature, s->n_checked);
  return 0;
}

int timing(char** argv) {
  const MaterialPtr m = load_card(argv[2]);
  const std::size_t n = std::strtoul(argv[3], nullptr, 10);
  const int repeats = std::atoi(argv[4]);
  std::vector<double> t(n), e(n), c(n), dc(n), k(n), dk(n);
  const double lo = m->lower_temperature(), hi = m->upper_temperature();
  for (std::size_t i = 0; i < n; ++i) // log-spaced, like a cool-down's temperatures
    t[i] = lo * std::pow(hi / lo, (i + 0.5) / static_cast<double>(n));
  const auto best = [&](auto&& call) {
    double ns = std::numeric_limits<double>::infinity();
    for (int r = 0; r < repeats; ++r) {
      const auto start = std::chrono::steady_clock::now();
      call();
      const auto stop = std::chrono::steady_clock::now();
      ns = std::min(ns, std::chrono::duration<double, std::nano>(stop - start).count());
    }
    return ns / static_cast<double>(n);
  };
  const double thermal =
      best([&] { m->thermal(t.data(), n, Basis::mass, e.data(), c.data(), dc.data()); });
  const double conduction =
      best([&] { m->conductivity(t.data(), n, k.data(), dk.data()); });
  std::printf("thermal %.3f\nconductivity %.3f\n", thermal, conduction);
  return 0;
}

} // namespace

int main(int argc, char** argv) {
  const std::string mode = argc > 1 ? argv[1] : "";
  try {
    if (mode == "values" && argc >= 4)
      return values(argc, argv);
    if (mode == "equilibrium" && argc >= 8)
      return equilibrium(argc, argv);
    if (mode == "statistics" && argc == 3)
      return statistics(argv);
    if (mode == "time" && argc == 5)
      return timing(argv);
  } catch (const std::exception& e) {
    std::fprintf(stderr, "python_cxx_reference: %s\n", e.what());
    return 2;
  }
  std::fprintf(stderr, "usage: python_cxx_reference values CARD BASIS T... | "
                       "equilibrium CARD M T0 CARD M T0 ... | statistics CARD | "
                       "time CARD N REPEATS\n");
  return 2;
}
