// SPDX-License-Identifier: Apache-2.0
// Conversion of the Python extension's arguments (python_arguments.h).
#include "python_arguments.h"

#include <quantacal/common/exceptions.h>
#include <quantacal/common/text.h>

#include <utility>

namespace quantacal::python {

std::string type_name(py::handle o) {
  return py::str(py::type::handle_of(o).attr("__name__"));
}

/// Basis from "mass" / "mole" / "volume", a quantacal.Basis or 0, 1, 2.
Basis to_basis(py::handle basis, const std::string& function) {
  static const std::vector<std::string> names = {"mass", "mole", "volume"};
  if (py::isinstance<py::str>(basis)) {
    const std::string s = basis.cast<std::string>();
    for (std::size_t i = 0; i < names.size(); ++i)
      if (s == names[i])
        return static_cast<Basis>(i);
    throw InputError::argument(function, "basis", s,
                               "'mass', 'mole' or 'volume'" +
                                   quantacal::did_you_mean(s, names));
  }
  if (py::isinstance<py::int_>(basis) && !py::isinstance<py::bool_>(basis)) {
    int overflow = 0;
    const long v = PyLong_AsLongAndOverflow(basis.ptr(), &overflow);
    switch (overflow == 0 ? v : -1) {
    case 0:
      return Basis::mass;
    case 1:
      return Basis::mole;
    case 2:
      return Basis::volume;
    default:
      throw InputError::argument(function, "basis", py::str(basis),
                                 "quantacal.Basis.MASS (0), MOLE (1) or VOLUME (2)");
    }
  }
  throw py::type_error(function +
                       ": basis: expected 'mass', 'mole', 'volume' or a "
                       "quantacal.Basis, got a " +
                       type_name(basis));
}

unsigned flag_of(py::handle item, const std::string& function) {
  static const std::vector<std::pair<std::string, unsigned>> table = {
      {"energy", kEnergy},
      {"capacity", kCapacity},
      {"capacity_derivative", kCapacityDerivative},
      {"conductivity", kConductivity},
      {"conductivity_derivative", kConductivityDerivative},
      {"thermal", kThermal},
      {"conduction", kConduction},
      {"all", kAll}};
  if (py::isinstance<py::str>(item)) {
    const std::string s = item.cast<std::string>();
    std::vector<std::string> names;
    for (const auto& [name, bits] : table) {
      if (s == name)
        return bits;
      names.push_back(name);
    }
    std::string list;
    for (const auto& n : names)
      list += (list.empty() ? "" : ", ") + n;
    throw InputError::argument(function, "properties", s,
                               "one of " + list + quantacal::did_you_mean(s, names));
  }
  if (py::isinstance<py::int_>(item) && !py::isinstance<py::bool_>(item)) {
    int overflow = 0;
    const long v = PyLong_AsLongAndOverflow(item.ptr(), &overflow);
    if (overflow == 0 && v >= 1 && v <= static_cast<long>(kAll))
      return static_cast<unsigned>(v);
    throw InputError::argument(function, "properties", py::str(item),
                               "a non-zero OR of quantacal.Property flags (1 to 31)");
  }
  throw py::type_error(function +
                       ": properties: expected a quantacal.Property, a name such as "
                       "'capacity', or a list of them, got a " +
                       type_name(item));
}

/// Flags from a quantacal.Property (or int), a name, or an iterable of them.
unsigned to_flags(py::handle what, const std::string& function) {
  if (py::isinstance<py::str>(what) || py::isinstance<py::int_>(what))
    return flag_of(what, function);
  if (!py::isinstance<py::iterable>(what))
    return flag_of(what, function); // raises the TypeError
  unsigned flags = 0;
  for (py::handle item : what)
    flags |= flag_of(item, function);
  if (flags == 0)
    throw InputError::argument(function, "properties", "[]", "at least one property");
  return flags;
}

Points to_points(py::handle obj, const std::string& function, const char* name) {
  py::array a = py::array::ensure(obj);
  if (!a)
    throw py::type_error(function + ": " + name +
                         ": expected a number or an array of numbers, got a " +
                         type_name(obj) + " numpy cannot convert");
  const char kind = a.dtype().kind();
  if (kind != 'f' && kind != 'i' && kind != 'u')
    throw py::type_error(
        function + ": " + name +
        ": expected real numbers (a float or integer dtype), got dtype " +
        std::string(py::str(a.dtype())));
  Points p;
  p.array = py::array_t<double, py::array::c_style | py::array::forcecast>::ensure(a);
  if (!p.array)
    throw py::error_already_set();
  p.shape.assign(a.shape(), a.shape() + a.ndim());
  p.scalar = a.ndim() == 0;
  return p;
}

py::object shaped(py::array_t<double>& out, const Points& p) {
  if (p.scalar)
    return py::float_(*out.data());
  return std::move(out);
}

} // namespace quantacal::python
