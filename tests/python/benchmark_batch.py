# SPDX-License-Identifier: Apache-2.0
"""Cost per point of a numpy call of the Python package against the C++ batch call
it makes (tests/python/cxx_reference.cc, `time` mode), on the same card and the
same log-spaced temperatures; best of several repeats. Not a test (timings
depend on the machine); docs/api-python.md quotes its output.

    PYTHONPATH=build/python /usr/bin/python3 tests/python/benchmark_batch.py \
        build/tests/python/python_cxx_reference materials/copper.yaml
"""

import subprocess
import sys
import time

import numpy as np

import quantacal


def best_ns_per_point(call, n, repeats):
    best = float("inf")
    for _ in range(repeats):
        start = time.perf_counter_ns()
        call()
        best = min(best, time.perf_counter_ns() - start)
    return best / n


def main(program, card):
    m = quantacal.load_card(card)
    lo, hi = m.valid_range
    print(f"{'points':>9} {'C++ thermal':>12} {'Python thermal':>15} {'C++ k':>8} "
          f"{'Python k':>9} {'Python all 5':>13}   (ns per point)")
    for n, repeats in [(1, 2000), (100, 2000), (10_000, 200), (1_000_000, 7)]:
        t = lo * (hi / lo) ** ((np.arange(n) + 0.5) / n)
        out = subprocess.run([program, "time", card, str(n), str(repeats)], check=True,
                             capture_output=True, text=True).stdout.split()
        cxx_thermal, cxx_k = float(out[1]), float(out[3])
        py_thermal = best_ns_per_point(lambda: m.evaluate(t, quantacal.THERMAL), n, repeats)
        py_k = best_ns_per_point(lambda: m.evaluate(t, quantacal.CONDUCTION), n, repeats)
        py_all = best_ns_per_point(lambda: m.evaluate(t), n, repeats)
        print(f"{n:9d} {cxx_thermal:12.2f} {py_thermal:15.2f} {cxx_k:8.2f} {py_k:9.2f} "
              f"{py_all:13.2f}")


if __name__ == "__main__":
    if len(sys.argv) != 3:
        sys.exit(__doc__)
    main(sys.argv[1], sys.argv[2])
