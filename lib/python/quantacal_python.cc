// SPDX-License-Identifier: Apache-2.0
// The Python extension quantacal._quantacal (pybind11) over the core: a Material
// handle that owns a shared quantacal::Material, batch evaluation of numpy arrays of
// any shape (one call into the C++ batch API over the flattened, contiguous array,
// with the GIL released), the inverse T(e), equilibrium of bodies in contact, table
// statistics, and the C++ exceptions raised as the Python classes of
// quantacal/_errors.py with their context. docs/api-python.md describes the package.
#include "python_arguments.h"

#include <quantacal/cards/card.h>
#include <quantacal/common/exceptions.h>
#include <quantacal/common/format.h>
#include <quantacal/common/text.h>
#include <quantacal/material/equilibrium.h>
#include <quantacal/material/material.h>
#include <quantacal/version.h>

#include <pybind11/numpy.h>
#include <pybind11/pybind11.h>

#include <array>
#include <cstddef>
#include <functional>
#include <string>
#include <utility>
#include <vector>

namespace py = pybind11;

namespace {

using namespace quantacal::python;
using quantacal::Basis;
using quantacal::InputError;
using quantacal::Material;
using quantacal::MaterialPtr;
using quantacal::RangeError;

/// What Python holds: a shared, immutable material whose tables are built.
struct PyMaterial {
  MaterialPtr material;
};

/// The Python classes of quantacal._errors and quantacal._types, looked up at import
/// (references kept for the life of the process).
struct PythonTypes {
  py::handle input_error, range_error, numerical_error;
  py::handle properties, table_statistics, transition_passage, equilibrium_result;
};

PythonTypes& python_types() {
  static PythonTypes types;
  return types;
}

/// A str from UTF-8 text; invalid bytes (a file name in another encoding) replaced.
py::str text(const std::string& s) {
  PyObject* o =
      PyUnicode_DecodeUTF8(s.data(), static_cast<Py_ssize_t>(s.size()), "replace");
  if (!o)
    throw py::error_already_set();
  return py::reinterpret_steal<py::str>(o);
}

/// Sets @p instance as the pending Python exception of class @p cls.
void set_error(py::handle cls, const py::object& instance) {
  PyErr_SetObject(cls.ptr(), instance.ptr());
}

py::object input_error(const InputError& e) {
  return python_types().input_error(
      text(e.what()), py::arg("file") = text(e.file()), py::arg("line") = e.line(),
      py::arg("column") = e.column(), py::arg("field") = text(e.field()),
      py::arg("value") = text(e.value()), py::arg("expected") = text(e.expected()));
}

py::object range_error(const std::string& message, const RangeError& e,
                       const py::object& index) {
  return python_types().range_error(
      text(message), py::arg("function") = text(e.function()),
      py::arg("subject") = text(e.subject()), py::arg("condition") = text(e.condition()),
      py::arg("value") = e.value(), py::arg("index") = index);
}

/// The exceptions of the core as the Python classes, context kept; others as
/// pybind11 maps them (std::bad_alloc: MemoryError, std::exception: RuntimeError).
void translate(std::exception_ptr p) {
  try {
    if (p)
      std::rethrow_exception(p);
  } catch (const InputError& e) {
    try {
      set_error(python_types().input_error, input_error(e));
    } catch (py::error_already_set& failed) {
      failed.restore();
    }
  } catch (const RangeError& e) {
    try {
      set_error(python_types().range_error, range_error(e.what(), e, py::none()));
    } catch (py::error_already_set& failed) {
      failed.restore();
    }
  } catch (const quantacal::NumericalError& e) {
    try {
      set_error(python_types().numerical_error,
                python_types().numerical_error(text(e.what()),
                                               py::arg("function") = text(e.function())));
    } catch (py::error_already_set& failed) {
      failed.restore();
    }
  }
}

/// Index of the first value outside the material's valid range (NaN included), or n.
std::size_t first_outside(const Material& m, const double* t, std::size_t n) {
  for (std::size_t i = 0; i < n; ++i)
    if (!(t[i] >= m.lower_temperature() && t[i] <= m.upper_temperature()))
      return i;
  return n;
}

/// Raises quantacal.RangeError naming where in the array argument the point is:
/// "temperatures[2, 1] = 2000 K: <the C++ message>", index (2, 1).
[[noreturn]] void raise_range_at(const RangeError& e, const Points& p, std::size_t flat,
                                 const char* name, const std::string& unit) {
  if (flat >= p.size()) {
    set_error(python_types().range_error, range_error(e.what(), e, py::none()));
    throw py::error_already_set();
  }
  std::vector<py::ssize_t> index(p.shape.size());
  std::size_t rest = flat;
  for (std::size_t k = index.size(); k-- > 0;) {
    index[k] = static_cast<py::ssize_t>(rest % static_cast<std::size_t>(p.shape[k]));
    rest /= static_cast<std::size_t>(p.shape[k]);
  }
  std::string where = name;
  if (!index.empty()) {
    where += "[";
    for (std::size_t k = 0; k < index.size(); ++k)
      where += (k ? ", " : "") + std::to_string(index[k]);
    where += "]";
  }
  where += " = " + quantacal::format_double(p.data()[flat]) + " " + unit + ": ";
  py::tuple t(index.size());
  for (std::size_t k = 0; k < index.size(); ++k)
    t[k] = py::int_(index[k]);
  set_error(python_types().range_error, range_error(where + e.what(), e, t));
  throw py::error_already_set();
}

const char* energy_unit(Basis b) {
  switch (b) {
  case Basis::mass:
    return "J/kg";
  case Basis::mole:
    return "J/mol";
  case Basis::volume:
    return "J/m^3";
  }
  return "";
}

/// The five outputs of one evaluation, each an array shaped like the input (or None).
using Outputs = std::array<py::object, 5>;

/**
 * The batch evaluation: one call of Material::thermal and one of
 * Material::conductivity over the flattened contiguous array, the GIL released
 * (exact: the exact model point by point, also without the GIL).
 */
Outputs compute(const PyMaterial& self, py::handle temperatures, unsigned flags,
                py::handle basis, bool exact, const std::string& function) {
  const Basis b = to_basis(basis, function);
  const Points p = to_points(temperatures, function, "temperatures");
  const std::size_t n = p.size();
  std::array<py::array_t<double>, 5> arrays;
  std::array<double*, 5> out{};
  for (unsigned k = 0; k < 5; ++k)
    if (flags & (1u << k)) {
      arrays[k] = py::array_t<double>(p.shape);
      out[k] = arrays[k].mutable_data();
    }
  const Material& m = *self.material;
  const double* t = p.data();
  try {
    py::gil_scoped_release unlocked;
    if (n > 0 && !exact) {
      if (flags & kThermal)
        m.thermal(t, n, b, out[0], out[1], out[2]);
      if (flags & kConduction)
        m.conductivity(t, n, out[3], out[4]);
    } else {
      for (std::size_t i = 0; i < n; ++i) {
        if (flags & kThermal) {
          const quantacal::ThermalState s = m.thermal_exact(t[i], b);
          for (auto [k, v] : {std::pair{0, s.energy}, std::pair{1, s.capacity},
                              std::pair{2, s.capacity_derivative}})
            if (out[k])
              out[k][i] = v;
        }
        if (flags & kConduction) {
          const quantacal::ConductivityValue c = m.conductivity_exact(t[i]);
          if (out[3])
            out[3][i] = c.value;
          if (out[4])
            out[4][i] = c.derivative;
        }
      }
    }
  } catch (const RangeError& e) {
    raise_range_at(e, p, first_outside(m, t, n), "temperatures", "K");
  }
  Outputs result;
  for (unsigned k = 0; k < 5; ++k)
    result[k] = (flags & (1u << k)) ? shaped(arrays[k], p) : py::none();
  return result;
}

/// Runs @p per_point over the points without the GIL; a RangeError names the point.
py::object pointwise(const PyMaterial& self, py::handle values, const char* name,
                     const std::string& unit, const std::string& function,
                     const std::function<double(const Material&, double)>& per_point) {
  const Points p = to_points(values, function, name);
  py::array_t<double> out(p.shape);
  double* o = out.mutable_data();
  const double* v = p.data();
  const std::size_t n = p.size();
  std::size_t i = 0;
  try {
    py::gil_scoped_release unlocked;
    for (; i < n; ++i)
      o[i] = per_point(*self.material, v[i]);
  } catch (const RangeError& e) {
    raise_range_at(e, p, i, name, unit);
  }
  return shaped(out, p);
}

/// Loads through @p load and builds both tables, without the GIL.
PyMaterial load_with(const std::function<MaterialPtr()>& load) {
  MaterialPtr m;
  {
    py::gil_scoped_release unlocked;
    m = load();
    m->table();
    m->conductivity_table();
  }
  return PyMaterial{std::move(m)};
}

py::object statistics(const quantacal::TableStatistics& s) {
  return python_types().table_statistics(
      py::arg("n_segments") = s.n_segments, py::arg("bytes") = s.bytes,
      py::arg("worst_error") = s.worst_error,
      py::arg("worst_temperature") = s.worst_temperature,
      py::arg("n_checked") = s.n_checked,
      py::arg("worst_energy_error") = s.worst_energy_error,
      py::arg("n_cells") = s.n_cells, py::arg("n_evaluations") = s.n_evaluations);
}

py::object solve(py::handle bodies, bool exact) {
  static const std::string function = "quantacal.equilibrium";
  if (py::isinstance<py::str>(bodies) || !py::isinstance<py::sequence>(bodies))
    throw py::type_error(function +
                         ": bodies: expected a list of (material, mass, initial "
                         "temperature[, label]), got a " +
                         type_name(bodies));
  std::vector<quantacal::Body> list;
  std::size_t i = 0;
  for (py::handle item : py::reinterpret_borrow<py::sequence>(bodies)) {
    const std::string field = "bodies[" + std::to_string(i++) + "]";
    const bool tuple_like =
        !py::isinstance<py::str>(item) && py::isinstance<py::sequence>(item);
    const std::size_t size = tuple_like ? py::len(item) : 0;
    if (size != 3 && size != 4)
      throw InputError::argument(function, field, py::repr(item),
                                 "(material, mass in kg, initial temperature in K"
                                 "[, label])");
    const auto body = py::reinterpret_borrow<py::sequence>(item);
    quantacal::Body b;
    try {
      b.material = body[0].cast<const PyMaterial&>().material;
    } catch (const py::cast_error&) {
      throw py::type_error(function + ": " + field +
                           "[0]: expected a quantacal.Material, got a " +
                           type_name(body[0]));
    }
    for (auto [k, target] :
         {std::pair{1, &b.mass}, std::pair{2, &b.initial_temperature}}) {
      try {
        *target = body[k].cast<double>();
      } catch (const py::cast_error&) {
        throw py::type_error(function + ": " + field + "[" + std::to_string(k) +
                             "]: expected a number, got a " + type_name(body[k]));
      }
    }
    if (size == 4)
      b.label = py::str(body[3]);
    list.push_back(std::move(b));
  }
  quantacal::EquilibriumResult r;
  {
    py::gil_scoped_release unlocked;
    r = quantacal::solve_equilibrium(list, exact ? quantacal::EnergySource::exact
                                                 : quantacal::EnergySource::table);
  }
  py::array_t<double> heat(static_cast<py::ssize_t>(r.heat.size()));
  std::copy(r.heat.begin(), r.heat.end(), heat.mutable_data());
  py::list transitions;
  for (const auto& per_body : r.transitions) {
    py::list passages;
    for (const quantacal::TransitionPassage& t : per_body)
      passages.append(python_types().transition_passage(
          py::arg("temperature") = t.temperature, py::arg("latent_heat") = t.latent_heat,
          py::arg("fraction") = t.fraction, py::arg("crossed") = t.crossed,
          py::arg("ends_inside") = t.ends_inside));
    transitions.append(passages);
  }
  return python_types().equilibrium_result(
      py::arg("temperature") = r.temperature, py::arg("heat") = heat,
      py::arg("heat_sum") = r.heat_sum,
      py::arg("relative_imbalance") = r.relative_imbalance,
      py::arg("iterations") = r.iterations, py::arg("transitions") = transitions);
}

const char* const kEvaluateDoc = R"doc(
Properties at temperatures of any shape, from the cached tables: one batch call
into the C++ library over the flattened array, without the GIL.

Parameters
----------
temperatures : float or array_like of real numbers, K, inside valid_range
    Any shape; strided arrays and other real dtypes are copied once to
    contiguous float64.
properties : quantacal.Property, str or list of str, default Property.ALL
    What to compute: an OR of Property flags, or names among 'energy',
    'capacity', 'capacity_derivative', 'conductivity',
    'conductivity_derivative', 'thermal', 'conduction', 'all'.
basis : 'mass', 'mole', 'volume' or quantacal.Basis, default 'mass'
    Of energy (J/kg, J/mol, J/m^3), c_p and dc_p/dT; k is per metre always.
exact : bool, default False
    Evaluate the exact model instead of the table (slow; for checks).

Returns
-------
quantacal.Properties
    energy, capacity, capacity_derivative, conductivity,
    conductivity_derivative: arrays shaped like temperatures (floats for a
    scalar), None for what was not asked for.

Raises
------
quantacal.RangeError
    A temperature outside valid_range or NaN; index is where the first one is.
quantacal.InputError
    An unknown property or basis (with "did you mean").
TypeError
    temperatures not real numbers (complex, str, bool, object).
)doc";

} // namespace

