// SPDX-License-Identifier: Apache-2.0
// The Python extension's conversion of its arguments: a basis, the property flags
// and the temperature arrays from whatever Python passes, with the errors a
// misspelt name or a wrong type gets (quantacal_python.cc binds the calls).
#ifndef QUANTACAL_LIB_PYTHON_PYTHON_ARGUMENTS_H
#define QUANTACAL_LIB_PYTHON_PYTHON_ARGUMENTS_H

#include <quantacal/material/material.h>

#include <pybind11/numpy.h>
#include <pybind11/pybind11.h>

#include <cstddef>
#include <string>
#include <vector>

namespace quantacal::python {

namespace py = pybind11;

/// The property bits of the C interface (qc_property_flag).
constexpr unsigned kEnergy = 1, kCapacity = 2, kCapacityDerivative = 4, kConductivity = 8,
                   kConductivityDerivative = 16, kThermal = 7, kConduction = 24,
                   kAll = 31;

/** The name of an object's Python type, for error messages. */
std::string type_name(py::handle o);

/** Basis from "mass" / "mole" / "volume", a quantacal.Basis or 0, 1, 2. */
Basis to_basis(py::handle basis, const std::string& function);

/** One property bit from a quantacal.Property, an int or a name. */
unsigned flag_of(py::handle item, const std::string& function);

/** Flags from a quantacal.Property (or int), a name, or an iterable of them. */
unsigned to_flags(py::handle what, const std::string& function);

/// Numbers from Python as one C-contiguous float64 array (copied once if the input is
/// another dtype, strided or not an array), with the shape to give the results.
struct Points {
  py::array_t<double, py::array::c_style> array;
  std::vector<py::ssize_t> shape;
  bool scalar = false;
  std::size_t size() const { return static_cast<std::size_t>(array.size()); }
  const double* data() const { return array.data(); }
};

/** The argument @p obj (named @p name in errors) as Points. */
Points to_points(py::handle obj, const std::string& function, const char* name);

/** A float for a scalar input, else the array with the input's shape. */
py::object shaped(py::array_t<double>& out, const Points& p);

} // namespace quantacal::python

#endif
