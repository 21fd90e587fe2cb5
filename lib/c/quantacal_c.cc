// SPDX-License-Identifier: Apache-2.0
// The C interface (include/quantacal/c/quantacal.h) over the core: handles that own
// a shared Material, exceptions turned into status codes and a per-thread message.
#include <quantacal/c/quantacal.h>

#include <quantacal/cards/card.h>
#include <quantacal/common/exceptions.h>
#include <quantacal/common/format.h>
#include <quantacal/material/equilibrium.h>
#include <quantacal/material/material.h>
#include <quantacal/version.h>

#include <algorithm>
#include <cstdio>
#include <cstring>
#include <new>
#include <string>
#include <vector>

struct qc_material {
  quantacal::MaterialPtr material;
};

namespace {

using quantacal::Basis;

/// The last failure on this thread: the library's only mutable state.
struct ThreadError {
  std::string message;
  int line = 0;
  int column = 0;
};

ThreadError& thread_error() {
  thread_local ThreadError error;
  return error;
}

/**
 * Records a failure as "function: text" (line and column of a card error); never
 * throws: a message that cannot be stored whole is cut to the space already held.
 */
qc_status fail(qc_status status, const char* function, const char* text, int line = 0,
               int column = 0) noexcept {
  ThreadError& e = thread_error();
  e.line = line;
  e.column = column;
  e.message.clear();
  for (const char* piece : {function, ": ", text}) {
    try {
      e.message += piece;
    } catch (...) {
      const std::size_t room = e.message.capacity() - e.message.size();
      e.message.append(piece, std::min(room, std::char_traits<char>::length(piece)));
    }
  }
  return status;
}

qc_status succeed() noexcept {
  ThreadError& e = thread_error();
  e.message.clear();
  e.line = e.column = 0;
  return QC_OK;
}

/// How an InputError counts: a card's (load calls) or a parameter's (the others).
enum class InputKind { card, argument };

/**
 * Runs @p body and turns what it throws into a status and this thread's message:
 * the one place where exceptions stop.
 */
template <typename Body>
qc_status guarded(const char* function, InputKind input, Body&& body) noexcept {
  try {
    body();
    return succeed();
  } catch (const quantacal::InputError& e) {
    return fail(input == InputKind::card ? QC_INPUT_ERROR : QC_INVALID_ARGUMENT, function,
                e.what(), e.line(), e.column());
  } catch (const quantacal::RangeError& e) {
    return fail(QC_RANGE_ERROR, function, e.what());
  } catch (const quantacal::NumericalError& e) {
    return fail(QC_NUMERICAL_ERROR, function, e.what());
  } catch (const std::bad_alloc&) {
    return fail(QC_OUT_OF_MEMORY, function, "out of memory");
  } catch (const std::exception& e) {
    return fail(QC_INTERNAL_ERROR, function, e.what());
  } catch (...) {
    return fail(QC_INTERNAL_ERROR, function, "unknown exception");
  }
}

/**
 * Inserts where the failing point is ("temperatures[3] = 2000 K: ", or "energies[3]: "
 * if @p temperature is null) after the "function: " that starts this thread's
 * message; leaves the message alone if that cannot be done.
 */
void name_the_point(const char* function, const char* array, size_t index,
                    const double* temperature) noexcept {
  try {
    std::string where = std::string(array) + "[" + std::to_string(index) + "]";
    if (temperature)
      where += " = " + quantacal::format_double(*temperature) + " K";
    thread_error().message.insert(std::char_traits<char>::length(function) + 2,
                                  where + ": ");
  } catch (...) {
  }
}

/// QC_INVALID_ARGUMENT with a message formatted into a fixed buffer (no allocation).
template <typename... Args>
qc_status invalid(const char* function, const char* format, Args... args) noexcept {
  char text[320];
  std::snprintf(text, sizeof text, format, args...);
  return fail(QC_INVALID_ARGUMENT, function, text);
}

qc_status null_argument(const char* function, const char* argument) noexcept {
  return invalid(function, "%s is a null pointer", argument);
}

// A C caller may pass any int as a qc_basis or qc_status (a cast); C++ may not
// load such a value as the enum (UBSan: "load of value ... not a valid value for
// type 'qc_basis'"), so the argument's bytes are read as the int they are.
template <typename Enum>
int raw_int(const Enum& e) noexcept {
  static_assert(sizeof(Enum) == sizeof(int), "an int-sized C enum");
  int value = 0;
  std::memcpy(&value, &e, sizeof value);
  return value;
}

bool to_basis(const qc_basis& basis, Basis& out) noexcept {
  switch (raw_int(basis)) {
  case QC_PER_MASS:
    out = Basis::mass;
    return true;
  case QC_PER_MOLE:
    out = Basis::mole;
    return true;
  case QC_PER_VOLUME:
    out = Basis::volume;
    return true;
  }
  return false;
}

qc_status bad_basis(const char* function, const qc_basis& basis) noexcept {
  return invalid(function,
                 "basis = %d: expected QC_PER_MASS (0), QC_PER_MOLE (1) or "
                 "QC_PER_VOLUME (2)",
                 raw_int(basis));
}

/// Loads through @p load and builds both tables, so evaluation never builds.
template <typename Load>
qc_status load_with(const char* function, qc_material** out, Load&& load) noexcept {
  return guarded(function, InputKind::card, [&] {
    quantacal::MaterialPtr m = load();
    m->table();
    m->conductivity_table();
    *out = new qc_material{std::move(m)};
  });
}

/// Index of the first temperature outside [lower, upper] (NaN included), or n.
size_t first_outside(const quantacal::Material& m, const double* t, size_t n) noexcept {
  for (size_t i = 0; i < n; ++i)
    if (!(t[i] >= m.lower_temperature() && t[i] <= m.upper_temperature()))
      return i;
  return n;
}

} // namespace