PYBIND11_MODULE(_quantacal, module) {
  module.doc() = "The C++ part of the quantacal package (import quantacal instead).";
  const py::module_ errors = py::module_::import("quantacal._errors");
  const py::module_ types = py::module_::import("quantacal._types");
  PythonTypes& t = python_types();
  t.input_error = py::object(errors.attr("InputError")).release();
  t.range_error = py::object(errors.attr("RangeError")).release();
  t.numerical_error = py::object(errors.attr("NumericalError")).release();
  t.properties = py::object(types.attr("Properties")).release();
  t.table_statistics = py::object(types.attr("TableStatistics")).release();
  t.transition_passage = py::object(types.attr("TransitionPassage")).release();
  t.equilibrium_result = py::object(types.attr("EquilibriumResult")).release();
  py::register_exception_translator(translate);

  py::class_<PyMaterial> material(module, "Material", R"doc(
A material loaded from a card: immutable, its tables built at load, safe to share
between threads. Made by quantacal.load_card or quantacal.load_card_text.
)doc");
  material.attr("__module__") = "quantacal";
  material
      .def_property_readonly(
          "name", [](const PyMaterial& s) { return text(s.material->name()); },
          "The card's name.")
      .def_property_readonly(
          "description",
          [](const PyMaterial& s) { return text(s.material->data().description); })
      .def_property_readonly(
          "file", [](const PyMaterial& s) { return text(s.material->data().file); },
          "The card's path ('' or the name given for a card from text).")
      .def_property_readonly(
          "molar_mass", [](const PyMaterial& s) { return s.material->molar_mass(); },
          "kg/mol, of the card's formula unit.")
      .def_property_readonly(
          "reference_density",
          [](const PyMaterial& s) { return s.material->reference_density(); },
          "kg/m^3: the density of the volume basis.")
      .def_property_readonly(
          "lower_temperature",
          [](const PyMaterial& s) { return s.material->lower_temperature(); }, "K")
      .def_property_readonly(
          "upper_temperature",
          [](const PyMaterial& s) { return s.material->upper_temperature(); }, "K")
      .def_property_readonly(
          "valid_range",
          [](const PyMaterial& s) {
            return py::make_tuple(s.material->lower_temperature(),
                                  s.material->upper_temperature());
          },
          "(lower, upper), K: every call accepts lower <= T <= upper.")
      .def_property_readonly(
          "reference_temperature",
          [](const PyMaterial& s) { return s.material->data().reference_temperature; },
          "K at which the stored energy is zero (0 = at 0 K).")
      .def_property_readonly(
          "sources",
          [](const PyMaterial& s) {
            py::list l;
            for (const quantacal::Source& src : s.material->data().sources)
              l.append(py::make_tuple(text(src.parameter), text(src.citation)));
            return l;
          },
          "The card's sources: a list of (parameter, citation).")
      .def_property_readonly(
          "phases",
          [](const PyMaterial& s) {
            py::list l;
            for (const quantacal::PhaseInfo& ph : s.material->data().phases)
              l.append(text(ph.name));
            return l;
          },
          "Names of the card's phases in order of temperature ([] for one phase).")
      .def_property_readonly(
          "table_statistics",
          [](const PyMaterial& s) {
            return statistics(s.material->table().statistics());
          },
          "quantacal.TableStatistics of the c_p / energy table (worst relative error "
          "of c_p on the build's independent check sample, segments, bytes, ...).")
      .def_property_readonly(
          "conductivity_table_statistics",
          [](const PyMaterial& s) {
            return statistics(s.material->conductivity_table().statistics());
          },
          "quantacal.TableStatistics of the conductivity table (worst_error of k).")
      .def(
          "evaluate",
          [](const PyMaterial& s, py::handle temperatures, py::handle properties,
             py::handle basis, bool exact) {
            const std::string f = "Material.evaluate";
            const Outputs o =
                compute(s, temperatures, to_flags(properties, f), basis, exact, f);
            return python_types().properties(o[0], o[1], o[2], o[3], o[4]);
          },
          kEvaluateDoc, py::arg("temperatures"), py::arg("properties") = kAll,
          py::kw_only(), py::arg("basis") = "mass", py::arg("exact") = false);

  // One-property shortcuts, each the same batch call with one flag.
  const struct {
    const char* name;
    unsigned flag;
    bool has_basis;
    const char* doc;
  } shortcuts[] = {
      {"energy", kEnergy, true,
       "Stored energy e(T) relative to the reference temperature: J/kg, J/mol or "
       "J/m^3 on basis. Shaped like temperatures."},
      {"capacity", kCapacity, true,
       "c_p = de/dT: J/kg/K, J/mol/K or J/m^3/K on basis. Shaped like temperatures."},
      {"capacity_derivative", kCapacityDerivative, true,
       "dc_p/dT per K^2 on basis. Shaped like temperatures."},
      {"conductivity", kConductivity, false, "k, W/m/K. Shaped like temperatures."},
      {"conductivity_derivative", kConductivityDerivative, false,
       "dk/dT, W/m/K^2. Shaped like temperatures."}};
  for (const auto& sc : shortcuts) {
    const unsigned flag = sc.flag;
    const std::string f = std::string("Material.") + sc.name;
    unsigned k = 0;
    while (!(flag & (1u << k)))
      ++k;
    if (sc.has_basis)
      material.def(
          sc.name,
          [flag, f, k](const PyMaterial& s, py::handle temperatures, py::handle basis,
                       bool exact) {
            return compute(s, temperatures, flag, basis, exact, f)[k];
          },
          sc.doc, py::arg("temperatures"), py::kw_only(), py::arg("basis") = "mass",
          py::arg("exact") = false);
    else
      material.def(
          sc.name,
          [flag, f, k](const PyMaterial& s, py::handle temperatures, bool exact) {
            return compute(s, temperatures, flag, py::str("mass"), exact, f)[k];
          },
          sc.doc, py::arg("temperatures"), py::kw_only(), py::arg("exact") = false);
  }

  material
      .def(
          "temperature_from_energy",
          [](const PyMaterial& s, py::handle energies, py::handle basis) {
            const std::string f = "Material.temperature_from_energy";
            const Basis b = to_basis(basis, f);
            return pointwise(s, energies, "energies", energy_unit(b), f,
                             [b](const Material& m, double e) {
                               return m.temperature_from_energy(e, b);
                             });
          },
          "The inverse of energy(): the temperatures (K) at which e(T) equals each "
          "energy, solved exactly on the same interpolant; shaped like energies. "
          "RangeError for an energy outside [e(lower), e(upper)].",
          py::arg("energies"), py::kw_only(), py::arg("basis") = "mass")
      .def(
          "density",
          [](const PyMaterial& s, py::handle temperatures) {
            return pointwise(s, temperatures, "temperatures", "K", "Material.density",
                             [](const Material& m, double t) { return m.density(t); });
          },
          "Density at temperatures, kg/m^3 (phases blended over their joins; the "
          "reference density for a one-phase card).",
          py::arg("temperatures"))
      .def("__repr__", [](const PyMaterial& s) {
        const Material& m = *s.material;
        std::string r = "<quantacal.Material '" + m.name() +
                        "': " + quantacal::format_double(m.lower_temperature()) +
                        " K to " + quantacal::format_double(m.upper_temperature()) + " K";
        if (!m.data().file.empty())
          r += ", from " + m.data().file;
        return text(r + ">");
      });

  module.def(
      "load_card",
      [](py::handle path) {
        const std::string p =
            py::module_::import("os").attr("fsdecode")(path).cast<std::string>();
        return load_with([&] { return quantacal::load_card(p); });
      },
      "Loads the YAML material card at path (str or os.PathLike) and builds its "
      "tables. Raises quantacal.InputError (file, line, column, field, value) for a "
      "missing, malformed or non-physical card.",
      py::arg("path"));
  module.def(
      "load_card_text",
      [](const std::string& yaml, const std::string& name) {
        return load_with([&] { return quantacal::load_card_from_string(yaml, name); });
      },
      "Loads a card from YAML text; name is what messages call it (and the folder "
      "composition paths are resolved from).",
      py::arg("text"), py::arg("name") = "<text>");
  module.def("equilibrium", &solve,
             "Common final temperature of bodies that exchange heat only with each "
             "other, latent heats included. bodies: a list of (material, mass kg, "
             "initial temperature K[, label]) or quantacal.Body. Returns "
             "quantacal.EquilibriumResult.",
             py::arg("bodies"), py::kw_only(), py::arg("exact") = false);
  module.attr("__version__") = QUANTACAL_VERSION_STRING;
}
