# SPDX-License-Identifier: Apache-2.0
"""Error paths of the Python package: each error is the quantacal class of its
kind and keeps where and what (file, line, column, field, value; the index and
value of an out-of-range point). The cards here are illustrative (values only
need to be physical or deliberately not); the line and column figures are those
the C++ tests assert for the same text (tests/cards/test_card_errors.cc).
"""

import pickle

import numpy as np
import pytest

import quantacal
from conftest import material_path

# Illustrative card; line numbers below refer to this text.
GOOD = """name: test metal
description: illustrative card for error tests
molar_mass: "63.546 g/mol"
reference_density: "8960 kg/m^3"
valid_range: {from: "4 K", to: "300 K"}
heat_capacity:
  - kind: debye
    theta_D: "343 K"
  - kind: electronic
    gamma: "0.695 mJ/mol/K^2"
conductivity:
  kind: table
  columns: ["K", "W/m/K"]
  rows: [[4, 642], [20, 2423], [77, 547], [300, 396]]
sources:
  - {for: [molar_mass, reference_density, heat_capacity, conductivity], cite: "illustrative"}
"""


def bad(old, new):
    assert old in GOOD
    return GOOD.replace(old, new, 1)


def test_the_good_card_loads():
    m = quantacal.load_card_text(GOOD, "good.yaml")
    assert m.name == "test metal" and m.file == "good.yaml"
    assert m.valid_range == (4.0, 300.0)


def test_missing_file():
    with pytest.raises(quantacal.InputError) as caught:
        quantacal.load_card("no-such-card.yaml")
    e = caught.value
    assert str(e) == "no-such-card.yaml: cannot open the card file"
    assert (e.file, e.line, e.column) == ("no-such-card.yaml", 0, 0)
    assert isinstance(e, ValueError) and isinstance(e, quantacal.Error)


def test_yaml_syntax_error_is_located():
    with pytest.raises(quantacal.InputError) as caught:
        quantacal.load_card_text(bad("[[4, 642]", "[[4, 642"), "bad.yaml")
    e = caught.value
    assert (e.file, e.line) == ("bad.yaml", 15)
    assert e.column > 0
    assert str(e).startswith("bad.yaml:15:")
    assert "YAML syntax error" in e.expected


def test_non_physical_value_keeps_file_line_column_field_and_value():
    with pytest.raises(quantacal.InputError) as caught:
        quantacal.load_card_text(bad('"343 K"', '"-343 K"'), "bad.yaml")
    e = caught.value
    assert str(e) == 'bad.yaml:8:14: heat_capacity[0].theta_D = "-343 K": expected a temperature > 0 K'
    assert (e.file, e.line, e.column) == ("bad.yaml", 8, 14)
    assert (e.field, e.value) == ("heat_capacity[0].theta_D", "-343 K")
    assert e.expected == "expected a temperature > 0 K"


def test_misspelt_key_from_a_file_on_disk(tmp_path):
    path = tmp_path / "bad.yaml"
    path.write_text(bad("theta_D:", "theta_d:"))
    with pytest.raises(quantacal.InputError) as caught:
        quantacal.load_card(path)  # an os.PathLike works as a path
    e = caught.value
    assert (e.file, e.line, e.column) == (str(path), 8, 5)
    assert e.field == "heat_capacity[0].theta_d"
    assert "did you mean 'theta_D'?" in str(e)


def test_errors_survive_pickling():
    with pytest.raises(quantacal.InputError) as caught:
        quantacal.load_card_text(bad('"343 K"', '"-343 K"'), "bad.yaml")
    copy = pickle.loads(pickle.dumps(caught.value))
    assert type(copy) is quantacal.InputError and str(copy) == str(caught.value)
    assert (copy.line, copy.column, copy.field) == (8, 14, "heat_capacity[0].theta_D")


def test_a_card_whose_table_cannot_meet_its_tolerance_is_located_at_its_range():
    # a latent heat smeared over 1 mK with a table tolerance of 1e-13: past the
    # table's 4 MiB memory cap, reported as the card's error at its valid_range
    # (docs/reliability.md, finding 8)
    text = bad('valid_range: {from: "4 K", to: "300 K"}\n',
               'valid_range: {from: "4 K", to: "300 K"}\ntable_tolerance: 1e-13\n')
    text = text.replace("conductivity:\n", '  - kind: transition\n    temperature: "100 K"\n'
                        '    latent_heat: "13 kJ/mol"\n    width: "0.001 K"\nconductivity:\n', 1)
    with pytest.raises(quantacal.InputError) as caught:
        quantacal.load_card_text(text, "tight.yaml")
    assert caught.value.field == "valid_range"
    assert caught.value.line == text.splitlines().index(
        'valid_range: {from: "4 K", to: "300 K"}') + 1
    assert "max_bytes" in str(caught.value)
    assert "quantacal::PropertyTable::build" in str(caught.value)


