#!/usr/bin/env python3
# SPDX-License-Identifier: Apache-2.0
"""Turns a bench_tables JSON run into the markdown table of docs/performance.md.

usage: bench_tables --benchmark_repetitions=5 --benchmark_format=json > run.json
       python3 ratios.py run.json [baseline-name]
Each row: median ns per point over the repetitions (CPU time), the ratio to the
baseline (default BM_TableBatch) measured in the same run, and the table bytes.
"""
import json
import sys

run = json.load(open(sys.argv[1]))
baseline = sys.argv[2] if len(sys.argv) > 2 else "BM_TableBatch"
rows, fastest = {}, {}
for b in run["benchmarks"]:
    name = b["run_name"]
    if b.get("aggregate_name") == "median":
        rows[name] = b
    elif "aggregate_name" not in b:
        rows.setdefault(name, b)
        fastest[name] = min(fastest.get(name, float("inf")), b["ns_per_point"])
base = rows[baseline]["ns_per_point"]
print("| benchmark | ns per point (median) | fastest repetition | ratio to %s (median) "
      "| table bytes |" % baseline)
print("|---|---|---|---|---|")
for name, b in rows.items():
    ns = b["ns_per_point"]
    size = "%d" % b["bytes"] if "bytes" in b else ""
    print("| %s | %.2f | %.2f | %.1f | %s |"
          % (name, ns * 1e9, fastest.get(name, ns) * 1e9, ns / base, size))
