#!/usr/bin/env python3
# SPDX-License-Identifier: Apache-2.0
"""Lists every unit string the project reads, for compare_udunits.cc.

Collects the units of the quoted quantities ("343 K", "0.695 mJ/mol/K^2") and
of the `columns:` unit lists in materials/*.yaml and examples/**/case.yaml, and
the quantity literals of the unit tests (tests/cards/test_units.cc,
tests/cli/*units*). Prints one line per distinct unit: the unit, a tab, where it
was found first, a tab, how many times it occurs.

usage: python3 tests/benchmarks/units/unit_strings.py [SOURCE_DIR] > units.tsv
"""
import glob
import os
import re
import sys

root = sys.argv[1] if len(sys.argv) > 1 else os.path.join(os.path.dirname(__file__), "..", "..", "..")
root = os.path.abspath(root)

NUMBER = r"[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?"
QUANTITY = re.compile(r"^\s*" + NUMBER + r"\s*([A-Za-z(][^\"]*)$")
QUOTED = re.compile(r'"([^"\n]*)"')
# A quoted YAML flow value: after a key, a '[', ',' or '-', and followed by
# ',', ']', '}' or the end of the line (not a quotation inside free text).
FLOW_VALUE = re.compile(r'(?:^|[:\[,{-])\s*"([^"\n]*)"\s*(?=[,\]}]|$)')

found = {}  # unit -> [first place, count]


def note(unit, place):
    unit = unit.strip()
    if not unit:
        return
    if unit in found:
        found[unit][1] += 1
    else:
        found[unit] = [place, 1]


def strip_comment(line):
    # YAML comments start with '#' outside quotes.
    out, quoted = [], False
    for c in line:
        if c == '"':
            quoted = not quoted
        if c == "#" and not quoted:
            break
        out.append(c)
    return "".join(out)


yaml_files = sorted(glob.glob(os.path.join(root, "materials", "*.yaml")))
yaml_files += sorted(glob.glob(os.path.join(root, "examples", "**", "case.yaml"), recursive=True))
for path in yaml_files:
    rel = os.path.relpath(path, root)
    with open(path, encoding="utf-8") as f:
        for number, line in enumerate(f, 1):
            line = strip_comment(line)
            place = f"{rel}:{number}"
            is_columns = re.match(r"^\s*columns\s*:", line) is not None
            if re.match(r"^\s*-?\s*(name|description|cite|citation|for|note)\s*:", line):
                continue  # free text, not quantities
            for text in FLOW_VALUE.findall(line.rstrip("\n")):
                m = QUANTITY.match(text)
                if m:
                    note(m.group(1), place)
                elif is_columns:
                    note(text, place)

path = os.path.join(root, "tests", "cards", "test_units.cc")
rel = os.path.relpath(path, root)
with open(path, encoding="utf-8") as f:
    for number, line in enumerate(f, 1):
        for text in QUOTED.findall(line):
            m = QUANTITY.match(text)
            if m:
                note(m.group(1), f"{rel}:{number}")

# The --unit values of the command-line tests: "cp=J/g/K,T=degC" -> J/g/K, degC.
UNIT_OPTION = re.compile(r"^[A-Za-z]+=[^,]*(?:,[A-Za-z]+=[^,]*)*$")
for path in sorted(glob.glob(os.path.join(root, "tests", "cli", "*unit*.cc"))):
    rel = os.path.relpath(path, root)
    with open(path, encoding="utf-8") as f:
        for number, line in enumerate(f, 1):
            for text in QUOTED.findall(line):
                if UNIT_OPTION.match(text):
                    for item in text.split(","):
                        note(item.split("=", 1)[1], f"{rel}:{number}")

for unit, (place, count) in found.items():
    print(f"{unit}\t{place}\t{count}")
