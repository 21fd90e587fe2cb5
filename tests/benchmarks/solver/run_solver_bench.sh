#!/usr/bin/env bash
# SPDX-License-Identifier: Apache-2.0
# Solver benchmark: runs `quantacal run` on the default case (example (a)) and on
# the 3D block of this folder, on 1 and 2 MPI ranks, with lattice and constant
# properties, and with the capacity formulation, then prints a markdown table
# from the summary.yaml files. It builds nothing and asserts no time: the
# figures go to docs/performance.md ("Transient solver").
#
# usage: run_solver_bench.sh BUILD_DIR [OUTPUT_DIR]
#        run_solver_bench.sh --report OUTPUT_DIR   (tables of earlier runs, runs nothing)
#   BUILD_DIR   a build tree holding the `quantacal` executable
#   OUTPUT_DIR  where the runs write (default: BUILD_DIR/solver-bench)
set -euo pipefail

if [[ $# -lt 1 || $# -gt 2 || ($1 == --report && $# -ne 2) ]]; then
  echo "usage: $0 BUILD_DIR [OUTPUT_DIR] | $0 --report OUTPUT_DIR" >&2
  exit 2
fi
report_only=0
if [[ $1 == --report ]]; then
  report_only=1
  out=$(cd "$2" && pwd)
fi

print_tables() { # the markdown tables from the summary.yaml files in $out
python3 - "$out" <<'PY'
import os, sys

out = sys.argv[1]


def summary(name):
    """The two-level maps of summary.yaml as {"a.b": "value"}."""
    values, top = {}, None
    with open(os.path.join(out, name, "summary.yaml")) as f:
        for line in f:
            if not line.strip() or line.lstrip().startswith("#"):
                continue
            indent = len(line) - len(line.lstrip())
            key, _, value = line.strip().partition(":")
            value = value.strip().strip('"')
            if indent == 0:
                top = key
                if value:
                    values[key] = value
            elif indent == 2 and top is not None:
                values[top + "." + key] = value
    return values


runs = ["a_energy_1", "a_energy_2", "a_constant_1", "a_capacity_1",
        "block_energy_1", "block_energy_2", "block_constant_1"]
s = {r: summary(r) for r in runs}


def baseline():
    """The key: value pairs of linear_baseline's line, or None if it did not run."""
    path = os.path.join(out, "linear_baseline.txt")
    if not os.path.exists(path):
        return None
    with open(path) as f:
        line = f.read().strip()
    return {k.strip(): v.strip() for k, _, v in
            (item.partition(":") for item in line.split(","))}


def num(r, key):
    return float(s[r][key])


def per_step(r, key):
    return num(r, key) / max(1.0, num(r, "steps.accepted"))


def final_imbalance(r):
    dE = num(r, "energy.stored_change_J")
    q = num(r, "energy.boundary_heat_J") + num(r, "energy.source_heat_J")
    return abs(dE - q) / max(abs(dE), 1e-300)


print("| run | ranks | dofs | steps (rejected) | wall s | wall/step s | Newton/step "
      "| Jacobians | residuals | assembly s | material s | material share of assembly "
      "| linear solve s | AMG setup s | worst imbalance | final imbalance |")
print("|---|---|---|---|---|---|---|---|---|---|---|---|---|---|---|---|")
for r in runs:
    a, m = num(r, "wall_time_s.assembly"), num(r, "wall_time_s.material_evaluation")
    print(f"| {r} | {s[r]['ranks']} | {s[r]['mesh.dofs']} | {s[r]['steps.accepted']} "
          f"({s[r]['steps.rejected']}) | {num(r, 'wall_time_s.total'):.2f} "
          f"| {per_step(r, 'wall_time_s.total'):.3f} "
          f"| {per_step(r, 'steps.newton_iterations'):.2f} "
          f"| {s[r]['steps.jacobian_assemblies']} | {s[r]['steps.residual_assemblies']} "
          f"| {a:.2f} | {m:.2f} "
          f"| {100 * m / a:.1f} % | {num(r, 'wall_time_s.linear_solve'):.2f} "
          f"| {num(r, 'wall_time_s.preconditioner'):.2f} "
          f"| {num(r, 'worst_relative_imbalance'):.2e} | {final_imbalance(r):.2e} |")


def stepping(r):  # time-stepping phases: total less setup and output
    return (num(r, "wall_time_s.total") - num(r, "wall_time_s.setup")
            - num(r, "wall_time_s.output"))


def per_newton(r):  # time stepping per Newton iteration
    return stepping(r) / max(1.0, num(r, "steps.newton_iterations"))


print()
print("| ratio (same run) | default case (a) | 3D block | target |")
print("|---|---|---|---|")
print(f"| lattice / constant properties, total wall | "
      f"{num('a_energy_1', 'wall_time_s.total') / num('a_constant_1', 'wall_time_s.total'):.2f} | "
      f"{num('block_energy_1', 'wall_time_s.total') / num('block_constant_1', 'wall_time_s.total'):.2f} "
      f"| <= 1.5 |")
print(f"| lattice / constant properties, time stepping (total - setup - output) | "
      f"{stepping('a_energy_1') / stepping('a_constant_1'):.2f} | "
      f"{stepping('block_energy_1') / stepping('block_constant_1'):.2f} | |")
print(f"| lattice / constant properties, wall per Newton iteration | "
      f"{per_newton('a_energy_1') / per_newton('a_constant_1'):.2f} | "
      f"{per_newton('block_energy_1') / per_newton('block_constant_1'):.2f} | |")
print(f"| speed-up 1 -> 2 ranks, total wall | "
      f"{num('a_energy_1', 'wall_time_s.total') / num('a_energy_2', 'wall_time_s.total'):.2f} | "
      f"{num('block_energy_1', 'wall_time_s.total') / num('block_energy_2', 'wall_time_s.total'):.2f} "
      f"| >= 1.7 |")
print(f"| speed-up 1 -> 2 ranks, time stepping (total - setup - output) | "
      f"{stepping('a_energy_1') / stepping('a_energy_2'):.2f} | "
      f"{stepping('block_energy_1') / stepping('block_energy_2'):.2f} | |")
print(f"| speed-up 1 -> 2 ranks, assembly | "
      f"{num('a_energy_1', 'wall_time_s.assembly') / num('a_energy_2', 'wall_time_s.assembly'):.2f} | "
      f"{num('block_energy_1', 'wall_time_s.assembly') / num('block_energy_2', 'wall_time_s.assembly'):.2f} | |")
print(f"| speed-up 1 -> 2 ranks, linear solve | "
      f"{num('a_energy_1', 'wall_time_s.linear_solve') / num('a_energy_2', 'wall_time_s.linear_solve'):.2f} | "
      f"{num('block_energy_1', 'wall_time_s.linear_solve') / num('block_energy_2', 'wall_time_s.linear_solve'):.2f} | |")
b = baseline()
if b is not None:
    step = float(b["step_s"])
    print()
    print(f"Linear baseline (same run): {b['unknowns']} unknowns, {step:.3f} s per "
          f"backward-Euler step, {float(b['cg_iterations_per_step']):.1f} CG iterations "
          f"per step.")
    print()
    print("| 3D block, 1 rank | time stepping per step, s | ratio to the linear baseline "
          "step | target |")
    print("|---|---|---|---|")
    for r in ("block_energy_1", "block_constant_1"):
        per = stepping(r) / max(1.0, num(r, "steps.accepted"))
        print(f"| {r} | {per:.3f} | {per / step:.1f} | <= 3 |")
print()
print("| default case (a), 1 rank | energy form | capacity form | capacity / energy |")
print("|---|---|---|---|")
for label, f in (("worst relative imbalance", lambda r: num(r, "worst_relative_imbalance")),
                 ("final relative imbalance", final_imbalance)):
    e, c = f("a_energy_1"), f("a_capacity_1")
    print(f"| {label} | {e:.2e} | {c:.2e} | {c / e:.3g} |")
e = num("a_energy_1", "energy.stored_change_J")
c = num("a_capacity_1", "energy.stored_change_J")
cb = num("a_capacity_1", "energy.boundary_heat_J") + num("a_capacity_1", "energy.source_heat_J")
print(f"| stored energy change, J | {e:.6g} | {c:.6g} | |")
print(f"| energy lost (stored change - boundary and source heat), J | "
      f"{e - num('a_energy_1', 'energy.boundary_heat_J') - num('a_energy_1', 'energy.source_heat_J'):.3g} "
      f"| {c - cb:.3g} | |")
print(f"| wall s | {num('a_energy_1', 'wall_time_s.total'):.2f} "
      f"| {num('a_capacity_1', 'wall_time_s.total'):.2f} | |")
PY
}

if [[ $report_only -eq 1 ]]; then
  print_tables
  exit 0
fi
build=$(cd "$1" && pwd)
exe="$build/quantacal"
[[ -x "$exe" ]] || { echo "no executable $exe (build the quantacal_cli target)" >&2; exit 2; }
here=$(cd "$(dirname "${BASH_SOURCE[0]}")" && pwd)
src=$(cd "$here/../../.." && pwd)
out=${2:-"$build/solver-bench"}
mkdir -p "$out"
out=$(cd "$out" && pwd)

mpirun_cmd=(mpirun --oversubscribe)
if [[ $(id -u) -eq 0 ]]; then
  mpirun_cmd+=(--allow-run-as-root)
  export OMPI_ALLOW_RUN_AS_ROOT=1 OMPI_ALLOW_RUN_AS_ROOT_CONFIRM=1
fi

case_a="$src/examples/a-aluminium-bar-water-quench/case.yaml"
case_3d="$here/aluminium_block_quench.yaml"
case_3d_const="$here/aluminium_block_quench_constant.yaml"
# the default case with the constant-property twin card, written next to the runs
case_a_const="$out/a_constant_case.yaml"
sed "s#card: ../../materials/aluminium.yaml#card: $here/aluminium_constant.yaml#" \
  "$case_a" > "$case_a_const"
grep -q "aluminium_constant.yaml" "$case_a_const" ||
  { echo "could not point $case_a_const at the constant card" >&2; exit 2; }
sed -i "s#^name: .*#name: example (a) with constant properties (illustrative benchmark twin)#" \
  "$case_a_const"

common=(--no-fields --no-plot --quiet)
log="$out/commands.txt"
{
  echo "# run_solver_bench.sh $*"
  echo "# date: $(date -u '+%Y-%m-%d %H:%M:%S UTC')"
  echo "# machine: $(lscpu | sed -n 's/^Model name:[[:space:]]*//p' | head -1), $(nproc) CPUs"
  echo "# load before: $(cut -d' ' -f1-3 /proc/loadavg)"
} > "$log"

run() { # name ranks case [extra options...]
  local name=$1 ranks=$2 casefile=$3
  shift 3
  local cmd
  if [[ $ranks -eq 1 ]]; then
    cmd=("$exe" run "$casefile" --output "$out/$name" "${common[@]}" "$@")
  else
    cmd=("${mpirun_cmd[@]}" -np "$ranks" "$exe" run "$casefile" --output "$out/$name"
         "${common[@]}" "$@")
  fi
  echo "${cmd[*]}" >> "$log"
  echo "[$(date -u +%H:%M:%S)] $name" >&2
  rm -rf "$out/$name"
  "${cmd[@]}"
}

run a_energy_1 1 "$case_a"
run a_energy_2 2 "$case_a"
run a_constant_1 1 "$case_a_const"
run a_capacity_1 1 "$case_a" --formulation capacity
run block_energy_1 1 "$case_3d"
run block_energy_2 2 "$case_3d"
run block_constant_1 1 "$case_3d_const"
# the linear baseline, if built (cmake --build BUILD_DIR --target linear_baseline)
baseline_exe="$build/tests/benchmarks/linear_baseline"
if [[ -x "$baseline_exe" ]]; then
  echo "$baseline_exe $src" >> "$log"
  echo "[$(date -u +%H:%M:%S)] linear_baseline" >&2
  "$baseline_exe" "$src" > "$out/linear_baseline.txt"
else
  echo "no $baseline_exe: the ratios to the linear baseline are left out" >&2
  rm -f "$out/linear_baseline.txt"
fi
echo "# load after: $(cut -d' ' -f1-3 /proc/loadavg)" >> "$log"

cat "$log"
echo
print_tables
