#!/usr/bin/env bash
# SPDX-License-Identifier: Apache-2.0
# CTest fe_mpi_kill_resume: `quantacal run` of the adaptive quench on 2 MPI ranks,
# killed (SIGKILL, by the rank that reaches the kill point first) after its second
# checkpoint and resumed with --resume on 2 ranks, must give the probes.csv,
# energy.csv and summary.yaml of an uninterrupted 2-rank run (to 1e-12 relative,
# wall times aside; the round-off column relative_imbalance to 1e-12 absolute).
# Usage: mpi_kill_resume.sh MPIRUN QUANTACAL CASE WORK_DIR PYTHON
set -euo pipefail
mpirun=$1 quantacal=$2 case_file=$3 work=$4 python=$5
rm -rf "$work"
mkdir -p "$work"
export OMPI_ALLOW_RUN_AS_ROOT=1 OMPI_ALLOW_RUN_AS_ROOT_CONFIRM=1
run() { # folder, extra args...
  local folder=$1
  shift
  "$mpirun" --allow-run-as-root --oversubscribe -np 2 "$@" "$quantacal" run "$case_file" \
    --output "$work/$folder" --quiet
}
run reference -x QUANTACAL_TEST_KILL_AT= || { echo "uninterrupted run failed"; exit 1; }
set +e
run resumed -x QUANTACAL_TEST_KILL_AT=checkpoint:committed:2 2>"$work/killed.err"
status=$?
set -e
if [ "$status" -eq 0 ] || [ -e "$work/resumed/summary.yaml" ]; then
  echo "the run to be killed finished (exit $status)"
  exit 1
fi
echo "killed run: exit status $status"
# the kill point is a test hook; the resumed run has none
"$mpirun" --allow-run-as-root --oversubscribe -np 2 -x QUANTACAL_TEST_KILL_AT= \
  "$quantacal" run "$case_file" --output "$work/resumed" --quiet --resume
"$python" - "$work/reference" "$work/resumed" <<'PY'
import sys, pathlib
ref, res = map(pathlib.Path, sys.argv[1:3])
def numbers(text):
    out = []
    for line in text.splitlines():
        for cell in line.replace(":", ",").split(","):
            try:
                out.append(float(cell))
            except ValueError:
                pass
    return out
def without_wall(text):
    keep, wall = [], False
    for line in text.splitlines():
        if line.startswith("wall_time_s:"):
            wall = True
            continue
        if wall and line.startswith("  "):
            continue
        wall = False
        if not line.startswith("case_file:"):
            keep.append(line)
    return "\n".join(keep)
def imbalance_apart(text):
    # relative_imbalance is round-off (about 1e-14): its relative difference means
    # nothing, so it is compared on its own, as an absolute difference
    rows = [line.split(",") for line in text.splitlines()]
    column = rows[0].index("relative_imbalance")
    rest = "\n".join(",".join(r[:column] + r[column + 1:]) for r in rows)
    return rest, [float(r[column]) for r in rows[1:]]
worst = 0.0
for name in ("probes.csv", "energy.csv", "summary.yaml"):
    a, b = (ref / name).read_text(), (res / name).read_text()
    if name == "energy.csv":
        (a, ia), (b, ib) = imbalance_apart(a), imbalance_apart(b)
        d = max((abs(p - q) for p, q in zip(ia, ib)), default=0.0)
        print(f"[ measured ] energy.csv relative_imbalance: worst difference {d:.3g}")
        if len(ia) != len(ib) or d > 1e-12:
            sys.exit(f"relative_imbalance differs by {d:.3g} > 1e-12")
    if name == "summary.yaml":
        a, b = without_wall(a), without_wall(b)
    x, y = numbers(a), numbers(b)
    if len(x) != len(y) or len(a.splitlines()) != len(b.splitlines()):
        sys.exit(f"{name}: {len(y)} numbers resumed against {len(x)} uninterrupted")
    d = max((abs(p - q) / max(abs(q), 1e-300) for p, q in zip(y, x)), default=0.0)
    print(f"[ measured ] {name}: worst relative difference {d:.3g}")
    worst = max(worst, d)
if worst > 1e-12:
    sys.exit(f"resumed run differs from the uninterrupted one by {worst:.3g} > 1e-12")
PY
