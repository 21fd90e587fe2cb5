# SPDX-License-Identifier: Apache-2.0
"""CTest fe_report_html: runs `quantacal run CASE --output WORK/...` and checks the
report.html it writes with Python's html.parser (docs/results.md, "Report"):

- one self-contained file: no script, link, iframe, object or embed element, every
  src/href a data: URI or an in-page #anchor, no url() or @import in the style;
- every section present (ids below), tags balanced;
- every number of the metrics tables carries its summary.yaml path (data-key) and
  equals summary.yaml's value there exactly (data-value), and its text is that value
  to 4 significant digits; every window and crossing of summary.yaml is in the report;
- the plots are inline SVG (data:image/svg+xml) when gnuplot is installed;
- with --no-plot the plots section says so and holds no image.

Usage: check_report.py QUANTACAL CASE WORK_DIR
"""
import base64
import html.parser
import json
import pathlib
import shutil
import subprocess
import sys

SECTIONS = ["cautions", "glance", "plots", "windows", "crossings", "ledger",
            "materials", "boundaries", "mesh", "solver"]
FORBIDDEN = {"script", "link", "iframe", "object", "embed", "base"}
VOID = {"meta", "img", "br", "hr", "input", "col", "source", "wbr", "link", "base",
        "area", "embed", "param", "track"}


class Report(html.parser.HTMLParser):
    def __init__(self):
        super().__init__(convert_charrefs=True)
        self.ids, self.cells, self.images, self.errors = set(), [], [], []
        self.stack, self.style, self.in_style, self.cell = [], "", False, None

    def handle_starttag(self, tag, attrs):
        a = dict(attrs)
        if tag in FORBIDDEN:
            self.errors.append(f"<{tag}> element")
        for name, value in attrs:
            if name in ("src", "href", "xlink:href", "srcset", "action", "poster"):
                if not (value or "").startswith(("data:", "#")):
                    self.errors.append(f"external {name}={value!r} on <{tag}>")
            if name.startswith("on"):
                self.errors.append(f"event handler {name} on <{tag}>")
        if "id" in a:
            self.ids.add(a["id"])
        if tag == "img":
            self.images.append(a.get("src", ""))
        if tag == "style":
            self.in_style = True
        if tag == "td" and "data-key" in a:
            self.cell = {"key": a["data-key"], "value": a.get("data-value"), "text": ""}
        if tag not in VOID:
            self.stack.append(tag)

    def handle_endtag(self, tag):
        if tag in VOID:
            return
        if not self.stack or self.stack[-1] != tag:
            self.errors.append(f"unbalanced </{tag}> (open: {self.stack[-3:]})")
        else:
            self.stack.pop()
        if tag == "style":
            self.in_style = False
        if tag == "td" and self.cell is not None:
            self.cells.append(self.cell)
            self.cell = None

    def handle_data(self, data):
        if self.in_style:
            self.style += data
        if self.cell is not None:
            self.cell["text"] += data


def scalar(text):
    """A YAML scalar of summary.yaml as its raw text (quotes removed)."""
    text = text.strip()
    if text.startswith('"'):
        return json.loads(text)
    if " #" in text:
        text = text[:text.index(" #")].rstrip()
    return {"[]": [], "{}": {}, "null": None}.get(text, text)


def parse_block(lines, i, indent):
    """The mapping or list at @indent starting at lines[i] (the subset summary.yaml
    uses: block mappings and lists, scalars, [] and {})."""
    if lines[i].strip().startswith("- "):
        items = []
        while i < len(lines) and depth(lines[i]) == indent and lines[i].strip().startswith("- "):
            content = lines[i][indent + 2:]
            if ":" in content and not content.startswith('"'):
                lines[i] = " " * (indent + 2) + content
                item, i = parse_block(lines, i, indent + 2)
            else:
                item, i = scalar(content), i + 1
            items.append(item)
        return items, i
    node = {}
    while i < len(lines) and depth(lines[i]) == indent and not lines[i].strip().startswith("- "):
        key, _, rest = lines[i].strip().partition(":")
        i += 1
        if rest.strip() == "":
            node[key], i = parse_block(lines, i, depth(lines[i]))
        else:
            node[key] = scalar(rest)
    return node, i


