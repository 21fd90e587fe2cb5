#!/usr/bin/env bash
# SPDX-License-Identifier: Apache-2.0
#
# Plots every bundled material card (materials/*.yaml) into
# docs/materials/<card>.svg: c_p (J/kg/K, left axis) and k (W/m/K, right axis)
# against T over the card's valid range, with the card's `measurements` of c_p
# and k marked. The curves are what `quantacal table` prints; the marked points
# are the published values that `quantacal check` lists for the card.
#
# usage: scripts/plot_materials.sh [QUANTACAL]
#   QUANTACAL  the quantacal binary (default: build/quantacal of this repository)
#
# Needs bash, awk and gnuplot (svg terminal). Builds nothing; each SVG is
# written to a .tmp file and moved into place, so a failed run leaves the
# previous plot intact. See docs/materials.md.
set -euo pipefail

root=$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)
if [[ $# -ge 1 ]]; then
  bin=$1
  [[ $bin == /* ]] || bin="$PWD/$bin"
else
  bin="$root/build/quantacal"
fi
[[ -x $bin ]] || { echo "plot_materials.sh: no executable quantacal at $bin" >&2; exit 4; }
command -v gnuplot >/dev/null || { echo "plot_materials.sh: gnuplot not found" >&2; exit 4; }

out_dir="$root/docs/materials"
mkdir -p "$out_dir"
work=$(mktemp -d)
tmp_svg=""
cleanup() { rm -rf "$work"; [[ -z $tmp_svg ]] || rm -f "$tmp_svg"; }
trap cleanup EXIT

# Points per curve on the base grid, and at most this many refined stretches.
base_points=200
refine_points=24

# valid_range of a card as "LOW HIGH" in kelvin. Reads the flow form
# `valid_range: {from: "100 K", to: "600 K"}` and the block form (from:/to: on
# the following indented lines); units K, mK and degC.
valid_range() {
  awk '
    function kelvin(s,   v, u) {
      gsub(/["'"'"']/, "", s); v = s + 0; u = s; sub(/^[-+0-9.eE]+[ \t]*/, "", u)
      if (u == "degC") return v + 273.15
      if (u == "mK") return v / 1000
      return v
    }
    function grab(text, key,   m) {
      if (match(text, key ":[ \t]*(\"[^\"]*\"|'"'"'[^'"'"']*'"'"'|[^,}]*)")) {
        m = substr(text, RSTART, RLENGTH); sub(key ":[ \t]*", "", m); return m
      }
      return ""
    }
    /^valid_range:/ { text = $0; block = 1; next }
    block && /^[ \t]+/ { text = text " " $0; next }
    block { block = 0 }
    END {
      f = grab(text, "from"); t = grab(text, "to")
      if (f == "" || t == "") exit 1
      printf "%.10g %.10g\n", kelvin(f), kelvin(t)
    }' "$1"
}

# `name:` of a card (for the title).
card_name() {
  awk '/^name:/ { sub(/^name:[ \t]*/, ""); gsub(/^["'"'"']|["'"'"']$/, ""); print; exit }' "$1"
}

# Rows T,cp,e,k of `quantacal table` from $2 to $3 in about $4 steps
# (appended to file $5 without the header).
tabulate() {
  local card=$1 from=$2 to=$3 n=$4 file=$5 step
  step=$(awk -v a="$from" -v b="$to" -v n="$n" 'BEGIN { printf "%.8g", (b - a) / n }')
  "$bin" table "$card" --from "$from" --to "$to" --step "$step" --basis mass | tail -n +2 >>"$file"
}

# The q-quantile (0..1) of column $2 of CSV file $1.
quantile() {
  cut -d, -f"$2" "$1" | sort -g | awk -v q="$3" '{ v[NR] = $1 }
    END { i = int(q * NR + 0.5); if (i < 1) i = 1; if (i > NR) i = NR; print v[i] }'
}

# Sorted rows, one per temperature.
tidy() { sort -t, -k1,1g "$1" | awk -F, '!seen[$1]++' >"$1.sorted"; mv "$1.sorted" "$1"; }

for card in "$root"/materials/*.yaml; do
  base=$(basename "$card" .yaml)
  read -r lo hi < <(valid_range "$card" || "$bin" table "$card" --step 1e9 | awk -F, 'NR > 1 { t[NR] = $1 } END { print t[2], t[NR] }')
  name=$(card_name "$card")
  data="$work/$base.csv"
  : >"$data"

  # Base grid: log-spaced (in stretches of a factor 2, each tabulated with a
  # linear step) when the range starts below 50 K, else linear.
  logx=$(awk -v lo="$lo" 'BEGIN { print (lo < 50) ? 1 : 0 }')
  if [[ $logx == 1 ]]; then
    awk -v lo="$lo" -v hi="$hi" -v n="$base_points" 'BEGIN {
      k = int(log(hi / lo) / log(2)) + 1; a = lo
      for (i = 1; i <= k; i++) {
        b = (i == k) ? hi : lo * 2 ^ i; if (b > hi) b = hi
        m = int(n * log(b / a) / log(hi / lo) + 0.5); if (m < 4) m = 4
        printf "%.10g %.10g %d\n", a, b, m; a = b
        if (b >= hi) break
      } }' >"$work/stretches"
  else
    echo "$lo $hi $base_points" >"$work/stretches"
  fi
  while read -r a b m; do tabulate "$card" "$a" "$b" "$m" "$data"; done <"$work/stretches"
  tidy "$data"
  cp "$data" "$work/base_grid.csv"

  # Refinement: where c_p jumps by more than 4 % of its median between two
  # neighbouring rows (latent heats, Curie peaks, joins), tabulate that stretch
  # again finely; neighbouring stretches are merged, the largest jumps first.
  med=$(quantile "$work/base_grid.csv" 2 0.5)
  awk -F, -v med="$med" '
    { t[NR] = $1; c[NR] = $2 }
    END {
      for (i = 1; i < NR; i++) {
        d = c[i + 1] - c[i]; if (d < 0) d = -d
        if (d > 0.04 * med) {
          a = (i > 1) ? t[i - 1] : t[i]; b = (i + 2 <= NR) ? t[i + 2] : t[i + 1]
          if (k > 0 && a <= hi[k]) { if (b > hi[k]) hi[k] = b; if (d > w[k]) w[k] = d }
          else { k++; lo[k] = a; hi[k] = b; w[k] = d }
        }
      }
      for (j = 1; j <= k; j++) printf "%.12g %.10g %.10g\n", w[j], lo[j], hi[j]
    }' "$data" | sort -g -r | head -n 8 >"$work/refine"
  while read -r _ a b; do tabulate "$card" "$a" "$b" "$refine_points" "$data"; done <"$work/refine"
  tidy "$data"

  # Molar mass from the two bases at the lower end (kg/mol), to turn the molar
  # c_p of `quantacal check` into J/kg/K.
  molar_mass=$(paste -d, \
      <("$bin" table "$card" --from "$lo" --to "$lo" --basis mole | tail -n 1) \
      <("$bin" table "$card" --from "$lo" --to "$lo" --basis mass | tail -n 1) |
    awk -F, '{ printf "%.10g", $2 / $6 }')

  # Measurements as printed by `quantacal check` (exit 1 = a point outside its
  # tolerance, still plotted; 2 or more = the card did not load).
  rc=0
  check=$("$bin" check "$card") || rc=$?
  if [[ $rc -gt 1 ]]; then
    echo "plot_materials.sh: quantacal check $card failed ($rc)" >&2
    exit "$rc"
  fi
  printf '%s\n' "$check" | awk -v M="$molar_mass" -v cp="$work/meas_cp" -v k="$work/meas_k" '
    BEGIN { printf "" >cp; printf "" >k }
    $1 ~ /^[0-9.eE+-]+$/ && $2 == "specific" {
      v = $5; if ($4 == "J/mol/K") v = v / M; print $1, v >cp }
    $1 ~ /^[0-9.eE+-]+$/ && $2 == "conductivity" { print $1, $4 >k }'
  n_cp=$(wc -l <"$work/meas_cp")
  n_k=$(wc -l <"$work/meas_k")
  n_e=$(printf '%s\n' "$check" | awk '$1 ~ /^[0-9.eE+-]+$/ && $2 == "stored"' | wc -l)

  # Axis choices: log k when it spans more than a decade; c_p cut at 2.5 times
  # its 90th percentile (on the base grid) when a peak (latent heat, Curie
  # point) would flatten the rest of the curve.
  p90=$(quantile "$work/base_grid.csv" 2 0.9)
  read -r kmin kmax cap cpmax tpeak < <(awk -F, -v p="$p90" '
    NR == 1 { kmin = kmax = $4; cpmax = $2; tpeak = $1 }
    { if ($4 < kmin) kmin = $4; if ($4 > kmax) kmax = $4
      if ($2 > cpmax) { cpmax = $2; tpeak = $1 } }
    END { cap = (p > 0 && cpmax > 3 * p) ? 2.5 * p : 0
          printf "%.10g %.10g %.10g %.10g %.10g\n", kmin, kmax, cap, cpmax, tpeak }' "$data")
  logk=$(awk -v a="$kmin" -v b="$kmax" 'BEGIN { print (b > 10 * a) ? 1 : 0 }')

  esc() { printf '%s' "$1" | sed "s/'/''/g"; }          # for '...' in gnuplot
  dq() { printf '%s' "$1" | sed 's/[\\"]/\\&/g'; }       # for "..." in gnuplot
  title="$name (materials/$base.yaml), $(printf '%g' "$lo") K to $(printf '%g' "$hi") K"
  notes=()
  [[ $n_e -eq 0 ]] || notes+=("stored-energy points of the card ($n_e) are not drawn")
  if awk -v c="$cap" 'BEGIN { exit !(c > 0) }'; then
    notes+=("$(printf 'c_p axis cut off: peak %.3g J/kg/K at %.5g K' "$cpmax" "$tpeak")")
  fi
  note=""
  for x in "${notes[@]+"${notes[@]}"}"; do note="${note:+$note; }$x"; done

  tmp_svg="$out_dir/$base.svg.tmp"
  {
    echo "set terminal svg size 760,480 dynamic font 'Helvetica,12' background rgb 'white'"
    echo "set output '$(esc "$tmp_svg")'"
    if [[ -z $note ]]; then
      echo "set title '$(esc "$title")' noenhanced"
    else
      # a double-quoted gnuplot string, for the line break
      echo "set title \"$(dq "$title")\\n$(dq "$note")\" noenhanced"
    fi
    echo "set xlabel 'T (K)'"
    echo "set ylabel 'c_p (J/kg/K)'"
    echo "set y2label 'k (W/m/K)'"
    echo "set ytics nomirror"
    echo "set y2tics"
    echo "set grid xtics ytics lc rgb '#dddddd'"
    echo "set key below horizontal"
    echo "set xrange [$lo:$hi]"
    [[ $logx == 1 ]] && echo "set logscale x"
    if [[ $logk == 1 ]]; then echo "set logscale y2"; else echo "set y2range [0:*]"; fi
    if awk -v c="$cap" 'BEGIN { exit !(c > 0) }'; then
      echo "set yrange [0:$cap]"
    else
      echo "set yrange [0:*]"
    fi
    curves="$work/$base.dat"
    awk -F, '{ print $1, $2, $4 }' "$data" >"$curves"
    plot="plot '$curves' using 1:2 axes x1y1 with lines lw 2 lc rgb '#c0392b' title 'c_p (card)', \\"
    plot+=$'\n'"  '$curves' using 1:3 axes x1y2 with lines lw 2 lc rgb '#2471a3' title 'k (card)'"
    if [[ $n_cp -gt 0 ]]; then
      plot+=", \\"$'\n'"  '$work/meas_cp' using 1:2 axes x1y1 with points pt 7 ps 1.2 lc rgb '#c0392b' title 'c_p, card measurements'"
    fi
    if [[ $n_k -gt 0 ]]; then
      plot+=", \\"$'\n'"  '$work/meas_k' using 1:2 axes x1y2 with points pt 9 ps 1.4 lc rgb '#2471a3' title 'k, card measurements'"
    fi
    echo "$plot"
  } >"$work/$base.gp"
  gnuplot "$work/$base.gp"
  mv -f "$tmp_svg" "$out_dir/$base.svg"
  tmp_svg=""
  printf '%-22s %8g K to %-8g K  %4d rows  %d c_p and %d k points%s\n' "$base" "$lo" "$hi" \
    "$(wc -l <"$data")" "$n_cp" "$n_k" "${note:+  ($note)}"
done