extern "C" {

qc_status qc_load_card(const char* path, qc_material** material) {
  if (!material)
    return null_argument("qc_load_card", "material");
  *material = nullptr;
  if (!path)
    return null_argument("qc_load_card", "path");
  return load_with("qc_load_card", material,
                   [&] { return quantacal::load_card(std::string(path)); });
}

qc_status qc_load_card_text(const char* text, const char* name, qc_material** material) {
  if (!material)
    return null_argument("qc_load_card_text", "material");
  *material = nullptr;
  if (!text)
    return null_argument("qc_load_card_text", "text");
  return load_with("qc_load_card_text", material, [&] {
    return quantacal::load_card_from_string(
        std::string(text), name && *name ? std::string(name) : std::string("<text>"));
  });
}

void qc_free(qc_material* material) {
  delete material;
}

qc_status qc_name(const qc_material* material, const char** name) {
  if (!material)
    return null_argument("qc_name", "material");
  if (!name)
    return null_argument("qc_name", "name");
  *name = material->material->name().c_str();
  return succeed();
}

qc_status qc_valid_range(const qc_material* material, double* lower, double* upper) {
  if (!material)
    return null_argument("qc_valid_range", "material");
  if (!lower || !upper)
    return null_argument("qc_valid_range", lower ? "upper" : "lower");
  *lower = material->material->lower_temperature();
  *upper = material->material->upper_temperature();
  return succeed();
}

qc_status qc_molar_mass(const qc_material* material, double* molar_mass) {
  if (!material)
    return null_argument("qc_molar_mass", "material");
  if (!molar_mass)
    return null_argument("qc_molar_mass", "molar_mass");
  *molar_mass = material->material->molar_mass();
  return succeed();
}

qc_status qc_reference_density(const qc_material* material, double* density) {
  if (!material)
    return null_argument("qc_reference_density", "material");
  if (!density)
    return null_argument("qc_reference_density", "density");
  *density = material->material->reference_density();
  return succeed();
}

qc_status qc_density(const qc_material* material, double temperature, double* density) {
  if (!material)
    return null_argument("qc_density", "material");
  if (!density)
    return null_argument("qc_density", "density");
  return guarded("qc_density", InputKind::argument,
                 [&] { *density = material->material->density(temperature); });
}

qc_status qc_evaluate(const qc_material* material, const double* temperatures, size_t n,
                      qc_basis basis, unsigned flags, double* energy, double* capacity,
                      double* capacity_derivative, double* conductivity,
                      double* conductivity_derivative) {
  static const char* const function = "qc_evaluate";
  if (!material)
    return null_argument(function, "material");
  if (flags == 0 || (flags & ~static_cast<unsigned>(QC_ALL)) != 0)
    return invalid(
        function,
        "flags = %u: expected a non-zero OR of QC_ENERGY (1), QC_CAPACITY (2), "
        "QC_CAPACITY_DERIVATIVE (4), QC_CONDUCTIVITY (8) and "
        "QC_CONDUCTIVITY_DERIVATIVE (16)",
        flags);
  Basis b = Basis::mass;
  if (!to_basis(basis, b))
    return bad_basis(function, basis);
  const struct {
    unsigned flag;
    const double* array;
    const char* name;
  } outputs[] = {
      {QC_ENERGY, energy, "energy"},
      {QC_CAPACITY, capacity, "capacity"},
      {QC_CAPACITY_DERIVATIVE, capacity_derivative, "capacity_derivative"},
      {QC_CONDUCTIVITY, conductivity, "conductivity"},
      {QC_CONDUCTIVITY_DERIVATIVE, conductivity_derivative, "conductivity_derivative"}};
  for (const auto& o : outputs)
    if ((flags & o.flag) && !o.array)
      return invalid(function, "%s is a null pointer but its flag is set", o.name);
  if (n == 0)
    return succeed();
  if (!temperatures)
    return null_argument(function, "temperatures");
  const quantacal::Material& m = *material->material;
  const qc_status s = guarded(function, InputKind::argument, [&] {
    if (flags & QC_THERMAL)
      m.thermal(temperatures, n, b, (flags & QC_ENERGY) ? energy : nullptr,
                (flags & QC_CAPACITY) ? capacity : nullptr,
                (flags & QC_CAPACITY_DERIVATIVE) ? capacity_derivative : nullptr);
    if (flags & QC_CONDUCTION)
      m.conductivity(temperatures, n, (flags & QC_CONDUCTIVITY) ? conductivity : nullptr,
                     (flags & QC_CONDUCTIVITY_DERIVATIVE) ? conductivity_derivative
                                                          : nullptr);
  });
  if (s == QC_RANGE_ERROR) { // the C++ message names the value, not where it is
    const size_t i = first_outside(m, temperatures, n);
    if (i < n)
      name_the_point(function, "temperatures", i, &temperatures[i]);
  }
  return s;
}

qc_status qc_temperature_from_energy(const qc_material* material, const double* energies,
                                     size_t n, qc_basis basis, double* temperatures) {
  static const char* const function = "qc_temperature_from_energy";
  if (!material)
    return null_argument(function, "material");
  Basis b = Basis::mass;
  if (!to_basis(basis, b))
    return bad_basis(function, basis);
  if (n == 0)
    return succeed();
  if (!energies)
    return null_argument(function, "energies");
  if (!temperatures)
    return null_argument(function, "temperatures");
  size_t i = 0;
  const qc_status s = guarded(function, InputKind::argument, [&] {
    for (i = 0; i < n; ++i)
      temperatures[i] = material->material->temperature_from_energy(energies[i], b);
  });
  if (s == QC_RANGE_ERROR && i < n)
    name_the_point(function, "energies", i, nullptr);
  return s;
}

qc_status qc_equilibrium(size_t n, const qc_material* const* materials,
                         const double* masses, const double* initial_temperatures,
                         double* final_temperature, double* heats) {
  static const char* const function = "qc_equilibrium";
  if (!materials)
    return null_argument(function, "materials");
  if (!masses)
    return null_argument(function, "masses");
  if (!initial_temperatures)
    return null_argument(function, "initial_temperatures");
  if (!final_temperature)
    return null_argument(function, "final_temperature");
  for (size_t i = 0; i < n; ++i)
    if (!materials[i])
      return invalid(function, "materials[%zu] is a null pointer", i);
  return guarded(function, InputKind::argument, [&] {
    std::vector<quantacal::Body> bodies;
    bodies.reserve(n);
    for (size_t i = 0; i < n; ++i) // the C++ call labels a body by its 1-based number
      bodies.push_back({materials[i]->material, masses[i], initial_temperatures[i], ""});
    const quantacal::EquilibriumResult r = quantacal::solve_equilibrium(bodies);
    *final_temperature = r.temperature;
    if (heats)
      for (size_t i = 0; i < n; ++i)
        heats[i] = r.heat[i];
  });
}

const char* qc_last_error(void) {
  return thread_error().message.c_str();
}

void qc_last_error_location(int* line, int* column) {
  const ThreadError& e = thread_error();
  if (line)
    *line = e.line;
  if (column)
    *column = e.column;
}

qc_status qc_set_error(qc_status status, const char* message) {
  const char* text = message ? message : "";
  ThreadError& e = thread_error();
  e.line = e.column = 0;
  try {
    e.message = text;
  } catch (...) {
    e.message.clear();
  }
  return status;
}

const char* qc_status_name(qc_status status) {
  switch (raw_int(status)) {
  case QC_OK:
    return "ok";
  case QC_INPUT_ERROR:
    return "input error";
  case QC_RANGE_ERROR:
    return "range error";
  case QC_NUMERICAL_ERROR:
    return "numerical error";
  case QC_INVALID_ARGUMENT:
    return "invalid argument";
  case QC_OUT_OF_MEMORY:
    return "out of memory";
  case QC_INTERNAL_ERROR:
    return "internal error";
  }
  return "unknown status";
}

const char* qc_version(void) {
  return QUANTACAL_VERSION_STRING;
}

} // extern "C"