def depth(line):
    return len(line) - len(line.lstrip(" "))


def load_summary(path):
    lines = [l for l in path.read_text().splitlines() if l.strip() and not l.startswith("#")]
    node, i = parse_block(lines, 0, 0)
    assert i == len(lines), f"summary.yaml: unparsed from line {lines[i]!r}"
    return node


def at(summary, path):
    node = summary
    for part in path:
        node = node[part]
    return node


def four_digits(value):
    return float(f"{float(value):.4g}")


def run(quantacal, case, out, *extra):
    cmd = [quantacal, "run", case, "--output", str(out), "--quiet", *extra]
    done = subprocess.run(cmd, capture_output=True, text=True)
    if done.returncode != 0:
        sys.exit(f"quantacal run failed ({done.returncode}): {done.stderr}")


def check(folder, plotted):
    failures = []
    report = Report()
    text = (folder / "report.html").read_text()
    report.feed(text)
    report.close()
    failures += report.errors
    if report.stack:
        failures.append(f"unclosed tags {report.stack}")
    if "url(" in report.style or "@import" in report.style:
        failures.append("the style loads a resource")
    failures += [f"section {s} missing" for s in SECTIONS if s not in report.ids]
    if (folder / "report.html.tmp").exists():
        failures.append("report.html.tmp left behind")
    summary = load_summary(folder / "summary.yaml")
    for cell in report.cells:
        path = json.loads(cell["key"])
        try:
            expected = at(summary, path)
        except (KeyError, IndexError, TypeError):
            failures.append(f"{path}: not in summary.yaml")
            continue
        if cell["value"] != expected:
            failures.append(f"{path}: report {cell['value']} != summary {expected}")
        elif float(cell["text"]) != four_digits(expected):
            failures.append(f"{path}: shown {cell['text']!r}, expected {expected} to 4 digits")
    keys = {tuple(json.loads(c["key"])) for c in report.cells}
    for probe, entry in summary["probes"].items():
        for i, window in enumerate(entry["windows"]):
            for key in window:
                if key.endswith(("_s", "_per_s")) and ("probes", probe, "windows", i, key) not in keys:
                    if "first_in_s" in window:
                        failures.append(f"window {probe}[{i}].{key} missing from the report")
        for i, crossing in enumerate(entry["crossings"]):
            if crossing.get("time_s") and ("probes", probe, "crossings", i, "time_s") not in keys:
                failures.append(f"crossing {probe}[{i}] missing from the report")
    svgs = [s for s in report.images if s.startswith("data:image/svg+xml;base64,")]
    if plotted and len(svgs) != 3:
        failures.append(f"expected 3 inline SVG plots, found {len(svgs)}")
    for src in svgs:
        if b"<svg" not in base64.b64decode(src.split(",", 1)[1]):
            failures.append("an inline plot is not SVG")
    if not plotted and (report.images or "No plots" not in text):
        failures.append("--no-plot: the plots section should say there are none")
    print(f"{folder / 'report.html'}: {len(text)} bytes, {len(report.cells)} numbers "
          f"checked against summary.yaml, {len(svgs)} inline plots")
    return failures


def main():
    quantacal, case, work = sys.argv[1], sys.argv[2], pathlib.Path(sys.argv[3])
    shutil.rmtree(work, ignore_errors=True)
    plotted = shutil.which("gnuplot") is not None
    run(quantacal, case, work / "plots")
    failures = check(work / "plots", plotted)
    run(quantacal, case, work / "no-plot", "--no-plot")
    failures += check(work / "no-plot", False)
    for f in failures:
        print("FAIL:", f)
    sys.exit(1 if failures else 0)


if __name__ == "__main__":
    main()
