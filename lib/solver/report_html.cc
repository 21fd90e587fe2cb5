// SPDX-License-Identifier: Apache-2.0
// report.html: the page, its style, the plots and the cautions (report_html.h).
#include "report_html.h"

#include "result_files.h"

#include <quantacal/common/files.h>
#include <quantacal/common/text.h>
#include <quantacal/version.h>

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <sstream>

namespace quantacal::solver {
namespace detail {
namespace {

namespace fs = std::filesystem;

const char* const style = R"(
:root{--ink:#1d2733;--muted:#5b6673;--line:#d5dbe1;--accent:#1f5f8b;--warn:#9a5700;
--warnbg:#fff6e5}
*{box-sizing:border-box}
body{margin:0;background:#eef1f4;color:var(--ink);
font:15px/1.45 "DejaVu Sans",system-ui,-apple-system,"Segoe UI",Roboto,sans-serif}
main{max-width:1100px;margin:0 auto;padding:24px 32px 40px;background:#fff}
header h1{font-size:25px;margin:0 0 6px}
.meta{color:var(--muted);margin:2px 0}
.status{display:inline-block;padding:1px 8px;border-radius:10px;font-size:13px;
background:#e3f1e6;color:#1e6b34}
.status.stopped{background:#fbe4e1;color:#9b2418}
section{margin-top:26px}
h2{font-size:19px;color:var(--accent);border-bottom:2px solid var(--accent);
padding-bottom:3px;margin:0 0 10px}
h3{font-size:15px;margin:14px 0 4px}
table{border-collapse:collapse;width:100%;font-size:14px}
th,td{border-bottom:1px solid var(--line);padding:5px 8px;text-align:left;
vertical-align:top}
thead th{background:#eef2f6;font-weight:600}
td.num{text-align:right;font-variant-numeric:tabular-nums;white-space:nowrap}
th.num{text-align:right}
.nowrap{white-space:nowrap}
.wide{overflow-x:auto}
table.pairs{width:100%}
table.pairs th{font-weight:normal;color:var(--muted);width:55%}
.grid{display:grid;grid-template-columns:1fr 1fr;gap:28px}
.grid section{margin-top:26px}
.caution{background:var(--warnbg);border-left:5px solid var(--warn);padding:6px 18px 10px}
.caution h2{color:var(--warn);border-color:transparent;margin-bottom:4px}
.caution ul{margin:4px 0;padding-left:20px}
figure{margin:14px 0 22px}
figure img{display:block;width:100%;height:auto;border:1px solid var(--line)}
figcaption{color:var(--muted);font-size:13px;margin-top:4px}
.note{color:var(--muted);font-size:13px}
ul.sources{font-size:13px;margin:2px 0 8px;padding-left:20px}
.param{font-family:"DejaVu Sans Mono",monospace;font-size:12px}
footer{margin-top:30px;color:var(--muted);font-size:12px}
@media (max-width:760px){.grid{grid-template-columns:1fr}}
@media print{body{background:#fff}main{padding:0}}
)";

std::string base64(const std::string& bytes) {
  static const char* const digits =
      "ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz0123456789+/";
  std::string out;
  out.reserve((bytes.size() + 2) / 3 * 4);
  for (std::size_t i = 0; i < bytes.size(); i += 3) {
    const std::size_t n = std::min<std::size_t>(3, bytes.size() - i);
    unsigned long v = 0;
    for (std::size_t k = 0; k < 3; ++k)
      v = (v << 8) | (k < n ? static_cast<unsigned char>(bytes[i + k]) : 0u);
    for (std::size_t k = 0; k < 4; ++k)
      out += k <= n ? digits[(v >> (18 - 6 * k)) & 63] : '=';
  }
  return out;
}

std::string read_all(const fs::path& path) {
  std::ifstream in(path, std::ios::binary);
  std::ostringstream text;
  text << in.rdbuf();
  return text.str();
}

struct Plot {
  const char* stem;
  const char* caption;
};

std::string plots_section(const CaseDescription& description, const RunResult& result,
                          const TemperatureScale& scale) {
  const Plot plots[] = {
      {"cooling_curves", "Cooling curves: temperature of each probe against time; "
                         "shaded bands are the temperature windows."},
      {"cooling_rates", "Cooling rate -dT/dt of each probe against its temperature, "
                        "the temperature falling to the right; shaded bands are the "
                        "windows."},
      {"energy_ledger", "Energy ledger: stored-energy change and the heat that "
                        "entered, with the relative imbalance on the right axis."}};
  const fs::path folder(description.output.folder);
  std::ostringstream out;
  for (const Plot& plot : plots) {
    const bool scripted = std::any_of(
        result.plot_scripts.begin(), result.plot_scripts.end(),
        [&](const std::string& s) { return fs::path(s).stem() == plot.stem; });
    if (!scripted)
      continue;
    const fs::path svg = folder / (std::string(plot.stem) + ".svg");
    out << "<figure id=\"plot-" << plot.stem << "\">\n";
    if (fs::exists(svg))
      out << "<img alt=\"" << markup_escape(plot.caption)
          << "\" src=\"data:image/svg+xml;base64," << base64(read_all(svg)) << "\">\n";
    else
      out << "<p class=\"note\">Not drawn: " << plot.stem
          << ".svg is missing (gnuplot not "
          << "installed or failed); run <code>gnuplot " << plot.stem
          << ".gp</code> in the output folder.</p>\n";
    out << "<figcaption>" << markup_escape(plot.caption) << " Temperatures in "
        << scale.symbol() << ".</figcaption>\n</figure>\n";
  }
  if (result.plot_scripts.empty())
    out << "<p class=\"note\">No plots: switched off (output.plot: false or "
           "--no-plot).</p>\n";
  return "<section id=\"plots\">\n<h2>Plots</h2>\n" + out.str() + "</section>\n";
}

std::string cautions_section(const RunResult& result) {
  std::ostringstream out;
  out << "<section id=\"cautions\" class=\"caution\">\n<h2>Cautions</h2>\n<ul>\n<li>"
      << markup_escape(run_caution()) << "</li>\n"
      << "<li>Transformation heats in the cards are the equilibrium ones: on a quench, "
         "real transformations undercool or are suppressed, which the cards do not "
         "model.</li>\n"
      << "<li>Cooling rates come from the solver at the probe points; they are only as "
         "good as the boundary data (heat-transfer curves) the case states.</li>\n";
  if (!result.completed)
    out << "<li><strong>The run stopped early:</strong> "
        << markup_escape(result.stop_reason) << "</li>\n";
  for (const std::string& w : result.warnings)
    out << "<li><strong>Warning:</strong> " << markup_escape(w) << "</li>\n";
  out << "</ul>\n</section>\n";
  return out.str();
}

std::string page_header(const CaseDescription& description, const RunResult& result,
                        const TemperatureScale& scale) {
  std::ostringstream out;
  const double end = result.times.empty() ? 0.0 : result.times.back();
  out << "<header>\n<h1>Quench report: " << markup_escape(description.name) << "</h1>\n"
      << "<p class=\"meta\">Case file: <code>"
      << markup_escape(description.file.empty() ? "(built in code)" : description.file)
      << "</code></p>\n<p class=\"meta\"><span class=\"status"
      << (result.completed ? "" : " stopped") << "\">"
      << (result.completed ? "completed" : "stopped")
      << "</span> at t = " << markup_escape(number(end)) << " s; temperatures in "
      << scale.symbol() << ", rates in " << scale.rate_symbol()
      << (scale.rate_symbol() == "K/s" ? " (= degC/s)" : "") << ".</p>\n</header>\n";
  return out.str();
}

std::string page(const CaseDescription& description, const RunResult& result) {
  const TemperatureScale scale(description.output.temperature_unit);
  std::ostringstream out;
  out << "<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\">\n"
      << "<meta name=\"viewport\" content=\"width=device-width, initial-scale=1\">\n"
      << "<title>Quench report: " << markup_escape(description.name) << "</title>\n"
      << "<style>" << style << "</style>\n</head>\n<body>\n<main>\n"
      << page_header(description, result, scale) << cautions_section(result)
      << glance_section(description, result, scale)
      << plots_section(description, result, scale) << windows_section(result, scale)
      << crossings_section(result, scale) << ledger_section(description, result)
      << materials_section(description, scale) << boundaries_section(description, scale)
      << "<div class=\"grid\">\n"
      << mesh_section(description, result) << solver_section(result) << "</div>\n"
      << "<footer>Written by quantacal " << QUANTACAL_VERSION_STRING
      << " (quantacal run). The numbers are those of summary.yaml; probes.csv and "
         "energy.csv hold every step. Definitions: docs/results.md.</footer>\n"
      << "</main>\n</body>\n</html>\n";
  return out.str();
}

} // namespace

std::string display_number(double value) {
  // 4 significant digits, without an exponent from 1e4 to 1e9 ("-67430", not
  // "-6.743e+04")
  char text[40];
  std::snprintf(text, sizeof text, "%.4g", value);
  if (std::abs(value) >= 1e4 && std::abs(value) < 1e9)
    std::snprintf(text, sizeof text, "%.0f", std::strtod(text, nullptr));
  return text;
}

std::string number_cell(const std::vector<PathPart>& path, double shown) {
  std::string key = "[";
  for (const PathPart& part : path) {
    key += key.size() > 1 ? "," : "";
    key += part.index >= 0 ? std::to_string(part.index) : quoted(part.key);
  }
  key += "]";
  return "<td class=\"num\" data-key=\"" + markup_escape(key) + "\" data-value=\"" +
         markup_escape(number(shown)) + "\">" + display_number(shown) + "</td>";
}

std::string text_cell(const std::string& text) {
  return "<td>" + markup_escape(text) + "</td>";
}

} // namespace detail

std::string write_report(const CaseDescription& description, const RunResult& result) {
  const std::string path =
      (std::filesystem::path(description.output.folder) / "report.html").string();
  write_file_atomically(path, detail::page(description, result));
  return path;
}

} // namespace quantacal::solver
