# SPDX-License-Identifier: Apache-2.0
"""Fixtures of the Python tests: where the cards are, and the C++ API's answers.

ctest sets PYTHONPATH to <build>/python, QUANTACAL_SOURCE_DIR and
QUANTACAL_CXX_REFERENCE (the program tests/python/cxx_reference.cc); run by hand:

    PYTHONPATH=build/python QUANTACAL_CXX_REFERENCE=build/tests/python/python_cxx_reference \
        /usr/bin/python3 -m pytest tests/python
"""

import os
import subprocess
from pathlib import Path

import pytest

SOURCE_DIR = Path(os.environ.get("QUANTACAL_SOURCE_DIR", Path(__file__).resolve().parents[2]))


def material_path(name):
    """Path of a bundled card, materials/<name>."""
    return str(SOURCE_DIR / "materials" / name)


def data_path(name):
    """Path of a reference data file, tests/data/<name>."""
    return str(SOURCE_DIR / "tests" / "data" / name)


@pytest.fixture(scope="session")
def cxx():
    """Runs the C++ reference program; returns its output lines, each split into words."""
    program = os.environ.get("QUANTACAL_CXX_REFERENCE")
    if not program:
        pytest.skip("QUANTACAL_CXX_REFERENCE is not set (ctest sets it)")

    def run(*args):
        done = subprocess.run([program, *map(str, args)], capture_output=True, text=True,
                              check=False)
        assert done.returncode == 0, done.stderr
        return [line.split() for line in done.stdout.splitlines()]

    return run


@pytest.fixture(scope="session")
def copper():
    import quantacal
    return quantacal.load_card(material_path("copper.yaml"))


@pytest.fixture(scope="session")
def aluminium():
    import quantacal
    return quantacal.load_card(material_path("aluminium.yaml"))
