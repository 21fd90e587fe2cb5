#!/usr/bin/env bash
# Runs the libFuzzer targets of quantacal over their committed corpora
# (docs/reliability.md). Build them first:
#   cmake -S . -B /tmp/fuzz-build -DCMAKE_CXX_COMPILER=clang++-14 \
#         -DCMAKE_C_COMPILER=clang-14 -DQUANTACAL_FUZZ=ON -DQUANTACAL_WITH_SOLVER=OFF \
#         -DQUANTACAL_HARDENING_TESTS=OFF
#   cmake --build /tmp/fuzz-build -j1 --target fuzz_targets
# Usage: tests/fuzz/run_fuzz.sh BUILD_DIR SECONDS [TARGET...]
#   TARGET: card units fit_data options c_api case (default: all)
# Each target runs for SECONDS over a scratch copy of its corpus (new inputs
# stay in WORK_DIR, default /tmp/quantacal-fuzz; the committed corpus is not
# changed), with a 10 s per-input timeout and a 2 GB memory limit. A crash,
# timeout, leak or invariant failure leaves its input in WORK_DIR/<target>/
# and makes the script exit non-zero after all targets ran. The last status
# line of each target (execs, cov, ft) is printed at the end. With FRESH=1 each
# target starts from the committed corpus alone (WORK_DIR/<target> is emptied
# first), as the hardening tests run it. SEED=N fixes libFuzzer's random seed
# (the hardening tests use SEED=1, so a CI run explores the same inputs each
# time, as far as its SECONDS reach).
set -uo pipefail
if [ $# -lt 2 ]; then
  sed -n '2,19p' "$0"
  exit 2
fi
build=$1
seconds=$2
shift 2
targets=("$@")
[ ${#targets[@]} -gt 0 ] || targets=(card units fit_data options c_api case)
here=$(cd "$(dirname "$0")" && pwd)
work=${WORK_DIR:-/tmp/quantacal-fuzz}
failed=0
summary=()
for t in "${targets[@]}"; do
  exe="$build/fuzz/fuzz_$t"
  if [ ! -x "$exe" ]; then
    echo "run_fuzz: $exe not built" >&2
    failed=1
    continue
  fi
  if [ "${FRESH:-0}" = 1 ]; then
    rm -rf "${work:?}/$t"
  fi
  mkdir -p "$work/$t/corpus"
  cp -n "$here/corpus/$t/"* "$work/$t/corpus/" 2>/dev/null
  log="$work/$t/fuzz.log"
  start=$(date +%s)
  (cd "$work/$t" && "$exe" ${SEED:+-seed="$SEED"} -max_total_time="$seconds" -timeout=10 -rss_limit_mb=2048 \
     -max_len=16384 -print_final_stats=1 corpus >"$log" 2>&1)
  status=$?
  elapsed=$(($(date +%s) - start))
  last=$(grep -E '^#[0-9]+' "$log" | tail -1)
  execs=$(grep -E 'stat::number_of_executed_units' "$log" | awk '{print $2}')
  summary+=("$t: ${elapsed} s, ${execs:-?} execs, exit $status | $last")
  if [ $status -ne 0 ]; then
    failed=1
    echo "run_fuzz: $t FAILED (exit $status), see $log" >&2
    grep -E 'invariant violated|ERROR|SUMMARY|Test unit written' "$log" >&2
  fi
done
printf '%s\n' "${summary[@]}"
exit $failed
