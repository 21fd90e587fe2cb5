#!/usr/bin/env bash
# SPDX-License-Identifier: Apache-2.0
#
# Renders a run's report.html to a PNG screenshot with a headless Chromium, for
# the documentation (docs/images/report-case-a.png, docs/results.md) and to
# look at the layout. The report loads nothing from the network; the flags below
# also keep the browser itself from going online.
#
# usage: scripts/render_report.sh REPORT.html OUT.png [WIDTH HEIGHT]
#   REPORT.html  a report written by `quantacal run` (e.g.
#                examples/a-aluminium-bar-water-quench/results/report.html)
#   OUT.png      the screenshot (written to OUT.png.tmp.png and moved into place;
#                reduced to 256 colours when Pillow is installed)
#   WIDTH HEIGHT window size in CSS pixels (default 1200 2400)
#
# Needs Debian's chromium (apt-get install chromium; not a build dependency).
# Exit status: 0 written, 2 usage, 4 chromium missing or failed.
set -euo pipefail

if [[ $# -lt 2 || $# -gt 4 ]]; then
  echo "usage: $0 REPORT.html OUT.png [WIDTH HEIGHT]" >&2
  exit 2
fi
report=$(realpath "$1")
out=$2
width=${3:-1200}
height=${4:-2400}
[[ -f $report ]] || { echo "render_report.sh: no report at $1" >&2; exit 2; }
browser=$(command -v chromium || command -v chromium-browser || true)
[[ -n $browser ]] || { echo "render_report.sh: chromium not found" >&2; exit 4; }

profile=$(mktemp -d)
trap 'rm -rf "$profile"' EXIT
tmp="$out.tmp.png"
rm -f "$tmp"
if ! "$browser" --headless --no-sandbox --disable-gpu --disable-quic --no-first-run \
  --disable-background-networking --disable-component-update --disable-sync \
  --hide-scrollbars --user-data-dir="$profile" --window-size="$width,$height" \
  --screenshot="$tmp" "file://$report" >"$profile/log" 2>&1 || [[ ! -s $tmp ]]; then
  echo "render_report.sh: chromium failed:" >&2
  tail -n 5 "$profile/log" >&2
  exit 4
fi
# a 256-colour palette keeps the page legible at about half the size (Pillow, if
# installed; python3-pil comes with python3-matplotlib)
/usr/bin/python3 - "$tmp" <<'PY' 2>/dev/null || true
import sys
from PIL import Image
path = sys.argv[1]
Image.open(path).convert("RGB").quantize(256, dither=Image.Dither.NONE).save(path, optimize=True)
PY
mv "$tmp" "$out"
echo "render_report.sh: $out ($(stat -c %s "$out") bytes)"
