# SPDX-License-Identifier: Apache-2.0
"""Plain result types and enumerations of the Python interface (no logic).

The values of Basis and Property are those of the C interface
(include/quantacal/c/quantacal.h: qc_basis and qc_property_flag).
"""

import enum
from dataclasses import dataclass, field
from typing import List, NamedTuple, Optional

import numpy as np

__all__ = [
    "Basis",
    "Property",
    "Properties",
    "Body",
    "TableStatistics",
    "TransitionPassage",
    "EquilibriumResult",
]


class Basis(enum.IntEnum):
    """Per what quantity energies and capacities are expressed."""

    MASS = 0  #: J/kg, J/kg/K, J/kg/K^2
    MOLE = 1  #: J/mol, J/mol/K, J/mol/K^2
    VOLUME = 2  #: J/m^3, J/m^3/K, J/m^3/K^2 of the reference configuration


class Property(enum.IntFlag):
    """What Material.evaluate computes (an OR of these)."""

    ENERGY = 1  #: e(T) relative to the card's reference temperature
    CAPACITY = 2  #: c_p = de/dT
    CAPACITY_DERIVATIVE = 4  #: dc_p/dT
    CONDUCTIVITY = 8  #: k, W/m/K
    CONDUCTIVITY_DERIVATIVE = 16  #: dk/dT, W/m/K^2
    THERMAL = 7  #: the first three
    CONDUCTION = 24  #: k and dk/dT
    ALL = 31  #: all five


class Properties(NamedTuple):
    """What Material.evaluate returns: arrays shaped like the temperatures
    (floats for a scalar), None for what was not asked for. SI units on the
    basis of the call (k is per metre always)."""

    energy: Optional[np.ndarray]
    capacity: Optional[np.ndarray]
    capacity_derivative: Optional[np.ndarray]
    conductivity: Optional[np.ndarray]
    conductivity_derivative: Optional[np.ndarray]


class Body(NamedTuple):
    """One body of quantacal.equilibrium (a plain tuple works as well)."""

    material: object  #: a quantacal.Material
    mass: float  #: kg, > 0
    initial_temperature: float  #: K, inside the material's valid range
    label: str = ""  #: how messages name the body ("" = its number)


@dataclass(frozen=True)
class TableStatistics:
    """What the build of a cached table measured (C++ quantacal::TableStatistics)."""

    n_segments: int  #: polynomial segments
    bytes: int  #: memory held by the table
    worst_error: float  #: worst relative error of c_p (of k for a conductivity table)
    worst_temperature: float  #: K, where worst_error was found
    n_checked: int  #: independent sample points checked
    worst_energy_error: float  #: worst relative error of e (0 for conductivity)
    n_cells: int  #: lookup cells
    n_evaluations: int  #: exact-model evaluations spent by the build


@dataclass(frozen=True)
class TransitionPassage:
    """A latent-heat transition of a body's material and where the body stands in it."""

    temperature: float  #: K, centre of the transition
    latent_heat: float  #: J/kg
    fraction: float  #: share of the high-temperature phase at T_f
    crossed: bool  #: the transition lies between the start and T_f
    ends_inside: bool  #: T_f lies inside the smeared transition


@dataclass(frozen=True)
class EquilibriumResult:
    """The result of quantacal.equilibrium."""

    temperature: float  #: T_f, K
    heat: np.ndarray  #: J per body: + taken, - given
    heat_sum: float  #: J, sum of the heats (round-off only)
    relative_imbalance: float  #: |heat_sum| / largest |heat|
    iterations: int  #: root-finder iterations
    transitions: List[List[TransitionPassage]] = field(default_factory=list)

for _cls in (Basis, Property, Properties, Body, TableStatistics, TransitionPassage,
             EquilibriumResult):
    _cls.__module__ = "quantacal"  # as users name them: quantacal.Basis
