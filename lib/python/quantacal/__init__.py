# SPDX-License-Identifier: Apache-2.0
"""quantacal: specific heat, stored energy and conductivity of materials from
YAML material cards, served through cached energy-consistent tables.

    import numpy as np
    import quantacal

    al = quantacal.load_card("materials/aluminium.yaml")
    t = np.linspace(300.0, 800.0, 6)
    p = al.evaluate(t, basis="volume")           # e, c_p, dc_p/dT, k, dk/dT
    c = al.capacity(t)                           # J/kg/K
    back = al.temperature_from_energy(al.energy(t))  # == t

Each call on an array is one batch call into the C++ library (the GIL is
released while it runs); results have the shape of the input. Errors are
quantacal.InputError, RangeError and NumericalError (docs/api-python.md).
"""

from ._errors import Error, InputError, NumericalError, RangeError
from ._types import (
    Basis,
    Body,
    EquilibriumResult,
    Properties,
    Property,
    TableStatistics,
    TransitionPassage,
)
from ._quantacal import Material, equilibrium, load_card, load_card_text, __version__

ENERGY = Property.ENERGY
CAPACITY = Property.CAPACITY
CAPACITY_DERIVATIVE = Property.CAPACITY_DERIVATIVE
CONDUCTIVITY = Property.CONDUCTIVITY
CONDUCTIVITY_DERIVATIVE = Property.CONDUCTIVITY_DERIVATIVE
THERMAL = Property.THERMAL
CONDUCTION = Property.CONDUCTION
ALL = Property.ALL

__all__ = [
    "Material",
    "load_card",
    "load_card_text",
    "equilibrium",
    "Basis",
    "Property",
    "Properties",
    "Body",
    "TableStatistics",
    "TransitionPassage",
    "EquilibriumResult",
    "Error",
    "InputError",
    "RangeError",
    "NumericalError",
    "ENERGY",
    "CAPACITY",
    "CAPACITY_DERIVATIVE",
    "CONDUCTIVITY",
    "CONDUCTIVITY_DERIVATIVE",
    "THERMAL",
    "CONDUCTION",
    "ALL",
    "__version__",
]