def test_temperature_outside_the_valid_range_names_the_point(copper):
    t = np.full((2, 3), 300.0)
    t[1, 2] = 2000.0
    t[1, 0] = 3000.0  # the first in C order is reported
    with pytest.raises(quantacal.RangeError) as caught:
        copper.evaluate(t)
    e = caught.value
    assert e.index == (1, 0) and e.value == 3000.0
    assert e.condition == "4 K <= T <= 1500 K"
    assert e.subject == copper.name
    assert str(e).startswith("temperatures[1, 0] = 3000 K: quantacal::Material::thermal: ")
    assert str(e).endswith("requires 4 K <= T <= 1500 K but got 3000 K")
    assert isinstance(e, ValueError)


@pytest.mark.parametrize("value", [2.0, float("nan"), float("inf"), -300.0])
def test_below_range_nan_and_inf_are_refused(copper, value):
    with pytest.raises(quantacal.RangeError) as caught:
        copper.conductivity([300.0, value])
    assert caught.value.index == (1,)
    assert str(caught.value).startswith("temperatures[1] = ")
    with pytest.raises(quantacal.RangeError) as caught:
        copper.capacity(value)
    assert caught.value.index == ()


def test_energy_outside_the_range_of_energies(copper):
    top = copper.energy(1500.0)
    with pytest.raises(quantacal.RangeError) as caught:
        copper.temperature_from_energy([copper.energy(300.0), 2 * top])
    assert caught.value.index == (1,)
    assert str(caught.value).startswith("energies[1] = ")
    assert " J/kg: " in str(caught.value)
    with pytest.raises(quantacal.RangeError):
        copper.density(1e4)


@pytest.mark.parametrize("temperatures, dtype", [
    (np.array([300 + 1j]), "complex128"),
    (["300 K"], "<U5"),
    (np.array([True, False]), "bool"),
    (np.array([300.0, None], dtype=object), "object"),
])
def test_wrong_dtypes_are_refused_clearly(copper, temperatures, dtype):
    with pytest.raises(TypeError) as caught:
        copper.evaluate(temperatures)
    assert str(caught.value) == ("Material.evaluate: temperatures: expected real numbers "
                                 f"(a float or integer dtype), got dtype {dtype}")


def test_ragged_input_is_refused(copper):
    with pytest.raises(TypeError) as caught:
        copper.capacity([[300.0, 400.0], [500.0]])
    assert "temperatures" in str(caught.value)


def test_bad_basis_and_properties(copper):
    with pytest.raises(quantacal.InputError) as caught:
        copper.capacity(300.0, basis="maas")
    e = caught.value
    assert (e.field, e.value, e.file, e.line) == ("basis", "maas", "", 0)
    assert str(e) == ("Material.capacity: basis = maas: expected 'mass', 'mole' or "
                      "'volume' (did you mean 'mass'?)")
    with pytest.raises(quantacal.InputError, match=r"basis = 3: expected"):
        copper.energy(300.0, basis=3)
    with pytest.raises(TypeError, match="basis"):
        copper.energy(300.0, basis=True)
    with pytest.raises(quantacal.InputError, match=r"did you mean 'capacity'\?"):
        copper.evaluate(300.0, "capacty")
    for flags in [0, 32, -1]:
        with pytest.raises(quantacal.InputError, match=r"properties = -?\d+: expected a non-zero OR"):
            copper.evaluate(300.0, flags)
    with pytest.raises(quantacal.InputError, match="at least one property"):
        copper.evaluate(300.0, [])
    with pytest.raises(TypeError, match="properties"):
        copper.evaluate(300.0, 2.0)


def test_equilibrium_arguments(copper, aluminium):
    with pytest.raises(quantacal.InputError) as caught:
        quantacal.equilibrium([(copper, 1.0, 300.0), (aluminium, 1.0)])
    assert caught.value.field == "bodies[1]"
    assert "(material, mass in kg, initial temperature in K[, label])" in str(caught.value)
    with pytest.raises(TypeError, match=r"bodies\[0\]\[0\]: expected a quantacal.Material"):
        quantacal.equilibrium([(material_path("copper.yaml"), 1.0, 300.0), (copper, 1.0, 400.0)])
    with pytest.raises(TypeError, match=r"bodies\[1\]\[1\]: expected a number"):
        quantacal.equilibrium([(copper, 1.0, 300.0), (copper, "1 kg", 400.0)])
    with pytest.raises(quantacal.InputError):  # fewer than two bodies (the C++ check)
        quantacal.equilibrium([(copper, 1.0, 300.0)])
    with pytest.raises(quantacal.InputError):  # a mass that is not > 0 (the C++ check)
        quantacal.equilibrium([(copper, 1.0, 300.0), (copper, -1.0, 400.0)])
    with pytest.raises(quantacal.RangeError):  # a start outside the valid range
        quantacal.equilibrium([(copper, 1.0, 300.0), (aluminium, 1.0, 1200.0)])
    with pytest.raises(TypeError):
        quantacal.equilibrium("copper")


def test_materials_come_from_cards_only():
    with pytest.raises(TypeError):
        quantacal.Material()
