# SPDX-License-Identifier: Apache-2.0
"""The bundled cards through the Python package against published values: the
same sources and tolerances as the C++ card tests (tests/cards), each named on
the line of its check; "from memory" where those tests mark a value so; "fit
check" where the card was built on the value. Evaluated the numpy way: one
array call per quantity.
"""

import numpy as np
import pytest

from conftest import data_path

# NIST Chemistry WebBook Shomate fits of NIST-JANAF (Chase, J. Phys. Chem. Ref.
# Data Monograph 9, 1998), copper solid 298-1358 K: A..F (kJ/mol, t = T/1000 K).
CU_SOLID_SHOMATE = (17.72891, 28.09870, -31.25289, 13.97243, 0.068611, -6.056591)


def shomate_capacity(t, a, b, c, d, e, f):
    """C_p = A + B t + C t^2 + D t^3 + E/t^2, J/mol/K (NIST WebBook form)."""
    t = np.asarray(t) / 1000.0
    return a + b * t + c * t**2 + d * t**3 + e / t**2


def shomate_enthalpy(t, a, b, c, d, e, f):
    """H - H(298.15 K) = A t + B t^2/2 + C t^3/3 + D t^4/4 - E/t + F, J/mol."""
    t = np.asarray(t) / 1000.0
    return 1000.0 * (a * t + b * t**2 / 2 + c * t**3 / 3 + d * t**4 / 4 - e / t + f)


def deviation(model, reference):
    return np.asarray(model) / np.asarray(reference) - 1.0


def test_specific_heat_at_room_temperature_against_the_crc_handbook(aluminium, copper):
    # c_p(298.15 K), J/mol/K, within 3 % (a model limit)
    assert deviation(aluminium.capacity(298.15, basis="mole"), 24.200) == pytest.approx(0, abs=0.03)  # CRC Handbook of Chemistry and Physics (verified)
    assert deviation(copper.capacity(298.15, basis="mole"), 24.440) == pytest.approx(0, abs=0.03)  # CRC Handbook of Chemistry and Physics (from memory)
    # per kilogram, J/kg/K, within 3 %
    assert deviation(aluminium.capacity(298.15), 897.0) == pytest.approx(0, abs=0.03)  # CRC Handbook, 97th ed., mass-specific c_p
    assert deviation(copper.capacity(298.15), 385.0) == pytest.approx(0, abs=0.03)  # CRC Handbook, 97th ed., mass-specific c_p


def test_enthalpy_increment_against_codata(aluminium, copper):
    # H(298.15 K) - H(0), J/mol, within 5 % (a model limit); the cards' energy is
    # relative to 0 K
    assert deviation(copper.energy(298.15, basis="mole"), 5004.0) == pytest.approx(0, abs=0.05)  # CODATA Key Values, Cox, Wagman and Medvedev 1989 (from memory)
    assert deviation(aluminium.energy(298.15, basis="mole"), 4540.0) == pytest.approx(0, abs=0.05)  # CODATA Key Values, Cox, Wagman and Medvedev 1989 (verified)


def test_copper_cryogenic_fit_check(copper):
    # FIT CHECK: the copper lattice model was fitted to the NIST OFHC correlation
    # (Marquardt, Le and Radebaugh 2000); 10 % at 4 K, 5 % above (its stated error)
    t = np.array([4.0, 20.0, 77.0, 300.0])
    reference = np.array([0.0994, 7.51, 196.0, 389.0])  # Marquardt, Le and Radebaugh 2000, computed (from memory)
    d = deviation(copper.capacity(t), reference)
    print("copper c_p vs NIST OFHC (fit check):", np.round(100 * d, 2), "%")
    assert np.all(np.abs(d) <= np.where(t < 10, 0.10, 0.05))
    # the whole correlation, 20 K to 300 K, one array call
    coefficients = np.loadtxt(data_path("copper_ofhc_cp_nist.txt"))  # Marquardt, Le and Radebaugh 2000 (coefficients from memory)
    dense = np.geomspace(20.0, 300.0, 401)
    nist = 10.0 ** np.polynomial.polynomial.polyval(np.log10(dense), coefficients)
    worst = np.max(np.abs(deviation(copper.capacity(dense), nist)))
    print(f"copper vs NIST correlation 20-300 K (fit check): worst {100 * worst:.2f} %")
    assert worst < 0.05


def test_copper_against_nist_janaf(copper):
    # validation (the card carries the SGTE assessment, not JANAF): c_p 3 % to 1000 K
    t = np.array([298.15, 400.0, 500.0, 600.0, 800.0, 1000.0])
    d = deviation(copper.capacity(t, basis="mole"), shomate_capacity(t, *CU_SOLID_SHOMATE))  # Chase 1998 (NIST-JANAF), NIST WebBook Shomate fit
    print("copper c_p vs JANAF:", np.round(100 * d, 2), "%")
    assert np.all(np.abs(d) < 0.03)
    # H(T) - H(298.15 K), 2 %
    t = np.array([500.0, 800.0, 1200.0])
    model = copper.energy(t, basis="mole") - copper.energy(298.15, basis="mole")
    d = deviation(model, shomate_enthalpy(t, *CU_SOLID_SHOMATE))  # Chase 1998 (NIST-JANAF), NIST WebBook Shomate fit
    print("copper H - H(298.15 K) vs JANAF:", np.round(100 * d, 2), "%")
    assert np.all(np.abs(d) < 0.02)


def test_copper_conductivity_at_room_temperature(copper):
    # commercial copper at 20 degC, 1 % (OFHC RRR 100 is within 1 % of it)
    assert deviation(copper.conductivity(293.15), 394.0) == pytest.approx(0, abs=0.01)  # Copper Development Association (verified)


def test_aluminium_latent_heat_fit_check(aluminium):
    # FIT CHECK: the card states 10.71 kJ/mol; the energy gained from 900 K to 960 K
    # less the sensible part (trapezoid of c_p at the ends) gives it back to 1 %
    e = aluminium.energy(np.array([900.0, 960.0]), basis="mole")
    c = aluminium.capacity(np.array([900.0, 960.0]), basis="mole")
    latent = (e[1] - e[0]) - 0.5 * (c[0] + c[1]) * 60.0
    assert deviation(latent, 10710.0) == pytest.approx(0, abs=0.01)  # CRC Handbook of Chemistry and Physics (verified)
